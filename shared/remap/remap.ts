/**
 * Remap a cast onto target isopycnals (docs/science.md §3.3): per target σ level the pressure, depth,
 * every property, the layer thickness, the crossing count and flags.
 *
 * Inversion handling (recorded by the caller in every export):
 * - 'sort' (default): Thorpe (1977) reordering — the parcels are sorted by σ while the pressure
 *   (and depth) grid stays; properties travel with their parcel.
 * - 'drop': the light levels of each reported inversion (iTop + 1 … iBottom, see inversions.ts)
 *   are removed and the profile is interpolated across the gap; the heavy parcel iTop is kept.
 * - 'raw': the profile as measured; each target takes its first crossing from the top.
 * On a stable cast the three give the same table.
 *
 * Interpolation in σ: linear (default) or the monotone cubic of Fritsch & Carlson (1980).
 *
 * Thickness of target i: the pressure (dbar) — and, with heights given, depth (m) — between the
 * mid-levels σ_{i−½} = (σ_{i−1} + σ_i)/2 and σ_{i+½} = (σ_i + σ_{i+1})/2 found in the same handled
 * profile with the same interpolation; the outer half-levels of the first and last targets lie
 * half a step beyond them. NaN when either mid-level is not in the cast (outcrop or bottom).
 *
 * Crossings: how many times the handled profile passes through the target (for 'raw' the measured
 * profile). The measured profile's count is also kept (crossingsRaw); the multi_crossing flag is
 * raised when the measured profile crosses the target more than once, whatever the handling, since
 * it warns about the water itself.
 */
import { detectInversions, type Inversion } from './inversions';
import { thorpeOrder } from './thorpe';
import {
  assertAscending,
  firstCrossing,
  interpLinearAt,
  interpLinearOrderedAt,
  interpFritschCarlsonAt,
  lowerBound,
  upperBound,
  type Bracket,
} from './interpolate';

export type InversionHandling = 'sort' | 'drop' | 'raw';
export type SigmaInterpolation = 'linear' | 'pchip';

/** Target lighter than the shallowest water of the cast. */
export const FLAG_OUTCROP = 1;
/** Target denser than the deepest water of the cast. */
export const FLAG_BELOW_BOTTOM = 2;
/** The measured profile crosses the target more than once. */
export const FLAG_MULTI_CROSSING = 4;
/** The reported pressure lies inside a reported inversion [pTop, pBottom]. */
export const FLAG_IN_INVERSION = 8;

const FLAG_NAMES: [number, string][] = [
  [FLAG_OUTCROP, 'outcrop'],
  [FLAG_BELOW_BOTTOM, 'below_bottom'],
  [FLAG_MULTI_CROSSING, 'multi_crossing'],
  [FLAG_IN_INVERSION, 'in_inversion'],
];

/** Names of the flags set in a bitmask, in the export's order. */
export function flagNames(bits: number): string[] {
  const names: string[] = [];
  for (const [bit, name] of FLAG_NAMES) if (bits & bit) names.push(name);
  return names;
}

export interface RemapCast {
  /** Sea pressure, dbar, increasing down the cast. */
  p: Float64Array;
  /** Height, m (negative below the surface), optional. */
  z?: Float64Array;
  /** Potential density anomaly of the chosen reference pressure, kg/m³. */
  sigma: Float64Array;
  /** Properties to carry (CT, SA, oxygen, …), same length as p. */
  props: Record<string, Float64Array>;
}

export interface RemapOptions {
  handling: InversionHandling;
  interpolation: SigmaInterpolation;
  /** Inversions already found on this cast and σ; detected here when absent. */
  inversions?: Inversion[];
  /** Inversion threshold, kg/m³ (default 0.01), when they are detected here. */
  threshold?: number;
}

export interface RemapResult {
  /** Target σ levels, kg/m³. */
  targets: Float64Array;
  /** Pressure of each target, dbar (NaN where the level is not in the cast). */
  pressure: Float64Array;
  /** Depth of each target, m positive down (null when the cast had no heights). */
  depth: Float64Array | null;
  /** Each property at each target. */
  props: Record<string, Float64Array>;
  /** Pressure between the mid-levels about each target, dbar. */
  thickness: Float64Array;
  /** Depth between the mid-levels about each target, m (null without heights). */
  thicknessDepth: Float64Array | null;
  /** Crossings of the target by the profile as handled. */
  crossings: Int32Array;
  /** Crossings of the target by the measured profile. */
  crossingsRaw: Int32Array;
  /** Bitmask of FLAG_* per target. */
  flags: Uint8Array;
  /** The inversions used. */
  inversions: Inversion[];
  handling: InversionHandling;
  interpolation: SigmaInterpolation;
}

