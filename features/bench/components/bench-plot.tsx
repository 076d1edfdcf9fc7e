'use client';
/** A Plotly figure loaded only in the browser (react-plotly.js factory over the minified bundle). */
import dynamic from 'next/dynamic';

const Plot = dynamic(
  async () => {
    const [{ default: createPlotlyComponent }, { default: Plotly }] = await Promise.all([
      import('react-plotly.js/factory'),
      import('plotly.js-dist-min'),
    ]);
    return createPlotlyComponent(Plotly as Parameters<typeof createPlotlyComponent>[0]);
  },
  { ssr: false, loading: () => <div className="flex h-full items-center justify-center text-sm text-ink-soft">Loading plot…</div> },
);

export function BenchPlot({ title, data, layout, heightPx = 320 }: { title: string; data: Record<string, unknown>[]; layout: Record<string, unknown>; heightPx?: number }) {
  return (
    <figure aria-label={title} className="rounded-lg border border-ink-soft/20 bg-white p-2">
      <div style={{ height: heightPx }}>
        <Plot
          data={data as never}
          layout={{
            autosize: true,
            margin: { l: 70, r: 20, t: 36, b: 56 },
            font: { family: 'system-ui, sans-serif', size: 12, color: '#1c2430' },
            paper_bgcolor: 'rgba(0,0,0,0)',
            plot_bgcolor: '#ffffff',
            title: { text: title, font: { size: 13 } },
            ...layout,
          } as never}
          config={{ displaylogo: false, responsive: true }}
          useResizeHandler
          style={{ width: '100%', height: '100%' }}
        />
      </div>
      <figcaption className="sr-only">{title}</figcaption>
    </figure>
  );
}
