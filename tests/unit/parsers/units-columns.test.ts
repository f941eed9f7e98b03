// Unit strings, column recognition, the user's column mapping, and the checks that need a file
// built for the purpose (synthetic files; parser behaviour only).
import { describe, expect, it } from 'vitest';
import { parseUpload } from '../../../server/parsers/index';
import { resolveUnit } from '../../../server/parsers/units';
import { assignColumns, splitHeader } from '../../../server/parsers/columns';
import { parseLatitude, parseLongitude, parseTime } from '../../../server/parsers/metadata';

const conv = (role: Parameters<typeof resolveUnit>[0], u: string | null): { f: number; o: number; ipts68: boolean } => {
  const r = resolveUnit(role, u, 'c');
  if (!r.ok) throw new Error(r.message);
  return { f: r.conv.factor, o: r.conv.offset, ipts68: r.conv.ipts68 };
};

describe('units', () => {
  it('pressure units through mathjs: 1 bar = 10 dbar, 1 kPa = 0.1 dbar', () => {
    expect(conv('pressure', 'bar').f).toBeCloseTo(10, 12);
    expect(conv('pressure', 'kPa').f).toBeCloseTo(0.1, 12);
    expect(conv('pressure', 'DBAR').f).toBe(1);
    expect(conv('pressure', 'decibars').f).toBe(1);
  });
  it('conductivity: S/m × 10 = mS/cm; µS/cm / 1000; mmho/cm = mS/cm', () => {
    expect(conv('conductivity', 'S/m').f).toBeCloseTo(10, 12);
    expect(conv('conductivity', 'µS/cm').f).toBeCloseTo(0.001, 12);
    expect(conv('conductivity', 'mmho/cm').f).toBeCloseTo(1, 12);
    expect(conv('conductivity', 'MS/CM').f).toBeCloseTo(1, 12);
  });
  it('temperature: K offset, scales by text', () => {
    const k = conv('temperature', 'K');
    expect(k.f * 273.15 + k.o).toBeCloseTo(0, 9);
    expect(conv('temperature', 'IPTS-68').ipts68).toBe(true);
    expect(conv('temperature', 'deg C (T68)').ipts68).toBe(true);
    expect(conv('temperature', 'ITS-90 degC').ipts68).toBe(false);
    expect(conv('temperature', '°C').ipts68).toBe(false);
  });
  it('depth in feet and fathoms', () => {
    expect(conv('depth', 'ft').f).toBeCloseTo(0.3048, 12);
    expect(conv('depth', 'fathoms').f).toBeCloseTo(1.8288, 12);
  });
  it('unconvertible units are errors naming the column', () => {
    for (const [role, u] of [
      ['pressure', 'm'],
      ['temperature', 'furlong'],
      ['salinity', 'g/kg'],
      ['conductivity', 'dbar'],
    ] as const) {
      const r = resolveUnit(role, u, '"my column"');
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.message).toContain('"my column"');
    }
  });
});

describe('columns', () => {
  it('splits names and units', () => {
    expect(splitHeader('pressure [dbar]')).toEqual({ name: 'pressure', unit: 'dbar' });
    expect(splitHeader('Temperature (°C ITS-90)')).toEqual({ name: 'Temperature', unit: '°C ITS-90' });
    expect(splitHeader('CTDSAL')).toEqual({ name: 'CTDSAL', unit: null });
  });
  it('recognises roles, flags, extras; a second role column becomes an extra', () => {
    const names = ['PRES', 'temp', 'Temperature', 'PSAL', 'psal_qc', 'fluor', 'weird'];
    const { assignments, duplicates } = assignColumns(names, names);
    expect(assignments.map((a) => a.kind)).toEqual(['role', 'role', 'extra', 'role', 'flag', 'extra', 'extra']);
    expect(assignments[4]).toEqual({ kind: 'flag', of: 'salinity' });
    expect(duplicates).toEqual([{ index: 2, role: 'temperature' }]);
  });
});

describe('metadata values', () => {
  it('positions in several spellings', () => {
    expect(parseLatitude('35 15.0 S')).toEqual({ ok: true, value: -35.25 });
    expect(parseLatitude("S 35°15.0'")).toEqual({ ok: true, value: -35.25 });
    expect(parseLongitude('339.5')).toEqual({ ok: true, value: -20.5 });
    expect(parseLongitude('20 30 W')).toEqual({ ok: true, value: -20.5 });
    expect(parseLatitude('-35 15 N').ok).toBe(false);
  });
  it('times to ISO UTC', () => {
    expect(parseTime('2026-03-04 05:06')).toEqual({ ok: true, value: '2026-03-04T05:06:00Z' });
    expect(parseTime('2026-03-04T07:06:00+02:00')).toEqual({ ok: true, value: '2026-03-04T05:06:00Z' });
    expect(parseTime('2026-02-29T00:00:00Z').ok).toBe(false);
  });
});

