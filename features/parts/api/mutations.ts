import { useMutation, useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/features/ui/fetch-json';
import { partsQueryKey } from '@/features/parts/api/get-library';
import type { ImportPreviewDto, ImportResultDto, LibraryPartDto } from '@/features/parts/types';
import type { PartKind } from '@/lib/parts/part-kinds';

/** A part body as the create and edit routes take it: kind and fields, numbers in SI units. */
export type PartBody = { kind: PartKind; name: string; description: string; sourceNote: string; status: string } & Record<string, unknown>;

export function useSavePart() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, body }: { id?: string; body: PartBody }) =>
      (
        await fetchJson<{ part: LibraryPartDto }>(id ? `/api/parts/${id}` : '/api/parts', {
          method: id ? 'PUT' : 'POST',
          body: JSON.stringify(body),
        })
      ).part,
    onSuccess: () => client.invalidateQueries({ queryKey: partsQueryKey }),
  });
}

export function useRetirePart() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (id: string) => (await fetchJson<{ part: LibraryPartDto }>(`/api/parts/${id}/retire`, { method: 'POST' })).part,
    onSuccess: () => client.invalidateQueries({ queryKey: partsQueryKey }),
  });
}

export interface ImportRequest {
  file: File;
  kind: PartKind;
  mapping?: Record<string, string | null>;
}

function importForm({ file, kind, mapping }: ImportRequest, mode: 'preview' | 'import'): FormData {
  const form = new FormData();
  form.set('file', file);
  form.set('kind', kind);
  form.set('mode', mode);
  if (mapping) form.set('mapping', JSON.stringify(mapping));
  return form;
}

/** Checks a file: every problem listed, nothing written. */
export function usePreviewImport() {
  return useMutation({
    mutationFn: async (request: ImportRequest) =>
      (await fetchJson<{ preview: ImportPreviewDto }>('/api/parts/import', { method: 'POST', body: importForm(request, 'preview') })).preview,
  });
}

/** Imports a file: all of it or nothing. */
export function useRunImport() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (request: ImportRequest) =>
      fetchJson<ImportResultDto>('/api/parts/import', { method: 'POST', body: importForm(request, 'import') }),
    onSuccess: () => client.invalidateQueries({ queryKey: partsQueryKey }),
  });
}
