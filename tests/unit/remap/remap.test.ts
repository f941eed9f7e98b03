import { describe, expect, it } from 'vitest';
import {
  FLAG_BELOW_BOTTOM,
  FLAG_IN_INVERSION,
  FLAG_MULTI_CROSSING,
  FLAG_OUTCROP,
  flagNames,
  remapToIsopycnals,
  countCrossings,
  type RemapCast,
} from '../../../shared/remap';

const range = (a: number, step: number, b: number) => {
  const out: number[] = [];
  for (let i = 0; a + i * step <= b + 1e-9; i++) out.push(a + i * step);
  return Float64Array.from(out);
};

/** Linear stratification σ = 24 + a·p, heights z = −0.99·p (analytic case). */
function linearCast(a = 0.002, n = 2001): RemapCast {
  const p = range(0, 1, n - 1);
  const sigma = p.map((v) => 24 + a * v);
  return {
    p,
    z: p.map((v) => -0.99 * v),
    sigma,
    props: { CT: p.map((v) => 20 - 0.004 * v), SA: p.map((v) => 35 + 0.0002 * v) },
  };
}

describe('remapToIsopycnals on analytic stratifications', () => {
  it('linear profile, linear interpolation: isopycnal pressures exact to 1e-9 dbar (analytic case)', () => {
    const a = 0.002;
    const cast = linearCast(a);
    const targets = range(24.05, 0.05, 27.95);
    const r = remapToIsopycnals(cast, targets, { handling: 'sort', interpolation: 'linear' });
    for (let j = 0; j < targets.length; j++) {
      const pExact = (targets[j] - 24) / a;
      expect(Math.abs(r.pressure[j] - pExact)).toBeLessThan(1e-9);
      expect(Math.abs(r.depth![j] - 0.99 * pExact)).toBeLessThan(1e-9);
      expect(Math.abs(r.props.CT[j] - (20 - 0.004 * pExact))).toBeLessThan(1e-9);
      // Thickness between mid-levels: 0.05 kg/m³ / a = 25 dbar.
      expect(Math.abs(r.thickness[j] - 25)).toBeLessThan(1e-9);
      expect(Math.abs(r.thicknessDepth![j] - 0.99 * 25)).toBeLessThan(1e-9);
      expect(r.crossings[j]).toBe(1);
      expect(r.flags[j]).toBe(0);
    }
  });

  it('exponential profile: linear error within the h²/8·max|p″(σ)| bound, PCHIP closer (analytic case)', () => {
    // σ = 24 + 3(1 − e^{−p/H}) ⇒ p(σ) = −H ln(1 − (σ − 24)/3), p″(σ) = H/(3 − (σ−24))².
    const H = 600;
    const p = range(0, 2, 4000);
    const sigma = p.map((v) => 24 + 3 * (1 - Math.exp(-v / H)));
    const targets = range(24.1, 0.1, 26.8);
    const lin = remapToIsopycnals({ p, sigma, props: {} }, targets, { handling: 'sort', interpolation: 'linear' });
    const cub = remapToIsopycnals({ p, sigma, props: {} }, targets, { handling: 'sort', interpolation: 'pchip' });
    let linMax = 0;
    let cubMax = 0;
    for (let j = 0; j < targets.length; j++) {
      const s = targets[j];
      const pExact = -H * Math.log(1 - (s - 24) / 3);
      // Bracketing interval in σ: the nodes 2 dbar apart about pExact.
      const k = Math.floor(pExact / 2);
      const h = sigma[k + 1] - sigma[k];
      const p2 = H / (3 - (sigma[k + 1] - 24)) ** 2;
      const errLin = Math.abs(lin.pressure[j] - pExact);
      expect(errLin).toBeLessThanOrEqual((h * h * p2) / 8 + 1e-9);
      linMax = Math.max(linMax, errLin);
      cubMax = Math.max(cubMax, Math.abs(cub.pressure[j] - pExact));
    }
    expect(cubMax).toBeLessThan(linMax / 10);
    expect(cubMax).toBeLessThan(1e-3);
  });

  it('flags outcrop and below-bottom targets and leaves them empty (analytic case)', () => {
    const cast = linearCast(0.002, 501); // σ from 24 to 25
    const r = remapToIsopycnals(cast, Float64Array.from([23.5, 24.5, 25.5]), {
      handling: 'sort',
      interpolation: 'linear',
    });
    expect(r.flags[0]).toBe(FLAG_OUTCROP);
    expect(r.flags[2]).toBe(FLAG_BELOW_BOTTOM);
    expect(flagNames(r.flags[0] | r.flags[2])).toEqual(['outcrop', 'below_bottom']);
    expect(Number.isNaN(r.pressure[0]) && Number.isNaN(r.props.CT[2])).toBe(true);
    expect(r.pressure[1]).toBeCloseTo(250, 9);
    expect(r.crossings[0] + r.crossings[2]).toBe(0);
  });

  it('sort, drop and raw give the same table on a stable cast (docs/science.md §3.3)', () => {
    const cast = linearCast();
    const targets = range(24.0, 0.1, 28.0);
    for (const interpolation of ['linear', 'pchip'] as const) {
      const [a, b, c] = (['sort', 'drop', 'raw'] as const).map((handling) =>
        remapToIsopycnals(cast, targets, { handling, interpolation }),
      );
      for (const other of [b, c]) {
        expect(Array.from(other.pressure)).toEqual(Array.from(a.pressure));
        expect(Array.from(other.props.SA)).toEqual(Array.from(a.props.SA));
        expect(Array.from(other.thickness)).toEqual(Array.from(a.thickness));
        expect(Array.from(other.flags)).toEqual(Array.from(a.flags));
        expect(Array.from(other.crossings)).toEqual(Array.from(a.crossings));
      }
    }
  });
});

