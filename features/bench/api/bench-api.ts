import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BenchRecordDetailDto, BenchRecordDto } from '@/features/bench/types';

/** A refusal from the bench API, with the server's message (which names the field and the reason). */
export class BenchApiError extends Error {
  constructor(readonly status: number, message: string) {
    super(message);
    this.name = 'BenchApiError';
  }
}

async function call<T>(url: string, init?: RequestInit): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { ...init, headers: { accept: 'application/json', ...(init?.headers ?? {}) } });
  } catch {
    throw new BenchApiError(0, 'The server could not be reached; nothing was stored. Try again.');
  }
  const body = (await response.json().catch(() => undefined)) as { error?: { message?: string } } | undefined;
  if (!response.ok) throw new BenchApiError(response.status, body?.error?.message ?? `The server answered ${response.status}.`);
  return body as T;
}

export const benchQueryKey = ['bench-records'] as const;

/** The revision's records (`GET /api/revisions/[id]/bench-records`). */
export function getBenchRecordsQueryOptions(revisionId: string) {
  return queryOptions({
    queryKey: [...benchQueryKey, 'revision', revisionId] as const,
    queryFn: async () => (await call<{ records: BenchRecordDto[] }>(`/api/revisions/${revisionId}/bench-records`)).records,
  });
}

/** One record with trace and spectrum (`GET /api/bench-records/[id]`). */
export function getBenchRecordQueryOptions(recordId: string) {
  return queryOptions({
    queryKey: [...benchQueryKey, 'record', recordId] as const,
    queryFn: async () => (await call<{ record: BenchRecordDetailDto }>(`/api/bench-records/${recordId}`)).record,
    staleTime: 5 * 60_000,
  });
}

export const useBenchRecords = (revisionId: string) => useQuery(getBenchRecordsQueryOptions(revisionId));
export const useBenchRecord = (recordId: string | null) => useQuery({ ...getBenchRecordQueryOptions(recordId ?? ''), enabled: recordId !== null });

export function useUploadBenchRecord(revisionId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (form: FormData) =>
      (await call<{ record: BenchRecordDto }>(`/api/revisions/${revisionId}/bench-records`, { method: 'POST', body: form })).record,
    onSuccess: () => client.invalidateQueries({ queryKey: benchQueryKey }),
  });
}

export function useWithdrawBenchRecord() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ recordId, reason }: { recordId: string; reason: string }) =>
      (
        await call<{ record: BenchRecordDto }>(`/api/bench-records/${recordId}/withdraw`, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ reason }),
        })
      ).record,
    onSuccess: () => client.invalidateQueries({ queryKey: benchQueryKey }),
  });
}
