import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { contourStep, sigmaGrid, tsExtent } from '../../../src/features/sections';
import { sigma_pr } from '../../../shared/seawater/density';

// Source of the expected values: TEOS-10 GSW check values v3.0 (gsw/tests/gsw_cv_v3_0.npz of Debian's
// python3-gsw 3.6.16), as turned into fixtures/reference/gsw_cv_v3_0.json; arrays are [level][cast].
const cv = JSON.parse(
  readFileSync(new URL('../../../fixtures/reference/gsw_cv_v3_0.json', import.meta.url), 'utf8'),
).values;
const SA = cv.SA_chck_cast as number[][];
const CT = cv.CT_chck_cast as number[][];

describe('T–S σ-contour grid', () => {
  it.each([
    [0, 'sigma0'],
    [2000, 'sigma2'],
    [4000, 'sigma4'],
  ] as const)('has the GSW check values of %s dbar at its corner nodes', (ref, key) => {
    // Corners placed on two check-cast points, so nodes [0][0] and [last][last] are those points.
    const a = { sa: SA[0][0], ct: CT[0][0], s: cv[key][0][0] as number };
    const b = { sa: SA[20][1], ct: CT[20][1], s: cv[key][20][1] as number };
    const lo = { sa: Math.min(a.sa, b.sa), ct: Math.min(a.ct, b.ct) };
    expect(lo).toEqual({ sa: a.sa, ct: b.ct }); // the second point is saltier and colder
    const grid = sigmaGrid({ saMin: a.sa, saMax: b.sa, ctMin: a.ct, ctMax: b.ct }, ref, 7, 5);
    expect(grid.SA).toHaveLength(7);
    expect(grid.CT).toHaveLength(5);
    expect(grid.sigma).toHaveLength(5);
    expect(grid.sigma[0]).toHaveLength(7);
    expect(Math.abs((grid.sigma[0][0] as number) - a.s)).toBeLessThan(1e-8);
    expect(Math.abs((grid.sigma[4][6] as number) - b.s)).toBeLessThan(1e-8);
  });

  it('is laid out z[CT row][SA column], each node the seawater core at that SA and CT', () => {
    const grid = sigmaGrid({ saMin: 34, saMax: 36, ctMin: 2, ctMax: 20 }, 1000, 11, 10);
    for (const [j, i] of [
      [0, 0],
      [3, 7],
      [9, 10],
      [5, 2],
    ]) {
      expect(grid.sigma[j][i]).toBe(sigma_pr(grid.SA[i], grid.CT[j], 1000));
    }
    // Saltier is denser along a row; warmer is lighter down a column.
    expect(grid.sigma[4][8] as number).toBeGreaterThan(grid.sigma[4][2] as number);
    expect(grid.sigma[8][5] as number).toBeLessThan(grid.sigma[1][5] as number);
  });

  it('leaves nodes outside the equation of state empty instead of drawing nonsense', () => {
    const grid = sigmaGrid({ saMin: 30, saMax: 35, ctMin: 10, ctMax: 60 }, 0, 3, 3);
    expect(grid.sigma[2][0]).toBeNull(); // 60 °C is outside the 75-term polynomial's range
    expect(grid.sigma[0][0]).not.toBeNull();
  });

  it('pads the extent of the points and ignores missing values', () => {
    const extent = tsExtent([
      { castId: '1', station: 'A', x: 0, SA: [35, 35.5, null], CT: [10, 4, 3], p: [0, 500, 1000] },
      { castId: '2', station: 'B', x: 30, SA: [34.9], CT: [12], p: [0] },
    ]);
    expect(extent).not.toBeNull();
    expect(extent!.saMin).toBeLessThan(34.9);
    expect(extent!.saMax).toBeGreaterThan(35.5);
    expect(extent!.ctMin).toBeLessThan(4);
    expect(extent!.ctMin).toBeGreaterThan(3); // the level with no SA does not count
    expect(extent!.ctMax).toBeGreaterThan(12);
    expect(tsExtent([{ castId: '1', station: 'A', x: 0, SA: [null], CT: [null], p: [null] }])).toBeNull();
  });

  it('chooses a round contour spacing inside the grid’s σ span', () => {
    const grid = sigmaGrid({ saMin: 34, saMax: 36, ctMin: 2, ctMax: 20 }, 0, 20, 20);
    const step = contourStep(grid, 10)!;
    expect([0.1, 0.2, 0.25, 0.5, 1]).toContain(Number(step.size.toPrecision(3)));
    let lo = Infinity,
      hi = -Infinity;
    for (const row of grid.sigma)
      for (const v of row)
        if (v !== null) {
          lo = Math.min(lo, v);
          hi = Math.max(hi, v);
        }
    expect(step.start).toBeGreaterThanOrEqual(lo);
    expect(step.end).toBeLessThanOrEqual(hi);
    expect((step.end - step.start) / step.size).toBeGreaterThanOrEqual(5);
  });
});
