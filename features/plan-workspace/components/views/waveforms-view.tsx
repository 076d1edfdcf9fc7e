'use client';
/**
 * Waveforms: the application's synthetic signal with offset, drift, mains and noise traced
 * through every stage (clipping highlighted), and the low-frequency impulse test in time.
 */
import { useDeferredValue, useMemo, useState } from 'react';
import type { ChannelPlan } from '@/lib/engine/plan';
import { simulateImpulseTest, simulateWaveforms, type WaveformResult, type ImpulseTestSimulation } from '@/lib/engine/waveforms';
import { formatEng, formatPercent } from '@/features/plan-workspace/format';
import { waveformRangeV } from '@/features/plan-workspace/report-view';
import { PlotFigure, plotColors, type PlotTrace, type PlotLayout } from '@/features/plan-workspace/components/plot-figure';

const durations = [2, 5, 10] as const;

/**
 * Simulation rate for the waveform view: at least 2 kHz, five times the low-pass corner
 * (the simulator asks for ≥ 4 ×) and not below the converter's own rate.
 */
export function waveformSampleRateHz(plan: ChannelPlan): number {
  return Math.min(200_000, Math.max(2000, 5 * plan.gainStage.lowPass.fcHz, plan.adc.sampleRateHz));
}

export function WaveformsView({ plan, canEdit }: { plan: ChannelPlan | null; canEdit: boolean }) {
  const deferredPlan = useDeferredValue(plan);
  const [durationS, setDurationS] = useState<(typeof durations)[number]>(5);
  const [seed, setSeed] = useState(1);
  const result = useMemo((): { sim: WaveformResult; impulse: ImpulseTestSimulation } | { error: string } | null => {
    if (!deferredPlan) return null;
    try {
      return {
        sim: simulateWaveforms(deferredPlan, { durationS, sampleRateHz: waveformSampleRateHz(deferredPlan), seed, maxDisplayPoints: 1500 }),
        impulse: simulateImpulseTest(deferredPlan),
      };
    } catch (cause) {
      return { error: cause instanceof Error ? cause.message : String(cause) };
    }
  }, [deferredPlan, durationS, seed]);

  if (!result) return <p className="text-sm text-ink-soft">No valid plan to simulate.</p>;
  if ('error' in result) return <p role="alert" className="text-sm text-verdict-fails">The waveform simulation could not run: {result.error}</p>;
  const { sim, impulse } = result;
  const clipped = sim.traces.filter((t) => t.clippedFraction > 0);

  const n = sim.traces.length;
  const gap = 0.025;
  const rowH = (1 - gap * (n - 1)) / n;
  const data: PlotTrace[] = [];
  const layout: PlotLayout = { showlegend: false, margin: { l: 80, r: 20, t: 36, b: 50 }, shapes: [], annotations: [] };
  const shapes = layout.shapes as Record<string, unknown>[];
  const annotations = layout.annotations as Record<string, unknown>[];
  sim.traces.forEach((t, i) => {
    const axis = i === 0 ? '' : String(i + 1);
    const top = 1 - i * (rowH + gap);
    const isClipped = t.clippedFraction > 0;
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: t.label,
      x: t.timeS,
      y: t.values,
      xaxis: `x${axis}`,
      yaxis: `y${axis}`,
      line: { width: 1, color: isClipped ? plotColors.fails : plotColors.series[0] },
      hovertemplate: `${t.label}<br>%{x:.3f} s, %{y:.4s}V<extra></extra>`,
    });
    layout[`yaxis${axis}`] = {
      domain: [Math.max(0, top - rowH), top],
      title: { text: 'V', standoff: 4 },
      range: waveformRangeV(t.values, t.limits, isClipped),
      exponentformat: 'SI',
      gridcolor: '#eef0f3',
      zeroline: false,
    };
    layout[`xaxis${axis}`] = {
      anchor: `y${axis}`,
      matches: i === 0 ? undefined : 'x',
      showticklabels: i === n - 1,
      title: i === n - 1 ? { text: 'Time (s)' } : undefined,
      gridcolor: '#eef0f3',
    };
    for (const limitV of [t.limits.minV, t.limits.maxV]) {
      shapes.push({ type: 'line', xref: `x${axis} domain`, yref: `y${axis}`, x0: 0, x1: 1, y0: limitV, y1: limitV, line: { color: plotColors.copper, width: 1, dash: 'dash' } });
    }
    for (const seg of t.clippedSegments.slice(0, 200)) {
      shapes.push({ type: 'rect', xref: `x${axis}`, yref: `y${axis} domain`, x0: seg.startS, x1: seg.endS, y0: 0, y1: 1, fillcolor: 'rgba(179,38,30,0.18)', line: { width: 0 } });
    }
    annotations.push({
      xref: 'paper',
      yref: 'paper',
      x: 0,
      y: top,
      xanchor: 'left',
      yanchor: 'bottom',
      showarrow: false,
      text: `${t.label}${isClipped ? ` — clipped ${formatPercent(t.clippedFraction, 2)} of the time` : ''} (limits ${formatEng(t.limits.minV, 'V')} … ${formatEng(t.limits.maxV, 'V')})`,
      font: { size: 11, color: isClipped ? plotColors.fails : plotColors.inkSoft },
    });
  });

  const impulseData: PlotTrace[] = [
    { type: 'scatter', mode: 'lines', name: 'test pulse (input)', x: impulse.input.timeS, y: impulse.input.values, line: { color: plotColors.inkSoft, width: 1.5, dash: 'dot' } },
    { type: 'scatter', mode: 'lines', name: 'chain output referred to input', x: impulse.output.timeS, y: impulse.output.values, line: { color: plotColors.series[0], width: 2 } },
  ];

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-4 rounded border border-slate-200 bg-white p-3 text-sm">
        {canEdit ? (
          <>
        <label className="flex items-center gap-2">
          Record length
          <select className="rounded border border-slate-300 px-2 py-1" value={durationS} onChange={(e) => setDurationS(Number(e.target.value) as (typeof durations)[number])}>
            {durations.map((d) => (
              <option key={d} value={d}>
                {d} s
              </option>
            ))}
          </select>
        </label>
        <button type="button" className="rounded border border-slate-300 px-2 py-1 hover:border-copper" onClick={() => setSeed((s) => s + 1)}>
          New noise realisation
        </button>
          </>
        ) : (
          <span>Record length {durationS} s</span>
        )}
        <span className="text-xs text-ink-soft">
          {sim.signal.toUpperCase()} synthetic signal, simulated at {formatEng(sim.sampleRateHz, 'Hz')}, seed {sim.seed}; converter LSB {formatEng(sim.adc.lsbV, 'V')}.
        </span>
      </div>
      {clipped.length > 0 ? (
        <div role="alert" className="rounded border border-verdict-fails bg-verdict-fails/5 p-3 text-sm text-verdict-fails">
          <p className="font-semibold">Clipping: {clipped.length === 1 ? 'one node saturates' : `${clipped.length} nodes saturate`} in this record.</p>
          <ul className="mt-1 list-disc pl-5">
            {clipped.map((t) => (
              <li key={t.node}>
                {t.label}: at its limit {formatPercent(t.clippedFraction, 2)} of the time
              </li>
            ))}
          </ul>
        </div>
      ) : (
        <p className="text-sm text-verdict-meets">No node clips in this record.</p>
      )}
      <PlotFigure title="Synthetic signal through each stage (dashed: node limits; shaded: clipped)" data={data} layout={layout} heightPx={150 * n + 80} />
      <PlotFigure
        title={`Low-frequency impulse test: ${formatEng(impulse.amplitudeV, 'V')} × ${formatEng(impulse.widthS, 's')}`}
        data={impulseData}
        heightPx={320}
        layout={{
          xaxis: { title: { text: 'Time (s)' }, gridcolor: '#e5e7eb' },
          yaxis: { title: { text: 'Voltage referred to input (V)' }, exponentformat: 'SI', gridcolor: '#e5e7eb' },
          shapes: [{ type: 'rect', xref: 'x', yref: 'paper', x0: impulse.startS, x1: impulse.endS, y0: 0, y1: 1, fillcolor: 'rgba(180,88,42,0.08)', line: { width: 0 } }],
        }}
      />
      <p className="text-sm">
        After the pulse: displacement {formatEng(impulse.displacementV, 'V')}, slope {formatEng(impulse.slopeVPerS, 'V/s')} (measured at the high-pass output, referred to input).
      </p>
    </div>
  );
}
