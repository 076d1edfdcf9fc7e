/**
 * Number formatting for the workspace: engineering notation with SI prefixes
 * (exponent a multiple of three) and the unit, e.g. 51 000 Ω → "51 kΩ",
 * 4.7e-8 F → "47 nF", 8e-9 V/√Hz → "8 nV/√Hz".
 *
 * Pure functions, no React; safe in the browser, the worker and tests.
 */

/** SI prefixes from femto to tera, keyed by the power of 1000. */
const prefixByExponent3: Record<number, string> = {
  [-5]: 'f',
  [-4]: 'p',
  [-3]: 'n',
  [-2]: 'µ',
  [-1]: 'm',
  0: '',
  1: 'k',
  2: 'M',
  3: 'G',
  4: 'T',
};
const minExponent3 = -5;
const maxExponent3 = 4;

/** Units that never take an SI prefix (logarithmic or dimensionless). */
const unprefixedUnits = new Set(['dB', '%', 'bits', 'V/V', '', 'codes', 'LSB', 'K', '°C']);

export interface FormatOptions {
  /** Significant digits (1–15); default 3. */
  digits?: number;
  /** Force plain (unprefixed) output even for prefixable units. */
  plain?: boolean;
  /** Show an explicit "+" on positive values. */
  signed?: boolean;
}

/** The placeholder shown for a value that is missing or not finite. */
export const missingValueText = '—';

/**
 * Rounds `value` to `digits` significant digits and returns it as a string
 * without trailing zeros ("47.0" → "47", "1.50" → "1.5").
 */
export function toSignificant(value: number, digits = 3): string {
  if (value === 0) return '0';
  const d = Math.min(15, Math.max(1, Math.round(digits)));
  const text = Number(value.toPrecision(d)).toString();
  // Number#toString switches to exponent form below 1e-6 or above 1e21; expand it.
  if (/e/i.test(text)) {
    const exponent = Math.floor(Math.log10(Math.abs(value)));
    const decimals = Math.max(0, d - 1 - exponent);
    return Number(value.toPrecision(d)).toFixed(Math.min(100, decimals)).replace(/\.?0+$/, '');
  }
  return text;
}

/**
 * Formats an SI value in engineering notation with its unit.
 *
 * @param valueSi the value in the unit's SI base (V, A, Ω, F, Hz, s, V/√Hz, ...)
 * @param unit the unit symbol appended after the prefix ("Ω", "F", "V/√Hz"); units such as "dB", "%" or "" are never prefixed
 * @param options significant digits (default 3), plain, signed
 * @returns e.g. `formatEng(51000, 'Ω')` → "51 kΩ", `formatEng(4.7e-8, 'F')` → "47 nF", `formatEng(0.05, 'Hz')` → "50 mHz"
 */
export function formatEng(valueSi: number | null | undefined, unit: string, options: FormatOptions = {}): string {
  if (valueSi === null || valueSi === undefined || Number.isNaN(valueSi)) return missingValueText;
  const digits = options.digits ?? 3;
  const sign = valueSi < 0 ? '−' : options.signed && valueSi > 0 ? '+' : '';
  const magnitude = Math.abs(valueSi);
  const space = unit === '' ? '' : ' ';
  if (!Number.isFinite(valueSi)) return `${sign}∞${space}${unit}`;
  if (magnitude === 0) return `0${space}${unit}`;
  if (options.plain || unprefixedUnits.has(unit)) {
    // Without a prefix, large values keep their integer digits (a gain of 1001 stays 1001).
    const text = magnitude >= 10 ** digits ? String(Math.round(magnitude)) : toSignificant(magnitude, digits);
    return `${sign}${text}${space}${unit}`;
  }
  let exponent3 = Math.floor(Math.log10(magnitude) / 3);
  exponent3 = Math.min(maxExponent3, Math.max(minExponent3, exponent3));
  let mantissa = Number((magnitude / 1000 ** exponent3).toPrecision(digits));
  // Rounding can carry 999.6 up to 1000: move to the next prefix.
  if (mantissa >= 1000 && exponent3 < maxExponent3) {
    exponent3 += 1;
    mantissa = Number((magnitude / 1000 ** exponent3).toPrecision(digits));
  }
  const prefix = prefixByExponent3[exponent3];
  return `${sign}${toSignificant(mantissa, digits)} ${prefix}${unit}`;
}

/**
 * Formats a ratio (0.001) as a percentage ("0.1 %").
 * @param ratio plain fraction, 0.01 = 1 %
 */
export function formatPercent(ratio: number | null | undefined, digits = 3): string {
  if (ratio === null || ratio === undefined || !Number.isFinite(ratio)) return missingValueText;
  const text = toSignificant(Math.abs(ratio) * 100, digits);
  return `${ratio < 0 && text !== '0' ? '−' : ''}${text} %`;
}

/**
 * Formats a decibel value with a fixed number of decimals ("89.0 dB").
 * @param valueDb value in dB
 */
export function formatDb(valueDb: number | null | undefined, decimals = 1): string {
  if (valueDb === null || valueDb === undefined || Number.isNaN(valueDb)) return missingValueText;
  if (!Number.isFinite(valueDb)) return `${valueDb < 0 ? '−' : ''}∞ dB`;
  const text = Math.abs(valueDb).toFixed(decimals);
  return `${valueDb < 0 && Number(text) !== 0 ? '−' : ''}${text} dB`;
}

/**
 * Formats any value given with its unit: dB values with decimals, fractions
 * as per cent, everything else in engineering notation.
 * @param value value in the unit's SI base (or dB, or a ratio for "ratio"/"fraction")
 * @param unit the unit of the value; "ratio" and "fraction" are shown as %
 */
export function formatValue(value: number | null | undefined, unit: string, digits = 3): string {
  if (unit === 'dB') return formatDb(value);
  if (unit === 'ratio' || unit === 'fraction') return formatPercent(value, digits);
  return formatEng(value, unit, { digits });
}

/**
 * Formats a duration in milliseconds for the engine readout ("0.6 ms", "12 ms").
 * @param durationMs milliseconds
 */
export function formatDurationMs(durationMs: number): string {
  if (!Number.isFinite(durationMs) || durationMs < 0) return missingValueText;
  if (durationMs < 10) return `${durationMs.toFixed(1)} ms`;
  if (durationMs < 1000) return `${Math.round(durationMs)} ms`;
  return `${(durationMs / 1000).toFixed(2)} s`;
}
