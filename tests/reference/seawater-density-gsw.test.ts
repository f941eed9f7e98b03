/**
 * Live randomised cross-check of the density half of the seawater core against the reference
 * library itself. source: python3-gsw live reference (Debian python3-gsw 3.6.16, run through
 * /usr/bin/python3 in one batch call). Targets from docs/science.md §5: |Δσ| ≤ 1e-8 kg/m³,
 * |ΔN²| ≤ 1e-12 s⁻², |ΔD| ≤ 1e-6 m²/s²; rho, alpha, beta, specvol, z_from_p, grav, enthalpy and
 * spiciness0 are held to the same kind of bound (stated beside each).
 *
 * Points span the ocean: SP 2–42 (SA = SR here; the atlas anomaly does not matter to the density
 * polynomial), CT from near freezing to 35 °C, p 0–6500 dbar, latitudes −80…80. The casts have
 * random level spacing from 0.5 to 250 dbar so that both of the library's integration paths for
 * dynamic height (plain trapezoid and the pchip-refined grid) are exercised, with reference
 * pressures at the surface, on a level, between levels and above the first level.
 */
import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from './python';
import { afterAll, describe, expect, it } from 'vitest';
import {
  alpha,
  beta,
  enthalpy,
  rho,
  sigma_batch,
  sigma0,
  sigma1,
  sigma2,
  sigma3,
  sigma4,
  specvol,
} from '../../shared/seawater/density';
import { grav, p_from_z, z_from_p } from '../../shared/seawater/depth';
import { Nsquared } from '../../shared/seawater/stability';
import { geo_strf_dyn_height, geo_strf_velocity } from '../../shared/seawater/geostrophy';
import { spiciness0 } from '../../shared/seawater/spiciness';

const rng = mulberry32;
const rand = rng(20240611);
const uniform = (lo: number, hi: number) => lo + (hi - lo) * rand();
const uPS = 35.16504 / 35;

// ---- points -------------------------------------------------------------------------------
const N_POINTS = 12_000;
const pts = { SA: [] as number[], CT: [] as number[], p: [] as number[], lat: [] as number[] };
for (let k = 0; k < N_POINTS; k++) {
  const SP = uniform(2, 42);
  const p = uniform(0, 6500);
  const freezing = -0.0575 * SP - 7.53e-4 * p; // rough freezing point, °C: stay in liquid water
  pts.SA.push(SP * uPS);
  pts.CT.push(uniform(Math.max(-2, freezing), 35));
  pts.p.push(p);
  pts.lat.push(uniform(-80, 80));
}

// ---- casts --------------------------------------------------------------------------------
interface Cast {
  SA: number[];
  CT: number[];
  p: number[];
  lat: number;
  p_ref: number;
}
const casts: Cast[] = [];
for (let c = 0; c < 160; c++) {
  const lat = uniform(-70, 70);
  const p: number[] = [];
  let q = c % 4 === 3 ? uniform(2, 20) : 0; // some casts start below the surface
  const fine = c % 3 === 0; // every third cast 1-dbar-or-finer, as from a binned CTD
  while (q < uniform(1500, 6500) && p.length < 400) {
    p.push(q);
    q += fine ? (c % 2 ? 1 : 0.5) : uniform(2, 250);
  }
  const sTop = uniform(30, 37),
    sDeep = uniform(34.6, 35),
    tTop = uniform(5, 30),
    tDeep = uniform(-0.5, 3);
  const scale = uniform(200, 1000);
  const SA = p.map((x) => (sDeep + (sTop - sDeep) * Math.exp(-x / scale) + uniform(-0.01, 0.01)) * uPS);
  const CT = p.map((x) => tDeep + (tTop - tDeep) * Math.exp(-x / (0.7 * scale)) + uniform(-0.02, 0.02));
  // reference pressure: surface, a level, between two levels, or shallower than the first level
  const mode = c % 4;
  const p_ref = mode === 0 ? 0 : mode === 1 ? p[Math.floor(p.length / 2)] : mode === 2 ? 0.5 * (p[5] + p[6]) + 0.3 : 0;
  casts.push({ SA, CT, p, lat, p_ref });
}
// pairs on a shared grid for geostrophic velocity (the second cast is the first, perturbed)
const pairs = casts
  .filter((c) => c.p[0] === 0)
  .slice(0, 20)
  .map((a, k) => ({
    a,
    b: { ...a, SA: a.SA.map((s) => s + uniform(-0.05, 0.05)), CT: a.CT.map((t) => t + uniform(-0.3, 0.3)) },
    lonA: uniform(-180, 180),
    latA: a.lat,
    dLon: uniform(0.05, 1),
    dLat: uniform(-0.5, 0.5),
    p_ref: k % 2 ? a.p[a.p.length - 1] : 1000,
  }));