/**
 * Crossings of each (ascending) target by the piecewise-linear profile sigma: the number of
 * separate points where the profile equals the target — one per interval that passes strictly
 * through it (min < s < max) plus one per run of consecutive levels lying exactly on it.
 * Difference array over the targets, O(n log m).
 */
export function countCrossings(sigma: Float64Array, targets: Float64Array, out?: Int32Array): Int32Array {
  const m = targets.length;
  const res = out ?? new Int32Array(m);
  const diff = new Int32Array(m + 1);
  const n = sigma.length;
  if (n === 0 || m === 0) {
    res.fill(0);
    return res;
  }
  // gt(v): first target > v; ge(v): first target ≥ v. σ moves little between levels, so each is
  // found by walking from the previous answer rather than searching afresh.
  let gPrev = upperBound(targets, sigma[0]);
  let ePrev = lowerBound(targets, sigma[0]);
  if (ePrev < m && targets[ePrev] === sigma[0]) {
    diff[ePrev]++;
    diff[ePrev + 1]--;
  }
  for (let k = 0; k < n - 1; k++) {
    const a = sigma[k];
    const b = sigma[k + 1];
    let g = gPrev;
    while (g > 0 && targets[g - 1] > b) g--;
    while (g < m && targets[g] <= b) g++;
    let e = ePrev;
    while (e > 0 && targets[e - 1] >= b) e--;
    while (e < m && targets[e] < b) e++;
    if (a !== b) {
      // Strict passes: targets with min < s < max.
      const j0 = a < b ? gPrev : g;
      const j1 = a < b ? e : ePrev;
      if (j0 < j1) {
        diff[j0]++;
        diff[j1]--;
      }
      // A new run of levels lying exactly on a target.
      if (e < m && targets[e] === b) {
        diff[e]++;
        diff[e + 1]--;
      }
    }
    gPrev = g;
    ePrev = e;
  }
  let c = 0;
  for (let j = 0; j < m; j++) {
    c += diff[j];
    res[j] = c;
  }
  return res;
}

/** Levels of a cast whose p and σ are both finite (null when all are), and whether σ never decreases. */
function scanCast(cast: RemapCast): { keep: Int32Array | null; monotone: boolean } {
  const n = cast.p.length;
  const p = cast.p;
  const s = cast.sigma;
  // Fast path, one predictable branch a level: every p and σ finite and σ never decreasing
  // (x − x is 0 only for a finite x, so the sum is 0 only when both are finite).
  let prev = -Infinity;
  let i = 0;
  for (; i < n; i++) {
    const si = s[i];
    const pi = p[i];
    if (!(si >= prev && si - si + (pi - pi) === 0)) break;
    prev = si;
  }
  if (i === n) return { keep: null, monotone: true };
  let bad = 0;
  let monotone = true;
  prev = -Infinity;
  for (let k = 0; k < n; k++) {
    const sk = s[k];
    if (p[k] - p[k] !== 0 || sk - sk !== 0) {
      bad++;
      continue;
    }
    if (sk < prev) monotone = false;
    prev = sk;
  }
  if (bad === 0) return { keep: null, monotone };
  const keep = new Int32Array(n - bad);
  let j = 0;
  for (let k = 0; k < n; k++) if (Number.isFinite(p[k]) && Number.isFinite(s[k])) keep[j++] = k;
  return { keep, monotone };
}

function take(a: Float64Array, keep: Int32Array): Float64Array {
  const out = new Float64Array(keep.length);
  for (let i = 0; i < keep.length; i++) out[i] = a[keep[i]];
  return out;
}

