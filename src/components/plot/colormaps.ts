import { oklchToSrgb, rgb01ToHex } from './colour';

/**
 * Sigmaline's palettes for fields, in Plotly colorscale form (`[[position, colour], …]`).
 *
 * Each palette is written here as a path in OKLCH (Ottosson 2020): lightness changes linearly with
 * the value, so equal steps of the value give equal steps of perceived lightness and the eye finds
 * no front the data does not have (the reason rainbow ramps are avoided, common practice); hue and
 * chroma only help to tell steps apart. Colours outside sRGB lose chroma, never lightness. The
 * unit test `tests/unit/client/palettes.test.ts` checks lightness monotonicity in CIELAB and the
 * steps under simulated protanopia, deuteranopia and tritanopia (Machado, Oliveira & Fernandes 2009).
 *
 * - `HEARTH` (sequential, temperature-like): deep indigo for cold, through plum and copper, to pale
 *   straw for warm.
 * - `BRINE` (sequential, salinity-like and densities): pale sand, sea-green, teal, deep navy.
 * - `CLEFT` (diverging, anomalies and velocities): blue, a neutral white at zero, brick; the two arms
 *   mirror each other in lightness so neither sign looks stronger. Centre it on zero.
 * - `GRAPHITE` (sequential, prints in grey): paper to charcoal with a faint teal tint; its
 *   luminance alone carries the value, so a grey print or a photocopy keeps the order.
 */

export type ColorScale = ReadonlyArray<readonly [number, string]>;

interface Path {
  /** OKLCH lightness at the start and the end (0–1). */
  L: readonly [number, number];
  /** Hue in degrees at the start and the end (may exceed 360 to turn the other way). */
  h: readonly [number, number];
  /** Chroma at the start, the middle and the end. */
  C: readonly [number, number, number];
}

const STOPS = 17;

function ramp({ L, h, C }: Path, n = STOPS): string[] {
  const out: string[] = [];
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1);
    const chroma = t < 0.5 ? C[0] + (C[1] - C[0]) * (t / 0.5) : C[1] + (C[2] - C[1]) * ((t - 0.5) / 0.5);
    out.push(rgb01ToHex(oklchToSrgb(L[0] + (L[1] - L[0]) * t, chroma, h[0] + (h[1] - h[0]) * t)));
  }
  return out;
}

function evenly(colours: readonly string[]): ColorScale {
  return colours.map((c, i) => [i / (colours.length - 1), c] as const);
}

/** Sequential, temperature-like: dark for cold, light for warm. */
export const HEARTH: ColorScale = evenly(ramp({ L: [0.2, 0.96], h: [285, 460], C: [0.1, 0.16, 0.09] }));

/** Sequential, salinity-like: light for fresh, dark for salty. */
export const BRINE: ColorScale = evenly(ramp({ L: [0.97, 0.26], h: [105, 262], C: [0.04, 0.1, 0.07] }));

/**
 * Diverging: blue below zero, a neutral white at zero (no chroma, so a zero change does not read
 * as a faint cooling or warming), brick above.
 */
export const CLEFT: ColorScale = evenly([
  ...ramp({ L: [0.36, 0.96], h: [255, 255], C: [0.12, 0.08, 0] }, 9),
  ...ramp({ L: [0.96, 0.36], h: [40, 35], C: [0, 0.08, 0.12] }, 9).slice(1),
]);

/** Sequential, prints in grey: paper to charcoal. */
export const GRAPHITE: ColorScale = evenly(ramp({ L: [0.97, 0.2], h: [195, 215], C: [0.008, 0.018, 0.015] }));

/** The palettes a user can choose, by key, with how they read. */
export const PALETTES = {
  hearth: { scale: HEARTH, label: 'Hearth — temperature-like', kind: 'sequential' },
  brine: { scale: BRINE, label: 'Brine — salinity, density', kind: 'sequential' },
  cleft: { scale: CLEFT, label: 'Cleft — anomaly, centred on 0', kind: 'diverging' },
  graphite: { scale: GRAPHITE, label: 'Graphite — prints in grey', kind: 'sequential' },
} as const satisfies Record<string, { scale: ColorScale; label: string; kind: 'sequential' | 'diverging' }>;
export type PaletteName = keyof typeof PALETTES;
export const PALETTE_NAMES = Object.keys(PALETTES) as PaletteName[];

/** Kept for the screens that ask for "the sequential" or "the diverging" palette. */
export const DEPTHS = BRINE;
export const COLOR_SCALES = { sequential: BRINE, diverging: CLEFT } as const;
export type ColorScaleName = keyof typeof COLOR_SCALES;

/** A scale reversed (dark for low values), e.g. for a property that reads better dark-on-top. */
export function reversed(scale: ColorScale): ColorScale {
  return scale.map(([t, c]) => [1 - t, c] as const).reverse();
}

/** Plotly wants a mutable array of [number, string] tuples. */
export function toPlotly(scale: ColorScale): Array<[number, string]> {
  return scale.map(([t, c]) => [t, c]);
}

const hexToRgb = (hex: string): [number, number, number] => {
  const v = parseInt(hex.slice(1), 16);
  return [(v >> 16) & 255, (v >> 8) & 255, v & 255];
};

/**
 * The colour at position t (0–1) of a scale, interpolated in sRGB between the neighbouring stops
 * (the stops are close enough that the difference from interpolating in OKLab is invisible).
 * For colouring discrete things by value: stations by distance, T–S points by pressure.
 */
export function colorAt(scale: ColorScale, t: number): string {
  const x = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  for (let i = 1; i < scale.length; i++) {
    const [t1, c1] = scale[i];
    if (x <= t1) {
      const [t0, c0] = scale[i - 1];
      const f = t1 === t0 ? 0 : (x - t0) / (t1 - t0);
      const a = hexToRgb(c0);
      const b = hexToRgb(c1);
      const mix = a.map((v, k) => Math.round(v + (b[k] - v) * f));
      return `rgb(${mix[0]}, ${mix[1]}, ${mix[2]})`;
    }
  }
  return scale[scale.length - 1][1];
}
