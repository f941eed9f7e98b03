/**
 * Property tests (fast-check) of the density half.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { p_from_z, z_from_p, grav } from '../../shared/seawater/depth';
import { sigma_pr, rho } from '../../shared/seawater/density';
import { geo_strf_dyn_height } from '../../shared/seawater/geostrophy';

const pressure = fc.double({ min: 0, max: 10000, noNaN: true });
const latitude = fc.double({ min: -90, max: 90, noNaN: true });

describe('depth properties', () => {
  it('p_from_z(z_from_p(p, lat), lat) returns p within 1e-8 dbar (issue 3)', () => {
    fc.assert(
      fc.property(pressure, latitude, (p, lat) => {
        expect(Math.abs(p_from_z(z_from_p(p, lat), lat) - p)).toBeLessThanOrEqual(1e-8);
      }),
      { numRuns: 2000 },
    );
  });
  it('z_from_p decreases (deeper) as p increases, and gravity grows with depth', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 9500, noNaN: true }),
        fc.double({ min: 0.01, max: 500, noNaN: true }),
        latitude,
        (p, dp, lat) => {
          expect(z_from_p(p + dp, lat)).toBeLessThan(z_from_p(p, lat));
          expect(grav(lat, p + dp)).toBeGreaterThan(grav(lat, p));
        },
      ),
    );
  });
});

describe('density properties', () => {
  it('potential density rises with the reference pressure (seawater is compressible)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 42, noNaN: true }),
        fc.double({ min: -2, max: 35, noNaN: true }),
        fc.double({ min: 0, max: 5000, noNaN: true }),
        (SA, CT, p) => {
          expect(sigma_pr(SA, CT, p + 100)).toBeGreaterThan(sigma_pr(SA, CT, p));
          expect(rho(SA, CT, p)).toBeCloseTo(sigma_pr(SA, CT, p) + 1000, 9);
        },
      ),
    );
  });
  it('dynamic height is additive in the reference: D(p; r2) = D(p; r1) − D(r2; r1) for levels r1, r2', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0.5, max: 150, noNaN: true }), { minLength: 6, maxLength: 30 }),
        fc.nat(),
        fc.nat(),
        (gaps, i1, i2) => {
          const p: number[] = [0];
          for (const g of gaps) p.push(p[p.length - 1] + g);
          const SA = p.map((q) => 34.6 + 0.6 * Math.exp(-q / 400));
          const CT = p.map((q) => 2 + 18 * Math.exp(-q / 300));
          const r1 = p[i1 % p.length],
            r2 = p[i2 % p.length];
          const D1 = geo_strf_dyn_height(SA, CT, p, r1);
          const D2 = geo_strf_dyn_height(SA, CT, p, r2);
          const atR2 = D1[p.indexOf(r2)];
          p.forEach((_, k) => expect(Math.abs(D2[k] - (D1[k] - atR2))).toBeLessThan(1e-9));
        },
      ),
      { numRuns: 100 },
    );
  });
});

// Regression (found by the property above): a reference pressure a hair above a whole-dbar
// multiple, equal to a level, was dropped from the integration grid and every D came back NaN.
describe('dynamic height reference on the integration grid', () => {
  it('keeps a reference pressure that sits just past a grid multiple (analytic profile)', () => {
    const p = [
      0, 3.4, 4.2, 16.3, 18.1, 59.0, 62.4, 88.4, 89.3, 118.1, 150.6, 156.0, 156.8, 160.7, 166.9, 240.9, 361.7,
      373.00000000000006,
    ];
    const SA = p.map((q) => 34.6 + 0.6 * Math.exp(-q / 400));
    const CT = p.map((q) => 2 + 18 * Math.exp(-q / 300));
    const D = geo_strf_dyn_height(SA, CT, p, p[p.length - 1]);
    expect(D.every((v) => Number.isFinite(v))).toBe(true);
    expect(D[D.length - 1]).toBe(0);
    const D0 = geo_strf_dyn_height(SA, CT, p, 0);
    p.forEach((_, k) => expect(Math.abs(D[k] - (D0[k] - D0[p.length - 1]))).toBeLessThan(1e-9));
  });
});
