import { describe, expect, it } from 'vitest';
import { interpretSaveResponse, savePlanRequestSchema } from '@/features/plan-workspace/api/save-plan';

describe('save request schema', () => {
  it('accepts a plan object with a whole, non-negative version', () => {
    expect(savePlanRequestSchema.safeParse({ plan: { name: 'x' }, version: 3 }).success).toBe(true);
  });
  it('names the field and the reason for a bad body', () => {
    const r = savePlanRequestSchema.safeParse({ plan: 'not an object', version: 1.5 });
    expect(r.success).toBe(false);
    if (!r.success) {
      const messages = Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message]));
      expect(messages).toEqual({ plan: 'plan must be a JSON object', version: 'version must be a whole number' });
    }
  });
});

describe('interpretSaveResponse', () => {
  it('reads a successful save', () => {
    expect(interpretSaveResponse(200, { version: 8, report: { checks: [] } })).toEqual({ kind: 'saved', version: 8, report: { checks: [] } });
  });
  it('reads a stale save with the current plan and who saved it', () => {
    const body = {
      error: { code: 'stale', message: 'The plan was changed by someone else.' },
      current: { plan: { name: 'theirs' }, version: 9, updatedByName: 'Eli Engineer', updatedAt: '2026-12-03T08:00:00.000Z' },
    };
    const out = interpretSaveResponse(409, body);
    expect(out.kind).toBe('stale');
    if (out.kind === 'stale') expect(out.current.updatedByName).toBe('Eli Engineer');
  });
  it('reads field issues of an invalid plan', () => {
    const body = { error: { code: 'invalid', message: '1 field is invalid', issues: [{ path: 'instrumentation.rgOhm', message: 'must be greater than zero' }] } };
    expect(interpretSaveResponse(422, body)).toEqual({ kind: 'invalid', message: '1 field is invalid', issues: body.error.issues });
  });
  it('turns a refusal or an unreadable body into a message, never a throw', () => {
    expect(interpretSaveResponse(403, { error: { code: 'forbidden', message: 'Only engineers and admins can edit plans.' } })).toEqual({
      kind: 'refused',
      status: 403,
      code: 'forbidden',
      message: 'Only engineers and admins can edit plans.',
    });
    // A 409 without the stored plan (e.g. an archived plan) is a refusal with its message.
    expect(interpretSaveResponse(409, { error: { code: 'conflict', message: 'archived' } }).kind).toBe('refused');
    const odd = interpretSaveResponse(500, '<html>');
    expect(odd).toEqual({ kind: 'refused', status: 500, code: 'unexpected', message: 'The server answered 500 with a response the workspace could not read.' });
  });
});
