/**
 * Demo programs, channel plans and parts for the "Larkspur Biosignals" workspace (all invented:
 * generic parts, no real part numbers or brands). Called by `db/seed.ts` after the workspace and
 * its members exist. Idempotent: a program or plan that exists (same name) is left as it is, so
 * demo edits survive a re-seed; the same holds for parts, keyed by (workspace, kind, name).
 * Every row it creates is recorded in the audit trail, attributed to the demo engineer.
 */
import { and, eq } from 'drizzle-orm';
import type { Database } from '@/db/connection';
import { auditEvents, channelPlans, parts, programs } from '@/db/schema';
import diagnosticCart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import emgSleeve from '@/lib/engine/demo-plans/emg-sleeve.json';
import wearablePatchHighGain from '@/lib/engine/demo-plans/wearable-ecg-patch-high-gain.json';
import wearablePatch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import { evaluate } from '@/lib/engine/evaluate';
import { profileFor } from '@/lib/engine/profiles';
import type { Verdict } from '@/lib/engine/report';
import { parsePlan } from '@/lib/engine/validate';
import { partSchema, type Part } from '@/lib/parts/part-kinds';

interface SeedTarget {
  workspaceId: number;
  /** The demo engineer: creator of the demo data. */
  engineerUserId: number;
}

const demoPrograms: { name: string; description: string; plans: { templateId: string; plan: unknown }[] }[] = [
  {
    name: 'Two-lead wearable ECG patch',
    description: 'Single 3.0 V supply, dry electrodes, monitoring ECG. The high-gain variant shows offset saturation and its fix.',
    plans: [
      { templateId: 'wearable-ecg-patch', plan: wearablePatch },
      { templateId: 'wearable-ecg-patch-high-gain', plan: wearablePatchHighGain },
    ],
  },
  {
    name: '12-lead diagnostic cart front end',
    description: '±5 V supply, wet gel electrodes, diagnostic ECG profile.',
    plans: [{ templateId: 'diagnostic-cart-12-lead', plan: diagnosticCart }],
  },
  {
    name: 'Surface-EMG sleeve',
    description: 'Surface EMG over the forearm, gel electrodes.',
    plans: [{ templateId: 'emg-sleeve', plan: emgSleeve }],
  },
];

type OpAmpJson = Record<string, number | string>;
const amplifierValues = (opAmp: OpAmpJson) => {
  const { source: _source, ...values } = opAmp;
  return values as Record<string, number>;
};

/** The demo part library; amplifier, converter and electrode values come from the demo plans where they overlap. */
function demoParts(): Part[] {
  const cartIna = diagnosticCart.instrumentation;
  const patchIna = wearablePatch.instrumentation;
  const invented = 'invented demo part; values assumed, not from any datasheet';
  return [
    {
      kind: 'instrumentation-amplifier',
      name: 'Generic low-noise INA, 8 nV/√Hz',
      description: 'Three-op-amp instrumentation amplifier for mains-powered front ends (values as in the diagnostic-cart demo plan).',
      status: 'approved',
      sourceNote: invented,
      ...(amplifierValues(cartIna.opAmp) as object),
      gainMin: 1,
      gainMax: 1000,
      diffGain: cartIna.diffGain,
      rgConstantOhm: 2 * cartIna.rOhm,
    } as Part,
    {
      kind: 'instrumentation-amplifier',
      name: 'Generic micropower INA, 25 nV/√Hz',
      description: 'Rail-to-rail micropower instrumentation amplifier for single-supply wearables (values as in the patch demo plan).',
      status: 'approved',
      sourceNote: invented,
      ...(amplifierValues(patchIna.opAmp) as object),
      gainMin: 1,
      gainMax: 1000,
      diffGain: patchIna.diffGain,
      rgConstantOhm: 2 * patchIna.rOhm,
    } as Part,
    {
      kind: 'operational-amplifier',
      name: 'Generic precision op-amp, 10 nV/√Hz',
      description: 'Low-noise rail-to-rail op-amp for gain and filter stages (values as in the EMG demo plan).',
      status: 'under-evaluation',
      sourceNote: invented,
      ...(amplifierValues(emgSleeve.gainStage.opAmp) as object),
    } as Part,
    {
      kind: 'converter',
      name: 'Generic 24-bit sigma-delta converter',
      description: 'Delta-sigma converter for low-rate biopotential channels.',
      status: 'under-evaluation',
      sourceNote: invented,
      bits: 24,
      fullScaleV: 5,
      sampleRateMaxHz: 32e3,
      inputNoiseVrms: 1e-6,
    },
    {
      kind: 'converter',
      name: 'Generic 16-bit SAR converter',
      description: 'Successive-approximation converter (full scale and noise as in the diagnostic-cart demo plan).',
      status: 'approved',
      sourceNote: invented,
      bits: diagnosticCart.adc.bits,
      fullScaleV: diagnosticCart.adc.fullScaleV,
      sampleRateMaxHz: 1e6,
      inputNoiseVrms: diagnosticCart.adc.inputNoiseVrms,
    },
    {
      kind: 'electrode',
      name: 'Generic dry electrode',
      description: 'Dry contact electrode for wearables (impedance as in the patch demo plan).',
      status: 'under-evaluation',
      sourceNote: invented,
      electrodeType: 'dry',
      rsOhm: wearablePatch.electrodes.rsOhm,
      rpOhm: wearablePatch.electrodes.rpOhm,
      cpF: wearablePatch.electrodes.cpF,
      offsetTypicalV: 0.1,
      offsetMaxV: wearablePatch.electrodes.offsetV,
    },
    {
      kind: 'electrode',
      name: 'Generic wet gel electrode',
      description: 'Disposable wet gel electrode (impedance as in the diagnostic-cart demo plan).',
      status: 'approved',
      sourceNote: invented,
      electrodeType: 'wet-gel',
      rsOhm: diagnosticCart.electrodes.rsOhm,
      rpOhm: diagnosticCart.electrodes.rpOhm,
      cpF: diagnosticCart.electrodes.cpF,
      offsetTypicalV: 0.01,
      offsetMaxV: diagnosticCart.electrodes.offsetV,
    },
  ];
}

