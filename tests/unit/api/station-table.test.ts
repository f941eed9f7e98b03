// The coordinate reader and the station table reader of the station plan (shared/api/stations.ts).
// Degrees and decimal minutes: value = degrees + minutes / 60, south and west negative (common practice
// of the trade; the 0–360 longitude convention also common practice). Expected values are worked by hand.
import { describe, it, expect } from 'vitest';
import { parseCoordinate, parseDepth, parseStationTable } from '../../../shared/api/stations';

const lat = (s: string) => parseCoordinate(s, 'latitude');
const lon = (s: string) => parseCoordinate(s, 'longitude');
const value = (r: ReturnType<typeof lat>) => (r.ok ? r.value : `error: ${r.message}`);

describe('coordinates', () => {
  it('reads decimal degrees, signed or with a hemisphere', () => {
    expect(value(lat('-54.5083'))).toBeCloseTo(-54.5083, 12);
    expect(value(lat('54.5083 S'))).toBeCloseTo(-54.5083, 12);
    expect(value(lat('54.5083N'))).toBeCloseTo(54.5083, 12);
    expect(value(lat('+12.25'))).toBeCloseTo(12.25, 12);
    expect(value(lon('57.9 W'))).toBeCloseTo(-57.9, 12);
    expect(value(lon('\u221257.9'))).toBeCloseTo(-57.9, 12); // a typographic minus, as word processors write it
    expect(value(lat('0'))).toBe(0);
  });
  it('reads degrees and decimal minutes in the usual spellings', () => {
    // 54° 30.5' = 54 + 30.5/60 = 54.508333…
    const want = -(54 + 30.5 / 60);
    for (const s of [
      '54 30.5 S',
      '-54 30.5',
      "54°30.5'S",
      '54° 30.5′ S',
      'S 54 30.5',
      "S54°30.5'",
      '54º30.5 S',
      '54 30.5S',
    ])
      expect(value(lat(s)), s).toBeCloseTo(want, 12);
    expect(value(lon('57 54.0 W'))).toBeCloseTo(-57.9, 12);
    expect(value(lon("057°54.0'E"))).toBeCloseTo(57.9, 12);
    expect(value(lat('60 0 N'))).toBe(60);
  });
  it('takes longitudes east of 180 (0–360) to −180…180', () => {
    expect(value(lon('302.1'))).toBeCloseTo(-57.9, 12);
    expect(value(lon('180'))).toBe(180);
    expect(value(lon('-180'))).toBe(-180);
  });
  it('refuses what is not a coordinate, with a reason', () => {
    const msg = (r: ReturnType<typeof lat>) => (r.ok ? 'accepted' : r.message);
    expect(msg(lat('91'))).toMatch(/at most 90/);
    expect(msg(lat('90 30 S'))).toMatch(/at most 90/);
    expect(msg(lon('181 W'))).toMatch(/at most 180/);
    expect(msg(lon('361'))).toMatch(/at most 180/);
    expect(msg(lat('54 60.0 S'))).toMatch(/minutes are under 60/);
    expect(msg(lat('54.5 30 S'))).toMatch(/whole degrees/);
    expect(msg(lat('-54 30.5 S'))).toMatch(/both a minus sign and the hemisphere/);
    expect(msg(lat('54 30.5 E'))).toMatch(/not a hemisphere of a latitude/);
    expect(msg(lon('57 54 N'))).toMatch(/not a hemisphere of a longitude/);
    expect(msg(lat('N 54 S'))).toMatch(/two hemisphere letters/);
    expect(msg(lat('54 30 15 S'))).toMatch(/seconds/);
    expect(msg(lat('abc'))).toMatch(/not a latitude/);
    expect(msg(lat(''))).toMatch(/no latitude/);
    expect(msg(lat('54,5'))).toMatch(/not a latitude/);
    expect(msg(lat("30.5'"))).toMatch(/not a latitude/);
  });
  it('reads depths in metres, blank as none', () => {
    expect(parseDepth('4520')).toEqual({ ok: true, value: 4520 });
    expect(parseDepth('4520 m')).toEqual({ ok: true, value: 4520 });
    expect(parseDepth('')).toEqual({ ok: true, value: null });
    expect(parseDepth('-10').ok).toBe(false);
    expect(parseDepth('0').ok).toBe(false);
    expect(parseDepth('13000').ok).toBe(false);
    expect(parseDepth('deep').ok).toBe(false);
  });
});

describe('station table', () => {
  it('reads a spreadsheet paste (tabs) with a header in any column order', () => {
    const t = parseStationTable('Lat\tStation\tLon\tDepth (m)\n54 30.5 S\tA1\t57 54.0 W\t4200\n-55.0\tA2\t-57.5\t\n');
    expect(t.ok).toBe(true);
    if (!t.ok) return;
    expect(t.header).toBe(true);
    expect(t.rows).toHaveLength(2);
    expect(t.rows[0]).toMatchObject({ line: 2, name: 'A1', plannedDepth: 4200 });
    expect(t.rows[0].latitude).toBeCloseTo(-54.508333333, 8);
    expect(t.rows[0].longitude).toBeCloseTo(-57.9, 12);
    expect(t.rows[1]).toMatchObject({ line: 3, name: 'A2', latitude: -55, longitude: -57.5, plannedDepth: null });
  });
  it('reads CSV and semicolons without a header, skipping blank and # lines', () => {
    const csv = parseStationTable('# plan of the line\n\nB1,-60.1,-45.2,3000\n"B 2","60 06.0 S","45 12.0 W",3100\n');
    expect(csv.ok && csv.rows.map((r) => [r.line, r.name, r.latitude, r.longitude])).toEqual([
      [3, 'B1', -60.1, -45.2],
      [4, 'B 2', -60.1, -45.2],
    ]);
    const semi = parseStationTable('C1;-10;20\r\nC2;-11;21');
    expect(semi.ok && semi.rows.map((r) => r.name)).toEqual(['C1', 'C2']);
  });
  it('names the line and column of every bad cell', () => {
    const t = parseStationTable(
      'station,lat,lon,depth\nS1,-54.5,-57.9,4000\nS2,95,-57.9,4000\nS3,-54.5,57 54 N,deep\nS1,-54,-57\nS5,-54\n',
    );
    expect(t.ok).toBe(false);
    if (t.ok) return;
    expect(t.problems.map((p) => [p.line, p.column, p.field])).toEqual([
      [3, 2, 'latitude'],
      [4, 3, 'longitude'],
      [4, 4, 'plannedDepth'],
      [5, 1, 'name'],
      [6, 3, null],
    ]);
    expect(t.problems[3].message).toMatch(/already on line 2/);
  });
  it('asks for a separator, a header with the needed columns, and at least one station', () => {
    const none = parseStationTable('S1 -54.5 -57.9');
    expect(!none.ok && none.problems[0].message).toMatch(/no column separator/);
    const head = parseStationTable('station,depth\nS1,100');
    expect(!head.ok && head.problems.map((p) => p.field)).toEqual(['latitude', 'longitude']);
    const empty = parseStationTable('\n# nothing\n');
    expect(!empty.ok && empty.problems[0].message).toMatch(/empty/);
    const only = parseStationTable('station,lat,lon\n');
    expect(!only.ok && only.problems[0].message).toMatch(/no station/);
  });
});
