'use client';
/**
 * The programs list: each program with its plan count and last change; engineers and admins also
 * get the create form and rename / archive / restore controls (others see none of them).
 */
import Link from 'next/link';
import { useId, useState, type FormEvent } from 'react';
import { useCreateProgram } from '@/features/programs/api/create-program';
import { ApiError } from '@/features/ui/fetch-json';
import { usePrograms } from '@/features/programs/api/get-programs';
import { useUpdateProgram } from '@/features/programs/api/update-program';
import { createProgramInputSchema, programNameSchema } from '@/features/programs/schemas';
import type { ProgramDto } from '@/features/programs/types';

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const formatWhen = (iso: string) => `${dateFormat.format(new Date(iso))} UTC`;
const messageOf = (error: unknown) => (error instanceof ApiError || error instanceof Error ? error.message : 'Something went wrong.');

export function ProgramsList({ initialPrograms, canEdit }: { initialPrograms: ProgramDto[]; canEdit: boolean }) {
  const [showArchived, setShowArchived] = useState(false);
  const query = usePrograms({ includeArchived: showArchived, initialData: showArchived ? undefined : initialPrograms });
  const programs = query.data ?? [];

  return (
    <div className="space-y-6">
      {canEdit ? <CreateProgramForm /> : null}
      <div className="flex items-center justify-between gap-4">
        <p className="text-ink-soft">
          {query.isPending ? 'Loading…' : `${programs.length} ${programs.length === 1 ? 'program' : 'programs'}`}
        </p>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} />
          Show archived programs
        </label>
      </div>
      {query.isError ? (
        <p role="alert" className="text-verdict-fails">
          {messageOf(query.error)}
        </p>
      ) : null}
      {programs.length === 0 && !query.isPending ? (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">
          No programs yet.{canEdit ? ' Create the first one above.' : ' Engineers create programs; they will appear here.'}
        </p>
      ) : (
        <ul className="divide-y divide-ink-soft/15 rounded-lg border border-ink-soft/20 bg-white" aria-label="Programs">
          {programs.map((program) => (
            <ProgramRow key={program.id} program={program} canEdit={canEdit} />
          ))}
        </ul>
      )}
    </div>
  );
}

function CreateProgramForm() {
  const nameId = useId();
  const descriptionId = useId();
  const errorId = useId();
  const create = useCreateProgram();
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const [error, setError] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = createProgramInputSchema.safeParse({ name, description });
    if (!parsed.success) {
      setError(parsed.error.issues.map((i) => `${String(i.path[0] ?? '')}: ${i.message}`.replace(/^: /, '')).join('; '));
      return;
    }
    setError(null);
    create.mutate(parsed.data, {
      onSuccess: () => {
        setName('');
        setDescription('');
      },
      onError: (e) => setError(messageOf(e)),
    });
  };

  return (
    <form onSubmit={submit} className="rounded-lg border border-ink-soft/20 bg-white p-5" aria-label="Create a program" noValidate>
      <h2 className="text-lg font-semibold">New program</h2>
      <div className="mt-3 grid gap-3 md:grid-cols-[1fr_2fr_auto] md:items-end">
        <div>
          <label htmlFor={nameId} className="block text-sm font-medium">
            Program name
          </label>
          <input
            id={nameId}
            value={name}
            onChange={(e) => setName(e.target.value)}
            maxLength={250}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? errorId : undefined}
            className="mt-1 w-full rounded-md border border-ink-soft/40 px-3 py-2 focus:outline-2 focus:outline-copper"
          />
        </div>
        <div>
          <label htmlFor={descriptionId} className="block text-sm font-medium">
            Description (optional)
          </label>
          <input
            id={descriptionId}
            value={description}
            onChange={(e) => setDescription(e.target.value)}
            className="mt-1 w-full rounded-md border border-ink-soft/40 px-3 py-2 focus:outline-2 focus:outline-copper"
          />
        </div>
        <button
          type="submit"
          disabled={create.isPending}
          className="rounded-md bg-copper-dark px-4 py-2 font-medium text-white hover:bg-copper focus:outline-2 focus:outline-offset-2 focus:outline-copper disabled:opacity-60"
        >
          {create.isPending ? 'Creating…' : 'Create program'}
        </button>
      </div>
      {error ? (
        <p id={errorId} role="alert" className="mt-2 text-sm text-verdict-fails">
          {error}
        </p>
      ) : null}
    </form>
  );
}

