// Analytic case: a one-scan spike in weakly stratified deep water, followed by a stretch where σ
// sits a little (less than the threshold) below the parcel above it. The inversion is the spike
// alone and it is classed a spike (regression: it was once reported as an overturn spanning the tail).
import { describe, it, expect } from 'vitest';
import { detectInversions } from '../../../shared/remap/inversions';

describe('inversion extent in a weakly stratified column', () => {
  it('starts the interval just above the spike even when the running maximum was set a few noisy scans higher', () => {
    const n = 2000;
    const p = Float64Array.from({ length: n }, (_, i) => 2 * i);
    const sigma = Float64Array.from(p, (pp) => 27.8 + 1e-6 * pp);
    const k = 1500;
    const M = sigma[k - 6] + 0.0008; // a noisy heavy scan six levels up
    sigma[k - 6] = M;
    for (let i = k - 5; i < k; i++) sigma[i] = M - 0.0004;
    sigma[k] = M - 0.07;
    for (let i = k + 1; i < k + 20; i++) sigma[i] = M - 0.0003;
    const found = detectInversions(p, sigma, { threshold: 0.01 });
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ iTop: k - 1, iBottom: k, class: 'spike' });
  });
  it('reports the planted spike with its exact extent, not the sub-threshold tail', () => {
    const n = 2000;
    const p = Float64Array.from({ length: n }, (_, i) => 2 * i);
    const sigma = Float64Array.from(p, (pp) => 27.8 + 1e-6 * pp);
    const k = 1500;
    const top = sigma[k - 1];
    sigma[k] = top - 0.05; // the spike, one scan
    for (let i = k + 1; i < k + 30; i++) sigma[i] = top - 0.0005; // tail lighter by less than the threshold
    const found = detectInversions(p, sigma, { threshold: 0.01 });
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ iTop: k - 1, iBottom: k, pTop: p[k - 1], pBottom: p[k], class: 'spike' });
    expect(found[0].deficit).toBeCloseTo(0.05, 12);
  });
});
