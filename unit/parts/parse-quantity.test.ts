import { describe, expect, it } from 'vitest';
import { parseQuantity, type ExpectedUnit } from '@/lib/units/parse-quantity';
import { formatQuantity } from '@/lib/units/format-quantity';

// Expected SI values are worked out by hand from the SI prefix definitions
// (BIPM, The International System of Units, 9th ed., table of SI prefixes).
const accepted: Array<[string, ExpectedUnit, number]> = [
  ['51 kΩ', 'ohm', 51e3],
  ['51k', 'ohm', 51e3],
  ['51K', 'ohm', 51e3],
  ['51 kohm', 'ohm', 51e3],
  ['51 kOhm', 'ohm', 51e3],
  ['2.2 MΩ', 'ohm', 2.2e6],
  ['2.2 M\u2126', 'ohm', 2.2e6], // the ohm sign, not the Greek capital omega
  ['1000', 'ohm', 1000],
  ['47n F', 'F', 47e-9],
  ['47 nF', 'F', 47e-9],
  ['4.7 µF', 'F', 4.7e-6],
  ['4.7 μF', 'F', 4.7e-6], // Greek mu instead of the micro sign
  ['4.7uF', 'F', 4.7e-6],
  ['0.05 Hz', 'Hz', 0.05],
  ['1 MHz', 'Hz', 1e6],
  ['1 mHz', 'Hz', 1e-3],
  ['300 mV', 'V', 0.3],
  ['3 m', 'V', 3e-3], // a bare prefix: milli, as in "51k"
  ['-300 mV', 'V', -0.3],
  ['1.5e-3 V', 'V', 1.5e-3],
  ['2 nA', 'A', 2e-9],
  ['8 nV/√Hz', 'V/rtHz', 8e-9],
  ['8 nV/rtHz', 'V/rtHz', 8e-9],
  ['8 nV/sqrt(Hz)', 'V/rtHz', 8e-9],
  ['8 nV/Hz^0.5', 'V/rtHz', 8e-9],
  ['100 fA/√Hz', 'A/rtHz', 100e-15],
  ['0.2 pA/rtHz', 'A/rtHz', 0.2e-12],
  ['120 dB', 'dB', 120],
  ['120', 'dB', 120],
  ['10 ms', 's', 0.01],
  ['0.1 %', '1', 0.001],
  ['50 ppm', '1', 50e-6],
];

describe('parseQuantity accepts engineering notation', () => {
  it.each(accepted)('%s as %s → %d', (text, unit, expected) => {
    const r = parseQuantity(text, unit);
    expect(r.ok, JSON.stringify(r)).toBe(true);
    if (r.ok) expect(r.valueSi).toBeCloseTo(expected, 15 - Math.ceil(Math.log10(Math.abs(expected))));
    if (r.ok) expect(Math.abs(r.valueSi - expected) / Math.abs(expected)).toBeLessThan(1e-12);
  });
});

const refused: Array<[string, ExpectedUnit, string]> = [
  ['47 nF', 'ohm', 'expected a resistance (Ω), got a capacitance'],
  ['51 kΩ', 'F', 'expected a capacitance (F), got a resistance'],
  ['300 mV', 'A', 'expected a current (A), got a voltage'],
  ['8 nV', 'V/rtHz', 'expected a voltage-noise density (V/√Hz), got a voltage'],
  ['8 nV/√Hz', 'V', 'expected a voltage (V), got a voltage-noise density'],
  ['2 pA/√Hz', 'V/rtHz', 'expected a voltage-noise density (V/√Hz), got a current-noise density'],
  ['10 ms', 'Hz', 'expected a frequency (Hz), got a time'],
  ['1 kHz', 's', 'expected a time (s), got a frequency'],
  ['10 mH', 'F', 'expected a capacitance (F), got an inductance'],
  ['120 dB', 'V', 'expected a voltage (V), got a level in decibels'],
  ['120 V', 'dB', 'expected a level in decibels (dB), got a voltage'],
  ['5 %', 'ohm', 'expected a resistance (Ω), got a ratio (%)'],
  ['3 km', 'V', 'expected a voltage (V), got a length'],
  ['', 'V', 'a value is required'],
  ['   ', 'V', 'a value is required'],
  ['abc', 'V', '"abc" does not start with a number'],
  ['4,7 nF', 'F', '"4,7 nF" uses a decimal comma; write a decimal point (e.g. 4.7)'],
  ['47 nQ', 'F', 'unknown unit "nQ"'],
  ['1e999 V', 'V', '"1e999 V" is too large to be a finite number'],
];

describe('parseQuantity refuses with a specific message', () => {
  it.each(refused)('%s as %s', (text, unit, message) => {
    expect(parseQuantity(text, unit)).toEqual({ ok: false, message });
  });
});

describe('formatQuantity', () => {
  it.each([
    [2.2e6, 'ohm', '2.2 MΩ'],
    [47e-9, 'F', '47 nF'],
    [8e-9, 'V/rtHz', '8 nV/√Hz'],
    [0.05, 'Hz', '50 mHz'],
    [120, 'dB', '120 dB'],
    [999.9, 'ohm', '1 kΩ'],
    [-0.3, 'V', '-300 mV'],
  ] as Array<[number, ExpectedUnit, string]>)('%d %s → %s', (v, u, s) => {
    expect(formatQuantity(v, u)).toBe(s);
  });
  it('round-trips through parseQuantity', () => {
    for (const [v, u] of [[51e3, 'ohm'], [4.7e-6, 'F'], [1.2e-12, 'A/rtHz']] as Array<[number, ExpectedUnit]>) {
      const r = parseQuantity(formatQuantity(v, u), u);
      expect(r.ok && Math.abs(r.valueSi - v) / v).toBeLessThan(1e-12);
    }
  });
});
