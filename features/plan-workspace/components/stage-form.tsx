'use client';
/**
 * The form of one stage: every value typed with its unit, parsed as the user types, errors at
 * the field (aria-invalid + aria-describedby). Valid edits go straight into the draft plan so the
 * results recompute; an invalid entry stays in the input (nothing typed is lost) and the results
 * keep the last valid value.
 */
import { useEffect, useMemo, useRef } from 'react';
import { useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { fieldKey, getAt, stageFields, stages, type FieldDef, type StageId } from '@/features/plan-workspace/stage-fields';
import { textToValue, valueToDisplay, valueToText, firstStageGain, gainResistorFor, type PartOption, type PlanDraft } from '@/features/plan-workspace/plan-edit';
import { formatEng } from '@/features/plan-workspace/format';

type FormValues = Record<string, string | boolean>;

/** The zod schema of a stage form: each field's text must parse into its unit. */
function stageFormSchema(fields: FieldDef[]) {
  const shape: Record<string, z.ZodType> = {};
  for (const f of fields) {
    const key = fieldKey(f.path);
    if (f.kind === 'boolean') {
      shape[key] = z.boolean();
      continue;
    }
    shape[key] = z.string().superRefine((text, ctx) => {
      const parsed = textToValue(f, text);
      if (!parsed.ok) ctx.addIssue({ code: 'custom', message: parsed.message });
    });
  }
  return z.object(shape);
}

/** The initial text of each field: what was typed before (kept across reopening), else the plan's value. */
export function initialFormValues(stageId: StageId, plan: PlanDraft, typed: Record<string, string | boolean>): FormValues {
  const values: FormValues = {};
  for (const f of stageFields[stageId]) {
    const key = fieldKey(f.path);
    if (key in typed) values[key] = typed[key];
    else if (f.kind === 'boolean') values[key] = getAt(plan, f.path) === true;
    else values[key] = valueToText(f, getAt(plan, f.path));
  }
  return values;
}

interface StageFormProps {
  stageId: StageId;
  plan: PlanDraft;
  /** Text typed so far per field key (kept by the workspace). */
  typed: Record<string, string | boolean>;
  /** Issues from plan validation or the server, keyed by dotted path. */
  issues: Record<string, string>;
  parts: PartOption[];
  /** A valid field edit. Returns the plan after the edit, so dependent fields can be refreshed. */
  onEdit: (path: string[], value: unknown) => PlanDraft;
  /** Every keystroke, valid or not, with whether the text parsed. */
  onTyped: (key: string, text: string | boolean, valid: boolean) => void;
  onChoosePart: (part: PartOption) => void;
  onClose: () => void;
}

export function StageForm({ stageId, plan, typed, issues, parts, onEdit, onTyped, onChoosePart, onClose }: StageFormProps) {
  const info = stages[stageId];
  const fields = stageFields[stageId];
  const schema = useMemo(() => stageFormSchema(fields), [fields]);
  const {
    register,
    watch,
    setValue,
    trigger,
    formState: { errors },
  } = useForm<FormValues>({
    defaultValues: initialFormValues(stageId, plan, typed),
    // The schema is built from the field list, so its inferred type is a plain record; it checks exactly FormValues.
    resolver: zodResolver(schema) as unknown as Resolver<FormValues>,
    mode: 'onChange',
  });

  // Latest props for the subscription below (it is created once).
  const latest = useRef({ plan, onEdit, onTyped });
  latest.current = { plan, onEdit, onTyped };
  const echo = useRef(false);

  useEffect(() => {
    // Show errors of text that was typed earlier and is still invalid.
    if (Object.keys(typed).some((k) => fields.some((f) => fieldKey(f.path) === k))) void trigger();
    const subscription = watch((values, { name }) => {
      if (!name || echo.current) return;
      const f = fields.find((x) => fieldKey(x.path) === name);
      if (!f) return;
      const text = values[name] as string | boolean;
      const parsed = textToValue(f, text);
      latest.current.onTyped(name, text, parsed.ok);
      if (!parsed.ok) return;
      const before = latest.current.plan;
      const after = latest.current.onEdit(f.path, parsed.value);
      // Refresh fields that the edit changed indirectly (Rg ⇄ target gain, body model).
      echo.current = true;
      try {
        for (const other of fields) {
          if (other === f) continue;
          const was = getAt(before, other.path);
          const now = getAt(after, other.path);
          if (JSON.stringify(was) === JSON.stringify(now)) continue;
          const key = fieldKey(other.path);
          const nextText = other.kind === 'boolean' ? now === true : valueToText(other, now);
          setValue(key, nextText, { shouldValidate: true });
          latest.current.onTyped(key, nextText, true);
        }
      } finally {
        echo.current = false;
      }
    });
    return () => subscription.unsubscribe();
    // The form is remounted (key) when the plan changes from outside; fields are fixed per stage.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  /** On leaving a field, a valid entry is shown back in engineering notation with its unit ("51k" → "51 kΩ"). */
  const normalize = (f: FieldDef, text: string) => {
    if (f.kind !== 'quantity' && f.kind !== 'percent' && f.kind !== 'number') return;
    const parsed = textToValue(f, text);
    if (!parsed.ok) return;
    const canonical = valueToText(f, parsed.value);
    if (canonical === text) return;
    echo.current = true;
    try {
      setValue(fieldKey(f.path), canonical, { shouldValidate: true });
    } finally {
      echo.current = false;
    }
    latest.current.onTyped(fieldKey(f.path), canonical, true);
  };

  const matchingParts = info.partKind ? parts.filter((p) => p.kind === info.partKind) : [];
  const visible = fields.filter((f) => !f.visibleWhen || f.visibleWhen(plan));
  const headingId = `stage-form-${stageId}-title`;

  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-copper/40 bg-white p-4 shadow-sm">
      <div className="mb-3 flex items-center justify-between gap-4">
        <h3 id={headingId} className="text-base font-semibold text-ink">
          {info.title}
        </h3>
        <button type="button" onClick={onClose} className="rounded px-2 py-1 text-sm text-ink-soft underline-offset-2 hover:underline focus-visible:outline-2 focus-visible:outline-copper">
          Close {info.noun} form
        </button>
      </div>
      {matchingParts.length > 0 && (
        <div className="mb-4">
          <label htmlFor={`part-${stageId}`} className="block text-sm font-medium text-ink">
            Fill from part library
          </label>
          <select
            id={`part-${stageId}`}
            className="mt-1 w-full max-w-md rounded border border-slate-300 px-2 py-1.5 text-sm"
            defaultValue=""
            onChange={(e) => {
              const part = matchingParts.find((p) => p.id === e.target.value);
              if (part) onChoosePart(part);
              e.target.value = '';
            }}
          >
            <option value="">Choose a part…</option>
            {matchingParts.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name} ({p.status})
              </option>
            ))}
          </select>
        </div>
      )}
      <form className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-2 xl:grid-cols-3" onSubmit={(e) => e.preventDefault()} noValidate>
        {visible.map((f) => (
          <FieldInput key={fieldKey(f.path)} field={f} plan={plan} register={register} errors={errors} issues={issues} onNormalize={normalize} />
        ))}
      </form>
    </section>
  );
}

