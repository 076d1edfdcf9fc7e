/**
 * Suggestions: for a failing or marginal check, one plan change (path + value) that fixes it with
 * a 10 % margin where a closed form or a short search gives it.
 */
import { lowPassMagnitudeSquared, LOW_PASS_MAX_ORDER } from './filters';
import { pulseTest } from './impulse';
import { interferenceReport } from './interference';
import { firstStageGain, gainResistorOhm, resolvePlan, type Resolved } from './model';
import { noiseBudget } from './noise';
import type { ChannelReport, Check, Suggestion } from './report';

/** Rounds to three significant digits. */
function sig3(v: number): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  const k = 10 ** (Math.floor(Math.log10(Math.abs(v))) - 2);
  return Math.round(v / k) * k;
}

function needsFix(check: Check | undefined): check is Check {
  return check !== undefined && check.verdict !== 'meets';
}

/** Largest second-stage gain that keeps the signal 10 % inside the gain stage and converter ranges. */
function maxSecondStageGain(r: Resolved, g1: number): number {
  const vref = r.referenceV;
  const room = Math.min(r.out2HiV - vref, vref - r.out2LoV, r.adcHiV - vref, vref - r.adcLoV);
  return (0.9 * room) / (g1 * r.gd * r.signalV);
}

/** Highest high-pass corner (same order) that passes both impulse limits with 10 % margin, Hz. */
export function impulseSafeCornerHz(r: Resolved): number | null {
  const c = r.profile.checks;
  const order = r.plan.highPass.order;
  if (order === 0) return null;
  const spec = c.impulseSlopeVPerS ?? c.impulseDisplacementV;
  if (!spec) return null;
  const ok = (fc: number) => {
    const t = pulseTest(order, fc, spec.amplitudeV, spec.durationS);
    return (!c.impulseDisplacementV || t.displacementV <= 0.9 * c.impulseDisplacementV.value) && (!c.impulseSlopeVPerS || t.slopeVPerS <= 0.9 * c.impulseSlopeVPerS.value);
  };
  let lo = 1e-5;
  let hi = r.plan.highPass.fcHz;
  if (!ok(lo)) return null;
  for (let i = 0; i < 60; i++) {
    const m = Math.sqrt(lo * hi);
    if (ok(m)) lo = m;
    else hi = m;
  }
  return lo;
}

/** Smallest right-leg-drive loop gain that brings `metric` to 90 % of `limit`, or null. */
function loopGainFor(r: Resolved, metric: (loop: number) => number, limit: number): number | null {
  const target = 0.9 * limit;
  let hi = 1e5;
  if (metric(hi) > target) return null;
  let lo = 0;
  if (metric(lo) <= target) return 0;
  for (let i = 0; i < 60; i++) {
    const m = (lo + hi) / 2;
    if (metric(m) <= target) hi = m;
    else lo = m;
  }
  return Math.ceil(hi);
}

