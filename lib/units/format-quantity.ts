/**
 * Formatting of SI values with an engineering prefix for messages, tables and templates:
 * `formatQuantity(2.2e6, 'ohm')` → "2.2 MΩ". The inverse of `parseQuantity` for the units it knows.
 */
import type { ExpectedUnit } from '@/lib/units/parse-quantity';

const symbols: Record<ExpectedUnit, string> = {
  ohm: 'Ω',
  F: 'F',
  Hz: 'Hz',
  V: 'V',
  A: 'A',
  'V/rtHz': 'V/√Hz',
  'A/rtHz': 'A/√Hz',
  dB: 'dB',
  s: 's',
  '1': '',
};

const prefixes: Array<[number, string]> = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
];

/** Removes trailing zeros from a fixed/precision string ("8.00" → "8", "2.20" → "2.2"). */
function trimZeros(s: string): string {
  return s.includes('e') ? s : s.replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
}

/**
 * Formats an SI value with an engineering prefix and the unit's symbol.
 *
 * @param valueSi the value in SI units of `unit` (dB and ratios as they are)
 * @param unit the unit of the value
 * @param significantDigits significant digits kept (default 3)
 * @returns e.g. "2.2 MΩ", "8 nV/√Hz", "120 dB", "0.001"
 * @example formatQuantity(47e-9, 'F') // "47 nF"
 */
export function formatQuantity(valueSi: number, unit: ExpectedUnit, significantDigits = 3): string {
  if (!Number.isFinite(valueSi)) return String(valueSi);
  if (unit === 'dB' || unit === '1') {
    const text = trimZeros(Number(valueSi.toPrecision(significantDigits)).toString());
    return unit === 'dB' ? `${text} dB` : text;
  }
  const symbol = symbols[unit];
  if (valueSi === 0) return `0 ${symbol}`;
  const magnitude = Math.abs(valueSi);
  const [factor, prefix] = prefixes.find(([f]) => magnitude >= f * 0.9995) ?? prefixes[prefixes.length - 1];
  const scaled = Number((valueSi / factor).toPrecision(significantDigits));
  return `${trimZeros(String(scaled))} ${prefix}${symbol}`;
}
