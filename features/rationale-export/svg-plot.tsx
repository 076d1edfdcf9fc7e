/**
 * Small vector-plot helpers for the PDF, drawn with react-pdf's `Svg` primitives: line plots on
 * linear or log axes, range bars against limits, and horizontal bars; with axis titles, tick
 * labels in engineering notation and a legend. Everything stays vector in the PDF.
 */
import * as React from 'react';
import { G, Line, Polyline, Rect, Svg, Text, View } from '@react-pdf/renderer';
import { pdfText } from './format';
import { PDF_FONT_FAMILIES } from './pdf-fonts';
import { axisTicks, makeScale, type AxisSpec } from './plot-scales';

void React;

export const PLOT_COLORS = ['#1f4e9c', '#c2410c', '#15803d', '#7e22ce', '#b91c1c', '#0e7490', '#a16207', '#be185d', '#4d7c0f', '#475569', '#9333ea', '#0369a1'];
const AXIS_COLOR = '#334155';
const GRID_COLOR = '#e2e8f0';
const TICK_FONT = 6.5;
const TITLE_FONT = 7.5;

export type PlotPoint = { x: number; y: number };
export type Series = { label: string; color: string; points: PlotPoint[]; dashed?: boolean; widthPt?: number };
export type ReferenceLine = { axis: 'x' | 'y'; value: number; label: string; color?: string };

type Margins = { left: number; right: number; top: number; bottom: number };
const DEFAULT_MARGINS: Margins = { left: 48, right: 12, top: 8, bottom: 30 };

/** Svg text with the document's fonts; `anchor` as in SVG. */
function SvgLabel(props: { x: number; y: number; text: string; size?: number; anchor?: 'start' | 'middle' | 'end'; color?: string; rotate?: boolean; bold?: boolean }) {
  const { x, y, text, size = TICK_FONT, anchor = 'start', color = AXIS_COLOR, rotate = false, bold = false } = props;
  const label = (
    // react-pdf's Svg Text takes SVG attributes and a style for the font.
    <Text x={x} y={y} fill={color} textAnchor={anchor} style={{ fontSize: size, fontFamily: PDF_FONT_FAMILIES, fontWeight: bold ? 700 : 400 } as never}>
      {pdfText(text)}
    </Text>
  );
  return rotate ? <G transform={`rotate(-90 ${x} ${y})`}>{label}</G> : label;
}

function inRange(axis: AxisSpec, v: number): boolean {
  return Number.isFinite(v) && (axis.kind === 'linear' || v > 0);
}

function clampTo(axis: AxisSpec, v: number): number {
  return Math.min(axis.max, Math.max(axis.min, v));
}

/**
 * Splits a series into drawable runs: points that cannot be drawn (non-finite, or ≤ 0 on a log
 * axis) break the line; points beyond the axis range are clamped to its edge.
 */
export function drawableRuns(points: readonly PlotPoint[], x: AxisSpec, y: AxisSpec): PlotPoint[][] {
  const slack = x.kind === 'log' ? 1e-9 * x.max : 1e-9 * Math.abs(x.max - x.min);
  const runs: PlotPoint[][] = [];
  let current: PlotPoint[] = [];
  for (const p of points) {
    const drawable = inRange(x, p.x) && inRange(y, p.y) && p.x >= x.min - slack && p.x <= x.max + slack;
    if (!drawable) {
      if (current.length > 0) runs.push(current);
      current = [];
      continue;
    }
    current.push({ x: p.x, y: clampTo(y, p.y) });
  }
  if (current.length > 0) runs.push(current);
  return runs;
}

