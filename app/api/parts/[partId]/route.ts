import { NextResponse } from 'next/server';
import { DuplicatePartNameError, getPartById, updatePart } from '@/db/queries/parts';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { validatePartInput } from '@/features/parts/part-input';
import { toLibraryPartDto } from '@/features/parts/types';
import { canEditParts, canReadWorkInProgress } from '@/lib/auth/permissions';
import { parseIdParam } from '@/app/api/parts/_shared/http';

type Context = { params: Promise<{ partId: string }> };

/** One part of the library. */
export async function GET(_request: Request, context: Context) {
  try {
    const partId = parseIdParam((await context.params).partId, 'part');
    const member = await requireSession();
    if (!canReadWorkInProgress(member)) throw new AppError('forbidden', 'The part library is not shared with regulators.');
    const part = await getPartById({ workspaceId: member.workspaceId, partId });
    if (!part) throw new AppError('not-found', 'No such part.');
    return NextResponse.json({ part: toLibraryPartDto(part) });
  } catch (error) {
    return errorResponse(error);
  }
}

/** Replaces a part's content (engineers and admins); its kind cannot change. */
export async function PUT(request: Request, context: Context) {
  try {
    const partId = parseIdParam((await context.params).partId, 'part');
    let raw: unknown;
    try {
      raw = await request.json();
    } catch {
      throw new AppError('invalid-input', 'The request body must be valid JSON.');
    }
    const member = await requireSession();
    const current = await getPartById({ workspaceId: member.workspaceId, partId });
    if (!current) throw new AppError('not-found', 'No such part.');
    if (!canEditParts(member)) throw new AppError('forbidden', 'Only engineers and admins can edit parts.');
    const input = validatePartInput(raw, current.kind);
    if (!input.ok) throw new AppError('invalid-input', input.message, input.fieldErrors);
    const { kind: _kind, ...content } = input.part;
    let result;
    try {
      result = await updatePart({ workspaceId: member.workspaceId, userId: member.userId, partId, part: content });
    } catch (error) {
      if (error instanceof DuplicatePartNameError) throw new AppError('conflict', error.message, { name: [error.message] });
      throw error;
    }
    if (result.status === 'not-found') throw new AppError('not-found', 'No such part.');
    if (result.status === 'retired') throw new AppError('conflict', 'This part is retired; retired parts cannot be edited.');
    const part = await getPartById({ workspaceId: member.workspaceId, partId });
    return NextResponse.json({ part: toLibraryPartDto(part!), status: result.status });
  } catch (error) {
    return errorResponse(error);
  }
}
