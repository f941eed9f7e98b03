import { describe, expect, it } from 'vitest';
import { detectInversions } from '../../../shared/remap';

/** Linear stratification σ = 24 + 0.002·p on a 1-dbar grid (analytic case, stable: N² > 0). */
function stable(n = 1001): { p: Float64Array; sigma: Float64Array } {
  const p = new Float64Array(n);
  const sigma = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    p[i] = i;
    sigma[i] = 24 + 0.002 * i;
  }
  return { p, sigma };
}

describe('detectInversions', () => {
  it('reports nothing on a stable profile (common practice: σ increases with depth in a stable column)', () => {
    const { p, sigma } = stable();
    expect(detectInversions(p, sigma)).toEqual([]);
  });

  it('finds a planted one-scan spike with its exact extent and class (analytic case)', () => {
    const { p, sigma } = stable();
    sigma[300] -= 0.05; // one light scan, as sensor lag makes
    const inv = detectInversions(p, sigma);
    expect(inv).toHaveLength(1);
    expect(inv[0]).toMatchObject({ iTop: 299, iBottom: 300, pTop: 299, pBottom: 300, levels: 1, class: 'spike' });
    // deficit = σ(299) − σ(300) = 0.002·299 − (0.002·300 − 0.05) = 0.048
    expect(inv[0].deficit).toBeCloseTo(0.048, 12);
  });

  it('finds a planted overturn (parcels 500…539 reversed) with its exact extent and class (analytic case)', () => {
    const { p, sigma } = stable();
    const flipped = sigma.slice(500, 540).reverse();
    sigma.set(flipped, 500);
    const inv = detectInversions(p, sigma);
    expect(inv).toHaveLength(1);
    expect(inv[0]).toMatchObject({ iTop: 500, iBottom: 539, pTop: 500, pBottom: 539, levels: 39, class: 'overturn' });
    // deficit = σ_old(539) − σ_old(500) = 0.002·39
    expect(inv[0].deficit).toBeCloseTo(0.078, 12);
  });

  it('finds spike and overturn together, in order, and honours the threshold (analytic case)', () => {
    const { p, sigma } = stable();
    sigma[100] -= 0.05;
    sigma.set(sigma.slice(700, 720).reverse(), 700);
    sigma[900] -= 0.005; // below the default 0.01 kg/m³ threshold
    const inv = detectInversions(p, sigma);
    expect(inv.map((i) => [i.iTop, i.iBottom, i.class])).toEqual([
      [99, 100, 'spike'],
      [700, 719, 'overturn'],
    ]);
    const fine = detectInversions(p, sigma, { threshold: 0.001 });
    expect(fine.map((i) => i.iTop)).toEqual([99, 700, 899]);
  });

  it('classes a short excursion on a fine grid as a spike by thickness (analytic case)', () => {
    const n = 2000;
    const p = new Float64Array(n);
    const sigma = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      p[i] = 0.04 * i;
      sigma[i] = 25 + 0.01 * p[i];
    }
    for (let i = 1000; i < 1005; i++) sigma[i] -= 0.03; // 5 scans = 0.2 dbar
    const inv = detectInversions(p, sigma);
    expect(inv).toHaveLength(1);
    expect(inv[0].levels).toBe(5);
    expect(inv[0].class).toBe('spike');
    expect(detectInversions(p, sigma, { overturnMinThickness: 0.1 })[0].class).toBe('overturn');
  });

  it('reports depths from heights and the most negative N² inside (analytic case)', () => {
    const { p, sigma } = stable(50);
    sigma[20] -= 0.05;
    const z = p.map((v) => -0.99 * v);
    const N2 = new Float64Array(49).fill(1e-5);
    N2[19] = -3e-4;
    N2[20] = -1e-4;
    const [inv] = detectInversions(p, sigma, { z, N2 });
    expect(inv.depthTop).toBeCloseTo(0.99 * 19, 12);
    expect(inv.depthBottom).toBeCloseTo(0.99 * 20, 12);
    expect(inv.minN2).toBe(-3e-4);
  });
});
