/**
 * The plan's inputs as rows for the rationale: label, value in engineering notation with its unit,
 * and where the value comes from (the part library entry or datasheet the plan names, an entry
 * typed into the plan, a profile default, or an engine assumption).
 */
import type { ChannelPlan, OpAmp } from '@/lib/engine/plan';
import { profileFor } from '@/lib/engine/profiles';
import { eng, percent } from './format';

export type InputRow = { label: string; value: string; source: string };
/** `partSource`: where a part's values come from, stated once for the rows marked `PART_ENTRY`. */
export type InputSection = { title: string; partSource?: string; rows: InputRow[] };

/** Source column of a row whose value comes from the part named in the section's `partSource`. */
export const PART_ENTRY = 'part values (source above)';

const PLAN_ENTRY = 'entered in the plan';

function partSource(source: string | undefined, what: string): string {
  const s = (source ?? '').trim();
  return s ? s : `${what}: no source given in the plan`;
}

function opAmpRows(a: OpAmp): InputRow[] {
  const row = (label: string, value: string, src = PART_ENTRY): InputRow => ({ label, value, source: src });
  return [
    row('Voltage-noise density e_n', eng(a.enVPerRtHz, 'V/rtHz')),
    row('Voltage-noise 1/f corner', a.enCornerHz === 0 ? 'none (white only)' : eng(a.enCornerHz, 'Hz')),
    row('Current-noise density i_n', eng(a.inAPerRtHz, 'A/rtHz')),
    row('Current-noise 1/f corner', a.inCornerHz === 0 ? 'none (white only)' : eng(a.inCornerHz, 'Hz')),
    row('Op-amp CMRR at DC', eng(a.cmrrDb, 'dB')),
    row('Gain-bandwidth product', eng(a.gbwHz, 'Hz')),
    row('Input bias current', eng(a.biasA, 'A')),
    row('Input offset voltage', eng(a.offsetV, 'V')),
    row('Input common mode from the negative rail', eng(a.inputCmFromNegV, 'V')),
    row('Input common mode from the positive rail', eng(a.inputCmFromPosV, 'V')),
    row('Output swing from the negative rail', eng(a.outputFromNegV, 'V')),
    row('Output swing from the positive rail', eng(a.outputFromPosV, 'V')),
    a.inputCmOhm === undefined
      ? row('Common-mode input resistance', '1 TΩ (assumed)', 'not given: the engine assumes 1 TΩ')
      : row('Common-mode input resistance', eng(a.inputCmOhm, 'Ω')),
    a.inputCmF === undefined
      ? row('Common-mode input capacitance', '3 pF (assumed)', 'not given: the engine assumes 3 pF')
      : row('Common-mode input capacitance', eng(a.inputCmF, 'F')),
  ];
}

/**
 * Every input of the plan, grouped by stage, with units and sources.
 * @param plan a validated plan
 */
