import { NextResponse } from 'next/server';
import { createProgram, getProgramById, listPrograms } from '@/db/queries/programs';
import { requireSession } from '@/features/auth/guard';
import { parseJsonBody } from '@/app/api/programs/_shared/request';
import { toProgramDto } from '@/features/programs/types';
import { canEditPlans } from '@/lib/auth/permissions';
import { AppError, errorResponse } from '@/features/auth/errors';
import { createProgramBodySchema, listProgramsQuerySchema } from '@/app/api/programs/schema';

/** The workspace's programs. Every role may list them (regulators reach released revisions through them). */
export async function GET(request: Request) {
  try {
    const query = listProgramsQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) throw new AppError('invalid-input', query.error.issues.map((i) => i.message).join('; '));
    const member = await requireSession();
    const rows = await listPrograms({ workspaceId: member.workspaceId, includeArchived: query.data.archived === 'include' });
    return NextResponse.json({ programs: rows.map(toProgramDto) });
  } catch (error) {
    return errorResponse(error);
  }
}

/** Creates a program (engineers and admins). */
export async function POST(request: Request) {
  try {
    const input = await parseJsonBody(request, createProgramBodySchema);
    const member = await requireSession();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can create programs.');
    const { id } = await createProgram({
      workspaceId: member.workspaceId,
      userId: member.userId,
      name: input.name,
      description: input.description,
    });
    const program = await getProgramById({ workspaceId: member.workspaceId, programId: id });
    if (!program) throw new Error(`program ${id} not readable right after creation`);
    return NextResponse.json({ program: toProgramDto(program) }, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