const csv = (s: string): Buffer => Buffer.from(s);

describe('files made for one check', () => {
  it('unrecognised headers: ok:false with unmappedHeaders, then the mapping reads it', async () => {
    const body = 'prz,wt,sss,sonde\n2,18.1,35.5,1\n4,18.0,35.5,2\n';
    const r = await parseUpload('odd.csv', csv(body));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0].code).toBe('missing_column');
    expect(r.unmappedHeaders).toEqual({ file: 'odd.csv', headers: ['prz', 'wt', 'sss', 'sonde'] });
    const m = await parseUpload('odd.csv', csv(body), {
      columnMapping: { prz: 'pressure', wt: 'temperature', sss: 'salinity', sonde: 'ignore' },
    });
    expect(m.ok).toBe(true);
    if (!m.ok) return;
    expect(Array.from(m.casts[0].columns.salinity as Float64Array)).toEqual([35.5, 35.5]);
    expect(m.casts[0].extras).toEqual({});
  });
  it('a mapping overrides recognition, and a bad mapping is refused', async () => {
    const body = 'p,t,s,t2\n2,18.1,35.5,19.0\n4,18.0,35.5,18.9\n';
    const r = await parseUpload('m.csv', csv(body), { columnMapping: { t: 'extra', t2: 'temperature' } });
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(Array.from(r.casts[0].columns.temperature)).toEqual([19.0, 18.9]);
      expect(Array.from(r.casts[0].extras.t.values)).toEqual([18.1, 18.0]);
    }
    const bad = await parseUpload('m.csv', csv(body), { columnMapping: { t: 'warmth' } });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors[0].code).toBe('bad_mapping');
  });
  it('conductivity without a unit: S/m or mS/cm judged from the values', async () => {
    const sm = await parseUpload('c.csv', csv('p,t,c\n2,18,4.8\n4,18,4.7\n'));
    const ms = await parseUpload('c.csv', csv('p,t,c\n2,18,48\n4,18,47\n'));
    expect(sm.ok && ms.ok).toBe(true);
    if (sm.ok && ms.ok) {
      expect(sm.casts[0].columns.conductivity?.[0]).toBeCloseTo(48, 9);
      expect(ms.casts[0].columns.conductivity?.[0]).toBe(48);
    }
  });
  it('fill values are missing (NaN, flag 9); NaN text in an extra column is missing too', async () => {
    const r = await parseUpload(
      'f.csv',
      csv('p,t,s,turbidity\n2,-999,35.5,NaN\n4,-9.0E+02,35.5,0.2\n6,18,-999.0,0.3\n'),
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const c = r.casts[0];
    expect(Number.isNaN(c.columns.temperature[0]) && Number.isNaN(c.columns.temperature[1])).toBe(true);
    expect(Array.from(c.flags.temperature)).toEqual([9, 9, 2]);
    expect(Array.from(c.flags.salinity)).toEqual([2, 2, 9]);
    expect(Number.isNaN(c.extras.turbidity.values[0])).toBe(true);
  });
  it('a text column among extras is dropped with a warning, not an error', async () => {
    const r = await parseUpload('t.csv', csv('p,t,s,comment\n2,18,35.5,ok\n4,18,35.5,spike?\n'));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.warnings.some((w) => w.code === 'text_column' && w.column === 4)).toBe(true);
  });
  it('CRLF line ends and quoted headers', async () => {
    const r = await parseUpload(
      'q.csv',
      csv('"pressure [dbar]","temperature [ITS-90 degC]","salinity [PSS-78]"\r\n2,18,35.5\r\n"4","18","35.4"\r\n'),
    );
    expect(r.ok).toBe(true);
    if (r.ok) expect(Array.from(r.casts[0].columns.salinity as Float64Array)).toEqual([35.5, 35.4]);
  });
  it('an error names file, 1-based line in the original file and 1-based column', async () => {
    const r = await parseUpload(
      'e.csv',
      csv('# station: 1\n\n# cast: 2\npressure,temperature,salinity\n2,18,35\n\n4,18,abc\n'),
    );
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatchObject({ file: 'e.csv', line: 7, column: 3, code: 'text_in_numeric' });
    if (!r.ok) expect(r.errors[0].message).toContain('salinity');
  });
  it('a file over maxBytes is refused before it is read', async () => {
    const r = await parseUpload('big.csv', Buffer.alloc(2000, 0x31), { maxBytes: 1000 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].code).toBe('file_too_large');
  });
});
