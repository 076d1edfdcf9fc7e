/**
 * Small shared form pieces with the app's look: labelled fields with their error text tied to
 * the input (aria-describedby), buttons, and status messages.
 */
import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from 'react';

const controlClass =
  'mt-1 block w-full rounded-md border border-ink-soft/40 bg-white px-3 py-2 text-ink shadow-sm ' +
  'focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/40 aria-[invalid=true]:border-verdict-fails';

export function Field({
  label,
  name,
  errors,
  hint,
  ...input
}: { label: string; name: string; errors?: string[]; hint?: string } & InputHTMLAttributes<HTMLInputElement>) {
  const id = `field-${name}`;
  const describedBy = [errors?.length ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ');
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      <input
        id={id}
        name={name}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={controlClass}
        {...input}
      />
      {hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      ) : null}
      {errors?.length ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-verdict-fails">
          {errors[0]}
        </p>
      ) : null}
    </div>
  );
}

export function SelectField({
  label,
  name,
  errors,
  children,
  id: idOverride,
  ...select
}: { label: string; name: string; errors?: string[]; children: ReactNode } & SelectHTMLAttributes<HTMLSelectElement>) {
  const id = idOverride ?? `field-${name}`;
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      <select
        id={id}
        name={name}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? `${id}-error` : undefined}
        className={controlClass}
        {...select}
      >
        {children}
      </select>
      {errors?.length ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-verdict-fails">
          {errors[0]}
        </p>
      ) : null}
    </div>
  );
}

export function SubmitButton({ children, pending }: { children: ReactNode; pending?: boolean }) {
  return (
    <button
      type="submit"
      disabled={pending}
      className="inline-flex items-center justify-center rounded-md bg-copper-dark px-4 py-2 font-medium text-white hover:bg-copper disabled:opacity-60"
    >
      {pending ? 'Working…' : children}
    </button>
  );
}

/** A form-level message; errors are announced to screen readers at once. */
export function FormMessage({ tone, children }: { tone: 'error' | 'success'; children: ReactNode }) {
  return tone === 'error' ? (
    <p role="alert" className="rounded-md border border-verdict-fails/30 bg-red-50 px-3 py-2 text-sm text-verdict-fails">
      {children}
    </p>
  ) : (
    <p role="status" className="rounded-md border border-verdict-meets/30 bg-green-50 px-3 py-2 text-sm text-verdict-meets">
      {children}
    </p>
  );
}
