import { describe, expect, it } from 'vitest';
import { formatDb, formatDurationMs, formatEng, formatPercent, formatValue, toSignificant } from '@/features/plan-workspace/format';
import { parseQuantity, type ExpectedUnit } from '@/lib/units/parse-quantity';

// Expected strings follow the SI prefix table (BIPM, The International System of Units, 9th ed., table 7):
// k = 1e3, M = 1e6, G = 1e9, m = 1e-3, µ = 1e-6, n = 1e-9, p = 1e-12, f = 1e-15.
describe('formatEng', () => {
  const rows: Array<[number, string, string]> = [
    [51_000, 'Ω', '51 kΩ'],
    [47e-9, 'F', '47 nF'],
    [0.05, 'Hz', '50 mHz'],
    [0.3, 'V', '300 mV'],
    [8e-9, 'V/√Hz', '8 nV/√Hz'],
    [2.2e6, 'Ω', '2.2 MΩ'],
    [1.15e9, 'Ω', '1.15 GΩ'],
    [4.7e-12, 'F', '4.7 pF'],
    [1e-15, 'A/√Hz', '1 fA/√Hz'],
    [150, 'Hz', '150 Hz'],
    [1, 'V', '1 V'],
    [0.000093, 'V', '93 µV'],
    [-0.3, 'V', '−300 mV'],
  ];
  it.each(rows)('%s %s → %s', (value, unit, expected) => {
    expect(formatEng(value, unit)).toBe(expected);
  });

  it('rounds to three significant digits by default', () => {
    // 4.0582 nV/√Hz is √(4kTR) of 1 kΩ at 298.15 K (Johnson–Nyquist; k from CODATA 2018): shown as 4.06 nV/√Hz.
    expect(formatEng(4.0582e-9, 'V/√Hz')).toBe('4.06 nV/√Hz');
    expect(formatEng(12345, 'Ω', { digits: 4 })).toBe('12.35 kΩ');
  });

  it('carries a rounded mantissa of 1000 into the next prefix', () => {
    expect(formatEng(999.96, 'Ω')).toBe('1 kΩ');
    expect(formatEng(0.99996e-6, 'F')).toBe('1 µF');
  });

  it('does not prefix dB, % or plain numbers', () => {
    expect(formatEng(89.04, 'dB')).toBe('89 dB');
    expect(formatEng(1001, '')).toBe('1001');
    expect(formatEng(1001, 'V/V')).toBe('1001 V/V');
  });

  it('marks missing and infinite values instead of printing NaN', () => {
    expect(formatEng(Number.NaN, 'V')).toBe('—');
    expect(formatEng(undefined, 'V')).toBe('—');
    expect(formatEng(null, 'V')).toBe('—');
    expect(formatEng(Number.POSITIVE_INFINITY, 'Ω')).toBe('∞ Ω');
    expect(formatEng(0, 'A')).toBe('0 A');
  });

  it('shows a sign on request', () => {
    expect(formatEng(0.0025, 'V', { signed: true })).toBe('+2.5 mV');
  });

  it('produces text the quantity parser reads back to the same value', () => {
    const cases: Array<[number, string, ExpectedUnit]> = [
      [51_000, 'Ω', 'ohm'],
      [47e-9, 'F', 'F'],
      [0.05, 'Hz', 'Hz'],
      [8e-9, 'V/√Hz', 'V/rtHz'],
      [2e-15, 'A/√Hz', 'A/rtHz'],
      [3.3e-12, 'F', 'F'],
      [1.5e-6, 'A', 'A'],
    ];
    for (const [value, unit, expected] of cases) {
      const parsed = parseQuantity(formatEng(value, unit, { digits: 6 }), expected);
      expect(parsed.ok, `${value} ${unit}`).toBe(true);
      if (parsed.ok) expect(parsed.valueSi).toBeCloseTo(value, 20);
      if (parsed.ok) expect(Math.abs(parsed.valueSi - value) / value).toBeLessThan(1e-9);
    }
  });
});

describe('toSignificant', () => {
  it('drops trailing zeros and expands tiny numbers', () => {
    expect(toSignificant(47.0)).toBe('47');
    expect(toSignificant(1.5)).toBe('1.5');
    expect(toSignificant(1.23456e-7, 3)).toBe('0.000000123');
  });
});

describe('formatPercent, formatDb, formatValue, formatDurationMs', () => {
  it('formats fractions as per cent', () => {
    expect(formatPercent(0.001)).toBe('0.1 %');
    expect(formatPercent(0.05)).toBe('5 %');
  });
  it('formats dB with one decimal', () => {
    // 20·log10(10 V rms·2√2 / 1 mV) = 89.03 dB, the CMR figure of the diagnostic-ECG test (engine notes, derived).
    const cmrDb = 20 * Math.log10((10 * 2 * Math.SQRT2) / 1e-3);
    expect(formatDb(cmrDb)).toBe('89.0 dB');
    expect(formatDb(-3.0103)).toBe('−3.0 dB');
  });
  it('picks the style from the unit', () => {
    expect(formatValue(68.0, 'dB')).toBe('68.0 dB');
    expect(formatValue(0.01, 'ratio')).toBe('1 %');
    expect(formatValue(3e-5, 'V')).toBe('30 µV');
  });
  it('formats engine timings', () => {
    expect(formatDurationMs(0.61)).toBe('0.6 ms');
    expect(formatDurationMs(12.4)).toBe('12 ms');
    expect(formatDurationMs(1500)).toBe('1.50 s');
  });
});
