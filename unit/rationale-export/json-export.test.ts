import { describe, expect, it } from 'vitest';
import { contentHash } from '@/features/rationale-export/content-hash';
import { planFromRationaleJson, rationaleJsonHashIntact, rationaleJsonText, RationaleJsonError, toRationaleJson } from '@/features/rationale-export/json-export';
import { RationaleInputError } from '@/features/rationale-export/rationale-input';
import { evaluate } from '@/lib/engine/evaluate';
import { parsePlan } from '@/lib/engine/validate';
import { demoPlanFiles, demoPlanJson, demoRationaleInput } from './fixtures';

const CAUTION =
  'Channelsmith is a planning aid, not a certification. The device must be verified by test to IEC 60601-1 and the applicable particular standards; local regulations and qualified engineers decide. Patient leakage and defibrillation protection must be designed and tested separately.';

describe('toRationaleJson', () => {
  it('carries format, version, plan, report, review, revision, cautions and a matching content hash', () => {
    const input = demoRationaleInput('wearable-ecg-patch.json', { withBench: true });
    const doc = toRationaleJson(input);
    expect(doc.format).toBe('channelsmith-rationale');
    expect(doc.formatVersion).toBe(1);
    expect(doc.cautions).toEqual([CAUTION]);
    expect(doc.revision.label).toBe('B');
    expect(doc.revision.createdAt).toBe('2025-03-03T14:30:00.000Z');
    expect(doc.review.signatures).toHaveLength(2);
    expect(doc.bench?.rows).toHaveLength(3);
    expect(doc.contentHash).toBe(contentHash({ plan: parsePlan(demoPlanJson('wearable-ecg-patch.json')), report: evaluate(demoPlanJson('wearable-ecg-patch.json')) }));
    expect(doc.contentHashMatchesRevision).toBe(true);
    expect(rationaleJsonHashIntact(doc)).toBe(true);
  });

  it('flags a revision hash that does not match the data', () => {
    const input = demoRationaleInput('wearable-ecg-patch.json');
    const doc = toRationaleJson({ ...input, revision: { ...input.revision, contentHash: 'b'.repeat(64) } });
    expect(doc.contentHashMatchesRevision).toBe(false);
  });

  it('detects a value changed in the file after export', () => {
    const doc = JSON.parse(JSON.stringify(toRationaleJson(demoRationaleInput('wearable-ecg-patch.json'))));
    doc.report.noise.rtiRmsV *= 0.5;
    expect(rationaleJsonHashIntact(doc)).toBe(false);
  });

  it('refuses bad input with the field and the reason', () => {
    const input = demoRationaleInput('wearable-ecg-patch.json');
    expect(() => toRationaleJson({ ...input, revision: { ...input.revision, label: 'b2' } })).toThrow(RationaleInputError);
    expect(() => toRationaleJson({ ...input, revision: { ...input.revision, label: 'b2' } })).toThrow('revision.label: revision label must be one to three capital letters');
    expect(() => toRationaleJson({ ...input, revision: { ...input.revision, contentHash: 'xyz' } })).toThrow('revision.contentHash: content hash must be 64 lowercase hexadecimal digits (SHA-256)');
    expect(() => toRationaleJson({ ...input, generatedAt: 'yesterday' })).toThrow('generatedAt: generation date is not a valid date');
    const badPlan = { ...(input.planInput as object), highPass: { order: 1, fcHz: -1 } };
    expect(() => toRationaleJson({ ...input, planInput: badPlan })).toThrow('planInput.highPass.fcHz: high-pass corner must be greater than zero');
    expect(() => toRationaleJson({ ...input, report: { checks: [] } })).toThrow("report: report must be the engine's report");
    expect(() => toRationaleJson(null)).toThrow(RationaleInputError);
  });
});

describe('planFromRationaleJson', () => {
  for (const file of demoPlanFiles) {
    it(`round-trips ${file}: equal plan, and evaluate() of it gives an equal report`, () => {
      const input = demoRationaleInput(file);
      const text = JSON.stringify(toRationaleJson(input));
      const plan = planFromRationaleJson(JSON.parse(text));
      expect(plan).toEqual(input.planInput);
      expect(evaluate(plan)).toEqual(input.report);
      // From the text itself, too.
      expect(planFromRationaleJson(text)).toEqual(input.planInput);
    });
  }

  it('gives the same canonical text for the same document', () => {
    const doc = toRationaleJson(demoRationaleInput('emg-sleeve.json'));
    const reread = JSON.parse(JSON.stringify(doc));
    expect(rationaleJsonText(reread)).toBe(rationaleJsonText(doc));
  });

  it('names the offending field for bad documents', () => {
    const doc = JSON.parse(JSON.stringify(toRationaleJson(demoRationaleInput('wearable-ecg-patch.json'))));
    const attempt = (v: unknown) => {
      try {
        planFromRationaleJson(v);
      } catch (e) {
        expect(e).toBeInstanceOf(RationaleJsonError);
        return (e as RationaleJsonError).issues;
      }
      throw new Error('expected a RationaleJsonError');
    };
    expect(attempt('{not json')[0].message).toMatch(/^the text is not valid JSON/);
    expect(attempt([1, 2])).toEqual([{ path: '', message: 'the document must be a JSON object' }]);
    expect(attempt({ ...doc, format: 'other' })).toEqual([{ path: 'format', message: 'format must be "channelsmith-rationale"' }]);
    expect(attempt({ ...doc, formatVersion: 2 })).toEqual([{ path: 'formatVersion', message: 'formatVersion must be 1 (this version of Channelsmith reads version 1 only)' }]);
    const { plan: _plan, ...noPlan } = doc;
    expect(attempt(noPlan)).toEqual([{ path: 'plan', message: 'is required' }]);
    const badGain = { ...doc, plan: { ...doc.plan, gainStage: { ...doc.plan.gainStage, gain: 0.5 } } };
    expect(attempt(badGain)).toEqual([{ path: 'plan.gainStage.gain', message: 'second-stage gain must be at least 1' }]);
    const noRails = { ...doc, plan: { ...doc.plan, supply: { positiveV: 0, negativeV: 3, referenceV: 1 } } };
    expect(attempt(noRails)).toContainEqual({ path: 'plan.supply.positiveV', message: 'positive rail must be above the negative rail' });
  });
});
