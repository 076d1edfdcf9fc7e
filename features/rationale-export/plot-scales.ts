/**
 * Axis arithmetic for the PDF's vector plots: linear and logarithmic scales, "nice" tick values
 * and engineering tick labels. Pure functions (no React) so they can be tested on their own.
 */
import { engNumber } from './format';

export type AxisKind = 'linear' | 'log';

export type AxisSpec = {
  kind: AxisKind;
  /** Data range shown, in the axis unit (SI); for a log axis both must be > 0. */
  min: number;
  max: number;
  /** Axis title with its unit, e.g. "Frequency (Hz)". */
  title: string;
};

export type Tick = { value: number; label: string; major: boolean };

/**
 * Maps data values to pixels.
 * @param axis the axis (range and kind)
 * @param fromPx pixel of `axis.min`
 * @param toPx pixel of `axis.max`
 * @returns a function value → pixel; values outside the range map outside [fromPx, toPx]
 */
export function makeScale(axis: Pick<AxisSpec, 'kind' | 'min' | 'max'>, fromPx: number, toPx: number): (value: number) => number {
  if (axis.kind === 'log') {
    const lo = Math.log10(axis.min);
    const span = Math.log10(axis.max) - lo || 1;
    return (v) => fromPx + ((Math.log10(v) - lo) / span) * (toPx - fromPx);
  }
  const span = axis.max - axis.min || 1;
  return (v) => fromPx + ((v - axis.min) / span) * (toPx - fromPx);
}

/**
 * A "nice" step for about `target` intervals over a span: 1, 2 or 5 × 10^k.
 * @example niceStep(0, 10, 5) // 2
 */
export function niceStep(min: number, max: number, target = 5): number {
  const raw = Math.abs(max - min) / Math.max(1, target);
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  const nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * power;
}

/**
 * Widens a data range to whole multiples of a nice step (linear) or to whole decades (log).
 * Degenerate ranges (min = max) are opened up around the value.
 * @param values the data (non-finite values, and for log non-positive ones, are ignored)
 * @param kind axis kind
 * @param include extra values that must be inside (limits, zero)
 */
export function niceRange(values: readonly number[], kind: AxisKind, include: readonly number[] = []): { min: number; max: number } {
  const all = [...values, ...include].filter((v) => Number.isFinite(v) && (kind === 'linear' || v > 0));
  if (all.length === 0) return kind === 'log' ? { min: 1, max: 10 } : { min: 0, max: 1 };
  let lo = Math.min(...all);
  let hi = Math.max(...all);
  if (kind === 'log') {
    let min = 10 ** Math.floor(Math.log10(lo) + 1e-9);
    let max = 10 ** Math.ceil(Math.log10(hi) - 1e-9);
    if (max <= min) {
      min /= 10;
      max *= 10;
    }
    return { min, max };
  }
  if (hi === lo) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const step = niceStep(lo, hi, 5);
  const clean = (v: number) => Number(v.toPrecision(12)); // 17 × 0.2 = 3.4000000000000004 → 3.4
  return { min: clean(Math.floor(lo / step + 1e-9) * step), max: clean(Math.ceil(hi / step - 1e-9) * step) };
}

/**
 * Tick marks for a linear axis at multiples of a nice step.
 * @returns ticks with engineering labels ("-2m", "0", "2m")
 */
export function linearTicks(min: number, max: number, target = 5): Tick[] {
  const step = niceStep(min, max, target);
  const first = Math.ceil(min / step - 1e-9);
  const last = Math.floor(max / step + 1e-9);
  const ticks: Tick[] = [];
  for (let k = first; k <= last && ticks.length < 50; k += 1) {
    // k·step, with the float noise of the product removed (0.30000000000000004 → 0.3).
    const value = Number((k * step).toPrecision(12));
    ticks.push({ value, label: engNumber(value, 3), major: true });
  }
  return ticks;
}

/**
 * Tick marks for a log axis: every decade labelled; minor ticks at 2–9 unlabelled, except that
 * spans of at most two decades also label 2 and 5. Very wide spans label every second or third
 * decade so the labels do not collide.
 * @param min lower end (> 0)
 * @param max upper end (> min)
 */
export function logTicks(min: number, max: number): Tick[] {
  if (!(min > 0 && max > min)) return [];
  const lo = Math.floor(Math.log10(min) + 1e-9);
  const hi = Math.ceil(Math.log10(max) - 1e-9);
  const decades = hi - lo;
  const labelEvery = decades > 12 ? 3 : decades > 7 ? 2 : 1;
  const ticks: Tick[] = [];
  for (let d = lo; d <= hi; d += 1) {
    for (let m = 1; m <= 9; m += 1) {
      const value = Number((m * 10 ** d).toPrecision(12));
      if (value < min * (1 - 1e-9) || value > max * (1 + 1e-9)) continue;
      const major = m === 1;
      const labelled = major ? (d - lo) % labelEvery === 0 : decades <= 2 && (m === 2 || m === 5);
      ticks.push({ value, label: labelled ? engNumber(value, 3) : '', major });
    }
  }
  return ticks;
}

/** Ticks for an axis of either kind. */
export function axisTicks(axis: Pick<AxisSpec, 'kind' | 'min' | 'max'>, target = 5): Tick[] {
  return axis.kind === 'log' ? logTicks(axis.min, axis.max) : linearTicks(axis.min, axis.max, target);
}
