'use client';
/**
 * Noise: density by contributor against frequency (log axes), the integrated contribution of
 * each source, the profile's limit and the physical floor (thermal noise of the electrodes).
 */
import type { ChannelReport } from '@/lib/engine/report';
import { formatEng, formatPercent } from '@/features/plan-workspace/format';
import { PlotFigure, plotColors, type PlotTrace } from '@/features/plan-workspace/components/plot-figure';
import { checkById, ppToRms } from '@/features/plan-workspace/report-view';

export function NoiseView({ report }: { report: ChannelReport }) {
  const noise = report.noise;
  const names = Object.keys(noise.densityPoints[0]?.byContributor ?? {});
  const f = noise.densityPoints.map((p) => p.fHz);
  const limitCheck = checkById(report, 'noise');
  const limitPpV = limitCheck?.limit;
  const bandwidthHz = Math.max(noise.bandHighHz - noise.bandLowHz, 1e-12);
  // A flat density that integrates to the given rms over the band: rms / √(bandwidth) (white-noise equivalent).
  const flatDensity = (rmsV: number) => rmsV / Math.sqrt(bandwidthHz);

  const densityData: PlotTrace[] = [
    ...names.map((name, i) => ({
      type: 'scatter',
      mode: 'lines',
      name,
      x: f,
      y: noise.densityPoints.map((p) => p.byContributor[name]),
      line: { width: 1.5, color: plotColors.series[i % plotColors.series.length] },
    })),
    {
      type: 'scatter',
      mode: 'lines',
      name: 'total',
      x: f,
      y: noise.densityPoints.map((p) => p.totalVPerRtHz),
      line: { width: 3, color: plotColors.ink },
    },
    {
      type: 'scatter',
      mode: 'lines',
      name: 'thermal floor of the electrodes (flat equivalent)',
      x: [noise.bandLowHz, noise.bandHighHz],
      y: [flatDensity(noise.floorRmsV), flatDensity(noise.floorRmsV)],
      line: { width: 2, dash: 'dot', color: plotColors.meets },
    },
  ];
  if (limitPpV !== undefined) {
    densityData.push({
      type: 'scatter',
      mode: 'lines',
      name: 'limit (flat equivalent: p-p ÷ 6.6 ÷ √bandwidth)',
      x: [noise.bandLowHz, noise.bandHighHz],
      y: [flatDensity(ppToRms(limitPpV)), flatDensity(ppToRms(limitPpV))],
      line: { width: 2, dash: 'dash', color: plotColors.fails },
    });
  }

  const sorted = [...noise.contributions].sort((a, b) => b.rmsV - a.rmsV);
  const barData: PlotTrace[] = [
    {
      type: 'bar',
      name: 'rms contribution',
      x: sorted.map((c) => c.name),
      y: sorted.map((c) => c.rmsV),
      marker: { color: sorted.map((_, i) => plotColors.series[i % plotColors.series.length]) },
      text: sorted.map((c) => `${formatEng(c.rmsV, 'V')} (${formatPercent(c.share, 2)})`),
      textposition: 'outside',
      hovertemplate: sorted.map((c) => `${c.name}: ${formatEng(c.rmsV, 'V')} rms, ${formatPercent(c.share)} of power<extra></extra>`),
    },
  ];
  const hLines = [
    { y: noise.rtiRmsV, color: plotColors.ink, text: `total ${formatEng(noise.rtiRmsV, 'V')} rms` },
    { y: noise.floorRmsV, color: plotColors.meets, text: `thermal floor ${formatEng(noise.floorRmsV, 'V')} rms` },
    ...(limitPpV !== undefined ? [{ y: ppToRms(limitPpV), color: plotColors.fails, text: `limit ${formatEng(ppToRms(limitPpV), 'V')} rms (${formatEng(limitPpV, 'V')} p-p)` }] : []),
  ];

  return (
    <div className="space-y-3">
      <dl className="grid grid-cols-2 gap-3 rounded border border-slate-200 bg-white p-3 text-sm md:grid-cols-5">
        <Stat term="Noise RTI (rms)" value={formatEng(noise.rtiRmsV, 'V')} />
        <Stat term="Noise RTI (peak-to-peak, 6.6 × rms)" value={formatEng(noise.rtiPpV, 'V')} />
        <Stat term="Limit (peak-to-peak)" value={limitPpV === undefined ? 'none in profile' : formatEng(limitPpV, 'V')} />
        <Stat term="Thermal floor of the electrodes (rms)" value={formatEng(noise.floorRmsV, 'V')} />
        <Stat term="Integration band" value={`${formatEng(noise.bandLowHz, 'Hz')} … ${formatEng(noise.bandHighHz, 'Hz')}`} />
      </dl>
      <PlotFigure
        title="Noise density referred to input, by contributor"
        data={densityData}
        heightPx={380}
        layout={{
          xaxis: { type: 'log', title: { text: 'Frequency (Hz)' }, gridcolor: '#e5e7eb' },
          yaxis: { type: 'log', title: { text: 'Noise density RTI (V/√Hz)' }, gridcolor: '#e5e7eb', exponentformat: 'SI' },
          legend: { orientation: 'h', y: -0.25, font: { size: 11 } },
          margin: { b: 110 },
        }}
      />
      <PlotFigure
        title="Integrated noise referred to input, by contributor"
        data={barData}
        heightPx={360}
        layout={{
          xaxis: { title: { text: 'Contributor' }, automargin: true },
          yaxis: { title: { text: 'Noise RTI (V rms)' }, gridcolor: '#e5e7eb', exponentformat: 'SI', rangemode: 'tozero' },
          showlegend: false,
          shapes: hLines.map((l) => ({ type: 'line', xref: 'paper', x0: 0, x1: 1, y0: l.y, y1: l.y, line: { color: l.color, width: 2, dash: 'dash' } })),
          annotations: hLines.map((l, i) => ({ xref: 'paper', x: i === 1 ? 0.5 : 1, xanchor: 'right', y: l.y, yanchor: 'bottom', text: l.text, showarrow: false, font: { size: 11, color: l.color } })),
        }}
      />
      <div className="overflow-x-auto rounded border border-slate-200 bg-white">
        <table className="w-full text-sm">
          <caption className="sr-only">Noise contributions referred to input</caption>
          <thead className="bg-slate-50 text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-1.5">Contributor</th>
              <th scope="col" className="px-2 py-1.5 text-right">RTI (rms)</th>
              <th scope="col" className="px-2 py-1.5 text-right">Share of noise power</th>
            </tr>
          </thead>
          <tbody>
            {sorted.map((c) => (
              <tr key={c.name} className="border-t border-slate-200">
                <th scope="row" className="px-2 py-1 text-left font-medium">
                  {c.name}
                </th>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(c.rmsV, 'V')}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatPercent(c.share)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

function Stat({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{term}</dt>
      <dd className="font-semibold tabular-nums">{value}</dd>
    </div>
  );
}
