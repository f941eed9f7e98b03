// netCDF CTD reading: CF-1.x profile files we wrote (fixtures/samples/cf-*.nc, invented values
// from scripts/lib/netcdfSamples.ts) and the data office's WOCE netCDF CTD files of a real
// section (fixtures/real/sr1b-2015, CCHDO distribution of GO-SHIP SR1B 2015: "Data were collected
// and made publicly available by the International Global Ship-based Hydrographic Investigations
// Program (GO-SHIP; http://www.go-ship.org/) with National Capability funding from the UK Natural
// Environment Research Council to the National Oceanography Centre.").
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { parseUpload, detectFormat } from '../../../server/parsers/index';
import { ParseResultSchema, type ParsedCast } from '../../../shared/schemas/cast';
import { cfTime, repairUnit } from '../../../server/parsers/netcdf';

const ROOT = join(import.meta.dirname, '..', '..', '..');
const sample = (f: string): Buffer => readFileSync(join(ROOT, 'fixtures', 'samples', f));
const SR1B = join(ROOT, 'fixtures/real/sr1b-2015/74JC20150110_nc_ctd.zip');
// The invented profile the samples were written from (scripts/lib/netcdfSamples.ts).
const tAt = (p: number): number => 4 + 16 * Math.exp(-p / 300);
const sAt = (p: number): number => 34.6 + Math.exp(-p / 250);
const oAt = (p: number): number => 220 - 50 * Math.exp(-(((p - 600) / 200) ** 2));

async function casts(name: string, bytes: Buffer): Promise<ParsedCast[]> {
  const r = await parseUpload(name, bytes);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  expect(ParseResultSchema.safeParse(r).success).toBe(true);
  return r.casts;
}

describe('netCDF detection', () => {
  it('goes by the magic bytes, whatever the name', () => {
    expect(detectFormat('x.csv', sample('cf-profiles.nc'))).toBe('netcdf');
    expect(detectFormat('x.nc', Buffer.from('pressure,temperature\n1,2\n'))).toBe('plain');
    expect(detectFormat('x.nc', Buffer.from([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0]))).toBe('hdf5');
  });
});

describe('CF profile files', () => {
  it('several profiles on a (profile, level) grid: packed T and S unpacked, fills dropped, QC kept, station from cf_role', async () => {
    const cs = await casts('cf-profiles.nc', sample('cf-profiles.nc'));
    expect(cs).toHaveLength(3);
    expect(cs.map((c) => c.metadata.station)).toEqual(['T-01', 'T-02', 'T-03']);
    expect(cs.map((c) => c.profile.levels)).toEqual([120, 100, 80]);
    expect(cs.map((c) => c.file)).toEqual([
      'cf-profiles.nc [profile 1]',
      'cf-profiles.nc [profile 2]',
      'cf-profiles.nc [profile 3]',
    ]);
    // days since 1950-01-01: 27821.25 days = 2026-03-04 06:00 UTC (2026-03-04 is day 27821, python datetime)
    expect(cs[0].metadata.time).toBe('2026-03-04T06:00:00Z');
    expect(cs[2].metadata).toMatchObject({ latitude: -41, longitude: 10.75 });
    const c = cs[1];
    for (const k of [0, 10, 99]) {
      const p = 2 + 2 * k + 1;
      expect(c.columns.pressure![k]).toBe(p);
      // packed with scale 0.001 (float32) and offset 10: within half a step of the invented value
      expect(Math.abs(c.columns.temperature[k] - tAt(p))).toBeLessThan(0.0006);
      expect(Math.abs(c.columns.salinity![k] - sAt(p))).toBeLessThan(0.00006);
    }
    expect(c.flags.temperature[10]).toBe(3);
    expect(c.flags.temperature[11]).toBe(1);
    // DOXY level 5 is the _FillValue (-999): missing, flagged 9
    expect(Number.isNaN(c.columns.oxygen![5])).toBe(true);
    expect(c.flags.oxygen[5]).toBe(9);
    expect(c.columns.oxygen![6]).toBeCloseTo(oAt(2 + 12 + 1), 9);
    expect(c.units.oxygen).toBe('µmol/kg');
    expect(c.units.temperature).toBe('ITS-90 degC');
    expect(c.extras.fluorescence.unit).toBe('mg m-3');
    expect(c.notes.join(' ')).toMatch(/scale_factor/);
  });

  it('a contiguous ragged array: two profiles, conductivity S m-1 to mS/cm, oxygen ml l-1 to µmol/l by 44.661', async () => {
    const cs = await casts('cf-ragged.nc', sample('cf-ragged.nc'));
    expect(cs.map((c) => [c.metadata.station, c.profile.levels])).toEqual([
      ['R-1', 60],
      ['R-2', 40],
    ]);
    expect(cs[1].metadata.time).toBe('2026-03-01T02:00:00Z');
    expect(cs[1].metadata.longitude).toBe(-59.5);
    const c = cs[1];
    expect(c.columns.pressure![0]).toBe(4);
    expect(c.columns.conductivity![3]).toBeCloseTo((3.0 + 0.09 * tAt(19)) * 10, 9);
    // the conversion: 1 ml/l = 44.661 µmol/l (per kg later, with the potential density)
    expect(c.units.oxygen).toBe('µmol/l');
    expect(c.columns.oxygen![3]).toBeCloseTo(oAt(19), 9);
    expect(c.notes.join(' ')).toMatch(/to µmol\/l \(44\.661 µmol\/l per ml\/l\)/);
  });

  it('one profile on depth with scalar time and position', async () => {
    const [c] = await casts('cf-single-depth.nc', sample('cf-single-depth.nc'));
    expect(c.vertical).toBe('depth');
    expect(c.metadata).toMatchObject({ station: '5', latitude: 55.5, longitude: -12.25, time: '2026-03-03T06:00:00Z' });
    expect(c.columns.depth![49]).toBe(99);
    expect(c.columns.salinity![0]).toBeCloseTo(sAt(1), 12);
  });

  it('reads inside a zip next to text casts', async () => {
    const yazl = (await import('yazl')).default;
    const z = new yazl.ZipFile();
    z.addBuffer(sample('cf-ragged.nc'), 'a/ragged.nc');
    z.addBuffer(sample('plain.csv'), 'a/plain.csv');
    z.end();
    const chunks: Buffer[] = [];
    await new Promise<void>((res) => {
      z.outputStream.on('data', (b: Buffer) => chunks.push(b));
      z.outputStream.on('end', () => res());
    });
    const cs = await casts('mixed.zip', Buffer.concat(chunks));
    expect(cs.map((c) => c.format).sort()).toEqual(['netcdf', 'netcdf', 'plain']);
  });

  it('CF time units and lost signs in unit strings', () => {
    expect(cfTime(18426691, 'minutes since 1980-01-01 00:00:00')).toBe('2015-01-13T07:31:00Z');
    expect(cfTime(1.5, 'days since 2000-01-01')).toBe('2000-01-02T12:00:00Z');
    expect(cfTime(1, 'fortnights since 2000-01-01')).toBeNull();
    expect(repairUnit('?C (ITS-90)')).toBe('°C (ITS-90)');
    expect(repairUnit('?mol/kg')).toBe('µmol/kg');
  });
});

