/**
 * Comparison of two revisions of a plan: which inputs changed (path, old → new, with units) and how
 * every headline result and every check moved (value old → new, verdict changes flagged).
 * Pure: takes the two stored plans and reports, returns plain data for the compare view.
 */
import type { ChannelReport, Check, Verdict } from '@/lib/engine/report';
import { formatValue, unitForCheckUnit, unitForFieldName } from '@/features/revisions/quantity-text';

export interface InputChange {
  /** Dotted path in the plan, e.g. "highPass.fcHz". */
  path: string;
  oldValue: unknown;
  newValue: unknown;
  oldText: string;
  newText: string;
}

export interface HeadlineChange {
  id: string;
  label: string;
  oldValue: number | null;
  newValue: number | null;
  oldText: string;
  newText: string;
  changed: boolean;
}

export type CheckMovement = 'improved' | 'worsened' | 'same' | 'value-changed' | 'added' | 'removed';

export interface CheckChange {
  id: string;
  title: string;
  oldValueText: string;
  newValueText: string;
  limitText: string;
  oldVerdict: Verdict | null;
  newVerdict: Verdict | null;
  verdictChanged: boolean;
  movement: CheckMovement;
}

export interface RevisionComparison {
  inputs: InputChange[];
  headlines: HeadlineChange[];
  checks: CheckChange[];
}

type Leaf = { path: string; value: unknown };

/** Every leaf (number, text, boolean, null, array) of a JSON object with its dotted path. */
export function flattenLeaves(value: unknown, prefix = ''): Leaf[] {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return [{ path: prefix, value }];
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
  if (entries.length === 0) return [{ path: prefix, value: {} }];
  return entries.flatMap(([key, v]) => flattenLeaves(v, prefix ? `${prefix}.${key}` : key));
}

const sameJson = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
const lastSegment = (path: string) => path.split('.').pop() ?? path;

/**
 * The plan inputs that differ between two plans, in the order of the newer plan (removed paths last).
 * @example diffPlanInputs({ highPass: { fcHz: 0.5 } }, { highPass: { fcHz: 0.05 } })
 *   // [{ path: 'highPass.fcHz', oldText: '500 mHz', newText: '50 mHz', ... }]
 */
export function diffPlanInputs(oldPlan: unknown, newPlan: unknown): InputChange[] {
  const oldLeaves = new Map(flattenLeaves(oldPlan).map((leaf) => [leaf.path, leaf.value]));
  const newLeaves = new Map(flattenLeaves(newPlan).map((leaf) => [leaf.path, leaf.value]));
  const paths = [...newLeaves.keys(), ...[...oldLeaves.keys()].filter((p) => !newLeaves.has(p))];
  const changes: InputChange[] = [];
  for (const path of paths) {
    const oldValue = oldLeaves.get(path);
    const newValue = newLeaves.get(path);
    if (sameJson(oldValue, newValue)) continue;
    const unit = unitForFieldName(lastSegment(path));
    changes.push({ path, oldValue, newValue, oldText: formatValue(oldValue, unit), newText: formatValue(newValue, unit) });
  }
  return changes;
}

/** The headline results shown in the compare view, with where they sit in the report. */
export const headlineResults: { id: string; label: string; read: (r: ChannelReport) => number | null | undefined }[] = [
  { id: 'gains.g1', label: 'First-stage gain G1', read: (r) => r.gains.g1 },
  { id: 'gains.totalGain', label: 'Total gain', read: (r) => r.gains.totalGain },
  { id: 'maxFirstStageGain', label: 'Largest offset-safe first-stage gain', read: (r) => r.maxFirstStageGain },
  { id: 'worstCaseInputV', label: 'Worst-case differential DC input', read: (r) => r.worstCaseInputV },
  { id: 'response.lowCornerHz', label: 'Low −3 dB corner', read: (r) => r.response.lowCornerHz },
  { id: 'response.highCornerHz', label: 'High −3 dB corner', read: (r) => r.response.highCornerHz },
  { id: 'response.midbandGainDb', label: 'Mid-band gain', read: (r) => r.response.midbandGainDb },
  { id: 'response.aliasAttenuationDb', label: 'Alias attenuation', read: (r) => r.response.aliasAttenuationDb },
  { id: 'impulseTest.displacementV', label: 'Impulse-test displacement (RTI)', read: (r) => r.impulseTest.displacementV },
  { id: 'impulseTest.slopeVPerS', label: 'Impulse-test slope (RTI)', read: (r) => r.impulseTest.slopeVPerS },
  { id: 'recovery.timeS', label: 'Recovery after overload', read: (r) => r.recovery.timeS },
  { id: 'noise.rtiRmsV', label: 'Noise RTI, rms', read: (r) => r.noise.rtiRmsV },
  { id: 'noise.rtiPpV', label: 'Noise RTI, peak-to-peak', read: (r) => r.noise.rtiPpV },
  { id: 'cmrr.dcDb', label: 'CMRR at DC', read: (r) => r.cmrr.dcDb },
  { id: 'cmrr.mainsDb', label: 'CMRR at mains frequency', read: (r) => r.cmrr.mainsDb },
  { id: 'interference.rtiPpV', label: 'Mains interference RTI', read: (r) => r.interference.rtiPpV },
  { id: 'interference.cmrTest.rtiPpV', label: 'Common-mode test result RTI', read: (r) => r.interference.cmrTest?.rtiPpV },
  { id: 'adc.lsbRtiV', label: 'LSB referred to input', read: (r) => r.adc.lsbRtiV },
  { id: 'adc.rangeRtiV', label: 'Converter range referred to input', read: (r) => r.adc.rangeRtiV },
  { id: 'patientCurrents.dcA', label: 'Patient DC current per lead', read: (r) => r.patientCurrents.dcA },
];

