/**
 * Pure helpers that turn the engine's report into what the workspace shows: verdict per stage,
 * card summaries, saturated nodes, suggestion patches as plan edits. No React.
 */
import type { ChannelReport, Check, StageId as ReportStageId, Verdict } from '@/lib/engine/report';
import { formatEng, formatPercent } from '@/features/plan-workspace/format';
import { getAt, type StageId } from '@/features/plan-workspace/stage-fields';
import type { PlanDraft } from '@/features/plan-workspace/plan-edit';

const fromReport: Record<ReportStageId, StageId> = {
  electrodes: 'electrodes',
  protection: 'protection',
  instrumentation: 'instrumentation',
  'high-pass': 'highPass',
  'gain-stage': 'gainStage',
  adc: 'adc',
  'right-leg-drive': 'rightLegDrive',
  'lead-off': 'leadOff',
};

/** The workspace's stage id of a report stage id ("high-pass" → "highPass"); unknown ids fall back to the profile stage. */
export function workspaceStageId(id: string): StageId {
  return (fromReport as Record<string, StageId>)[id] ?? 'profile';
}

const verdictRank: Record<Verdict, number> = { meets: 0, marginal: 1, fails: 2 };

/** The worse of two verdicts (fails > marginal > meets). */
export function worseVerdict(a: Verdict | null, b: Verdict): Verdict {
  if (a === null) return b;
  return verdictRank[b] > verdictRank[a] ? b : a;
}

/**
 * The worst verdict of the checks tied to each stage; stages without checks are absent.
 * @param checks the report's checks
 */
export function worstVerdictByStage(checks: readonly Pick<Check, 'stageId' | 'verdict'>[]): Partial<Record<StageId, Verdict>> {
  const out: Partial<Record<StageId, Verdict>> = {};
  for (const c of checks) {
    const id = workspaceStageId(c.stageId);
    out[id] = worseVerdict(out[id] ?? null, c.verdict);
  }
  return out;
}

/** Counts of verdicts, for the summary line. */
export function verdictCounts(checks: readonly Pick<Check, 'verdict'>[]): Record<Verdict, number> {
  const counts: Record<Verdict, number> = { meets: 0, marginal: 0, fails: 0 };
  for (const c of checks) counts[c.verdict] += 1;
  return counts;
}

export interface SaturatedNode {
  stageName: string;
  nodeName: string;
  minV: number;
  maxV: number;
  lowLimitV: number;
  highLimitV: number;
}

/** Nodes whose worst-case swing leaves the allowed range (negative headroom). */
export function saturatedNodes(report: Pick<ChannelReport, 'stages'>): SaturatedNode[] {
  const out: SaturatedNode[] = [];
  for (const s of report.stages) {
    for (const n of s.nodes) {
      if (n.headroomV < 0) out.push({ stageName: s.name, nodeName: n.name, minV: n.minV, maxV: n.maxV, lowLimitV: n.lowLimitV, highLimitV: n.highLimitV });
    }
  }
  return out;
}

/** A suggestion's patch as a plan path ("instrumentation.rgOhm" → ["instrumentation", "rgOhm"]). */
export function patchPath(path: string): string[] {
  return path.split('.').filter((k) => k !== '');
}

/**
 * A check's value or limit in its unit. Checks carry SI units ("V", "Hz", "dB", "V/s", "Ω", "A")
 * a gain ("V/V") or a fraction ("fraction of range", "ratio").
 */
export function formatCheckValue(value: number, unit: string): string {
  if (unit === 'dB') return `${value.toFixed(1)} dB`;
  if (unit === 'fraction' || unit === 'fraction of range' || unit === 'ratio' || unit === '%') return formatPercent(value);
  if (unit === '1' || unit === '' || unit === 'V/V') return formatEng(value, '', { digits: 4 });
  return formatEng(value, unit);
}

