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
  const SP = new Float64Array(n),
    t = new Float64Array(n),
    p = new Float64Array(n);
  const lon = new Float64Array(n),
    lat = new Float64Array(n);
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

/** One 4° cell of the SAAR atlas grid: its south-west corner and the deepest pressure it reads, dbar. */
export type AtlasCell = { lon: number; lat: number; deepestPressure: number; gaps: boolean };

/**
 * Reproducible points over the whole ocean for the Absolute Salinity cross-check: uniform over the
 * globe (longitudes given in several turns, −360…720 °E), cells with corners without data
 * (coasts, ridges, seamounts), both sides of the 0°/360° seam, the Panama box, and the Southern
 * Ocean ridge region near 0° E; each at a pressure from 0 down to a little below the cell's
 * deepest level.
 */
export function randomWholeOceanPoints(n: number, seed: number, cells: AtlasCell[]) {
  let s = seed >>> 0;
  const next = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
  const withGaps = cells.filter((c) => c.gaps);
  const SP = new Float64Array(n),
    p = new Float64Array(n),
    lon = new Float64Array(n),
    lat = new Float64Array(n);
  const depthAt = (x: number, y: number) => {
    const ix = Math.min(89, Math.floor((((x % 360) + 360) % 360) / 4));
    const iy = Math.min(43, Math.max(0, Math.floor((y + 86) / 4)));
    return cells[iy * 90 + ix].deepestPressure;
  };
  for (let i = 0; i < n; i++) {
    SP[i] = 2 + 40 * next();
    const kind = i % 10;
    if (kind < 4) {
      // anywhere, in any of three turns of longitude
      lon[i] = -360 + 1080 * next();
      lat[i] = -86 + 176 * next();
    } else if (kind < 6) {
      // a cell with missing corners
      const c = withGaps[Math.floor(next() * withGaps.length)];
      lon[i] = c.lon + 4 * next();
      lat[i] = c.lat + 4 * next();
    } else if (kind === 6) {
      // across the seam, written either way
      const x = -4 + 8 * next();
      lon[i] = next() < 0.5 ? x : x < 0 ? x + 360 : x;
      lat[i] = -86 + 176 * next();
    } else if (kind === 7) {
      // the Panama box and its edges
      lon[i] = 255 + 45 * next();
      lat[i] = -2 + 26 * next();
    } else {
      // the Southern Ocean ridge region near 0° E, 1500–2300 dbar
      lon[i] = -3 + 3 * next();
      lat[i] = -55 + 5 * next();
      p[i] = 1500 + 800 * next();
      continue;
    }
    p[i] = (depthAt(lon[i], lat[i]) + 300) * next();
  }
  return { SP, p, lon, lat };
}
