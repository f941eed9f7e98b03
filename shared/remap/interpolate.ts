/**
 * Interpolation of a cast's columns at target values of a (possibly non-monotonic) coordinate,
 * typically pressure and properties at target σ levels.
 *
 * The bracket step is shared by every column: for each target the first interval of the node
 * sequence (scanning from the top of the cast) that contains it, and the fractional position in it.
 * Columns are then evaluated either linearly or by the monotone piecewise cubic Hermite
 * interpolant of Fritsch & Carlson (1980, SIAM J. Numer. Anal. 17, 238–246).
 */

/** Where each target sits in the node sequence: interval index (−1 if none) and weight in [0, 1]. */
export interface Bracket {
  /** Index k of the first interval [x_k, x_{k+1}] containing the target, −1 when no interval does. */
  index: Int32Array;
  /** (target − x_k)/(x_{k+1} − x_k); 0 for a flat interval equal to the target. */
  weight: Float64Array;
}

/** Index of the first element of a sorted array that is ≥ v (lower bound). */
export function lowerBound(a: Float64Array, v: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Index of the first element of a sorted array that is > v (upper bound). */
export function upperBound(a: Float64Array, v: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] <= v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Throws unless targets are strictly increasing and finite. */
export function assertAscending(targets: Float64Array, what = 'targets'): void {
  for (let j = 0; j < targets.length; j++) {
    if (!Number.isFinite(targets[j])) throw new RangeError(`${what}[${j}] is not finite`);
    if (j > 0 && !(targets[j] > targets[j - 1])) throw new RangeError(`${what} must be strictly increasing`);
  }
}

/**
 * First crossing of each target in the node sequence x (any order, NaN-free), scanning from k = 0.
 * targets must be strictly increasing. Each interval claims the not-yet-claimed targets inside its
 * closed value range; a "next unclaimed" forest with path compression skips claimed ones, so the
 * cost is O((n + m)·log m) however often the profile folds back. knownMonotone (x known to be
 * non-decreasing) skips the check.
 */
export function firstCrossing(x: Float64Array, targets: Float64Array, out?: Bracket, knownMonotone = false): Bracket {
  const m = targets.length;
  const index = out?.index ?? new Int32Array(m);
  const weight = out?.weight ?? new Float64Array(m);
  index.fill(-1);
  weight.fill(NaN);
  const n = x.length;
  if (m === 0) return { index, weight };
  if (n === 1) {
    // A single level brackets only a target equal to it.
    for (let j = 0; j < m; j++)
      if (targets[j] === x[0]) {
        index[j] = 0;
        weight[j] = 0;
      }
    return { index, weight };
  }
  // Monotone non-decreasing profiles (stable or sorted casts) take a single merge walk.
  let monotone = knownMonotone;
  if (!monotone) {
    monotone = true;
    for (let k = 1; k < n; k++)
      if (x[k] < x[k - 1]) {
        monotone = false;
        break;
      }
  }
  if (monotone) {
    const last = x[n - 1];
    // Very few targets on a long cast: a binary search each (O(m log n)); else one merge walk,
    // whose single predictable branch per level beats unpredictable bisection steps.
    const search = m * 64 < n;
    let k = 0;
    for (let j = 0; j < m; j++) {
      const s = targets[j];
      if (s < x[0] || s > last) continue;
      if (search) {
        k = lowerBound(x, s) - 1; // first k with x[k+1] ≥ s
        if (k < 0) k = 0;
        if (k > n - 2) k = n - 2;
      } else {
        while (k < n - 2 && x[k + 1] < s) k++;
      }
      const h = x[k + 1] - x[k];
      index[j] = k;
      weight[j] = h > 0 ? (s - x[k]) / h : 0;
    }
    return { index, weight };
  }
  const next = new Int32Array(m + 1);
  for (let j = 0; j <= m; j++) next[j] = j;
  const find = (j: number): number => {
    let r = j;
    while (next[r] !== r) r = next[r];
    while (next[j] !== r) {
      const t = next[j];
      next[j] = r;
      j = t;
    }
    return r;
  };
  let unclaimed = m;
  for (let k = 0; k < n - 1 && unclaimed > 0; k++) {
    const a = x[k];
    const b = x[k + 1];
    const lo = a < b ? a : b;
    const hi = a < b ? b : a;
    const jEnd = upperBound(targets, hi);
    for (let j = find(lowerBound(targets, lo)); j < jEnd; j = find(j)) {
      index[j] = k;
      weight[j] = b !== a ? (targets[j] - a) / (b - a) : 0;
      next[j] = j + 1;
      unclaimed--;
    }
  }
  return { index, weight };
}

/**
 * Linear interpolation of column y at the bracketed targets; NaN where unbracketed.
 * out[j] = y_k + w·(y_{k+1} − y_k).
 */
export function interpLinearAt(y: Float64Array, br: Bracket, out?: Float64Array): Float64Array {
  const m = br.index.length;
  const res = out ?? new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const k = br.index[j];
    if (k < 0) {
      res[j] = NaN;
      continue;
    }
    const w = br.weight[j];
    res[j] = w === 0 ? y[k] : y[k] + w * (y[k + 1] - y[k]);
  }
  return res;
}

