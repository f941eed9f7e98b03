// Real data: the SR1B Drake Passage section of January 2015 (GO-SHIP line SR1B, RRS James Clark
// Ross cruise JR306, expocode 74JC20150110, CCHDO "WOCE netCDF" CTD product; fixtures/real/sr1b-2015,
// see its SOURCE.md). "Data were collected and made publicly available by the International Global
// Ship-based Hydrographic Investigations Program (GO-SHIP; http://www.go-ship.org/) with National
// Capability funding from the UK Natural Environment Research Council to the National Oceanography
// Centre." The files are read in the test's setup by the reference interpreter's netCDF4
// (tests/reference/python.ts). Checks: the line compared with itself gives zero everywhere; compared
// with a copy displaced by a known heave δ(p) it gives that heave on every isopycnal and no
// water-mass change (Bindoff & McDougall 1994, J. Phys. Oceanogr. 24, 1137–1152).
import { describe, it, expect, beforeAll } from 'vitest';
import { join } from 'node:path';
import { runPythonJson } from '../../reference/python';
import { compareOccupations, type OccupationCast, type CompareOptions } from '../../../shared/compare/index';
import { SA_from_SP_batch } from '../../../shared/seawater/saar';
import { CT_from_t_batch } from '../../../shared/seawater/conversions';

type Raw = {
  station: string;
  cast: string;
  lat: number;
  lon: number;
  minutes: number;
  p: number[];
  t: number[];
  S: number[];
  qc: number[];
};
const ZIP = join(import.meta.dirname, '..', '..', '..', 'fixtures', 'real', 'sr1b-2015', '74JC20150110_nc_ctd.zip');
let casts: OccupationCast[];

beforeAll(() => {
  const raw = runPythonJson<Raw[]>(
    `
import sys, json, zipfile, netCDF4, numpy as np
z = zipfile.ZipFile(sys.argv[1])
out = []
for n in sorted(z.namelist()):
    d = netCDF4.Dataset('m', memory=z.read(n))
    v = lambda k: np.ma.filled(d.variables[k][:].astype(float), np.nan)
    qc = np.maximum(np.maximum(v('pressure_QC'), v('temperature_QC')), v('salinity_QC'))
    out.append(dict(station=str(d.STATION_NUMBER).strip(), cast=str(d.CAST_NUMBER).strip(), lat=float(v('latitude')), lon=float(v('longitude')),
        minutes=float(v('time')), p=v('pressure').tolist(), t=v('temperature').tolist(), S=v('salinity').tolist(), qc=qc.tolist()))
    d.close()
print(json.dumps(out).replace('NaN', 'null'))
`,
    { args: [ZIP] },
  );
  casts = raw
    .map((c) => {
      const p = Float64Array.from(c.p, (v) => v ?? NaN);
      const SA = SA_from_SP_batch(
        Float64Array.from(c.S, (v) => v ?? NaN),
        p,
        c.lon,
        c.lat,
      );
      const CT = CT_from_t_batch(
        SA,
        Float64Array.from(c.t, (v) => v ?? NaN),
        p,
      );
      return {
        station: c.station,
        cast: c.cast,
        lat: c.lat,
        lon: c.lon,
        time: Date.UTC(1980, 0, 1) + c.minutes * 60e3,
        p,
        SA,
        CT,
        C: CT,
        bad: Uint8Array.from(c.qc, (q) => (q === 2 || q === 1 ? 0 : 1)),
      };
    })
    .sort((a, b) => Number(a.station) - Number(b.station));
}, 120_000);

const opts: CompareOptions = {
  ref: 0,
  targets: Float64Array.from({ length: 121 }, (_, i) => 26.0 + 0.02 * i),
  pressure: Float64Array.from({ length: 1201 }, (_, i) => 4 * i),
  handling: 'sort',
  pairDistanceKm: 15,
  positions: 'stations',
};
const finite = (g: Float64Array) => Array.from(g).filter((v) => Number.isFinite(v));

describe('SR1B 2015 (GO-SHIP; CCHDO)', () => {
  it('the line compared with itself gives zero everywhere', () => {
    expect(casts).toHaveLength(30);
    const r = compareOccupations(casts, casts, opts);
    expect(r.pairs).toHaveLength(30);
    expect(r.excluded).toEqual([]);
    expect(r.years).toBe(0);
    for (const g of [
      r.onPressure.diff,
      r.onDensity.heave,
      r.onDensity.diff,
      r.decomposition.waterMassTerm,
      r.decomposition.heaveTerm,
      r.decomposition.residual,
    ]) {
      const v = finite(g);
      expect(v.length).toBeGreaterThan(1000);
      expect(v.every((x) => x === 0)).toBe(true);
    }
    expect(r.transport.every((l) => l.change === 0)).toBe(true);
  });

  it('against a copy displaced by a known heave it gives that heave', () => {
    const delta = (p: number) => 30 * Math.exp(-(((p - 800) / 600) ** 2));
    const later = casts.map((c) => ({
      ...c,
      time: c.time! + 5 * 365.2425 * 86_400_000,
      p: Float64Array.from(c.p, (q) => q + delta(q)),
    }));
    const r = compareOccupations(casts, later, opts);
    expect(r.years).toBeCloseTo(5, 6);
    const nx = r.x.length;
    let n = 0;
    let worst = 0;
    for (let i = 0; i < r.sigma.length; i++)
      for (let j = 0; j < nx; j++) {
        const h = r.onDensity.heave[i * nx + j];
        if (!Number.isFinite(h)) continue;
        n++;
        worst = Math.max(worst, Math.abs(h - delta(r.onDensity.pA[i * nx + j])));
      }
    expect(n).toBeGreaterThan(1000);
    // δ is nearly linear over the 2-dbar bins of the files: the error is ≤ δ''·h²/8 ≈ 1e-4 dbar
    expect(worst).toBeLessThan(0.01);
    expect(Math.max(...finite(r.onDensity.diff).map(Math.abs))).toBeLessThan(1e-6);
    // at the core of the displacement every isopycnal moved by about 30 dbar
    const core = Array.from(r.onDensity.heave).filter(
      (h, k) => Number.isFinite(h) && Math.abs(r.onDensity.pA[k] - 800) < 50,
    );
    expect(core.length).toBeGreaterThan(20);
    expect(Math.min(...core)).toBeGreaterThan(29.5);
  });
});
