/**
 * Number and text formatting for the PDF: engineering notation with SI prefixes, and a text
 * filter that keeps only characters the embedded fonts can draw.
 */

const PREFIXES: ReadonlyArray<[number, string]> = [
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

/** Units written without an SI prefix (ratios, decibels, degrees, counts). */
const UNPREFIXED = new Set(['', 'dB', '%', '°', '°C', 'V/V', 'codes', 'bits', 'K', '×']);

function trimZeros(s: string): string {
  return s.includes('e') ? s : s.replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
}

/** Placeholder for a value that is missing or not a finite number. */
export const NOT_AVAILABLE = 'n/a';

/**
 * A number with an SI prefix and no unit, for axis ticks and compact cells.
 * @param value the value (SI)
 * @param significantDigits digits kept, default 3
 * @returns e.g. "4.7k", "10m", "0", "-2.5µ"
 * @example engNumber(0.001) // "1m"
 */
export function engNumber(value: number, significantDigits = 3): string {
  const parts = engParts(value, significantDigits);
  return parts === null ? NOT_AVAILABLE : `${parts.mantissa}${parts.prefix}`;
}

/** Mantissa and SI prefix of a value, or null when it is not finite. */
function engParts(value: number, significantDigits: number): { mantissa: string; prefix: string } | null {
  if (!Number.isFinite(value)) return null;
  if (value === 0) return { mantissa: '0', prefix: '' };
  const magnitude = Math.abs(value);
  // Round first so that 999.96 becomes "1k", not "1000".
  const rounded = Number(magnitude.toPrecision(significantDigits));
  const [factor, prefix] = PREFIXES.find(([f]) => rounded >= f) ?? PREFIXES[PREFIXES.length - 1];
  const scaled = Number((rounded / factor).toPrecision(significantDigits));
  return { mantissa: `${value < 0 ? '-' : ''}${trimZeros(String(scaled))}`, prefix };
}

/**
 * A value in engineering notation with its unit: "51 kΩ", "8 nV/√Hz" is written "8 nV/rtHz"
 * because the embedded fonts have no square-root sign.
 * @param value the value in SI units of `unit`
 * @param unit the SI unit ("V", "Ω", "F", "Hz", "A", "s", "V/rtHz", "A/rtHz", "V/s") or an
 *   unprefixed one ("dB", "%", "°", "V/V", "")
 * @param significantDigits digits kept, default 3
 * @example eng(47e-9, 'F') // "47 nF"
 * @example eng(120, 'dB') // "120 dB"
 */
export function eng(value: number | null | undefined, unit: string, significantDigits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NOT_AVAILABLE;
  if (UNPREFIXED.has(unit)) {
    const text = trimZeros(Number(value.toPrecision(significantDigits)).toString());
    return unit === '' ? text : unit === '%' || unit === '°' ? `${text}${unit}` : `${text} ${unit}`;
  }
  // Sub-hertz corners read better as decimals ("0.05 Hz", not "50 mHz"), as the standards write them.
  if (unit === 'Hz' && Math.abs(value) >= 1e-3 && Math.abs(value) < 1) return `${trimZeros(Number(value.toPrecision(significantDigits)).toString())} Hz`;
  const parts = engParts(value, significantDigits) ?? { mantissa: NOT_AVAILABLE, prefix: '' };
  return `${parts.mantissa} ${parts.prefix}${unit}`;
}

/**
 * A fraction as a percentage: 0.125 → "12.5%".
 * @param fraction plain ratio (1 = 100 %)
 */
export function percent(fraction: number, significantDigits = 3): string {
  return eng(fraction * 100, '%', significantDigits);
}

/** Characters the embedded Inter subsets (latin, latin-ext, greek) lack, with a readable stand-in. */
const REPLACEMENTS: Record<string, string> = {
  '√': 'rt',
  '∥': '||',
  '≤': '<=',
  '≥': '>=',
  '≈': '~',
  '≠': '!=',
  '→': '->',
  '←': '<-',
  '∞': 'infinity',
  '‰': ' per mille',
  '∆': 'Δ',
  '\u00ad': '',
  '\u2009': ' ',
  '\u202f': ' ',
};

/** Whether a code point is drawn by the embedded fonts (checked with fontkit against the three subsets). */
function drawable(cp: number): boolean {
  if (cp === 0x0a) return true;
  if (cp >= 0x20 && cp <= 0x7e) return true;
  if (cp >= 0xa0 && cp <= 0x24f) return cp !== 0xad && cp !== 0x149 && cp !== 0x1c4;
  if (cp >= 0x391 && cp <= 0x3c9) return cp !== 0x3a2;
  // General punctuation and the few symbols the latin subset carries.
  return [0x2013, 0x2014, 0x2018, 0x2019, 0x201a, 0x201c, 0x201d, 0x201e, 0x2020, 0x2022, 0x2026, 0x2032, 0x2033, 0x2039, 0x203a, 0x2044, 0x2113, 0x2122, 0x2191, 0x2193, 0x2212].includes(cp);
}

/**
 * Makes a text safe for the embedded fonts: known symbols become readable stand-ins ("√Hz" →
 * "rtHz", "≤" → "<="), anything else the fonts cannot draw becomes "?". Tabs and line breaks
 * other than "\n" become spaces.
 * @param text any text (profile conditions, comments, names)
 */
export function pdfText(text: string): string {
  let out = '';
  for (const ch of text) {
    const replacement = REPLACEMENTS[ch];
    if (replacement !== undefined) {
      out += replacement;
      continue;
    }
    if (ch === '\r' || ch === '\t') {
      out += ' ';
      continue;
    }
    const cp = ch.codePointAt(0) ?? 0x3f;
    out += drawable(cp) ? ch : '?';
  }
  return out;
}

/** A date-time as "2025-03-04 05:06 UTC" (ISO text in). */
export function dateTimeUtc(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return NOT_AVAILABLE;
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}
