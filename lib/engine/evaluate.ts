/**
 * evaluate(plan) → report: validates the plan, then computes levels, response, impulse test,
 * noise, CMRR, interference, converter figures, patient currents, checks, suggestions and
 * warnings. Pure and deterministic; SI units.
 */
import { adcReport } from './adc';
import { makeCheck } from './checks';
import { cmrrReport } from './cmrr';
import { pulseTest, recoveryAfterStep } from './impulse';
import { bodyCommonMode, interferenceReport } from './interference';
import { commonModeWindow, maxFirstStageGain, stageLevels } from './levels';
import { gainResistorOhm, inputCmImpedanceOhm, resolvePlan, type Resolved } from './model';
import { magnitude } from './complex';
import { noiseBudget } from './noise';
import type { ChannelPlan } from './plan';
import { patientCurrentLimits, patientCurrentSource, profileFor } from './profiles';
import type { ChannelReport, Check, PatientCurrents, StageId, StageLevels, Warning } from './report';
import { frequencyResponse } from './response';
import { buildSuggestions } from './suggestions';
import { parsePlan } from './validate';

/** Version of the engine's model; stored with every report. */
export const ENGINE_VERSION = '1.0.0';

export type EvaluateOptions = {
  /** Points of the frequency-response sweep (default 200). */
  responsePoints?: number;
  /** Points of the noise integration (default 240). */
  noisePoints?: number;
};

const COMMON_ASSUMPTIONS = [
  'Worst-case electrode offset is the larger of the plan value and the profile test offset.',
  'Interference terms and CMRR terms are added in magnitude (worst-case phase).',
  'Input op-amp CMRR mismatch is taken as 2/CMRR (the two amplifiers may differ in sign).',
  'The two input op-amps are assumed to differ in gain-bandwidth by ±20 % (common practice, no source).',
  'Op-amps are modelled with a single pole: closed-loop bandwidth = GBW / noise gain.',
  'Peak-to-peak noise = 6.6 × rms (common practice for Gaussian noise, no source).',
  'The low-frequency impulse test uses the high-pass alone (the other stages are flat there).',
  "The conversion of common-mode to differential voltage by electrode imbalance leaves out the protection filter's differential capacitor, which only lowers it (conservative).",
  'In the profile CMR test the right-leg drive is credited through the test source impedance (300 pF assumed); without a drive no reduction is credited.',
  'A planning aid, not a certification: verify by test to IEC 60601-1 and the applicable particular standards.',
];

function patientCurrents(r: Resolved): PatientCurrents {
  const p = r.plan;
  const lim = patientCurrentLimits[p.appliedPart];
  const span = p.supply.positiveV - p.supply.negativeV;
  const rld = p.rightLegDrive;
  return {
    dcA: p.instrumentation.opAmp.biasA + r.leadOffDcA,
    acA: p.leadOff.mode === 'ac' ? p.leadOff.currentA / Math.SQRT2 : 0,
    limitNormalA: lim.dc.normalA,
    limitSingleFaultA: lim.dc.singleFaultA,
    limitNormalAcA: lim.ac.normalA,
    limitSingleFaultAcA: lim.ac.singleFaultA,
    rightLegFaultA: rld.enabled ? (rld.outputROhm > 0 ? span / rld.outputROhm : rld.currentLimitA) : 0,
  };
}

function worstNodeFraction(stage: StageLevels | undefined): number {
  if (!stage || stage.nodes.length === 0) return 1;
  return Math.min(...stage.nodes.map((n) => n.headroomFraction));
}

