/**
 * JSON Schema of the channel plan, generated from the zod schema (zod 4 `z.toJSONSchema`).
 * The committed `plan.schema.json` must equal `planJsonSchema()` (a unit test checks it;
 * regenerate with `node --import tsx lib/engine/json-schema.ts > lib/engine/plan.schema.json`).
 */
import { z } from 'zod';
import { planSchema } from './plan';

/** The plan's JSON Schema as written by users (input side: defaults optional). */
export function planJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(planSchema, { io: 'input', unrepresentable: 'any' }) as Record<string, unknown>;
}

/** The schema as committed: pretty-printed with a trailing newline. */
export function planJsonSchemaText(): string {
  return `${JSON.stringify(planJsonSchema(), null, 2)}\n`;
}

if (typeof process !== 'undefined' && process.argv[1]?.endsWith('json-schema.ts')) {
  process.stdout.write(planJsonSchemaText());
}
