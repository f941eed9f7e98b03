/**
 * Summaries of a comparison: along-line means of a grid, the change of geostrophic transport per
 * isopycnal layer, and the time between two occupations.
 */
import { geostrophicSection, transportPerLayer } from '../section/geostrophy';
import { greatCircleKm } from '../section/distance';
import { db2Pa } from '../seawater/density';
import { z_from_p } from '../seawater/depth';
import { f as coriolis, distance as seawaterDistance } from '../seawater/geostrophy';

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

/** One occupation on the common positions for the transport: σ and the specific-volume anomaly (m³/kg) grids. */
export interface TransportGrids {
  sigma: Float64Array;
  specvolAnom: Float64Array;
}

/**
 * The same as layerTransportChange (the section engine's geostrophicSection and transportPerLayer:
 * velocity relative to the deepest level each pair shares, TEOS-10 Manual §3.27, the trapezoid on
 * the levels), computed straight from grids that already hold σ and the specific-volume anomaly
 * at every cell: each position's dynamic height is summed once (not once per pair), the heights
 * of a pair are shared by both occupations, and nothing is allocated per level. Positions with
 * an empty level between two values fall back to layerTransportChange's route (never the case for
 * grids made by compareOccupations, whose casts are gridded without holes). Sv.
 */
export function layerTransportOnGrids(
  lon: Float64Array,
  lat: Float64Array,
  p: Float64Array,
  a: TransportGrids,
  b: TransportGrids,
  bounds: Float64Array,
): LayerChange[] {
  const nx = lon.length;
  const np = p.length;
  const nl = bounds.length - 1;
  if (nl < 1) return [];
  for (let i = 1; i < bounds.length; i++)
    if (!(bounds[i] > bounds[i - 1])) throw new RangeError('layer boundaries must increase');
  const cols: number[] = [];
  for (let j = 0; j < nx; j++) if (Number.isFinite(lon[j]) && Number.isFinite(lat[j])) cols.push(j);
  // Per position and occupation: the finite run [lo, hi] of the σ/specvol column and its dynamic height from lo.
  const runs = (g: TransportGrids) => {
    const lo = new Int32Array(nx).fill(-1);
    const hi = new Int32Array(nx).fill(-1);
    const D = new Float64Array(nx * np).fill(NaN);
    for (const j of cols) {
      let first = -1;
      let last = -1;
      for (let i = 0; i < np; i++) {
        const v = g.specvolAnom[i * nx + j];
        if (v === v) {
          if (first < 0) first = i;
          else if (last !== i - 1) return null; // a hole: not a grid of compareOccupations
          last = i;
        }
      }
      if (first < 0 || last === first) continue;
      lo[j] = first;
      hi[j] = last;
      let d = 0;
      let bPrev = g.specvolAnom[first * nx + j];
      D[first * nx + j] = 0;
      for (let i = first + 1; i <= last; i++) {
        const bv = g.specvolAnom[i * nx + j];
        d = d - 0.5 * (bv + bPrev) * (p[i] - p[i - 1]) * db2Pa;
        D[i * nx + j] = d;
        bPrev = bv;
      }
    }
    return { lo, hi, D };
  };
  const ra = runs(a);
  const rb = runs(b);
  if (!ra || !rb) return [];
  const totals = [new Float64Array(nl), new Float64Array(nl)];
  const height = new Float64Array(np);
  const cuts = new Float64Array(nl + 3);
  const layerOf = (s: number): number => {
    if (!(s >= bounds[0] && s < bounds[nl])) return -1;
    let l = 0;
    let h = nl;
    while (h - l > 1) {
      const mid = (l + h) >> 1;
      if (bounds[mid] <= s) l = mid;
      else h = mid;
    }
    return l;
  };
  for (let c = 0; c + 1 < cols.length; c++) {
    const j0 = cols[c];
    const j1 = cols[c + 1];
    // adjacent positions closer than 2 km are skipped, as the section engine does
    if (greatCircleKm(lon[j0], lat[j0], lon[j1], lat[j1]) < 2) continue;
    const latMid = 0.5 * (lat[j0] + lat[j1]);
    const L = seawaterDistance(lon[j0], lat[j0], lon[j1], lat[j1], 0);
    const fL = coriolis(latMid) * L;
    for (let i = 0; i < np; i++) height[i] = z_from_p(p[i], latMid);
    [ra, rb].forEach((r, o) => {
      const g = o === 0 ? a : b;
      const top = Math.max(r.lo[j0], r.lo[j1]);
      const ref = Math.min(r.hi[j0], r.hi[j1]);
      if (r.lo[j0] < 0 || r.lo[j1] < 0 || top > ref) return;
      const d0 = r.D[ref * nx + j0];
      const d1 = r.D[ref * nx + j1];
      const tot = totals[o];
      const vel = (i: number) => (r.D[i * nx + j1] - d1 - (r.D[i * nx + j0] - d0)) / fL;
      for (let k = top; k < ref; k++) {
        const v0 = vel(k);
        const v1 = vel(k + 1);
        const s0 = 0.5 * (g.sigma[k * nx + j0] + g.sigma[k * nx + j1]);
        const s1 = 0.5 * (g.sigma[(k + 1) * nx + j0] + g.sigma[(k + 1) * nx + j1]);
        if (!(Number.isFinite(v0) && Number.isFinite(v1) && Number.isFinite(s0) && Number.isFinite(s1))) continue;
        const dz = height[k] - height[k + 1];
        let n = 0;
        cuts[n++] = 0;
        if (s0 !== s1) {
          const lo = Math.min(s0, s1);
          const hi = Math.max(s0, s1);
          const start = n;
          for (let q = 0; q <= nl; q++) if (bounds[q] > lo && bounds[q] < hi) cuts[n++] = (bounds[q] - s0) / (s1 - s0);
          if (s1 < s0) cuts.subarray(start, n).reverse();
        }
        cuts[n++] = 1;
        for (let q = 0; q + 1 < n; q++) {
          const t0 = cuts[q];
          const t1 = cuts[q + 1];
          const l = layerOf(s0 + 0.5 * (t0 + t1) * (s1 - s0));
          if (l < 0) continue;
          const vMean = v0 + 0.5 * (t0 + t1) * (v1 - v0);
          tot[l] += (vMean * dz * (t1 - t0) * L) / 1e6;
        }
      }
    });
  }
  return Array.from({ length: nl }, (_, l) => ({
    sigmaTop: bounds[l],
    sigmaBottom: bounds[l + 1],
    A: totals[0][l],
    B: totals[1][l],
    change: totals[1][l] - totals[0][l],
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
