import { NextResponse } from 'next/server';
import { createImportedPlan } from '@/db/queries/revisions';
import { getProgramById } from '@/db/queries/programs';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { computePlan } from '@/features/plans/compute-plan';
import { parseIdParam } from '@/app/api/programs/_shared/request';
import { planFromRationaleJson, RATIONALE_JSON_MAX_CHARS, RationaleJsonError } from '@/features/rationale-export/json-export';
import { canEditPlans } from '@/lib/auth/permissions';
import { regulatorNeverWrites } from '@/app/api/revisions/_shared/access';

type Context = { params: Promise<{ programId: string }> };

/**
 * Creates a plan in the program from an exported design-rationale JSON (the request body is the
 * document). The plan is validated field by field and its report recomputed on the server; the
 * document's own report is not trusted. Engineers and admins. 201 `{ plan: { id, name } }`;
 * 422 `{ error: { issues } }` naming every bad field.
 */
export async function POST(request: Request, context: Context) {
  try {
    const programId = parseIdParam((await context.params).programId, 'program');
    const declared = Number(request.headers.get('content-length') ?? '0');
    if (declared > RATIONALE_JSON_MAX_CHARS) {
      throw new AppError('invalid-input', `The document is larger than ${RATIONALE_JSON_MAX_CHARS} characters; nothing was imported.`);
    }
    const text = await request.text();
    let plan;
    try {
      plan = planFromRationaleJson(text);
    } catch (error) {
      if (error instanceof RationaleJsonError) {
        return NextResponse.json(
          { error: { code: 'invalid-input', message: `${error.message}. Nothing was imported.`, issues: error.issues } },
          { status: 422 },
        );
      }
      throw error;
    }
    const member = await requireSession();
    const program = await getProgramById({ workspaceId: member.workspaceId, programId });
    if (!program) throw new AppError('not-found', 'No such program in this workspace.');
    if (member.role === 'regulator') throw regulatorNeverWrites();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can import plans.');
    const computed = computePlan(plan);
    const doc = JSON.parse(text) as { revision?: { label?: unknown }; contentHash?: unknown; planName?: unknown };
    const result = await createImportedPlan({
      workspaceId: member.workspaceId,
      programId,
      userId: member.userId,
      name: String(computed.plan.name),
      computed,
      source: {
        format: 'channelsmith-rationale',
        revisionLabel: typeof doc.revision?.label === 'string' ? doc.revision.label : null,
        contentHash: typeof doc.contentHash === 'string' ? doc.contentHash : null,
        planName: typeof doc.planName === 'string' ? doc.planName : null,
      },
    });
    if (result.status === 'not-found') throw new AppError('not-found', 'No such program in this workspace.');
    if (result.status === 'program-archived') throw new AppError('conflict', 'This program is archived; restore it before importing plans.');
    return NextResponse.json({ plan: { id: String(result.id), name: String(computed.plan.name) } }, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