/** Axes with grid, ticks and titles; children draw in data coordinates through the scales given. */
function Axes(props: { width: number; height: number; x: AxisSpec; y: AxisSpec; margins: Margins; hideYTicks?: boolean; children: (sx: (v: number) => number, sy: (v: number) => number) => React.ReactNode }) {
  const { width, height, x, y, margins } = props;
  const left = margins.left;
  const right = width - margins.right;
  const top = margins.top;
  const bottom = height - margins.bottom;
  const sx = makeScale(x, left, right);
  const sy = makeScale(y, bottom, top);
  const xTicks = axisTicks(x, 6);
  const yTicks = props.hideYTicks ? [] : axisTicks(y, 5);
  return (
    <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
      <Rect x={left} y={top} width={right - left} height={bottom - top} fill="#ffffff" stroke={AXIS_COLOR} strokeWidth={0.6} />
      {xTicks.map((t) => (
        <G key={`x${t.value}`}>
          <Line x1={sx(t.value)} y1={top} x2={sx(t.value)} y2={bottom} stroke={GRID_COLOR} strokeWidth={t.major ? 0.5 : 0.25} />
          <Line x1={sx(t.value)} y1={bottom} x2={sx(t.value)} y2={bottom + (t.major ? 3 : 1.5)} stroke={AXIS_COLOR} strokeWidth={0.5} />
          {t.label ? <SvgLabel x={sx(t.value)} y={bottom + 10} text={t.label} anchor="middle" /> : null}
        </G>
      ))}
      {yTicks.map((t) => (
        <G key={`y${t.value}`}>
          <Line x1={left} y1={sy(t.value)} x2={right} y2={sy(t.value)} stroke={GRID_COLOR} strokeWidth={t.major ? 0.5 : 0.25} />
          <Line x1={left - (t.major ? 3 : 1.5)} y1={sy(t.value)} x2={left} y2={sy(t.value)} stroke={AXIS_COLOR} strokeWidth={0.5} />
          {t.label ? <SvgLabel x={left - 4} y={sy(t.value) + 2.2} text={t.label} anchor="end" /> : null}
        </G>
      ))}
      {props.children(sx, sy)}
      <Rect x={left} y={top} width={right - left} height={bottom - top} fill="none" stroke={AXIS_COLOR} strokeWidth={0.6} />
      <SvgLabel x={(left + right) / 2} y={height - 4} text={x.title} anchor="middle" size={TITLE_FONT} />
      {y.title ? <SvgLabel x={9} y={(top + bottom) / 2} text={y.title} anchor="middle" size={TITLE_FONT} rotate /> : null}
    </Svg>
  );
}

function points(run: PlotPoint[], sx: (v: number) => number, sy: (v: number) => number): string {
  return run.map((p) => `${sx(p.x).toFixed(2)},${sy(p.y).toFixed(2)}`).join(' ');
}

/** A legend row under a plot: colour swatch and label per entry. */
export function Legend(props: { entries: { label: string; color: string; dashed?: boolean }[] }) {
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', marginTop: 2 }}>
      {props.entries.map((e) => (
        <View key={e.label} style={{ flexDirection: 'row', alignItems: 'center', marginRight: 10, marginBottom: 2 }}>
          <Svg width={14} height={6} viewBox="0 0 14 6">
            <Line x1={0} y1={3} x2={14} y2={3} stroke={e.color} strokeWidth={1.6} strokeDasharray={e.dashed ? '3 2' : undefined} />
          </Svg>
          <Text style={{ fontSize: 6.5, marginLeft: 3, color: '#1e293b' }}>{pdfText(e.label)}</Text>
        </View>
      ))}
    </View>
  );
}

/**
 * A line plot of one or more series on linear or log axes, with optional reference lines
 * (limits, corners) drawn dashed and labelled.
 */
export function LinePlot(props: { width: number; height: number; x: AxisSpec; y: AxisSpec; series: Series[]; references?: ReferenceLine[]; legend?: boolean }) {
  const { x, y, series, references = [], legend = true } = props;
  return (
    <View>
      <Axes width={props.width} height={props.height} x={x} y={y} margins={DEFAULT_MARGINS}>
        {(sx, sy) => (
          <G>
            {references.map((r) => {
              const axis = r.axis === 'x' ? x : y;
              if (!inRange(axis, r.value) || r.value < axis.min || r.value > axis.max) return null;
              const color = r.color ?? '#b91c1c';
              return r.axis === 'x' ? (
                <G key={`r${r.label}`}>
                  <Line x1={sx(r.value)} y1={sy(y.max)} x2={sx(r.value)} y2={sy(y.min)} stroke={color} strokeWidth={0.7} strokeDasharray="3 2" />
                  <SvgLabel x={sx(r.value) + 2} y={sy(y.max) + 7} text={r.label} color={color} />
                </G>
              ) : (
                <G key={`r${r.label}`}>
                  <Line x1={sx(x.min)} y1={sy(r.value)} x2={sx(x.max)} y2={sy(r.value)} stroke={color} strokeWidth={0.7} strokeDasharray="3 2" />
                  <SvgLabel x={sx(x.max) - 2} y={sy(r.value) - 2} text={r.label} color={color} anchor="end" />
                </G>
              );
            })}
            {series.flatMap((s) =>
              drawableRuns(s.points, x, y).map((run, i) => (
                <Polyline
                  key={`${s.label}-${i}`}
                  points={points(run, sx, sy)}
                  fill="none"
                  stroke={s.color}
                  strokeWidth={s.widthPt ?? 1}
                  strokeDasharray={s.dashed ? '3 2' : undefined}
                />
              )),
            )}
          </G>
        )}
      </Axes>
      {legend ? <Legend entries={series.map((s) => ({ label: s.label, color: s.color, dashed: s.dashed }))} /> : null}
    </View>
  );
}

