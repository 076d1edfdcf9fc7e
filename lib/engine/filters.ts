/**
 * Analog filter responses of the channel: Butterworth and Bessel low-pass
 * (orders 1–8), Butterworth high-pass (orders 1–4), first-order sections.
 * All responses are normalised to unity gain in the pass band and to −3 dB
 * (|H| = 1/√2) at the corner frequency `fcHz`, for both families.
 *
 * Butterworth: poles equally spaced on the unit circle, s_k = exp(jπ(2k + n − 1)/(2n)),
 * k = 1…n (Butterworth 1930; Williams & Taylor, Electronic Filter Design Handbook, ch. 2).
 * Bessel: reverse Bessel polynomial θ_n(s) = Σ a_k s^k with
 * a_k = (2n − k)! / (2^(n−k)·k!·(n − k)!) (Thomson 1949; Williams & Taylor ch. 2),
 * rescaled in frequency so that |H| = 1/√2 at fc — the same normalisation as
 * SciPy's `scipy.signal.bessel(..., norm='mag')`.
 * High-pass: the low-pass-to-high-pass transformation s → ωc/s.
 */
import type { Complex } from './complex';

export type { Complex } from './complex';

/** Low-pass filter families offered in the plan. */
export type LowPassKind = 'butterworth' | 'bessel';

/** Lowest and highest low-pass order supported. */
export const LOW_PASS_MAX_ORDER = 8;
/** Highest Butterworth high-pass order supported. */
export const HIGH_PASS_MAX_ORDER = 4;

/** Ascending real coefficients d_0 … d_n of a monic-normalised denominator D(s) with D(0) = 1. */
type Denominator = Float64Array;

function butterworthDenominator(order: number): Denominator {
  // Multiply out ∏ (s − p_k) from the pole positions, then normalise so D(0) = 1.
  let re = [1];
  let im = [0];
  for (let k = 1; k <= order; k++) {
    const angle = (Math.PI * (2 * k + order - 1)) / (2 * order);
    const pRe = Math.cos(angle);
    const pIm = Math.sin(angle);
    const nextRe = new Array<number>(re.length + 1).fill(0);
    const nextIm = new Array<number>(re.length + 1).fill(0);
    for (let i = 0; i < re.length; i++) {
      // (c_i s^i)·s
      nextRe[i + 1] += re[i];
      nextIm[i + 1] += im[i];
      // (c_i s^i)·(−p)
      nextRe[i] -= re[i] * pRe - im[i] * pIm;
      nextIm[i] -= re[i] * pIm + im[i] * pRe;
    }
    re = nextRe;
    im = nextIm;
  }
  const d0 = re[0];
  return Float64Array.from(re, (c) => c / d0);
}

function factorial(n: number): number {
  let f = 1;
  for (let i = 2; i <= n; i++) f *= i;
  return f;
}

/** Delay-normalised reverse Bessel polynomial, ascending coefficients, D(0) = 1. */
function besselDelayDenominator(order: number): Denominator {
  const a = new Float64Array(order + 1);
  for (let k = 0; k <= order; k++) {
    a[k] = factorial(2 * order - k) / (2 ** (order - k) * factorial(k) * factorial(order - k));
  }
  const a0 = a[0];
  return a.map((c) => c / a0);
}

/** |1/D(jΩ)|² for a denominator with real ascending coefficients. */
function magnitudeSquaredAt(d: ArrayLike<number>, omega: number): number {
  // D(jΩ): even powers give the real part with sign (−1)^(k/2), odd powers the imaginary part.
  let re = 0;
  let im = 0;
  let power = 1;
  for (let k = 0; k < d.length; k++) {
    const term = d[k] * power;
    switch (k & 3) {
      case 0: re += term; break;
      case 1: im += term; break;
      case 2: re -= term; break;
      default: im -= term;
    }
    power *= omega;
  }
  return 1 / (re * re + im * im);
}

/** Rescales D(s) → D(s·w) so that the −3 dB point moves from w to 1 rad/s. */
function rescale(d: Denominator, w: number): Denominator {
  return d.map((c, k) => c * w ** k);
}

