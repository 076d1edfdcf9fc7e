'use client';
/**
 * Response: magnitude and phase of the whole chain and of each stage; the profile's pass band
 * shaded; alias marks at fs − f_high and fs/2; the low-frequency impulse test against its limits.
 */
import type { ChannelPlan } from '@/lib/engine/plan';
import type { ChannelReport } from '@/lib/engine/report';
import { formatDb, formatEng } from '@/features/plan-workspace/format';
import { checkById } from '@/features/plan-workspace/report-view';
import { profileFor } from '@/lib/engine/profiles';
import { PlotFigure, plotColors, type PlotTrace } from '@/features/plan-workspace/components/plot-figure';
import { VerdictBadge } from '@/features/plan-workspace/components/verdict-badge';

const stageNames: Record<string, string> = {
  input: 'input network',
  electrodes: 'electrodes',
  protection: 'protection',
  instrumentation: 'instrumentation stage',
  'high-pass': 'high-pass',
  'gain-stage': 'gain and low-pass',
  adc: 'converter',
};

export function ResponseView({ report, plan }: { report: ChannelReport; plan: ChannelPlan | null }) {
  const resp = report.response;
  const f = resp.points.map((p) => p.fHz);
  // The profile's band of interest (flatness, alias and corners refer to it).
  const band = profileBand(plan) ?? { lowHz: report.noise.bandLowHz, highHz: report.noise.bandHighHz };
  const bandLow = band.lowHz;
  const bandHigh = band.highHz;
  const fsHz = plan?.adc.sampleRateHz;
  const aliasHz = fsHz !== undefined ? fsHz - bandHigh : undefined;
  const nyquistHz = fsHz !== undefined ? fsHz / 2 : undefined;
  const lowCheck = checkById(report, 'low-corner');
  const highCheck = checkById(report, 'high-corner');
  const aliasCheck = checkById(report, 'alias-attenuation');
  const dispCheck = checkById(report, 'impulse-displacement');
  const slopeCheck = checkById(report, 'impulse-slope');

  const series = (key: 'magDb' | 'phaseDeg'): PlotTrace[] => [
    ...resp.stages.map((s, i) => ({
      type: 'scatter',
      mode: 'lines',
      name: stageNames[s.id] ?? s.id,
      x: s.points.map((p) => p.fHz),
      y: s.points.map((p) => p[key]),
      line: { width: 1.3, dash: 'dot', color: plotColors.series[(i + 1) % plotColors.series.length] },
    })),
    { type: 'scatter', mode: 'lines', name: 'whole chain', x: f, y: resp.points.map((p) => p[key]), line: { width: 3, color: plotColors.ink } },
  ];

  const vline = (x: number, color: string, dash = 'dash') => ({ type: 'line', yref: 'paper', x0: x, x1: x, y0: 0, y1: 1, line: { color, width: 1.5, dash } });
  const mark = (x: number, text: string, color: string, y = 1) => ({ x: Math.log10(x), yref: 'paper', y, yanchor: 'bottom', text, showarrow: false, font: { color, size: 11 } });
  const bandShape = { type: 'rect', xref: 'x', yref: 'paper', x0: bandLow, x1: bandHigh, y0: 0, y1: 1, fillcolor: 'rgba(29,122,70,0.08)', line: { width: 0 }, layer: 'below' };

  const marks = [
    ...(aliasHz !== undefined && aliasHz > 0 ? [{ x: aliasHz, text: `fs − f_high = ${formatEng(aliasHz, 'Hz')}`, color: plotColors.fails }] : []),
    ...(nyquistHz !== undefined ? [{ x: nyquistHz, text: `fs/2 = ${formatEng(nyquistHz, 'Hz')}`, color: plotColors.copper }] : []),
  ];

  const magLayout = {
    xaxis: { type: 'log', title: { text: 'Frequency (Hz)' }, gridcolor: '#e5e7eb' },
    yaxis: { title: { text: 'Gain (dB)' }, gridcolor: '#e5e7eb' },
    shapes: [bandShape, ...marks.map((m) => vline(m.x, m.color)), ...(lowCheck ? [vline(lowCheck.limit, plotColors.meets, 'dot')] : []), ...(highCheck ? [vline(highCheck.limit, plotColors.meets, 'dot')] : [])],
    annotations: [
      mark(Math.sqrt(bandLow * bandHigh), `pass band of the profile ${formatEng(bandLow, 'Hz')} … ${formatEng(bandHigh, 'Hz')}`, plotColors.meets, 0.02),
      ...marks.map((m, i) => ({ ...mark(m.x, m.text, m.color, i % 2 === 0 ? 1 : 0.93), xanchor: i % 2 === 0 ? 'right' : 'left' })),
    ],
    legend: { orientation: 'h', y: -0.25 },
    margin: { b: 100 },
  };

  return (
    <div className="space-y-3">
      <dl className="grid grid-cols-2 gap-3 rounded border border-slate-200 bg-white p-3 text-sm md:grid-cols-5">
        <Stat term="Low −3 dB corner" value={resp.lowCornerHz === 0 ? 'DC-coupled' : formatEng(resp.lowCornerHz, 'Hz')} badge={lowCheck?.verdict} />
        <Stat term="High −3 dB corner" value={formatEng(resp.highCornerHz, 'Hz')} badge={highCheck?.verdict} />
        <Stat term="Mid-band gain" value={`${formatDb(resp.midbandGainDb)} at ${formatEng(resp.midbandHz, 'Hz')}`} />
        <Stat term="Attenuation at fs − f_high" value={formatDb(resp.aliasAttenuationDb)} badge={aliasCheck?.verdict} />
        <Stat term="Attenuation at fs/2" value={formatDb(resp.attenuationAtNyquistDb)} />
      </dl>
      <PlotFigure title="Magnitude response, whole chain and per stage" data={series('magDb')} layout={magLayout} heightPx={400} />
      <PlotFigure
        title="Phase response, whole chain and per stage"
        data={series('phaseDeg')}
        heightPx={340}
        layout={{ ...magLayout, yaxis: { title: { text: 'Phase (degrees)' }, gridcolor: '#e5e7eb' } }}
      />
      <section aria-label="Low-frequency impulse test" className="rounded border border-slate-200 bg-white p-3 text-sm">
        <h4 className="font-semibold">
          Low-frequency impulse test ({formatEng(report.impulseTest.amplitudeV, 'V')} × {formatEng(report.impulseTest.durationS, 's')})
        </h4>
        <ul className="mt-1 space-y-1">
          <li>
            Displacement after the pulse: {formatEng(report.impulseTest.displacementV, 'V')}
            {dispCheck && <> (limit {formatEng(dispCheck.limit, 'V')}) <VerdictBadge verdict={dispCheck.verdict} /></>}
          </li>
          <li>
            Slope after the pulse: {formatEng(report.impulseTest.slopeVPerS, 'V/s')}
            {slopeCheck && <> (limit {formatEng(slopeCheck.limit, 'V/s')}) <VerdictBadge verdict={slopeCheck.verdict} /></>}
          </li>
          <li>
            Recovery after a {formatEng(report.recovery.stepV, 'V')} step: {report.recovery.timeS === null ? 'does not recover' : formatEng(report.recovery.timeS, 's')} (to within{' '}
            {formatEng(report.recovery.bandV, 'V')})
          </li>
        </ul>
        <p className="mt-1 text-xs text-ink-soft">The time-domain trace of this test is on the Waveforms view.</p>
      </section>
    </div>
  );
}

function profileBand(plan: ChannelPlan | null): { lowHz: number; highHz: number } | null {
  if (!plan) return null;
  try {
    return profileFor(plan.profileId, plan.customProfile).band;
  } catch {
    return null;
  }
}

function Stat({ term, value, badge }: { term: string; value: string; badge?: 'meets' | 'marginal' | 'fails' }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{term}</dt>
      <dd className="flex flex-wrap items-center gap-1 font-semibold tabular-nums">
        {value} {badge && <VerdictBadge verdict={badge} />}
      </dd>
    </div>
  );
}
