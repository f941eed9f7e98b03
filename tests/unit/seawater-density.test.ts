/**
 * Unit checks of the density half that need no outside library: common-practice facts of the
 * trade, internal consistency of the polynomial family, and analytic cases.
 */
import { describe, expect, it } from 'vitest';
import {
  alpha,
  beta,
  dynamic_enthalpy,
  rho,
  rho_batch,
  sigma0,
  sigma0_batch,
  sigma2,
  sigma_batch,
  sigma_pr,
  specvol,
  specvol_alpha_beta,
  SSO,
} from '../../shared/seawater/density';
import { z_from_p } from '../../shared/seawater/depth';
import { Nsquared } from '../../shared/seawater/stability';
import {
  distance,
  f,
  geo_strf_dyn_height,
  geostrophic_velocity,
  pchipSlopesFritschButland,
  geo_strf_velocity,
} from '../../shared/seawater/geostrophy';
import { mixed_layer_depth } from '../../shared/seawater/mld';

describe('density: common practice', () => {
  it('open-ocean surface σ0 lies between 20 and 27 kg/m³ (common practice)', () => {
    // typical open-ocean surface waters: tropical warm/fresh to subpolar cold/salty
    for (const [SA, CT] of [
      [34.2, 29],
      [35.2, 26],
      [36.8, 24],
      [35.0, 12],
      [34.2, 4],
      [33.5, 1],
    ]) {
      const s = sigma0(SA, CT);
      expect(s).toBeGreaterThan(20);
      expect(s).toBeLessThan(27.9);
    }
    expect(sigma0(35.2, 26)).toBeLessThan(27);
  });
  it('density increases with pressure in a stable column, and N² > 0 there (common practice)', () => {
    const p = [0, 100, 500, 1000, 2000, 4000];
    const SA = [35.0, 35.1, 35.0, 34.9, 34.9, 34.9];
    const CT = [20, 15, 8, 4, 2.5, 1.5];
    for (let i = 1; i < p.length; i++)
      expect(rho(SA[i], CT[i], p[i])).toBeGreaterThan(rho(SA[i - 1], CT[i - 1], p[i - 1]));
    for (const v of Nsquared(SA, CT, p, 30).N2) expect(v).toBeGreaterThan(0);
  });
  it('α > 0 for warm water, β ≈ 7.4e-4 kg/g, and σ rises with the reference pressure (common practice)', () => {
    expect(alpha(35, 15, 0)).toBeGreaterThan(1e-4);
    expect(beta(35, 15, 0)).toBeGreaterThan(7e-4);
    expect(beta(35, 15, 0)).toBeLessThan(8e-4);
    expect(sigma2(35, 2)).toBeGreaterThan(sigma0(35, 2) + 9);
  });
});

describe('density: internal consistency of the polynomial', () => {
  it('rho = 1/specvol, sigma_pr(.., p) = rho(.., p) − 1000 and the batch forms equal the scalar forms', () => {
    const SA = Float64Array.from([0, 10, 34.5, 35.16504, 40]);
    const CT = Float64Array.from([0, 5, 3, 15, 30]);
    const p = Float64Array.from([0, 500, 1000, 3000, 6000]);
    const r = rho_batch(SA, CT, p);
    for (const pr of [0, 1000, 2000, 3000, 4000, 1234.5]) {
      const s = sigma_batch(SA, CT, pr);
      SA.forEach((_, i) => {
        expect(s[i]).toBeCloseTo(rho(SA[i], CT[i], pr) - 1000, 10);
        expect(s[i]).toBe(sigma_pr(SA[i], CT[i], pr));
      });
    }
    SA.forEach((_, i) => {
      expect(r[i]).toBe(1 / specvol(SA[i], CT[i], p[i]));
      expect(sigma0_batch(SA, CT)[i]).toBe(sigma0(SA[i], CT[i]));
    });
  });
  it('alpha and beta equal centred finite differences of specvol (to 1e-7 relative)', () => {
    for (const [SA, CT, p] of [
      [35, 10, 1000],
      [34, 2, 4000],
      [36.5, 25, 10],
    ]) {
      const h = 1e-4;
      const v = specvol(SA, CT, p);
      const dvdT = (specvol(SA, CT + h, p) - specvol(SA, CT - h, p)) / (2 * h);
      const dvdS = (specvol(SA + h, CT, p) - specvol(SA - h, CT, p)) / (2 * h);
      expect(Math.abs(alpha(SA, CT, p) - dvdT / v) / alpha(SA, CT, p)).toBeLessThan(1e-7);
      expect(Math.abs(beta(SA, CT, p) + dvdS / v) / beta(SA, CT, p)).toBeLessThan(1e-7);
      const all = specvol_alpha_beta(SA, CT, p);
      expect(all.alpha).toBe(alpha(SA, CT, p));
      expect(all.beta).toBe(beta(SA, CT, p));
    }
  });
  it('dynamic enthalpy is the pressure integral of specvol (Simpson rule, 1e-8 relative)', () => {
    const SA = 35,
      CT = 5,
      P = 3000,
      m = 600;
    let s = 0;
    for (let k = 0; k <= m; k++) {
      const w = k === 0 || k === m ? 1 : k % 2 ? 4 : 2;
      s += w * specvol(SA, CT, (P * k) / m);
    }
    const integral = ((s * (P / m)) / 3) * 1e4;
    expect(Math.abs(dynamic_enthalpy(SA, CT, P) - integral) / integral).toBeLessThan(1e-8);
  });
  it('out-of-range inputs come back NaN (ranges.ts), scalar and batch', () => {
    expect(rho(60, 10, 0)).toBeNaN();
    expect(sigma0(35, 45)).toBeNaN();
    expect(sigma0(Number.NaN, 10)).toBeNaN();
    const s = sigma0_batch(Float64Array.from([35, 60, Number.NaN]), Float64Array.from([10, 10, 10]));
    expect(Number.isFinite(s[0])).toBe(true);
    expect(s[1]).toBeNaN();
    expect(s[2]).toBeNaN();
  });
});