function buildChecks(r: Resolved, report: Omit<ChannelReport, 'checks' | 'suggestions' | 'warnings'>): Check[] {
  const c = r.profile.checks;
  const checks: Check[] = [];
  const levelsSource = { source: 'three-op-amp node equations (Sedra & Smith, Microelectronic Circuits) at the worst-case offset', sourceVerified: true };
  checks.push(makeCheck('first-stage-gain', 'First-stage gain within the offset-safe maximum', r.g1, 'V/V', 'atMost', { value: report.maxFirstStageGain, ...levelsSource }, 'instrumentation'));
  const stageTitles: [StageId, string][] = [
    ['instrumentation', 'Instrumentation stage nodes in range'],
    ['high-pass', 'High-pass output in range'],
    ['gain-stage', 'Gain-stage output in range'],
    ['adc', 'Converter input within full scale'],
  ];
  for (const [id, title] of stageTitles) {
    const stage = report.stages.find((s) => s.id === id);
    checks.push(makeCheck(`headroom-${id}`, title, worstNodeFraction(stage), 'fraction of range', 'atLeast', { value: 0, ...levelsSource }, id));
  }
  const resp = report.response;
  if (c.lowCornerMaxHz) checks.push(makeCheck('low-corner', 'Low −3 dB corner', resp.lowCornerHz, 'Hz', 'atMost', c.lowCornerMaxHz, 'high-pass'));
  if (c.highCornerMinHz) checks.push(makeCheck('high-corner', 'High −3 dB corner', resp.highCornerHz, 'Hz', 'atLeast', c.highCornerMinHz, 'gain-stage'));
  if (c.aliasMinDb) checks.push(makeCheck('alias-attenuation', 'Attenuation of the first alias', resp.aliasAttenuationDb, 'dB', 'atLeast', c.aliasMinDb, 'gain-stage'));
  if (c.impulseDisplacementV) checks.push(makeCheck('impulse-displacement', 'Impulse test: displacement after the pulse', report.impulseTest.displacementV, 'V', 'atMost', c.impulseDisplacementV, 'high-pass'));
  if (c.impulseSlopeVPerS) checks.push(makeCheck('impulse-slope', 'Impulse test: slope after the pulse', report.impulseTest.slopeVPerS, 'V/s', 'atMost', c.impulseSlopeVPerS, 'high-pass'));
  if (c.noisePpV) {
    const top = [...report.noise.contributions].sort((a, b) => b.share - a.share)[0];
    checks.push(makeCheck('noise', 'Noise referred to input (peak-to-peak)', report.noise.rtiPpV, 'V', 'atMost', c.noisePpV, top?.stageId ?? 'instrumentation'));
  }
  if (c.mainsInterferencePpV) {
    const [imb, cm] = report.interference.terms;
    const stageId: StageId = imb.rtiPpV >= cm.rtiPpV ? 'electrodes' : 'instrumentation';
    checks.push(makeCheck('mains-interference', 'Mains interference referred to input in use', report.interference.rtiPpV, 'V', 'atMost', c.mainsInterferencePpV, r.plan.rightLegDrive.enabled ? 'right-leg-drive' : stageId));
  }
  if (c.cmrTest && report.interference.cmrTest) {
    checks.push(makeCheck('cmr-test', 'Common-mode rejection test of the profile', report.interference.cmrTest.rtiPpV, 'V', 'atMost', c.cmrTest, 'instrumentation'));
  }
  if (c.cmrrMinDb) checks.push(makeCheck('cmrr', 'CMRR at mains frequency', report.cmrr.mainsDb, 'dB', 'atLeast', c.cmrrMinDb, 'instrumentation'));
  if (c.inputImpedanceMinOhm) {
    const zMin = Math.min(...c.inputImpedanceMinOhm.frequenciesHz.map((f) => magnitude(inputCmImpedanceOhm(r, f, 1 + r.cCmMismatch))));
    checks.push(makeCheck('input-impedance', 'Input impedance of each lead', zMin, 'Ω', 'atLeast', c.inputImpedanceMinOhm, r.cCmF > 0 ? 'protection' : 'instrumentation'));
  }
  if (c.dcLeadCurrentMaxA) checks.push(makeCheck('dc-lead-current', 'DC current in each lead', report.patientCurrents.dcA, 'A', 'atMost', c.dcLeadCurrentMaxA, r.leadOffDcA > 0 ? 'lead-off' : 'instrumentation'));
  if (c.sampleRateMinHz) checks.push(makeCheck('sample-rate', 'Sample rate', r.plan.adc.sampleRateHz, 'Hz', 'atLeast', c.sampleRateMinHz, 'adc'));
  if (c.lsbMaxV) checks.push(makeCheck('adc-resolution', 'LSB referred to input', report.adc.lsbRtiV, 'V', 'atMost', c.lsbMaxV, 'adc'));
  const pc = report.patientCurrents;
  const pcSource = { source: patientCurrentSource, sourceVerified: true };
  checks.push(makeCheck('patient-current-dc', `Patient DC current per lead (type ${r.plan.appliedPart})`, pc.dcA, 'A', 'atMost', { value: pc.limitNormalA, ...pcSource }, r.leadOffDcA > 0 ? 'lead-off' : 'instrumentation'));
  if (r.plan.leadOff.mode === 'ac') checks.push(makeCheck('patient-current-ac', `Patient AC current per lead (type ${r.plan.appliedPart})`, pc.acA, 'A', 'atMost', { value: pc.limitNormalAcA, ...pcSource }, 'lead-off'));
  if (r.plan.rightLegDrive.enabled) {
    checks.push(makeCheck('right-leg-fault-current', 'Right-leg driver current with its output at a rail (single fault)', pc.rightLegFaultA, 'A', 'atMost', { value: pc.limitSingleFaultA, ...pcSource }, 'right-leg-drive'));
  }
  return checks;
}

