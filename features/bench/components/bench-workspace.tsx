'use client';
/**
 * The Bench view of a plan: choose a revision, upload a record from the prototype (CSV or EDF) with
 * its settings, and see each record's measurements beside the revision's prediction (predicted,
 * measured, ratio, within/outside), with the trace and the spectrum referred to input.
 */
import { useId, useState, type FormEvent } from 'react';
import { useBenchRecord, useBenchRecords, useUploadBenchRecord, useWithdrawBenchRecord } from '@/features/bench/api/bench-api';
import { BenchPlot } from '@/features/bench/components/bench-plot';
import type { BenchRecordDto } from '@/features/bench/types';
import type { ComparisonRow } from '@/lib/bench/analyze';
import { formatQuantity } from '@/lib/units/format-quantity';

export interface BenchRevisionOption {
  id: string;
  label: string;
  state: string;
}

const MAX_BYTES = 20 * 1024 * 1024;
const control = 'mt-1 w-full rounded-md border border-ink-soft/40 bg-white px-3 py-2 text-sm focus:outline-none focus-visible:ring-2 focus-visible:ring-copper';
const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const volts = (v: number) => (Number.isFinite(v) ? formatQuantity(v, 'V', 3) : '—');

const verdictText: Record<ComparisonRow['verdict'], string> = {
  within: 'within',
  above: 'outside (above)',
  below: 'outside (below)',
  'no-prediction': 'no prediction',
};

export function BenchWorkspace({ revisions, canUpload }: { revisions: BenchRevisionOption[]; canUpload: boolean }) {
  const revisionSelectId = useId();
  const [revisionId, setRevisionId] = useState(revisions[0]?.id ?? '');
  const [selected, setSelected] = useState<string | null>(null);
  const records = useBenchRecords(revisionId);
  const shownId = selected ?? records.data?.find((r) => !r.withdrawn)?.id ?? records.data?.[0]?.id ?? null;
  const revision = revisions.find((r) => r.id === revisionId);

  return (
    <div className="space-y-6">
      <div className="max-w-xs">
        <label htmlFor={revisionSelectId} className="block text-sm font-medium">
          Revision
        </label>
        <select
          id={revisionSelectId}
          className={control}
          value={revisionId}
          onChange={(e) => {
            setRevisionId(e.target.value);
            setSelected(null);
          }}
        >
          {revisions.map((r) => (
            <option key={r.id} value={r.id}>
              {r.label} ({r.state})
            </option>
          ))}
        </select>
      </div>
      {canUpload && revision ? <UploadForm key={revisionId} revisionId={revisionId} revisionLabel={revision.label} onUploaded={setSelected} /> : null}
      <section aria-labelledby="records-heading" className="space-y-3">
        <h2 id="records-heading" className="text-lg font-semibold">
          Records of revision {revision?.label}
        </h2>
        {records.isError ? <p role="alert" className="text-verdict-fails">{records.error.message}</p> : null}
        {records.data && records.data.length === 0 ? (
          <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">
            No bench records for this revision yet.{canUpload ? ' Upload one above.' : ''}
          </p>
        ) : null}
        {records.data && records.data.length > 0 ? (
          <ul className="divide-y divide-ink-soft/15 rounded-lg border border-ink-soft/20 bg-white" aria-label="Bench records">
            {records.data.map((r) => (
              <RecordRow key={r.id} record={r} shown={r.id === shownId} onShow={() => setSelected(r.id)} canWithdraw={canUpload} />
            ))}
          </ul>
        ) : null}
      </section>
      {shownId ? <RecordDetail recordId={shownId} /> : null}
    </div>
  );
}