const PY = String.raw`
import json, sys
import numpy as np
import gsw
d = json.load(sys.stdin)
P = d['points']
SA, CT, p, lat = (np.array(P[k]) for k in ('SA', 'CT', 'p', 'lat'))
out = {
  'rho': gsw.rho(SA, CT, p), 'specvol': gsw.specvol(SA, CT, p),
  'alpha': gsw.alpha(SA, CT, p), 'beta': gsw.beta(SA, CT, p),
  'sigma0': gsw.sigma0(SA, CT), 'sigma1': gsw.sigma1(SA, CT), 'sigma2': gsw.sigma2(SA, CT),
  'sigma3': gsw.sigma3(SA, CT), 'sigma4': gsw.sigma4(SA, CT),
  'enthalpy': gsw.enthalpy(SA, CT, p), 'spiciness0': gsw.spiciness0(SA, CT),
  'z': gsw.z_from_p(p, lat), 'grav': gsw.grav(lat, p),
}
out = {k: v.tolist() for k, v in out.items()}
out['casts'] = []
for c in d['casts']:
  s, t, q = np.array(c['SA']), np.array(c['CT']), np.array(c['p'])
  n2, pm = gsw.Nsquared(s, t, q, lat=np.full(q.shape, c['lat']))
  D = gsw.geo_strf_dyn_height(s, t, q, p_ref=c['p_ref'])
  out['casts'].append({'N2': n2.tolist(), 'p_mid': pm.tolist(), 'D': [None if np.isnan(x) else x for x in D.tolist()]})
out['pairs'] = []
for pr in d['pairs']:
  q = np.array(pr['p'])
  Da = gsw.geo_strf_dyn_height(np.array(pr['SAa']), np.array(pr['CTa']), q, p_ref=pr['p_ref'])
  Db = gsw.geo_strf_dyn_height(np.array(pr['SAb']), np.array(pr['CTb']), q, p_ref=pr['p_ref'])
  v, _, _ = gsw.geostrophic_velocity(np.stack([Da, Db], axis=1), np.array(pr['lon']), np.array(pr['lat']), axis=0)
  out['pairs'].append([None if np.isnan(x) else x for x in v[:, 0].tolist()])
json.dump(out, sys.stdout, allow_nan=False)
`;
import { mulberry32 } from '../../scripts/lib/prng';

interface Ref {
  [k: string]: unknown;
  casts: { N2: number[]; p_mid: number[]; D: (number | null)[] }[];
  pairs: (number | null)[][];
}
const ref = JSON.parse(
  execFileSync(GSW_PYTHON, ['-c', PY], {
    input: JSON.stringify({
      points: pts,
      casts,
      pairs: pairs.map((q) => ({
        p: q.a.p,
        SAa: q.a.SA,
        CTa: q.a.CT,
        SAb: q.b.SA,
        CTb: q.b.CT,
        p_ref: q.p_ref,
        lon: [q.lonA, q.lonA + q.dLon],
        lat: [q.latA, q.latA + q.dLat],
      })),
    }),
    maxBuffer: 256 * 1024 * 1024,
  }).toString(),
) as Ref;
const refCol = (k: string) => ref[k] as number[];

/** Measured worst differences, printed once at the end for the record. */
const measured: Record<string, number> = {};
afterAll(() => console.info('worst |ours − python3-gsw|:', JSON.stringify(measured)));
const note = (name: string, worst: number): number => ((measured[name] = Math.max(measured[name] ?? 0, worst)), worst);

function worstPointwise(ours: (k: number) => number, expected: number[]): number {
  let worst = 0;
  for (let k = 0; k < expected.length; k++) {
    const d = Math.abs(ours(k) - expected[k]);
    if (!(d <= worst)) worst = Number.isNaN(d) ? Infinity : d;
  }
  return worst;
}