function readSafely(read: (r: ChannelReport) => number | null | undefined, report: ChannelReport): number | null {
  try {
    const value = read(report);
    return typeof value === 'number' ? value : null;
  } catch {
    return null;
  }
}

/** Every headline result of two reports, old → new. */
export function diffHeadlines(oldReport: ChannelReport, newReport: ChannelReport): HeadlineChange[] {
  return headlineResults.map(({ id, label, read }) => {
    const oldValue = readSafely(read, oldReport);
    const newValue = readSafely(read, newReport);
    const unit = unitForFieldName(lastSegment(id));
    return {
      id,
      label,
      oldValue,
      newValue,
      oldText: oldValue === null ? '—' : formatValue(oldValue, unit),
      newText: newValue === null ? '—' : formatValue(newValue, unit),
      changed: oldValue !== newValue,
    };
  });
}

const verdictRank: Record<Verdict, number> = { meets: 0, marginal: 1, fails: 2 };

/** Every check of either report (newer order first, then checks only the older report has). */
export function diffChecks(oldChecks: readonly Check[], newChecks: readonly Check[]): CheckChange[] {
  const oldById = new Map(oldChecks.map((c) => [c.id, c]));
  const newById = new Map(newChecks.map((c) => [c.id, c]));
  const ids = [...newById.keys(), ...[...oldById.keys()].filter((id) => !newById.has(id))];
  return ids.map((id) => {
    const before = oldById.get(id);
    const after = newById.get(id);
    const reference = (after ?? before)!;
    const unit = unitForCheckUnit(reference.unit);
    let movement: CheckMovement;
    if (!before) movement = 'added';
    else if (!after) movement = 'removed';
    else if (verdictRank[after.verdict] < verdictRank[before.verdict]) movement = 'improved';
    else if (verdictRank[after.verdict] > verdictRank[before.verdict]) movement = 'worsened';
    else movement = after.value === before.value ? 'same' : 'value-changed';
    return {
      id,
      title: reference.title,
      oldValueText: before ? formatValue(before.value, unit) : '—',
      newValueText: after ? formatValue(after.value, unit) : '—',
      limitText: `${reference.sense === 'atMost' ? '≤' : '≥'} ${formatValue(reference.limit, unit)}`,
      oldVerdict: before?.verdict ?? null,
      newVerdict: after?.verdict ?? null,
      verdictChanged: (before?.verdict ?? null) !== (after?.verdict ?? null),
      movement,
    };
  });
}

/** The whole comparison of an older and a newer revision. */
export function compareRevisions(
  older: { plan: unknown; report: ChannelReport },
  newer: { plan: unknown; report: ChannelReport },
): RevisionComparison {
  return {
    inputs: diffPlanInputs(older.plan, newer.plan),
    headlines: diffHeadlines(older.report, newer.report),
    checks: diffChecks(older.report.checks ?? [], newer.report.checks ?? []),
  };
}

/** The headline results of one report as label and text (the revision page's summary table). */
export function headlineRowsOf(report: ChannelReport): { id: string; label: string; text: string }[] {
  return headlineResults.map(({ id, label, read }) => {
    const value = readSafely(read, report);
    return { id, label, text: value === null ? '—' : formatValue(value, unitForFieldName(lastSegment(id))) };
  });
}

/** Every check of one report with its value, limit and verdict as text. */
export function checkRowsOf(report: ChannelReport) {
  return (report.checks ?? []).map((check) => {
    const unit = unitForCheckUnit(check.unit);
    return {
      id: check.id,
      title: check.title,
      valueText: formatValue(check.value, unit),
      limitText: `${check.sense === 'atMost' ? '≤' : '≥'} ${formatValue(check.limit, unit)}`,
      verdict: check.verdict,
      stageId: check.stageId,
    };
  });
}
