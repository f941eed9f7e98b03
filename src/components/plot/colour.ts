/**
 * Colour arithmetic for Sigmaline's palettes and for the tests that check them: sRGB ↔ linear RGB
 * ↔ OKLab / OKLCH, CIE XYZ → CIELAB, and the simulation of colour-vision deficiency.
 * No dependencies; every function is pure and works on plain numbers.
 */

export type Rgb = readonly [number, number, number];

/** sRGB transfer function (IEC 61966-2-1:1999): an sRGB component 0–1 to linear light 0–1. */
export function srgbToLinear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** Inverse of `srgbToLinear`. */
export function linearToSrgb(c: number): number {
  return c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055;
}

/**
 * OKLab (B. Ottosson, 2020, "A perceptual color space for image processing") from linear sRGB.
 * L is 0 (black) to 1 (white).
 */
export function linearToOklab([r, g, b]: Rgb): Rgb {
  const l = Math.cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  return [
    0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s,
  ];
}

/** Inverse of `linearToOklab` (Ottosson 2020). */
export function oklabToLinear([L, a, b]: Rgb): Rgb {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s,
  ];
}

const inGamut = (c: Rgb) => c.every((v) => v >= -1e-6 && v <= 1 + 1e-6);

/**
 * An sRGB colour (components 0–1) for an OKLCH lightness, chroma and hue (degrees). A colour
 * outside sRGB keeps its lightness and hue and loses chroma until it fits, so a palette's
 * lightness ramp survives the gamut.
 */
export function oklchToSrgb(L: number, C: number, hDeg: number): Rgb {
  const h = (hDeg * Math.PI) / 180;
  let lo = 0,
    hi = C;
  let best = oklabToLinear([L, 0, 0]);
  const at = (c: number) => oklabToLinear([L, c * Math.cos(h), c * Math.sin(h)]);
  if (inGamut(at(C))) best = at(C);
  else {
    for (let i = 0; i < 30; i++) {
      const mid = (lo + hi) / 2;
      const lin = at(mid);
      if (inGamut(lin)) {
        lo = mid;
        best = lin;
      } else hi = mid;
    }
  }
  return best.map((v) => Math.min(1, Math.max(0, linearToSrgb(Math.min(1, Math.max(0, v)))))) as unknown as Rgb;
}

export function hexToRgb01(hex: string): Rgb {
  const v = parseInt(hex.slice(1), 16);
  return [((v >> 16) & 255) / 255, ((v >> 8) & 255) / 255, (v & 255) / 255];
}

export function rgb01ToHex(c: Rgb): string {
  return `#${c
    .map((v) =>
      Math.round(Math.min(1, Math.max(0, v)) * 255)
        .toString(16)
        .padStart(2, '0'),
    )
    .join('')}`;
}

/**
 * CIELAB (CIE 15:2004, D65 white) of an sRGB colour (components 0–1), through CIE XYZ with the
 * sRGB primaries of IEC 61966-2-1. L* is 0–100.
 */
export function srgbToCielab(c: Rgb): Rgb {
  const [r, g, b] = c.map(srgbToLinear);
  const x = (0.4124564 * r + 0.3575761 * g + 0.1804375 * b) / 0.95047;
  const y = 0.2126729 * r + 0.7151522 * g + 0.072175 * b;
  const z = (0.0193339 * r + 0.119192 * g + 0.9503041 * b) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  const fx = f(x),
    fy = f(y),
    fz = f(z);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** CIE76 colour difference ΔE*ab between two CIELAB colours. */
export function deltaE76(a: Rgb, b: Rgb): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
}

/**
 * Simulation matrices of dichromacy (severity 1.0) in linear RGB, from G. M. Machado, M. M.
 * Oliveira and L. A. F. Fernandes (2009), "A physiologically-based model for simulation of color
 * vision deficiency", IEEE Transactions on Visualization and Computer Graphics 15(6), 1291–1298,
 * Table 1 (values from memory; each row sums to 1, as the paper's do, so grey stays grey).
 */
export const MACHADO_2009 = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
} as const;
export type Deficiency = keyof typeof MACHADO_2009;

/** An sRGB colour (0–1) as a viewer with the given dichromacy sees it (Machado et al. 2009). */
export function simulateDeficiency(c: Rgb, kind: Deficiency): Rgb {
  const lin = c.map(srgbToLinear);
  const m = MACHADO_2009[kind];
  return m.map((row) =>
    linearToSrgb(Math.min(1, Math.max(0, row[0] * lin[0] + row[1] * lin[1] + row[2] * lin[2]))),
  ) as unknown as Rgb;
}

/** Relative luminance Y (0–1) of an sRGB colour: what a grey print keeps of it. */
export function luminance(c: Rgb): number {
  const [r, g, b] = c.map(srgbToLinear);
  return 0.2126729 * r + 0.7151522 * g + 0.072175 * b;
}
