'use client';
/**
 * A program's channel plans: a sortable, filterable table (name, application, revision, state,
 * worst verdict, last change) with the create form; write controls only for engineers and admins.
 */
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useId, useMemo, useState, type FormEvent } from 'react';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useCreatePlan } from '@/features/plans/api/create-plan';
import { ApiError } from '@/features/ui/fetch-json';
import { useProgramPlans } from '@/features/plans/api/get-plans';
import { useUpdatePlan } from '@/features/plans/api/update-plan';
import { createPlanInputSchema } from '@/features/plans/schemas';
import { demoTemplateIds, demoTemplateLabels, type DemoTemplateId } from '@/features/plans/template-ids';
import type { PlanSummaryDto } from '@/features/plans/types';
import { builtInProfiles } from '@/lib/engine/profiles';
import type { BuiltInProfileId } from '@/lib/engine/plan';
import type { Verdict } from '@/lib/engine/report';

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const formatWhen = (iso: string) => `${dateFormat.format(new Date(iso))} UTC`;
const messageOf = (error: unknown) => (error instanceof ApiError || error instanceof Error ? error.message : 'Something went wrong.');
const verdictOrder: Record<Verdict, number> = { meets: 0, marginal: 1, fails: 2 };
const verdictClass: Record<Verdict, string> = {
  meets: 'bg-verdict-meets/10 text-verdict-meets',
  marginal: 'bg-verdict-marginal/10 text-verdict-marginal',
  fails: 'bg-verdict-fails/10 text-verdict-fails',
};

/** "Monitoring ECG" for a built-in profile id, the id itself otherwise. */
function profileLabel(profileId: string): string {
  return (builtInProfiles as Record<string, { name: string } | undefined>)[profileId as BuiltInProfileId]?.name ?? profileId;
}

const column = createColumnHelper<PlanSummaryDto>();

