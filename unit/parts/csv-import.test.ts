import { describe, expect, it } from 'vitest';
import { parsePartsCsv, partsCsvLimits, partsCsvTemplate, suggestColumnMapping } from '@/lib/parts/csv-import';
import { partKinds } from '@/lib/parts/part-kinds';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('partsCsvTemplate', () => {
  it.each(partKinds)('the %s template parses back into one valid part', (kind) => {
    const r = parsePartsCsv(partsCsvTemplate(kind), kind);
    expect(r.errors).toEqual([]);
    expect(r.rows).toHaveLength(1);
    expect(r.rowNumbers).toEqual([2]);
    expect(r.rows[0].kind).toBe(kind);
  });

  it('the op-amp template values come out in SI units', () => {
    const [p] = parsePartsCsv(partsCsvTemplate('operational-amplifier'), 'operational-amplifier').rows;
    // 12 nV/√Hz = 12e-9 V/√Hz; 0.5 pA/√Hz = 5e-13 A/√Hz; 5 MHz = 5e6 Hz; 200 µV = 2e-4 V (SI prefixes).
    expect(rel(p.enVPerRtHz, 12e-9)).toBeLessThan(1e-12);
    expect(rel(p.inAPerRtHz, 5e-13)).toBeLessThan(1e-12);
    expect(p.gbwHz).toBe(5e6);
    expect(rel(p.offsetV, 2e-4)).toBeLessThan(1e-12);
  });
});

const goodElectrodes = [
  'Name,Type,Rs (kΩ),Rp,Cp,Offset typ,Offset max,Source,Status,Notes',
  'wet gel disc,wet-gel,0.5,51 kohm,47 nF,5 mV,30 mV,measured on bench 2025-03,approved,ignored column',
  'dry pin,dry,2,2.2 MΩ,10n F,50 mV,300 mV,assumed,Under evaluation,',
  '"textile band, knitted",textile,10,1 MΩ,4.7 nF,20 mV,150 mV,assumed,not-for-new-designs,x',
].join('\n');

describe('parsePartsCsv: a good file', () => {
  it('maps columns by name, parses units, applies the header unit to bare numbers', () => {
    const r = parsePartsCsv(goodElectrodes, 'electrode');
    expect(r.refused).toBe(false);
    expect(r.errors).toEqual([]);
    expect(r.rows.map((p) => p.name)).toEqual(['wet gel disc', 'dry pin', 'textile band, knitted']);
    const [wet, dry] = r.rows;
    expect(wet.rsOhm).toBe(500); // "0.5" in a column headed "(kΩ)"
    expect(wet.rpOhm).toBe(51e3);
    expect(rel(wet.cpF, 47e-9)).toBeLessThan(1e-12);
    expect(rel(dry.rpOhm, 2.2e6)).toBeLessThan(1e-12);
    expect(rel(dry.cpF, 10e-9)).toBeLessThan(1e-12);
    expect(dry.status).toBe('under-evaluation');
    expect(r.columns.find((c) => c.column === 'Notes')?.field).toBeNull();
    expect(r.columns.find((c) => c.column === 'Rs (kΩ)')).toEqual({ column: 'Rs (kΩ)', field: 'rsOhm', headerUnit: 'kΩ' });
  });

  it('suggestColumnMapping recognises names, labels and abbreviations', () => {
    expect(suggestColumnMapping(['Part', 'en (nV/rtHz)', 'GBW', 'Vos', 'whatever'], 'operational-amplifier')).toEqual({
      Part: 'name',
      'en (nV/rtHz)': 'enVPerRtHz',
      GBW: 'gbwHz',
      Vos: 'offsetV',
    });
  });

  it('an explicit mapping overrides the suggestion', () => {
    const csv = 'label,a,b,c,d,e,f,g,h\nx,dry,1k,1M,1n,1m,2m,assumed,approved\n';
    const mapping = { label: 'name', a: 'electrodeType', b: 'rsOhm', c: 'rpOhm', d: 'cpF', e: 'offsetTypicalV', f: 'offsetMaxV', g: 'sourceNote', h: 'status' };
    const r = parsePartsCsv(csv, 'electrode', mapping);
    expect(r.errors).toEqual([]);
    expect(r.rows[0]).toMatchObject({ name: 'x', rsOhm: 1000, rpOhm: 1e6, cpF: 1e-9, offsetTypicalV: 1e-3, offsetMaxV: 2e-3 });
  });
});

