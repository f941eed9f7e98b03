import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from '../../reference/python';
import { geostrophicSection, transportPerLayer, type GeostrophicSection } from '../../../shared/section';
import { z_from_p } from '../../../shared/seawater/depth';

/**
 * Two casts on a meridian, 10°N and 10.5°N at 30°W, 0–1000 dbar every 10 dbar. Their SA/CT are
 * smooth ocean-like profiles (a thermocline that deepens northward); the dynamic height of each is
 * taken from the live reference library, python3-gsw 3.6.16 gsw.geo_strf_dyn_height, and the
 * velocity is then worked out by hand below.
 */
const p = Float64Array.from({ length: 101 }, (_, i) => 10 * i);
const profile = (shift: number) => ({
  SA: p.map((v) => 34.9 + 0.6 * Math.exp(-(v + shift) / 300)),
  CT: p.map((v) => 4 + 22 * Math.exp(-(v + shift) / 250)),
});
const a = { id: 'a', lon: -30, lat: 10, p, ...profile(0) };
const b = { id: 'b', lon: -30, lat: 10.5, p, ...profile(40) };

const py = `
import sys, json, numpy as np, gsw
d = json.load(sys.stdin)
p = np.array(d['p'])
out = {k: gsw.geo_strf_dyn_height(np.array(d[k]['SA']), np.array(d[k]['CT']), p, p_ref=1000).tolist() for k in ('a', 'b')}
print(json.dumps(out))
`;
const ref = JSON.parse(
  execFileSync(GSW_PYTHON, ['-c', py], {
    input: JSON.stringify({
      p: Array.from(p),
      a: { SA: Array.from(a.SA), CT: Array.from(a.CT) },
      b: { SA: Array.from(b.SA), CT: Array.from(b.CT) },
    }),
  }).toString(),
) as { a: number[]; b: number[] };

describe('geostrophicSection: two-cast hand calculation', () => {
  it('v = (D_b − D_a)/(f L) relative to 1000 dbar (source: python3-gsw 3.6.16 live reference for D; hand calculation)', () => {
    // f = 2Ω sin φ at the mid latitude 10.25°, Ω = 7.292115e-5 rad/s (TEOS-10).
    const f = 2 * 7.292115e-5 * Math.sin((10.25 * Math.PI) / 180); // ≈ 2.5954e-5 s⁻¹
    // L: half a degree of a meridian on the sphere of mean radius 6371008.8 m.
    const L = (6371008.8 * (0.5 * Math.PI)) / 180; // ≈ 55597.5 m
    expect(f).toBeCloseTo(2.5954e-5, 8);
    expect(L).toBeCloseTo(55597.5, 0);
    const s = geostrophicSection([a, b], { pRef: 1000, levels: p });
    const pair = s.pairs[0];
    expect(pair.width).toBeCloseTo(L, 6);
    expect(pair.pRef).toBe(1000);
    for (let k = 0; k < p.length; k++) {
      const vHand = (ref.b[k] - ref.a[k]) / (f * L);
      expect(Math.abs(pair.velocity[k] - vHand)).toBeLessThan(1e-6);
    }
    // Lighter, warmer water to the south (cast a): D_a > D_b at the surface. Positive is to the
    // left of a → b (northward), i.e. westward; the flow, high D on its right, is eastward: negative.
    expect(pair.velocity[0]).toBeLessThan(0);
    expect(pair.velocity[100]).toBe(0);
  });

  it("deepest common level: zero velocity at the shallower cast's deepest level (definition)", () => {
    const short = { ...b, p: p.subarray(0, 81), SA: b.SA.subarray(0, 81), CT: b.CT.subarray(0, 81) };
    const s = geostrophicSection([a, short], { pRef: 'deepest_common', levels: p });
    expect(s.pairs[0].pRef).toBe(800);
    expect(s.pairs[0].velocity[80]).toBe(0);
    expect(Number.isNaN(s.pairs[0].velocity[90])).toBe(true);
    expect(s.grid.z[90][0]).toBeNull();
  });
});

describe('transportPerLayer', () => {
  it('uniform 0.1 m/s, σ linear 26 → 27 over 0–1000 dbar, 100 km wide (analytic case, thickness by TEOS-10 z_from_p)', () => {
    const lv = Float64Array.from({ length: 11 }, (_, i) => 100 * i);
    const section: GeostrophicSection = {
      p: lv,
      sigmaRef: 0,
      pairs: [
        {
          a: 'a',
          b: 'b',
          x: 50,
          width: 1e5,
          lat: 20,
          pRef: 1000,
          velocity: new Float64Array(11).fill(0.1),
          sigma: lv.map((v) => 26 + v / 1000),
        },
      ],
      grid: { x: [50], y: Array.from(lv), z: [] },
      skipped: [],
    };
    const layers = transportPerLayer(section, Float64Array.from([26, 26.25, 27]));
    // Interface 26.25 lies at 250 dbar, inside the 200–300 dbar interval: the piece above it
    // takes half of that interval's thickness.
    const dz = (p1: number, p2: number) => z_from_p(p1, 20) - z_from_p(p2, 20);
    const upper = (0.1 * (dz(0, 200) + 0.5 * dz(200, 300)) * 1e5) / 1e6;
    const lower = (0.1 * (0.5 * dz(200, 300) + dz(300, 1000)) * 1e5) / 1e6;
    expect(layers[0].transport[0]).toBeCloseTo(upper, 12);
    expect(layers[1].transport[0]).toBeCloseTo(lower, 12);
    expect(layers[0].total + layers[1].total).toBeCloseTo(0.1 * dz(0, 1000) * 0.1, 12);
  });
});
