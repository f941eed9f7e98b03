// The acquisition text export (a `*`/`#` header with column declarations, NMEA lines, a bad-flag
// value, `*END*`, whitespace columns), from samples written by scripts/lib/acquisitionSamples.ts
// out of an invented profile. What is checked is reading: roles by long name and unit, the primary
// of two sensor pairs, the secondary kept, bad-flag values missing, units converted.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseUpload, detectFormat } from '../../../server/parsers/index';
import { parseMonthDate } from '../../../server/parsers/acquisition';
import { ParseResultSchema, type ParsedCast } from '../../../shared/schemas/cast';

const DIR = join(import.meta.dirname, '..', '..', '..', 'fixtures', 'samples');
const tAt = (p: number): number => 4 + 16 * Math.exp(-p / 300);
const sAt = (p: number): number => 34.6 + Math.exp(-p / 250);
const oAt = (p: number): number => 220 - 50 * Math.exp(-(((p - 600) / 200) ** 2));

async function one(f: string): Promise<ParsedCast> {
  const r = await parseUpload(f, readFileSync(join(DIR, f)));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  expect(ParseResultSchema.safeParse(r).success).toBe(true);
  return r.casts[0];
}

describe('acquisition text export', () => {
  it('is detected by its content, whatever the name', () => {
    expect(detectFormat('cast.csv', readFileSync(join(DIR, 'acquisition-two-pairs.txt')))).toBe('acquisition');
    expect(detectFormat('x.txt', readFileSync(join(DIR, 'plain-whitespace.txt')))).toBe('plain');
  });

  it('two sensor pairs: the primary is the cast, the secondary kept as extra variables with their units', async () => {
    const c = await one('acquisition-two-pairs.txt');
    expect(c.format).toBe('acquisition');
    // NMEA lines: 34 07.50 S, 021 30.00 W, Mar 04 2026 05:06:00; operator lines: station, cast, water depth
    expect(c.metadata).toMatchObject({
      station: 'K-11',
      cast: '2',
      latitude: -34.125,
      longitude: -21.5,
      time: '2026-03-04T05:06:00Z',
      bottomDepth: 1480,
    });
    expect(c.profile.levels).toBe(150);
    expect(c.columns.pressure![20]).toBe(42);
    expect(c.columns.temperature[20]).toBeCloseTo(tAt(42), 4);
    expect(c.columns.salinity![20]).toBeCloseTo(sAt(42), 4);
    expect(c.extras.temperature_2.values[20]).toBeCloseTo(tAt(42) + 0.001, 4);
    expect(c.extras.temperature_2.unit).toBe('ITS-90, deg C');
    expect(c.extras.salinity_2.values[20]).toBeCloseTo(sAt(42) + 0.001, 4);
    expect(c.extras.conductivity_2.unit).toBe('S/m');
    // S/m to mS/cm is a factor of 10
    expect(c.columns.conductivity![20]).toBeCloseTo((3.0 + 0.09 * Number(tAt(42).toFixed(4))) * 10, 4);
    expect(Object.keys(c.extras).sort()).toEqual([
      'conductivity_2',
      'fluorescence',
      'salinity_2',
      'temperature_2',
      'transmission',
    ]);
    expect(c.notes.join(' ')).toMatch(/secondary kept as extra variables/);
  });

  it('values equal to the bad flag (-9.990e-29) are missing and flagged 9', async () => {
    const c = await one('acquisition-two-pairs.txt');
    expect(Number.isNaN(c.columns.temperature[10])).toBe(true);
    expect(c.flags.temperature[10]).toBe(9);
    expect(c.flags.temperature[11]).toBe(2);
    expect(Number.isNaN(c.columns.oxygen![40])).toBe(true);
    expect(c.notes.join(' ')).toMatch(/2 values equal to the bad flag/);
  });

  it('oxygen in ml/l becomes µmol/l by 44.661 (per kg when the cast is processed)', async () => {
    const c = await one('acquisition-two-pairs.txt');
    expect(c.units.oxygen).toBe('µmol/l');
    // the file holds O2/44.661 to 4 decimals: back within 44.661 × 0.00005
    expect(Math.abs(c.columns.oxygen![3] - oAt(8))).toBeLessThan(44.661 * 0.00005 + 1e-9);
  });

  it('depth in "salt water, m", position from operator lines, time from start_time', async () => {
    const c = await one('acquisition-depth.txt');
    expect(c.vertical).toBe('depth');
    expect(c.metadata).toMatchObject({
      station: 'D-2',
      latitude: 10.5,
      longitude: -45.25,
      time: '2026-03-05T11:20:00Z',
    });
    expect(c.columns.depth![79]).toBe(238);
    expect(c.units.oxygen).toBe('µmol/kg');
  });

  it("the export's dates", () => {
    expect(parseMonthDate('Mar 04 2026 05:06:00 [header]')).toBe('2026-03-04T05:06:00Z');
    expect(parseMonthDate('Dec 31 2025 23:59')).toBe('2025-12-31T23:59:00Z');
    expect(parseMonthDate('Foo 04 2026 05:06:00')).toBeNull();
  });
});
