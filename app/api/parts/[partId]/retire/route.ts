import { NextResponse } from 'next/server';
import { getPartById, retirePart } from '@/db/queries/parts';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { toLibraryPartDto } from '@/features/parts/types';
import { canEditParts } from '@/lib/auth/permissions';
import { parseIdParam } from '@/app/api/parts/_shared/http';

/** Retires a part (engineers and admins): it leaves the plan forms; the row, its name and its history stay. */
export async function POST(_request: Request, context: { params: Promise<{ partId: string }> }) {
  try {
    const partId = parseIdParam((await context.params).partId, 'part');
    const member = await requireSession();
    const current = await getPartById({ workspaceId: member.workspaceId, partId });
    if (!current) throw new AppError('not-found', 'No such part.');
    if (!canEditParts(member)) throw new AppError('forbidden', 'Only engineers and admins can retire parts.');
    const result = await retirePart({ workspaceId: member.workspaceId, userId: member.userId, partId });
    if (result.status === 'not-found') throw new AppError('not-found', 'No such part.');
    if (result.status === 'already-retired') throw new AppError('conflict', 'This part is already retired.');
    const part = await getPartById({ workspaceId: member.workspaceId, partId });
    return NextResponse.json({ part: toLibraryPartDto(part!) });
  } catch (error) {
    return errorResponse(error);
  }
}
