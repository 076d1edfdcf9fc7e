'use client';
/**
 * Levels: every node's worst-case range against its limits (including the instrumentation
 * stage's internal nodes VA and VB), saturation in the fails colour, the largest first-stage
 * gain the offset allows, and the common-mode window of the three-op-amp stage.
 */
import type { ChannelReport } from '@/lib/engine/report';
import { formatEng, formatPercent } from '@/features/plan-workspace/format';
import { saturatedNodes } from '@/features/plan-workspace/report-view';
import { PlotFigure, plotColors, type PlotTrace } from '@/features/plan-workspace/components/plot-figure';

export function LevelsView({ report }: { report: ChannelReport }) {
  const rows = report.stages.flatMap((s) => s.nodes.map((n) => ({ stage: s.name, label: `${s.name}: ${n.name}`, ...n })));
  const saturated = saturatedNodes(report);
  // Categories from top (first node) to bottom.
  const labels = rows.map((r) => r.label);
  const ok = rows.map((r) => r.headroomV >= 0);

  const data: PlotTrace[] = [
    {
      type: 'bar',
      orientation: 'h',
      name: 'worst-case swing (min … max)',
      y: labels,
      base: rows.map((r) => r.minV),
      x: rows.map((r) => Math.max(r.maxV - r.minV, 1e-6)),
      marker: { color: ok.map((o) => (o ? plotColors.series[0] : plotColors.fails)) },
      hovertemplate: rows.map((r) => `${r.label}<br>${formatEng(r.minV, 'V')} … ${formatEng(r.maxV, 'V')}<extra></extra>`),
    },
    {
      type: 'scatter',
      mode: 'markers',
      name: 'low limit',
      y: labels,
      x: rows.map((r) => r.lowLimitV),
      marker: { symbol: 'line-ns-open', size: 18, line: { width: 3, color: plotColors.ink }, color: plotColors.ink },
      hovertemplate: rows.map((r) => `low limit ${formatEng(r.lowLimitV, 'V')}<extra></extra>`),
    },
    {
      type: 'scatter',
      mode: 'markers',
      name: 'high limit',
      y: labels,
      x: rows.map((r) => r.highLimitV),
      marker: { symbol: 'line-ns-open', size: 18, line: { width: 3, color: plotColors.copper }, color: plotColors.copper },
      hovertemplate: rows.map((r) => `high limit ${formatEng(r.highLimitV, 'V')}<extra></extra>`),
    },
  ];

  const cmWindow = report.commonModeWindow;
  const vertices = cmWindow.vertices.length > 0 ? [...cmWindow.vertices, cmWindow.vertices[0]] : [];
  const windowData: PlotTrace[] = [
    {
      type: 'scatter',
      mode: 'lines',
      fill: 'toself',
      name: `allowed (Vcm, Vout) for Vd = ${formatEng(cmWindow.vdV, 'V')}`,
      x: vertices.map((v) => v.vcmV),
      y: vertices.map((v) => v.voutV),
      line: { color: plotColors.meets },
      fillcolor: 'rgba(29,122,70,0.15)',
    },
  ];

  return (
    <div className="space-y-3">
      {saturated.length > 0 && (
        <div className="rounded border border-verdict-fails bg-verdict-fails/5 p-3 text-sm text-verdict-fails">
          <p className="font-semibold">
            {saturated.length === 1 ? 'One node saturates' : `${saturated.length} nodes saturate`} with the worst-case offset and signal:
          </p>
          <ul className="mt-1 list-disc pl-5">
            {saturated.map((s) => (
              <li key={`${s.stageName}-${s.nodeName}`}>
                {s.stageName}, {s.nodeName}: swings {formatEng(s.minV, 'V')} … {formatEng(s.maxV, 'V')}, allowed {formatEng(s.lowLimitV, 'V')} …{' '}
                {formatEng(s.highLimitV, 'V')} (saturated)
              </li>
            ))}
          </ul>
        </div>
      )}
      <dl className="grid grid-cols-2 gap-3 rounded border border-slate-200 bg-white p-3 text-sm md:grid-cols-4">
        <Stat term="Worst-case differential input" value={formatEng(report.worstCaseInputV, 'V')} />
        <Stat term="First-stage gain G1" value={formatEng(report.gains.g1, '', { digits: 4 })} />
        <Stat
          term="Largest safe first-stage gain"
          value={`${formatEng(report.maxFirstStageGain, '', { digits: 4 })}${report.maxFirstStageGainDetail.rgOhm !== null ? ` (Rg ≥ ${formatEng(report.maxFirstStageGainDetail.rgOhm, 'Ω')})` : ''}`}
          note={`limited by ${report.maxFirstStageGainDetail.limitingNode}`}
        />
        <Stat term="Total gain" value={`${formatEng(report.gains.totalGain, '', { digits: 4 })} V/V`} />
      </dl>
      <PlotFigure
        title="Node levels against their limits"
        data={data}
        heightPx={Math.max(260, 36 * rows.length + 110)}
        layout={{
          barmode: 'overlay',
          xaxis: { title: { text: 'Voltage (V)' }, zeroline: true, gridcolor: '#e5e7eb' },
          yaxis: { title: { text: 'Node' }, autorange: 'reversed', automargin: true },
          margin: { l: 230 },
        }}
      />
      <div className="overflow-x-auto rounded border border-slate-200 bg-white">
        <table className="w-full text-sm">
          <caption className="sr-only">Headroom per node</caption>
          <thead className="bg-slate-50 text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-1.5">Node</th>
              <th scope="col" className="px-2 py-1.5 text-right">Min</th>
              <th scope="col" className="px-2 py-1.5 text-right">Max</th>
              <th scope="col" className="px-2 py-1.5 text-right">Low limit</th>
              <th scope="col" className="px-2 py-1.5 text-right">High limit</th>
              <th scope="col" className="px-2 py-1.5 text-right">Headroom</th>
              <th scope="col" className="px-2 py-1.5 text-right">of range</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.label} className={`border-t border-slate-200 ${r.headroomV < 0 ? 'bg-verdict-fails/5 text-verdict-fails' : ''}`}>
                <th scope="row" className="px-2 py-1 text-left font-medium">
                  {r.label}
                  {r.headroomV < 0 && <span className="ml-2 text-xs font-semibold">saturates</span>}
                </th>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(r.minV, 'V')}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(r.maxV, 'V')}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(r.lowLimitV, 'V')}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(r.highLimitV, 'V')}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(r.headroomV, 'V')}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatPercent(r.headroomFraction)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {vertices.length > 0 && (
        <PlotFigure
          title="Common-mode window of the instrumentation stage"
          data={windowData}
          heightPx={320}
          layout={{
            xaxis: { title: { text: 'Common-mode input Vcm (V)' }, gridcolor: '#e5e7eb' },
            yaxis: { title: { text: 'Output Vout (V)' }, gridcolor: '#e5e7eb' },
            shapes: [
              ...(cmWindow.minV > cmWindow.maxV ? [] : [{
                type: 'rect',
                xref: 'x',
                yref: 'paper',
                x0: cmWindow.minV,
                x1: cmWindow.maxV,
                y0: 0,
                y1: 1,
                line: { width: 0 },
                fillcolor: 'rgba(180,88,42,0.08)',
              }]),
            ],
            annotations: [
              {
                xref: 'paper',
                yref: 'paper',
                x: 0,
                y: 1.06,
                showarrow: false,
                xanchor: 'left',
                text:
                  cmWindow.minV <= cmWindow.maxV
                    ? `Vcm allowed ${formatEng(cmWindow.minV, 'V')} … ${formatEng(cmWindow.maxV, 'V')} at Vd = ${formatEng(cmWindow.vdV, 'V')} (shaded)`
                    : `No common-mode voltage is allowed at Vd = ${formatEng(cmWindow.vdV, 'V')}: the stage saturates`,
                font: { size: 11, color: plotColors.inkSoft },
              },
            ],
          }}
        />
      )}
    </div>
  );
}

function Stat({ term, value, note }: { term: string; value: string; note?: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{term}</dt>
      <dd className="font-semibold tabular-nums">{value}</dd>
      {note && <dd className="text-xs text-ink-soft">{note}</dd>}
    </div>
  );
}
