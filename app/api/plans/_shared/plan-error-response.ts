import 'server-only';
import { NextResponse } from 'next/server';
import { StalePlanError } from '@/db/queries/plans';
import { errorResponse } from '@/features/auth/errors';
import { PlanValidationError } from '@/lib/engine/validate';

/**
 * The plan routes' one translation of errors to responses: a stale save is 409 with the stored
 * plan, an invalid plan 422 with every field path; everything else goes through `errorResponse`.
 */
export function planErrorResponse(error: unknown): NextResponse {
  if (error instanceof StalePlanError) {
    return NextResponse.json(
      {
        error: { code: 'stale', message: error.message },
        current: {
          plan: error.current.plan,
          version: error.current.version,
          updatedByName: error.current.updatedByName,
          updatedAt: error.current.updatedAt.toISOString(),
        },
      },
      { status: 409 },
    );
  }
  if (error instanceof PlanValidationError) {
    const count = error.issues.length;
    return NextResponse.json(
      {
        error: {
          code: 'invalid',
          message: `The plan has ${count} invalid field${count === 1 ? '' : 's'}; nothing was saved.`,
          issues: error.issues,
        },
      },
      { status: 422 },
    );
  }
  return errorResponse(error);
}
