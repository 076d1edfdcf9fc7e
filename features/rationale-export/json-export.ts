/**
 * The machine-readable design rationale: the plan, its report, the revision and its review
 * record, in one JSON document; and the way back from such a document to a validated plan.
 */
import { z } from 'zod';
import type { ChannelPlan } from '@/lib/engine/plan';
import type { ChannelReport } from '@/lib/engine/report';
import { safeParsePlan } from '@/lib/engine/validate';
import { RATIONALE_CAUTION } from './cautions';
import { canonicalJson, contentHash } from './content-hash';
import { parseRationaleInput, type RationaleInput } from './rationale-input';

export const RATIONALE_FORMAT = 'channelsmith-rationale';
export const RATIONALE_FORMAT_VERSION = 1;
/** Largest JSON text `planFromRationaleJson` reads, characters (a plan and report are far smaller). */
export const RATIONALE_JSON_MAX_CHARS = 20_000_000;

/** The exported document. Dates are ISO 8601 texts; numbers SI as in the engine. */
export type RationaleJson = {
  format: typeof RATIONALE_FORMAT;
  formatVersion: typeof RATIONALE_FORMAT_VERSION;
  generatedAt: string;
  generatedByName: string;
  program: { name: string };
  planName: string;
  revision: RationaleInput['revision'];
  /** SHA-256 of the canonical JSON of `{ plan, report }` as computed at export time. */
  contentHash: string;
  /** Whether `contentHash` equals the revision's recorded hash. */
  contentHashMatchesRevision: boolean;
  plan: ChannelPlan;
  report: ChannelReport;
  review: RationaleInput['review'];
  bench?: RationaleInput['bench'];
  cautions: string[];
};

/**
 * Builds the JSON export of a revision.
 * @param input the export data (validated here; see `parseRationaleInput`)
 * @returns a plain JSON-serialisable object; `JSON.stringify` it to write the file
 * @throws RationaleInputError naming the offending field for bad input
 */
export function toRationaleJson(input: unknown): RationaleJson {
  const data = parseRationaleInput(input);
  const hash = contentHash({ plan: data.planInput, report: data.report });
  // A deep copy through JSON so the document shares no objects with the caller's data.
  const copy = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;
  const doc: RationaleJson = {
    format: RATIONALE_FORMAT,
    formatVersion: RATIONALE_FORMAT_VERSION,
    generatedAt: data.generatedAt,
    generatedByName: data.generatedByName,
    program: { name: data.program.name },
    planName: data.plan.name,
    revision: copy(data.revision),
    contentHash: hash,
    contentHashMatchesRevision: hash === data.revision.contentHash,
    plan: copy(data.planInput),
    report: copy(data.report),
    review: copy(data.review),
    cautions: [RATIONALE_CAUTION],
  };
  if (data.bench) doc.bench = copy(data.bench);
  return doc;
}

/** Thrown when a rationale document cannot give a plan; `issues` names every offending field. */
export class RationaleJsonError extends Error {
  readonly issues: { path: string; message: string }[];
  constructor(issues: { path: string; message: string }[]) {
    super(`Not a usable design-rationale JSON: ${issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; ')}`);
    this.name = 'RationaleJsonError';
    this.issues = issues;
  }
}

const envelopeSchema = z.object({
  format: z.literal(RATIONALE_FORMAT, { error: `format must be "${RATIONALE_FORMAT}"` }),
  formatVersion: z.literal(RATIONALE_FORMAT_VERSION, { error: `formatVersion must be ${RATIONALE_FORMAT_VERSION} (this version of Channelsmith reads version 1 only)` }),
  plan: z.record(z.string(), z.unknown(), { error: 'plan must be an object' }),
});

function readAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = root;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[key as string];
  }
  return v;
}

/**
 * Reads the plan back from an exported rationale.
 * @param json the parsed document, or its JSON text
 * @returns the validated channel plan (defaults applied)
 * @throws RationaleJsonError naming the field and the reason (`plan.instrumentation.rgOhm: ...`)
 */
export function planFromRationaleJson(json: unknown): ChannelPlan {
  let doc: unknown = json;
  if (typeof json === 'string') {
    if (json.length > RATIONALE_JSON_MAX_CHARS) throw new RationaleJsonError([{ path: '', message: `the document is larger than ${RATIONALE_JSON_MAX_CHARS} characters` }]);
    try {
      doc = JSON.parse(json);
    } catch (cause) {
      throw new RationaleJsonError([{ path: '', message: `the text is not valid JSON (${cause instanceof Error ? cause.message : String(cause)})` }]);
    }
  }
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) {
    throw new RationaleJsonError([{ path: '', message: 'the document must be a JSON object' }]);
  }
  const envelope = envelopeSchema.safeParse(doc);
  if (!envelope.success) {
    throw new RationaleJsonError(
      envelope.error.issues.map((i) => ({
        path: i.path.map(String).join('.'),
        message: readAt(doc, i.path) === undefined ? 'is required' : i.message,
      })),
    );
  }
  const plan = safeParsePlan(envelope.data.plan);
  if (!plan.success) {
    throw new RationaleJsonError(plan.error.issues.map((i) => ({ path: i.path ? `plan.${i.path}` : 'plan', message: i.message })));
  }
  return plan.data;
}

/**
 * Whether a rationale document's plan and report still hash to its `contentHash`: a changed value
 * anywhere in either gives false.
 * @param doc an exported document (as `toRationaleJson` returns it, possibly read back from a file)
 */
export function rationaleJsonHashIntact(doc: Pick<RationaleJson, 'plan' | 'report' | 'contentHash'>): boolean {
  try {
    return contentHash({ plan: doc.plan, report: doc.report }) === doc.contentHash;
  } catch {
    return false;
  }
}

/** The document as text, canonical (sorted keys, no whitespace): the same document always gives the same bytes. */
export function rationaleJsonText(doc: RationaleJson): string {
  return canonicalJson(doc);
}
