import { createHash } from 'node:crypto';
import { NextResponse } from 'next/server';
import { createBenchRecord, getBenchRecordById, listBenchRecords } from '@/db/queries/bench-records';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { canWriteBenchRecords } from '@/features/bench/access';
import { analyzeForRevision, BENCH_MAX_BYTES, benchUploadFieldsSchema, readBenchRecord, storedAnalysis } from '@/features/bench/record-analysis';
import { toBenchRecordDto } from '@/features/bench/types';
import { formFields, parseIdParam, readUploadForm, zodError } from '@/app/api/parts/_shared/http';
import { loadBenchRevision, revisionNotFound } from '@/app/api/bench-records/_shared/load';
import { getRevisionForBench } from '@/db/queries/bench-records';

type Context = { params: Promise<{ revisionId: string }> };

/** The revision's bench records (withdrawn ones too, flagged), newest first. */
export async function GET(_request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const { member } = await loadBenchRevision(revisionId);
    const rows = await listBenchRecords({ workspaceId: member.workspaceId, revisionId });
    return NextResponse.json({ records: rows.map(toBenchRecordDto) });
  } catch (error) {
    return errorResponse(error);
  }
}

/**
 * Uploads a bench record to the revision (engineers and admins): multipart with `file` (CSV or EDF,
 * at most 20 MB, told apart by content) and the settings (channel, unit, gainMode, gainVPerV,
 * sampleRateHz, note). The file is read and analysed first; a malformed file, or one that cannot be
 * analysed with the revision's conditions, is refused with the reader's message and nothing is stored.
 */
export async function POST(request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    // Role before reading the (up to 20 MB) body: a refused caller uploads nothing.
    const member = await requireSession();
    const revision = await getRevisionForBench({ workspaceId: member.workspaceId, revisionId });
    if (!revision) throw revisionNotFound();
    if (!canWriteBenchRecords(member)) throw new AppError('forbidden', 'Only engineers and admins can upload bench records.');
    const { form, file, bytes } = await readUploadForm(request, { maxBytes: BENCH_MAX_BYTES, limitText: '20 MB' });
    const fields = benchUploadFieldsSchema.safeParse(formFields(form));
    if (!fields.success) throw zodError(fields.error);
    const settings = fields.data;

    const read = readBenchRecord(bytes, settings);
    if (!read.ok) throw new AppError('invalid-input', `${read.field}: ${read.message}; nothing was stored`, { [read.field]: [read.message] });
    const gainVPerV = settings.gainMode === 'gain-to-apply' ? settings.gainVPerV! : 1;
    const analysed = analyzeForRevision(read.signal, gainVPerV, revision.plan, revision.report);
    if (!analysed.ok) throw new AppError('invalid-input', `file: ${analysed.message}; nothing was stored`, { file: [analysed.message] });

    const { id } = await createBenchRecord({
      workspaceId: member.workspaceId,
      userId: member.userId,
      bytes,
      record: {
        planId: revision.planId,
        revisionId,
        fileName: (file.name || `record.${read.format}`).slice(0, 255),
        format: read.format,
        sha256: createHash('sha256').update(bytes).digest('hex'),
        channel: read.signal.label.slice(0, 120),
        unit: read.format === 'csv' ? settings.unit! : null,
        sampleRateGivenHz: read.format === 'csv' ? (settings.sampleRateHz ?? null) : null,
        gainMode: settings.gainMode,
        gainVPerV,
        note: settings.note,
        analysis: storedAnalysis(analysed),
        comparison: analysed.comparison,
      },
    });
    const stored = await getBenchRecordById({ workspaceId: member.workspaceId, recordId: id });
    return NextResponse.json({ record: toBenchRecordDto(stored!) }, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
