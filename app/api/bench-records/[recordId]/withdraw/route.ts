import { NextResponse } from 'next/server';
import { getBenchRecordById, withdrawBenchRecord } from '@/db/queries/bench-records';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { canWriteBenchRecords } from '@/features/bench/access';
import { toBenchRecordDto } from '@/features/bench/types';
import { parseIdParam, parseJsonBody } from '@/app/api/parts/_shared/http';
import { withdrawBodySchema } from '@/app/api/bench-records/[recordId]/withdraw/schema';

/** Withdraws a record (engineers and admins): it is kept and listed, flagged, and no longer used by the export. */
export async function POST(request: Request, context: { params: Promise<{ recordId: string }> }) {
  try {
    const recordId = parseIdParam((await context.params).recordId, 'bench record');
    const { reason } = await parseJsonBody(request, withdrawBodySchema);
    const member = await requireSession();
    const record = await getBenchRecordById({ workspaceId: member.workspaceId, recordId });
    if (!record) throw new AppError('not-found', 'No such bench record in this workspace.');
    if (!canWriteBenchRecords(member)) throw new AppError('forbidden', 'Only engineers and admins can withdraw bench records.');
    const result = await withdrawBenchRecord({ workspaceId: member.workspaceId, userId: member.userId, recordId, reason });
    if (result.status === 'not-found') throw new AppError('not-found', 'No such bench record in this workspace.');
    if (result.status === 'already-withdrawn') throw new AppError('conflict', 'This bench record is already withdrawn.');
    const stored = await getBenchRecordById({ workspaceId: member.workspaceId, recordId });
    return NextResponse.json({ record: toBenchRecordDto(stored!) });
  } catch (error) {
    return errorResponse(error);
  }
}
