// Sigmaline's palettes: perceptually ordered and legible to colour-blind readers.
// Methods:
//  - lightness: CIELAB L* (CIE 15:2004, D65) of the sRGB colours (IEC 61966-2-1), sampled at 33
//    evenly spaced values. A sequential palette's L* must change monotonically, in near-equal
//    steps; a diverging palette's two arms must each be monotone and mirror each other.
//  - colour-blind legibility: each colour seen through the dichromacy matrices (severity 1.0) of
//    G. M. Machado, M. M. Oliveira & L. A. F. Fernandes (2009), "A physiologically-based model for
//    simulation of color vision deficiency", IEEE TVCG 15(6) 1291–1298. Under protanopia,
//    deuteranopia and tritanopia neighbouring samples must stay apart (ΔE*ab ≥ 2 between 1/32
//    steps; ≈ 2.3 is the just-noticeable difference, common practice) and the order must stay
//    monotone in L* for sequential palettes; a diverging palette's ends must stay far apart.
//  - grey print: relative luminance monotone for the palette meant for grey prints.
import { describe, it, expect } from 'vitest';
import { PALETTES, PALETTE_NAMES, colorAt, type ColorScale } from '../../../src/components/plot/colormaps';
import {
  deltaE76,
  hexToRgb01,
  linearToOklab,
  luminance,
  oklabToLinear,
  simulateDeficiency,
  srgbToCielab,
  srgbToLinear,
  type Rgb,
} from '../../../src/components/plot/colour';

const N = 33;
const rgbOf = (css: string): Rgb => {
  if (css.startsWith('#')) return hexToRgb01(css);
  const m = css.match(/rgb\((\d+), (\d+), (\d+)\)/)!;
  return [Number(m[1]) / 255, Number(m[2]) / 255, Number(m[3]) / 255];
};
const samples = (scale: ColorScale) => Array.from({ length: N }, (_, i) => rgbOf(colorAt(scale, i / (N - 1))));
const diffs = (v: number[]) => v.slice(1).map((x, i) => x - v[i]);
const monotone = (v: number[]) => diffs(v).every((d) => d > 0) || diffs(v).every((d) => d < 0);

describe('colour arithmetic', () => {
  it('CIELAB of the sRGB primaries matches the published values (from memory: white 100/0/0, red 53.24/80.09/67.20)', () => {
    const white = srgbToCielab([1, 1, 1]);
    expect(white[0]).toBeCloseTo(100, 2);
    expect(Math.abs(white[1]) + Math.abs(white[2])).toBeLessThan(0.01);
    const red = srgbToCielab([1, 0, 0]);
    expect(red[0]).toBeCloseTo(53.24, 1);
    expect(red[1]).toBeCloseTo(80.09, 0);
    expect(red[2]).toBeCloseTo(67.2, 0);
  });
  it('OKLab round-trips, and white is L = 1 (Ottosson 2020)', () => {
    const lin: Rgb = [0.2, 0.5, 0.7];
    const back = oklabToLinear(linearToOklab(lin));
    back.forEach((v, i) => expect(v).toBeCloseTo(lin[i], 6));
    expect(linearToOklab([1, 1, 1])[0]).toBeCloseTo(1, 4);
  });
  it('the simulation keeps greys grey and folds red onto green for a deuteranope (Machado et al. 2009)', () => {
    const grey = simulateDeficiency([0.5, 0.5, 0.5], 'deuteranopia');
    grey.forEach((v) => expect(v).toBeCloseTo(0.5, 3));
    const red = srgbToCielab(simulateDeficiency([0.8, 0.3, 0.3], 'deuteranopia'));
    const green = srgbToCielab(simulateDeficiency([0.45, 0.5, 0.3], 'deuteranopia'));
    // A pair that differs strongly to normal vision and little to a deuteranope.
    expect(deltaE76(srgbToCielab([0.8, 0.3, 0.3]), srgbToCielab([0.45, 0.5, 0.3]))).toBeGreaterThan(40);
    expect(deltaE76(red, green)).toBeLessThan(15);
  });
});

describe.each(PALETTE_NAMES)('palette %s', (name) => {
  const { scale, kind } = PALETTES[name];
  const colours = samples(scale);
  const L = colours.map((c) => srgbToCielab(c)[0]);

  if (kind === 'sequential') {
    it('CIELAB lightness changes monotonically, in near-equal steps, over a wide span', () => {
      expect(monotone(L)).toBe(true);
      const steps = diffs(L).map(Math.abs);
      const mean = steps.reduce((s, d) => s + d, 0) / steps.length;
      // equal steps of the value give equal steps of lightness, within ±45 % of the mean step
      for (const d of steps) expect(Math.abs(d - mean) / mean).toBeLessThan(0.45);
      expect(Math.abs(L[N - 1] - L[0])).toBeGreaterThan(55);
    });
    it.each(['protanopia', 'deuteranopia', 'tritanopia'] as const)(
      'under simulated %s the order and every step stay visible',
      (kind2) => {
        const seen = colours.map((c) => srgbToCielab(simulateDeficiency(c, kind2)));
        expect(monotone(seen.map((c) => c[0]))).toBe(true);
        for (let i = 1; i < N; i++) expect(deltaE76(seen[i], seen[i - 1])).toBeGreaterThanOrEqual(2);
      },
    );
  } else {
    const mid = (N - 1) / 2;
    it('each arm is monotone in lightness towards a light centre, and the arms mirror each other', () => {
      expect(monotone(L.slice(0, mid + 1))).toBe(true);
      expect(monotone(L.slice(mid))).toBe(true);
      expect(L[mid]).toBeGreaterThan(90);
      for (let i = 0; i <= mid; i++) expect(Math.abs(L[i] - L[N - 1 - i])).toBeLessThan(4);
    });
    it.each(['protanopia', 'deuteranopia', 'tritanopia'] as const)(
      'under simulated %s both signs stay apart and every step visible',
      (kind2) => {
        const seen = colours.map((c) => srgbToCielab(simulateDeficiency(c, kind2)));
        // The two ends (and the two quarter points) of opposite sign remain clearly different colours.
        expect(deltaE76(seen[0], seen[N - 1])).toBeGreaterThan(25);
        expect(deltaE76(seen[8], seen[N - 1 - 8])).toBeGreaterThan(12);
        for (let i = 1; i < N; i++) expect(deltaE76(seen[i], seen[i - 1])).toBeGreaterThanOrEqual(2);
      },
    );
  }

  if (name === 'graphite') {
    it('prints in grey: the relative luminance alone keeps the order, over a wide span', () => {
      const Y = colours.map(luminance);
      expect(monotone(Y)).toBe(true);
      expect(Math.abs(Y[0] - Y[N - 1])).toBeGreaterThan(0.7);
      // and it is nearly grey: chroma in CIELAB under 8 everywhere
      for (const c of colours) {
        const [, a, b] = srgbToCielab(c);
        expect(Math.hypot(a, b)).toBeLessThan(8);
      }
    });
  }

  it('has stops in sRGB and from 0 to 1', () => {
    expect(scale[0][0]).toBe(0);
    expect(scale[scale.length - 1][0]).toBe(1);
    for (const [, c] of scale) expect(c).toMatch(/^#[0-9a-f]{6}$/);
    expect(colours.every((c) => c.every((v) => v >= 0 && v <= 1 && Number.isFinite(srgbToLinear(v))))).toBe(true);
  });
});
