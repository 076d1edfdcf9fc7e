import { NextResponse } from 'next/server';
import { createPart, DuplicatePartNameError, getPartById, listParts } from '@/db/queries/parts';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { toPartOptionDto } from '@/features/plans/types';
import { canEditParts, canReadWorkInProgress } from '@/lib/auth/permissions';
import { validatePartInput } from '@/features/parts/part-input';
import { toLibraryPartDto } from '@/features/parts/types';
import { listPartsQuerySchema } from '@/app/api/parts/schema';

/** The workspace's part library (not retired), for plan forms. */
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

/**
 * Adds a part to the library (engineers and admins). Body: `kind` and that kind's fields, numbers in
 * SI units. A name already used by a part of the kind (retired parts included) is a 409.
 */
export async function POST(request: Request) {
  try {
    let raw: unknown;
    try {
      raw = await request.json();
    } catch {
      throw new AppError('invalid-input', 'The request body must be valid JSON.');
    }
    const input = validatePartInput(raw);
    if (!input.ok) throw new AppError('invalid-input', input.message, input.fieldErrors);
    const member = await requireSession();
    if (!canEditParts(member)) throw new AppError('forbidden', 'Only engineers and admins can add parts.');
    let id: number;
    try {
      ({ id } = await createPart({ workspaceId: member.workspaceId, userId: member.userId, part: input.part }));
    } catch (error) {
      if (error instanceof DuplicatePartNameError) throw new AppError('conflict', error.message, { name: [error.message] });
      throw error;
    }
    const part = await getPartById({ workspaceId: member.workspaceId, partId: id });
    return NextResponse.json({ part: toLibraryPartDto(part!) }, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