/** The key values shown on a stage card. */
export function stageSummary(stageId: StageId, plan: PlanDraft, report: ChannelReport | null): string[] {
  const n = (path: string[]) => {
    const v = getAt(plan, path);
    return typeof v === 'number' ? v : undefined;
  };
  const eng = (path: string[], unit: string) => formatEng(n(path), unit);
  switch (stageId) {
    case 'profile':
      return [String(getAt(plan, ['profileId']) ?? ''), `${eng(['supply', 'negativeV'], 'V')} … ${eng(['supply', 'positiveV'], 'V')}`];
    case 'electrodes':
      return [`offset ±${eng(['electrodes', 'offsetV'], 'V')}`, `Rp ${eng(['electrodes', 'rpOhm'], 'Ω')} ∥ Cp ${eng(['electrodes', 'cpF'], 'F')}`];
    case 'protection': {
      const filter = getAt(plan, ['protection', 'filter', 'enabled']) === true;
      return [`R ${eng(['protection', 'seriesROhm'], 'Ω')} per lead`, filter ? `RC filter, Ccm ${eng(['protection', 'filter', 'cCmF'], 'F')}` : 'no RC filter'];
    }
    case 'instrumentation': {
      const g1 = report?.gains.g1;
      const rg = report?.gains.rgOhm ?? n(['instrumentation', 'rgOhm']);
      return [
        `G1 = ${g1 === undefined ? '—' : formatEng(g1, '', { digits: 4 })}, Rg ${formatEng(rg, 'Ω')}`,
        `en ${eng(['instrumentation', 'opAmp', 'enVPerRtHz'], 'V/√Hz')}, tol ${formatPercent(n(['instrumentation', 'resistorTolerance']))}`,
      ];
    }
    case 'highPass': {
      const order = n(['highPass', 'order']);
      return order === 0 ? ['DC-coupled'] : [`order ${order}`, `fc ${eng(['highPass', 'fcHz'], 'Hz')}`];
    }
    case 'gainStage':
      return [
        `G2 = ${formatEng(n(['gainStage', 'gain']), '', { digits: 4 })}`,
        `${String(getAt(plan, ['gainStage', 'lowPass', 'kind']) ?? '')} ${n(['gainStage', 'lowPass', 'order']) ?? ''}, fc ${eng(['gainStage', 'lowPass', 'fcHz'], 'Hz')}`,
      ];
    case 'adc':
      return [`${n(['adc', 'bits']) ?? '—'} bits, ${eng(['adc', 'fullScaleV'], 'V')} span`, `fs ${eng(['adc', 'sampleRateHz'], 'Hz')}`];
    case 'rightLegDrive':
      return getAt(plan, ['rightLegDrive', 'enabled']) === true
        ? [`loop gain ${formatEng(n(['rightLegDrive', 'loopGain']), '', { digits: 3 })}`, `R out ${eng(['rightLegDrive', 'outputROhm'], 'Ω')}`]
        : ['off'];
    case 'leadOff': {
      const mode = getAt(plan, ['leadOff', 'mode']);
      return mode === 'none' || mode === undefined ? ['off'] : [`${String(mode).toUpperCase()} ${eng(['leadOff', 'currentA'], 'A')}`];
    }
  }
}

/** Peak-to-peak ÷ 6.6 = rms for Gaussian noise (≈ 0.1 % exceedance; common practice, no source — as the engine uses). */
export const gaussianPpPerRms = 6.6;

/** Converts a Gaussian noise peak-to-peak value to rms (÷ 6.6, common practice, no source). */
export function ppToRms(ppV: number): number {
  return ppV / gaussianPpPerRms;
}

/** The check with this id (engine ids: "noise", "mains-interference", "cmr-test", "cmrr", "low-corner", ...). */
export function checkById(report: Pick<ChannelReport, 'checks'>, id: string): Check | undefined {
  return report.checks.find((c) => c.id === id);
}

/**
 * The first check whose id contains one of the words (case-insensitive), e.g. ['noise'].
 * @param report the report
 * @param words candidate id fragments, tried in order
 */
export function findCheck(report: Pick<ChannelReport, 'checks'>, words: string[]): Check | undefined {
  for (const w of words) {
    const found = report.checks.find((c) => c.id.toLowerCase().includes(w.toLowerCase()));
    if (found) return found;
  }
  return undefined;
}

/** The unit column of the checks table: fractions are shown as per cent. */
export function checkUnitLabel(unit: string): string {
  if (unit === 'fraction of range') return '% of range';
  if (unit === 'fraction' || unit === 'ratio') return '%';
  return unit;
}

/**
 * The y-range of a waveform panel: the data with 8 % padding, widened to a node limit only when
 * the limit lies within three data spans (so clipping shows against its limit, while a small
 * signal far from the rails is not flattened by them).
 * @param values the trace, V
 * @param limits the node's allowed range, V
 * @param includeLimits always show both limits (for a node that clips)
 * @returns [low, high], V
 */
export function waveformRangeV(values: readonly number[], limits: { minV: number; maxV: number }, includeLimits = false): [number, number] {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo > hi) return [limits.minV, limits.maxV];
  // A flat trace still gets a readable span: 0.2 % of the node's allowed range.
  const span = Math.max(hi - lo, 1e-9, 0.002 * Math.abs(limits.maxV - limits.minV));
  if (includeLimits || limits.minV >= lo - 3 * span) lo = Math.min(lo, limits.minV);
  if (includeLimits || limits.maxV <= hi + 3 * span) hi = Math.max(hi, limits.maxV);
  const pad = 0.08 * Math.max(hi - lo, span);
  return [lo - pad, hi + pad];
}