/** The cast restricted to the given levels (p, σ, z and every property). */
function subCast(cast: RemapCast, keep: Int32Array): RemapCast {
  const props: Record<string, Float64Array> = {};
  for (const name of Object.keys(cast.props)) props[name] = take(cast.props[name], keep);
  return { p: take(cast.p, keep), z: cast.z ? take(cast.z, keep) : undefined, sigma: take(cast.sigma, keep), props };
}

/**
 * A cast as handled. For 'sort' the properties stay in measured order and `order` says which
 * parcel sits at each level (p and z, the grid, do not move); otherwise order is null.
 */
interface HandledCast extends RemapCast {
  order: Int32Array | null;
}

// Scratch for the Thorpe order and sorted σ, reused between calls (nothing returned points into it).
let scratchOrder = new Int32Array(0);
let scratchSorted = new Float64Array(0);

/** The cast as handled: sorted parcels, light levels dropped, or as measured. */
function handleCast(cast: RemapCast, handling: InversionHandling, inversions: Inversion[]): HandledCast {
  if (handling === 'raw') return { ...cast, order: null };
  const n = cast.p.length;
  if (handling === 'sort') {
    if (scratchOrder.length < n) {
      scratchOrder = new Int32Array(n);
      scratchSorted = new Float64Array(n);
    }
    const order = scratchOrder.subarray(0, n);
    const sorted = scratchSorted.subarray(0, n);
    return thorpeOrder(cast.sigma, order, sorted) ? { ...cast, sigma: sorted, order } : { ...cast, order: null };
  }
  if (inversions.length === 0) return { ...cast, order: null };
  const drop = new Uint8Array(n);
  let dropped = 0;
  for (const inv of inversions) {
    for (let i = inv.iTop + 1; i <= inv.iBottom && i < n; i++)
      if (!drop[i]) {
        drop[i] = 1;
        dropped++;
      }
  }
  const keep = new Int32Array(n - dropped);
  let j = 0;
  for (let i = 0; i < n; i++) if (!drop[i]) keep[j++] = i;
  return { ...subCast(cast, keep), order: null };
}

/** Column values at the bracketed targets by the chosen interpolation in σ (order: Thorpe order of y). */
function evaluate(
  sigma: Float64Array,
  y: Float64Array,
  br: Bracket,
  how: SigmaInterpolation,
  order: Int32Array | null,
): Float64Array {
  if (order) {
    if (how === 'linear') return interpLinearOrderedAt(y, order, br);
    const moved = new Float64Array(order.length);
    for (let k = 0; k < order.length; k++) moved[k] = y[order[k]];
    return interpFritschCarlsonAt(sigma, moved, br);
  }
  return how === 'pchip' ? interpFritschCarlsonAt(sigma, y, br) : interpLinearAt(y, br);
}

/** Mid-levels about each target: m + 1 values, half a step beyond the ends. */
function midLevels(targets: Float64Array): Float64Array {
  const m = targets.length;
  const mid = new Float64Array(m + 1);
  if (m === 1) {
    mid[0] = targets[0];
    mid[1] = targets[0];
    return mid;
  }
  for (let i = 1; i < m; i++) mid[i] = 0.5 * (targets[i - 1] + targets[i]);
  mid[0] = targets[0] - 0.5 * (targets[1] - targets[0]);
  mid[m] = targets[m - 1] + 0.5 * (targets[m - 1] - targets[m - 2]);
  return mid;
}

/** Crossings of a non-decreasing profile: one for every target within its range (a point or a flat run). */
function monotoneCrossings(sigma: Float64Array, targets: Float64Array): Int32Array {
  const c = new Int32Array(targets.length);
  if (sigma.length === 0) return c;
  const lo = sigma[0];
  const hi = sigma[sigma.length - 1];
  for (let j = 0; j < targets.length; j++) c[j] = targets[j] >= lo && targets[j] <= hi ? 1 : 0;
  return c;
}

/**
 * Remap one cast onto ascending target σ levels (kg/m³). See the head of this file for the
 * handling, the interpolation, the thickness and the crossings. Levels with NaN p or σ are
 * left out first (given inversions are then re-detected so their indices match). A cast whose σ
 * never decreases takes a fast path: no inversion, handling changes nothing, one crossing each.
 */