function UploadForm({ revisionId, revisionLabel, onUploaded }: { revisionId: string; revisionLabel: string; onUploaded: (id: string) => void }) {
  const id = useId();
  const upload = useUploadBenchRecord(revisionId);
  const [file, setFile] = useState<File | null>(null);
  const [gainMode, setGainMode] = useState<'referred-to-input' | 'gain-to-apply'>('referred-to-input');
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (!file) return setMessage({ tone: 'error', text: 'file: choose a CSV or EDF record to upload' });
    if (file.size > MAX_BYTES) return setMessage({ tone: 'error', text: `file: the file is ${(file.size / (1024 * 1024)).toFixed(1)} MB; the limit is 20 MB` });
    const form = new FormData(event.currentTarget);
    form.set('file', file);
    for (const key of ['channel', 'gainVPerV', 'sampleRateHz', 'note']) if (form.get(key) === '') form.delete(key);
    setMessage(null);
    upload.mutate(form, {
      onSuccess: (record) => {
        setMessage({ tone: 'ok', text: `Stored "${record.fileName}" (${record.format.toUpperCase()}, channel ${record.channel}) with revision ${revisionLabel}.` });
        onUploaded(record.id);
      },
      onError: (e) => setMessage({ tone: 'error', text: e.message }),
    });
  };

  return (
    <form onSubmit={submit} aria-label="Upload a bench record" className="space-y-4 rounded-lg border border-ink-soft/20 bg-white p-4">
      <h2 className="text-lg font-semibold">Upload a bench record to revision {revisionLabel}</h2>
      <p className="text-sm text-ink-soft">
        CSV (an optional time column, one column per channel) or EDF, at most 20 MB; the type is read from the content. Records are kept: a record can be
        withdrawn, never deleted.
      </p>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <div>
          <label htmlFor={`${id}-file`} className="block text-sm font-medium">Record file</label>
          <input id={`${id}-file`} type="file" accept=".csv,.edf,text/csv" className="mt-1 text-sm" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
        </div>
        <div>
          <label htmlFor={`${id}-channel`} className="block text-sm font-medium">Channel (optional)</label>
          <input id={`${id}-channel`} name="channel" className={control} maxLength={120} placeholder="first voltage channel" />
        </div>
        <div>
          <label htmlFor={`${id}-unit`} className="block text-sm font-medium">Unit of CSV values</label>
          <select id={`${id}-unit`} name="unit" className={control} defaultValue="uV">
            <option value="uV">µV</option>
            <option value="mV">mV</option>
            <option value="V">V</option>
          </select>
          <p className="mt-1 text-xs text-ink-soft">EDF files state their own unit.</p>
        </div>
        <fieldset>
          <legend className="block text-sm font-medium">Gain in the recorded values</legend>
          <label className="mt-1 flex items-center gap-2 text-sm">
            <input type="radio" name="gainMode" value="referred-to-input" checked={gainMode === 'referred-to-input'} onChange={() => setGainMode('referred-to-input')} />
            Already referred to input (gain applied)
          </label>
          <label className="flex items-center gap-2 text-sm">
            <input type="radio" name="gainMode" value="gain-to-apply" checked={gainMode === 'gain-to-apply'} onChange={() => setGainMode('gain-to-apply')} />
            Measured at the output (gain to apply)
          </label>
        </fieldset>
        {gainMode === 'gain-to-apply' ? (
          <div>
            <label htmlFor={`${id}-gain`} className="block text-sm font-medium">Gain from input to record (V/V)</label>
            <input id={`${id}-gain`} name="gainVPerV" inputMode="decimal" className={control} required />
          </div>
        ) : null}
        <div>
          <label htmlFor={`${id}-rate`} className="block text-sm font-medium">Sample rate, Hz (CSV without a time column)</label>
          <input id={`${id}-rate`} name="sampleRateHz" inputMode="decimal" className={control} />
        </div>
        <div className="sm:col-span-2 lg:col-span-3">
          <label htmlFor={`${id}-note`} className="block text-sm font-medium">Note (optional)</label>
          <input id={`${id}-note`} name="note" maxLength={500} className={control} placeholder="prototype, set-up, electrodes…" />
        </div>
      </div>
      {message ? (
        <p role={message.tone === 'error' ? 'alert' : 'status'} className={message.tone === 'error' ? 'text-sm text-verdict-fails' : 'text-sm text-verdict-meets'}>
          {message.text}
        </p>
      ) : null}
      <button type="submit" disabled={upload.isPending} className="rounded-md bg-copper px-4 py-2 text-sm font-medium text-white hover:bg-copper-dark disabled:opacity-60">
        {upload.isPending ? 'Uploading and analysing…' : 'Upload and analyse'}
      </button>
    </form>
  );
}

function RecordRow({ record, shown, onShow, canWithdraw }: { record: BenchRecordDto; shown: boolean; onShow: () => void; canWithdraw: boolean }) {
  const withdraw = useWithdrawBenchRecord();
  const outside = record.comparison.filter((r) => r.verdict === 'above' || r.verdict === 'below').length;
  return (
    <li className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
      <div>
        <p className="font-medium">
          {record.fileName} <span className="text-sm font-normal text-ink-soft">({record.format.toUpperCase()}, {record.channel})</span>
          {record.withdrawn ? <span className="ml-2 rounded bg-ink/10 px-1.5 text-xs">withdrawn</span> : null}
        </p>
        <p className="text-sm text-ink-soft">
          {dateFormat.format(new Date(record.createdAt))} UTC by {record.createdByName} · {outside === 0 ? 'all within the prediction' : `${outside} outside the prediction`}
          {record.withdrawn ? ` · withdrawn by ${record.withdrawn.byName ?? '—'}: ${record.withdrawn.reason}` : ''}
        </p>
      </div>
      <div className="flex gap-3 text-sm">
        <button type="button" onClick={onShow} aria-pressed={shown} className="text-copper-dark underline">
          {shown ? 'Shown below' : 'Show'}<span className="sr-only"> {record.fileName}</span>
        </button>
        {canWithdraw && !record.withdrawn ? (
          <button
            type="button"
            className="text-ink-soft underline"
            onClick={() => {
              const reason = window.prompt(`Why is "${record.fileName}" withdrawn? (It is kept and listed, flagged.)`);
              if (reason && reason.trim()) withdraw.mutate({ recordId: record.id, reason });
            }}
          >
            Withdraw<span className="sr-only"> {record.fileName}</span>
          </button>
        ) : null}
      </div>
    </li>
  );
}

