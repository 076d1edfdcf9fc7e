/**
 * Bench records against the real test MariaDB: upload of a generated CSV and EDF record to a
 * revision (stored in chunks, analysed with the revision's conditions, compared with its report),
 * refusals that store nothing (malformed EDF and CSV, not a record, over 20 MB, roles), reading per
 * role (regulators: released revisions only), withdrawal, and the rows for the rationale export.
 *
 * The test signals are sums of sinusoids, so the expected measurements are closed forms independent
 * of the analysis code: a sine of amplitude A has rms A/√2 and peak-to-peak 2A; the mean of a whole
 * number of cycles is zero, so the offset is the added DC.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { channelPlans, planRevisions } from '@/db/schema';
import { eq } from 'drizzle-orm';
import { writeEdf } from '@/lib/bench/edf';
import type { Role } from '@/lib/auth/roles';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const revisionRecords = await import('@/app/api/revisions/[revisionId]/bench-records/route');
const comparisonRoute = await import('@/app/api/revisions/[revisionId]/bench-records/comparison/route');
const recordRoute = await import('@/app/api/bench-records/[recordId]/route');
const withdrawRoute = await import('@/app/api/bench-records/[recordId]/withdraw/route');
const exportRoute = await import('@/app/api/revisions/[revisionId]/export/route');

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let draftRevisionId: number;
let releasedRevisionId: number;
let report: { worstCaseInputV: number; noise: { rtiRmsV: number; rtiPpV: number }; interference: { rtiPpV: number } };

const signInAs = (role: Role | 'signed-out') => {
  session.current = role === 'signed-out' ? null : { userId: seeded.userIds[role], workspaceId: seeded.workspaceId };
};

beforeAll(async () => {
  await resetTestDatabase();
  const db = getDb();
  seeded = await seedDemoWorkspace(db);
  const data = await seedWorkspaceData(db, { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
  // The wearable patch: monitoring-ECG profile (band 0.67–40 Hz, 10 s noise window), 50 Hz mains.
  const planId = data.planIds['wearable-ecg-patch'];
  const [plan] = await db.select().from(channelPlans).where(eq(channelPlans.id, planId));
  report = plan.report as typeof report;
  const revision = (sequence: number, label: string, state: 'draft' | 'released') => ({
    workspaceId: seeded.workspaceId,
    planId,
    sequence,
    label,
    changeSummary: `test revision ${label}`,
    planVersion: plan.version,
    plan: plan.plan,
    report: plan.report,
    contentHash: createHash('sha256').update(JSON.stringify({ plan: plan.plan, report: plan.report })).digest('hex'),
    worstVerdict: plan.worstVerdict,
    createdByUserId: seeded.userIds.engineer,
    state,
  });
  [{ id: releasedRevisionId }] = await db.insert(planRevisions).values(revision(1, 'A', 'released')).$returningId();
  [{ id: draftRevisionId }] = await db.insert(planRevisions).values(revision(2, 'B', 'draft')).$returningId();
});
afterAll(closeDb);

// The test record, referred to input: 20 mV DC + 30 µV at 10 Hz (in band) + 8 µV at 50 Hz (mains), 500 Hz, 12 s.
// The in-band tone is a cosine over whole cycles, so the mirrored extension the noise filter uses is smooth
// (a sine would have a kink at each end, and the brick-wall band limit rings there: its peak-to-peak
// then reads about 4 % high, a property of the method, not of the upload path).
const fsHz = 500;
const durationS = 12;
const dcV = 20e-3;
const inBandAmplitudeV = 30e-6;
const mainsAmplitudeV = 8e-6;
function inputSignalV(n = fsHz * durationS): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / fsHz;
    x[i] = dcV + inBandAmplitudeV * Math.cos(2 * Math.PI * 10 * t) + mainsAmplitudeV * Math.sin(2 * Math.PI * 50 * t + 0.3);
  }
  return x;
}

type Upload = { content: BlobPart; name: string; fields: Record<string, string> };
function upload(revisionId: number, { content, name, fields }: Upload) {
  const form = new FormData();
  form.set('file', new File([content], name));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return revisionRecords.POST(new Request('http://test.invalid/api', { method: 'POST', body: form }), { params: Promise.resolve({ revisionId: String(revisionId) }) });
}
const revisionCtx = (id: number) => ({ params: Promise.resolve({ revisionId: String(id) }) });
const recordCtx = (id: number | string) => ({ params: Promise.resolve({ recordId: String(id) }) });

async function counts() {
  const [row] = await rawQuery<{ records: number; chunks: number; audit: number }>(
    'SELECT (SELECT COUNT(*) FROM bench_records) AS records, (SELECT COUNT(*) FROM bench_record_chunks) AS chunks, (SELECT COUNT(*) FROM audit_events) AS audit',
  );
  return { records: Number(row.records), chunks: Number(row.chunks), audit: Number(row.audit) };
}

/** The output-side CSV: time in s, channel in mV after a gain of 100 V/V. */
function outputCsv(): string {
  const x = inputSignalV();
  const lines = ['time (s),ch1'];
  for (let i = 0; i < x.length; i++) lines.push(`${(i / fsHz).toFixed(4)},${(x[i] * 100 * 1e3).toPrecision(9)}`);
  return lines.join('\n');
}

