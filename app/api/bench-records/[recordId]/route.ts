import { NextResponse } from 'next/server';
import { getBenchRecordById, getBenchRecordBytes } from '@/db/queries/bench-records';
import { AppError, errorResponse } from '@/features/auth/errors';
import { analyzeForRevision, readBenchRecord, traceForPlot } from '@/features/bench/record-analysis';
import { toBenchRecordDto, type BenchRecordDetailDto } from '@/features/bench/types';
import { parseIdParam } from '@/app/api/parts/_shared/http';
import { loadBenchRevision } from '@/app/api/bench-records/_shared/load';
import { requireSession } from '@/features/auth/guard';

const recordNotFound = () => new AppError('not-found', 'No such bench record in this workspace.');

/** One record with its trace and spectrum, recomputed from the stored file with its stored settings. */
export async function GET(_request: Request, context: { params: Promise<{ recordId: string }> }) {
  try {
    const recordId = parseIdParam((await context.params).recordId, 'bench record');
    const session = await requireSession();
    const record = await getBenchRecordById({ workspaceId: session.workspaceId, recordId });
    if (!record) throw recordNotFound();
    const { member, revision } = await loadBenchRevision(record.revisionId);
    const bytes = await getBenchRecordBytes({ workspaceId: member.workspaceId, recordId });
    if (!bytes) throw recordNotFound();
    const read = readBenchRecord(bytes, { channel: record.channel, unit: record.unit ?? undefined, sampleRateHz: record.sampleRateGivenHz ?? undefined });
    if (!read.ok) throw new Error(`stored bench record ${recordId} no longer reads: ${read.message}`);
    const analysed = analyzeForRevision(read.signal, record.gainVPerV, revision.plan, revision.report);
    if (!analysed.ok) throw new Error(`stored bench record ${recordId} no longer analyses: ${analysed.message}`);
    const detail: BenchRecordDetailDto = {
      ...toBenchRecordDto(record),
      trace: traceForPlot(read.signal, record.gainVPerV, analysed.analysis.windowS),
      spectrum: analysed.analysis.spectrum,
    };
    return NextResponse.json({ record: detail });
  } catch (error) {
    return errorResponse(error);
  }
}