function RecordDetail({ recordId }: { recordId: string }) {
  const detail = useBenchRecord(recordId);
  if (detail.isPending) return <p className="text-sm text-ink-soft">Loading the record…</p>;
  if (detail.isError) return <p role="alert" className="text-verdict-fails">{detail.error.message}</p>;
  const record = detail.data;
  const a = record.analysis;
  return (
    <section aria-labelledby="comparison-heading" className="space-y-4">
      <h2 id="comparison-heading" className="text-lg font-semibold">
        Measured vs predicted: {record.fileName}
      </h2>
      <p className="text-sm text-ink-soft">
        Referred to input{record.gainMode === 'gain-to-apply' ? ` (recorded values ÷ ${record.gainVPerV} V/V)` : ''}; noise band {a.conditions.bandLowHz}–
        {a.conditions.bandHighHz} Hz of the {a.conditions.profileName} profile, {a.conditions.mainsHz} Hz mains excluded, over {a.windowS.toPrecision(4)} s of{' '}
        {a.sampleRateHz.toPrecision(5)} Hz samples. The prediction is the revision&apos;s stored report; the offset prediction is a worst-case bound. “Within” means
        a measured/predicted ratio inside the range shown (common practice, no source).
      </p>
      <div className="overflow-x-auto rounded-lg border border-ink-soft/20 bg-white">
        <table className="w-full text-left text-sm" aria-label="Measured vs predicted">
          <thead className="bg-ink/5">
            <tr>
              <th scope="col" className="px-3 py-2 font-medium">Quantity</th>
              <th scope="col" className="px-3 py-2 font-medium">Predicted</th>
              <th scope="col" className="px-3 py-2 font-medium">Measured</th>
              <th scope="col" className="px-3 py-2 font-medium">Ratio</th>
              <th scope="col" className="px-3 py-2 font-medium">Allowed ratio</th>
              <th scope="col" className="px-3 py-2 font-medium">Result</th>
            </tr>
          </thead>
          <tbody>
            {record.comparison.map((row) => (
              <tr key={row.quantity} className="border-t border-ink-soft/15">
                <th scope="row" className="px-3 py-2 font-normal">{row.label}</th>
                <td className="px-3 py-2 font-mono">{volts(row.predicted)}</td>
                <td className="px-3 py-2 font-mono">{volts(row.measured)}</td>
                <td className="px-3 py-2 font-mono">{row.ratio === null ? '—' : row.ratio.toPrecision(3)}</td>
                <td className="px-3 py-2 font-mono">{row.lowRatio}–{row.highRatio}</td>
                <td className={`px-3 py-2 font-medium ${row.verdict === 'within' ? 'text-verdict-meets' : row.verdict === 'no-prediction' ? 'text-ink-soft' : 'text-verdict-fails'}`}>
                  {verdictText[row.verdict]}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2 lg:grid-cols-3">
        <div className="flex justify-between gap-3"><dt className="text-ink-soft">Drift</dt><dd className="font-mono">{formatQuantity(a.driftVPerS, 'V')}/s</dd></div>
        <div className="flex justify-between gap-3"><dt className="text-ink-soft">Mains frequency found</dt><dd className="font-mono">{a.mains.frequencyHz.toFixed(2)} Hz</dd></div>
        <div className="flex justify-between gap-3"><dt className="text-ink-soft">Mains with harmonics, p-p</dt><dd className="font-mono">{volts(a.mains.withHarmonicsPpV)}</dd></div>
        <div className="flex justify-between gap-3"><dt className="text-ink-soft">Clipping</dt><dd>{a.clipping.clipped ? `${a.clipping.clippedSamples} samples at the rails` : 'none found'}</dd></div>
      </dl>
      {a.notes.length > 0 ? (
        <ul className="list-disc pl-5 text-sm text-ink-soft">
          {a.notes.map((n) => <li key={n}>{n}</li>)}
        </ul>
      ) : null}
      <div className="grid gap-4 lg:grid-cols-2">
        <BenchPlot
          title="Trace referred to input"
          data={[{ x: record.trace.tS, y: record.trace.inputV.map((v) => v * 1e6), type: 'scattergl', mode: 'lines', line: { width: 1, color: '#2f5d8a' }, name: 'input' }]}
          layout={{ xaxis: { title: { text: 'time (s)' } }, yaxis: { title: { text: 'voltage referred to input (µV)' } }, showlegend: false }}
        />
        <BenchPlot
          title="Amplitude spectral density referred to input"
          data={[{ x: record.spectrum.frequencyHz, y: record.spectrum.asdVPerRtHz.map((v) => v * 1e9), type: 'scatter', mode: 'lines', line: { width: 1.5, color: '#b4582a' }, name: 'ASD' }]}
          layout={{
            xaxis: { title: { text: 'frequency (Hz)' }, type: 'log' },
            yaxis: { title: { text: 'noise density (nV/√Hz)' }, type: 'log' },
            showlegend: false,
            shapes: [a.conditions.bandLowHz, a.conditions.bandHighHz].map((f) => ({ type: 'line', x0: f, x1: f, yref: 'paper', y0: 0, y1: 1, line: { dash: 'dot', color: '#4a5565', width: 1 } })),
          }}
        />
      </div>
    </section>
  );
}