describe('density half vs python3-gsw live reference (12 000 random ocean points, 160 casts)', () => {
  const { SA, CT, p, lat } = pts;
  it('sigma0 … sigma4 within 1e-8 kg/m³ (docs/science.md §5), scalar and batch', () => {
    const fns = [sigma0, sigma1, sigma2, sigma3, sigma4];
    fns.forEach((fn, r) => {
      expect(
        note(
          'sigma',
          worstPointwise((k) => fn(SA[k], CT[k]), refCol(`sigma${r}`)),
        ),
        `sigma${r}`,
      ).toBeLessThanOrEqual(1e-8);
      const batch = sigma_batch(Float64Array.from(SA), Float64Array.from(CT), r * 1000);
      expect(
        worstPointwise((k) => batch[k], refCol(`sigma${r}`)),
        `sigma${r} batch`,
      ).toBeLessThanOrEqual(1e-8);
    });
  });
  it('rho within 1e-8 kg/m³ and specvol within 1e-14 m³/kg', () => {
    expect(
      note(
        'rho',
        worstPointwise((k) => rho(SA[k], CT[k], p[k]), refCol('rho')),
      ),
    ).toBeLessThanOrEqual(1e-8);
    expect(worstPointwise((k) => specvol(SA[k], CT[k], p[k]), refCol('specvol'))).toBeLessThanOrEqual(1e-14);
  });
  it('alpha and beta within 1e-13 (≈ 1e-9 relative)', () => {
    expect(
      note(
        'alpha',
        worstPointwise((k) => alpha(SA[k], CT[k], p[k]), refCol('alpha')),
      ),
    ).toBeLessThanOrEqual(1e-13);
    expect(
      note(
        'beta',
        worstPointwise((k) => beta(SA[k], CT[k], p[k]), refCol('beta')),
      ),
    ).toBeLessThanOrEqual(1e-13);
  });
  it('enthalpy within 1e-6 J/kg and spiciness0 within 1e-8 kg/m³', () => {
    expect(worstPointwise((k) => enthalpy(SA[k], CT[k], p[k]), refCol('enthalpy'))).toBeLessThanOrEqual(1e-6);
    expect(worstPointwise((k) => spiciness0(SA[k], CT[k]), refCol('spiciness0'))).toBeLessThanOrEqual(1e-8);
  });
  it('z_from_p within 1e-7 m, grav within 1e-12 m/s², and p_from_z inverts to 1e-8 dbar', () => {
    expect(
      note(
        'z_from_p',
        worstPointwise((k) => z_from_p(p[k], lat[k]), refCol('z')),
      ),
    ).toBeLessThanOrEqual(1e-7);
    expect(worstPointwise((k) => grav(lat[k], p[k]), refCol('grav'))).toBeLessThanOrEqual(1e-12);
    expect(worstPointwise((k) => p_from_z(refCol('z')[k], lat[k]), p)).toBeLessThanOrEqual(1e-8);
  });
  it('Nsquared within 1e-12 s⁻² at every mid-point, p_mid exact', () => {
    let worst = 0,
      worstP = 0,
      n = 0;
    casts.forEach((c, i) => {
      const r = Nsquared(c.SA, c.CT, c.p, c.lat);
      const e = ref.casts[i];
      expect(r.N2.length).toBe(e.N2.length);
      r.N2.forEach((v, k) => {
        worst = Math.max(worst, Math.abs(v - e.N2[k]));
        worstP = Math.max(worstP, Math.abs(r.p_mid[k] - e.p_mid[k]));
        n++;
      });
    });
    expect(n).toBeGreaterThan(10_000);
    expect(note('N2', worst)).toBeLessThanOrEqual(1e-12);
    expect(worstP).toBeLessThanOrEqual(1e-9);
  });
  it('geo_strf_dyn_height within 1e-6 m²/s² on every level of every cast', () => {
    let worst = 0,
      n = 0;
    casts.forEach((c, i) => {
      const D = geo_strf_dyn_height(c.SA, c.CT, c.p, c.p_ref);
      ref.casts[i].D.forEach((e, k) => {
        if (e === null) {
          expect(D[k]).toBeNaN();
          return;
        }
        worst = Math.max(worst, Math.abs(D[k] - e));
        n++;
      });
    });
    expect(n).toBeGreaterThan(10_000);
    expect(note('D', worst)).toBeLessThanOrEqual(1e-6);
  });
  it('geostrophic velocity between cast pairs matches gsw.geostrophic_velocity (6371 km radius as the library) within 1e-9 m/s', () => {
    let worst = 0,
      compared = 0;
    pairs.forEach((q, i) => {
      const r = geo_strf_velocity(
        { SA: q.a.SA, CT: q.a.CT, lon: q.lonA, lat: q.latA },
        { SA: q.b.SA, CT: q.b.CT, lon: q.lonA + q.dLon, lat: q.latA + q.dLat },
        q.a.p,
        q.p_ref,
        { radius: 6371e3 },
      );
      ref.pairs[i].forEach((e, k) => {
        if (e === null) {
          expect(r.v[k]).toBeNaN();
          return;
        }
        worst = Math.max(worst, Math.abs(r.v[k] - e));
        compared++;
      });
    });
    expect(compared).toBeGreaterThan(1000);
    expect(note('v', worst)).toBeLessThanOrEqual(1e-9);
  });
});
