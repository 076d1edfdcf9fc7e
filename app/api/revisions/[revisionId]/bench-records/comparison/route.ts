import { NextResponse } from 'next/server';
import { errorResponse } from '@/features/auth/errors';
import { getBenchExportForRevision } from '@/features/bench/bench-export';
import { parseIdParam } from '@/app/api/parts/_shared/http';
import { loadBenchRevision } from '@/app/api/bench-records/_shared/load';

/**
 * The revision's bench comparison as the design-rationale export takes it:
 * `{ bench: { rows: [{ quantity, predicted, measured, ratio, within }], record } }`, or `{ bench: null }`
 * when no record (that is not withdrawn) is attached.
 */
export async function GET(_request: Request, context: { params: Promise<{ revisionId: string }> }) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const { member } = await loadBenchRevision(revisionId);
    const bench = await getBenchExportForRevision({ workspaceId: member.workspaceId, revisionId });
    return NextResponse.json({ bench: bench ?? null });
  } catch (error) {
    return errorResponse(error);
  }
}