function FieldInput({
  field,
  plan,
  register,
  errors,
  issues,
  onNormalize,
}: {
  field: FieldDef;
  plan: PlanDraft;
  register: ReturnType<typeof useForm<FormValues>>['register'];
  errors: FieldErrors<FormValues>;
  issues: Record<string, string>;
  onNormalize: (field: FieldDef, text: string) => void;
}) {
  const key = fieldKey(field.path);
  const id = `field-${key}`;
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const dotted = field.path.join('.');
  const message = (errors[key]?.message as string | undefined) ?? issues[dotted];
  const derived = derivedHint(field, plan);
  const hint = [field.hint, derived].filter(Boolean).join(' · ');
  const unitId = `${id}-unit`;
  const unitText = field.kind === 'quantity' ? field.symbol : field.kind === 'percent' ? '%' : field.kind === 'number' ? (field.suffix ?? '') : '';
  // The unit is described rather than part of the label, so the accessible name is exactly the label ("Gain resistance Rg").
  const describedBy = [message ? errorId : null, hint ? hintId : null, unitText ? unitId : null].filter(Boolean).join(' ') || undefined;
  const inputClass = `mt-1 w-full rounded border px-2 py-1.5 text-sm ${message ? 'border-verdict-fails ring-1 ring-verdict-fails' : 'border-slate-300'}`;

  if (field.kind === 'boolean') {
    return (
      <div className="flex items-start gap-2 pt-5">
        <input id={id} type="checkbox" className="mt-1 h-4 w-4 accent-copper" aria-describedby={describedBy} {...register(key)} />
        <label htmlFor={id} className="text-sm font-medium text-ink">
          {field.label}
        </label>
      </div>
    );
  }
  return (
    <div>
      <div className="flex items-baseline gap-1 text-sm">
        <label htmlFor={id} className="font-medium text-ink">
          {field.label}
        </label>
        {unitText && (
          <span aria-hidden="true" className="text-ink-soft">
            ({unitText})
          </span>
        )}
      </div>
      {unitText && (
        <span id={unitId} className="sr-only">
          unit {unitText}
        </span>
      )}
      {field.kind === 'select' ? (
        <select id={id} className={inputClass} aria-invalid={message ? true : undefined} aria-describedby={describedBy} {...register(key)}>
          {field.options.map((o) => (
            <option key={String(o.value)} value={String(o.value)}>
              {o.label}
            </option>
          ))}
        </select>
      ) : (
        <input
          id={id}
          type="text"
          inputMode={field.kind === 'text' ? 'text' : 'decimal'}
          autoComplete="off"
          spellCheck={false}
          className={inputClass}
          aria-invalid={message ? true : undefined}
          aria-describedby={describedBy}
          placeholder={derivedPlaceholder(field, plan)}
          {...register(key, { onBlur: (e: React.FocusEvent<HTMLInputElement>) => onNormalize(field, e.target.value) })}
        />
      )}
      {hint && (
        <p id={hintId} className="mt-0.5 text-xs text-ink-soft">
          {hint}
        </p>
      )}
      {message && (
        <p id={errorId} className="mt-0.5 text-xs font-medium text-verdict-fails">
          {message}
        </p>
      )}
    </div>
  );
}

