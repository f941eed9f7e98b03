/**
 * Sigmaline's colour maps for fields, in Plotly colorscale form (`[[position, colour], …]`).
 *
 * Both ramps were written for Sigmaline in the OKLCH space, so that equal steps of the value give
 * roughly equal steps of perceived lightness (OKLab L), which is what lets the eye read a field's
 * gradients without inventing fronts the data does not have (the reason rainbow ramps are avoided).
 *
 * - `DEPTHS` (sequential, for properties: CT, SA, σ, oxygen…): pale sand L 0.97 → sea-green →
 *   teal → deep navy L 0.25, lightness falling linearly, hue turning from 105° to 262°.
 * - `BALANCE` (diverging, for anomalies and velocity): ocean blue L 0.36 → warm white L 0.965 at
 *   zero → brick L 0.36, the two arms mirror images in lightness so neither sign looks stronger.
 *   Centre it on zero (`zmid: 0` or a symmetric range).
 */

export type ColorScale = ReadonlyArray<readonly [number, string]>;

function evenly(colours: readonly string[]): ColorScale {
  return colours.map((c, i) => [i / (colours.length - 1), c] as const);
}

/** Sequential: light for low values, dark for high. */
export const DEPTHS: ColorScale = evenly([
  '#f8f7e0',
  '#d0deb8',
  '#9ec89d',
  '#65b08f',
  '#1f9789',
  '#007a84',
  '#005b78',
  '#003c62',
  '#0c2045',
]);

/** Diverging: blue for negative, warm white at zero, brick for positive. */
export const BALANCE: ColorScale = evenly([
  '#043e71',
  '#1f5fa0',
  '#4f84be',
  '#82a9d6',
  '#b7cee9',
  '#f9f2f0',
  '#e8c2b8',
  '#d29484',
  '#b76855',
  '#963f2a',
  '#692312',
]);

export const COLOR_SCALES = { sequential: DEPTHS, diverging: BALANCE } as const;
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
