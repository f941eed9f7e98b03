/**
 * Section grids (docs/science.md §4): a property on pressure × distance and on σ × distance.
 *
 * - Casts are ordered by along-track distance (distance.ts).
 * - Columns: at every cast, and on a regular distance grid between them.
 * - Between two adjacent casts a and b, a value is the linear interpolation in distance of the
 *   two casts' values. The section's top and bottom are lines drawn linearly in distance between
 *   the casts' shallowest level and bottom (pressure frame: bottom pressure from the cast's bottom
 *   depth, else its deepest sample, which is then marked as not a known bottom, so a screen shows
 *   "no data below the cast" and never land there; density frame: the lightest and densest σ of the cast). Below
 *   the bottom line or above the top line nothing is drawn, so nothing is extrapolated below the
 *   deeper of two bottoms; between the lines, where only one cast has water (near a sloping
 *   bottom, or at a level one cast lacks), that cast's value is carried.
 * - Across a gap wider than gapFactor × the median cast spacing (default 1.5) the columns are
 *   left empty, except at the casts themselves.
 * Output is JSON-ready: plain arrays, y-major z[iy][ix], null for empty.
 */
import { alongTrackDistance, type DistanceOptions } from './distance';
import { binToPressure } from '../remap/binning';
import { detectInversions, type InversionClass } from '../remap/inversions';
import { remapToIsopycnals, type InversionHandling, type SigmaInterpolation, type RemapResult } from '../remap/remap';
import { p_from_z } from '../seawater/depth';

export interface SectionCast {
  id: string;
  station: string;
  lon: number;
  lat: number;
  /** Bottom depth at the station, m (null when unknown: the deepest sample stands in). */
  bottomDepth: number | null;
  /** Sea pressure, dbar, increasing. */
  p: Float64Array;
  /** Height, m (negative below the surface). */
  z?: Float64Array;
  /** σ of the section's reference pressure, kg/m³. */
  sigma: Float64Array;
  props: Record<string, Float64Array>;
}

export interface SectionCastInfo {
  id: string;
  station: string;
  lon: number;
  lat: number;
  /** Along-track distance, km. */
  x: number;
  /** Bottom pressure, dbar: from the bottom depth where known, else the cast's deepest good level. */
  bottom: number;
  bottomDepth: number | null;
  /** Whether the bottom is known (a bottom depth): where it is not, below the cast is "no data", never land. */
  bottomKnown: boolean;
  /** Inversion markers of the cast in the section's σ. */
  inversions: { pTop: number; pBottom: number; deficit: number; class: InversionClass }[];
}

export interface SectionGrid {
  coord: 'pressure' | 'density';
  property: string;
  /** Column positions, km. */
  x: number[];
  /** Rows: bin centres (dbar) or σ levels (kg/m³). */
  y: number[];
  /** The property, z[iy][ix]; null where empty. */
  z: (number | null)[][];
  casts: SectionCastInfo[];
  /** The bottom at each cast: pressure (dbar), the densest σ there, and whether it is a known bottom
   * (from a bottom depth) or only where the cast stopped. */
  bottom: { x: number; p: number; sigma: number | null; known: boolean }[];
  /** Distance ranges left empty by the gap rule, km. */
  gaps: { from: number; to: number }[];
  medianSpacingKm: number;
  gapKm: number;
}

export interface DensitySectionGrid extends SectionGrid {
  /** Pressure of each σ level, dbar, on the same grid. */
  pressure: (number | null)[][];
  /** Depth of each σ level, m, when the casts carry heights. */
  depth: (number | null)[][] | null;
  handling: InversionHandling;
  interpolation: SigmaInterpolation;
}

export interface CommonSectionOptions extends DistanceOptions {
  /** Gap rule factor on the median spacing (default 1.5). */
  gapFactor?: number;
  /** Step of the regular distance grid between casts, km (default a quarter of the median spacing). */
  distanceKm?: number;
  /** Inversion threshold for the markers, kg/m³ (default 0.01). */
  inversionThreshold?: number;
}

/** A grid held as typed rows before it becomes JSON: data[iy·nx + ix], NaN empty. */
export interface RawGrid {
  x: Float64Array;
  y: Float64Array;
  data: Float64Array;
}

interface PlacedCast {
  cast: SectionCast;
  x: number;
  bottom: number;
  known: boolean;
}

const median = (v: number[]): number => {
  if (v.length === 0) return NaN;
  const s = [...v].sort((a, b) => a - b);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : 0.5 * (s[h - 1] + s[h]);
};