describe('WOCE netCDF CTD files of a real section (SR1B 2015, GO-SHIP/CCHDO; acknowledgement above)', () => {
  it('every level of every cast equals an independent reading with python3-netcdf4', async () => {
    const cs = await casts('74JC20150110_nc_ctd.zip', readFileSync(SR1B));
    expect(cs).toHaveLength(30);
    const py = spawnSync(
      process.env.GSW_PYTHON ?? '/usr/bin/python3',
      [
        '-c',
        String.raw`
import sys, json, zipfile, numpy as np, netCDF4
out = {}
with zipfile.ZipFile(sys.argv[1]) as z:
    for n in z.namelist():
        d = netCDF4.Dataset(n, memory=z.read(n))
        def col(v): return [None if np.ma.is_masked(x) else float(x) for x in d[v][:]]
        out[n] = {'p': col('pressure'), 't': col('temperature'), 's': col('salinity'), 'o': col('oxygen'), 'of': [int(x) for x in d['oxygen_QC'][:]],
                  'lat': float(d['latitude'][0]), 'lon': float(d['longitude'][0]), 'bd': float(d.BOTTOM_DEPTH_METERS), 'date': int(d['woce_date'][0]), 'time': int(d['woce_time'][0])}
print(json.dumps(out))
`,
        SR1B,
      ],
      { encoding: 'utf8', maxBuffer: 1 << 27 },
    );
    expect(py.status, py.stderr).toBe(0);
    const ref = JSON.parse(py.stdout) as Record<
      string,
      {
        p: number[];
        t: number[];
        s: number[];
        o: (number | null)[];
        of: number[];
        lat: number;
        lon: number;
        bd: number;
        date: number;
        time: number;
      }
    >;
    for (const c of cs) {
      const r = ref[c.file];
      expect(r, c.file).toBeTruthy();
      expect(Array.from(c.columns.pressure!)).toEqual(r.p);
      expect(Array.from(c.columns.temperature)).toEqual(r.t);
      expect(Array.from(c.columns.salinity!)).toEqual(r.s);
      expect(Array.from(c.columns.oxygen!, (v) => (Number.isNaN(v) ? null : v))).toEqual(
        r.o.map((v) => (v === -999 ? null : v)),
      );
      expect(Array.from(c.flags.oxygen)).toEqual(r.of.map((f, i) => (r.o[i] === null || r.o[i] === -999 ? 9 : f)));
      expect(c.metadata.latitude).toBe(r.lat);
      expect(c.metadata.longitude).toBe(r.lon);
      expect(c.metadata.bottomDepth).toBe(r.bd);
      const d = String(r.date);
      const hm = String(r.time).padStart(4, '0');
      expect(c.metadata.time).toBe(
        `${d.slice(0, 4)}-${d.slice(4, 6)}-${d.slice(6, 8)}T${hm.slice(0, 2)}:${hm.slice(2)}:00Z`,
      );
    }
  });
});