/** Builds the suggestions for a finished report. */
export function buildSuggestions(r: Resolved, report: ChannelReport): Suggestion[] {
  const out: Suggestion[] = [];
  const byId = new Map(report.checks.map((c) => [c.id, c]));
  const p = r.plan;

  const gainCheck = byId.get('first-stage-gain');
  if (needsFix(gainCheck) || needsFix(byId.get('headroom-instrumentation'))) {
    const maxG = report.maxFirstStageGain;
    const newG1 = maxG >= 2 / 0.9 ? Math.floor(0.9 * maxG) : 1;
    if (newG1 < r.g1) {
      const detail = `Worst-case input ±${(r.vdMaxV * 1e3).toFixed(1)} mV allows G1 ≤ ${maxG.toFixed(2)} (limited by ${report.maxFirstStageGainDetail.limitingNode}); ${newG1} keeps 10 % margin.`;
      if (p.instrumentation.targetGain !== undefined || newG1 === 1) {
        if (p.instrumentation.targetGain !== undefined) {
          out.push({ id: 'reduce-first-stage-gain', checkId: 'first-stage-gain', title: `Lower the first-stage gain to ${newG1}`, detail, patch: { path: 'instrumentation.targetGain', value: newG1 } });
        }
      } else {
        const rg = sig3(gainResistorOhm(r.rOhm, newG1));
        out.push({ id: 'reduce-first-stage-gain', checkId: 'first-stage-gain', title: `Raise Rg to ${rg} Ω (G1 ≈ ${newG1})`, detail, patch: { path: 'instrumentation.rgOhm', value: rg } });
      }
      const g2 = Math.max(1, Math.min((p.gainStage.gain * r.g1) / newG1, maxSecondStageGain(r, newG1)));
      if (g2 > p.gainStage.gain) {
        out.push({ id: 'gain-split-after-reduction', checkId: 'first-stage-gain', title: `Move gain to the second stage: G2 = ${sig3(g2)}`, detail: 'Keeps the total gain (and the resolution) after lowering G1, within the second stage and converter ranges.', patch: { path: 'gainStage.gain', value: sig3(g2) } });
      }
    }
  }

  if (needsFix(byId.get('impulse-displacement')) || needsFix(byId.get('impulse-slope'))) {
    const fc = impulseSafeCornerHz(r);
    if (fc !== null && fc < p.highPass.fcHz) {
      const value = Math.floor(fc * 1e4) / 1e4;
      out.push({ id: 'impulse-corner', checkId: needsFix(byId.get('impulse-slope')) ? 'impulse-slope' : 'impulse-displacement', title: `Lower the high-pass corner to ${value} Hz`, detail: `The impulse test (${p.highPass.order === 1 ? 'first' : 'second'}-order high-pass) passes with 10 % margin at or below ${value} Hz.`, patch: { path: 'highPass.fcHz', value } });
    }
  }

  const low = byId.get('low-corner');
  if (needsFix(low) && low.verdict === 'fails' && p.highPass.order > 0) {
    const value = sig3(p.highPass.fcHz * ((0.9 * low.limit) / low.value));
    out.push({ id: 'low-corner', checkId: 'low-corner', title: `Lower the high-pass corner to ${value} Hz`, detail: 'Brings the −3 dB low corner 10 % below the profile limit.', patch: { path: 'highPass.fcHz', value } });
  }
  const high = byId.get('high-corner');
  if (needsFix(high) && high.verdict === 'fails') {
    const value = sig3(p.gainStage.lowPass.fcHz * ((1.1 * high.limit) / high.value));
    if (value < p.adc.sampleRateHz / 2) {
      out.push({ id: 'high-corner', checkId: 'high-corner', title: `Raise the low-pass corner to ${value} Hz`, detail: 'Brings the −3 dB high corner 10 % above the profile limit (check alias attenuation afterwards).', patch: { path: 'gainStage.lowPass.fcHz', value } });
    }
  }

  const alias = byId.get('alias-attenuation');
  if (needsFix(alias) && alias.verdict === 'fails') {
    const lp = p.gainStage.lowPass;
    const fAlias = Math.max(p.adc.sampleRateHz - r.profile.band.highHz, p.adc.sampleRateHz / 2);
    for (let n = lp.order + 1; n <= LOW_PASS_MAX_ORDER; n++) {
      const att = -10 * Math.log10(lowPassMagnitudeSquared(lp.kind, n, lp.fcHz, fAlias));
      if (att >= 1.1 * alias.limit) {
        out.push({ id: 'alias-order', checkId: 'alias-attenuation', title: `Raise the low-pass order to ${n}`, detail: `A ${lp.kind} low-pass of order ${n} attenuates ${att.toFixed(1)} dB at ${fAlias.toFixed(0)} Hz.`, patch: { path: 'gainStage.lowPass.order', value: n } });
        break;
      }
    }
  }

  const mains = byId.get('mains-interference');
  if (needsFix(mains) && p.body.mode === 'coupling') {
    const loop = loopGainFor(r, (l) => interferenceReport(r, l).rtiPpV, mains.limit);
    if (loop !== null && loop > (p.rightLegDrive.enabled ? p.rightLegDrive.loopGain : -1)) {
      out.push({ id: 'rld-gain-mains', checkId: 'mains-interference', title: `Right-leg drive with loop gain ${loop}`, detail: `${p.rightLegDrive.enabled ? '' : 'Enable the right-leg drive (rightLegDrive.enabled) and set '}a loop gain of ${loop} at mains frequency to bring interference to 90 % of the limit.`, patch: { path: 'rightLegDrive.loopGain', value: loop } });
    }
  }
  const cmr = byId.get('cmr-test');
  if (needsFix(cmr)) {
    const loop = loopGainFor(r, (l) => interferenceReport(r, l).cmrTest?.rtiPpV ?? 0, cmr.limit);
    if (loop !== null && loop > (p.rightLegDrive.enabled ? p.rightLegDrive.loopGain : -1)) {
      out.push({ id: 'rld-gain-cmr-test', checkId: 'cmr-test', title: `Right-leg drive with loop gain ${loop} for the CMR test`, detail: `${p.rightLegDrive.enabled ? '' : 'Enable the right-leg drive (rightLegDrive.enabled) and set '}a loop gain of ${loop}.`, patch: { path: 'rightLegDrive.loopGain', value: loop } });
    }
  }

  const noise = byId.get('noise');
  if (needsFix(noise)) out.push(...noiseSuggestions(r, report, noise));

  const res = byId.get('adc-resolution');
  if (needsFix(res)) {
    const g2 = sig3(maxSecondStageGain(r, r.g1));
    if (g2 > p.gainStage.gain && res.value * (p.gainStage.gain / g2) <= res.limit) {
      out.push({ id: 'gain-split-resolution', checkId: 'adc-resolution', title: `Raise the second-stage gain to ${g2}`, detail: 'Uses the converter range for the signal (10 % margin) so that one LSB referred to input meets the limit.', patch: { path: 'gainStage.gain', value: g2 } });
    }
  }
  return out;
}

