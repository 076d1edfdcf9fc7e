import { describe, expect, it } from 'vitest';
import {
  checkUnitLabel,
  formatCheckValue,
  patchPath,
  ppToRms,
  saturatedNodes,
  waveformRangeV,
  workspaceStageId,
  worstVerdictByStage,
  verdictCounts,
} from '@/features/plan-workspace/report-view';

describe('verdicts per stage', () => {
  it('takes the worst verdict of the checks tied to each stage', () => {
    const checks = [
      { stageId: 'instrumentation', verdict: 'meets' },
      { stageId: 'instrumentation', verdict: 'fails' },
      { stageId: 'instrumentation', verdict: 'marginal' },
      { stageId: 'high-pass', verdict: 'marginal' },
      { stageId: 'high-pass', verdict: 'meets' },
      { stageId: 'adc', verdict: 'meets' },
    ] as const;
    expect(worstVerdictByStage(checks)).toEqual({ instrumentation: 'fails', highPass: 'marginal', adc: 'meets' });
    expect(verdictCounts(checks)).toEqual({ meets: 3, marginal: 2, fails: 1 });
  });
  it('maps the engine stage ids to the workspace stages', () => {
    expect(workspaceStageId('gain-stage')).toBe('gainStage');
    expect(workspaceStageId('right-leg-drive')).toBe('rightLegDrive');
    expect(workspaceStageId('lead-off')).toBe('leadOff');
    expect(workspaceStageId('something-else')).toBe('profile');
  });
});

describe('saturatedNodes', () => {
  it('lists only nodes with negative headroom', () => {
    const node = (name: string, headroomV: number) => ({ name, minV: 0, maxV: 1, lowLimitV: 0.05, highLimitV: 2.95, headroomV, headroomFraction: headroomV / 2.9 });
    const report = { stages: [{ id: 'instrumentation' as const, name: 'Instrumentation stage', gain: 21, nodes: [node('VA', -1.8), node('VB', 0.2)] }] };
    expect(saturatedNodes(report).map((n) => n.nodeName)).toEqual(['VA']);
  });
});

describe('small conversions', () => {
  it('splits a suggestion path into plan keys', () => {
    expect(patchPath('gainStage.lowPass.order')).toEqual(['gainStage', 'lowPass', 'order']);
  });
  it('converts Gaussian peak-to-peak to rms with the 6.6 factor', () => {
    // 6.6 × rms ≈ 0.1 % exceedance for Gaussian noise (common practice, no source): 30 µV p-p → 4.545 µV rms.
    expect(ppToRms(30e-6)).toBeCloseTo(4.5454545e-6, 12);
  });
  it('formats check values by unit', () => {
    expect(formatCheckValue(-0.173, 'fraction of range')).toBe('−17.3 %');
    expect(checkUnitLabel('fraction of range')).toBe('% of range');
    expect(formatCheckValue(4.7454, 'V/V')).toBe('4.745');
    expect(formatCheckValue(3e-5, 'V')).toBe('30 µV');
    expect(formatCheckValue(53.64, 'dB')).toBe('53.6 dB');
  });
});

describe('waveformRangeV', () => {
  it('zooms on a small signal far from the rails', () => {
    const [lo, hi] = waveformRangeV([1.499, 1.5, 1.501], { minV: 0.05, maxV: 2.95 });
    expect(lo).toBeGreaterThan(1.49);
    expect(hi).toBeLessThan(1.51);
  });
  it('includes a limit the trace reaches', () => {
    const [lo, hi] = waveformRangeV([0.05, 1, 2.95], { minV: 0.05, maxV: 2.95 });
    expect(lo).toBeLessThan(0.05);
    expect(hi).toBeGreaterThan(2.95);
  });
  it('falls back to the limits for an empty trace', () => {
    expect(waveformRangeV([], { minV: 0, maxV: 3 })).toEqual([0, 3]);
  });
});

describe('waveformRangeV for a clipped node', () => {
  it('shows both limits when asked', () => {
    const [lo, hi] = waveformRangeV([2.95, 2.95], { minV: 0.05, maxV: 2.95 }, true);
    expect(lo).toBeLessThan(0.05);
    expect(hi).toBeGreaterThan(2.95);
  });
});
