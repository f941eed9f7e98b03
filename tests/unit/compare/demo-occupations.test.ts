// The invented demo line occupied twice (fixtures/demo: TS-26-04; fixtures/demo-earlier: TS-16-02,
// scripts/make-demo-earlier.ts): the comparison must find the two planted changes where they were
// planted — the heave of the thermocline isopycnals in the northern half and the freshening along
// a σ0 band — in magnitude within 10 % and in place within one station. The split into heave and
// water-mass change is that of Bindoff & McDougall (1994, J. Phys. Oceanogr. 24, 1137–1152).
import { describe, it, expect, beforeAll } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { parseUpload } from '../../../server/parsers/index';
import { processCast } from '../../../server/services/processCast';
import { compareOccupations, type OccupationCast, type Comparison } from '../../../shared/compare/index';
import { PLANTS, plantedHeave, plantedFreshening } from '../../../scripts/make-demo-earlier';

const ROOT = join(import.meta.dirname, '..', '..', '..', 'fixtures');
const num = (s: string) => Number(s.replace(/\D/g, ''));

async function occupation(dir: string, prop: 'SA' | 'CT'): Promise<OccupationCast[]> {
  const out: OccupationCast[] = [];
  for (const f of readdirSync(join(ROOT, dir, 'casts')).sort()) {
    const r = await parseUpload(f, readFileSync(join(ROOT, dir, 'casts', f)));
    if (!r.ok) throw new Error(f);
    for (const c of r.casts) {
      // the main line's first casts (the cross-line, the time-series site and repeat casts are not on it)
      if (c.metadata.cast !== '1' || !/^CP-\d\d$/.test(c.metadata.station ?? '')) continue;
      const pc = processCast(c, { inversionThreshold: 0.01 });
      if (!pc.ok) throw new Error(f);
      const col = (n: string) => pc.cast.columns.find((k) => k.name === n)!.values as Float64Array;
      out.push({
        station: c.metadata.station!,
        cast: '1',
        lon: c.metadata.longitude!,
        lat: c.metadata.latitude!,
        time: Date.parse(c.metadata.time!),
        p: col('pressure'),
        SA: col('SA'),
        CT: col('CT'),
        C: col(prop),
      });
    }
  }
  return out.sort((a, b) => num(a.station) - num(b.station));
}

const frac = (station: string) => (num(station) - 1) / 42;
let r: Comparison;

beforeAll(async () => {
  const a = await occupation('demo-earlier', 'SA');
  const b = await occupation('demo', 'SA');
  r = compareOccupations(a, b, {
    ref: 0,
    targets: Float64Array.from({ length: 141 }, (_, i) => 25.0 + 0.02 * i),
    pressure: Float64Array.from({ length: 1001 }, (_, i) => 2 * i),
    handling: 'sort',
    pairDistanceKm: 20,
    positions: 'stations',
  });
}, 60_000);

describe('demo: two occupations of the Corrow Passage line', () => {
  it('pairs the stations both occupied, ten years apart', () => {
    expect(r.years).toBeGreaterThan(9.9);
    expect(r.years).toBeLessThan(10.1);
    expect(r.pairs.length).toBe(39);
    expect(r.pairs.every((p) => p.stationA === p.stationB && p.offsetKm < 3)).toBe(true);
  });

  it('recovers the planted heave in the northern half, within 10 % and one station', () => {
    const nx = r.x.length;
    const ns = r.sigma.length;
    const atCore: { station: string; heave: number; planted: number }[] = [];
    for (let j = 0; j < nx; j++) {
      // the isopycnal that the earlier occupation had nearest the core pressure of the plant
      let best = -1;
      for (let i = 0; i < ns; i++) {
        const pA = r.onDensity.pA[i * nx + j];
        if (
          Number.isFinite(pA) &&
          (best < 0 ||
            Math.abs(pA - PLANTS.heave.pCentre) < Math.abs(r.onDensity.pA[best * nx + j] - PLANTS.heave.pCentre))
        )
          best = i;
      }
      const st = r.pairs[j].stationA;
      atCore.push({
        station: st,
        heave: r.onDensity.heave[best * nx + j],
        planted: plantedHeave(frac(st), r.onDensity.pA[best * nx + j]),
      });
    }
    for (const s of atCore) {
      if (s.planted > 0.9 * PLANTS.heave.dbar) expect(Math.abs(s.heave - s.planted)).toBeLessThan(0.1 * s.planted);
      if (s.planted < 0.05 * PLANTS.heave.dbar) expect(Math.abs(s.heave)).toBeLessThan(0.1 * PLANTS.heave.dbar);
    }
    // where the heave first passes half the plant, against where the plant does
    const found = atCore.findIndex((s) => s.heave > 0.5 * PLANTS.heave.dbar);
    const planted = atCore.findIndex((s) => s.planted > 0.5 * PLANTS.heave.dbar);
    expect(planted).toBeGreaterThan(0);
    expect(Math.abs(found - planted)).toBeLessThanOrEqual(1);
    // and the decomposition on pressure puts it in the heave term, not the water-mass term
    const i450 = r.pressure.indexOf(450);
    const north = atCore.map((s, j) => (s.planted > 0.9 * PLANTS.heave.dbar ? j : -1)).filter((j) => j >= 0);
    for (const j of north) {
      const o = i450 * nx + j;
      expect(Math.abs(r.decomposition.heave[o] - PLANTS.heave.dbar)).toBeLessThan(0.1 * PLANTS.heave.dbar);
    }
  });

  it('recovers the planted freshening along its σ0 band at every station, within 10 %', () => {
    const nx = r.x.length;
    const ic = Array.from(r.sigma).findIndex((s) => Math.abs(s - PLANTS.freshening.sigma0Centre) < 1e-9);
    const expected = (plantedFreshening(PLANTS.freshening.sigma0Centre) * 35.16504) / 35; // ΔSP → ΔSA (Reference-Salinity factor)
    let stations = 0;
    for (let j = 0; j < nx; j++) {
      const d = r.onDensity.diff[ic * nx + j];
      if (!Number.isFinite(d)) continue;
      stations++;
      expect(Math.abs(d - expected)).toBeLessThan(0.1 * Math.abs(expected));
    }
    expect(stations).toBeGreaterThan(30);
    // the band: the along-line mean change is most negative within one band width of the planted centre
    const m = Array.from(r.means.onDensity.diff);
    let k = 0;
    for (let i = 0; i < m.length; i++) if (Number.isFinite(m[i]) && m[i] < m[k]) k = i;
    expect(Math.abs(r.sigma[k] - PLANTS.freshening.sigma0Centre)).toBeLessThanOrEqual(PLANTS.freshening.sigma0Width);
    // well away from the band, no change on isopycnals
    const far = Array.from(r.sigma).findIndex((s) => Math.abs(s - 26.2) < 1e-9);
    expect(Math.abs(m[far])).toBeLessThan(0.1 * Math.abs(expected));
  });
});