export type RangeBar = { label: string; allowedLow: number; allowedHigh: number; reachedLow: number; reachedHigh: number; ok: boolean };

/**
 * Horizontal range bars on a linear axis: for each row the allowed range (light) and the range
 * reached (dark; red when outside), e.g. node voltages against rails and swing limits.
 */
export function RangeBarPlot(props: { width: number; x: AxisSpec; rows: RangeBar[]; rowHeightPt?: number; labelWidthPt?: number }) {
  const rowHeight = props.rowHeightPt ?? 13;
  const labelWidth = props.labelWidthPt ?? 130;
  const margins: Margins = { left: labelWidth, right: 12, top: 6, bottom: 30 };
  const height = margins.top + margins.bottom + rowHeight * props.rows.length;
  const y: AxisSpec = { kind: 'linear', min: 0, max: props.rows.length, title: '' };
  return (
    <View>
      <Axes width={props.width} height={height} x={props.x} y={y} margins={margins} hideYTicks>
          {(sx) => (
            <G>
              {props.rows.map((row, i) => {
                const top = margins.top + i * rowHeight;
                const clampX = (v: number) => sx(clampTo(props.x, v));
                const aLo = clampX(row.allowedLow);
                const aHi = clampX(row.allowedHigh);
                const rLo = clampX(Math.min(row.reachedLow, row.reachedHigh));
                const rHi = clampX(Math.max(row.reachedLow, row.reachedHigh));
                return (
                  <G key={row.label + i}>
                    <Rect x={aLo} y={top + 2} width={Math.max(0.5, aHi - aLo)} height={rowHeight - 4} fill="#dbeafe" stroke="#93c5fd" strokeWidth={0.4} />
                    <Rect x={rLo} y={top + 4.5} width={Math.max(1, rHi - rLo)} height={rowHeight - 9} fill={row.ok ? '#1f4e9c' : '#b91c1c'} />
                    <SvgLabel x={margins.left - 4} y={top + rowHeight / 2 + 2.2} text={row.label} anchor="end" />
                  </G>
                );
              })}
            </G>
          )}
        </Axes>
      <Legend
        entries={[
          { label: 'allowed range (swing / input range / full scale)', color: '#93c5fd' },
          { label: 'range reached, within limits', color: '#1f4e9c' },
          { label: 'range reached, beyond a limit', color: '#b91c1c' },
        ]}
      />
    </View>
  );
}

export type Bar = { label: string; value: number; color?: string };

/**
 * Horizontal bars from the axis minimum to each value (log or linear axis), with an optional
 * limit line; e.g. mains interference terms against the profile's limit.
 */
export function BarPlot(props: { width: number; x: AxisSpec; bars: Bar[]; limit?: { value: number; label: string }; rowHeightPt?: number; labelWidthPt?: number }) {
  const rowHeight = props.rowHeightPt ?? 13;
  const labelWidth = props.labelWidthPt ?? 150;
  const margins: Margins = { left: labelWidth, right: 12, top: 12, bottom: 30 };
  const height = margins.top + margins.bottom + rowHeight * props.bars.length;
  const y: AxisSpec = { kind: 'linear', min: 0, max: props.bars.length, title: '' };
  return (
    <Axes width={props.width} height={height} x={props.x} y={y} margins={margins} hideYTicks>
      {(sx) => (
        <G>
          {props.bars.map((bar, i) => {
            const top = margins.top + i * rowHeight;
            const drawn = inRange(props.x, bar.value);
            const end = drawn ? sx(clampTo(props.x, bar.value)) : sx(props.x.min);
            return (
              <G key={bar.label + i}>
                {drawn ? <Rect x={sx(props.x.min)} y={top + 2.5} width={Math.max(0.5, end - sx(props.x.min))} height={rowHeight - 5} fill={bar.color ?? PLOT_COLORS[i % PLOT_COLORS.length]} /> : null}
                <SvgLabel x={margins.left - 4} y={top + rowHeight / 2 + 2.2} text={bar.label} anchor="end" />
              </G>
            );
          })}
          {props.limit && inRange(props.x, props.limit.value) && props.limit.value >= props.x.min && props.limit.value <= props.x.max ? (
            <G>
              <Line x1={sx(props.limit.value)} y1={margins.top - 2} x2={sx(props.limit.value)} y2={height - margins.bottom} stroke="#b91c1c" strokeWidth={0.8} strokeDasharray="3 2" />
              <SvgLabel x={sx(props.limit.value)} y={margins.top - 4} text={props.limit.label} color="#b91c1c" anchor="middle" />
            </G>
          ) : null}
        </G>
      )}
    </Axes>
  );
}
