'use client';
/**
 * Tolerance: Monte Carlo over resistor tolerances, electrode imbalance, op-amp CMRR and input
 * capacitor spread, run in a Web Worker with progress and cancel. Histograms of CMRR, gain error
 * and interference with the profile's limits, and the yield.
 */
import { useState } from 'react';
import type { ChannelPlan } from '@/lib/engine/plan';
import type { Histogram, Summary } from '@/lib/engine/monte-carlo';
import { profileFor } from '@/lib/engine/profiles';
import { formatDb, formatDurationMs, formatEng, formatPercent } from '@/features/plan-workspace/format';
import type { ToleranceSettings, ToleranceState } from '@/features/plan-workspace/hooks/use-tolerance-run';
import { PlotFigure, plotColors, type PlotTrace } from '@/features/plan-workspace/components/plot-figure';

const trialChoices = [10_000, 50_000, 200_000];

interface ToleranceViewProps {
  plan: ChannelPlan | null;
  /** Read-only viewers run the analysis with the default settings (no inputs are shown to them). */
  canEdit: boolean;
  state: ToleranceState;
  onStart: (plan: ChannelPlan, settings: ToleranceSettings) => void;
  onCancel: () => void;
}

/** Profile limits of the distributions, where the profile has them. */
function limitsOf(plan: ChannelPlan): { cmrrMinDb?: number; interferenceMaxPpV?: number; gainErrorMax?: number } {
  try {
    const checks = profileFor(plan.profileId, plan.customProfile).checks;
    return { cmrrMinDb: checks.cmrrMinDb?.value, interferenceMaxPpV: checks.mainsInterferencePpV?.value, gainErrorMax: checks.gainErrorMax?.value };
  } catch {
    return {};
  }
}

