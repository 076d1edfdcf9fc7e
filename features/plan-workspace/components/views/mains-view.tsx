'use client';
/**
 * Mains: the interference path term by term (referred to input) against the profile's limit,
 * the profile's common-mode test reproduced against its limit, and CMRR against frequency.
 */
import type { ChannelReport } from '@/lib/engine/report';
import { formatDb, formatEng } from '@/features/plan-workspace/format';
import { checkById } from '@/features/plan-workspace/report-view';
import { PlotFigure, plotColors, type PlotTrace } from '@/features/plan-workspace/components/plot-figure';
import { VerdictBadge } from '@/features/plan-workspace/components/verdict-badge';

export function MainsView({ report, mainsHz }: { report: ChannelReport; mainsHz?: number }) {
  const inter = report.interference;
  const limit = checkById(report, 'mains-interference');
  const cmrTestCheck = checkById(report, 'cmr-test');
  const cmrrCheck = checkById(report, 'cmrr');
  const termNames = [...inter.terms.map((t) => t.name), 'total'];
  const termValues = [...inter.terms.map((t) => t.rtiPpV), inter.rtiPpV];
  const overLimit = termValues.map((v) => limit !== undefined && v > limit.limit);

  const termsData: PlotTrace[] = [
    {
      type: 'bar',
      orientation: 'h',
      y: termNames,
      x: termValues,
      marker: { color: termNames.map((n, i) => (overLimit[i] ? plotColors.fails : n === 'total' ? plotColors.ink : plotColors.series[i % plotColors.series.length])) },
      text: termValues.map((v) => formatEng(v, 'V')),
      textposition: 'outside',
      hovertemplate: termNames.map((n, i) => `${n}: ${formatEng(termValues[i], 'V')} p-p RTI<extra></extra>`),
    },
  ];
  const positive = termValues.filter((v) => v > 0);
  const useLog = positive.length > 1 && Math.max(...positive) / Math.min(...positive) > 100;

  const cmrTest = inter.cmrTest;
  const cmrData: PlotTrace[] = cmrTest
    ? [
        {
          type: 'bar',
          x: ['result', 'limit'],
          y: [cmrTest.rtiPpV, cmrTest.limitPpV],
          marker: { color: [cmrTest.rtiPpV > cmrTest.limitPpV ? plotColors.fails : plotColors.meets, plotColors.inkSoft] },
          text: [formatEng(cmrTest.rtiPpV, 'V'), formatEng(cmrTest.limitPpV, 'V')],
          textposition: 'outside',
        },
      ]
    : [];

  const mainsLine = mainsHz ?? null;
  const cmrrData: PlotTrace[] = [
    {
      type: 'scatter',
      mode: 'lines',
      name: 'CMRR of the channel',
      x: report.cmrr.points.map((p) => p.fHz),
      y: report.cmrr.points.map((p) => p.cmrrDb),
      line: { color: plotColors.series[0], width: 2.5 },
    },
  ];

  return (
    <div className="space-y-3">
      {inter.rightLegDriveSaturated && (
        <p role="alert" className="rounded border border-verdict-fails bg-verdict-fails/5 p-2 text-sm text-verdict-fails">
          The right-leg drive would need more current than its limit: it saturates and no reduction is credited.
        </p>
      )}
      <dl className="grid grid-cols-2 gap-3 rounded border border-slate-200 bg-white p-3 text-sm md:grid-cols-5">
        <Stat term="Body common-mode voltage" value={`${formatEng(inter.bodyCmV, 'V')} rms`} />
        <Stat term="Interference RTI in use" value={`${formatEng(inter.rtiPpV, 'V')} p-p`} />
        <Stat term="Limit in use" value={limit ? `${formatEng(limit.limit, 'V')} p-p` : 'none in profile'} badge={limit?.verdict} />
        <Stat term="CMRR at DC / at mains" value={`${formatDb(report.cmrr.dcDb)} / ${formatDb(report.cmrr.mainsDb)}`} badge={cmrrCheck?.verdict} />
        <Stat term="Resistor-limited CMRR (worst case)" value={formatDb(report.cmrr.resistorLimitedDb)} />
      </dl>
      <div className="grid gap-3 lg:grid-cols-2">
        <PlotFigure
          title="Mains interference referred to input, by term"
          data={termsData}
          layout={{
            yaxis: { automargin: true, autorange: 'reversed' },
            xaxis: { title: { text: 'RTI (V p-p)' }, type: useLog ? 'log' : 'linear', exponentformat: 'SI', gridcolor: '#e5e7eb' },
            showlegend: false,
            shapes: limit ? [{ type: 'line', yref: 'paper', y0: 0, y1: 1, x0: limit.limit, x1: limit.limit, line: { color: plotColors.fails, width: 2, dash: 'dash' } }] : [],
            annotations: limit
              ? [{ yref: 'paper', y: 1, yanchor: 'bottom', x: useLog ? Math.log10(limit.limit) : limit.limit, text: `limit ${formatEng(limit.limit, 'V')} p-p`, showarrow: false, font: { color: plotColors.fails, size: 11 } }]
              : [],
            margin: { l: 20 },
          }}
        />
        {cmrTest ? (
          <PlotFigure
            title={`Profile common-mode test: ${formatEng(cmrTest.vcmRms, 'V')} rms common mode`}
            data={cmrData}
            layout={{
              xaxis: { title: { text: 'Common-mode test' } },
              yaxis: { title: { text: 'Residual RTI (V peak-to-peak, log scale)' }, type: 'log', exponentformat: 'SI', gridcolor: '#e5e7eb' },
              showlegend: false,
            }}
          />
        ) : (
          <p className="rounded border border-slate-200 bg-white p-3 text-sm text-ink-soft">The profile has no common-mode test.</p>
        )}
      </div>
      {cmrTest && cmrTestCheck && (
        <p className="text-sm">
          Common-mode test: {formatEng(cmrTest.rtiPpV, 'V')} p-p RTI against a limit of {formatEng(cmrTest.limitPpV, 'V')} p-p{' '}
          <VerdictBadge verdict={cmrTestCheck.verdict} />
        </p>
      )}
      <PlotFigure
        title="CMRR against frequency"
        data={cmrrData}
        layout={{
          xaxis: { type: 'log', title: { text: 'Frequency (Hz)' }, gridcolor: '#e5e7eb' },
          yaxis: { title: { text: 'CMRR (dB)' }, gridcolor: '#e5e7eb' },
          showlegend: false,
          shapes: [
            ...(cmrrCheck ? [{ type: 'line', xref: 'paper', x0: 0, x1: 1, y0: cmrrCheck.limit, y1: cmrrCheck.limit, line: { color: plotColors.fails, width: 2, dash: 'dash' } }] : []),
            ...(mainsLine ? [{ type: 'line', yref: 'paper', x0: mainsLine, x1: mainsLine, y0: 0, y1: 1, line: { color: plotColors.copper, width: 1.5, dash: 'dot' } }] : []),
          ],
          annotations: [
            ...(cmrrCheck ? [{ xref: 'paper', x: 1, xanchor: 'right', y: cmrrCheck.limit, yanchor: 'bottom', text: `minimum ${formatDb(cmrrCheck.limit)}`, showarrow: false, font: { color: plotColors.fails, size: 11 } }] : []),
            ...(mainsLine ? [{ x: Math.log10(mainsLine), yref: 'paper', y: 1, yanchor: 'bottom', text: `mains ${mainsLine} Hz`, showarrow: false, font: { color: plotColors.copper, size: 11 } }] : []),
          ],
        }}
      />
      <div className="overflow-x-auto rounded border border-slate-200 bg-white">
        <table className="w-full text-sm">
          <caption className="sr-only">Interference terms referred to input</caption>
          <thead className="bg-slate-50 text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-1.5">Term</th>
              <th scope="col" className="px-2 py-1.5 text-right">RTI (peak-to-peak)</th>
            </tr>
          </thead>
          <tbody>
            {inter.terms.map((t) => (
              <tr key={t.name} className="border-t border-slate-200">
                <th scope="row" className="px-2 py-1 text-left font-medium">
                  {t.name}
                </th>
                <td className="px-2 py-1 text-right tabular-nums">{formatEng(t.rtiPpV, 'V')}</td>
              </tr>
            ))}
            <tr className="border-t border-slate-300 font-semibold">
              <th scope="row" className="px-2 py-1 text-left">
                total (added in magnitude)
              </th>
              <td className="px-2 py-1 text-right tabular-nums">{formatEng(inter.rtiPpV, 'V')}</td>
            </tr>
          </tbody>
        </table>
      </div>
    </div>
  );
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
