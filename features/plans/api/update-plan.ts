import { useMutation, useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import { programPlansQueryKey } from '@/features/plans/api/get-plans';
import type { UpdatePlanInput } from '@/features/plans/schemas';
import type { PlanSummaryDto } from '@/features/plans/types';

/** PATCH /api/plans/[planId] (rename, archive, restore); refreshes the program's lists. */
export function useUpdatePlan(programId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ planId, input }: { planId: string; input: UpdatePlanInput }) =>
      (
        await fetchJson<{ plan: PlanSummaryDto }>(`/api/plans/${encodeURIComponent(planId)}`, {
          method: 'PATCH',
          body: JSON.stringify(input),
        })
      ).plan,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: programPlansQueryKey(programId) }),
  });
}
