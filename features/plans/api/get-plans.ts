import { queryOptions, useQuery } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import type { PlanSummaryDto } from '@/features/plans/types';

/** Query key root of a program's plan lists (mutations invalidate it). */
export const programPlansQueryKey = (programId: string) => ['programs', programId, 'plans'] as const;

/** The program's plans (`GET /api/programs/[programId]/plans`). */
export function getProgramPlansQueryOptions({ programId, includeArchived = false }: { programId: string; includeArchived?: boolean }) {
  return queryOptions({
    queryKey: [...programPlansQueryKey(programId), { includeArchived }] as const,
    queryFn: async () =>
      (
        await fetchJson<{ plans: PlanSummaryDto[] }>(
          `/api/programs/${encodeURIComponent(programId)}/plans${includeArchived ? '?archived=include' : ''}`,
        )
      ).plans,
  });
}

/** The plans table's data, starting from what the server rendered. */
export function useProgramPlans({
  programId,
  includeArchived,
  initialData,
}: {
  programId: string;
  includeArchived: boolean;
  initialData?: PlanSummaryDto[];
}) {
  return useQuery({ ...getProgramPlansQueryOptions({ programId, includeArchived }), initialData });
}