function expectMeasurements(record: { analysis: Record<string, any>; comparison: any[] }) {
  const a = record.analysis;
  // Closed forms (see the file comment), 0.5 % tolerance for the band-limiting and window edges.
  expect(a.offsetV / dcV).toBeCloseTo(1, 3);
  expect(a.noiseRmsV / (inBandAmplitudeV / Math.SQRT2)).toBeGreaterThan(0.995);
  expect(a.noiseRmsV / (inBandAmplitudeV / Math.SQRT2)).toBeLessThan(1.005);
  expect(a.noisePpV / (2 * inBandAmplitudeV)).toBeGreaterThan(0.99);
  expect(a.noisePpV / (2 * inBandAmplitudeV)).toBeLessThan(1.01);
  expect(a.mains.frequencyHz).toBeCloseTo(50, 2);
  expect(a.mains.ppV / (2 * mainsAmplitudeV)).toBeCloseTo(1, 2);
  expect(a.windowS).toBeCloseTo(10, 6);
  expect(a.conditions).toMatchObject({ bandLowHz: 0.67, bandHighHz: 40, mainsHz: 50, profileWindowS: 10 });

  const rows = Object.fromEntries(record.comparison.map((r) => [r.quantity, r]));
  expect(rows.offsetV.predicted).toBe(report.worstCaseInputV);
  expect(rows.noiseRmsV.predicted).toBe(report.noise.rtiRmsV);
  expect(rows.noisePpV.predicted).toBe(report.noise.rtiPpV);
  expect(rows.mainsPpV.predicted).toBe(Math.abs(report.interference.rtiPpV));
  expect(rows.noiseRmsV.ratio).toBeCloseTo(a.noiseRmsV / report.noise.rtiRmsV, 12);
  // The offset prediction is a worst-case bound (≈ 0.3 V electrode offset for this plan): 20 mV is within.
  expect(report.worstCaseInputV).toBeGreaterThan(dcV);
  expect(rows.offsetV.verdict).toBe('within');
}

let csvRecordId: string;
let edfRecordId: string;

