// Analytic checks of the comparison of two occupations. The decomposition and every expectation
// below are those of Bindoff & McDougall (1994, "Diagnosing climate change and ocean ventilation
// using hydrographic data", J. Phys. Oceanogr. 24, 1137–1152): ΔC|p ≈ ΔC|σ − (∂C/∂p)·Δp|σ, the
// remainder being of second order in the displacement.
import { describe, it, expect } from 'vitest';
import { compareOccupations, type OccupationCast, type CompareOptions } from '../../../shared/compare/index';
import { sigma_batch } from '../../../shared/seawater/density';

const N = 8;
const LEVELS = 1501; // 0–1500 dbar every dbar
const ct = (p: number, f: number) => 2 + (17 + f) * Math.exp(-p / 400);
const sa = (p: number, f: number) => 34.95 - (0.45 + 0.05 * f) * Math.exp(-p / 500);

/** The earlier occupation: N stations 0.2° apart along 40° S, a smooth stable thermocline. */
function occupationA(): OccupationCast[] {
  return Array.from({ length: N }, (_, i) => {
    const f = i / (N - 1);
    const p = Float64Array.from({ length: LEVELS }, (_, k) => k);
    const CT = Float64Array.from(p, (q) => ct(q, f));
    return {
      station: `A${i + 1}`,
      cast: '1',
      lon: 10 + 0.2 * i,
      lat: -40,
      time: Date.UTC(2016, 0, 10),
      p,
      CT,
      SA: Float64Array.from(p, (q) => sa(q, f)),
      C: CT,
    };
  });
}

/** B = A with every parcel moved down by δ(p): same values, pressures p + δ(p). */
function heaved(a: OccupationCast[], delta: (p: number) => number): OccupationCast[] {
  return a.map((c) => ({
    ...c,
    station: c.station.replace('A', 'B'),
    time: Date.UTC(2026, 0, 10),
    p: Float64Array.from(c.p, (q) => q + delta(q)),
  }));
}

const opts = (over: Partial<CompareOptions> = {}): CompareOptions => ({
  ref: 0,
  targets: Float64Array.from({ length: 60 }, (_, i) => 25.3 + 0.03 * i),
  pressure: Float64Array.from({ length: 1401 }, (_, i) => i),
  handling: 'sort',
  pairDistanceKm: 20,
  positions: 'stations',
  ...over,
});

const finite = (g: Float64Array) => Array.from(g).filter((v) => Number.isFinite(v));
const maxAbs = (g: Float64Array) => finite(g).reduce((m, v) => Math.max(m, Math.abs(v)), 0);

describe('pure heave (Bindoff & McDougall 1994)', () => {
  const delta = (amp: number) => (p: number) => amp * Math.sin((Math.PI * p) / 3000) + 0.5 * amp;
  const a = occupationA();

  it('ΔC|σ vanishes and Δp|σ equals the displacement δ on every isopycnal', () => {
    const d = delta(20);
    const r = compareOccupations(a, heaved(a, d), opts());
    expect(r.pairs).toHaveLength(N);
    expect(finite(r.onDensity.diff).length).toBeGreaterThan(200);
    expect(maxAbs(r.onDensity.diff)).toBeLessThan(1e-6);
    // The parcel at pA on each isopycnal moved to pA + δ(pA); the heave is δ at A's pressure.
    let worst = 0;
    r.onDensity.pA.forEach((pA, i) => {
      const h = r.onDensity.heave[i];
      if (Number.isFinite(h)) worst = Math.max(worst, Math.abs(h - d(pA)));
    });
    // interpolation accuracy: δ is linear within a 1-dbar interval to ~ δ''/8 ≈ 3e-6 dbar
    expect(worst).toBeLessThan(1e-3);
    expect(r.years).toBeCloseTo(10, 1);
  });

  it('ΔC|p equals −(∂C/∂p)·δ to first order, and the terms add up to ΔC|p', () => {
    const d = delta(10);
    const r = compareOccupations(a, heaved(a, d), opts());
    const nx = r.x.length;
    let worst = 0;
    let big = 0;
    for (let i = 20; i < 1300; i++) {
      for (let j = 0; j < nx; j++) {
        const o = i * nx + j;
        const diff = r.onPressure.diff[o];
        if (!Number.isFinite(diff)) continue;
        const f = j / (N - 1);
        const dCdp = ct(i + 0.5, f) - ct(i - 0.5, f); // analytic ∂C/∂p of A
        worst = Math.max(worst, Math.abs(diff + dCdp * d(i)));
        big = Math.max(big, Math.abs(diff));
        const sum = r.decomposition.waterMassTerm[o] + r.decomposition.heaveTerm[o] + r.decomposition.residual[o];
        expect(Math.abs(sum - diff)).toBeLessThan(1e-12);
      }
    }
    expect(big).toBeGreaterThan(0.1);
    // second-order remainder ½·C''·δ² ≈ 1.1e-4 · 15² / 2 ≈ 0.012 at most, against ΔC|p up to ~0.7
    expect(worst).toBeLessThan(0.03 * big);
    expect(maxAbs(r.decomposition.waterMassTerm)).toBeLessThan(1e-3);
  });

  it('halving δ divides the residual by about four (second order)', () => {
    const rms = (amp: number) => {
      const r = compareOccupations(a, heaved(a, delta(amp)), opts());
      const nx = r.x.length;
      let s = 0;
      let n = 0;
      // the same interior cells for both amplitudes
      for (let i = 60; i < 1200; i++)
        for (let j = 0; j < nx; j++) {
          const v = r.decomposition.residual[i * nx + j];
          if (Number.isFinite(v)) {
            s += v * v;
            n++;
          }
        }
      return Math.sqrt(s / n);
    };
    const ratio = rms(24) / rms(12);
    expect(ratio).toBeGreaterThan(3.5);
    expect(ratio).toBeLessThan(4.5);
  });
});