/**
 * Initial derivative dy/dx at node k, Fritsch & Carlson (1980) step 1: zero at a local extremum
 * of the data or next to a flat interval, else the three-point (parabola) estimate; when the
 * two intervals run in opposite x directions (an unsorted profile) the mean of the secants.
 * Ends take the secant of their one interval.
 */
function fcInitialSlope(x: Float64Array, y: Float64Array, k: number): number {
  const n = x.length;
  if (n < 2) return 0;
  if (k === 0) {
    const h = x[1] - x[0];
    return h !== 0 ? (y[1] - y[0]) / h : 0;
  }
  if (k === n - 1) {
    const h = x[k] - x[k - 1];
    return h !== 0 ? (y[k] - y[k - 1]) / h : 0;
  }
  const hm = x[k] - x[k - 1];
  const hp = x[k + 1] - x[k];
  if (hm === 0 || hp === 0) return 0;
  const dm = (y[k] - y[k - 1]) / hm;
  const dp = (y[k + 1] - y[k]) / hp;
  const prod = dm * dp;
  if (!(prod > 0)) return Number.isNaN(prod) ? NaN : 0;
  if (hm * hp > 0) return (hp * dm + hm * dp) / (hm + hp);
  return 0.5 * (dm + dp);
}

/**
 * Fritsch & Carlson (1980) step 2 factor of interval k: τ = min(1, 3/√(α² + β²)) with
 * α = d_k/Δ_k, β = d_{k+1}/Δ_k, which brings (α, β) into the circle α² + β² ≤ 9 that lies in the
 * monotonicity region. 1 when Δ_k = 0 (both slopes are then zero already) or at the profile ends.
 */
function fcFactor(x: Float64Array, y: Float64Array, k: number, dk: number, dk1: number): number {
  if (k < 0 || k >= x.length - 1) return 1;
  const h = x[k + 1] - x[k];
  if (h === 0) return 1;
  const delta = (y[k + 1] - y[k]) / h;
  if (delta === 0) return 1;
  const a = dk / delta;
  const b = dk1 / delta;
  const r = a * a + b * b;
  return r > 9 ? 3 / Math.sqrt(r) : 1;
}

/** Final Fritsch–Carlson derivative at node k; each node is scaled by the smaller factor of its two intervals. */
function fcSlope(x: Float64Array, y: Float64Array, k: number): number {
  const n = x.length;
  const d = fcInitialSlope(x, y, k);
  if (d === 0) return 0;
  const dPrev = k > 0 ? fcInitialSlope(x, y, k - 1) : 0;
  const dNext = k < n - 1 ? fcInitialSlope(x, y, k + 1) : 0;
  const tLeft = fcFactor(x, y, k - 1, dPrev, d);
  const tRight = fcFactor(x, y, k, d, dNext);
  return d * (tLeft < tRight ? tLeft : tRight);
}