function buildWarnings(r: Resolved, report: Omit<ChannelReport, 'checks' | 'suggestions' | 'warnings'>): Warning[] {
  const w: Warning[] = [];
  const p = r.plan;
  if (r.profile.dcOffset.value > p.electrodes.offsetV) {
    w.push({ id: 'profile-offset', message: `Levels use the profile's test offset of ±${(r.profile.dcOffset.value * 1e3).toFixed(0)} mV, larger than the plan's ${(p.electrodes.offsetV * 1e3).toFixed(0)} mV.` });
  }
  if (r.usedDefaultInputCm) {
    w.push({ id: 'default-input-cm', message: 'The amplifier common-mode input impedance is not given; 1 TΩ ∥ 3 pF per input is assumed (common practice, no source).' });
  }
  if (r.leadOffDcA > 0) {
    const e = p.electrodes;
    const shiftV = r.leadOffDcA * (e.rsOhm + e.rpOhm + e.imbalanceROhm + p.protection.seriesROhm);
    w.push({
      id: 'dc-lead-off-offset',
      message: `DC lead-off current of ${(r.leadOffDcA * 1e9).toFixed(1)} nA through the electrode impedance adds ${(r.leadOffDcA * r.dcMismatchOhm * 1e3).toFixed(3)} mV of differential offset and shifts the common mode by up to ${(shiftV * 1e3).toFixed(1)} mV; the current sources' own noise (not modelled) also flows through the electrodes.`,
    });
  }
  if (p.body.mode === 'direct' && p.rightLegDrive.enabled) {
    w.push({ id: 'direct-body-rld', message: 'The body common mode is given directly, so the right-leg drive is not applied to it in use.' });
  }
  if (report.interference.rightLegDriveSaturated) {
    w.push({ id: 'rld-saturated', message: 'The right-leg drive would need more current than its limit; no reduction from it is credited.' });
  }
  if (p.electrodes.rpOhm > 50e6 || p.electrodes.rpOhm < 100) {
    w.push({ id: 'electrode-range', message: `Electrode parallel resistance ${p.electrodes.rpOhm.toExponential(2)} Ω is outside the usual range (100 Ω … 50 MΩ).` });
  }
  if (p.temperatureK < 273.15 || p.temperatureK > 318.15) {
    w.push({ id: 'temperature-range', message: `Temperature ${p.temperatureK} K is outside 0–45 °C.` });
  }
  const lp = p.gainStage.lowPass;
  if (p.adc.sampleRateHz < 2.5 * lp.fcHz) {
    w.push({ id: 'weak-anti-alias', message: `Sample rate is less than 2.5 × the low-pass corner (${lp.fcHz} Hz); the anti-alias filter has little room.` });
  }
  const inst = p.instrumentation;
  const firstPoleHz = inst.opAmp.gbwHz / Math.max(r.g1, 1 + r.gd);
  const secondPoleHz = p.gainStage.opAmp.gbwHz / r.g2;
  if (Math.min(firstPoleHz, secondPoleHz) < 10 * lp.fcHz) {
    w.push({ id: 'gbw-limited', message: `An op-amp closed-loop pole (${Math.min(firstPoleHz, secondPoleHz).toFixed(0)} Hz) is within a decade of the low-pass corner; the response is bandwidth-limited.` });
  }
  if (p.highPass.order === 2 && r.profile.checks.impulseSlopeVPerS) {
    w.push({ id: 'second-order-impulse', message: 'A second-order high-pass displaces the baseline more after a pulse than a first-order one at the same corner (the impulse test is in effect a phase requirement).' });
  }
  if (report.recovery.timeS === null) {
    w.push({ id: 'no-recovery', message: 'After a step of the worst-case offset the chain does not return within range (DC-coupled or no room for the signal).' });
  }
  if (p.body.mode === 'coupling' && !p.rightLegDrive.enabled) {
    w.push({ id: 'ground-path', message: 'Without a right-leg drive the displacement current is assumed to flow through the reference electrode to the amplifier common (line-powered worst case).' });
  }
  return w;
}

