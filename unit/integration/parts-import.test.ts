/**
 * Part library against the real test MariaDB: CSV import through the route handler (preview, then
 * all-or-nothing import with one audit event and the remembered mapping), refusals (bad rows, size,
 * row count, non-CSV content, roles), the template per kind, and create / edit / retire per role.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import type { Role } from '@/lib/auth/roles';
import { partFieldSpecs, partKinds } from '@/lib/parts/part-kinds';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const importRoute = await import('@/app/api/parts/import/route');
const templateRoute = await import('@/app/api/parts/template/route');
const partsRoute = await import('@/app/api/parts/route');
const partRoute = await import('@/app/api/parts/[partId]/route');
const retireRoute = await import('@/app/api/parts/[partId]/retire/route');

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
const signInAs = (role: Role | 'signed-out') => {
  session.current = role === 'signed-out' ? null : { userId: seeded.userIds[role], workspaceId: seeded.workspaceId };
};

beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
});
afterAll(closeDb);

type Upload = { content: string | Uint8Array; name?: string; kind?: string; mode?: 'preview' | 'import'; mapping?: Record<string, string | null> };
function importRequest({ content, name = 'parts.csv', kind = 'electrode', mode = 'preview', mapping }: Upload) {
  const form = new FormData();
  form.set('file', new File([content as BlobPart], name, { type: 'text/csv' }));
  form.set('kind', kind);
  form.set('mode', mode);
  if (mapping) form.set('mapping', JSON.stringify(mapping));
  return importRoute.POST(new Request('http://test.invalid/api/parts/import', { method: 'POST', body: form }));
}

async function counts() {
  const [row] = await rawQuery<{ parts: number; audit: number; mappings: number }>(
    'SELECT (SELECT COUNT(*) FROM parts) AS parts, (SELECT COUNT(*) FROM audit_events) AS audit, (SELECT COUNT(*) FROM part_import_mappings) AS mappings',
  );
  return { parts: Number(row.parts), audit: Number(row.audit), mappings: Number(row.mappings) };
}
const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value);
async function storedPart(name: string) {
  const [row] = await rawQuery<{ id: number; kind: string; status: string; source_note: string; values: unknown; retired_at: Date | null }>(
    'SELECT id, kind, status, source_note, `values`, retired_at FROM parts WHERE name = ?',
    [name],
  );
  return row ? { ...row, values: asJson(row.values) as Record<string, number | string> } : undefined;
}

const electrodeHeader = 'name,description,sourceNote,status,electrodeType,rsOhm,rpOhm,cpF,offsetTypicalV,offsetMaxV';
const goodElectrodes = [
  electrodeHeader,
  'test wet electrode A,Ag/AgCl gel,assumed for test,approved,wet-gel,200 Ω,2.2 MΩ,47 nF,5 mV,100 mV',
  'test dry electrode B,,measured on the bench,under-evaluation,dry,1 kΩ,10 MΩ,4.7 nF,50 mV,300 mV',
  'test textile electrode C,woven,assumed for test,not-for-new-designs,textile,5 kΩ,680 kΩ,100 nF,20 mV,0.25 V',
].join('\n');

describe('POST /api/parts/import', () => {
  it('previews a good file with the suggested mapping and no problems, writing nothing', async () => {
    signInAs('engineer');
    const before = await counts();
    const response = await importRequest({ content: goodElectrodes });
    expect(response.status).toBe(200);
    const { preview } = await response.json();
    expect(preview).toMatchObject({ kind: 'electrode', refused: false, validCount: 3, problems: [], mappingSource: 'suggested' });
    expect(preview.mapping).toMatchObject({ name: 'name', rsOhm: 'rsOhm', cpF: 'cpF', sourceNote: 'sourceNote' });
    expect(await counts()).toEqual(before);
  });

  it('imports a good file: every part with its values in SI units, one audit event, the mapping remembered', async () => {
    signInAs('engineer');
    const before = await counts();
    const response = await importRequest({ content: goodElectrodes, mode: 'import' });
    expect(response.status).toBe(201);
    const body = await response.json();
    expect(body).toMatchObject({ kind: 'electrode', imported: 3 });
    expect(await counts()).toEqual({ parts: before.parts + 3, audit: before.audit + 1, mappings: before.mappings + 1 });

    // SI prefixes (BIPM, The International System of Units, 9th ed., table 7): M = 1e6, k = 1e3, n = 1e-9, m = 1e-3.
    const a = await storedPart('test wet electrode A');
    expect(a).toMatchObject({ kind: 'electrode', status: 'approved', source_note: 'assumed for test' });
    expect(a!.values.electrodeType).toBe('wet-gel');
    expect(a!.values.rsOhm).toBeCloseTo(200, 9);
    expect(a!.values.rpOhm as number).toBeCloseTo(2.2e6, 3);
    expect((a!.values.cpF as number) / 47e-9).toBeCloseTo(1, 12);
    expect((a!.values.offsetMaxV as number) / 0.1).toBeCloseTo(1, 12);
    const c = await storedPart('test textile electrode C');
    expect(c!.values.offsetMaxV).toBeCloseTo(0.25, 12);
    expect(c!.status).toBe('not-for-new-designs');

    const [audit] = await rawQuery<{ action: string; actor: number; after: unknown }>(
      'SELECT action, actor_user_id AS actor, `after` FROM audit_events ORDER BY id DESC LIMIT 1',
    );
    const after = asJson(audit.after) as { kind: string; count: number; fileName: string; fileSha256: string; parts: { id: number; name: string }[] };
    expect(audit.action).toBe('parts.imported');
    expect(Number(audit.actor)).toBe(seeded.userIds.engineer);
    expect(after).toMatchObject({ kind: 'electrode', count: 3, fileName: 'parts.csv' });
    expect(after.fileSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(after.parts.map((p) => p.name)).toEqual(['test wet electrode A', 'test dry electrode B', 'test textile electrode C']);
    expect(after.parts[0].id).toBe(Number(a!.id));
  });

  it('starts the next import of the kind from the remembered mapping', async () => {
    signInAs('engineer');
    // A file whose headers suggest nothing; the engineer maps them by hand and imports.
    const custom = ['Label,Kind of electrode,R series (kΩ),R parallel,C parallel,Typ offset,Max offset,Origin,State', 'mapped electrode D,hydrogel,2.5,1 MΩ,22 nF,10 mV,150 mV,assumed,approved'].join('\n');
    const mapping = {
      Label: 'name',
      'Kind of electrode': 'electrodeType',
      'R series (kΩ)': 'rsOhm',
      'R parallel': 'rpOhm',
      'C parallel': 'cpF',
      'Typ offset': 'offsetTypicalV',
      'Max offset': 'offsetMaxV',
      Origin: 'sourceNote',
      State: 'status',
    };
    const imported = await importRequest({ content: custom, mode: 'import', mapping });
    expect(imported.status).toBe(201);
    // "2.5" under a "(kΩ)" header is 2.5 kΩ = 2500 Ω.
    expect((await storedPart('mapped electrode D'))!.values.rsOhm).toBeCloseTo(2500, 9);

    const again = custom.replace('mapped electrode D', 'mapped electrode E');
    const response = await importRequest({ content: again });
    const { preview } = await response.json();
    expect(preview.mappingSource).toBe('remembered');
    expect(preview.mapping).toEqual(mapping);
    expect(preview).toMatchObject({ validCount: 1, problems: [] });
    const [{ n }] = await rawQuery<{ n: number }>('SELECT COUNT(*) AS n FROM part_import_mappings WHERE kind = ?', ['electrode']);
    expect(Number(n)).toBe(1);
  });

  it('a file with bad rows writes nothing and lists every bad row and cell with the reason', async () => {
    signInAs('engineer');
    const before = await counts();
    const bad = [
      electrodeHeader,
      'fine electrode F,,assumed,approved,dry,1 kΩ,1 MΩ,10 nF,10 mV,100 mV',
      'bad unit G,,assumed,approved,dry,1 kF,1 MΩ,10 nF,10 mV,100 mV',
      'bad status H,,assumed,obsolete,dry,1 kΩ,1 MΩ,10 nF,10 mV,100 mV',
      'bad range I,,assumed,approved,dry,1 kΩ,1 MΩ,10 nF,200 mV,100 mV',
      'test wet electrode A,,assumed,approved,dry,1 kΩ,1 MΩ,10 nF,10 mV,100 mV',
      'short row J,,assumed',
    ].join('\n');
    const response = await importRequest({ content: bad, mode: 'import' });
    expect(response.status).toBe(422);
    const body = await response.json();
    expect(body.error.message).toMatch(/nothing was imported/);
    const problems = body.preview.problems as { row: number; column: string; value: string; message: string }[];
    const byRow = (row: number) => problems.filter((p) => p.row === row);
    expect(problems.map((p) => p.row).sort()).toEqual([3, 4, 5, 6, 7]);
    expect(byRow(3)[0]).toMatchObject({ column: 'rsOhm', value: '1 kF' });
    expect(byRow(3)[0].message).toMatch(/series resistance/);
    expect(byRow(4)[0]).toMatchObject({ column: 'status', value: 'obsolete' });
    expect(byRow(4)[0].message).toMatch(/status must be one of approved, under-evaluation, not-for-new-designs/);
    expect(byRow(5)[0]).toMatchObject({ column: 'offsetMaxV' });
    expect(byRow(5)[0].message).toBe('maximum offset must not be below the typical offset');
    expect(byRow(6)[0].message).toMatch(/already exists in the library/);
    expect(byRow(7)[0].message).toMatch(/row has 3 values; the header has 10 columns/);
    expect(await counts()).toEqual(before);
    expect(await storedPart('fine electrode F')).toBeUndefined();
  });

  it('refuses a file over 2 MB, and one over 5,000 rows, naming the limit; nothing written', async () => {
    signInAs('engineer');
    const before = await counts();
    const row = 'big electrode,,assumed,approved,dry,1 kΩ,1 MΩ,10 nF,10 mV,100 mV\n';
    const oversized = electrodeHeader + '\n' + row.repeat(Math.ceil((2 * 1024 * 1024) / row.length) + 10);
    expect(new TextEncoder().encode(oversized).length).toBeGreaterThan(2 * 1024 * 1024);
    const big = await importRequest({ content: oversized, mode: 'import' });
    expect(big.status).toBe(422);
    expect((await big.json()).error.message).toMatch(/the limit is 2 MB/);

    const manyRows = electrodeHeader + '\n' + Array.from({ length: 5001 }, (_, i) => row.replace('big electrode', `row ${i}`)).join('');
    expect(new TextEncoder().encode(manyRows).length).toBeLessThan(2 * 1024 * 1024);
    const many = await importRequest({ content: manyRows, mode: 'import' });
    expect(many.status).toBe(422);
    const body = await many.json();
    expect(body.preview.refused).toBe(true);
    expect(body.error.message).toMatch(/5,001 data rows; the limit is 5,000/);
    expect(await counts()).toEqual(before);
  });

  it('refuses content that is not CSV text whatever its name; nothing written', async () => {
    signInAs('engineer');
    const before = await counts();
    // The first bytes of a PNG file (PNG specification, 5.2: signature 89 50 4E 47 0D 0A 1A 0A), then an IHDR chunk.
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 1, 0]);
    const response = await importRequest({ content: png, name: 'parts.csv', mode: 'import' });
    expect(response.status).toBe(422);
    expect((await response.json()).error.message).toMatch(/not CSV text/);
    // A ZIP container (spreadsheet workbook): local file header signature 50 4B 03 04 with binary fields.
    const zip = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00, 0x08, 0x00, 0x00, 0x00, 0x21, 0x00]);
    const zipResponse = await importRequest({ content: zip, name: 'parts.csv', mode: 'preview' });
    expect(zipResponse.status).toBe(422);
    expect((await zipResponse.json()).error.message).toMatch(/not CSV text/);
    expect(await counts()).toEqual(before);
  });

  it.each(['reviewer', 'regulator'] as const)('refuses a %s with 403 and writes nothing', async (role) => {
    signInAs(role);
    const before = await counts();
    const content = goodElectrodes.replaceAll('test ', `${role} `);
    const response = await importRequest({ content, mode: 'import' });
    expect(response.status).toBe(403);
    expect((await response.json()).error.message).toBe('Only engineers and admins can import parts.');
    expect(await counts()).toEqual(before);
  });

  it('refuses a signed-out caller with 401', async () => {
    signInAs('signed-out');
    expect((await importRequest({ content: goodElectrodes })).status).toBe(401);
  });
});

describe('GET /api/parts/template', () => {
  it.each(partKinds)('%s: text/csv whose header names every field, and whose example row imports cleanly', async (kind) => {
    signInAs('engineer');
    const response = await templateRoute.GET(new Request(`http://test.invalid/api/parts/template?kind=${kind}`));
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(response.headers.get('content-disposition')).toContain(`channelsmith-parts-${kind}.csv`);
    const text = await response.text();
    expect(text.split('\n')[0].split(',')).toEqual(partFieldSpecs(kind).map((s) => s.field));
    const preview = await (await importRequest({ content: text.replace(/generic/, `template ${kind}`), kind })).json();
    expect(preview.preview).toMatchObject({ refused: false, validCount: 1, problems: [] });
  });

  it('an unknown kind is 422 naming the kinds', async () => {
    signInAs('engineer');
    const response = await templateRoute.GET(new Request('http://test.invalid/api/parts/template?kind=resistor'));
    expect(response.status).toBe(422);
    expect((await response.json()).error.message).toBe(`kind must be one of ${partKinds.join(', ')}`);
  });
});

describe('create, edit and retire parts', () => {
  const converter = {
    kind: 'converter',
    name: 'test 16-bit SAR converter',
    description: 'invented test part',
    sourceNote: 'assumed for test',
    status: 'under-evaluation',
    bits: 16,
    fullScaleV: 3.3,
    sampleRateMaxHz: 500e3,
    inputNoiseVrms: 30e-6,
  };
  const json = (method: string, body: unknown) =>
    new Request('http://test.invalid/api/parts', { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  const ctx = (id: number | string) => ({ params: Promise.resolve({ partId: String(id) }) });
  let partId: number;

  it('reviewer and regulator cannot create (403, nothing written); engineer creates (201, audited)', async () => {
    for (const role of ['reviewer', 'regulator'] as const) {
      signInAs(role);
      const before = await counts();
      expect((await partsRoute.POST(json('POST', converter))).status).toBe(403);
      expect(await counts()).toEqual(before);
    }
    signInAs('engineer');
    const before = await counts();
    const response = await partsRoute.POST(json('POST', converter));
    expect(response.status).toBe(201);
    const { part } = await response.json();
    partId = Number(part.id);
    expect(part.values).toEqual({ bits: 16, fullScaleV: 3.3, sampleRateMaxHz: 500e3, inputNoiseVrms: 30e-6 });
    expect(await counts()).toEqual({ ...before, parts: before.parts + 1, audit: before.audit + 1 });
  });

  it('refuses bad fields naming each one, and a duplicate name with 409', async () => {
    signInAs('engineer');
    const bad = await partsRoute.POST(json('POST', { ...converter, name: 'other', bits: 12.5, fullScaleV: -1, colour: 'red' }));
    expect(bad.status).toBe(422);
    const { error } = await bad.json();
    expect(error.fieldErrors.bits).toEqual(['resolution must be a whole number']);
    expect(error.fieldErrors.fullScaleV).toEqual(['full-scale range must be greater than zero']);
    expect(error.fieldErrors.colour).toEqual(['colour is not a field of converter parts']);
    const duplicate = await partsRoute.POST(json('POST', { ...converter, name: 'TEST 16-bit SAR converter' }));
    expect(duplicate.status).toBe(409);
  });

  it('edits (reviewer refused), then retires; a retired part cannot be edited', async () => {
    signInAs('reviewer');
    expect((await partRoute.PUT(json('PUT', { ...converter, status: 'approved' }), ctx(partId))).status).toBe(403);
    expect((await retireRoute.POST(json('POST', {}), ctx(partId))).status).toBe(403);
    signInAs('engineer');
    const edited = await partRoute.PUT(json('PUT', { ...converter, status: 'approved', bits: 18 }), ctx(partId));
    expect(edited.status).toBe(200);
    expect((await storedPart(converter.name))!.values.bits).toBe(18);
    expect((await partRoute.PUT(json('PUT', { ...converter, kind: 'electrode' }), ctx(partId))).status).toBe(422);
    const retired = await retireRoute.POST(json('POST', {}), ctx(partId));
    expect(retired.status).toBe(200);
    expect((await storedPart(converter.name))!.retired_at).not.toBeNull();
    expect((await partRoute.PUT(json('PUT', converter), ctx(partId))).status).toBe(409);
    expect((await retireRoute.POST(json('POST', {}), ctx(partId))).status).toBe(409);
    // Retired parts leave the plan forms' list but keep their name.
    const list = await (await partsRoute.GET(new Request('http://test.invalid/api/parts?kind=converter'))).json();
    expect(list.parts.map((p: { name: string }) => p.name)).not.toContain(converter.name);
    expect((await partsRoute.POST(json('POST', converter))).status).toBe(409);
  });

  it('an id of nothing is 404', async () => {
    signInAs('engineer');
    expect((await partRoute.PUT(json('PUT', converter), ctx(999999))).status).toBe(404);
    expect((await partRoute.PUT(json('PUT', converter), ctx('abc'))).status).toBe(404);
  });
});
