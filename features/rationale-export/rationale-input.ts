/**
 * The plain data a design-rationale export is made from: the revision's title block, the plan it
 * snapshots, the engine's report for it, the review record and (optionally) the bench comparison.
 * Callers (route handlers) load this from the database and pass it in; the renderers never touch I/O.
 *
 * `parseRationaleInput` checks the title block, review and bench parts with zod and checks that the
 * plan is a valid channel plan; the report is taken as the engine produced it (it is never user input)
 * but its top-level shape is checked so that a wrong object gives a clear message instead of a crash.
 */
import { z } from 'zod';
import type { ChannelPlan } from '@/lib/engine/plan';
import type { ChannelReport, StageId } from '@/lib/engine/report';
import { safeParsePlan } from '@/lib/engine/validate';

/** Revision states as the product names them. */
export const revisionStates = ['draft', 'in-review', 'released', 'changes-requested', 'superseded'] as const;
export type RevisionState = (typeof revisionStates)[number];

/** A date given as a `Date` or an ISO 8601 text; kept as the ISO text. */
const isoDate = (what: string) =>
  z
    .union([z.date(), z.string()], { error: `${what} must be a date or an ISO 8601 date text` })
    .transform((v, ctx) => {
      const d = v instanceof Date ? v : new Date(v);
      if (Number.isNaN(d.getTime())) {
        ctx.addIssue({ code: 'custom', message: `${what} is not a valid date` });
        return z.NEVER;
      }
      return d.toISOString();
    });

const text = (what: string, max: number) =>
  z.string({ error: `${what} must be a text` }).max(max, { message: `${what} must be at most ${max} characters` });
const name = (what: string) => text(what, 200).trim().min(1, { message: `${what} must not be empty` });

/** A SHA-256 content hash, 64 lowercase hexadecimal digits. */
export const contentHashSchema = z
  .string({ error: 'content hash must be a text' })
  .regex(/^[0-9a-f]{64}$/, { message: 'content hash must be 64 lowercase hexadecimal digits (SHA-256)' });

export const revisionInfoSchema = z.object({
  /** 'A', 'B', ..., 'Z', 'AA', ... */
  label: z.string({ error: 'revision label must be a text' }).regex(/^[A-Z]{1,3}$/, { message: 'revision label must be one to three capital letters (A, B, ..., AA)' }),
  state: z.enum(revisionStates, { error: `revision state must be one of ${revisionStates.join(', ')}` }),
  createdAt: isoDate('revision creation date'),
  createdByName: name('revision author name'),
  changeSummary: text('change summary', 4000),
  contentHash: contentHashSchema,
});

export const reviewerSchema = z.object({
  name: name('reviewer name'),
  /** Workspace role or review role, e.g. "reviewer". */
  role: text('reviewer role', 100),
});

export const reviewCommentSchema = z.object({
  /** The stage the comment is anchored to, when it is. */
  stageId: text('comment stage', 50).optional(),
  /** The check the comment is anchored to, when it is. */
  checkId: text('comment check', 100).optional(),
  authorName: name('comment author name'),
  at: isoDate('comment date'),
  body: text('comment text', 10000).min(1, { message: 'comment text must not be empty' }),
  resolved: z.boolean({ error: 'comment resolved flag must be true or false' }),
});

export const signatureSchema = z.object({
  signerName: name('signer name'),
  role: text('signer role', 100),
  meaning: z.enum(['approved', 'changes-requested'], { error: 'signature meaning must be approved or changes-requested' }),
  at: isoDate('signature date'),
  /** The content hash the signer saw and signed. */
  contentHash: contentHashSchema,
});

export const reviewRecordSchema = z.object({
  requestedAt: isoDate('review request date').optional(),
  reviewers: z.array(reviewerSchema, { error: 'reviewers must be a list' }).max(100),
  comments: z.array(reviewCommentSchema, { error: 'comments must be a list' }).max(2000),
  signatures: z.array(signatureSchema, { error: 'signatures must be a list' }).max(100),
});

const finiteNumber = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { message: `${what} must be a finite number` });

