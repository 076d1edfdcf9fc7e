import { useMutation, useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import { programsQueryKey } from '@/features/programs/api/get-programs';
import type { UpdateProgramInput } from '@/features/programs/schemas';
import type { ProgramDto } from '@/features/programs/types';

export { updateProgramInputSchema } from '@/features/programs/schemas';

/** PATCH /api/programs/[programId] (rename, archive, restore); refreshes the lists. */
export function useUpdateProgram() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ programId, input }: { programId: string; input: UpdateProgramInput }) =>
      (
        await fetchJson<{ program: ProgramDto }>(`/api/programs/${encodeURIComponent(programId)}`, {
          method: 'PATCH',
          body: JSON.stringify(input),
        })
      ).program,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: programsQueryKey }),
  });
}