export function ToleranceView({ plan, canEdit, state, onStart, onCancel }: ToleranceViewProps) {
  const [settings, setSettings] = useState<ToleranceSettings>({ trials: 50_000, seed: 1, distribution: 'uniform' });
  const running = state.kind === 'running';
  const stale = state.kind === 'done' && plan !== null && state.planKey !== JSON.stringify(plan);

  return (
    <div className="space-y-3">
      <form
        className="flex flex-wrap items-end gap-4 rounded border border-slate-200 bg-white p-3 text-sm"
        onSubmit={(e) => {
          e.preventDefault();
          if (plan && !running) onStart(plan, settings);
        }}
      >
        {canEdit ? (
          <>
        <label className="flex flex-col gap-1">
          <span className="text-xs text-ink-soft">Trials</span>
          <select className="rounded border border-slate-300 px-2 py-1" value={settings.trials} disabled={running} onChange={(e) => setSettings({ ...settings, trials: Number(e.target.value) })}>
            {trialChoices.map((t) => (
              <option key={t} value={t}>
                {t.toLocaleString('en')}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="text-xs text-ink-soft">Tolerance distribution</span>
          <select
            className="rounded border border-slate-300 px-2 py-1"
            value={settings.distribution}
            disabled={running}
            onChange={(e) => setSettings({ ...settings, distribution: e.target.value === 'normal' ? 'normal' : 'uniform' })}
          >
            <option value="uniform">uniform over ± tolerance</option>
            <option value="normal">normal, tolerance = 3σ</option>
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="text-xs text-ink-soft">Seed</span>
          <input
            type="number"
            min={0}
            step={1}
            className="w-24 rounded border border-slate-300 px-2 py-1"
            value={settings.seed}
            disabled={running}
            onChange={(e) => setSettings({ ...settings, seed: Number.isFinite(Number(e.target.value)) ? Math.round(Number(e.target.value)) : 1 })}
          />
        </label>
          </>
        ) : (
          <span className="text-ink-soft">
            {settings.trials.toLocaleString('en')} trials, uniform over ± tolerance, seed {settings.seed}
          </span>
        )}
        <button type="submit" disabled={!plan || running} className="rounded bg-copper px-3 py-1.5 font-semibold text-white hover:bg-copper-dark disabled:opacity-50">
          Run tolerance analysis
        </button>
        {running && (
          <button type="button" onClick={onCancel} className="rounded border border-ink px-3 py-1.5 font-medium">
            Cancel
          </button>
        )}
      </form>

      {running && (
        <div className="rounded border border-slate-200 bg-white p-3 text-sm">
          <div className="mb-1 flex justify-between text-xs text-ink-soft">
            <span id="tolerance-progress-label">Running in the background…</span>
            <span>
              {state.done.toLocaleString('en')} / {state.total.toLocaleString('en')} trials
            </span>
          </div>
          <div
            role="progressbar"
            aria-labelledby="tolerance-progress-label"
            aria-valuemin={0}
            aria-valuemax={state.total}
            aria-valuenow={state.done}
            className="h-2.5 w-full overflow-hidden rounded bg-slate-200"
          >
            <div className="h-full bg-copper transition-[width]" style={{ width: `${(100 * state.done) / Math.max(1, state.total)}%` }} />
          </div>
        </div>
      )}
      {state.kind === 'cancelled' && <p role="status" className="text-sm text-ink-soft">Tolerance analysis cancelled.</p>}
      {state.kind === 'error' && (
        <p role="alert" className="text-sm text-verdict-fails">
          The tolerance analysis could not run: {state.message}
        </p>
      )}
      {state.kind === 'idle' && <p className="text-sm text-ink-soft">Run the analysis to see the distributions and the yield against the profile.</p>}

      {state.kind === 'done' && plan && (
        <ToleranceResults
          state={state}
          limits={limitsOf(plan)}
          stale={stale}
        />
      )}
    </div>
  );
}

function ToleranceResults({
  state,
  limits,
  stale,
}: {
  state: Extract<ToleranceState, { kind: 'done' }>;
  limits: ReturnType<typeof limitsOf>;
  stale: boolean;
}) {
  const { result } = state;
  const y = result.yield;
  return (
    <div className="space-y-3">
      {stale && (
        <p role="status" className="rounded border border-verdict-marginal/50 bg-verdict-marginal/5 p-2 text-sm">
          The plan has changed since this run; run again for current results.
        </p>
      )}
      <dl className="grid grid-cols-2 gap-3 rounded border border-slate-200 bg-white p-3 text-sm md:grid-cols-5">
        <Stat term="Yield against the profile" value={formatPercent(y.overall, 4)} strong />
        <Stat term="CMRR yield" value={y.cmrr === null ? 'no limit in profile' : formatPercent(y.cmrr, 4)} />
        <Stat term="Interference yield" value={y.interference === null ? 'no limit in profile' : formatPercent(y.interference, 4)} />
        <Stat term="Gain-error yield" value={y.gain === null ? 'no limit in profile' : formatPercent(y.gain, 4)} />
        <Stat
          term="Run"
          value={`${result.trials.toLocaleString('en')} trials, ${result.distribution}, seed ${result.seed}`}
          note={`${formatDurationMs(state.elapsedMs)} in the worker`}
        />
      </dl>
      <div className="grid gap-3 lg:grid-cols-3">
        <HistogramFigure
          title="CMRR at mains frequency"
          axis="CMRR at mains (dB)"
          histogram={result.histograms.cmrrDb}
          summary={result.summary.cmrrDb}
          scale={1}
          format={(v) => formatDb(v)}
          limit={limits.cmrrMinDb === undefined ? undefined : { value: limits.cmrrMinDb, text: `minimum ${formatDb(limits.cmrrMinDb)}` }}
        />
        <HistogramFigure
          title="Gain error of the chain"
          axis="Gain error (%)"
          histogram={result.histograms.gainError}
          summary={result.summary.gainError}
          scale={100}
          format={(v) => formatPercent(v)}
          limit={limits.gainErrorMax === undefined ? undefined : { value: limits.gainErrorMax, text: `± ${formatPercent(limits.gainErrorMax)}`, symmetric: true }}
        />
        <HistogramFigure
          title="Mains interference referred to input"
          axis="Interference RTI (V peak-to-peak)"
          histogram={result.histograms.interferenceRtiPpV}
          summary={result.summary.interferenceRtiPpV}
          scale={1}
          format={(v) => formatEng(v, 'V')}
          limit={limits.interferenceMaxPpV === undefined ? undefined : { value: limits.interferenceMaxPpV, text: `limit ${formatEng(limits.interferenceMaxPpV, 'V')}` }}
        />
      </div>
    </div>
  );
}

function HistogramFigure({
  title,
  axis,
  histogram,
  summary,
  scale,
  format,
  limit,
}: {
  title: string;
  axis: string;
  histogram: Histogram;
  summary: Summary;
  /** Display factor of the x values (100 for per cent). */
  scale: number;
  format: (v: number) => string;
  limit?: { value: number; text: string; symmetric?: boolean };
}) {
  const centres = histogram.counts.map((_, i) => ((histogram.edges[i] + histogram.edges[i + 1]) / 2) * scale);
  const widths = histogram.counts.map((_, i) => (histogram.edges[i + 1] - histogram.edges[i]) * scale);
  const data: PlotTrace[] = [
    {
      type: 'bar',
      x: centres,
      y: histogram.counts,
      width: widths,
      marker: { color: plotColors.series[0], line: { width: 0 } },
      hovertemplate: '%{x:.4g}: %{y} trials<extra></extra>',
    },
  ];
  const limitXs = limit ? (limit.symmetric ? [-limit.value * scale, limit.value * scale] : [limit.value * scale]) : [];
  return (
    <div>
      <PlotFigure
        title={title}
        data={data}
        heightPx={300}
        layout={{
          bargap: 0,
          showlegend: false,
          xaxis: { title: { text: axis }, exponentformat: 'SI', gridcolor: '#e5e7eb' },
          yaxis: { title: { text: 'Trials' }, gridcolor: '#e5e7eb' },
          shapes: limitXs.map((x) => ({ type: 'line', yref: 'paper', x0: x, x1: x, y0: 0, y1: 1, line: { color: plotColors.fails, width: 2, dash: 'dash' } })),
          annotations: limit ? [{ x: limitXs[limitXs.length - 1], yref: 'paper', y: 1, yanchor: 'bottom', text: limit.text, showarrow: false, font: { color: plotColors.fails, size: 11 } }] : [],
        }}
      />
      <p className="mt-1 text-xs text-ink-soft">
        mean {format(summary.mean)}; 5 % … 95 %: {format(summary.p5)} … {format(summary.p95)}; range {format(summary.min)} … {format(summary.max)}
      </p>
    </div>
  );
}

function Stat({ term, value, note, strong }: { term: string; value: string; note?: string; strong?: boolean }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{term}</dt>
      <dd className={`tabular-nums ${strong ? 'text-lg font-bold' : 'font-semibold'}`}>{value}</dd>
      {note && <dd className="text-xs text-ink-soft">{note}</dd>}
    </div>
  );
}