/** Bottom pressure of a cast, dbar: from its bottom depth (TEOS-10 p_from_z), never above its deepest sample. */
export function bottomPressure(cast: SectionCast): number {
  let pDeep = -Infinity;
  for (let i = 0; i < cast.p.length; i++) if (Number.isFinite(cast.sigma[i]) && cast.p[i] > pDeep) pDeep = cast.p[i];
  if (cast.bottomDepth !== null && Number.isFinite(cast.bottomDepth)) {
    const pb = p_from_z(-cast.bottomDepth, cast.lat);
    if (Number.isFinite(pb)) return Math.max(pb, pDeep);
  }
  return pDeep;
}

/** Whether a cast's bottom is known: it has a bottom depth (from its file or the station plan). */
export function bottomKnown(cast: SectionCast): boolean {
  return (
    cast.bottomDepth !== null &&
    Number.isFinite(cast.bottomDepth) &&
    Number.isFinite(p_from_z(-cast.bottomDepth, cast.lat))
  );
}

/** Casts with their along-track distance and bottom, ordered by distance. */
function placeCasts(casts: SectionCast[], opts: DistanceOptions): PlacedCast[] {
  const x = alongTrackDistance(
    Float64Array.from(casts, (c) => c.lon),
    Float64Array.from(casts, (c) => c.lat),
    opts,
  );
  return casts
    .map((cast, i) => ({ cast, x: x[i], bottom: bottomPressure(cast), known: bottomKnown(cast) }))
    .sort((a, b) => a.x - b.x);
}

/** Column positions: every cast, plus a regular grid of the given step between the first and last. */
export function sectionColumns(castX: number[], stepKm: number): Float64Array {
  const xs = [...castX];
  const x0 = castX[0];
  const x1 = castX[castX.length - 1];
  if (stepKm > 0 && x1 > x0) {
    const n = Math.min(4000, Math.floor((x1 - x0) / stepKm));
    for (let i = 1; i <= n; i++) xs.push(x0 + i * stepKm);
  }
  xs.sort((a, b) => a - b);
  const out: number[] = [];
  for (const v of xs) if (out.length === 0 || v - out[out.length - 1] > 1e-6) out.push(v);
  return Float64Array.from(out);
}

/**
 * Interpolate cast columns onto the columns xg by the rules at the head of this file.
 * castX km ascending; cols[c] the c-th cast's values on the rows y; top/bottom the envelope of
 * each cast in row units; gapKm the widest interpolated spacing.
 */
export function interpolateColumns(
  xg: Float64Array,
  castX: number[],
  cols: Float64Array[],
  top: number[],
  bottom: number[],
  y: Float64Array,
  gapKm: number,
): { data: Float64Array; gaps: { from: number; to: number }[] } {
  const nx = xg.length;
  const ny = y.length;
  const data = new Float64Array(nx * ny).fill(NaN);
  const gaps: { from: number; to: number }[] = [];
  for (let c = 0; c + 1 < castX.length; c++)
    if (castX[c + 1] - castX[c] > gapKm) gaps.push({ from: castX[c], to: castX[c + 1] });
  let c = 0;
  for (let ix = 0; ix < nx; ix++) {
    const xv = xg[ix];
    while (c + 1 < castX.length - 1 && castX[c + 1] <= xv) c++;
    const nearA = Math.abs(xv - castX[c]) <= 1e-6;
    const nearB = c + 1 < castX.length && Math.abs(xv - castX[c + 1]) <= 1e-6;
    if (nearA || nearB || castX.length === 1) {
      const k = nearB && !nearA ? c + 1 : c;
      const col = cols[k];
      for (let iy = 0; iy < ny; iy++) {
        const yv = y[iy];
        if (yv >= top[k] && yv <= bottom[k]) data[iy * nx + ix] = col[iy];
      }
      continue;
    }
    const xa = castX[c];
    const xb = castX[c + 1];
    if (xb - xa > gapKm || xv < xa || xv > xb) continue;
    const w = (xv - xa) / (xb - xa);
    const ca = cols[c];
    const cb = cols[c + 1];
    const tp = top[c] + w * (top[c + 1] - top[c]);
    const bt = bottom[c] + w * (bottom[c + 1] - bottom[c]);
    for (let iy = 0; iy < ny; iy++) {
      const yv = y[iy];
      if (yv < tp || yv > bt) continue;
      const va = ca[iy];
      const vb = cb[iy];
      const okA = va === va;
      const okB = vb === vb;
      data[iy * nx + ix] = okA && okB ? va + w * (vb - va) : okA ? va : okB ? vb : NaN;
    }
  }
  return { data, gaps };
}