/**
 * For a failing noise check: noise made after the first stage (difference stage, gain stage,
 * filter, converter) is divided by G1 when referred to input, so a larger G1 with G2 lowered to keep
 * the total gain lowers the RTI noise (Friis's formula for cascaded stages, Friis 1944, in its
 * voltage form). Searches the smallest G1, within 90 % of the offset-safe maximum, whose noise is at
 * most 90 % of the limit; suggests it (as the plan states G1: target gain or Rg) and the G2 that
 * keeps the total gain. None when even the largest safe G1 is not enough: the dominant contributor
 * is then the electrodes or the input op-amp, which a gain change does not help.
 */
function noiseSuggestions(r: Resolved, report: ChannelReport, check: Check): Suggestion[] {
  const p = r.plan;
  const byRg = p.instrumentation.targetGain === undefined;
  const gMax = 0.9 * report.maxFirstStageGain;
  if (!(gMax > r.g1)) return [];
  const totalGain = r.g1 * p.gainStage.gain;
  /** The plan with the first stage at g1 (as the plan states it) and G2 keeping the total gain. */
  const withFirstStageGain = (g1: number) => {
    const plan = structuredClone(p);
    if (byRg) plan.instrumentation.rgOhm = sig3(gainResistorOhm(r.rOhm, g1));
    else plan.instrumentation.targetGain = g1;
    const actualG1 = byRg ? firstStageGain(r.rOhm, plan.instrumentation.rgOhm!) : g1;
    plan.gainStage.gain = Math.max(1, sig3(totalGain / actualG1));
    return { plan, actualG1 };
  };
  const target = 0.9 * check.limit;
  const noiseAt = (g1: number) => noiseBudget(resolvePlan(withFirstStageGain(g1).plan, r.profile)).rtiPpV;
  const gTop = Math.floor(gMax);
  if (gTop <= r.g1 || noiseAt(gTop) > target) return [];
  let lo = r.g1;
  let hi = gTop;
  while (hi - lo > 1) {
    const m = Math.floor((lo + hi) / 2);
    if (noiseAt(m) <= target) hi = m;
    else lo = m;
  }
  const { plan, actualG1 } = withFirstStageGain(hi);
  const reached = noiseAt(hi);
  const detail = `Noise made after the first stage is divided by G1 when referred to input: G1 ≈ ${sig3(actualG1)} with G2 = ${plan.gainStage.gain} (same total gain) gives ${sig3(reached * 1e6)} µV p-p against the ${sig3(check.limit * 1e6)} µV limit, within 90 % of the offset-safe maximum G1 = ${report.maxFirstStageGain.toFixed(2)}.`;
  const first: Suggestion = byRg
    ? { id: 'noise-first-stage-gain', checkId: 'noise', title: `Lower Rg to ${plan.instrumentation.rgOhm} Ω (G1 ≈ ${sig3(actualG1)}) for less noise`, detail, patch: { path: 'instrumentation.rgOhm', value: plan.instrumentation.rgOhm! } }
    : { id: 'noise-first-stage-gain', checkId: 'noise', title: `Raise the first-stage gain to ${hi} for less noise`, detail, patch: { path: 'instrumentation.targetGain', value: hi } };
  const out = [first];
  if (plan.gainStage.gain !== p.gainStage.gain) {
    out.push({ id: 'gain-split-after-noise', checkId: 'noise', title: `Keep the total gain: G2 = ${plan.gainStage.gain}`, detail: 'Lowers the second stage by as much as the first stage was raised, so levels after it and the resolution stay as they were.', patch: { path: 'gainStage.gain', value: plan.gainStage.gain } });
  }
  return out;
}