/** The derived value shown in the empty one of Rg / first-stage gain. */
function derivedPlaceholder(field: FieldDef, plan: PlanDraft): string | undefined {
  const dotted = field.path.join('.');
  const rOhm = getAt(plan, ['instrumentation', 'rOhm']);
  const rgOhm = getAt(plan, ['instrumentation', 'rgOhm']);
  const gain = getAt(plan, ['instrumentation', 'targetGain']);
  if (typeof rOhm !== 'number') return undefined;
  if (dotted === 'instrumentation.targetGain' && typeof rgOhm === 'number') return `${formatEng(firstStageGain(rOhm, rgOhm), '', { digits: 4 })} (from Rg)`;
  if (dotted === 'instrumentation.rgOhm' && typeof gain === 'number') return `${formatEng(gainResistorFor(rOhm, gain), 'Ω', { digits: 4 })} (from G1)`;
  return undefined;
}

/** "G1 = 11 from Rg" under the first-stage gain when Rg drives it, and the reverse. */
function derivedHint(field: FieldDef, plan: PlanDraft): string | undefined {
  const dotted = field.path.join('.');
  const rOhm = getAt(plan, ['instrumentation', 'rOhm']);
  const rgOhm = getAt(plan, ['instrumentation', 'rgOhm']);
  const gain = getAt(plan, ['instrumentation', 'targetGain']);
  if (typeof rOhm !== 'number') return undefined;
  if (dotted === 'instrumentation.targetGain' && typeof rgOhm === 'number' && gain === undefined) {
    return `set by Rg: G1 = ${formatEng(firstStageGain(rOhm, rgOhm), '', { digits: 4 })}`;
  }
  if (dotted === 'instrumentation.rgOhm' && typeof gain === 'number' && rgOhm === undefined) {
    return `set by the first-stage gain: Rg = ${formatEng(gainResistorFor(rOhm, gain), 'Ω', { digits: 4 })}`;
  }
  if (dotted === 'instrumentation.rgOhm' || dotted === 'instrumentation.targetGain') return 'type either; the one typed last sets the other';
  return undefined;
}

/** Read-only view of a stage: the same values as text, no inputs. */
export function StageValues({ stageId, plan, onClose }: { stageId: StageId; plan: PlanDraft; onClose: () => void }) {
  const info = stages[stageId];
  const headingId = `stage-values-${stageId}-title`;
  const visible = stageFields[stageId].filter((f) => !f.visibleWhen || f.visibleWhen(plan));
  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-slate-300 bg-white p-4">
      <div className="mb-3 flex items-center justify-between">
        <h3 id={headingId} className="text-base font-semibold text-ink">
          {info.title} <span className="text-sm font-normal text-ink-soft">(read-only)</span>
        </h3>
        <button type="button" onClick={onClose} className="rounded px-2 py-1 text-sm text-ink-soft hover:underline focus-visible:outline-2 focus-visible:outline-copper">
          Close {info.noun} values
        </button>
      </div>
      <dl className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-2 xl:grid-cols-3">
        {visible.map((f) => {
          const v = getAt(plan, f.path);
          return (
            <div key={fieldKey(f.path)}>
              <dt className="text-xs text-ink-soft">{f.label}</dt>
              <dd className="text-sm font-medium text-ink">{v === undefined ? '—' : valueToDisplay(f, v)}</dd>
            </div>
          );
        })}
      </dl>
    </section>
  );
}