/** One bench quantity: what the plan predicted against what the prototype measured, in SI units. */
export const benchRowSchema = z.object({
  /** E.g. "DC offset at the ADC", "noise RTI, rms". */
  quantity: name('bench quantity'),
  /** SI unit of predicted and measured ("V", "V/rtHz", "Hz", ...); optional, shown beside the values. */
  unit: text('bench unit', 20).optional(),
  predicted: finiteNumber('predicted value'),
  measured: finiteNumber('measured value'),
  /** measured ÷ predicted; null when nothing was predicted. */
  ratio: finiteNumber('measured/predicted ratio').nullable(),
  /** Whether the measurement is within the stated agreement band. */
  within: z.boolean({ error: 'bench "within" flag must be true or false' }),
});

export const benchComparisonSchema = z.object({
  /** Name of the uploaded record (file name or title). */
  recordName: text('bench record name', 300).optional(),
  rows: z.array(benchRowSchema, { error: 'bench rows must be a list' }).max(200),
});

/** Top-level keys the engine's report always has; checked so a wrong object fails with a message. */
const reportKeys = ['engineVersion', 'profile', 'gains', 'stages', 'response', 'impulseTest', 'noise', 'cmrr', 'interference', 'adc', 'patientCurrents', 'checks', 'warnings', 'assumptions'] as const;

const reportShape = z.custom<ChannelReport>(
  (v) => v !== null && typeof v === 'object' && reportKeys.every((k) => k in (v as Record<string, unknown>)),
  { message: `report must be the engine's report (with ${reportKeys.join(', ')})` },
);

const planShape = z.unknown().transform((v, ctx) => {
  const parsed = safeParsePlan(v);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: issue.path ? issue.path.split('.') : [], message: issue.message });
    return z.NEVER;
  }
  return parsed.data;
});

export const rationaleInputSchema = z.object({
  program: z.object({ name: name('program name') }),
  plan: z.object({ name: name('plan name') }),
  revision: revisionInfoSchema,
  planInput: planShape,
  report: reportShape,
  review: reviewRecordSchema,
  bench: benchComparisonSchema.optional(),
  generatedAt: isoDate('generation date'),
  generatedByName: name('name of the person exporting'),
});

/** The export's input after validation: dates as ISO texts, the plan with its defaults applied. */
export type RationaleInput = {
  program: { name: string };
  plan: { name: string };
  revision: z.output<typeof revisionInfoSchema>;
  planInput: ChannelPlan;
  report: ChannelReport;
  review: z.output<typeof reviewRecordSchema>;
  bench?: z.output<typeof benchComparisonSchema>;
  generatedAt: string;
  generatedByName: string;
};
/** What callers may pass: dates as `Date` or ISO text. */
export type RationaleInputData = z.input<typeof rationaleInputSchema>;
export type ReviewComment = z.output<typeof reviewCommentSchema>;
export type Signature = z.output<typeof signatureSchema>;
export type BenchRow = z.output<typeof benchRowSchema>;
export type { StageId };

/** Thrown for invalid export input; `issues` lists every offending field as `path: reason`. */
export class RationaleInputError extends Error {
  readonly issues: { path: string; message: string }[];
  constructor(issues: { path: string; message: string }[]) {
    super(`Invalid design-rationale input: ${issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; ')}`);
    this.name = 'RationaleInputError';
    this.issues = issues;
  }
}

/**
 * Validates the export input.
 * @param input the plain data from the caller
 * @returns the validated input (dates as ISO 8601 texts, plan with defaults)
 * @throws RationaleInputError naming every offending field
 */
export function parseRationaleInput(input: unknown): RationaleInput {
  let result: ReturnType<typeof rationaleInputSchema.safeParse>;
  try {
    result = rationaleInputSchema.safeParse(input);
  } catch (cause) {
    throw new RationaleInputError([{ path: '', message: `the input could not be read (${cause instanceof Error ? cause.message : String(cause)})` }]);
  }
  if (!result.success) {
    throw new RationaleInputError(
      result.error.issues.map((i) => ({
        path: i.path.map(String).join('.'),
        message: i.code === 'invalid_type' && i.path.length > 0 && !/must|required/.test(i.message) ? 'is required' : i.message,
      })),
    );
  }
  return result.data as RationaleInput;
}
