'use client';
/**
 * Create or edit one part: kind (fixed once created), name, description, source note, status and
 * every parameter of the kind, typed with units ("8 nV/√Hz", "2.2 MΩ"). Values are checked as typed
 * and again by the server, whose message names the field.
 */
import { useId, useState, type FormEvent } from 'react';
import { ApiError } from '@/features/ui/fetch-json';
import { useSavePart, type PartBody } from '@/features/parts/api/mutations';
import { formatFieldValue, kindLabels, parameterSpecs, parseFieldText, specLabel, statusLabels } from '@/features/parts/part-display';
import type { LibraryPartDto } from '@/features/parts/types';
import { partKinds, partStatuses, type PartKind } from '@/lib/parts/part-kinds';

const inputClass =
  'mt-1 w-full rounded-md border border-ink-soft/40 bg-white px-3 py-2 text-sm focus:outline-none focus-visible:ring-2 focus-visible:ring-copper';

export function PartForm({ part, onDone }: { part?: LibraryPartDto; onDone: (message: string) => void }) {
  const formId = useId();
  const [kind, setKind] = useState<PartKind>(part?.kind ?? 'instrumentation-amplifier');
  const [name, setName] = useState(part?.name ?? '');
  const [description, setDescription] = useState(part?.description ?? '');
  const [sourceNote, setSourceNote] = useState(part?.sourceNote ?? '');
  const [status, setStatus] = useState<string>(part?.status ?? 'under-evaluation');
  const [texts, setTexts] = useState<Record<string, string>>(() =>
    part ? Object.fromEntries(parameterSpecs(part.kind).map((s) => [s.field, formatFieldValue(s, part.values[s.field])])) : {},
  );
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const save = useSavePart();
  const specs = parameterSpecs(kind);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const fieldErrors: Record<string, string> = {};
    const body: PartBody = { kind, name: name.trim(), description: description.trim(), sourceNote: sourceNote.trim(), status };
    if (body.name === '') fieldErrors.name = 'name is required';
    if (body.sourceNote === '') fieldErrors.sourceNote = 'source note is required (datasheet revision, measured or assumed)';
    for (const spec of specs) {
      const parsed = parseFieldText(spec, texts[spec.field] ?? '');
      if (!parsed.ok) fieldErrors[spec.field] = parsed.message;
      else if (parsed.value !== undefined) body[spec.field] = parsed.value;
    }
    setErrors(fieldErrors);
    if (Object.keys(fieldErrors).length > 0) {
      setFormError('Some fields are not valid; nothing was saved.');
      return;
    }
    setFormError(null);
    save.mutate(
      { id: part?.id, body },
      {
        onSuccess: (saved) => onDone(part ? `Saved "${saved.name}".` : `Added "${saved.name}" to the library.`),
        onError: (e) => {
          if (e instanceof ApiError && e.fieldErrors) setErrors(Object.fromEntries(Object.entries(e.fieldErrors).map(([f, m]) => [f, m.join('; ')])));
          setFormError(e instanceof Error ? e.message : 'Something went wrong; nothing was saved.');
        },
      },
    );
  };

  const field = (id: string, label: string, control: React.ReactNode, hint?: string) => (
    <div>
      <label htmlFor={`${formId}-${id}`} className="block text-sm font-medium">
        {label}
      </label>
      {control}
      {hint ? <p className="mt-1 text-xs text-ink-soft">{hint}</p> : null}
      {errors[id] ? (
        <p id={`${formId}-${id}-error`} className="mt-1 text-sm text-verdict-fails">
          {errors[id]}
        </p>
      ) : null}
    </div>
  );
  const describedBy = (id: string) => (errors[id] ? `${formId}-${id}-error` : undefined);

  return (
    <form onSubmit={submit} noValidate aria-label={part ? `Edit ${part.name}` : 'New part'} className="space-y-4 rounded-lg border border-ink-soft/20 bg-white p-4">
      <h2 className="text-lg font-semibold">{part ? `Edit ${part.name}` : 'New part'}</h2>
      <div className="grid gap-4 sm:grid-cols-2">
        {field(
          'kind',
          'Kind',
          <select
            id={`${formId}-kind`}
            className={inputClass}
            value={kind}
            disabled={Boolean(part)}
            onChange={(e) => {
              setKind(e.target.value as PartKind);
              setTexts({});
              setErrors({});
            }}
          >
            {partKinds.map((k) => (
              <option key={k} value={k}>
                {kindLabels[k]}
              </option>
            ))}
          </select>,
          part ? 'The kind of a part cannot change.' : undefined,
        )}
        {field(
          'status',
          'Status',
          <select id={`${formId}-status`} className={inputClass} value={status} onChange={(e) => setStatus(e.target.value)}>
            {partStatuses.map((s) => (
              <option key={s} value={s}>
                {statusLabels[s]}
              </option>
            ))}
          </select>,
        )}
        {field('name', 'Name', <input id={`${formId}-name`} className={inputClass} value={name} maxLength={120} aria-invalid={Boolean(errors.name)} aria-describedby={describedBy('name')} onChange={(e) => setName(e.target.value)} />, 'A generic name, no manufacturer part number.')}
        {field('sourceNote', 'Source note', <input id={`${formId}-sourceNote`} className={inputClass} value={sourceNote} maxLength={500} aria-invalid={Boolean(errors.sourceNote)} aria-describedby={describedBy('sourceNote')} onChange={(e) => setSourceNote(e.target.value)} />, 'Where the values come from: datasheet revision, measured, or assumed.')}
      </div>
      {field('description', 'Description', <input id={`${formId}-description`} className={inputClass} value={description} maxLength={500} onChange={(e) => setDescription(e.target.value)} />)}
      <fieldset className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold">Parameters (type the unit: “8 nV/√Hz”, “2.2 MΩ”, “47 nF”)</legend>
        {specs.map((spec) =>
          spec.type === 'enum' ? (
            <div key={spec.field}>
              {field(
                spec.field,
                specLabel(spec),
                <select id={`${formId}-${spec.field}`} className={inputClass} value={texts[spec.field] ?? ''} onChange={(e) => setTexts({ ...texts, [spec.field]: e.target.value })}>
                  <option value="">Choose…</option>
                  {spec.options.map((o) => (
                    <option key={o} value={o}>
                      {o}
                    </option>
                  ))}
                </select>,
              )}
            </div>
          ) : (
            <div key={spec.field}>
              {field(
                spec.field,
                `${specLabel(spec)}${spec.required ? '' : ' (optional)'}`,
                <input
                  id={`${formId}-${spec.field}`}
                  className={inputClass}
                  value={texts[spec.field] ?? ''}
                  aria-invalid={Boolean(errors[spec.field])}
                  aria-describedby={describedBy(spec.field)}
                  onChange={(e) => setTexts({ ...texts, [spec.field]: e.target.value })}
                />,
              )}
            </div>
          ),
        )}
      </fieldset>
      {formError ? (
        <p role="status" className="text-sm text-verdict-fails">
          {formError}
        </p>
      ) : null}
      <div className="flex gap-3">
        <button type="submit" disabled={save.isPending} className="rounded-md bg-copper px-4 py-2 text-sm font-medium text-white hover:bg-copper-dark focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-copper disabled:opacity-60">
          {save.isPending ? 'Saving…' : part ? 'Save part' : 'Add part'}
        </button>
        <button type="button" onClick={() => onDone('')} className="rounded-md border border-ink-soft/40 px-4 py-2 text-sm">
          Cancel
        </button>
      </div>
    </form>
  );
}
