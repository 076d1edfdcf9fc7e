'use client';
/**
 * CSV import of one part kind: download the template, choose a file, map its columns to fields
 * (prefilled from the mapping remembered for this kind, else from the header names), check it (every
 * bad row and cell is listed, nothing is written), then import — all of it or nothing.
 */
import { useId, useState } from 'react';
import { ApiError } from '@/features/ui/fetch-json';
import { usePreviewImport, useRunImport } from '@/features/parts/api/mutations';
import { kindLabels, specLabel } from '@/features/parts/part-display';
import type { ImportPreviewDto } from '@/features/parts/types';
import { partFieldSpecs, partKinds, type PartKind } from '@/lib/parts/part-kinds';

const MAX_BYTES = 2 * 1024 * 1024;
const control = 'mt-1 rounded-md border border-ink-soft/40 bg-white px-3 py-2 text-sm focus:outline-none focus-visible:ring-2 focus-visible:ring-copper';

export function PartsImport({ onImported }: { onImported: (message: string) => void }) {
  const ids = { kind: useId(), file: useId() };
  const [kind, setKind] = useState<PartKind>('electrode');
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<Record<string, string | null> | undefined>(undefined);
  const [preview, setPreview] = useState<ImportPreviewDto | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'ok'; text: string } | null>(null);
  const check = usePreviewImport();
  const run = useRunImport();

  const reset = () => {
    setPreview(null);
    setMapping(undefined);
    setMessage(null);
  };
  const runCheck = (withMapping = mapping) => {
    if (!file) {
      setMessage({ tone: 'error', text: 'Choose a CSV file first.' });
      return;
    }
    if (file.size > MAX_BYTES) {
      setMessage({ tone: 'error', text: `The file is ${(file.size / (1024 * 1024)).toFixed(1)} MB; the limit is 2 MB (and 5,000 rows).` });
      return;
    }
    setMessage(null);
    check.mutate(
      { file, kind, mapping: withMapping },
      {
        onSuccess: (p) => {
          setPreview(p);
          setMapping(p.mapping);
        },
        onError: (e) => {
          setPreview(null);
          setMessage({ tone: 'error', text: e.message });
        },
      },
    );
  };
  const runImport = () => {
    if (!file || !preview) return;
    run.mutate(
      { file, kind, mapping },
      {
        onSuccess: (result) => {
          onImported(`Imported ${result.imported} ${kindLabels[result.kind].toLowerCase()} part${result.imported === 1 ? '' : 's'}.`);
          setFile(null);
          reset();
        },
        onError: (e) => {
          const body = e instanceof ApiError ? (e.body as { preview?: ImportPreviewDto } | undefined) : undefined;
          if (body?.preview) setPreview(body.preview);
          setMessage({ tone: 'error', text: e.message });
        },
      },
    );
  };

  const fields = partFieldSpecs(kind);
  const problems = preview?.problems ?? [];
  const canImport = preview !== null && !preview.refused && problems.length === 0 && preview.validCount > 0;

  return (
    <section aria-labelledby="import-heading" className="space-y-4 rounded-lg border border-ink-soft/20 bg-white p-4">
      <h2 id="import-heading" className="text-lg font-semibold">
        Import parts from CSV
      </h2>
      <p className="text-sm text-ink-soft">
        One kind per file, at most 2 MB and 5,000 rows. Cells may carry units (“8 nV/√Hz”, “2.2 MΩ”); a unit in a column header (“Rs (kΩ)”) applies to bare
        numbers. The file is checked first and every problem listed; the import then writes every row or none.
      </p>
      <div className="flex flex-wrap items-end gap-4">
        <div>
          <label htmlFor={ids.kind} className="block text-sm font-medium">
            Part kind
          </label>
          <select
            id={ids.kind}
            className={control}
            value={kind}
            onChange={(e) => {
              setKind(e.target.value as PartKind);
              reset();
            }}
          >
            {partKinds.map((k) => (
              <option key={k} value={k}>
                {kindLabels[k]}
              </option>
            ))}
          </select>
        </div>
        <a href={`/api/parts/template?kind=${kind}`} download className="text-sm font-medium text-copper-dark underline underline-offset-2">
          Download the {kindLabels[kind].toLowerCase()} template (CSV)
        </a>
        <div>
          <label htmlFor={ids.file} className="block text-sm font-medium">
            CSV file
          </label>
          <input
            id={ids.file}
            type="file"
            accept=".csv,text/csv"
            className="mt-1 text-sm"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              reset();
            }}
          />
        </div>
        <button type="button" onClick={() => runCheck()} disabled={check.isPending} className="rounded-md border border-copper px-4 py-2 text-sm font-medium text-copper-dark disabled:opacity-60">
          {check.isPending ? 'Checking…' : 'Check file'}
        </button>
      </div>

      {message ? (
        <p role={message.tone === 'error' ? 'alert' : 'status'} className={message.tone === 'error' ? 'text-sm text-verdict-fails' : 'text-sm text-verdict-meets'}>
          {message.text}
        </p>
      ) : null}

      {preview ? (
        <div className="space-y-4">
          <details open={preview.mappingSource !== 'given' || problems.some((p) => p.row === 0)}>
            <summary className="cursor-pointer text-sm font-semibold">
              Column mapping ({preview.mappingSource === 'remembered' ? 'remembered from the last import of this kind' : preview.mappingSource === 'suggested' ? 'suggested from the header names' : 'as you set it'})
            </summary>
            <table className="mt-2 text-sm">
              <thead>
                <tr className="text-left">
                  <th scope="col" className="pr-6 font-medium">
                    Column in the file
                  </th>
                  <th scope="col" className="font-medium">
                    Field
                  </th>
                </tr>
              </thead>
              <tbody>
                {preview.header.filter((h) => h !== '').map((column) => (
                  <tr key={column}>
                    <td className="py-1 pr-6">{column}</td>
                    <td className="py-1">
                      <select
                        aria-label={`Field for column ${column}`}
                        className="rounded border border-ink-soft/40 px-2 py-1"
                        value={mapping?.[column] ?? ''}
                        onChange={(e) => setMapping({ ...(mapping ?? {}), [column]: e.target.value === '' ? null : e.target.value })}
                      >
                        <option value="">(ignore)</option>
                        {fields.map((f) => (
                          <option key={f.field} value={f.field}>
                            {f.field} — {specLabel(f)}
                          </option>
                        ))}
                      </select>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <button type="button" onClick={() => runCheck(mapping)} className="mt-2 rounded-md border border-ink-soft/40 px-3 py-1 text-sm">
              Check again with this mapping
            </button>
          </details>

          {problems.length > 0 ? (
            <div>
              <h3 className="text-sm font-semibold text-verdict-fails">
                {preview.refused ? 'The file was refused' : `${problems.length} problem${problems.length === 1 ? '' : 's'} found`}: nothing will be imported until every one is fixed.
              </h3>
              <table className="mt-2 w-full text-left text-sm" aria-label="Problems in the file">
                <thead>
                  <tr>
                    <th scope="col" className="py-1 pr-4 font-medium">Row</th>
                    <th scope="col" className="py-1 pr-4 font-medium">Column</th>
                    <th scope="col" className="py-1 pr-4 font-medium">Value</th>
                    <th scope="col" className="py-1 font-medium">Reason</th>
                  </tr>
                </thead>
                <tbody>
                  {problems.map((p, i) => (
                    <tr key={i} className="border-t border-ink-soft/15">
                      <td className="py-1 pr-4">{p.row === 0 ? 'file' : p.row}</td>
                      <td className="py-1 pr-4">{p.column || p.field || '—'}</td>
                      <td className="py-1 pr-4 font-mono">{p.value || '—'}</td>
                      <td className="py-1">{p.message}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : (
            <p role="status" className="text-sm text-verdict-meets">
              No problems: {preview.validCount} part{preview.validCount === 1 ? '' : 's'} ready to import.
            </p>
          )}
          <button type="button" onClick={runImport} disabled={!canImport || run.isPending} className="rounded-md bg-copper px-4 py-2 text-sm font-medium text-white hover:bg-copper-dark disabled:cursor-not-allowed disabled:opacity-50">
            {run.isPending ? 'Importing…' : `Import ${preview.validCount} part${preview.validCount === 1 ? '' : 's'}`}
          </button>
        </div>
      ) : null}
    </section>
  );
}