/** Rows of a NaN-for-empty grid as JSON arrays with null for empty. */
export function toRows(data: Float64Array, nx: number, ny: number): (number | null)[][] {
  const rows: (number | null)[][] = new Array(ny);
  for (let iy = 0; iy < ny; iy++) {
    const row: (number | null)[] = new Array(nx);
    const o = iy * nx;
    for (let ix = 0; ix < nx; ix++) {
      const v = data[o + ix];
      row[ix] = v === v ? v : null;
    }
    rows[iy] = row;
  }
  return rows;
}

/** Grid rows (JSON) back to a NaN-for-empty typed grid, for slope and gradient computations. */
export function fromRows(rows: (number | null)[][]): Float64Array {
  const ny = rows.length;
  const nx = ny ? rows[0].length : 0;
  const out = new Float64Array(nx * ny);
  for (let iy = 0; iy < ny; iy++)
    for (let ix = 0; ix < nx; ix++) {
      const v = rows[iy][ix];
      out[iy * nx + ix] = v === null ? NaN : v;
    }
  return out;
}

function column(cast: SectionCast, property: string): Float64Array {
  if (property === 'sigma') return cast.sigma;
  if (property === 'pressure') return cast.p;
  const col = cast.props[property];
  if (!col) throw new RangeError(`cast ${cast.id} has no column "${property}"`);
  return col;
}

function spacing(placed: PlacedCast[], gapFactor: number): { medianSpacingKm: number; gapKm: number } {
  const d: number[] = [];
  for (let i = 1; i < placed.length; i++) {
    const s = placed[i].x - placed[i - 1].x;
    if (s > 0) d.push(s);
  }
  const med = median(d);
  return { medianSpacingKm: Number.isFinite(med) ? med : 0, gapKm: Number.isFinite(med) ? gapFactor * med : Infinity };
}

function castInfo(pc: PlacedCast, threshold: number | undefined): SectionCastInfo {
  const inv = detectInversions(pc.cast.p, pc.cast.sigma, { threshold });
  return {
    id: pc.cast.id,
    station: pc.cast.station,
    lon: pc.cast.lon,
    lat: pc.cast.lat,
    x: pc.x,
    bottom: pc.bottom,
    bottomDepth: pc.cast.bottomDepth,
    bottomKnown: pc.known,
    inversions: inv.map((i) => ({ pTop: i.pTop, pBottom: i.pBottom, deficit: i.deficit, class: i.class })),
  };
}

function densest(sigma: Float64Array): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < sigma.length; i++) {
    const s = sigma[i];
    if (s < min) min = s;
    if (s > max) max = s;
  }
  return { min, max };
}

export interface PressureSectionOptions extends CommonSectionOptions {
  property: string;
  /** Bin size, dbar. */
  binSize: number;
  /** Deepest bin centre, dbar (default the deepest sample of the section). */
  pMax?: number;
}

/** Property on pressure bins (mean within bins, binning.ts) × along-track distance. */
export function buildPressureSection(casts: SectionCast[], opts: PressureSectionOptions): SectionGrid {
  if (casts.length === 0) throw new RangeError('a section needs at least one cast');
  const placed = placeCasts(casts, opts);
  let pMax = opts.pMax ?? -Infinity;
  if (opts.pMax === undefined)
    for (const pc of placed) for (let i = 0; i < pc.cast.p.length; i++) if (pc.cast.p[i] > pMax) pMax = pc.cast.p[i];
  const cols: Float64Array[] = [];
  const top: number[] = [];
  const bottom: number[] = [];
  let y: Float64Array = new Float64Array(0);
  for (const pc of placed) {
    const b = binToPressure(pc.cast.p, { v: column(pc.cast, opts.property) }, opts.binSize, { pMin: 0, pMax });
    y = b.pressure;
    cols.push(b.props.v);
    let first = -1;
    for (let i = 0; i < b.count.length; i++)
      if (b.count[i] > 0) {
        first = i;
        break;
      }
    top.push(first >= 0 ? b.pressure[first] : Infinity);
    bottom.push(pc.bottom);
  }
  const { medianSpacingKm, gapKm } = spacing(placed, opts.gapFactor ?? 1.5);
  const castX = placed.map((pc) => pc.x);
  const xg = sectionColumns(castX, opts.distanceKm ?? medianSpacingKm / 4);
  const { data, gaps } = interpolateColumns(xg, castX, cols, top, bottom, y, gapKm);
  return {
    coord: 'pressure',
    property: opts.property,
    x: Array.from(xg),
    y: Array.from(y),
    z: toRows(data, xg.length, y.length),
    casts: placed.map((pc) => castInfo(pc, opts.inversionThreshold)),
    bottom: placed.map((pc) => ({
      x: pc.x,
      p: pc.bottom,
      sigma: Number.isFinite(densest(pc.cast.sigma).max) ? densest(pc.cast.sigma).max : null,
      known: pc.known,
    })),
    gaps,
    medianSpacingKm,
    gapKm,
  };
}

