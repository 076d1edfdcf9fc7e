/**
 * The plans the ngspice reference suite runs: the committed demo plans, the fixture and seeded
 * random valid plans; and deliberately mismatched resistor sets for the CMRR comparison.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import type { ChannelPlan } from '@/lib/engine/plan';
import { parsePlan } from '@/lib/engine/validate';
import { resolveInstrumentation, type InstrumentationResistors } from '@/lib/engine/spice-netlist';
import { fixturePlan, mulberry32, randomPlan } from './ngspice-plans';

/** Number of seeded random plans in the suite. */
export const RANDOM_PLAN_COUNT = 24;

const demoDir = fileURLToPath(new URL('../../lib/engine/demo-plans/', import.meta.url));

/** The demo plans committed with the engine (every *.json in lib/engine/demo-plans). */
export function demoPlans(): { name: string; plan: ChannelPlan }[] {
  if (!existsSync(demoDir)) return [];
  return readdirSync(demoDir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => ({ name: `demo ${f}`, plan: parsePlan(JSON.parse(readFileSync(join(demoDir, f), 'utf8'))) }));
}

/** Demo plans, the fixture and the random plans, each with a label for failure messages. */
export function referencePlans(): { name: string; plan: ChannelPlan }[] {
  return [
    ...demoPlans(),
    { name: 'fixture', plan: fixturePlan },
    ...Array.from({ length: RANDOM_PLAN_COUNT }, (_, i) => ({ name: `random seed ${i + 1}`, plan: randomPlan(i + 1) })),
  ];
}

/**
 * A deliberately mismatched resistor set: the difference stage's non-inverting pair pulled
 * apart by the full tolerance (R3ref low, R4ref high) and every other resistor off by a seeded
 * amount within ± half the tolerance, so the common-mode gain is dominated by a known mismatch
 * and never cancels by accident.
 */
export function mismatchedResistors(plan: ChannelPlan, seed: number): InstrumentationResistors {
  const nominal = resolveInstrumentation(plan);
  const t = Math.max(plan.instrumentation.resistorTolerance, 1e-4);
  const rand = mulberry32(seed);
  const jitter = () => 1 + (rand() - 0.5) * t;
  return {
    r1Ohm: nominal.r1Ohm * jitter(),
    r2Ohm: nominal.r2Ohm * jitter(),
    rgOhm: Number.isFinite(nominal.rgOhm) ? nominal.rgOhm * jitter() : nominal.rgOhm,
    r3InvOhm: nominal.r3InvOhm * jitter(),
    r4InvOhm: nominal.r4InvOhm * jitter(),
    r3RefOhm: nominal.r3RefOhm * (1 - t),
    r4RefOhm: nominal.r4RefOhm * (1 + t),
  };
}