describe('parsePartsCsv: bad rows are each listed with the reason', () => {
  const csv = [
    'name,electrodeType,rsOhm,rpOhm,cpF,offsetTypicalV,offsetMaxV,sourceNote,status',
    'ok one,dry,1k,1M,1n,1m,2m,assumed,approved', // row 2
    'wrong unit,dry,47 nF,1M,1n,1m,2m,assumed,approved', // row 3
    'missing,dry,,1M,1n,1m,2m,assumed,approved', // row 4
    'too big,dry,1k,1M,5 F,1m,2m,assumed,approved', // row 5
    'ragged,dry,1k', // row 6
    'OK ONE,dry,1k,1M,1n,1m,2m,assumed,approved', // row 7: duplicate (case-insensitive)
    'existing part,dry,1k,1M,1n,1m,2m,assumed,approved', // row 8
    'bad status,dry,1k,1M,1n,1m,2m,assumed,retired', // row 9
    'text,dry,abc,1M,1n,1m,2m,,approved', // row 10: two problems
  ].join('\n');

  it('lists row, column, field, value and message', () => {
    const r = parsePartsCsv(csv, 'electrode', undefined, { existingNames: ['Existing Part'] });
    expect(r.refused).toBe(false);
    expect(r.rows.map((p) => p.name)).toEqual(['ok one']);
    expect(r.errors).toEqual([
      { row: 3, column: 'rsOhm', field: 'rsOhm', value: '47 nF', message: 'series resistance: expected a resistance (Ω), got a capacitance' },
      { row: 4, column: 'rsOhm', field: 'rsOhm', value: '', message: 'series resistance is required' },
      { row: 5, column: 'cpF', field: 'cpF', value: '5 F', message: 'parallel capacitance must be at most 1 mF' },
      { row: 6, column: '', field: '', value: 'ragged,dry,1k', message: 'row has 3 values; the header has 9 columns' },
      { row: 7, column: 'name', field: 'name', value: 'OK ONE', message: 'duplicate name "OK ONE" (already in row 2)' },
      { row: 8, column: 'name', field: 'name', value: 'existing part', message: 'a part named "existing part" already exists in the library' },
      { row: 9, column: 'status', field: 'status', value: 'retired', message: 'status must be one of approved, under-evaluation, not-for-new-designs' },
      { row: 10, column: 'rsOhm', field: 'rsOhm', value: 'abc', message: 'series resistance: "abc" does not start with a number' },
    ]);
  });

  it('reports schema problems once the cells parse (empty source note)', () => {
    const r = parsePartsCsv('name,electrodeType,rsOhm,rpOhm,cpF,offsetTypicalV,offsetMaxV,sourceNote,status\nn,dry,1k,1M,1n,1m,2m,,approved\n', 'electrode');
    expect(r.errors).toEqual([
      { row: 2, column: 'sourceNote', field: 'sourceNote', value: '', message: 'source note is required (datasheet revision, measured or assumed)' },
    ]);
  });

  it('row numbers follow the file lines across a quoted multi-line cell and blank lines', () => {
    const r = parsePartsCsv(
      'name,electrodeType,rsOhm,rpOhm,cpF,offsetTypicalV,offsetMaxV,sourceNote,status\n"two\nline",dry,1k,1M,1n,1m,2m,assumed,approved\n\nbad,dry,1k,1M,1n,1m,2m,assumed,nope\n',
      'electrode',
    );
    expect(r.rowNumbers).toEqual([2]);
    expect(r.errors.map((e) => e.row)).toEqual([5]);
  });
});

