import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { planJsonSchemaText } from '@/lib/engine/json-schema';

describe('committed plan JSON Schema', () => {
  it('equals the schema generated from the zod plan schema', () => {
    const committed = readFileSync(new URL('../../lib/engine/plan.schema.json', import.meta.url), 'utf8');
    expect(committed).toBe(planJsonSchemaText());
  });
});
