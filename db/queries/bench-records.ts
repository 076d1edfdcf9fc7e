import 'server-only';
import { and, asc, desc, eq, isNull } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { benchRecordChunks, benchRecords, channelPlans, planRevisions, programs, users, type BenchRecordRow } from '@/db/schema';

/** Largest chunk of a record's bytes per row: 4 MiB, well below MariaDB's default 16 MiB max_allowed_packet. */
export const BENCH_CHUNK_BYTES = 4 * 1024 * 1024;

/** What a bench record needs of its revision: the frozen plan and report, and where it sits. */
export interface BenchRevision {
  id: number;
  planId: number;
  programId: number;
  planName: string;
  programName: string;
  label: string;
  state: 'draft' | 'in-review' | 'released' | 'changes-requested' | 'superseded';
  plan: Record<string, unknown>;
  report: unknown;
  createdAt: Date;
}

const revisionColumns = {
  id: planRevisions.id,
  planId: planRevisions.planId,
  programId: channelPlans.programId,
  planName: channelPlans.name,
  programName: programs.name,
  label: planRevisions.label,
  state: planRevisions.state,
  plan: planRevisions.plan,
  report: planRevisions.report,
  createdAt: planRevisions.createdAt,
};

/** The revision if it belongs to the workspace, else null. */
export async function getRevisionForBench({
  workspaceId,
  revisionId,
}: {
  workspaceId: number;
  revisionId: number;
}): Promise<BenchRevision | null> {
  const [row] = await getDb()
    .select(revisionColumns)
    .from(planRevisions)
    .innerJoin(channelPlans, eq(channelPlans.id, planRevisions.planId))
    .innerJoin(programs, eq(programs.id, channelPlans.programId))
    .where(and(eq(planRevisions.id, revisionId), eq(planRevisions.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

/** The plan's revisions (no plan/report bodies), newest first; none for a plan of another workspace. */
export async function listRevisionsForBench({
  workspaceId,
  planId,
}: {
  workspaceId: number;
  planId: number;
}): Promise<Array<Omit<BenchRevision, 'plan' | 'report'>>> {
  const { plan: _plan, report: _report, ...columns } = revisionColumns;
  return getDb()
    .select(columns)
    .from(planRevisions)
    .innerJoin(channelPlans, eq(channelPlans.id, planRevisions.planId))
    .innerJoin(programs, eq(programs.id, channelPlans.programId))
    .where(and(eq(planRevisions.planId, planId), eq(planRevisions.workspaceId, workspaceId)))
    .orderBy(desc(planRevisions.sequence));
}

/** The plan's name and program if it belongs to the workspace (the bench page's heading), else null. */
export async function getPlanHeadingForBench({ workspaceId, planId }: { workspaceId: number; planId: number }) {
  const [row] = await getDb()
    .select({ id: channelPlans.id, name: channelPlans.name, programId: channelPlans.programId, programName: programs.name })
    .from(channelPlans)
    .innerJoin(programs, eq(programs.id, channelPlans.programId))
    .where(and(eq(channelPlans.id, planId), eq(channelPlans.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

/** A stored record without its bytes, with the names of who uploaded and withdrew it. */
export type BenchRecordSummary = Omit<BenchRecordRow, 'workspaceId'> & {
  createdByName: string;
  withdrawnByName: string | null;
  revisionLabel: string;
};

const createdBy = alias(users, 'bench_created_by');
const withdrawnBy = alias(users, 'bench_withdrawn_by');

const summaryColumns = {
  id: benchRecords.id,
  planId: benchRecords.planId,
  revisionId: benchRecords.revisionId,
  fileName: benchRecords.fileName,
  format: benchRecords.format,
  byteLength: benchRecords.byteLength,
  sha256: benchRecords.sha256,
  chunkCount: benchRecords.chunkCount,
  channel: benchRecords.channel,
  unit: benchRecords.unit,
  sampleRateGivenHz: benchRecords.sampleRateGivenHz,
  gainMode: benchRecords.gainMode,
  gainVPerV: benchRecords.gainVPerV,
  note: benchRecords.note,
  analysis: benchRecords.analysis,
  comparison: benchRecords.comparison,
  withdrawnAt: benchRecords.withdrawnAt,
  withdrawnByUserId: benchRecords.withdrawnByUserId,
  withdrawnReason: benchRecords.withdrawnReason,
  createdByUserId: benchRecords.createdByUserId,
  createdAt: benchRecords.createdAt,
  createdByName: createdBy.name,
  withdrawnByName: withdrawnBy.name,
  revisionLabel: planRevisions.label,
};

function summaries(workspaceId: number) {
  return getDb()
    .select(summaryColumns)
    .from(benchRecords)
    .innerJoin(createdBy, eq(createdBy.id, benchRecords.createdByUserId))
    .leftJoin(withdrawnBy, eq(withdrawnBy.id, benchRecords.withdrawnByUserId))
    .innerJoin(planRevisions, eq(planRevisions.id, benchRecords.revisionId))
    .$dynamic()
    .where(eq(benchRecords.workspaceId, workspaceId));
}

/** The revision's records (withdrawn ones too), newest first. */
export async function listBenchRecords({
  workspaceId,
  revisionId,
}: {
  workspaceId: number;
  revisionId: number;
}): Promise<BenchRecordSummary[]> {
  return getDb()
    .select(summaryColumns)
    .from(benchRecords)
    .innerJoin(createdBy, eq(createdBy.id, benchRecords.createdByUserId))
    .leftJoin(withdrawnBy, eq(withdrawnBy.id, benchRecords.withdrawnByUserId))
    .innerJoin(planRevisions, eq(planRevisions.id, benchRecords.revisionId))
    .where(and(eq(benchRecords.workspaceId, workspaceId), eq(benchRecords.revisionId, revisionId)))
    .orderBy(desc(benchRecords.createdAt), desc(benchRecords.id));
}

/** The revision's newest record that is not withdrawn, or null. */
export async function getLatestActiveBenchRecord({
  workspaceId,
  revisionId,
}: {
  workspaceId: number;
  revisionId: number;
}): Promise<BenchRecordSummary | null> {
  const [row] = await getDb()
    .select(summaryColumns)
    .from(benchRecords)
    .innerJoin(createdBy, eq(createdBy.id, benchRecords.createdByUserId))
    .leftJoin(withdrawnBy, eq(withdrawnBy.id, benchRecords.withdrawnByUserId))
    .innerJoin(planRevisions, eq(planRevisions.id, benchRecords.revisionId))
    .where(and(eq(benchRecords.workspaceId, workspaceId), eq(benchRecords.revisionId, revisionId), isNull(benchRecords.withdrawnAt)))
    .orderBy(desc(benchRecords.createdAt), desc(benchRecords.id))
    .limit(1);
  return row ?? null;
}

/** One record (no bytes) if it belongs to the workspace, else null. */
export async function getBenchRecordById({ workspaceId, recordId }: { workspaceId: number; recordId: number }): Promise<BenchRecordSummary | null> {
  const [row] = await summaries(workspaceId).where(and(eq(benchRecords.workspaceId, workspaceId), eq(benchRecords.id, recordId))).limit(1);
  return row ?? null;
}

/** The record's file, reassembled from its chunks. */
export async function getBenchRecordBytes({ workspaceId, recordId }: { workspaceId: number; recordId: number }): Promise<Uint8Array | null> {
  const [record] = await getDb()
    .select({ id: benchRecords.id, byteLength: benchRecords.byteLength })
    .from(benchRecords)
    .where(and(eq(benchRecords.id, recordId), eq(benchRecords.workspaceId, workspaceId)))
    .limit(1);
  if (!record) return null;
  const chunks = await getDb()
    .select({ bytes: benchRecordChunks.bytes })
    .from(benchRecordChunks)
    .where(eq(benchRecordChunks.recordId, recordId))
    .orderBy(asc(benchRecordChunks.sequence));
  const out = new Uint8Array(record.byteLength);
  let offset = 0;
  for (const c of chunks) {
    out.set(c.bytes, offset);
    offset += c.bytes.length;
  }
  if (offset !== record.byteLength) throw new Error(`bench record ${recordId}: stored ${offset} bytes, expected ${record.byteLength}`);
  return out;
}

/** What an upload stores besides the bytes. */
export interface NewBenchRecord {
  planId: number;
  revisionId: number;
  fileName: string;
  format: 'edf' | 'csv';
  sha256: string;
  channel: string;
  unit: 'V' | 'mV' | 'uV' | null;
  sampleRateGivenHz: number | null;
  gainMode: 'referred-to-input' | 'gain-to-apply';
  gainVPerV: number;
  note: string;
  analysis: Record<string, unknown>;
  comparison: unknown[];
}

/** Stores a record, its bytes (in chunks) and its audit event in one transaction. */
export async function createBenchRecord({
  workspaceId,
  userId,
  record,
  bytes,
}: {
  workspaceId: number;
  userId: number;
  record: NewBenchRecord;
  bytes: Uint8Array;
}): Promise<{ id: number }> {
  const chunkCount = Math.max(1, Math.ceil(bytes.length / BENCH_CHUNK_BYTES));
  return getDb().transaction(async (tx) => {
    const [created] = await tx
      .insert(benchRecords)
      .values({ workspaceId, ...record, byteLength: bytes.length, chunkCount, createdByUserId: userId })
      .$returningId();
    for (let i = 0; i < chunkCount; i++) {
      const slice = bytes.subarray(i * BENCH_CHUNK_BYTES, Math.min(bytes.length, (i + 1) * BENCH_CHUNK_BYTES));
      await tx.insert(benchRecordChunks).values({ recordId: created.id, sequence: i, bytes: Buffer.from(slice.buffer, slice.byteOffset, slice.byteLength) });
    }
    const { analysis: _analysis, ...settings } = record;
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'bench-record.uploaded',
      entityType: 'bench-record',
      entityId: created.id,
      before: null,
      after: { ...settings, byteLength: bytes.length },
    });
    return { id: created.id };
  });
}

/** Withdraws a record (kept, flagged, with the reason); a record is withdrawn at most once. */
export async function withdrawBenchRecord({
  workspaceId,
  userId,
  recordId,
  reason,
}: {
  workspaceId: number;
  userId: number;
  recordId: number;
  reason: string;
}): Promise<{ status: 'withdrawn' } | { status: 'not-found' } | { status: 'already-withdrawn' }> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx
      .select({ id: benchRecords.id, withdrawnAt: benchRecords.withdrawnAt })
      .from(benchRecords)
      .where(and(eq(benchRecords.id, recordId), eq(benchRecords.workspaceId, workspaceId)))
      .for('update');
    if (!current) return { status: 'not-found' } as const;
    if (current.withdrawnAt) return { status: 'already-withdrawn' } as const;
    const withdrawnAt = new Date();
    await tx
      .update(benchRecords)
      .set({ withdrawnAt, withdrawnByUserId: userId, withdrawnReason: reason })
      .where(and(eq(benchRecords.id, recordId), eq(benchRecords.workspaceId, workspaceId)));
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'bench-record.withdrawn',
      entityType: 'bench-record',
      entityId: recordId,
      before: { withdrawnAt: null },
      after: { withdrawnAt: withdrawnAt.toISOString(), reason },
    });
    return { status: 'withdrawn' } as const;
  });
}
