import { NextResponse } from 'next/server';
import { getProgramById, updateProgram } from '@/db/queries/programs';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { toProgramDto } from '@/features/programs/types';
import { canEditPlans } from '@/lib/auth/permissions';
import { updateProgramBodySchema } from '@/app/api/programs/[programId]/schema';

type Context = { params: Promise<{ programId: string }> };

const notFound = () => new AppError('not-found', 'No such program in this workspace.');

/** One program of the member's workspace; a foreign or unknown id is 404. */
export async function GET(_request: Request, context: Context) {
  try {
    const programId = parseIdParam((await context.params).programId, 'program');
    const member = await requireSession();
    const program = await getProgramById({ workspaceId: member.workspaceId, programId });
    if (!program) throw notFound();
    return NextResponse.json({ program: toProgramDto(program) });
  } catch (error) {
    return errorResponse(error);
  }
}

/** Rename, re-describe, archive or restore (engineers and admins). */
export async function PATCH(request: Request, context: Context) {
  try {
    const programId = parseIdParam((await context.params).programId, 'program');
    const input = await parseJsonBody(request, updateProgramBodySchema);
    const member = await requireSession();
    const existing = await getProgramById({ workspaceId: member.workspaceId, programId });
    if (!existing) throw notFound();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can change programs.');
    const result = await updateProgram({ workspaceId: member.workspaceId, programId, userId: member.userId, ...input });
    if (result.status === 'not-found') throw notFound();
    const program = await getProgramById({ workspaceId: member.workspaceId, programId });
    if (!program) throw notFound();
    return NextResponse.json({ program: toProgramDto(program) });
  } catch (error) {
    return errorResponse(error);
  }
}
