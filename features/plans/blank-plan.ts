/**
 * The starting point of a "blank" plan. Every field must have a value for the engine to run, so a
 * blank plan holds generic placeholder values (a ±2.5 V monitoring-ECG channel with generic
 * amplifiers), each marked as a placeholder to replace. They are illustrative, not a recommendation
 * (common practice, no source).
 */
import type { ChannelPlanInput } from '@/lib/engine/plan';

const placeholder = 'placeholder value: replace with your part or measurement';

const genericOpAmp = {
  enVPerRtHz: 10e-9,
  enCornerHz: 10,
  inAPerRtHz: 100e-15,
  inCornerHz: 10,
  cmrrDb: 100,
  gbwHz: 1e6,
  biasA: 1e-9,
  offsetV: 100e-6,
  inputCmFromNegV: 1,
  inputCmFromPosV: 1,
  outputFromNegV: 0.1,
  outputFromPosV: 0.1,
  source: placeholder,
};

/**
 * A complete, valid plan with placeholder values.
 * @param name the plan's name
 */
export function blankPlan(name: string): ChannelPlanInput {
  return {
    schemaVersion: 1,
    name,
    profileId: 'monitoring-ecg',
    mainsHz: 50,
    temperatureK: 298.15,
    appliedPart: 'CF',
    electrodes: {
      offsetV: 0.3,
      rsOhm: 1e3,
      rpOhm: 1e6,
      cpF: 10e-9,
      imbalanceROhm: 0,
      imbalanceCF: 0,
      groundOhm: 50e3,
      source: placeholder,
    },
    body: { mode: 'coupling', mainsVrms: 230, bodyToMainsF: 3e-12, bodyToGroundF: 300e-12 },
    protection: { seriesROhm: 10e3, filter: { enabled: false, cDiffF: 0, cCmF: 0, cCmMismatch: 0 } },
    instrumentation: {
      rOhm: 25e3,
      targetGain: 5,
      r3Ohm: 10e3,
      diffGain: 1,
      resistorTolerance: 0.001,
      opAmp: genericOpAmp,
    },
    supply: { positiveV: 2.5, negativeV: -2.5, referenceV: 0 },
    highPass: { order: 1, fcHz: 0.05 },
    gainStage: {
      gain: 50,
      lowPass: { kind: 'butterworth', order: 2, fcHz: 150 },
      filterNoiseVPerRtHz: 0,
      opAmp: genericOpAmp,
    },
    adc: { bits: 16, fullScaleV: 5, midScaleV: 0, sampleRateHz: 1000, inputNoiseVrms: 50e-6 },
    rightLegDrive: { enabled: false, loopGain: 0, outputROhm: 0, currentLimitA: 0 },
    leadOff: { mode: 'none', currentA: 0, frequencyHz: 0 },
  };
}