/**
 * All node derivatives of the Fritsch–Carlson (1980) monotone piecewise cubic y(x); x in any
 * order without NaN (flat intervals give zero slopes at their ends). Exposed for tests and plots.
 */
export function fritschCarlsonSlopes(x: Float64Array, y: Float64Array, out?: Float64Array): Float64Array {
  const n = x.length;
  const d = out ?? new Float64Array(n);
  for (let k = 0; k < n; k++) d[k] = fcSlope(x, y, k);
  return d;
}

/**
 * Monotone cubic (Fritsch & Carlson 1980) interpolation of column y against node coordinate x at
 * the bracketed targets: the cubic Hermite form on [x_k, x_{k+1}] with the limited derivatives.
 * Only the two nodes of each used interval are evaluated, so the cost is O(m) per column.
 */
export function interpFritschCarlsonAt(
  x: Float64Array,
  y: Float64Array,
  br: Bracket,
  out?: Float64Array,
): Float64Array {
  const m = br.index.length;
  const res = out ?? new Float64Array(m);
  let kCached = -2;
  let d0 = 0;
  let d1 = 0;
  for (let j = 0; j < m; j++) {
    const k = br.index[j];
    if (k < 0) {
      res[j] = NaN;
      continue;
    }
    const t = br.weight[j];
    if (x.length === 1 || t === 0) {
      res[j] = y[k];
      continue;
    }
    if (k !== kCached) {
      d0 = fcSlope(x, y, k);
      d1 = fcSlope(x, y, k + 1);
      kCached = k;
    }
    const h = x[k + 1] - x[k];
    const t2 = t * t;
    const t3 = t2 * t;
    const h00 = 2 * t3 - 3 * t2 + 1;
    const h10 = t3 - 2 * t2 + t;
    const h01 = -2 * t3 + 3 * t2;
    const h11 = t3 - t2;
    res[j] = h00 * y[k] + h10 * h * d0 + h01 * y[k + 1] + h11 * h * d1;
  }
  return res;
}

/**
 * Linear interpolation like interpLinearAt for a reordered profile whose level k holds the
 * parcel order[k] of y (Thorpe-sorted casts), without building the reordered column.
 */
export function interpLinearOrderedAt(
  y: Float64Array,
  order: Int32Array,
  br: Bracket,
  out?: Float64Array,
): Float64Array {
  const m = br.index.length;
  const res = out ?? new Float64Array(m);
  for (let j = 0; j < m; j++) {
    const k = br.index[j];
    if (k < 0) {
      res[j] = NaN;
      continue;
    }
    const w = br.weight[j];
    const a = y[order[k]];
    res[j] = w === 0 ? a : a + w * (y[order[k + 1]] - a);
  }
  return res;
}

/** Linear interpolation y(xq) for strictly increasing x; NaN outside [x_0, x_{n−1}]. */
export function interpLinear(x: Float64Array, y: Float64Array, xq: Float64Array): Float64Array {
  const out = new Float64Array(xq.length);
  for (let j = 0; j < xq.length; j++) {
    const q = xq[j];
    if (!(q >= x[0] && q <= x[x.length - 1])) {
      out[j] = NaN;
      continue;
    }
    let k = upperBound(x, q) - 1;
    if (k >= x.length - 1) k = x.length - 2;
    if (k < 0) {
      out[j] = y[0];
      continue;
    }
    const h = x[k + 1] - x[k];
    out[j] = h > 0 ? y[k] + ((q - x[k]) / h) * (y[k + 1] - y[k]) : y[k];
  }
  return out;
}
