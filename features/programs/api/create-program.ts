import { useMutation, useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import { programsQueryKey } from '@/features/programs/api/get-programs';
import type { CreateProgramInput } from '@/features/programs/schemas';
import type { ProgramDto } from '@/features/programs/types';

export { createProgramInputSchema } from '@/features/programs/schemas';

/** POST /api/programs; refreshes the lists. */
export function useCreateProgram() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: CreateProgramInput) =>
      (await fetchJson<{ program: ProgramDto }>('/api/programs', { method: 'POST', body: JSON.stringify(input) })).program,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: programsQueryKey }),
  });
}
