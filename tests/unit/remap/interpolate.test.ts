import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  firstCrossing,
  fritschCarlsonSlopes,
  interpLinearAt,
  interpFritschCarlsonAt,
  interpLinear,
} from '../../../shared/remap';

const f64 = (a: number[]) => Float64Array.from(a);

describe('bracket and linear interpolation', () => {
  it('reproduces a linear function exactly (analytic case)', () => {
    const x = f64([0, 1, 2.5, 4, 7]);
    const y = x.map((v) => 3 - 2 * v);
    const q = f64([0, 0.3, 2.5, 3.9, 7]);
    const br = firstCrossing(x, q);
    const out = interpLinearAt(y, br);
    for (let j = 0; j < q.length; j++) expect(Math.abs(out[j] - (3 - 2 * q[j]))).toBeLessThan(1e-14);
    expect(Array.from(interpLinear(x, y, f64([-1, 8]))).every(Number.isNaN)).toBe(true);
  });

  it('takes the first crossing from the top of a folded profile (analytic case)', () => {
    // x goes 0 → 2 → 1 → 3: the target 1.5 is met first in interval 0, then in 1 and 2.
    const x = f64([0, 2, 1, 3]);
    const br = firstCrossing(x, f64([1.5, 2.5, 4]));
    expect(Array.from(br.index)).toEqual([0, 2, -1]);
    expect(br.weight[0]).toBeCloseTo(0.75, 15);
    expect(br.weight[1]).toBeCloseTo(0.75, 15);
  });
});

describe('Fritsch–Carlson monotone cubic', () => {
  it('reproduces linear data exactly (analytic case: the three-point slopes equal the secant)', () => {
    const x = f64([0, 0.5, 1.7, 2, 3.1]);
    const y = x.map((v) => 1 + 4 * v);
    const q = f64([0.1, 0.9, 1.8, 3.0]);
    const out = interpFritschCarlsonAt(x, y, firstCrossing(x, q));
    for (let j = 0; j < q.length; j++) expect(Math.abs(out[j] - (1 + 4 * q[j]))).toBeLessThan(1e-13);
  });

  it('sets the slope to zero at a local extremum of the data (Fritsch & Carlson 1980, step 1)', () => {
    const d = fritschCarlsonSlopes(f64([0, 1, 2, 3]), f64([0, 1, 0.5, 2]));
    expect(d[1]).toBe(0);
    expect(d[2]).toBe(0);
  });

  it('is monotone on monotone data (Fritsch & Carlson 1980: α² + β² ≤ 9 is sufficient)', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true })),
          { minLength: 3, maxLength: 12 },
        ),
        (steps) => {
          const x = new Float64Array(steps.length);
          const y = new Float64Array(steps.length);
          for (let i = 1; i < steps.length; i++) {
            x[i] = x[i - 1] + steps[i][0];
            y[i] = y[i - 1] + steps[i][1];
          }
          const q = new Float64Array(200);
          for (let j = 0; j < q.length; j++) q[j] = (x[x.length - 1] * j) / (q.length - 1);
          q[q.length - 1] = x[x.length - 1];
          const out = interpFritschCarlsonAt(x, y, firstCrossing(x, q));
          for (let j = 1; j < q.length; j++) if (out[j] < out[j - 1] - 1e-9 * (1 + Math.abs(out[j]))) return false;
          return out[0] === y[0] && Math.abs(out[q.length - 1] - y[y.length - 1]) < 1e-9 * (1 + y[y.length - 1]);
        },
      ),
      { numRuns: 300 },
    );
  });
});