/** Frequency (normalised) where |H|² = 1/2, by bisection; |H| falls monotonically for these families. */
function halfPowerOmega(d: Denominator): number {
  let lo = 1e-3;
  let hi = 1e3;
  for (let i = 0; i < 200; i++) {
    const mid = Math.sqrt(lo * hi);
    if (magnitudeSquaredAt(d, mid) > 0.5) lo = mid;
    else hi = mid;
    if (hi / lo - 1 < 1e-15) break;
  }
  return Math.sqrt(lo * hi);
}

const denominators: Record<LowPassKind, Denominator[]> = { butterworth: [], bessel: [] };
for (let n = 1; n <= LOW_PASS_MAX_ORDER; n++) {
  denominators.butterworth[n] = butterworthDenominator(n);
  const delay = besselDelayDenominator(n);
  denominators.bessel[n] = rescale(delay, halfPowerOmega(delay));
}

function checkOrder(order: number, max: number, what: string): void {
  if (!Number.isInteger(order) || order < 1 || order > max) {
    throw new RangeError(`${what} order must be a whole number from 1 to ${max} (got ${order})`);
  }
}

function checkFrequencies(fcHz: number, fHz: number): void {
  if (!(fcHz > 0) || !Number.isFinite(fcHz)) throw new RangeError(`corner frequency must be a positive finite number of hertz (got ${fcHz})`);
  if (!(fHz >= 0) || !Number.isFinite(fHz)) throw new RangeError(`frequency must be a finite number of hertz, zero or more (got ${fHz})`);
}

/**
 * Ascending coefficients of the normalised low-pass denominator D(s), with D(0) = 1 and
 * |1/D(j·1)| = 1/√2, s in units of the corner angular frequency.
 * @param kind filter family
 * @param order 1–8
 * @returns a copy of the coefficients d_0 … d_n
 * @example lowPassDenominator('butterworth', 2) → [1, 1.41421356…, 1]
 */
export function lowPassDenominator(kind: LowPassKind, order: number): number[] {
  checkOrder(order, LOW_PASS_MAX_ORDER, 'low-pass');
  return Array.from(denominators[kind][order]);
}

/** Evaluates 1/D(s) at the complex normalised frequency s = sRe + j·sIm (Horner). */
function inverseDenominatorAt(d: Denominator, sRe: number, sIm: number): Complex {
  let re = d[d.length - 1];
  let im = 0;
  for (let k = d.length - 2; k >= 0; k--) {
    const nextRe = re * sRe - im * sIm + d[k];
    im = re * sIm + im * sRe;
    re = nextRe;
  }
  const m = re * re + im * im;
  return { re: re / m, im: -im / m };
}

/**
 * Complex response of a low-pass filter at frequency fHz.
 * @param kind 'butterworth' or 'bessel' (Bessel normalised to −3 dB at fcHz, as SciPy's norm='mag')
 * @param order filter order, 1–8
 * @param fcHz −3 dB corner frequency, Hz
 * @param fHz evaluation frequency, Hz
 * @returns H(j2πf), dimensionless; H(0) = 1
 * @example magnitude(lowPassAt('butterworth', 4, 100, 100)) → 0.70711 (−3.01 dB)
 */
export function lowPassAt(kind: LowPassKind, order: number, fcHz: number, fHz: number): Complex {
  checkOrder(order, LOW_PASS_MAX_ORDER, 'low-pass');
  checkFrequencies(fcHz, fHz);
  return inverseDenominatorAt(denominators[kind][order], 0, fHz / fcHz);
}

/**
 * Squared magnitude |H|² of a low-pass filter at fHz (cheaper than the complex value; used by
 * the noise integration).
 * @param kind filter family
 * @param order 1–8
 * @param fcHz −3 dB corner, Hz
 * @param fHz frequency, Hz
 * @returns |H(j2πf)|², dimensionless
 * @example lowPassMagnitudeSquared('bessel', 3, 10, 10) → 0.5
 */
