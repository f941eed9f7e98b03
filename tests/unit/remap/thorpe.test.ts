import { describe, expect, it } from 'vitest';
import { thorpeSort, thorpeScale } from '../../../shared/remap';

describe('thorpeSort (Thorpe 1977 reordering)', () => {
  it('moves each parcel with its properties while the pressure grid stays (analytic case)', () => {
    const p = Float64Array.from([0, 1, 2, 3, 4, 5]);
    const sigma = Float64Array.from([25.0, 25.1, 25.4, 25.2, 25.3, 25.5]);
    const CT = Float64Array.from([10, 9, 6, 8, 7, 5]);
    const t = thorpeSort(p, sigma, { CT });
    expect(Array.from(t.sigma)).toEqual([25.0, 25.1, 25.2, 25.3, 25.4, 25.5]);
    expect(Array.from(t.props.CT)).toEqual([10, 9, 8, 7, 6, 5]);
    expect(Array.from(t.order)).toEqual([0, 1, 3, 4, 2, 5]);
    // The parcel at 2 dbar goes down to 4 dbar; those at 3 and 4 dbar move up by one.
    expect(Array.from(t.displacement)).toEqual([0, 0, 2, -1, -1, 0]);
    expect(thorpeScale(t.displacement, 2, 5)).toBeCloseTo(Math.sqrt(2), 14);
  });

  it('leaves a stable cast unchanged and keeps ties in measured order (analytic case)', () => {
    const p = Float64Array.from([0, 1, 2]);
    const sigma = Float64Array.from([25, 25, 26]);
    const t = thorpeSort(p, sigma, {});
    expect(t.changed).toBe(false);
    expect(Array.from(t.displacement)).toEqual([0, 0, 0]);
  });

  it('sorts a scrambled cast and its displacements sum to zero (a permutation of the grid, analytic case)', () => {
    const n = 500;
    const p = new Float64Array(n);
    const sigma = new Float64Array(n);
    let seed = 7;
    for (let i = 0; i < n; i++) {
      p[i] = 2 * i;
      seed = (seed * 16807) % 2147483647;
      sigma[i] = 26 + seed / 2147483647;
    }
    const t = thorpeSort(p, sigma, { s: sigma });
    for (let k = 1; k < n; k++) expect(t.sigma[k]).toBeGreaterThanOrEqual(t.sigma[k - 1]);
    expect(Array.from(t.props.s)).toEqual(Array.from(t.sigma));
    expect(Math.abs(t.displacement.reduce((a, b) => a + b, 0))).toBeLessThan(1e-9);
  });
});
