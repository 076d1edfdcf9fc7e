import { queryOptions, useQuery } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import type { ProgramDto } from '@/features/programs/types';

/** Query key root of every program read (mutations invalidate it). */
export const programsQueryKey = ['programs'] as const;

/** The workspace's programs (`GET /api/programs`), archived ones too when asked. */
export function getProgramsQueryOptions({ includeArchived = false }: { includeArchived?: boolean } = {}) {
  return queryOptions({
    queryKey: [...programsQueryKey, 'list', { includeArchived }] as const,
    queryFn: async () =>
      (await fetchJson<{ programs: ProgramDto[] }>(`/api/programs${includeArchived ? '?archived=include' : ''}`)).programs,
  });
}

/** The programs list, starting from what the server rendered. */
export function usePrograms({ includeArchived, initialData }: { includeArchived: boolean; initialData?: ProgramDto[] }) {
  return useQuery({ ...getProgramsQueryOptions({ includeArchived }), initialData });
}
