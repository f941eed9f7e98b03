import { describe, expect, it } from 'vitest';
import { coordinateFitness } from '../../../shared/remap';

const f64 = (a: number[]) => Float64Array.from(a);

describe('coordinateFitness', () => {
  it('a strictly increasing variable is fully monotonic and single-valued (analytic case)', () => {
    const r = coordinateFitness(f64([0, 10, 20, 30]), f64([24, 25, 26, 27]));
    expect(r).toEqual({
      monotonicShare: 1,
      multiValuedShare: 0,
      direction: 'increasing',
      segments: [{ pTop: 0, pBottom: 30 }],
    });
  });

  it('a decreasing variable (temperature-like) is fit, direction decreasing (analytic case)', () => {
    const r = coordinateFitness(f64([0, 100, 200]), f64([20, 10, 4]));
    expect(r.direction).toBe('decreasing');
    expect(r.monotonicShare).toBe(1);
  });

  it('a fold gives the shares worked out by hand (analytic case)', () => {
    // v: 0 → 2 over 0–20 dbar, back to 1 over 20–30, up to 3 over 30–50.
    // Monotonic (increasing) span: 20 + 20 of 50. Values in (1, 2) are met three times:
    // 10 dbar of the first leg, all 10 of the fold, 10 dbar of the last leg → 30 of 50.
    const r = coordinateFitness(f64([0, 20, 30, 50]), f64([0, 2, 1, 3]));
    expect(r.direction).toBe('increasing');
    expect(r.monotonicShare).toBeCloseTo(40 / 50, 14);
    expect(r.multiValuedShare).toBeCloseTo(30 / 50, 14);
    expect(r.segments).toEqual([
      { pTop: 0, pBottom: 20 },
      { pTop: 30, pBottom: 50 },
    ]);
  });

  it('a constant stretch is multi-valued and not strictly monotonic (analytic case)', () => {
    const r = coordinateFitness(f64([0, 10, 20, 40]), f64([1, 1, 2, 3]));
    expect(r.monotonicShare).toBeCloseTo(30 / 40, 14);
    expect(r.multiValuedShare).toBeCloseTo(10 / 40, 14);
  });
});
