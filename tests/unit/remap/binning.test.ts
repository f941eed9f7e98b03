import { describe, expect, it } from 'vitest';
import { binToPressure } from '../../../shared/remap';

describe('binToPressure', () => {
  it('means within 2-dbar bins centred on multiples of 2, counts kept (analytic case)', () => {
    // Samples every 0.25 dbar from 1.0 to 8.75; T = 10 + p is linear, so each full bin's mean is
    // 10 + its centre; bin 2 holds 1.0…2.75 (8 samples), bin 8 holds 7.0…8.75.
    const n = 32;
    const p = new Float64Array(n);
    for (let i = 0; i < n; i++) p[i] = 1 + 0.25 * i;
    const T = p.map((v) => 10 + v);
    const r = binToPressure(p, { T }, 2);
    expect(Array.from(r.pressure)).toEqual([2, 4, 6, 8]);
    expect(Array.from(r.count)).toEqual([8, 8, 8, 8]);
    for (let b = 0; b < 4; b++) expect(r.props.T[b]).toBeCloseTo(10 + r.pressure[b] - 0.125, 12);
  });

  it('skips NaN values in the mean, leaves empty bins NaN with count 0 (analytic case)', () => {
    const p = Float64Array.from([0.2, 0.4, 5.1]);
    const T = Float64Array.from([1, NaN, 3]);
    const r = binToPressure(p, { T }, 1, { pMax: 6 });
    expect(Array.from(r.count)).toEqual([2, 0, 0, 0, 0, 1, 0]);
    expect(r.props.T[0]).toBe(1);
    expect(Number.isNaN(r.props.T[1])).toBe(true);
    expect(r.props.T[5]).toBe(3);
  });
});
