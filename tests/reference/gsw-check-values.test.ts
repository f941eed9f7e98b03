/**
 * Every function of the seawater core against the TEOS-10 GSW check values v3.0.
 * source: TEOS-10 GSW check values v3.0, gsw_cv_v3_0.npz in Debian python3-gsw 3.6.16
 * (fixture fixtures/reference/gsw_cv_v3_0.json made by scripts/gsw/make_check_values.py);
 * for dynamic height and geostrophic velocity, the package's own pchip-method check values
 * (geo_strf_dyn_height.npy, geo_strf_velocity.npy in the same package) as it substitutes them.
 * Each check uses the file's own tolerance (the matching `*_ca` key), |ours − expected| < ca,
 * as the check-function list of the file does.
 *
 * Every function is looked up by name in its module; a function that is missing fails its check.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import * as density from '../../shared/seawater/density';
import * as depth from '../../shared/seawater/depth';
import * as stability from '../../shared/seawater/stability';
import * as geostrophy from '../../shared/seawater/geostrophy';
import * as spiciness from '../../shared/seawater/spiciness';
import * as conversions from '../../shared/seawater/conversions';
import * as pss78 from '../../shared/seawater/pss78';
import * as saar from '../../shared/seawater/saar';

type Grid = (number | null)[][];
interface Fixture {
  source: string;
  package: string;
  values: Record<string, unknown>;
}
const fixture = JSON.parse(
  readFileSync(new URL('../../fixtures/reference/gsw_cv_v3_0.json', import.meta.url), 'utf8'),
) as Fixture;
const cv = fixture.values;
const grid = (k: string): Grid => cv[k] as Grid;
const num = (k: string): number => cv[k] as number;
const vec = (k: string): number[] => cv[k] as number[];
const at = (k: string, i: number, c: number): number => grid(k)[i][c] ?? NaN;

type Fn = (...args: number[]) => number;
const modules = { density, depth, stability, geostrophy, spiciness, conversions, pss78, saar };
function fn(module: keyof typeof modules, name: string): Fn | null {
  const f = (modules[module] as Record<string, unknown>)[name];
  return typeof f === 'function' ? (f as Fn) : null;
}

const LEVELS = grid('p_chck_cast').length;
const CASTS = 3;
const lat = vec('lat_chck_cast');
const lon = vec('long_chck_cast');
const pr = num('pr');

/** Largest |ours − expected| over the points where the file has a value; counts misses too. */
function worstAgainst(
  key: string,
  ours: (i: number, c: number) => number,
  casts = CASTS,
): { worst: number; compared: number; where: string } {
  let worst = 0,
    compared = 0,
    where = '';
  for (let c = 0; c < casts; c++) {
    for (let i = 0; i < LEVELS; i++) {
      const expected = at(key, i, c);
      if (Number.isNaN(expected)) continue;
      const d = Math.abs(ours(i, c) - expected);
      compared++;
      if (!(d <= worst)) {
        worst = Number.isNaN(d) ? Infinity : d;
        where = `level ${i}, cast ${c}`;
      }
    }
  }
  return { worst, compared, where };
}

interface PointCheck {
  key: string;
  module: keyof typeof modules;
  name: string;
  args: (f: Fn, i: number, c: number) => number;
}
const SA = (i: number, c: number) => at('SA_chck_cast', i, c);
const CT = (i: number, c: number) => at('CT_chck_cast', i, c);
const t = (i: number, c: number) => at('t_chck_cast', i, c);
const p = (i: number, c: number) => at('p_chck_cast', i, c);
const SP = (i: number, c: number) => at('SP_chck_cast', i, c);

