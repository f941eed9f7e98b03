// Reproducible random seawater samples over the ocean's range (SP 2–42, t −2–35 °C,
// p 0–6500 dbar), placed in the given open-ocean boxes in turn — for the live cross-checks
// against python3-gsw and for the seawater benchmark.

/** A box [lon west, lon east, lat south, lat north], degrees. */
export type OceanBox = [number, number, number, number];

/** Open-ocean boxes away from coasts and the Baltic. */
export const OCEAN_BOXES: OceanBox[] = [
  [-60, -20, 15, 45], // North Atlantic
  [-35, 0, -45, -10], // South Atlantic
  [150, 220, 10, 45], // North Pacific
  [-150, -90, -50, -10], // South Pacific
  [60, 95, -40, -5], // Indian Ocean
  [0, 360, -70, -60], // Southern Ocean
];

export function randomOceanPoints(n: number, seed: number, boxes: OceanBox[] = OCEAN_BOXES) {
  let s = seed >>> 0;
  // a linear congruential generator: the same points on every run
  const next = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
  const SP = new Float64Array(n), t = new Float64Array(n), p = new Float64Array(n);
  const lon = new Float64Array(n), lat = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    SP[i] = 2 + 40 * next();
    t[i] = -2 + 37 * next();
    p[i] = 6500 * next();
    const [w, e, so, no] = boxes[i % boxes.length];
    lon[i] = w + (e - w) * next();
    lat[i] = so + (no - so) * next();
  }
  return { SP, t, p, lon, lat };
}