export function planInputSections(plan: ChannelPlan): InputSection[] {
  const entry = (label: string, value: string, source = PLAN_ENTRY): InputRow => ({ label, value, source });
  const profile = profileFor(plan.profileId, plan.customProfile);
  const electrodeSource = partSource(plan.electrodes.source, 'electrode values');
  const inaSource = partSource(plan.instrumentation.opAmp.source, 'op-amp values');
  const g2Source = partSource(plan.gainStage.opAmp.source, 'op-amp values');
  const e = plan.electrodes;
  const body: InputRow[] =
    plan.body.mode === 'coupling'
      ? [
          entry('Body common mode', 'from displacement currents (Metting van Rijn et al., 1990)'),
          entry('Mains voltage', eng(plan.body.mainsVrms, 'V rms')),
          entry('Body-to-mains capacitance', eng(plan.body.bodyToMainsF, 'F')),
          entry('Body-to-ground capacitance', eng(plan.body.bodyToGroundF, 'F')),
        ]
      : [entry('Body common-mode voltage (stated)', eng(plan.body.cmVrms, 'V rms'))];
  const ina = plan.instrumentation;
  const f = plan.protection.filter;
  return [
    {
      title: 'Application and environment',
      rows: [
        entry('Requirement profile', `${profile.name} (${plan.profileId})`, plan.profileId === 'custom' ? 'custom profile given in the plan' : 'built-in profile'),
        entry('Mains frequency', eng(plan.mainsHz, 'Hz')),
        entry('Temperature for thermal noise', `${eng(plan.temperatureK, 'K', 5)} (${eng(plan.temperatureK - 273.15, '°C', 4)})`),
        entry('Applied part type (IEC 60601-1)', plan.appliedPart),
        plan.signalAmplitudeV === undefined
          ? entry('Largest signal amplitude', eng(profile.signalAmplitude.value, 'V'), `profile default: ${profile.signalAmplitude.source}`)
          : entry('Largest signal amplitude', eng(plan.signalAmplitudeV, 'V')),
      ],
    },
    {
      title: 'Electrodes',
      partSource: electrodeSource,
      rows: [
        entry('Electrode DC offset (worst case)', eng(e.offsetV, 'V'), PART_ENTRY),
        entry('Series resistance Rs (each)', eng(e.rsOhm, 'Ω'), PART_ENTRY),
        entry('Parallel resistance Rp (each)', eng(e.rpOhm, 'Ω'), PART_ENTRY),
        entry('Parallel capacitance Cp (each)', eng(e.cpF, 'F'), PART_ENTRY),
        entry('Imbalance network in one lead', e.imbalanceROhm === 0 && e.imbalanceCF === 0 ? 'none' : `${eng(e.imbalanceROhm, 'Ω')} || ${eng(e.imbalanceCF, 'F')}`),
        entry('Reference electrode impedance', eng(e.groundOhm, 'Ω'), PART_ENTRY),
        entry('Impedance mismatch between leads', e.impedanceMismatch === undefined ? 'not given (imbalance network only)' : percent(e.impedanceMismatch), PART_ENTRY),
      ],
    },
    { title: 'Body coupling', rows: body },
    {
      title: 'Input protection',
      rows: [
        entry('Series resistor per lead', plan.protection.seriesROhm === 0 ? 'none' : eng(plan.protection.seriesROhm, 'Ω')),
        entry('RC input filter', f.enabled ? 'fitted' : 'not fitted'),
        ...(f.enabled
          ? [entry('Differential capacitor', eng(f.cDiffF, 'F')), entry('Common-mode capacitor (each)', eng(f.cCmF, 'F')), entry('Common-mode capacitor mismatch', percent(f.cCmMismatch))]
          : []),
      ],
    },
    {
      title: 'Instrumentation stage',
      rows: [
        entry('Feedback resistor R (each input op-amp)', eng(ina.rOhm, 'Ω')),
        ina.rgOhm !== undefined ? entry('Gain resistor Rg', eng(ina.rgOhm, 'Ω')) : entry('Target first-stage gain G1', eng(ina.targetGain ?? Number.NaN, 'V/V'), `${PLAN_ENTRY}; Rg derived as 2R/(G1 - 1)`),
        entry('Difference-stage resistor R3', eng(ina.r3Ohm, 'Ω')),
        entry('Difference-stage gain Gd = R4/R3', eng(ina.diffGain, 'V/V')),
        entry('Resistor tolerance', percent(ina.resistorTolerance)),
      ],
    },
    { title: 'Instrumentation-stage op-amps (three, identical nominal values)', partSource: inaSource, rows: opAmpRows(ina.opAmp) },
    {
      title: 'Supply',
      rows: [entry('Positive rail', eng(plan.supply.positiveV, 'V')), entry('Negative rail', eng(plan.supply.negativeV, 'V')), entry('Reference (mid-scale) voltage', eng(plan.supply.referenceV, 'V'))],
    },
    {
      title: 'High-pass',
      rows:
        plan.highPass.order === 0
          ? [entry('High-pass', 'none (DC-coupled)')]
          : [entry('Order', plan.highPass.order === 1 ? 'first' : 'second (Butterworth)'), entry('-3 dB corner', eng(plan.highPass.fcHz, 'Hz'))],
    },
    {
      title: 'Gain and anti-alias stage',
      rows: [
        entry('Second-stage gain G2', eng(plan.gainStage.gain, 'V/V')),
        entry('Low-pass family and order', `${plan.gainStage.lowPass.kind === 'butterworth' ? 'Butterworth' : 'Bessel'}, order ${plan.gainStage.lowPass.order}`),
        entry('Low-pass -3 dB corner', eng(plan.gainStage.lowPass.fcHz, 'Hz')),
        entry('Filter-network noise (output)', eng(plan.gainStage.filterNoiseVPerRtHz, 'V/rtHz')),
      ],
    },
    { title: 'Gain-stage op-amp', partSource: g2Source, rows: opAmpRows(plan.gainStage.opAmp) },
    {
      title: 'Converter',
      rows: [
        entry('Resolution', `${plan.adc.bits} bits`),
        entry('Full-scale span', eng(plan.adc.fullScaleV, 'V')),
        entry('Mid-scale voltage', eng(plan.adc.midScaleV, 'V')),
        entry('Sample rate', eng(plan.adc.sampleRateHz, 'Hz')),
        entry('Input-referred noise', eng(plan.adc.inputNoiseVrms, 'V rms')),
      ],
    },
    {
      title: 'Right-leg drive',
      rows: plan.rightLegDrive.enabled
        ? [
            entry('Right-leg drive', 'fitted'),
            entry('Loop gain at mains frequency', eng(plan.rightLegDrive.loopGain, 'V/V')),
            entry('Output resistor', eng(plan.rightLegDrive.outputROhm, 'Ω')),
            entry('Current limit', eng(plan.rightLegDrive.currentLimitA, 'A')),
          ]
        : [entry('Right-leg drive', 'not fitted')],
    },
    {
      title: 'Lead-off detection',
      rows:
        plan.leadOff.mode === 'none'
          ? [entry('Lead-off detection', 'none')]
          : [
              entry('Lead-off detection', plan.leadOff.mode === 'dc' ? 'DC current' : 'AC current'),
              entry(plan.leadOff.mode === 'ac' ? 'Excitation current per lead (peak)' : 'Excitation current per lead', eng(plan.leadOff.currentA, 'A')),
              ...(plan.leadOff.mode === 'ac' ? [entry('Excitation frequency', eng(plan.leadOff.frequencyHz, 'Hz'))] : []),
            ],
    },
  ];
}
