'use client';
/**
 * The part library: a table (search, filters by kind and status, sortable columns) of every part,
 * with create / edit / retire and CSV import for engineers and admins. Reviewers see the same table
 * without any of those controls (and the server refuses them anyway).
 */
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type SortingState,
} from '@tanstack/react-table';
import { useId, useMemo, useState } from 'react';
import { useLibrary } from '@/features/parts/api/get-library';
import { useRetirePart } from '@/features/parts/api/mutations';
import { formatFieldValue, keyParameters, kindLabels, parameterSpecs, specLabel, statusLabels } from '@/features/parts/part-display';
import { PartForm } from '@/features/parts/components/part-form';
import { PartsImport } from '@/features/parts/components/parts-import';
import type { LibraryPartDto } from '@/features/parts/types';
import { partKinds, partStatuses } from '@/lib/parts/part-kinds';

const column = createColumnHelper<LibraryPartDto>();
const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: 'UTC' });
const control = 'mt-1 rounded-md border border-ink-soft/40 bg-white px-3 py-2 text-sm focus:outline-none focus-visible:ring-2 focus-visible:ring-copper';

export function PartsLibrary({ initialParts, canEdit }: { initialParts: LibraryPartDto[]; canEdit: boolean }) {
  const ids = { search: useId(), kind: useId(), status: useId() };
  const query = useLibrary({ initialData: initialParts });
  const retire = useRetirePart();
  const [globalFilter, setGlobalFilter] = useState('');
  const [columnFilters, setColumnFilters] = useState<ColumnFiltersState>([]);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [showRetired, setShowRetired] = useState(false);
  const [editing, setEditing] = useState<LibraryPartDto | 'new' | null>(null);
  const [importing, setImporting] = useState(false);
  const [expanded, setExpanded] = useState<string | null>(null);
  const [notice, setNotice] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);

  const data = useMemo(() => (query.data ?? []).filter((p) => showRetired || !p.retiredAt), [query.data, showRetired]);
  const columns = useMemo(
    () => [
      column.accessor('name', { header: 'Name' }),
      column.accessor('kind', { header: 'Kind', cell: (c) => kindLabels[c.getValue()], filterFn: 'equals' }),
      column.accessor('status', { header: 'Status', cell: (c) => statusLabels[c.getValue()], filterFn: 'equals' }),
      column.accessor((p) => keyParameters(p.kind, p.values), { id: 'parameters', header: 'Key parameters', enableSorting: false }),
      column.accessor('sourceNote', { header: 'Source', enableSorting: false }),
      column.accessor('updatedAt', { header: 'Updated', cell: (c) => `${dateFormat.format(new Date(c.getValue()))} by ${c.row.original.updatedByName}` }),
    ],
    [],
  );
  const table = useReactTable({
    data,
    columns,
    state: { globalFilter, columnFilters, sorting },
    onGlobalFilterChange: setGlobalFilter,
    onColumnFiltersChange: setColumnFilters,
    onSortingChange: setSorting,
    globalFilterFn: (row, _id, value: string) => {
      const p = row.original;
      const haystack = `${p.name} ${p.description} ${p.sourceNote} ${kindLabels[p.kind]} ${keyParameters(p.kind, p.values)}`.toLowerCase();
      return String(value)
        .toLowerCase()
        .split(/\s+/)
        .every((word) => haystack.includes(word));
    },
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const setFilter = (id: string, value: string) =>
    setColumnFilters((filters) => [...filters.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);
  const filterValue = (id: string) => (columnFilters.find((f) => f.id === id)?.value as string | undefined) ?? '';

  const done = (text: string) => {
    setEditing(null);
    setImporting(false);
    if (text) setNotice({ tone: 'ok', text });
  };

  return (
    <div className="space-y-6">
      <p className="rounded-md border border-copper/30 bg-copper-light px-4 py-3 text-sm">
        A plan copies a part&apos;s values when you choose the part, and a revision freezes them: editing or retiring a part later never changes a frozen
        revision (or a draft plan that already uses it).
      </p>
      {canEdit ? (
        <div className="flex flex-wrap gap-3">
          <button type="button" onClick={() => { setEditing('new'); setImporting(false); }} className="rounded-md bg-copper px-4 py-2 text-sm font-medium text-white hover:bg-copper-dark">
            New part
          </button>
          <button type="button" onClick={() => { setImporting(!importing); setEditing(null); }} className="rounded-md border border-copper px-4 py-2 text-sm font-medium text-copper-dark" aria-expanded={importing}>
            Import from CSV
          </button>
        </div>
      ) : null}
      {notice ? (
        <p role="status" className={notice.tone === 'ok' ? 'text-sm text-verdict-meets' : 'text-sm text-verdict-fails'}>
          {notice.text}
        </p>
      ) : null}
      {canEdit && editing ? <PartForm key={editing === 'new' ? 'new' : editing.id} part={editing === 'new' ? undefined : editing} onDone={done} /> : null}
      {canEdit && importing ? <PartsImport onImported={done} /> : null}

      <div className="flex flex-wrap items-end gap-4">
        <div>
          <label htmlFor={ids.search} className="block text-sm font-medium">
            Search
          </label>
          <input id={ids.search} type="search" className={control} value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} placeholder="name, description, value…" />
        </div>
        <div>
          <label htmlFor={ids.kind} className="block text-sm font-medium">
            Kind
          </label>
          <select id={ids.kind} className={control} value={filterValue('kind')} onChange={(e) => setFilter('kind', e.target.value)}>
            <option value="">All kinds</option>
            {partKinds.map((k) => (
              <option key={k} value={k}>
                {kindLabels[k]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={ids.status} className="block text-sm font-medium">
            Status
          </label>
          <select id={ids.status} className={control} value={filterValue('status')} onChange={(e) => setFilter('status', e.target.value)}>
            <option value="">All statuses</option>
            {partStatuses.map((s) => (
              <option key={s} value={s}>
                {statusLabels[s]}
              </option>
            ))}
          </select>
        </div>
        <label className="flex items-center gap-2 pb-2 text-sm">
          <input type="checkbox" checked={showRetired} onChange={(e) => setShowRetired(e.target.checked)} />
          Show retired parts
        </label>
      </div>
      {query.isError ? (
        <p role="alert" className="text-verdict-fails">
          {query.error.message}
        </p>
      ) : null}

      <p className="text-sm text-ink-soft">
        {table.getRowModel().rows.length} of {data.length} {data.length === 1 ? 'part' : 'parts'}
      </p>
      {data.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">
          No parts yet.{canEdit ? ' Add one or import a CSV file above.' : ' Engineers add parts; they will appear here.'}
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-soft/20 bg-white">
          <table className="w-full text-left text-sm" aria-label="Part library">
            <thead className="bg-ink/5">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const sorted = header.column.getIsSorted();
                    return (
                      <th key={header.id} scope="col" className="px-3 py-2 font-medium" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                        {header.column.getCanSort() ? (
                          <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-copper-dark">
                            {flexRender(header.column.columnDef.header, header.getContext())}
                            <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                          </button>
                        ) : (
                          flexRender(header.column.columnDef.header, header.getContext())
                        )}
                      </th>
                    );
                  })}
                  <th scope="col" className="px-3 py-2 font-medium">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => {
                const part = row.original;
                return (
                  <PartRows
                    key={row.id}
                    part={part}
                    cells={row.getVisibleCells().map((cell) => (
                      <td key={cell.id} className="px-3 py-2 align-top">
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        {cell.column.id === 'name' && part.retiredAt ? <span className="ml-2 rounded bg-ink/10 px-1.5 text-xs">retired</span> : null}
                      </td>
                    ))}
                    expanded={expanded === part.id}
                    onToggle={() => setExpanded(expanded === part.id ? null : part.id)}
                    actions={
                      canEdit && !part.retiredAt ? (
                        <>
                          <button type="button" className="text-copper-dark underline" onClick={() => { setEditing(part); setImporting(false); window.scrollTo({ top: 0 }); }}>
                            Edit<span className="sr-only"> {part.name}</span>
                          </button>
                          <button
                            type="button"
                            className="text-ink-soft underline"
                            onClick={() => {
                              if (!window.confirm(`Retire "${part.name}"? It leaves the plan forms; plans and revisions that use its values keep them.`)) return;
                              retire.mutate(part.id, {
                                onSuccess: () => setNotice({ tone: 'ok', text: `Retired "${part.name}".` }),
                                onError: (e) => setNotice({ tone: 'error', text: e.message }),
                              });
                            }}
                          >
                            Retire<span className="sr-only"> {part.name}</span>
                          </button>
                        </>
                      ) : null
                    }
                  />
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

function PartRows({
  part,
  cells,
  expanded,
  onToggle,
  actions,
}: {
  part: LibraryPartDto;
  cells: React.ReactNode;
  expanded: boolean;
  onToggle: () => void;
  actions: React.ReactNode;
}) {
  return (
    <>
      <tr className="border-t border-ink-soft/15">
        {cells}
        <td className="space-x-3 whitespace-nowrap px-3 py-2 align-top">
          <button type="button" className="text-copper-dark underline" aria-expanded={expanded} onClick={onToggle}>
            Details<span className="sr-only"> of {part.name}</span>
          </button>
          {actions}
        </td>
      </tr>
      {expanded ? (
        <tr className="bg-ink/5">
          <td colSpan={7} className="px-3 py-3">
            {part.description ? <p className="mb-2">{part.description}</p> : null}
            <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-2 lg:grid-cols-3">
              {parameterSpecs(part.kind).map((spec) =>
                part.values[spec.field] === undefined ? null : (
                  <div key={spec.field} className="flex justify-between gap-3">
                    <dt className="text-ink-soft">{specLabel(spec)}</dt>
                    <dd className="font-mono">{formatFieldValue(spec, part.values[spec.field])}</dd>
                  </div>
                ),
              )}
            </dl>
          </td>
        </tr>
      ) : null}
    </>
  );
}