describe('parsePartsCsv: refused files', () => {
  it('refuses a file over 2 MB', () => {
    const big = 'name,rsOhm\n' + 'x'.repeat(partsCsvLimits.maxBytes);
    const r = parsePartsCsv(big, 'electrode');
    expect(r.refused).toBe(true);
    expect(r.errors).toEqual([{ row: 0, column: '', field: '', value: '', message: 'the file is 2.0 MB; the limit is 2 MB' }]);
  });

  it('counts multi-byte characters toward the size (UTF-8 bytes, not characters)', () => {
    // 'Ω' is 2 bytes in UTF-8 (U+03A9): 1.1 M of them is 2.2 MB though only 1.1 M characters.
    const r = parsePartsCsv('name,rsOhm\n' + 'Ω'.repeat(1_100_000), 'electrode');
    expect(r.errors[0].message).toBe('the file is 2.1 MB; the limit is 2 MB');
  });

  it('refuses more than 5,000 data rows', () => {
    const header = 'name,electrodeType,rsOhm,rpOhm,cpF,offsetTypicalV,offsetMaxV,sourceNote,status';
    const rows = Array.from({ length: 5001 }, (_, i) => `e${i},dry,1k,1M,1n,1m,2m,a,approved`);
    const r = parsePartsCsv([header, ...rows].join('\n'), 'electrode');
    expect(r.refused).toBe(true);
    expect(r.errors[0].message).toBe('the file has 5,001 data rows; the limit is 5,000');
    const ok = parsePartsCsv([header, ...rows.slice(0, 5000)].join('\n'), 'electrode');
    expect(ok.refused).toBe(false);
    expect(ok.rows).toHaveLength(5000);
  });

  it('refuses binary content', () => {
    const bytes = new Uint8Array(4096);
    for (let i = 0; i < bytes.length; i++) bytes[i] = (i * 73) % 256;
    const text = new TextDecoder().decode(bytes);
    expect(parsePartsCsv(text, 'converter').errors[0].message).toBe('the file is not CSV text (it contains binary data)');
    expect(parsePartsCsv('name\u0000,bits\n', 'converter').errors[0].message).toBe('the file is not CSV text (it contains binary data)');
  });

  it('refuses a file without a header', () => {
    const r = parsePartsCsv('24,5 V,32 kHz\n16,3.3 V,1 kHz\n', 'converter');
    expect(r.refused).toBe(true);
    expect(r.errors[0].message).toBe('the first line must be a header naming the columns; it looks like data');
    expect(parsePartsCsv('', 'converter').errors[0].message).toBe('the file is empty');
    expect(parsePartsCsv('just some prose without separators\n', 'converter').errors[0].message).toMatch(/^the first line must be a header naming at least two columns/);
  });

  it('refuses when a required field has no column, naming each', () => {
    const r = parsePartsCsv('name,bits,fullScaleV,status\nx,24,5 V,approved\n', 'converter');
    expect(r.refused).toBe(true);
    expect(r.errors.map((e) => e.message)).toEqual([
      'no column for required field sourceNote (source note)',
      'no column for required field sampleRateMaxHz (maximum sample rate)',
      'no column for required field inputNoiseVrms (input-referred noise)',
    ]);
  });

  it('refuses a header unit that does not suit the field', () => {
    const r = parsePartsCsv('name,Rs (nF),rpOhm,cpF,offsetTypicalV,offsetMaxV,sourceNote,status,type\nx,1,1M,1n,1m,2m,a,approved,dry\n', 'electrode');
    expect(r.errors[0].message).toBe('column "Rs (nF)": expected a resistance (Ω), got a capacitance');
  });

  it('refuses a mapping to an unknown field or a missing column', () => {
    expect(parsePartsCsv('a,b\n1,2\n', 'converter', { a: 'volume' }).errors[0].message).toBe('the mapping assigns column "a" to "volume", which is not a field of converter parts');
    expect(parsePartsCsv('a,b\n1,2\n', 'converter', { z: 'bits' }).errors[0].message).toBe('the mapping names column "z", which is not in the header');
  });
});