describe('geostrophy: analytic cases', () => {
  it('a standard-ocean column (SSO, 0 °C) has zero dynamic height anomaly at every level', () => {
    const p = [0, 3, 50, 51, 400, 2000];
    const D = geo_strf_dyn_height(
      p.map(() => SSO),
      p.map(() => 0),
      p,
      0,
    );
    for (const v of D) expect(Math.abs(v)).toBeLessThan(1e-12);
  });
  it('uniform water: D(p) matches a fine Simpson integral of −δ dP, whatever the level spacing', () => {
    // For SA, CT uniform, D(p) = −∫ δ(p') dP'; compare with a fine Simpson integral of δ.
    const p = [0, 10, 250, 700, 1500];
    const D = geo_strf_dyn_height(
      p.map(() => 34.0),
      p.map(() => 10),
      p,
      0,
    );
    const delta = (q: number) => specvol(34, 10, q) - specvol(SSO, 0, q);
    p.forEach((P, i) => {
      const m = 2000;
      let s = 0;
      for (let k = 0; k <= m; k++) s += (k === 0 || k === m ? 1 : k % 2 ? 4 : 2) * delta((P * k) / m);
      const exact = -((s * (P / m)) / 3) * 1e4;
      expect(Math.abs(D[i] - exact)).toBeLessThan(1e-7); // trapezoid on the 1-dbar grid
    });
  });
  it('D is zero at p_ref and changes sign across it; NaN levels are skipped and stay NaN', () => {
    const p = [0, 100, 200, 300, Number.NaN, 500];
    const SA = [35, 35, 34.9, 34.8, 34.8, 34.8],
      CT = [20, 15, 10, 6, 5, 4];
    const D = geo_strf_dyn_height(SA, CT, p, 200);
    expect(D[2]).toBe(0);
    expect(D[0]).toBeGreaterThan(0);
    expect(D[5]).toBeLessThan(0);
    expect(D[4]).toBeNaN();
    expect(geo_strf_dyn_height(SA, CT, p, 900).every(Number.isNaN)).toBe(true); // p_ref below the cast
  });
  it('pchip slopes keep monotone data monotone and are zero at extrema (Fritsch & Carlson 1980)', () => {
    const x = [0, 1, 2, 3, 4],
      y = [0, 1, 1.5, 1, 3];
    const d = pchipSlopesFritschButland(x, y);
    expect(d[2]).toBe(0); // local maximum
    expect(d[1]).toBeGreaterThan(0);
    expect(d[3]).toBe(0); // local minimum
  });
  it('geostrophic velocity: v = ΔD/(fL); one degree of longitude on the equator-free 45°N circle', () => {
    const L = distance(0, 45, 1, 45);
    // great-circle arc between points one degree apart on a parallel, on a sphere of mean radius
    const angle = 2 * Math.asin(Math.cos((45 * Math.PI) / 180) * Math.sin(Math.PI / 360));
    expect(L).toBeCloseTo(6371008.8 * angle, 6);
    const v = geostrophic_velocity([0, 1], [0.1, 1.2], 0, 45, 1, 45);
    expect(v[0]).toBeCloseTo(0.1 / (f(45) * L), 12);
    expect(v[1]).toBeCloseTo(0.2 / (f(45) * L), 12);
  });
  it('deepest-common-level reference: velocity is zero there and the level is reported', () => {
    const p = [0, 100, 500, 1000, 1500];
    const a = { SA: [35, 35, 34.9, 34.8, 34.8], CT: [20, 15, 8, 5, 4], lon: 10, lat: -30 };
    const b = { SA: [35.1, 35, 34.9, 34.8, Number.NaN], CT: [22, 16, 9, 5, Number.NaN], lon: 10.5, lat: -30 };
    const r = geo_strf_velocity(a, b, p, 'deepest_common');
    expect(r.p_ref).toBe(1000);
    expect(Math.abs(r.v[3])).toBe(0);
    expect(r.v[4]).toBeNaN();
    expect(Math.abs(r.v[0])).toBeGreaterThan(0.01);
  });
});

describe('depth and mixed layer', () => {
  it('1 dbar ≈ 1 m of depth to within 1–2 % in the upper ocean (common practice)', () => {
    for (const lat of [0, 30, 60, 80]) {
      for (const p of [10, 100, 500, 1000]) {
        const depth = -z_from_p(p, lat);
        expect(Math.abs(depth / p - 1)).toBeLessThan(0.02);
      }
    }
  });
  it('mixed layer: a homogeneous layer over a linear gradient ends where Δσ0 = threshold (analytic case)', () => {
    // σ0 = 25 down to 60 dbar, then rising 0.01 kg/m³ per dbar: the 0.03 threshold is met at 63 dbar.
    const p = Array.from({ length: 101 }, (_, i) => i);
    const s = p.map((q) => (q <= 60 ? 25 : 25 + 0.01 * (q - 60)));
    const r = mixed_layer_depth(s, p);
    expect(r.status).toBe('ok');
    expect(r.p_mld).toBeCloseTo(63, 10);
    expect(mixed_layer_depth(s, p, { threshold: 0.125 }).p_mld).toBeCloseTo(72.5, 10);
    expect(
      mixed_layer_depth(
        s.map(() => 25),
        p,
      ).status,
    ).toBe('mixed_to_bottom');
    expect(mixed_layer_depth(s.slice(20), p.slice(20)).status).toBe('no_reference');
  });
});
