'use client';
/**
 * A Plotly figure loaded on demand: plotly.js is imported only in the browser, after the
 * workspace has rendered, so it is not part of the first-load JavaScript.
 */
import dynamic from 'next/dynamic';

/** Plot data and layout as Plotly takes them (kept loose: the minified bundle has no types). */
export type PlotTrace = Record<string, unknown>;
export type PlotLayout = Record<string, unknown>;

const Plot = dynamic(
  async () => {
    const [{ default: createPlotlyComponent }, { default: Plotly }] = await Promise.all([
      import('react-plotly.js/factory'),
      import('plotly.js-dist-min'),
    ]);
    return createPlotlyComponent(Plotly);
  },
  {
    ssr: false,
    loading: () => <div className="flex h-full items-center justify-center text-sm text-ink-soft">Loading plot…</div>,
  },
);

/** Colours of the figures: the product palette (tailwind.config.ts) plus neutral series colours. */
export const plotColors = {
  ink: '#1c2430',
  inkSoft: '#4a5565',
  copper: '#b4582a',
  copperLight: '#f6e7de',
  meets: '#1d7a46',
  marginal: '#a66a00',
  fails: '#b3261e',
  series: ['#2f5d8a', '#b4582a', '#1d7a46', '#7a4fa0', '#a66a00', '#3b8c8c', '#8a2f5d', '#5d6b7a', '#c28f2c', '#4a7a2f'],
};

const baseLayout: PlotLayout = {
  autosize: true,
  margin: { l: 70, r: 20, t: 36, b: 56 },
  font: { family: 'system-ui, sans-serif', size: 12, color: plotColors.ink },
  paper_bgcolor: 'rgba(0,0,0,0)',
  plot_bgcolor: '#ffffff',
  legend: { orientation: 'h', y: -0.22 },
};

interface PlotFigureProps {
  /** Accessible description of the figure (what it shows). */
  title: string;
  data: PlotTrace[];
  layout: PlotLayout;
  heightPx?: number;
}

/**
 * One labelled figure. Axis titles (with units) come from the caller's layout.
 */
export function PlotFigure({ title, data, layout, heightPx = 340 }: PlotFigureProps) {
  const merged: PlotLayout = {
    ...baseLayout,
    ...layout,
    title: { text: title, font: { size: 14 }, x: 0, xanchor: 'left' },
    margin: { ...(baseLayout.margin as object), ...((layout.margin as object) ?? {}) },
  };
  return (
    <figure className="rounded border border-slate-200 bg-white p-2" aria-label={title}>
      <div style={{ height: heightPx }}>
        <Plot
          data={data}
          layout={merged}
          config={{ displaylogo: false, responsive: true, modeBarButtonsToRemove: ['lasso2d', 'select2d'] }}
          style={{ width: '100%', height: '100%' }}
          useResizeHandler
        />
      </div>
    </figure>
  );
}
