import { NextResponse } from 'next/server';
import { listLibraryParts } from '@/db/queries/parts';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { toLibraryPartDto } from '@/features/parts/types';
import { canReadWorkInProgress } from '@/lib/auth/permissions';

/** The whole part library of the workspace, retired parts included, for the library screen. */
export async function GET() {
  try {
    const member = await requireSession();
    if (!canReadWorkInProgress(member)) throw new AppError('forbidden', 'The part library is not shared with regulators.');
    const rows = await listLibraryParts({ workspaceId: member.workspaceId });
    return NextResponse.json({ parts: rows.map(toLibraryPartDto) });
  } catch (error) {
    return errorResponse(error);
  }
}