function ProgramRow({ program, canEdit }: { program: ProgramDto; canEdit: boolean }) {
  const update = useUpdateProgram();
  const [renaming, setRenaming] = useState(false);
  const [name, setName] = useState(program.name);
  const [error, setError] = useState<string | null>(null);
  const inputId = useId();
  const errorId = useId();
  const archived = program.archivedAt !== null;

  const rename = (event: FormEvent) => {
    event.preventDefault();
    const parsed = programNameSchema.safeParse(name);
    if (!parsed.success) {
      setError(`name: ${parsed.error.issues[0]?.message ?? 'not valid'}`);
      return;
    }
    update.mutate(
      { programId: program.id, input: { name: parsed.data } },
      { onSuccess: () => (setRenaming(false), setError(null)), onError: (e) => setError(messageOf(e)) },
    );
  };
  const setArchived = (value: boolean) =>
    update.mutate({ programId: program.id, input: { archived: value } }, { onError: (e) => setError(messageOf(e)) });

  return (
    <li className="flex flex-wrap items-start justify-between gap-4 p-4">
      <div className="min-w-0">
        {renaming ? (
          <form onSubmit={rename} className="flex flex-wrap items-center gap-2" aria-label={`Rename ${program.name}`}>
            <label htmlFor={inputId} className="sr-only">
              New name for {program.name}
            </label>
            <input
              id={inputId}
              value={name}
              onChange={(e) => setName(e.target.value)}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? errorId : undefined}
              className="rounded-md border border-ink-soft/40 px-2 py-1 focus:outline-2 focus:outline-copper"
            />
            <button type="submit" className="rounded-md bg-copper-dark px-3 py-1 text-sm text-white" disabled={update.isPending}>
              Save name
            </button>
            <button type="button" className="text-sm underline" onClick={() => (setRenaming(false), setName(program.name), setError(null))}>
              Cancel
            </button>
          </form>
        ) : (
          <Link href={`/programs/${program.id}`} className="text-lg font-medium text-ink underline-offset-2 hover:underline focus:outline-2 focus:outline-copper">
            {program.name}
          </Link>
        )}
        {program.description ? <p className="mt-1 text-sm text-ink-soft">{program.description}</p> : null}
        <p className="mt-1 text-sm text-ink-soft">
          {program.planCount} {program.planCount === 1 ? 'plan' : 'plans'} · updated by {program.updatedByName}, {formatWhen(program.updatedAt)}
          {archived ? ' · archived' : ''}
        </p>
        {error ? (
          <p id={errorId} role="alert" className="mt-1 text-sm text-verdict-fails">
            {error}
          </p>
        ) : null}
      </div>
      {canEdit ? (
        <div className="flex gap-2">
          {!archived && !renaming ? (
            <button type="button" onClick={() => setRenaming(true)} className="rounded-md border border-ink-soft/40 px-3 py-1 text-sm hover:bg-copper-light">
              Rename
            </button>
          ) : null}
          <button
            type="button"
            onClick={() => setArchived(!archived)}
            disabled={update.isPending}
            className="rounded-md border border-ink-soft/40 px-3 py-1 text-sm hover:bg-copper-light"
            aria-label={`${archived ? 'Restore' : 'Archive'} ${program.name}`}
          >
            {archived ? 'Restore' : 'Archive'}
          </button>
        </div>
      ) : null}
    </li>
  );
}