export function PlansTable({
  programId,
  initialPlans,
  canEdit,
}: {
  programId: string;
  initialPlans: PlanSummaryDto[];
  canEdit: boolean;
}) {
  const [showArchived, setShowArchived] = useState(false);
  const query = useProgramPlans({ programId, includeArchived: showArchived, initialData: showArchived ? undefined : initialPlans });
  const plans = useMemo(() => query.data ?? [], [query.data]);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updatedAt', desc: true }]);
  const [filter, setFilter] = useState('');
  const [verdictFilter, setVerdictFilter] = useState<'' | Verdict>('');
  const filterId = useId();
  const verdictFilterId = useId();
  const update = useUpdatePlan(programId);
  const [rowError, setRowError] = useState<string | null>(null);
  const create = useCreatePlan(programId);
  const router = useRouter();

  const visible = useMemo(() => (verdictFilter ? plans.filter((p) => p.worstVerdict === verdictFilter) : plans), [plans, verdictFilter]);

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Name',
        cell: (info) => (
          <Link
            href={`/programs/${programId}/plans/${info.row.original.id}`}
            className="font-medium text-ink underline-offset-2 hover:underline focus:outline-2 focus:outline-copper"
          >
            {info.getValue()}
          </Link>
        ),
      }),
      column.accessor((row) => `${row.application.toUpperCase()} · ${profileLabel(row.profileId)}`, {
        id: 'application',
        header: 'Application',
      }),
      column.accessor((row) => row.revision ?? '—', { id: 'revision', header: 'Revision', enableGlobalFilter: false }),
      column.accessor((row) => `${row.state.replace('-', ' ')}${row.archivedAt ? ' (archived)' : ''}`, { id: 'state', header: 'State' }),
      column.accessor('worstVerdict', {
        header: 'Worst verdict',
        sortingFn: (a, b) =>
          (a.original.worstVerdict ? verdictOrder[a.original.worstVerdict] : -1) - (b.original.worstVerdict ? verdictOrder[b.original.worstVerdict] : -1),
        cell: (info) => {
          const verdict = info.getValue();
          return verdict ? (
            <span className={`rounded px-2 py-0.5 text-sm font-medium ${verdictClass[verdict]}`}>{verdict}</span>
          ) : (
            <span className="text-ink-soft">—</span>
          );
        },
      }),
      column.accessor('updatedByName', { header: 'Updated by' }),
      column.accessor('updatedAt', { header: 'Updated at', cell: (info) => formatWhen(info.getValue()), enableGlobalFilter: false }),
      ...(canEdit
        ? [
            column.display({
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              cell: (info) => {
                const plan = info.row.original;
                const archived = plan.archivedAt !== null;
                return (
                  <div className="flex justify-end gap-2">
                    {!archived ? (
                      <button
                        type="button"
                        className="rounded-md border border-ink-soft/40 px-2 py-1 text-sm hover:bg-copper-light"
                        aria-label={`Duplicate ${plan.name}`}
                        disabled={create.isPending}
                        onClick={() =>
                          create.mutate({ source: 'duplicate', planId: plan.id }, { onError: (e) => setRowError(messageOf(e)) })
                        }
                      >
                        Duplicate
                      </button>
                    ) : null}
                    <button
                      type="button"
                      className="rounded-md border border-ink-soft/40 px-2 py-1 text-sm hover:bg-copper-light"
                      aria-label={`${archived ? 'Restore' : 'Archive'} ${plan.name}`}
                      disabled={update.isPending}
                      onClick={() =>
                        update.mutate({ planId: plan.id, input: { archived: !archived } }, { onError: (e) => setRowError(messageOf(e)) })
                      }
                    >
                      {archived ? 'Restore' : 'Archive'}
                    </button>
                  </div>
                );
              },
            }),
          ]
        : []),
    ],
    [programId, canEdit, create, update],
  );

  const table = useReactTable({
    data: visible,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    globalFilterFn: 'includesString',
  });

  return (
    <div className="space-y-6">
      {canEdit ? (
        <CreatePlanForm
          plans={plans.filter((p) => p.archivedAt === null)}
          pending={create.isPending}
          onCreate={(input, done) =>
            create.mutate(input, {
              onSuccess: (plan) => router.push(`/programs/${programId}/plans/${plan.id}`),
              onError: (e) => done(messageOf(e)),
            })
          }
        />
      ) : null}
      <div className="flex flex-wrap items-end gap-4">
        <div>
          <label htmlFor={filterId} className="block text-sm font-medium">
            Filter plans
          </label>
          <input
            id={filterId}
            value={filter}
            onChange={(e) => setFilter(e.target.value)}
            placeholder="name, application, person"
            className="mt-1 rounded-md border border-ink-soft/40 px-3 py-1.5 focus:outline-2 focus:outline-copper"
          />
        </div>
        <div>
          <label htmlFor={verdictFilterId} className="block text-sm font-medium">
            Worst verdict
          </label>
          <select
            id={verdictFilterId}
            value={verdictFilter}
            onChange={(e) => setVerdictFilter(e.target.value as '' | Verdict)}
            className="mt-1 rounded-md border border-ink-soft/40 px-3 py-1.5 focus:outline-2 focus:outline-copper"
          >
            <option value="">any</option>
            <option value="meets">meets</option>
            <option value="marginal">marginal</option>
            <option value="fails">fails</option>
          </select>
        </div>
        <label className="flex items-center gap-2 pb-2 text-sm">
          <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} />
          Show archived plans
        </label>
      </div>
      {rowError ? (
        <p role="alert" className="text-sm text-verdict-fails">
          {rowError}
        </p>
      ) : null}
      {query.isError ? (
        <p role="alert" className="text-verdict-fails">
          {messageOf(query.error)}
        </p>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-ink-soft/20 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Channel plans of this program</caption>
          <thead className="border-b border-ink-soft/20 bg-copper-light/40">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className="px-3 py-2 font-semibold"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 focus:outline-2 focus:outline-copper"
                        >
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">
                  {plans.length === 0 ? 'No plans in this program yet.' : 'No plan matches the filter.'}
                </td>
              </tr>
            ) : (
              table.getRowModel().rows.map((row) => (
                <tr key={row.id} className="border-b border-ink-soft/10 last:border-0">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}

type Source = 'template' | 'blank' | 'duplicate';

function CreatePlanForm({
  plans,
  pending,
  onCreate,
}: {
  plans: PlanSummaryDto[];
  pending: boolean;
  onCreate: (input: Parameters<ReturnType<typeof useCreatePlan>['mutate']>[0], done: (error: string) => void) => void;
}) {
  const ids = { source: useId(), template: useId(), plan: useId(), name: useId(), error: useId() };
  const [source, setSource] = useState<Source>('template');
  const [templateId, setTemplateId] = useState<DemoTemplateId>('wearable-ecg-patch');
  const [planId, setPlanId] = useState('');
  const [name, setName] = useState('');
  const [error, setError] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const trimmed = name.trim();
    const candidate =
      source === 'blank'
        ? { source, name: trimmed }
        : source === 'template'
          ? { source, templateId, ...(trimmed ? { name: trimmed } : {}) }
          : { source, planId: planId || plans[0]?.id || '', ...(trimmed ? { name: trimmed } : {}) };
    const parsed = createPlanInputSchema.safeParse(candidate);
    if (!parsed.success) {
      setError(parsed.error.issues.map((i) => (i.path.length ? `${i.path.join('.')}: ${i.message}` : i.message)).join('; '));
      return;
    }
    setError(null);
    onCreate(candidate as Parameters<typeof onCreate>[0], setError);
  };

  return (
    <form onSubmit={submit} aria-label="Create a plan" className="rounded-lg border border-ink-soft/20 bg-white p-5" noValidate>
      <h2 className="text-lg font-semibold">New channel plan</h2>
      <div className="mt-3 grid gap-3 md:grid-cols-4 md:items-end">
        <div>
          <label htmlFor={ids.source} className="block text-sm font-medium">
            Start from
          </label>
          <select
            id={ids.source}
            value={source}
            onChange={(e) => setSource(e.target.value as Source)}
            className="mt-1 w-full rounded-md border border-ink-soft/40 px-3 py-2 focus:outline-2 focus:outline-copper"
          >
            <option value="template">a demo template</option>
            <option value="blank">blank (placeholder values)</option>
            <option value="duplicate" disabled={plans.length === 0}>
              a copy of a plan
            </option>
          </select>
        </div>
        {source === 'template' ? (
          <div>
            <label htmlFor={ids.template} className="block text-sm font-medium">
              Template
            </label>
            <select
              id={ids.template}
              value={templateId}
              onChange={(e) => setTemplateId(e.target.value as DemoTemplateId)}
              className="mt-1 w-full rounded-md border border-ink-soft/40 px-3 py-2 focus:outline-2 focus:outline-copper"
            >
              {demoTemplateIds.map((id) => (
                <option key={id} value={id}>
                  {demoTemplateLabels[id]}
                </option>
              ))}
            </select>
          </div>
        ) : source === 'duplicate' ? (
          <div>
            <label htmlFor={ids.plan} className="block text-sm font-medium">
              Plan to copy
            </label>
            <select
              id={ids.plan}
              value={planId || plans[0]?.id || ''}
              onChange={(e) => setPlanId(e.target.value)}
              className="mt-1 w-full rounded-md border border-ink-soft/40 px-3 py-2 focus:outline-2 focus:outline-copper"
            >
              {plans.map((plan) => (
                <option key={plan.id} value={plan.id}>
                  {plan.name}
                </option>
              ))}
            </select>
          </div>
        ) : (
          <div />
        )}
        <div>
          <label htmlFor={ids.name} className="block text-sm font-medium">
            Plan name{source === 'blank' ? '' : ' (optional)'}
          </label>
          <input
            id={ids.name}
            value={name}
            onChange={(e) => setName(e.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? ids.error : undefined}
            className="mt-1 w-full rounded-md border border-ink-soft/40 px-3 py-2 focus:outline-2 focus:outline-copper"
          />
        </div>
        <button
          type="submit"
          disabled={pending}
          className="rounded-md bg-copper-dark px-4 py-2 font-medium text-white hover:bg-copper focus:outline-2 focus:outline-offset-2 focus:outline-copper disabled:opacity-60"
        >
          {pending ? 'Creating…' : 'Create plan'}
        </button>
      </div>
      {error ? (
        <p id={ids.error} role="alert" className="mt-2 text-sm text-verdict-fails">
          {error}
        </p>
      ) : null}
    </form>
  );
}
