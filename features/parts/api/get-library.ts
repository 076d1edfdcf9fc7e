import { queryOptions, useQuery } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import type { LibraryPartDto } from '@/features/parts/types';

/** Query key root of every part-library read (mutations invalidate it). */
export const partsQueryKey = ['parts'] as const;

/** The whole library, retired parts included (`GET /api/parts/library`). */
export function getLibraryQueryOptions() {
  return queryOptions({
    queryKey: [...partsQueryKey, 'library'] as const,
    queryFn: async () => (await fetchJson<{ parts: LibraryPartDto[] }>('/api/parts/library')).parts,
  });
}

/** The library, starting from what the server rendered. */
export function useLibrary({ initialData }: { initialData?: LibraryPartDto[] }) {
  return useQuery({ ...getLibraryQueryOptions(), initialData });
}
