import { describe, expect, it } from 'vitest';
import wearablePatch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import { runEngine } from '@/features/plan-workspace/hooks/use-live-report';
import { firstStageGain } from '@/features/plan-workspace/plan-edit';
import { setAt } from '@/features/plan-workspace/plan-edit';

describe('runEngine (the live evaluation)', () => {
  it('evaluates a valid plan and reports a measured duration', () => {
    const out = runEngine(wearablePatch);
    expect(out.report).not.toBeNull();
    expect(out.issues).toEqual([]);
    expect(out.engineMs).not.toBeNull();
    expect(out.engineMs as number).toBeGreaterThanOrEqual(0);
    const inst = (wearablePatch as { instrumentation: { rOhm: number; rgOhm?: number } }).instrumentation;
    // G1 = 1 + 2R/Rg (three-op-amp analysis, Sedra & Smith), computed here independently of the engine.
    if (inst.rgOhm !== undefined) expect(out.report?.gains.g1).toBeCloseTo(firstStageGain(inst.rOhm, inst.rgOhm), 9);
  });
  it('returns the field issue instead of throwing for an invalid plan', () => {
    const bad = setAt(wearablePatch as Record<string, unknown>, ['highPass', 'fcHz'], -1);
    const out = runEngine(bad);
    expect(out.report).toBeNull();
    expect(out.engineError).toBeNull();
    expect(out.issues.some((i) => i.path === 'highPass.fcHz')).toBe(true);
  });
});