const POINT_CHECKS: PointCheck[] = [
  // this half: density, depth, spiciness
  { key: 'rho', module: 'density', name: 'rho', args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)) },
  { key: 'specvol', module: 'density', name: 'specvol', args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)) },
  { key: 'alpha', module: 'density', name: 'alpha', args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)) },
  { key: 'beta', module: 'density', name: 'beta', args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)) },
  {
    key: 'specvol_anom_standard',
    module: 'density',
    name: 'specvol_anom_standard',
    args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)),
  },
  { key: 'sigma0', module: 'density', name: 'sigma0', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  { key: 'sigma1', module: 'density', name: 'sigma1', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  { key: 'sigma2', module: 'density', name: 'sigma2', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  { key: 'sigma3', module: 'density', name: 'sigma3', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  { key: 'sigma4', module: 'density', name: 'sigma4', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  { key: 'enthalpy', module: 'density', name: 'enthalpy', args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)) },
  {
    key: 'dynamic_enthalpy',
    module: 'density',
    name: 'dynamic_enthalpy',
    args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)),
  },
  { key: 'z_from_p', module: 'depth', name: 'z_from_p', args: (f, i, c) => f(p(i, c), lat[c]) },
  { key: 'p_from_z', module: 'depth', name: 'p_from_z', args: (f, i, c) => f(at('z_from_p', i, c), lat[c]) },
  { key: 'grav', module: 'depth', name: 'grav', args: (f, i, c) => f(lat[c], p(i, c)) },
  { key: 'spiciness0', module: 'spiciness', name: 'spiciness0', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  // the thermodynamic half
  { key: 'SR_from_SP', module: 'saar', name: 'SR_from_SP', args: (f, i, c) => f(SP(i, c)) },
  { key: 'SA_from_SP', module: 'saar', name: 'SA_from_SP', args: (f, i, c) => f(SP(i, c), p(i, c), lon[c], lat[c]) },
  { key: 'CT_from_t', module: 'conversions', name: 'CT_from_t', args: (f, i, c) => f(SA(i, c), t(i, c), p(i, c)) },
  { key: 'pt0_from_t', module: 'conversions', name: 'pt0_from_t', args: (f, i, c) => f(SA(i, c), t(i, c), p(i, c)) },
  { key: 'pt_from_t', module: 'conversions', name: 'pt_from_t', args: (f, i, c) => f(SA(i, c), t(i, c), p(i, c), pr) },
  { key: 't_from_CT', module: 'conversions', name: 't_from_CT', args: (f, i, c) => f(SA(i, c), CT(i, c), p(i, c)) },
  { key: 'pt_from_CT', module: 'conversions', name: 'pt_from_CT', args: (f, i, c) => f(SA(i, c), CT(i, c)) },
  {
    key: 'CT_from_pt',
    module: 'conversions',
    name: 'CT_from_pt',
    args: (f, i, c) => f(SA(i, c), at('pt_from_CT', i, c)),
  },
  { key: 'C_from_SP', module: 'pss78', name: 'C_from_SP', args: (f, i, c) => f(SP(i, c), t(i, c), p(i, c)) },
  {
    key: 'SP_from_C',
    module: 'pss78',
    name: 'SP_from_C',
    args: (f, i, c) => f(at('C_from_SP', i, c), t(i, c), p(i, c)),
  },
  { key: 't90_from_t68', module: 'pss78', name: 't90_from_t68', args: (f, i, c) => f(t(i, c)) },
];

describe(`GSW check values v3.0 (${fixture.source}, ${fixture.package})`, () => {
  for (const check of POINT_CHECKS) {
    const f = fn(check.module, check.name);
    const tol = num(`${check.key}_ca`);
    const title = `${check.name} within ${tol.toExponential(2)} of ${check.key}`;
    it(title, () => {
      expect(f, `shared/seawater/${check.module} exports ${check.name}`).toBeTypeOf('function');
      if (!f) return;
      const r = worstAgainst(check.key, (i, c) => check.args(f, i, c));
      expect(r.compared).toBeGreaterThan(90); // 45 + 45 + 8 levels hold values
      expect(r.worst, `worst at ${r.where}`).toBeLessThan(tol);
    });
  }

  it('Nsquared and its mid-point pressures within n2_ca and p_mid_n2_ca', () => {
    const Nsquared = modules.stability.Nsquared as (
      SA: number[],
      CT: number[],
      p: number[],
      lat: number,
    ) => { N2: Float64Array; p_mid: Float64Array };
    let worstN2 = 0,
      worstP = 0,
      compared = 0;
    for (let c = 0; c < CASTS; c++) {
      const idx = [...Array(LEVELS).keys()].filter((i) => Number.isFinite(p(i, c)));
      const r = Nsquared(
        idx.map((i) => SA(i, c)),
        idx.map((i) => CT(i, c)),
        idx.map((i) => p(i, c)),
        lat[c],
      );
      r.N2.forEach((v, k) => {
        const e = at('n2', k, c);
        if (Number.isNaN(e)) return;
        compared++;
        worstN2 = Math.max(worstN2, Math.abs(v - e));
        worstP = Math.max(worstP, Math.abs(r.p_mid[k] - at('p_mid_n2', k, c)));
      });
    }
    expect(compared).toBeGreaterThan(90);
    expect(worstN2).toBeLessThan(num('n2_ca'));
    expect(worstP).toBeLessThan(num('p_mid_n2_ca'));
  });

  it('geo_strf_dyn_height (p_ref = pr) within geo_strf_dyn_height_ca of the pchip check values', () => {
    const geo = modules.geostrophy.geo_strf_dyn_height as (
      SA: number[],
      CT: number[],
      p: number[],
      p_ref: number,
    ) => Float64Array;
    const D = [0, 1, 2].map((c) =>
      geo(
        [...Array(LEVELS).keys()].map((i) => SA(i, c)),
        [...Array(LEVELS).keys()].map((i) => CT(i, c)),
        [...Array(LEVELS).keys()].map((i) => p(i, c)),
        pr,
      ),
    );
    const r = worstAgainst('geo_strf_dyn_height_pchip', (i, c) => D[c][i]);
    expect(r.compared).toBeGreaterThan(90);
    expect(r.worst, r.where).toBeLessThan(num('geo_strf_dyn_height_ca'));
  });

  it('geostrophic_velocity between adjacent casts within geo_strf_velocity_ca (pchip values; radius 6371 km as the package)', () => {
    const vel = modules.geostrophy.geostrophic_velocity as (
      a: number[],
      b: number[],
      lonA: number,
      latA: number,
      lonB: number,
      latB: number,
      o: { radius: number },
    ) => Float64Array;
    const D = (c: number) => [...Array(LEVELS).keys()].map((i) => at('geo_strf_dyn_height_pchip', i, c));
    const v = [0, 1].map((c) => vel(D(c), D(c + 1), lon[c], lat[c], lon[c + 1], lat[c + 1], { radius: 6371e3 }));
    const r = worstAgainst('geo_strf_velocity_pchip', (i, c) => v[c][i], 2);
    expect(r.compared).toBeGreaterThan(50);
    expect(r.worst, r.where).toBeLessThan(num('geo_strf_velocity_ca'));
  });

  it('geostrophic_velocity with the pressure-shortened distance matches the v3.0 file (its own D input)', () => {
    const vel = modules.geostrophy.geostrophic_velocity as (
      a: number[],
      b: number[],
      lonA: number,
      latA: number,
      lonB: number,
      latB: number,
      o: object,
    ) => Float64Array;
    const col = (k: string, c: number) => [...Array(LEVELS).keys()].map((i) => at(k, i, c));
    const v = [0, 1].map((c) =>
      vel(col('geo_strf_dyn_height', c), col('geo_strf_dyn_height', c + 1), lon[c], lat[c], lon[c + 1], lat[c + 1], {
        radius: 6371e3,
        p_a: col('p_chck_cast', c),
        p_b: col('p_chck_cast', c + 1),
      }),
    );
    const r = worstAgainst('geo_strf_velocity', (i, c) => v[c][i], 2);
    expect(r.compared).toBeGreaterThan(50);
    expect(r.worst, r.where).toBeLessThan(num('geo_strf_velocity_ca'));
  });

  it('distance between adjacent casts at the mid pressure within distance_ca', () => {
    const distance = modules.geostrophy.distance as Fn;
    const r = worstAgainst(
      'distance',
      (i, c) => distance(lon[c], lat[c], lon[c + 1], lat[c + 1], 0.5 * (p(i, c) + p(i, c + 1)), 6371e3),
      2,
    );
    expect(r.compared).toBeGreaterThan(50);
    expect(r.worst, r.where).toBeLessThan(num('distance_ca'));
  });

  it('Coriolis parameter f within f_ca', () => {
    const f = modules.geostrophy.f as Fn;
    for (let c = 0; c < CASTS; c++) expect(Math.abs(f(lat[c]) - vec('f')[c])).toBeLessThan(num('f_ca'));
  });
});
