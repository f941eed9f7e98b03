/**
 * Summaries of a comparison: along-line means of a grid, the change of geostrophic transport per
 * isopycnal layer, and the time between two occupations.
 */
import { geostrophicSection, transportPerLayer } from '../section/geostrophy';

/**
 * Along-line mean of each row of a grid (data[row·nx + position], NaN empty), weighted by the
 * along-line length each position stands for (half the distance to each neighbour; common
 * practice for a section mean). NaN where the row has no value.
 */
export function alongLineMean(x: Float64Array, g: Float64Array, ny: number): Float64Array {
  const nx = x.length;
  const w = new Float64Array(nx);
  for (let j = 0; j < nx; j++) {
    const left = j > 0 ? x[j] - x[j - 1] : 0;
    const right = j < nx - 1 ? x[j + 1] - x[j] : 0;
    w[j] = nx === 1 ? 1 : 0.5 * (left + right);
  }
  const out = new Float64Array(ny);
  for (let i = 0; i < ny; i++) {
    let s = 0;
    let sw = 0;
    for (let j = 0; j < nx; j++) {
      const v = g[i * nx + j];
      if (v === v) {
        s += w[j] * v;
        sw += w[j];
      }
    }
    out[i] = sw > 0 ? s / sw : NaN;
  }
  return out;
}

/** Geostrophic transport per layer in each occupation and its change, Sv. */
export interface LayerChange {
  sigmaTop: number;
  sigmaBottom: number;
  A: number;
  B: number;
  change: number;
}

/**
 * Geostrophic transport (relative to the deepest level each pair shares) per isopycnal layer in
 * each occupation at the same common positions, and B − A, Sv. SA/CT are grids on the pressure
 * levels p (data[level·nx + position]); lon/lat the positions. Velocity and layer integral from
 * shared/section/geostrophy (TEOS-10 Manual §3.27).
 */
export function layerTransportChange(
  lon: Float64Array,
  lat: Float64Array,
  p: Float64Array,
  a: { SA: Float64Array; CT: Float64Array },
  b: { SA: Float64Array; CT: Float64Array },
  ref: number,
  bounds: Float64Array,
): LayerChange[] {
  const nx = lon.length;
  const np = p.length;
  const casts = (o: { SA: Float64Array; CT: Float64Array }) =>
    Array.from({ length: nx }, (_, j) => ({
      id: String(j),
      lon: lon[j],
      lat: lat[j],
      p,
      SA: Float64Array.from({ length: np }, (_, i) => o.SA[i * nx + j]),
      CT: Float64Array.from({ length: np }, (_, i) => o.CT[i * nx + j]),
    })).filter((c) => Number.isFinite(c.lon) && Number.isFinite(c.lat));
  if (bounds.length < 2) return [];
  // The levels are the integration grid (trapezoid between them, TEOS-10 Manual §3.27): no finer
  // interpolated grid is needed for a comparison of two occupations on the same levels.
  const step = np > 1 ? p[1] - p[0] : 1;
  const o = {
    pRef: 'deepest_common' as const,
    levels: p,
    sigmaRef: ref,
    max_dp: step,
    interpolation: 'linear' as const,
  };
  const ta = transportPerLayer(geostrophicSection(casts(a), o), bounds);
  const tb = transportPerLayer(geostrophicSection(casts(b), o), bounds);
  return ta.map((l, i) => ({
    sigmaTop: l.sigmaTop,
    sigmaBottom: l.sigmaBottom,
    A: l.total,
    B: tb[i].total,
    change: tb[i].total - l.total,
  }));
}

const YEAR_MS = 365.2425 * 86_400_000;

/** Years from the mean time of A's casts to that of B's (Gregorian year); null when either has none. */
export function yearsBetween(a: (number | null)[], b: (number | null)[]): number | null {
  const meanOf = (t: (number | null)[]) => {
    const v = t.filter((x): x is number => x !== null && Number.isFinite(x));
    return v.length ? v.reduce((s, x) => s + x, 0) / v.length : NaN;
  };
  const d = (meanOf(b) - meanOf(a)) / YEAR_MS;
  return Number.isFinite(d) ? d : null;
}
