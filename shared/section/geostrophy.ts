/**
 * Geostrophic velocity between adjacent casts of a section and transport per isopycnal layer
 * (docs/science.md §4). Dynamic height anomaly and the pair velocity come from the seawater core
 * (TEOS-10 Manual §3.27: v = (D_b − D_a)/(f L), f = 2Ω sin φ at the mid latitude, L the
 * great-circle distance), positive 90° to the left of the direction from cast a to cast b
 * (looking along the section from its first cast towards its last, positive is to the left:
 * for a section run eastward, positive is northward).
 *
 * The casts are first put on common pressure levels (linear in pressure inside each cast, never
 * extrapolated), so both casts of a pair share levels as the dynamic-height difference needs.
 */
import { geo_strf_velocity, type DynHeightOptions } from '../seawater/geostrophy';
import { sigma_batch } from '../seawater/density';
import { z_from_p } from '../seawater/depth';
import { alongTrackDistance, greatCircleKm } from './distance';

export interface GeostrophyCast {
  id: string;
  lon: number;
  lat: number;
  /** Sea pressure, dbar, increasing. */
  p: Float64Array;
  /** Absolute Salinity, g/kg. */
  SA: Float64Array;
  /** Conservative Temperature, °C. */
  CT: Float64Array;
}

export interface GeostrophyOptions extends DynHeightOptions {
  /** Reference pressure (dbar) of zero velocity, or the deepest level both casts of a pair share. */
  pRef: number | 'deepest_common';
  /** Common pressure levels, dbar ascending (default every binSize dbar from 0 to the deepest sample). */
  levels?: Float64Array;
  /** Spacing of the default levels, dbar (default 10). */
  binSize?: number;
  /** Reference pressure of the σ kept per pair for layer transports, dbar (default 0). */
  sigmaRef?: number;
  /** Distance along the line of each cast, km (default: great-circle legs summed). */
  positions?: ArrayLike<number>;
  /** Pairs closer than this, km, are skipped and named (default 2 km): ΔD over a near-zero L is noise. */
  minDistanceKm?: number;
}

export interface GeostrophicPair {
  a: string;
  b: string;
  /** Along-track position of the pair's mid-point, km from the first cast. */
  x: number;
  /** Great-circle distance between the casts, m (the pair's width for transports). */
  width: number;
  /** Mid latitude, degrees. */
  lat: number;
  /** Reference pressure used, dbar (NaN when the casts share no level). */
  pRef: number;
  /** Velocity on the levels, m/s (NaN where either cast has no water). */
  velocity: Float64Array;
  /** Mean σ of the two casts on the levels, kg/m³ (reference sigmaRef). */
  sigma: Float64Array;
}

export interface GeostrophicSection {
  /** Common pressure levels, dbar. */
  p: Float64Array;
  pairs: GeostrophicPair[];
  sigmaRef: number;
  /** Velocity as a JSON grid: x pair mid-points (km), y levels (dbar), z[iy][ix] m/s, null empty. */
  grid: { x: number[]; y: number[]; z: (number | null)[][] };
  /** Adjacent casts closer than the minimum distance, not used. */
  skipped: { a: string; b: string; distanceKm: number }[];
}

/** Column c of a cast linearly interpolated in pressure at the levels; NaN outside the cast. */
export function onLevels(p: Float64Array, c: Float64Array, levels: Float64Array): Float64Array {
  const out = new Float64Array(levels.length).fill(NaN);
  let k = 0;
  const n = p.length;
  for (let j = 0; j < levels.length; j++) {
    const q = levels[j];
    if (n === 0 || q < p[0] || q > p[n - 1]) continue;
    while (k < n - 2 && p[k + 1] < q) k++;
    if (n === 1) {
      out[j] = c[0];
      continue;
    }
    const h = p[k + 1] - p[k];
    const w = h > 0 ? (q - p[k]) / h : 0;
    out[j] = c[k] + w * (c[k + 1] - c[k]);
  }
  return out;
}

/** Finite levels only: a cast may carry NaN pressures or values from quality flags. */
function cleanCast(c: GeostrophyCast): { p: Float64Array; SA: Float64Array; CT: Float64Array } {
  const keep: number[] = [];
  for (let i = 0; i < c.p.length; i++)
    if (Number.isFinite(c.p[i]) && Number.isFinite(c.SA[i]) && Number.isFinite(c.CT[i])) keep.push(i);
  return {
    p: Float64Array.from(keep, (i) => c.p[i]),
    SA: Float64Array.from(keep, (i) => c.SA[i]),
    CT: Float64Array.from(keep, (i) => c.CT[i]),
  };
}

/**
 * Geostrophic velocity between each adjacent pair of casts (in the order given, along the
 * track), relative to opts.pRef, on common pressure levels. SA g/kg, CT °C, p dbar, lon/lat degrees.
 */
