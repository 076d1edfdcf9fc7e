import { NextResponse } from 'next/server';
import { listParts } from '@/db/queries/parts';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { toPartOptionDto } from '@/features/plans/types';
import { canReadWorkInProgress } from '@/lib/auth/permissions';
import { listPartsQuerySchema } from '@/app/api/parts/schema';

/** The workspace's part library (not retired), for plan forms. Read-only for now. */
export async function GET(request: Request) {
  try {
    const query = listPartsQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) throw new AppError('invalid-input', query.error.issues.map((i) => i.message).join('; '));
    const member = await requireSession();
    if (!canReadWorkInProgress(member)) throw new AppError('forbidden', 'The part library is not shared with regulators.');
    const rows = await listParts({ workspaceId: member.workspaceId, kind: query.data.kind });
    return NextResponse.json({ parts: rows.map(toPartOptionDto) });
  } catch (error) {
    return errorResponse(error);
  }
}
