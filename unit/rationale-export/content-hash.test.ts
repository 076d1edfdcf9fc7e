import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { canonicalJson, CanonicalJsonError, contentHash, sha256Hex } from '@/features/rationale-export/content-hash';
import type { ChannelPlan } from '@/lib/engine/plan';
import type { ChannelReport } from '@/lib/engine/report';

/** Python's json + hashlib, an implementation independent of ours. */
function pythonCanonicalHash(value: unknown): { text: string; hash: string } {
  const script = [
    'import json, hashlib, sys',
    'v = json.load(sys.stdin)',
    "t = json.dumps(v, sort_keys=True, separators=(',', ':'), ensure_ascii=False)",
    "print(json.dumps({'text': t, 'hash': hashlib.sha256(t.encode('utf-8')).hexdigest()}))",
  ].join('\n');
  const out = execFileSync('/usr/bin/python3', ['-c', script], { input: JSON.stringify(value), encoding: 'utf8' });
  return JSON.parse(out) as { text: string; hash: string };
}

describe('sha256Hex', () => {
  it('matches the FIPS 180-2 example digests', () => {
    // FIPS 180-2, appendix B.1 ("abc") and B.2 (the 448-bit message).
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
  });
});

describe('canonicalJson', () => {
  it('sorts keys at every depth and writes no whitespace', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: true, y: null }], c: 'x' } })).toBe('{"a":{"c":"x","d":[3,{"y":null,"z":true}]},"b":1}');
  });

  it('agrees with Python json.dumps(sort_keys=True) on text, nesting and non-ASCII units', () => {
    const value = { zeta: [1, 2.5, -3], alpha: { 'µV': 'Ω ∥ √Hz', nested: { b: false, a: 'line\nbreak "quoted"' } }, Beta: 0.125, empty: {}, list: [] };
    const reference = pythonCanonicalHash(value);
    expect(canonicalJson(value)).toBe(reference.text);
    expect(sha256Hex(canonicalJson(value))).toBe(reference.hash);
  });

  it('leaves out undefined object values, writes null for undefined array items, and Dates as ISO text', () => {
    expect(canonicalJson({ a: undefined, b: [undefined, 1], c: new Date('2025-03-04T05:06:07.000Z') })).toBe('{"b":[null,1],"c":"2025-03-04T05:06:07.000Z"}');
  });

  it('writes -0 as 0 (RFC 8785)', () => {
    expect(canonicalJson({ x: -0 })).toBe('{"x":0}');
  });

  it('refuses values JSON cannot hold and names their path', () => {
    expect(() => canonicalJson({ report: { noise: { rtiRmsV: Number.NaN } } })).toThrow(new CanonicalJsonError('report.noise.rtiRmsV', 'NaN cannot be written as JSON'));
    expect(() => canonicalJson({ a: [1, Infinity] })).toThrow('a[1]: Infinity cannot be written as JSON');
    expect(() => canonicalJson({ n: 10n })).toThrow('n: a bigint cannot be written as JSON');
    const cyclic: Record<string, unknown> = { a: 1 };
    cyclic.self = cyclic;
    expect(() => canonicalJson(cyclic)).toThrow('self: the value refers to itself (a cycle)');
    expect(() => canonicalJson(undefined)).toThrow(CanonicalJsonError);
  });

  it('accepts the same object twice when it is not a cycle', () => {
    const shared = { v: 1 };
    expect(canonicalJson({ a: shared, b: shared })).toBe('{"a":{"v":1},"b":{"v":1}}');
  });
});

describe('contentHash', () => {
  const plan = { schemaVersion: 1, name: 'P', mainsHz: 50, electrodes: { offsetV: 0.3, rsOhm: 1000 } } as unknown as ChannelPlan;
  const report = { engineVersion: '1', checks: [{ id: 'noise', value: 0.25 }] } as unknown as ChannelReport;

  it('does not depend on key order', () => {
    const reordered = JSON.parse('{"mainsHz":50,"electrodes":{"rsOhm":1000,"offsetV":0.3},"name":"P","schemaVersion":1}') as ChannelPlan;
    expect(Object.keys(reordered)[0]).toBe('mainsHz');
    expect(contentHash({ plan: reordered, report })).toBe(contentHash({ plan, report }));
    expect(contentHash({ report, plan } as { plan: ChannelPlan; report: ChannelReport })).toBe(contentHash({ plan, report }));
  });

  it('equals SHA-256 of the canonical text of { plan, report } computed by Python', () => {
    expect(contentHash({ plan, report })).toBe(pythonCanonicalHash({ plan, report }).hash);
  });

  it('changes when any value changes', () => {
    const changed = { ...plan, electrodes: { offsetV: 0.3, rsOhm: 1001 } } as unknown as ChannelPlan;
    expect(contentHash({ plan: changed, report })).not.toBe(contentHash({ plan, report }));
  });

  it('is 64 lowercase hex digits', () => {
    expect(contentHash({ plan, report })).toMatch(/^[0-9a-f]{64}$/);
  });
});