describe('inversion handling on a planted overturn (analytic case)', () => {
  // σ = 24 + 0.002 p; parcels 500…539 dbar reversed, with their CT.
  const cast = linearCast();
  cast.sigma.set(cast.sigma.slice(500, 540).reverse(), 500);
  cast.props.CT.set(cast.props.CT.slice(500, 540).reverse(), 500);
  const s = 24 + 0.002 * 520.5; // between parcels, inside the overturned range
  const targets = Float64Array.from([24.5, s, 26]);

  it('sort: the level sits where the sorted (= undisturbed) profile has it, crossed once', () => {
    const r = remapToIsopycnals(cast, targets, { handling: 'sort', interpolation: 'linear' });
    expect(r.pressure[1]).toBeCloseTo(520.5, 9);
    expect(r.props.CT[1]).toBeCloseTo(20 - 0.004 * 520.5, 9);
    expect(r.crossings[1]).toBe(1);
    expect(r.crossingsRaw[1]).toBe(3);
    expect(flagNames(r.flags[1])).toEqual(['multi_crossing', 'in_inversion']);
    expect(r.flags[0]).toBe(0);
    expect(r.inversions).toHaveLength(1);
  });

  it('raw: first crossing from the top, three crossings counted', () => {
    // Measured σ climbs to 24 + 0.002·499 at 499 dbar, jumps to 24 + 0.002·539 at 500 dbar: the
    // first crossing of s is in 499–500 dbar at the fraction (s − σ499)/(σ500 − σ499) = 21.5/40.
    const r = remapToIsopycnals(cast, targets, { handling: 'raw', interpolation: 'linear' });
    expect(r.pressure[1]).toBeCloseTo(499 + 21.5 / 40, 9);
    expect(r.crossings[1]).toBe(3);
    expect(r.flags[1] & FLAG_MULTI_CROSSING).toBe(FLAG_MULTI_CROSSING);
    expect(r.flags[1] & FLAG_IN_INVERSION).toBe(0); // 499.5 dbar is above the interval 500–539
  });

  it('drop: the light levels 501…539 go, the level is interpolated across 500–540 dbar', () => {
    // Kept: 500 dbar holding σ(539) and 540 dbar holding σ(540); s lies below σ(539), so the first
    // crossing is in 499–500 dbar as for raw, and the profile as handled crosses it once.
    const r = remapToIsopycnals(cast, targets, { handling: 'drop', interpolation: 'linear' });
    expect(r.pressure[1]).toBeCloseTo(499 + 21.5 / 40, 9);
    expect(r.crossings[1]).toBe(1);
    const deeper = remapToIsopycnals(cast, Float64Array.from([24 + 0.002 * 539.5]), {
      handling: 'drop',
      interpolation: 'linear',
    });
    expect(deeper.pressure[0]).toBeCloseTo(520, 9); // halfway between 500 (σ539) and 540 (σ540) dbar
  });
});

describe('countCrossings', () => {
  it('counts each separate point where the profile meets the target (analytic case)', () => {
    const c = countCrossings(Float64Array.from([1, 3, 2, 4]), Float64Array.from([1, 1.5, 2.5, 3, 3.5, 5]));
    expect(Array.from(c)).toEqual([1, 1, 3, 2, 1, 0]);
  });
});