describe('POST /api/revisions/[revisionId]/bench-records', () => {
  it('stores and analyses a generated CSV recorded after a gain of 100 (values in mV, gain to apply)', async () => {
    signInAs('engineer');
    const before = await counts();
    const csv = outputCsv();
    const response = await upload(draftRevisionId, { content: csv, name: 'bench-run-1.csv', fields: { unit: 'mV', gainMode: 'gain-to-apply', gainVPerV: '100', note: 'first prototype' } });
    expect(response.status).toBe(201);
    const { record } = await response.json();
    csvRecordId = record.id;
    expect(record).toMatchObject({ format: 'csv', channel: 'ch1', unit: 'mV', gainMode: 'gain-to-apply', gainVPerV: 100, revisionLabel: 'B', withdrawn: null });
    expectMeasurements(record);
    expect(await counts()).toEqual({ records: before.records + 1, chunks: before.chunks + 1, audit: before.audit + 1 });
    const [stored] = await rawQuery<{ sha: string; len: number }>('SELECT sha256 AS sha, byte_length AS len FROM bench_records WHERE id = ?', [record.id]);
    const bytes = new TextEncoder().encode(csv);
    expect(stored).toEqual({ sha: createHash('sha256').update(bytes).digest('hex'), len: bytes.length });
  });

  it('stores and analyses an EDF written by writeEdf (µV, referred to input), larger than one 4 MiB chunk', async () => {
    signInAs('engineer');
    const before = await counts();
    // 2,500 s at 500 Hz in two signals (a non-voltage one first) ≈ 5 MB: the bytes span two chunks.
    const x = inputSignalV(fsHz * 2500);
    const edf = writeEdf({
      recordDurationS: 1,
      signals: [
        { label: 'ECG lead I', samplesV: x, sampleRateHz: fsHz, physicalDimension: 'uV', physicalMinV: 0, physicalMaxV: 0.05 },
        { label: 'ECG lead II', samplesV: new Float64Array(x.length), sampleRateHz: fsHz, physicalDimension: 'uV', physicalMinV: -0.01, physicalMaxV: 0.01 },
      ],
    });
    if (!edf.ok) throw new Error(edf.message);
    expect(edf.bytes.length).toBeGreaterThan(4 * 1024 * 1024);
    const response = await upload(draftRevisionId, { content: edf.bytes as BlobPart, name: 'bench-run-2.edf', fields: { gainMode: 'referred-to-input', channel: 'ECG lead I' } });
    expect(response.status).toBe(201);
    const { record } = await response.json();
    edfRecordId = record.id;
    expect(record).toMatchObject({ format: 'edf', channel: 'ECG lead I', unit: null, gainVPerV: 1 });
    // 16-bit quantization over 50 mV: LSB = 0.05 V / 65535 ≈ 0.76 µV (EDF: Kemp et al. 1992), far below the 0.5 % tolerances.
    expectMeasurements(record);
    expect(await counts()).toEqual({ records: before.records + 1, chunks: before.chunks + 2, audit: before.audit + 1 });
    const chunks = await rawQuery<{ bytes: Buffer }>('SELECT bytes FROM bench_record_chunks WHERE record_id = ? ORDER BY sequence', [record.id]);
    expect(createHash('sha256').update(Buffer.concat(chunks.map((c) => c.bytes))).digest('hex')).toBe(createHash('sha256').update(edf.bytes).digest('hex'));
  });

  it('returns the record with its trace (µV-scale, referred to input) and spectrum, recomputed from the stored bytes', async () => {
    signInAs('reviewer');
    const response = await recordRoute.GET(new Request('http://test.invalid/api'), recordCtx(edfRecordId));
    expect(response.status).toBe(200);
    const { record } = await response.json();
    expect(record.trace.tS.length).toBeLessThanOrEqual(4000);
    const max = Math.max(...record.trace.inputV);
    const min = Math.min(...record.trace.inputV);
    // Peak of the sum of the two sines is at most their amplitudes' sum, above the DC.
    expect(max - dcV).toBeLessThanOrEqual(inBandAmplitudeV + mainsAmplitudeV + 1e-6);
    expect(max - min).toBeGreaterThan(1.8 * inBandAmplitudeV);
    const spectrum = record.spectrum as { frequencyHz: number[]; asdVPerRtHz: number[] };
    expect(spectrum.frequencyHz.length).toBeGreaterThan(10);
    const at = (f: number) => spectrum.asdVPerRtHz[spectrum.frequencyHz.reduce((best, v, i) => (Math.abs(v - f) < Math.abs(spectrum.frequencyHz[best] - f) ? i : best), 0)];
    expect(at(10)).toBeGreaterThan(10 * at(25));
  });

  const malformed: Array<[string, () => Upload, RegExp]> = [
    ['a truncated EDF', () => {
      const edf = writeEdf({ recordDurationS: 1, signals: [{ label: 'ECG', samplesV: inputSignalV(), sampleRateHz: fsHz, physicalDimension: 'uV' }] });
      if (!edf.ok) throw new Error(edf.message);
      return { content: edf.bytes.subarray(0, edf.bytes.length - 1000) as BlobPart, name: 'cut.edf', fields: { gainMode: 'referred-to-input' } };
    }, /EDF/],
    ['an EDF whose header is cut inside the fixed part', () => ({ content: '0       ' + 'x'.repeat(100), name: 'header.edf', fields: { gainMode: 'referred-to-input' } }), /truncated|EDF/],
    ['a CSV with a text cell', () => ({ content: outputCsv().replace(/\n1\.0000,[^\n]+/, '\n1.0000,n/a'), name: 'text.csv', fields: { unit: 'mV', gainMode: 'gain-to-apply', gainVPerV: '100' } }), /row 502/],
    ['a CSV with ragged rows', () => ({ content: outputCsv().replace(/\n2\.0000,([^\n]+)/, '\n2.0000,$1,7'), name: 'ragged.csv', fields: { unit: 'mV', gainMode: 'gain-to-apply', gainVPerV: '100' } }), /row 1002/],
    ['neither EDF nor CSV (PNG bytes)', () => ({ content: new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]) as BlobPart, name: 'record.csv', fields: { unit: 'V', gainMode: 'referred-to-input' } }), /neither EDF nor CSV/],
    ['a CSV without its unit', () => ({ content: outputCsv(), name: 'nounit.csv', fields: { gainMode: 'referred-to-input' } }), /unit is required/],
    ['a gain to apply without the gain', () => ({ content: outputCsv(), name: 'nogain.csv', fields: { unit: 'mV', gainMode: 'gain-to-apply' } }), /gain is required/],
  ];
  it.each(malformed)('refuses %s with the reader\'s message and stores nothing', async (_what, make, message) => {
    signInAs('engineer');
    const before = await counts();
    const response = await upload(draftRevisionId, make());
    expect(response.status).toBe(422);
    const { error } = await response.json();
    expect(error.message).toMatch(message);
    expect(await counts()).toEqual(before);
  });

  it('refuses a file over 20 MB and stores nothing', async () => {
    signInAs('engineer');
    const before = await counts();
    const big = new Uint8Array(20 * 1024 * 1024 + 1).fill(0x31);
    const response = await upload(draftRevisionId, { content: big as BlobPart, name: 'big.csv', fields: { unit: 'V', gainMode: 'referred-to-input' } });
    expect(response.status).toBe(422);
    expect((await response.json()).error.message).toMatch(/the limit is 20 MB/);
    expect(await counts()).toEqual(before);
  });

  it.each(['reviewer', 'regulator'] as const)('refuses a %s upload with 403 and stores nothing', async (role) => {
    signInAs(role);
    const before = await counts();
    const response = await upload(releasedRevisionId, { content: outputCsv(), name: 'r.csv', fields: { unit: 'mV', gainMode: 'gain-to-apply', gainVPerV: '100' } });
    expect(response.status).toBe(403);
    expect(await counts()).toEqual(before);
  });

  it('an unknown or foreign revision id is 404', async () => {
    signInAs('engineer');
    const response = await upload(999999, { content: outputCsv(), name: 'r.csv', fields: { unit: 'mV', gainMode: 'gain-to-apply', gainVPerV: '100' } });
    expect(response.status).toBe(404);
  });
});