export function lowPassMagnitudeSquared(kind: LowPassKind, order: number, fcHz: number, fHz: number): number {
  checkOrder(order, LOW_PASS_MAX_ORDER, 'low-pass');
  checkFrequencies(fcHz, fHz);
  return magnitudeSquaredAt(denominators[kind][order], fHz / fcHz);
}

/**
 * A validated filter ready to be evaluated at many frequencies: its normalised denominator D and
 * corner, with the order and corner checked once instead of at every frequency. Evaluate with
 * `filterResponseInto` and `filterMagnitudeSquaredAt`.
 */
export type FilterSweep = {
  /** true: high-pass, evaluated at Ω = −fc/f (s → ωc/s); false: low-pass, at Ω = f/fc. */
  readonly highPass: boolean;
  /** −3 dB corner, Hz. */
  readonly fcHz: number;
  /** Ascending coefficients d_0 … d_n of D(s), D(0) = 1 (shared, never written). */
  readonly denominator: ArrayLike<number>;
};

/**
 * The low-pass of `lowPassAt` prepared for a sweep.
 * @param kind filter family
 * @param order 1–8
 * @param fcHz −3 dB corner, Hz
 * @throws RangeError for an order or corner `lowPassAt` would reject
 */
export function lowPassSweep(kind: LowPassKind, order: number, fcHz: number): FilterSweep {
  checkOrder(order, LOW_PASS_MAX_ORDER, 'low-pass');
  checkFrequencies(fcHz, 0);
  return { highPass: false, fcHz, denominator: denominators[kind][order] };
}

/**
 * The Butterworth high-pass of `highPassAt` prepared for a sweep.
 * @param order 1–4
 * @param fcHz −3 dB corner, Hz
 * @throws RangeError for an order or corner `highPassAt` would reject
 */
export function highPassSweep(order: number, fcHz: number): FilterSweep {
  checkOrder(order, HIGH_PASS_MAX_ORDER, 'high-pass');
  checkFrequencies(fcHz, 0);
  return { highPass: true, fcHz, denominator: denominators.butterworth[order] };
}

/**
 * H(j2πf) of a prepared filter, written to out[at] (real part) and out[at + 1] (imaginary part):
 * the value `lowPassAt` / `highPassAt` return, without allocating. 1/D(jΩ) by Horner's rule with
 * the real part of s = jΩ left out (the same operations as `inverseDenominatorAt` with sRe = 0).
 * @param filter from `lowPassSweep` or `highPassSweep`
 * @param fHz frequency, Hz (finite, ≥ 0; not checked here); a high-pass gives 0 at 0 Hz
 * @param out receives the result
 * @param at index of the real part in `out`
 */
export function filterResponseInto(filter: FilterSweep, fHz: number, out: Float64Array, at: number): void {
  if (filter.highPass && fHz === 0) {
    out[at] = 0;
    out[at + 1] = 0;
    return;
  }
  const omega = filter.highPass ? -filter.fcHz / fHz : fHz / filter.fcHz;
  const d = filter.denominator;
  let re = d[d.length - 1];
  let im = 0;
  for (let k = d.length - 2; k >= 0; k--) {
    const nextRe = d[k] - im * omega;
    im = re * omega;
    re = nextRe;
  }
  const m = re * re + im * im;
  out[at] = re / m;
  out[at + 1] = -im / m;
}

/**
 * |H(j2πf)|² of a prepared filter, summed from the powers of Ω (cheaper than the complex value):
 * for a low-pass the value `lowPassMagnitudeSquared` returns.
 * @param filter from `lowPassSweep` or `highPassSweep`
 * @param fHz frequency, Hz (finite, ≥ 0; not checked here); a high-pass gives 0 at 0 Hz
 * @returns |H|², dimensionless
 */
export function filterMagnitudeSquaredAt(filter: FilterSweep, fHz: number): number {
  if (filter.highPass && fHz === 0) return 0;
  return magnitudeSquaredAt(filter.denominator, filter.highPass ? -filter.fcHz / fHz : fHz / filter.fcHz);
}

