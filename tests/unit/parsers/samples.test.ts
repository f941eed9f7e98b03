// Every good sample of fixtures/samples parses, with the conversions its headers ask for.
// Values are invented; what is checked is parser behaviour (conversions, metadata, profile logic).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { ParsedCast, ParseResult } from '../../../shared/schemas/cast';
import { ParseResultSchema } from '../../../shared/schemas/cast';
import { parseUpload } from '../../../server/parsers/index';

const DIR = join(import.meta.dirname, '..', '..', '..', 'fixtures', 'samples');
const read = (f: string): Buffer => readFileSync(join(DIR, f));
async function one(f: string): Promise<ParsedCast> {
  const r = await parseUpload(f, read(f));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  expect(ParseResultSchema.safeParse(r).success).toBe(true);
  expect(r.casts).toHaveLength(1);
  return r.casts[0];
}
// The invented profile the samples were written from (scripts/make-samples.ts).
const tAt = (p: number): number => 4 + 16 * Math.exp(-p / 300);
const sAt = (p: number): number => 34.6 + Math.exp(-p / 250);

describe('good samples', () => {
  it('plain CSV of api.md: metadata lines, units in brackets, values as written', async () => {
    const c = await one('plain.csv');
    expect(c.format).toBe('plain');
    expect(c.metadata).toMatchObject({
      station: 'K-07',
      cast: '1',
      latitude: -34.125,
      longitude: -21.5,
      time: '2026-03-04T05:06:00Z',
      bottomDepth: 1480,
    });
    expect(c.vertical).toBe('pressure');
    expect(c.profile).toEqual({ levels: 200, downcastEnd: 199, hasUpcast: false, reversals: 0 });
    expect(c.columns.pressure?.[10]).toBe(22);
    expect(c.columns.temperature[10]).toBeCloseTo(tAt(22), 4);
    expect(c.columns.salinity?.[10]).toBeCloseTo(sAt(22), 4);
    expect(c.units.oxygen).toBe('µmol/kg'); // the stored unit, whatever the spelling
    expect(Array.from(new Set(c.flags.temperature))).toEqual([2]);
  });

  it.each(['plain-tab.tsv', 'plain-bom.csv', 'plain-semicolon-decimal-comma.csv', 'plain-whitespace.txt'])(
    '%s reads the same numbers as the comma file',
    async (f) => {
      const ref = await one('plain.csv');
      const c = await one(f);
      expect(c.columns.pressure).toEqual(ref.columns.pressure);
      expect(c.columns.temperature).toEqual(ref.columns.temperature);
      expect(c.columns.salinity).toEqual(ref.columns.salinity);
      expect(c.metadata.station).toBe('K-07');
    },
  );

  it('BOM is removed and said so', async () => {
    const c = await one('plain-bom.csv');
    expect(c.notes.join(' ')).toMatch(/byte-order mark/);
  });

  it('IPTS-68 temperatures become ITS-90 by t90 = t68 / 1.00024', async () => {
    const c = await one('plain-ipts68.csv');
    const raw = read('plain-ipts68.csv').toString().split('\n')[7].split(',');
    expect(c.columns.temperature[0]).toBeCloseTo(Number(raw[1]) / 1.00024, 12);
    expect(c.notes.join(' ')).toMatch(/IPTS-68/);
  });

  it('conductivity in S/m becomes mS/cm; kPa becomes dbar; K becomes °C', async () => {
    const c = await one('plain-conductivity-sm.csv');
    const raw = read('plain-conductivity-sm.csv').toString().split('\n')[7].split(',').map(Number);
    expect(c.columns.salinity).toBeUndefined();
    expect(c.columns.conductivity?.[0]).toBeCloseTo(raw[2] * 10, 9);
    expect(c.columns.pressure?.[0]).toBeCloseTo(raw[0] / 10, 9);
    expect(c.columns.temperature[0]).toBeCloseTo(raw[1] - 273.15, 9);
    expect(c.units).toMatchObject({ conductivity: 'mS/cm', pressure: 'dbar', temperature: 'ITS-90 degC' });
  });

  it('depth instead of pressure is kept as depth', async () => {
    const c = await one('plain-depth.csv');
    expect(c.vertical).toBe('depth');
    expect(c.columns.pressure).toBeUndefined();
    expect(c.columns.depth?.[0]).toBe(Number((2 * 0.9933).toFixed(2)));
    expect(c.units.depth).toBe('m');
  });

  it('upcast is detected and dropped, the heave reversal counted, flags and extras kept', async () => {
    const c = await one('plain-upcast.csv');
    expect(c.profile.hasUpcast).toBe(true);
    expect(c.profile.reversals).toBe(1);
    expect(c.profile.levels).toBe(152); // 150 downcast levels plus the two heave levels
    const p = c.columns.pressure as Float64Array;
    expect(Math.max(...p)).toBe(300);
    expect(p[p.length - 1]).toBe(300);
    expect(c.notes.some((n) => /upcast of \d+ levels dropped/.test(n))).toBe(true);
    const i50 = p.indexOf(50);
    expect(c.flags.temperature[i50]).toBe(3);
    expect(c.flags.temperature[i50 + 1]).toBe(2);
    expect(c.extras.fluorescence.values).toHaveLength(152);
    expect(c.extras.fluorescence.unit).toBe('mg/m^3');
    expect(c.flags.fluorescence).toHaveLength(152);
  });

  it('exchange file: header block, flags, fill values, longitude normalised', async () => {
    const c = await one('exchange_ct1.csv');
    expect(c.format).toBe('exchange');
    expect(c.metadata).toMatchObject({
      station: '12',
      cast: '1',
      latitude: -34.25,
      longitude: -20.5,
      time: '2026-03-04T05:06:00Z',
      bottomDepth: 1480,
    });
    expect(c.metadata.extra.EXPOCODE).toBe('99TS20260301');
    const o = c.columns.oxygen as Float64Array;
    expect(Number.isNaN(o[7])).toBe(true);
    expect(c.flags.oxygen[7]).toBe(9);
    expect(c.flags.salinity[20]).toBe(3);
    expect(c.units.oxygen).toBe('µmol/kg'); // UMOL/KG in the file
    expect(c.extras).toEqual({});
  });

  it('station table rows', async () => {
    const r = await parseUpload('stations.csv', read('stations.csv'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.casts).toHaveLength(0);
    expect(r.stations.map((s) => s.station)).toEqual(['K-07', 'K-08', 'K-09']);
    expect(r.stations[2]).toMatchObject({ latitude: -35.25, longitude: -20.5, line: 4 }); // degrees and minutes
  });

  it('zip: every cast, and the station table fills the casts lacking positions', async () => {
    const r: ParseResult = await parseUpload('casts.zip', read('casts.zip'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.casts.map((c) => c.file).sort()).toEqual(['casts/K-08.csv', 'casts/K-09.tsv', 'casts/exchange_ct1.csv']);
    const k9 = r.casts.find((c) => c.metadata.station === 'K-09') as ParsedCast;
    expect(k9.metadata).toMatchObject({ latitude: -35.25, longitude: -20.5, bottomDepth: 3050 });
    expect(k9.notes.join(' ')).toMatch(/station/);
    expect(r.stations).toHaveLength(3);
  });

  it('a 6000-level file parses whole (its speed is a benchmark, tests/bench/parse.ts)', async () => {
    const lines = ['pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen [umol/kg],fluorescence'];
    for (let i = 1; i <= 6000; i++) lines.push(`${i}.0,${tAt(i).toFixed(4)},${sAt(i).toFixed(4)},210.5,0.05`);
    const r = await parseUpload('big.csv', Buffer.from(lines.join('\n')));
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.casts[0].profile.levels).toBe(6000);
      expect(r.casts[0].columns.pressure![5999]).toBe(6000);
      expect(Object.keys(r.casts[0].extras)).toContain('fluorescence');
    }
  });
});