const verdictRank: Record<Verdict, number> = { meets: 0, marginal: 1, fails: 2 };

/** Validates a demo plan and computes what the server stores with it. */
function computeDemoPlan(input: unknown) {
  const plan = parsePlan(input);
  const report = evaluate(plan);
  let worstVerdict: Verdict | null = null;
  for (const check of report.checks) {
    if (worstVerdict === null || verdictRank[check.verdict] > verdictRank[worstVerdict]) worstVerdict = check.verdict;
  }
  return {
    plan: plan as unknown as Record<string, unknown>,
    report,
    worstVerdict,
    profileId: plan.profileId,
    application: profileFor(plan.profileId, plan.customProfile).application,
  };
}

export interface SeededWorkspaceData {
  programIds: Record<string, number>;
  planIds: Record<string, number>;
  partCount: number;
}

/**
 * Adds the demo programs (one plan each, two for the patch), and upserts the demo parts.
 * @returns ids by program name and by template id
 */
export async function seedWorkspaceData(db: Database, target: SeedTarget): Promise<SeededWorkspaceData> {
  const { workspaceId, engineerUserId: userId } = target;
  const programIds: Record<string, number> = {};
  const planIds: Record<string, number> = {};

  for (const demo of demoPrograms) {
    await db.transaction(async (tx) => {
      let [program] = await tx
        .select({ id: programs.id })
        .from(programs)
        .where(and(eq(programs.workspaceId, workspaceId), eq(programs.name, demo.name)));
      if (!program) {
        [program] = await tx
          .insert(programs)
          .values({ workspaceId, name: demo.name, description: demo.description, createdByUserId: userId, updatedByUserId: userId })
          .$returningId();
        await tx.insert(auditEvents).values({
          workspaceId,
          actorUserId: userId,
          action: 'program.created',
          entityType: 'program',
          entityId: String(program.id),
          before: null,
          after: { name: demo.name, description: demo.description, archivedAt: null, seeded: true },
        });
      }
      programIds[demo.name] = program.id;

      for (const { templateId, plan } of demo.plans) {
        const computed = computeDemoPlan(plan);
        const name = String(computed.plan.name);
        let [row] = await tx
          .select({ id: channelPlans.id })
          .from(channelPlans)
          .where(and(eq(channelPlans.programId, program.id), eq(channelPlans.name, name)));
        if (!row) {
          [row] = await tx
            .insert(channelPlans)
            .values({
              programId: program.id,
              workspaceId,
              name,
              profileId: computed.profileId,
              application: computed.application,
              plan: computed.plan,
              report: computed.report,
              worstVerdict: computed.worstVerdict,
              version: 1,
              createdByUserId: userId,
              updatedByUserId: userId,
            })
            .$returningId();
          await tx.insert(auditEvents).values({
            workspaceId,
            actorUserId: userId,
            action: 'plan.created',
            entityType: 'channel-plan',
            entityId: String(row.id),
            before: null,
            after: { programId: program.id, name, origin: { kind: 'template', templateId }, version: 1, plan: computed.plan, seeded: true },
          });
        }
        planIds[templateId] = row.id;
      }
    });
  }

  const library = demoParts();
  for (const candidate of library) {
    // The library's own validation: a demo part that breaks its rules stops the seed with the reason.
    const part = partSchema.parse(candidate);
    const { kind, name, description, status, sourceNote, ...values } = part;
    await db.transaction(async (tx) => {
      const [existing] = await tx
        .select({ id: parts.id })
        .from(parts)
        .where(and(eq(parts.workspaceId, workspaceId), eq(parts.kind, kind), eq(parts.name, name)));
      if (existing) return;
      const [created] = await tx
        .insert(parts)
        .values({ workspaceId, kind, name, description, status, sourceNote, values, createdByUserId: userId, updatedByUserId: userId })
        .$returningId();
      await tx.insert(auditEvents).values({
        workspaceId,
        actorUserId: userId,
        action: 'part.created',
        entityType: 'part',
        entityId: String(created.id),
        before: null,
        after: { kind, name, status, sourceNote, values, seeded: true },
      });
    });
  }
  return { programIds, planIds, partCount: library.length };
}