/**
 * Complex response of a Butterworth high-pass filter (low-pass prototype with s → ωc/s).
 * @param order 1–4
 * @param fcHz −3 dB corner, Hz
 * @param fHz frequency, Hz (0 gives 0)
 * @returns H(j2πf), dimensionless; H(∞) = 1
 * @example magnitude(highPassAt(1, 0.05, 0.05)) → 0.70711
 */
export function highPassAt(order: number, fcHz: number, fHz: number): Complex {
  checkOrder(order, HIGH_PASS_MAX_ORDER, 'high-pass');
  checkFrequencies(fcHz, fHz);
  if (fHz === 0) return { re: 0, im: 0 };
  // s_normalised = jf/fc, so ωc/s = −j·fc/f.
  return inverseDenominatorAt(denominators.butterworth[order], 0, -fcHz / fHz);
}

/**
 * First-order RC low-pass 1/(1 + j f/fc).
 * @param fcHz corner, Hz (1/(2πRC))
 * @param fHz frequency, Hz
 * @returns H, dimensionless
 * @example firstOrderLowPassAt(1, 1) → { re: 0.5, im: -0.5 }
 */
export function firstOrderLowPassAt(fcHz: number, fHz: number): Complex {
  checkFrequencies(fcHz, fHz);
  const x = fHz / fcHz;
  const d = 1 + x * x;
  return { re: 1 / d, im: -x / d };
}

/**
 * First-order RC high-pass (j f/fc)/(1 + j f/fc).
 * @param fcHz corner, Hz
 * @param fHz frequency, Hz
 * @returns H, dimensionless
 * @example firstOrderHighPassAt(1, 1) → { re: 0.5, im: 0.5 }
 */
export function firstOrderHighPassAt(fcHz: number, fHz: number): Complex {
  checkFrequencies(fcHz, fHz);
  const x = fHz / fcHz;
  const d = 1 + x * x;
  return { re: (x * x) / d, im: x / d };
}

/**
 * Corner of an RC low-pass, fc = 1/(2πRC) (any circuits textbook, e.g. Horowitz & Hill, The Art
 * of Electronics, 3rd ed., §1.7).
 * @param rOhm resistance, Ω
 * @param cF capacitance, F
 * @returns corner frequency, Hz
 * @example rcCornerHz(1e3, 159.155e-9) → 1000.0
 */
export function rcCornerHz(rOhm: number, cF: number): number {
  return 1 / (2 * Math.PI * rOhm * cF);
}

/**
 * Equivalent noise bandwidth of a low-pass filter, ∫₀^∞ |H(f)|² df, by Simpson's rule after the
 * substitution Ω = tan θ (which maps the infinite range onto [0, π/2) and is exact for order 1).
 * Reference values (Winder, Analog and Digital Filter Design, table of noise bandwidths):
 * Butterworth orders 1–4 give 1.5708, 1.1107, 1.0472, 1.0262 × fc.
 * @param kind filter family
 * @param order 1–8
 * @param fcHz −3 dB corner, Hz
 * @returns noise bandwidth, Hz
 * @example equivalentNoiseBandwidthHz('butterworth', 1, 1) → 1.5708
 */
export function equivalentNoiseBandwidthHz(kind: LowPassKind, order: number, fcHz: number): number {
  checkOrder(order, LOW_PASS_MAX_ORDER, 'low-pass');
  const d = denominators[kind][order];
  const intervals = 4000;
  const h = Math.PI / 2 / intervals;
  let sum = 0;
  for (let i = 0; i <= intervals; i++) {
    const theta = i * h;
    let value: number;
    if (i === intervals) {
      value = order === 1 ? 1 / (d[1] * d[1]) : 0;
    } else {
      const omega = Math.tan(theta);
      const sec = 1 / Math.cos(theta);
      value = magnitudeSquaredAt(d, omega) * sec * sec;
    }
    sum += value * (i === 0 || i === intervals ? 1 : i % 2 === 1 ? 4 : 2);
  }
  return ((sum * h) / 3) * fcHz;
}
