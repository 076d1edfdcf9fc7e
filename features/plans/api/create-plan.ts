import { useMutation, useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import { programPlansQueryKey } from '@/features/plans/api/get-plans';
import type { CreatePlanInput } from '@/features/plans/schemas';
import type { PlanSummaryDto } from '@/features/plans/types';

/** POST /api/programs/[programId]/plans (blank, template or duplicate); refreshes the program's lists. */
export function useCreatePlan(programId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: CreatePlanInput) =>
      (
        await fetchJson<{ plan: PlanSummaryDto }>(`/api/programs/${encodeURIComponent(programId)}/plans`, {
          method: 'POST',
          body: JSON.stringify(input),
        })
      ).plan,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: programPlansQueryKey(programId) }),
  });
}