/**
 * Evaluates a channel plan.
 * @param plan a `ChannelPlan` or any unknown value (validated first)
 * @param options sweep sizes
 * @returns the full report, SI units
 * @throws PlanValidationError for an invalid plan (every offending field listed)
 */
export function evaluate(plan: ChannelPlan | unknown, options: EvaluateOptions = {}): ChannelReport {
  const valid = parsePlan(plan);
  const profile = profileFor(valid.profileId, valid.customProfile);
  const r = resolvePlan(valid, profile);
  const body = bodyCommonMode(r);
  const mainsCmPeakV = body.vcmRms * Math.SQRT2;
  const stages = stageLevels(r, mainsCmPeakV);
  const maxG1 = maxFirstStageGain(r, mainsCmPeakV);
  const impulseSpec = profile.checks.impulseSlopeVPerS ?? profile.checks.impulseDisplacementV;
  const partial: Omit<ChannelReport, 'checks' | 'suggestions' | 'warnings'> = {
    engineVersion: ENGINE_VERSION,
    planName: valid.name,
    profile: { id: profile.id, name: profile.name },
    gains: { g1: r.g1, rgOhm: Number.isFinite(r.rgOhm) ? r.rgOhm : 0, gd: r.gd, g2: r.g2, totalGain: r.totalGain },
    worstCaseInputV: r.vdMaxV,
    stages,
    maxFirstStageGain: maxG1.gain,
    maxFirstStageGainDetail: {
      limitingNode: maxG1.limitingNode,
      rgOhm: maxG1.gain > 1 && maxG1.gain < Number.MAX_VALUE ? gainResistorOhm(r.rOhm, maxG1.gain) : null,
    },
    commonModeWindow: commonModeWindow(r),
    response: frequencyResponse(r, options.responsePoints ?? 200),
    impulseTest: pulseTest(valid.highPass.order, valid.highPass.fcHz, impulseSpec?.amplitudeV ?? 3e-3, impulseSpec?.durationS ?? 0.1),
    recovery: recoveryAfterStep(r),
    noise: noiseBudget(r, options.noisePoints ?? 240),
    cmrr: cmrrReport(r),
    interference: interferenceReport(r),
    adc: adcReport(r),
    patientCurrents: patientCurrents(r),
    assumptions: COMMON_ASSUMPTIONS,
  };
  const checks = buildChecks(r, partial);
  const report: ChannelReport = { ...partial, checks, suggestions: [], warnings: buildWarnings(r, partial) };
  report.suggestions = buildSuggestions(r, report);
  return report;
}

