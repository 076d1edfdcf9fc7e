import { describe, expect, it } from 'vitest';
import { eng, engNumber, pdfText, percent } from '@/features/rationale-export/format';
import { linearTicks, logTicks, makeScale, niceRange, niceStep } from '@/features/rationale-export/plot-scales';
import { drawableRuns } from '@/features/rationale-export/svg-plot';

describe('engineering notation (SI prefixes, BIPM SI Brochure table of prefixes)', () => {
  it.each([
    [51e3, 'Ω', '51 kΩ'],
    [47e-9, 'F', '47 nF'],
    [8e-9, 'V/rtHz', '8 nV/rtHz'],
    [2.2e6, 'Ω', '2.2 MΩ'],
    [-0.1, 'V', '-100 mV'],
    [999.96, 'Hz', '1 kHz'], // rounds to 3 digits before the prefix is chosen
    [0.05, 'Hz', '0.05 Hz'], // sub-hertz corners as decimals
    [0, 'A', '0 A'],
    [120.04, 'dB', '120 dB'],
    [25, '°C', '25 °C'],
  ])('eng(%s, %s) = %s', (value, unit, text) => {
    expect(eng(value, unit)).toBe(text);
  });

  it('writes non-finite values as n/a and fractions as percentages', () => {
    expect(eng(Number.NaN, 'V')).toBe('n/a');
    expect(eng(Infinity, 'dB')).toBe('n/a');
    expect(eng(null, 'V')).toBe('n/a');
    expect(percent(0.125)).toBe('12.5%');
    expect(engNumber(0.001)).toBe('1m');
    expect(engNumber(4700)).toBe('4.7k');
  });
});

describe('pdfText', () => {
  it('replaces the symbols the embedded fonts lack and keeps the ones they have', () => {
    expect(pdfText('25 nV/√Hz, 51 kΩ ∥ 47 nF, ≤ 30 µV, ≥ 0.67 Hz, ≈ 1 mV, ±300 mV, 6.6 × rms, −3 dB')).toBe(
      '25 nV/rtHz, 51 kΩ || 47 nF, <= 30 µV, >= 0.67 Hz, ~ 1 mV, ±300 mV, 6.6 × rms, −3 dB',
    );
    expect(pdfText('a\tb\r\nc')).toBe('a b \nc');
    expect(pdfText('emoji 🙂 and ∑')).toBe('emoji ? and ?');
  });
});

describe('plot scales', () => {
  it('maps log and linear axes to pixels', () => {
    const log = makeScale({ kind: 'log', min: 1, max: 1000 }, 0, 300);
    expect(log(10)).toBeCloseTo(100, 9);
    expect(log(Math.sqrt(10))).toBeCloseTo(50, 9);
    const lin = makeScale({ kind: 'linear', min: -5, max: 5 }, 100, 0); // y grows downwards
    expect(lin(0)).toBeCloseTo(50, 9);
    expect(lin(5)).toBeCloseTo(0, 9);
  });

  it('chooses 1-2-5 steps and whole-decade ranges', () => {
    expect(niceStep(0, 10, 5)).toBe(2);
    expect(niceStep(0, 0.3, 5)).toBeCloseTo(0.1, 12); // raw 0.06 rounds up to the next 1-2-5 step
    expect(niceStep(0, 0.25, 5)).toBeCloseTo(0.05, 12);
    expect(niceRange([0.0123, 4.2], 'log')).toEqual({ min: 0.01, max: 10 });
    expect(niceRange([-1.745, 7.97], 'linear')).toEqual({ min: -2, max: 8 });
    expect(niceRange([3, 3], 'linear')).toEqual({ min: 2.6, max: 3.4 });
    expect(niceRange([], 'log')).toEqual({ min: 1, max: 10 });
  });

  it('labels decades on log axes with engineering labels and marks 2..9 as minor', () => {
    const ticks = logTicks(1e-3, 1e3);
    expect(ticks.filter((t) => t.label).map((t) => t.label)).toEqual(['1m', '10m', '100m', '1', '10', '100', '1k']);
    expect(ticks).toHaveLength(6 * 9 + 1);
    expect(logTicks(1, 100).filter((t) => t.label).map((t) => t.label)).toEqual(['1', '2', '5', '10', '20', '50', '100']);
  });

  it('places linear ticks at multiples of the step without float noise', () => {
    expect(linearTicks(0, 1, 5).map((t) => t.value)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(linearTicks(-0.3, 0.3, 6).map((t) => t.label)).toEqual(['-300m', '-200m', '-100m', '0', '100m', '200m', '300m']);
  });

  it('breaks lines at points a log axis cannot show and clamps values beyond the range', () => {
    const runs = drawableRuns(
      [
        { x: 1, y: 1e-9 },
        { x: 2, y: 0 },
        { x: 3, y: 1e-3 },
        { x: 4, y: 1e-8 },
      ],
      { kind: 'log', min: 1, max: 10, title: '' },
      { kind: 'log', min: 1e-10, max: 1e-6, title: '' },
    );
    expect(runs).toEqual([[{ x: 1, y: 1e-9 }], [{ x: 3, y: 1e-6 }, { x: 4, y: 1e-8 }]]);
  });
});
