/**
 * Canonical JSON and the content hash of a revision. Server-side (node:crypto).
 *
 * The canonical form follows the rules of RFC 8785 (JSON Canonicalization Scheme) for the data a
 * plan and a report hold: object keys sorted by UTF-16 code units, no whitespace, numbers written
 * as ECMAScript writes them (`JSON.stringify`), strings escaped as `JSON.stringify` escapes them.
 * Keys whose value is `undefined` are left out (as `JSON.stringify` does), so an optional field that
 * is absent and one that is `undefined` hash alike. Values JSON cannot hold faithfully (NaN,
 * Infinity, bigint, functions, symbols, cycles) are refused with the path of the offending value
 * instead of being silently turned into `null`.
 */
import { createHash } from 'node:crypto';
import type { ChannelPlan } from '@/lib/engine/plan';
import type { ChannelReport } from '@/lib/engine/report';

/** Thrown when a value has no faithful canonical JSON form; `path` is dotted (`report.noise.rtiRmsV`). */
export class CanonicalJsonError extends Error {
  readonly path: string;
  constructor(path: string, reason: string) {
    super(`${path || 'value'}: ${reason}`);
    this.name = 'CanonicalJsonError';
    this.path = path;
  }
}

function join(path: string, key: string | number): string {
  return typeof key === 'number' ? `${path}[${key}]` : path ? `${path}.${key}` : key;
}

function write(value: unknown, path: string, stack: Set<object>): string | undefined {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'string':
      return JSON.stringify(value);
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw new CanonicalJsonError(path, `${value} cannot be written as JSON`);
      return JSON.stringify(value); // -0 → "0", as RFC 8785 asks
    case 'undefined':
      return undefined;
    case 'bigint':
    case 'function':
    case 'symbol':
      throw new CanonicalJsonError(path, `a ${typeof value} cannot be written as JSON`);
    default:
      break;
  }
  const obj = value as object;
  if (stack.has(obj)) throw new CanonicalJsonError(path, 'the value refers to itself (a cycle)');
  const withToJson = obj as { toJSON?: () => unknown };
  if (typeof withToJson.toJSON === 'function') return write(withToJson.toJSON(), path, stack); // Date → ISO text
  stack.add(obj);
  try {
    if (Array.isArray(obj)) {
      // Inside arrays `undefined` becomes null, as in JSON.stringify.
      return `[${obj.map((item, i) => write(item, join(path, i), stack) ?? 'null').join(',')}]`;
    }
    const record = obj as Record<string, unknown>;
    // Default sort compares UTF-16 code units, which is the order RFC 8785 prescribes.
    const keys = Object.keys(record).sort();
    const parts: string[] = [];
    for (const key of keys) {
      const text = write(record[key], join(path, key), stack);
      if (text !== undefined) parts.push(`${JSON.stringify(key)}:${text}`);
    }
    return `{${parts.join(',')}}`;
  } finally {
    stack.delete(obj);
  }
}

/**
 * Canonical JSON text of a value: sorted keys, no whitespace.
 * @param value any JSON-like value
 * @returns the canonical text
 * @throws CanonicalJsonError naming the path of a value JSON cannot hold
 * @example canonicalJson({ b: 1, a: [true, null] }) // '{"a":[true,null],"b":1}'
 */
export function canonicalJson(value: unknown): string {
  const text = write(value, '', new Set());
  if (text === undefined) throw new CanonicalJsonError('', 'undefined cannot be written as JSON');
  return text;
}

/**
 * SHA-256 of a text's UTF-8 bytes (FIPS 180-4), as 64 lowercase hexadecimal digits.
 * @example sha256Hex('abc') // 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'
 */
export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/**
 * The content hash of a revision: SHA-256 of the canonical JSON of `{ plan, report }`.
 * Two revisions with the same plan and report have the same hash whatever the key order; any
 * changed value changes it. Signatures record the hash the signer saw.
 * @param content the plan (as validated, defaults applied) and the engine's report for it
 * @returns 64 lowercase hexadecimal digits
 * @throws CanonicalJsonError when the content holds a value JSON cannot hold (NaN, Infinity, ...)
 */
export function contentHash(content: { plan: ChannelPlan; report: ChannelReport }): string {
  return sha256Hex(canonicalJson({ plan: content.plan, report: content.report }));
}