describe('reading, withdrawing and the export rows', () => {
  it('lists the revision\'s records; a regulator may read a released revision\'s records only', async () => {
    signInAs('reviewer');
    const list = await (await revisionRecords.GET(new Request('http://test.invalid/api'), revisionCtx(draftRevisionId))).json();
    expect(list.records.map((r: { id: string }) => r.id)).toEqual([edfRecordId, csvRecordId]);
    signInAs('regulator');
    expect((await revisionRecords.GET(new Request('http://test.invalid/api'), revisionCtx(draftRevisionId))).status).toBe(403);
    expect((await recordRoute.GET(new Request('http://test.invalid/api'), recordCtx(csvRecordId))).status).toBe(403);
    expect((await revisionRecords.GET(new Request('http://test.invalid/api'), revisionCtx(releasedRevisionId))).status).toBe(200);
  });

  it('the export rows come from the newest record that is not withdrawn', async () => {
    signInAs('engineer');
    const first = await (await comparisonRoute.GET(new Request('http://test.invalid/api'), revisionCtx(draftRevisionId))).json();
    expect(first.bench.record.id).toBe(edfRecordId);
    expect(first.bench.rows).toHaveLength(4);
    for (const row of first.bench.rows) expect(Object.keys(row).sort()).toEqual(['measured', 'predicted', 'quantity', 'ratio', 'unit', 'within']);
    const offsetRow = first.bench.rows.find((r: { quantity: string }) => /offset/i.test(r.quantity));
    expect(offsetRow.measured / dcV).toBeCloseTo(1, 3);
    expect(offsetRow.within).toBe(true);

    signInAs('reviewer');
    expect((await withdrawRoute.POST(new Request('http://test.invalid/api', { method: 'POST', body: JSON.stringify({ reason: 'x' }) }), recordCtx(edfRecordId))).status).toBe(403);
    signInAs('engineer');
    const empty = await withdrawRoute.POST(new Request('http://test.invalid/api', { method: 'POST', body: JSON.stringify({ reason: '  ' }) }), recordCtx(edfRecordId));
    expect(empty.status).toBe(422);
    expect((await empty.json()).error.message).toBe('reason: reason is required: say why the record is withdrawn');
    const withdrawn = await withdrawRoute.POST(new Request('http://test.invalid/api', { method: 'POST', body: JSON.stringify({ reason: 'probe slipped' }) }), recordCtx(edfRecordId));
    expect(withdrawn.status).toBe(200);
    expect((await withdrawn.json()).record.withdrawn).toMatchObject({ reason: 'probe slipped' });
    expect((await withdrawRoute.POST(new Request('http://test.invalid/api', { method: 'POST', body: JSON.stringify({ reason: 'again' }) }), recordCtx(edfRecordId))).status).toBe(409);

    const after = await (await comparisonRoute.GET(new Request('http://test.invalid/api'), revisionCtx(draftRevisionId))).json();
    expect(after.bench.record.id).toBe(csvRecordId);
    const none = await (await comparisonRoute.GET(new Request('http://test.invalid/api'), revisionCtx(releasedRevisionId))).json();
    expect(none.bench).toBeNull();
  });

  it('the design-rationale export carries the newest bench comparison, and says so when there is none', async () => {
    signInAs('reviewer');
    const exported = await exportRoute.GET(new Request('http://test.invalid/api?format=json'), revisionCtx(draftRevisionId));
    expect(exported.status).toBe(200);
    const doc = JSON.parse(await exported.text());
    const comparison = await (await comparisonRoute.GET(new Request('http://test.invalid/api'), revisionCtx(draftRevisionId))).json();
    // The EDF record was withdrawn above: the CSV record's rows are the ones exported.
    expect(doc.bench.recordName).toMatch(/^bench-run-1\.csv \(channel .+, uploaded \d{4}-\d\d-\d\d \d\d:\d\d UTC\)$/);
    expect(doc.bench.rows).toEqual(comparison.bench.rows);
    expect(doc.bench.rows.every((r: { unit: string }) => r.unit === 'V')).toBe(true);

    const released = JSON.parse(await (await exportRoute.GET(new Request('http://test.invalid/api?format=json'), revisionCtx(releasedRevisionId))).text());
    expect(released.bench).toBeUndefined();
  });

  it('the database keeps records: raw DELETE and content UPDATE are refused', async () => {
    await expect(rawQuery('DELETE FROM bench_records WHERE id = ?', [csvRecordId])).rejects.toThrow(/DELETE refused/);
    await expect(rawQuery('DELETE FROM bench_record_chunks')).rejects.toThrow(/DELETE refused/);
    await expect(rawQuery('UPDATE bench_records SET gain_v_per_v = 1 WHERE id = ?', [csvRecordId])).rejects.toThrow(/UPDATE refused/);
    expect((await counts()).records).toBe(2);
  });
});