export function geostrophicSection(casts: GeostrophyCast[], opts: GeostrophyOptions): GeostrophicSection {
  const clean = casts.map(cleanCast);
  let levels = opts.levels;
  if (!levels) {
    const step = opts.binSize ?? 10;
    let deep = 0;
    for (const c of clean) if (c.p.length && c.p[c.p.length - 1] > deep) deep = c.p[c.p.length - 1];
    const n = Math.floor(deep / step) + 1;
    levels = Float64Array.from({ length: n }, (_, i) => i * step);
  }
  const sigmaRef = opts.sigmaRef ?? 0;
  const onLv = clean.map((c) => {
    const SA = onLevels(c.p, c.SA, levels!);
    const CT = onLevels(c.p, c.CT, levels!);
    return { SA, CT, sigma: sigma_batch(SA, CT, sigmaRef) };
  });
  const x = alongTrackDistance(
    Float64Array.from(casts, (c) => c.lon),
    Float64Array.from(casts, (c) => c.lat),
    { positions: opts.positions },
  );
  const pairs: GeostrophicPair[] = [];
  const skipped: GeostrophicSection['skipped'] = [];
  const minKm = opts.minDistanceKm ?? 2;
  for (let i = 0; i + 1 < casts.length; i++) {
    const a = casts[i];
    const b = casts[i + 1];
    const apartKm = greatCircleKm(a.lon, a.lat, b.lon, b.lat);
    if (apartKm < minKm) {
      skipped.push({ a: a.id, b: b.id, distanceKm: apartKm });
      continue;
    }
    const la = onLv[i];
    const lb = onLv[i + 1];
    const r = geo_strf_velocity(
      { SA: la.SA, CT: la.CT, lon: a.lon, lat: a.lat },
      { SA: lb.SA, CT: lb.CT, lon: b.lon, lat: b.lat },
      levels,
      opts.pRef,
      { max_dp: opts.max_dp, interpolation: opts.interpolation },
    );
    const sigma = new Float64Array(levels.length);
    for (let j = 0; j < levels.length; j++) sigma[j] = 0.5 * (la.sigma[j] + lb.sigma[j]);
    pairs.push({
      a: a.id,
      b: b.id,
      x: 0.5 * (x[i] + x[i + 1]),
      width: r.distance,
      lat: 0.5 * (a.lat + b.lat),
      pRef: r.p_ref,
      velocity: r.v,
      sigma,
    });
  }
  const z: (number | null)[][] = [];
  for (let j = 0; j < levels.length; j++)
    z.push(pairs.map((pr) => (Number.isFinite(pr.velocity[j]) ? pr.velocity[j] : null)));
  return { p: levels, pairs, sigmaRef, grid: { x: pairs.map((pr) => pr.x), y: Array.from(levels), z }, skipped };
}

export interface LayerTransport {
  /** Layer bounds, kg/m³: sigmaTop ≤ σ < sigmaBottom. */
  sigmaTop: number;
  sigmaBottom: number;
  /** Transport through each pair, Sv (10⁶ m³/s), positive as the velocity. */
  transport: Float64Array;
  /** Sum over the pairs, Sv. */
  total: number;
}

/**
 * Transport per isopycnal layer, Sv. boundaries: ascending σ (kg/m³) of the layer interfaces
 * (n + 1 bounds make n layers). Each interval between adjacent levels is split where the pair's
 * σ (linear in pressure inside it) crosses an interface; each piece adds ∫ v dz (trapezoid in
 * the piece, dz from TEOS-10 z_from_p at the pair's latitude) times the width (m) to the layer
 * holding the piece's mid σ. widths default to the pair distances.
 */
export function transportPerLayer(
  section: GeostrophicSection,
  boundaries: Float64Array,
  widths?: Float64Array,
): LayerTransport[] {
  const nl = boundaries.length - 1;
  for (let i = 1; i < boundaries.length; i++)
    if (!(boundaries[i] > boundaries[i - 1])) throw new RangeError('layer boundaries must increase');
  const layers: LayerTransport[] = [];
  for (let l = 0; l < nl; l++)
    layers.push({
      sigmaTop: boundaries[l],
      sigmaBottom: boundaries[l + 1],
      transport: new Float64Array(section.pairs.length),
      total: 0,
    });
  if (nl <= 0) return layers;
  const p = section.p;
  const cuts: number[] = [];
  const layerOf = (s: number): number => {
    if (!(s >= boundaries[0] && s < boundaries[nl])) return -1;
    let lo = 0;
    let hi = nl;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (boundaries[mid] <= s) lo = mid;
      else hi = mid;
    }
    return lo;
  };
  section.pairs.forEach((pair, ip) => {
    const width = widths ? widths[ip] : pair.width;
    const v = pair.velocity;
    const s = pair.sigma;
    const height = Float64Array.from(p, (pk) => z_from_p(pk, pair.lat));
    for (let k = 0; k + 1 < p.length; k++) {
      if (!(Number.isFinite(v[k]) && Number.isFinite(v[k + 1]) && Number.isFinite(s[k]) && Number.isFinite(s[k + 1])))
        continue;
      const dz = height[k] - height[k + 1];
      const s0 = s[k];
      const s1 = s[k + 1];
      cuts.length = 0;
      cuts.push(0);
      if (s0 !== s1) {
        const lo = Math.min(s0, s1);
        const hi = Math.max(s0, s1);
        const ts: number[] = [];
        for (let b = 0; b <= nl; b++)
          if (boundaries[b] > lo && boundaries[b] < hi) ts.push((boundaries[b] - s0) / (s1 - s0));
        ts.sort((a, c) => a - c);
        cuts.push(...ts);
      }
      cuts.push(1);
      for (let c = 0; c + 1 < cuts.length; c++) {
        const t0 = cuts[c];
        const t1 = cuts[c + 1];
        const l = layerOf(s0 + 0.5 * (t0 + t1) * (s1 - s0));
        if (l < 0) continue;
        const vMean = v[k] + 0.5 * (t0 + t1) * (v[k + 1] - v[k]);
        layers[l].transport[ip] += (vMean * dz * (t1 - t0) * width) / 1e6;
      }
    }
  });
  for (const layer of layers) layer.total = layer.transport.reduce((a, b) => a + b, 0);
  return layers;
}
