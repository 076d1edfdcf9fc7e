import { NextResponse } from 'next/server';
import { getReviewRecord } from '@/db/queries/reviews';
import { recordRevisionExport } from '@/db/queries/revisions';
import { AppError, errorResponse } from '@/features/auth/errors';
import { getBenchExportForRevision } from '@/features/bench/bench-export';
import { parseIdParam } from '@/app/api/programs/_shared/request';
import { rationaleJsonText, toRationaleJson } from '@/features/rationale-export/json-export';
import { renderRationalePdf } from '@/features/rationale-export/render-pdf';
import { canExport } from '@/lib/auth/permissions';
import { loadReadableRevision } from '@/app/api/revisions/_shared/access';
import { rationaleDataFor } from '@/app/api/revisions/_shared/rationale-data';

type Context = { params: Promise<{ revisionId: string }> };

const formats = ['pdf', 'json'] as const;

/** A file name without characters that trouble file systems or headers. */
function fileName(planName: string, label: string, extension: string): string {
  const base = planName.normalize('NFKD').replace(/[^A-Za-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80) || 'plan';
  return `${base}-revision-${label}-rationale.${extension}`;
}

/**
 * GET ?format=pdf|json: the design rationale of a revision (every role that may read it; a
 * regulator only for released and superseded revisions). Each export is recorded in the audit trail.
 */
export async function GET(request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const format = new URL(request.url).searchParams.get('format') ?? '';
    if (!(formats as readonly string[]).includes(format)) {
      throw new AppError('invalid-input', `format must be pdf or json (got "${format.slice(0, 20)}")`, { format: ['must be pdf or json'] });
    }
    const { member, revision } = await loadReadableRevision(revisionId);
    if (!canExport(member)) throw new AppError('forbidden', 'Your role cannot export.');
    const review = await getReviewRecord({ workspaceId: member.workspaceId, revisionId });
    const bench = await getBenchExportForRevision({ workspaceId: member.workspaceId, revisionId });
    const data = rationaleDataFor(revision, review, { name: member.name }, new Date(), bench);

    let body: Uint8Array | string;
    let contentType: string;
    if (format === 'pdf') {
      body = await renderRationalePdf(data);
      contentType = 'application/pdf';
    } else {
      body = rationaleJsonText(toRationaleJson(data));
      contentType = 'application/json; charset=utf-8';
    }
    await recordRevisionExport({
      workspaceId: member.workspaceId,
      revisionId,
      userId: member.userId,
      format: format as 'pdf' | 'json',
      contentHash: revision.contentHash,
    });
    return new NextResponse(body as BodyInit, {
      status: 200,
      headers: {
        'Content-Type': contentType,
        'Content-Disposition': `attachment; filename="${fileName(revision.planName, revision.label, format)}"`,
        'Cache-Control': 'no-store',
      },
    });
  } catch (error) {
    return errorResponse(error);
  }
}
