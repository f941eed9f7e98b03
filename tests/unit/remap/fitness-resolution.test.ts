// Analytic case: a stable linear σ profile with a ±0.002 kg/m³ zig-zag (below the 0.01 kg/m³
// inversion threshold, common practice for sensor noise) is far from strictly monotonic, yet fully
// fit as a coordinate at 0.01 kg/m³ resolution; a real 0.05 kg/m³ overturn still shows at that resolution.
import { describe, it, expect } from 'vitest';
import { coordinateFitness, coordinateFitnessAtResolution } from '../../../shared/remap/fitness';

const n = 1001;
const p = Float64Array.from({ length: n }, (_, i) => 2 * i);

describe('coordinate fitness at a resolution', () => {
  it('ignores zig-zags smaller than the tolerance', () => {
    const v = Float64Array.from(p, (pp, i) => 25 + 0.001 * pp + (i % 2 ? 0.002 : -0.002));
    const strict = coordinateFitness(p, v);
    expect(strict.monotonicShare).toBeLessThan(0.6);
    const resolved = coordinateFitnessAtResolution(p, v, 0.01);
    expect(resolved.monotonicShare).toBe(1);
    expect(resolved.multiValuedShare).toBe(0);
    expect(resolved.direction).toBe('increasing');
  });
  it('still sees an overturn larger than the tolerance', () => {
    const v = Float64Array.from(p, (pp) => 25 + 0.001 * pp);
    // reverse the slab 400…449 (Δσ across it = 0.098 kg/m³)
    const slab = Float64Array.from({ length: 50 }, (_, k) => 25 + 0.001 * p[400 + k]).reverse();
    v.set(slab, 400);
    const resolved = coordinateFitnessAtResolution(p, v, 0.01);
    expect(resolved.monotonicShare).toBeLessThan(0.97);
    expect(resolved.multiValuedShare).toBeGreaterThan(0.05);
  });
});