export interface DensitySectionOptions extends CommonSectionOptions {
  property: string;
  /** Target σ levels, ascending, kg/m³. */
  targets: Float64Array;
  handling: InversionHandling;
  interpolation: SigmaInterpolation;
}

/** Remap of every cast onto the targets, in distance order (exposed so a caller can reuse it). */
export function remapSectionCasts(
  casts: SectionCast[],
  targets: Float64Array,
  handling: InversionHandling,
  interpolation: SigmaInterpolation,
  threshold?: number,
): RemapResult[] {
  return casts.map((c) =>
    remapToIsopycnals({ p: c.p, z: c.z, sigma: c.sigma, props: c.props }, targets, {
      handling,
      interpolation,
      threshold,
    }),
  );
}

/** Property on σ levels (remap.ts) × along-track distance, with the pressure (and depth) of each level. */
export function buildDensitySection(casts: SectionCast[], opts: DensitySectionOptions): DensitySectionGrid {
  if (casts.length === 0) throw new RangeError('a section needs at least one cast');
  const placed = placeCasts(casts, opts);
  const remaps = remapSectionCasts(
    placed.map((pc) => pc.cast),
    opts.targets,
    opts.handling,
    opts.interpolation,
    opts.inversionThreshold,
  );
  const cols: Float64Array[] = [];
  const pCols: Float64Array[] = [];
  const dCols: Float64Array[] = [];
  const top: number[] = [];
  const bottom: number[] = [];
  const withDepth = remaps.every((r) => r.depth !== null);
  placed.forEach((pc, i) => {
    const r = remaps[i];
    const col =
      opts.property === 'pressure'
        ? r.pressure
        : opts.property === 'depth' && r.depth
          ? r.depth
          : r.props[opts.property];
    if (!col) throw new RangeError(`cast ${pc.cast.id} has no column "${opts.property}"`);
    cols.push(col);
    pCols.push(r.pressure);
    if (withDepth && r.depth) dCols.push(r.depth);
    const { min, max } = densest(pc.cast.sigma);
    top.push(min);
    bottom.push(max);
  });
  const { medianSpacingKm, gapKm } = spacing(placed, opts.gapFactor ?? 1.5);
  const castX = placed.map((pc) => pc.x);
  const xg = sectionColumns(castX, opts.distanceKm ?? medianSpacingKm / 4);
  const y = opts.targets;
  const main = interpolateColumns(xg, castX, cols, top, bottom, y, gapKm);
  const pg = interpolateColumns(xg, castX, pCols, top, bottom, y, gapKm);
  const dg = withDepth ? interpolateColumns(xg, castX, dCols, top, bottom, y, gapKm) : null;
  return {
    coord: 'density',
    property: opts.property,
    x: Array.from(xg),
    y: Array.from(y),
    z: toRows(main.data, xg.length, y.length),
    pressure: toRows(pg.data, xg.length, y.length),
    depth: dg ? toRows(dg.data, xg.length, y.length) : null,
    casts: placed.map((pc) => castInfo(pc, opts.inversionThreshold)),
    bottom: placed.map((pc, i) => ({
      x: pc.x,
      p: pc.bottom,
      sigma: Number.isFinite(bottom[i]) ? bottom[i] : null,
      known: pc.known,
    })),
    gaps: main.gaps,
    medianSpacingKm,
    gapKm,
    handling: opts.handling,
    interpolation: opts.interpolation,
  };
}

/**
 * Isopycnal lines to draw over the pressure frame: the pressure (dbar) of each target σ at each
 * cast, p[itarget][icast], null where the level is not in the cast; x km of the casts.
 */
export function isopycnalLines(
  casts: SectionCast[],
  targets: Float64Array,
  handling: InversionHandling,
  interpolation: SigmaInterpolation = 'linear',
  opts: DistanceOptions = {},
): { x: number[]; sigma: number[]; p: (number | null)[][] } {
  const placed = placeCasts(casts, opts);
  const remaps = remapSectionCasts(
    placed.map((pc) => pc.cast),
    targets,
    handling,
    interpolation,
  );
  const p: (number | null)[][] = [];
  for (let j = 0; j < targets.length; j++)
    p.push(remaps.map((r) => (Number.isFinite(r.pressure[j]) ? r.pressure[j] : null)));
  return { x: placed.map((pc) => pc.x), sigma: Array.from(targets), p };
}
