/**
 * Parsing of quantities typed or imported with engineering units ("51 kΩ", "47 nF",
 * "8 nV/√Hz", "120 dB") into SI values, with a dimension check. The dimension algebra
 * is done by mathjs units; this module only normalises the notations engineers use
 * (Ω, µ, √Hz, "rtHz", a bare SI prefix as in "51k") before handing the unit to mathjs.
 *
 * Pure: no I/O, runs in the browser and on the server.
 */
import { unit as mathUnit, type Unit } from 'mathjs';

/** The SI unit a field expects. `'1'` is a plain ratio (accepts "%" and "ppm"); `'dB'` stays in decibels. */
export type ExpectedUnit = 'ohm' | 'F' | 'Hz' | 'V' | 'A' | 'V/rtHz' | 'A/rtHz' | 'dB' | 's' | '1';

export type ParsedQuantity = { ok: true; valueSi: number } | { ok: false; message: string };

interface Dimension {
  /** What a quantity of this dimension is called in messages ("a resistance"). */
  noun: string;
  /** The SI unit as shown to people. */
  symbol: string;
  /** The unit in mathjs notation, used for the dimension comparison and the conversion. */
  mathjs: string;
}

/** Dimensions a field can expect, keyed by {@link ExpectedUnit}. */
const expectedDimensions: Record<Exclude<ExpectedUnit, 'dB' | '1'>, Dimension> = {
  ohm: { noun: 'a resistance', symbol: 'Ω', mathjs: 'ohm' },
  F: { noun: 'a capacitance', symbol: 'F', mathjs: 'F' },
  Hz: { noun: 'a frequency', symbol: 'Hz', mathjs: 'Hz' },
  V: { noun: 'a voltage', symbol: 'V', mathjs: 'V' },
  A: { noun: 'a current', symbol: 'A', mathjs: 'A' },
  'V/rtHz': { noun: 'a voltage-noise density', symbol: 'V/√Hz', mathjs: 'V/Hz^0.5' },
  'A/rtHz': { noun: 'a current-noise density', symbol: 'A/√Hz', mathjs: 'A/Hz^0.5' },
  s: { noun: 'a time', symbol: 's', mathjs: 's' },
};

/** Further dimensions recognised only to name what was typed instead ("got an inductance"). */
const otherDimensions: Dimension[] = [
  { noun: 'an inductance', symbol: 'H', mathjs: 'H' },
  { noun: 'a power', symbol: 'W', mathjs: 'W' },
  { noun: 'a conductance', symbol: 'S', mathjs: 'S' },
  { noun: 'a charge', symbol: 'C', mathjs: 'C' },
  { noun: 'a length', symbol: 'm', mathjs: 'm' },
  { noun: 'a mass', symbol: 'kg', mathjs: 'kg' },
  { noun: 'a temperature', symbol: 'K', mathjs: 'K' },
  { noun: 'a voltage-noise power density', symbol: 'V²/Hz', mathjs: 'V^2/Hz' },
  { noun: 'a current-noise power density', symbol: 'A²/Hz', mathjs: 'A^2/Hz' },
];

/** SI prefixes accepted on a bare number ("51k", "4.7u"); "K" is accepted as kilo only there, as on resistor labels. */
const barePrefixFactor: Record<string, number> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  m: 1e-3,
  k: 1e3,
  K: 1e3,
  M: 1e6,
  G: 1e9,
  T: 1e12,
};

const numberPattern = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/;

/**
 * Rewrites the unit part of a quantity into mathjs notation: drops spaces ("47n F" → "nF"),
 * Ω → ohm, µ/μ → u, √Hz / rtHz / sqrt(Hz) → Hz^0.5.
 */
function normaliseUnitText(unitText: string): string {
  return unitText
    .replace(/\s+/g, '')
    .replace(/[\u03A9\u2126]/g, 'ohm') // Greek capital omega, ohm sign
    .replace(/ohms?/gi, 'ohm')
    .replace(/[\u00B5\u03BC]/g, 'u') // micro sign, Greek mu
    .replace(/(?:√\(?hz\)?|rt\(?hz\)?|sqrt\(?hz\)?|hz\^\(?(?:0\.5|1\/2)\)?)/gi, 'Hz^0.5');
}

function dimensionOf(u: Unit): Dimension | null {
  for (const d of [...Object.values(expectedDimensions), ...otherDimensions]) {
    if (u.equalBase(mathUnit(1, d.mathjs))) return d;
  }
  return null;
}