export function remapToIsopycnals(cast: RemapCast, targets: Float64Array, opts: RemapOptions): RemapResult {
  assertAscending(targets);
  const { keep, monotone } = scanCast(cast);
  const clean = keep ? subCast(cast, keep) : cast;
  let inversions = keep ? undefined : opts.inversions;
  if (!inversions)
    inversions = monotone ? [] : detectInversions(clean.p, clean.sigma, { threshold: opts.threshold, z: clean.z });
  const handled: HandledCast = monotone ? { ...clean, order: null } : handleCast(clean, opts.handling, inversions);
  const m = targets.length;
  const sig = handled.sigma;
  const order = handled.order;
  const how = opts.interpolation;

  const crossingsRaw = monotone ? monotoneCrossings(clean.sigma, targets) : countCrossings(clean.sigma, targets);
  const sameProfile = handled.sigma === clean.sigma;
  const crossings = sameProfile
    ? crossingsRaw.slice()
    : opts.handling === 'sort'
      ? monotoneCrossings(sig, targets)
      : countCrossings(sig, targets);
  const sortedSig = monotone || order !== null;
  const mids = midLevels(targets);
  let br: Bracket;
  let brMid: Bracket;
  if (sortedSig) {
    // Mid-levels and targets interleave (mid₀ < t₀ < mid₁ < … < mid_m): one walk brackets both.
    const both = new Float64Array(2 * m + 1);
    for (let j = 0; j < m; j++) {
      both[2 * j] = mids[j];
      both[2 * j + 1] = targets[j];
    }
    both[2 * m] = mids[m];
    const all = firstCrossing(sig, both, undefined, true);
    br = { index: new Int32Array(m), weight: new Float64Array(m) };
    brMid = { index: new Int32Array(m + 1), weight: new Float64Array(m + 1) };
    for (let j = 0; j <= m; j++) {
      brMid.index[j] = all.index[2 * j];
      brMid.weight[j] = all.weight[2 * j];
    }
    for (let j = 0; j < m; j++) {
      br.index[j] = all.index[2 * j + 1];
      br.weight[j] = all.weight[2 * j + 1];
    }
  } else {
    br = firstCrossing(sig, targets, undefined, false);
    brMid = firstCrossing(sig, mids, undefined, false);
  }
  const pressure = evaluate(sig, handled.p, br, how, null);
  const depth = handled.z ? evaluate(sig, handled.z, br, how, null) : null;
  if (depth) for (let j = 0; j < m; j++) depth[j] = -depth[j];
  const props: Record<string, Float64Array> = {};
  for (const name of Object.keys(handled.props)) props[name] = evaluate(sig, handled.props[name], br, how, order);

  const pMid = evaluate(sig, handled.p, brMid, how, null);
  const zMid = handled.z ? evaluate(sig, handled.z, brMid, how, null) : null;
  const thickness = new Float64Array(m);
  const thicknessDepth = zMid ? new Float64Array(m) : null;
  for (let j = 0; j < m; j++) {
    thickness[j] = pMid[j + 1] - pMid[j];
    if (thicknessDepth && zMid) thicknessDepth[j] = zMid[j] - zMid[j + 1];
  }

  let sMin = Infinity;
  let sMax = -Infinity;
  if (monotone || order) {
    if (sig.length) {
      sMin = sig[0];
      sMax = sig[sig.length - 1];
    }
  } else
    for (let k = 0; k < sig.length; k++) {
      if (sig[k] < sMin) sMin = sig[k];
      if (sig[k] > sMax) sMax = sig[k];
    }
  const flags = new Uint8Array(m);
  for (let j = 0; j < m; j++) {
    let f = 0;
    if (targets[j] < sMin) f |= FLAG_OUTCROP;
    if (targets[j] > sMax) f |= FLAG_BELOW_BOTTOM;
    if (crossingsRaw[j] > 1) f |= FLAG_MULTI_CROSSING;
    const pj = pressure[j];
    if (pj === pj) {
      for (const inv of inversions)
        if (pj >= inv.pTop && pj <= inv.pBottom) {
          f |= FLAG_IN_INVERSION;
          break;
        }
    }
    flags[j] = f;
  }
  return {
    targets,
    pressure,
    depth,
    props,
    thickness,
    thicknessDepth,
    crossings,
    crossingsRaw,
    flags,
    inversions,
    handling: opts.handling,
    interpolation: opts.interpolation,
  };
}
