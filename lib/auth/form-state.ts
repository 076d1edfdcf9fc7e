/**
 * The typed state a server action returns to its form (read with React's useActionState):
 * field errors by field name, a form-level message, and the values to put back in the fields.
 */
export type FormState<TField extends string = string> =
  | { status: 'idle' }
  | {
      status: 'error';
      message?: string;
      fieldErrors: Partial<Record<TField, string[]>>;
      values?: Partial<Record<TField, string>>;
    }
  | { status: 'success'; message: string };

export const idleFormState = { status: 'idle' } as const satisfies FormState;

/** Field errors from a zod error's flattened form (first message per field is what forms show). */
export function fieldErrorsFromIssues<TField extends string>(
  issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }>,
): Partial<Record<TField, string[]>> {
  const errors: Partial<Record<TField, string[]>> = {};
  for (const issue of issues) {
    const field = String(issue.path[0] ?? 'form') as TField;
    (errors[field] ??= []).push(issue.message);
  }
  return errors;
}