describe('pure water-mass change (Bindoff & McDougall 1994)', () => {
  it('density-compensated change along isopycnals gives no heave', () => {
    const a = occupationA();
    const dT = (p: number) => -0.3 * Math.exp(-(((p - 700) / 200) ** 2));
    const b = a.map((c) => {
      const CT = Float64Array.from(c.CT, (t, k) => t + dT(c.p[k]));
      const target = sigma_batch(c.SA, c.CT, 0);
      // SA that keeps σ0 at each level (secant iteration on the TEOS-10 σ0 of shared/seawater)
      const SA = Float64Array.from(c.SA);
      for (let it = 0; it < 6; it++) {
        const s0 = sigma_batch(SA, CT, 0);
        const SAh = Float64Array.from(SA, (v) => v + 1e-4);
        const s1 = sigma_batch(SAh, CT, 0);
        for (let k = 0; k < SA.length; k++) SA[k] -= ((s0[k] - target[k]) * 1e-4) / (s1[k] - s0[k]);
      }
      return { ...c, station: c.station.replace('A', 'B'), time: Date.UTC(2026, 0, 10), CT, SA, C: CT };
    });
    const r = compareOccupations(
      a,
      b,
      opts({ targets: Float64Array.from({ length: 100 }, (_, i) => 25.3 + 0.025 * i) }),
    );
    expect(finite(r.onDensity.heave).length).toBeGreaterThan(200);
    expect(maxAbs(r.onDensity.heave)).toBeLessThan(1e-6);
    expect(maxAbs(r.decomposition.heave)).toBeLessThan(1e-6);
    // the water-mass term carries the whole change; ΔC|σ is the planted −0.3 °C at its core
    expect(Math.min(...finite(r.onDensity.diff))).toBeCloseTo(-0.3, 2);
    const nx = r.x.length;
    for (let j = 0; j < nx; j++) {
      const o = 700 * nx + j;
      expect(r.decomposition.waterMassTerm[o]).toBeCloseTo(r.onPressure.diff[o], 6);
      expect(Math.abs(r.decomposition.heaveTerm[o])).toBeLessThan(1e-6);
    }
  });
});

describe('common positions, exclusions and flags', () => {
  it('unpaired stations are left out and listed; B is interpolated between its casts', () => {
    const a = occupationA();
    // B misses station 4, adds a cast 60 km off the line, and sits 3 km east of A elsewhere
    const b = a
      .filter((_, i) => i !== 3)
      .map((c) => ({ ...c, station: c.station.replace('A', 'B'), lon: c.lon + 0.035 }));
    b.push({ ...a[0], station: 'B-off', lon: 10.7, lat: -39.45 });
    const r = compareOccupations(a, b, opts({ pairDistanceKm: 10 }));
    expect(r.excluded).toContainEqual({
      station: 'B-off',
      line: 'B',
      why: expect.stringContaining('farther than 10 km'),
    });
    // A4 is 14 km from B3 and 20 km from B5: no partner within 10 km
    expect(r.excluded.find((e) => e.station === 'A4')?.line).toBe('A');
    expect(r.pairs.map((p) => p.stationA)).not.toContain('A4');
    expect(r.pairs[0].offsetKm).toBeCloseTo(3, 0);
    expect(r.x.length).toBe(N - 1);
  });

  it('levels flagged in either occupation are left out of the differences and counted', () => {
    const a = occupationA();
    const b = heaved(a, () => 5);
    const bad = new Uint8Array(LEVELS);
    for (let k = 300; k < 320; k++) bad[k] = 1;
    b[2] = { ...b[2], bad };
    const r = compareOccupations(a, b, opts());
    expect(r.counts.flaggedLevels).toEqual({ A: 0, B: 20 });
    const nx = r.x.length;
    // B's levels 300–319 sit at 305–324 dbar; the bridged span is (304, 325)
    for (let p = 305; p <= 324; p++) expect(Number.isNaN(r.onPressure.diff[p * nx + 2])).toBe(true);
    expect(Number.isFinite(r.onPressure.diff[303 * nx + 2])).toBe(true);
    expect(r.counts.leftOut.pressure).toBe(20);
    expect(r.counts.leftOut.density).toBeGreaterThan(0);
  });
});
