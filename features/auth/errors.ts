/**
 * The app's typed errors and their one translation to an HTTP status and a user message.
 * Anything that is not an AppError (a database failure, a bug) becomes a 500 with a generic
 * message; its details are logged on the server and never sent to the client.
 */
import { NextResponse } from 'next/server';

export type AppErrorCode = 'unauthenticated' | 'forbidden' | 'not-found' | 'conflict' | 'invalid-input';

export const httpStatusByCode: Record<AppErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  'not-found': 404,
  conflict: 409,
  'invalid-input': 422,
};

const defaultMessages: Record<AppErrorCode, string> = {
  unauthenticated: 'Sign in to continue.',
  forbidden: 'Your role does not allow this.',
  'not-found': 'Not found.',
  conflict: 'This conflicts with a change made in the meantime.',
  'invalid-input': 'Some fields are not valid.',
};

export const unexpectedErrorMessage = 'Something went wrong on our side; nothing was changed. Please try again.';

export class AppError extends Error {
  readonly code: AppErrorCode;
  /** Field name → messages, for 'invalid-input'. */
  readonly fieldErrors?: Record<string, string[]>;

  constructor(code: AppErrorCode, message?: string, fieldErrors?: Record<string, string[]>) {
    super(message ?? defaultMessages[code]);
    this.name = 'AppError';
    this.code = code;
    this.fieldErrors = fieldErrors;
  }
}

export interface ErrorBody {
  error: { code: AppErrorCode | 'internal'; message: string; fieldErrors?: Record<string, string[]> };
}

/** The status and JSON body for any thrown value. */
export function describeError(error: unknown): { status: number; body: ErrorBody } {
  if (error instanceof AppError) {
    return {
      status: httpStatusByCode[error.code],
      body: { error: { code: error.code, message: error.message, fieldErrors: error.fieldErrors } },
    };
  }
  console.error('[channelsmith] unexpected error', error);
  return { status: 500, body: { error: { code: 'internal', message: unexpectedErrorMessage } } };
}

/** A route handler's response for any thrown value. */
export function errorResponse(error: unknown): NextResponse<ErrorBody> {
  const { status, body } = describeError(error);
  return NextResponse.json(body, { status });
}

/** The form state for a thrown value, for server actions (same translation as for route handlers). */
export function errorFormState(error: unknown): {
  status: 'error';
  message: string;
  fieldErrors: Record<string, string[]>;
} {
  const { body } = describeError(error);
  return { status: 'error', message: body.error.message, fieldErrors: body.error.fieldErrors ?? {} };
}