function expectedPhrase(expected: ExpectedUnit): string {
  if (expected === 'dB') return 'a level in decibels (dB)';
  if (expected === '1') return 'a plain number (ratio)';
  const d = expectedDimensions[expected];
  return `${d.noun} (${d.symbol})`;
}

/**
 * Parses a quantity such as "51 kΩ", "51k", "51 kohm", "47n F", "0.05 Hz", "300 mV",
 * "8 nV/√Hz", "2 pA/rtHz", "120 dB" or "0.1 %" and returns its value in SI units of the
 * expected dimension (Ω, F, Hz, V, A, V/√Hz, A/√Hz, s; dB stays dB; a ratio stays a ratio).
 * A bare number is taken in the expected SI unit ("1000" for an `'ohm'` field is 1000 Ω).
 *
 * @param text what was typed or imported
 * @param expectedUnit the SI unit (dimension) the field expects
 * @returns `{ ok: true, valueSi }` or `{ ok: false, message }` naming the problem
 * @example parseQuantity('51 kΩ', 'ohm') // { ok: true, valueSi: 51000 }
 * @example parseQuantity('47 nF', 'ohm') // { ok: false, message: 'expected a resistance (Ω), got a capacitance' }
 */
export function parseQuantity(text: string, expectedUnit: ExpectedUnit): ParsedQuantity {
  const trimmed = typeof text === 'string' ? text.trim() : '';
  if (trimmed === '') return { ok: false, message: 'a value is required' };
  if (/^[+-]?\d+,\d+/.test(trimmed)) {
    return { ok: false, message: `"${trimmed}" uses a decimal comma; write a decimal point (e.g. 4.7)` };
  }
  const numberMatch = numberPattern.exec(trimmed);
  if (!numberMatch) return { ok: false, message: `"${trimmed}" does not start with a number` };
  const magnitude = Number(numberMatch[0]);
  if (!Number.isFinite(magnitude)) return { ok: false, message: `"${trimmed}" is too large to be a finite number` };
  const rawUnit = trimmed.slice(numberMatch[0].length).trim();

  const finish = (value: number): ParsedQuantity =>
    Number.isFinite(value) ? { ok: true, valueSi: value } : { ok: false, message: `"${trimmed}" is too large to be a finite number` };

  if (rawUnit === '') return finish(magnitude);

  if (/^db$/i.test(rawUnit)) {
    if (expectedUnit === 'dB') return finish(magnitude);
    return { ok: false, message: `expected ${expectedPhrase(expectedUnit)}, got a level in decibels` };
  }
  if (rawUnit === '%' || /^ppm$/i.test(rawUnit)) {
    if (expectedUnit === '1') return finish(magnitude * (rawUnit === '%' ? 1e-2 : 1e-6));
    return { ok: false, message: `expected ${expectedPhrase(expectedUnit)}, got a ratio (${rawUnit})` };
  }
  const normalisedUnit = normaliseUnitText(rawUnit);
  if (normalisedUnit in barePrefixFactor) {
    return finish(magnitude * barePrefixFactor[normalisedUnit]);
  }

  let parsedUnit: Unit;
  try {
    parsedUnit = mathUnit(1, normalisedUnit);
  } catch {
    return { ok: false, message: `unknown unit "${rawUnit}"` };
  }

  if (expectedUnit === 'dB' || expectedUnit === '1') {
    const got = dimensionOf(parsedUnit);
    if (parsedUnit.dimensions.every((p) => p === 0)) {
      // A dimensionless mathjs unit (e.g. "rad") is refused rather than guessed.
      return { ok: false, message: `expected ${expectedPhrase(expectedUnit)}, got a quantity in ${rawUnit}` };
    }
    return { ok: false, message: `expected ${expectedPhrase(expectedUnit)}, got ${got ? got.noun : `a quantity in ${rawUnit}`}` };
  }

  const expected = expectedDimensions[expectedUnit];
  const reference = mathUnit(1, expected.mathjs);
  if (!parsedUnit.equalBase(reference)) {
    const got = dimensionOf(parsedUnit);
    return { ok: false, message: `expected ${expectedPhrase(expectedUnit)}, got ${got ? got.noun : `a quantity in ${rawUnit}`}` };
  }
  if (parsedUnit.units.some((u) => u.unit.offset !== 0)) {
    return { ok: false, message: `unit "${rawUnit}" has an offset (like °F); use an absolute unit` };
  }
  return finish(mathUnit(magnitude, normalisedUnit).toNumber(expected.mathjs));
}
