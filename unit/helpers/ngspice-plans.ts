/**
 * Plans for the reference tests: a fixed fixture (invented values, in the manner of a
 * two-lead wearable ECG patch) and seeded random valid plans spanning the schema's ranges.
 */
import { planSchema, type ChannelPlan, type ChannelPlanInput } from '@/lib/engine/plan';

/** A deterministic 32-bit PRNG (mulberry32, public-domain algorithm by Tommy Ettinger). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const baseOpAmp = {
  enVPerRtHz: 8e-9,
  enCornerHz: 5,
  inAPerRtHz: 0.2e-12,
  inCornerHz: 20,
  cmrrDb: 110,
  gbwHz: 1e6,
  biasA: 1e-9,
  offsetV: 50e-6,
  inputCmFromNegV: 0.1,
  inputCmFromPosV: 1.0,
  outputFromNegV: 0.05,
  outputFromPosV: 0.05,
  source: 'invented demo part: generic low-noise rail-to-rail op-amp',
};

/** A fixture in the manner of a wearable ECG patch on a 3.0 V single supply with dry electrodes (invented). */
export const fixturePlanInput: ChannelPlanInput = {
  schemaVersion: 1,
  name: 'Reference fixture: wearable ECG patch',
  profileId: 'ambulatory-ecg',
  mainsHz: 50,
  temperatureK: 298.15,
  appliedPart: 'CF',
  electrodes: {
    offsetV: 0.3,
    rsOhm: 2e3,
    rpOhm: 500e3,
    cpF: 20e-9,
    imbalanceROhm: 51e3,
    imbalanceCF: 47e-9,
    groundOhm: 100e3,
  },
  body: { mode: 'coupling', mainsVrms: 230, bodyToMainsF: 3e-12, bodyToGroundF: 300e-12 },
  protection: { seriesROhm: 10e3, filter: { enabled: true, cDiffF: 100e-12, cCmF: 22e-12, cCmMismatch: 0.05 } },
  instrumentation: { rOhm: 25e3, targetGain: 4, r3Ohm: 10e3, diffGain: 1, resistorTolerance: 0.001, opAmp: baseOpAmp },
  supply: { positiveV: 3.0, negativeV: 0, referenceV: 1.5 },
  highPass: { order: 1, fcHz: 0.05 },
  gainStage: {
    gain: 40,
    lowPass: { kind: 'butterworth', order: 2, fcHz: 150 },
    filterNoiseVPerRtHz: 20e-9,
    opAmp: { ...baseOpAmp, enVPerRtHz: 15e-9, enCornerHz: 10, gbwHz: 2e6 },
  },
  adc: { bits: 16, fullScaleV: 3.0, midScaleV: 1.5, sampleRateHz: 1000, inputNoiseVrms: 30e-6 },
  rightLegDrive: { enabled: false, loopGain: 0, outputROhm: 0, currentLimitA: 0 },
  leadOff: { mode: 'none', currentA: 0, frequencyHz: 0 },
};

export const fixturePlan: ChannelPlan = planSchema.parse(fixturePlanInput);

/** log-uniform draw between lo and hi. */
function logUniform(rand: () => number, lo: number, hi: number): number {
  return lo * (hi / lo) ** rand();
}
function pick<T>(rand: () => number, items: readonly T[]): T {
  return items[Math.floor(rand() * items.length) % items.length];
}

/**
 * A seeded random valid plan. Ranges are wide but physical: corners, gains and gain-bandwidth
 * products of real channels, both supply styles, every filter family and order.
 */
export function randomPlan(seed: number): ChannelPlan {
  const rand = mulberry32(seed);
  const split = rand() < 0.5;
  const positiveV = split ? pick(rand, [2.5, 5, 12]) : pick(rand, [3, 3.3, 5]);
  const negativeV = split ? -positiveV : 0;
  const referenceV = split ? 0 : positiveV / 2;
  const sampleRateHz = pick(rand, [250, 500, 1000, 2000, 4000]);
  const lowPassFcHz = logUniform(rand, sampleRateHz / 20, sampleRateHz / 2.5);
  const highPassOrder = pick(rand, [0, 1, 1, 2] as const);
  const highPassFcHz = logUniform(rand, 0.03, Math.min(20, lowPassFcHz / 10));
  const opAmp = () => ({
    ...baseOpAmp,
    enVPerRtHz: logUniform(rand, 3e-9, 40e-9),
    enCornerHz: rand() < 0.3 ? 0 : logUniform(rand, 0.5, 50),
    inAPerRtHz: rand() < 0.2 ? 0 : logUniform(rand, 5e-15, 2e-12),
    inCornerHz: rand() < 0.5 ? 0 : logUniform(rand, 1, 100),
    cmrrDb: 80 + 40 * rand(),
    gbwHz: logUniform(rand, 2e5, 1e7),
  });
  const useRg = rand() < 0.5;
  const rOhm = logUniform(rand, 5e3, 100e3);
  const g1 = logUniform(rand, 1.5, 100);
  const input: ChannelPlanInput = {
    ...fixturePlanInput,
    name: `Random reference plan ${seed}`,
    profileId: pick(rand, ['diagnostic-ecg', 'monitoring-ecg', 'ambulatory-ecg', 'surface-emg', 'eeg'] as const),
    mainsHz: pick(rand, [50, 60] as const),
    temperatureK: 273.15 + 15 + 25 * rand(),
    electrodes: {
      offsetV: 0.3 * rand(),
      rsOhm: logUniform(rand, 100, 20e3),
      rpOhm: logUniform(rand, 10e3, 5e6),
      cpF: rand() < 0.2 ? 0 : logUniform(rand, 1e-9, 100e-9),
      imbalanceROhm: rand() < 0.3 ? 0 : logUniform(rand, 1e3, 100e3),
      imbalanceCF: rand() < 0.3 ? 0 : logUniform(rand, 1e-9, 100e-9),
      groundOhm: logUniform(rand, 1e3, 1e6),
    },
    protection: {
      seriesROhm: rand() < 0.2 ? 0 : logUniform(rand, 1e3, 50e3),
      filter: {
        enabled: rand() < 0.7,
        cDiffF: logUniform(rand, 100e-12, 10e-9),
        cCmF: logUniform(rand, 10e-12, 1e-9),
        cCmMismatch: 0.1 * rand(),
      },
    },
    instrumentation: {
      rOhm,
      ...(useRg ? { rgOhm: (2 * rOhm) / (g1 - 1) } : { targetGain: g1 }),
      r3Ohm: logUniform(rand, 5e3, 50e3),
      diffGain: pick(rand, [1, 1, 2, 5, 10]),
      resistorTolerance: pick(rand, [0.0001, 0.001, 0.01]),
      opAmp: opAmp(),
    },
    supply: { positiveV, negativeV, referenceV },
    highPass: { order: highPassOrder, fcHz: highPassFcHz },
    gainStage: {
      gain: logUniform(rand, 1, 100),
      lowPass: { kind: pick(rand, ['butterworth', 'bessel'] as const), order: 1 + Math.floor(rand() * 8), fcHz: lowPassFcHz },
      filterNoiseVPerRtHz: rand() < 0.3 ? 0 : logUniform(rand, 1e-9, 100e-9),
      opAmp: opAmp(),
    },
    adc: {
      bits: pick(rand, [12, 16, 24]),
      fullScaleV: split ? 2 * positiveV * 0.9 : positiveV,
      midScaleV: referenceV,
      sampleRateHz,
      inputNoiseVrms: logUniform(rand, 1e-6, 100e-6),
    },
  };
  return planSchema.parse(input);
}
