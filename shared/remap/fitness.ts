/**
 * Fitness of a variable as the vertical coordinate of a cast (docs/science.md §3.2): a variable can
 * serve only where it is single-valued and strictly monotonic in pressure. The profile is taken
 * as piecewise linear between levels; shares are fractions of the pressure span.
 */

export interface PressureSegment {
  pTop: number;
  pBottom: number;
}

export interface CoordinateFitness {
  /** Share of the pressure span over which v moves strictly in the dominant direction. */
  monotonicShare: number;
  /** Share of the pressure span where v takes a value it also takes at another pressure. */
  multiValuedShare: number;
  /** Dominant direction of v with pressure (by span); 'none' when v never changes. */
  direction: 'increasing' | 'decreasing' | 'none';
  /** Maximal pressure intervals over which v is strictly monotonic in the dominant direction. */
  segments: PressureSegment[];
}

/** Sort keys[0..m) ascending, carrying order[] along: insertion sort while the input is nearly
 * sorted (a profile's levels in its dominant direction), a full sort of the pairs once it is not. */
function sortByKey(keys: Float64Array, order: Int32Array, m: number, value: Float64Array): void {
  let budget = 8 * m;
  for (let i = 1; i < m; i++) {
    const x = keys[i],
      o = order[i];
    let j = i - 1;
    while (j >= 0 && keys[j] > x) {
      keys[j + 1] = keys[j];
      order[j + 1] = order[j];
      j--;
      if (--budget < 0) {
        keys[j + 1] = x;
        order[j + 1] = o;
        // keys[q] is V[order[q]]: sort the level indices by their values
        order.subarray(0, m).sort((u, w) => value[u] - value[w]);
        for (let q = 0; q < m; q++) keys[q] = value[order[q]];
        return;
      }
    }
    keys[j + 1] = x;
    order[j + 1] = o;
  }
}

/**
 * Coordinate fitness of v against pressure p (dbar, increasing; levels with NaN are skipped).
 * Monotonic share: intervals whose Δv has the dominant sign, weighted by Δp. Multi-valued share:
 * for each interval, the part of its value range that some other interval also covers (a
 * coverage count over the value axis, O(n log n)), mapped back to pressure linearly; flat
 * intervals (Δv = 0) count as multi-valued in full.
 */
export function coordinateFitness(p: Float64Array, v: Float64Array): CoordinateFitness {
  // The usable levels, packed (no per-level objects: this runs for 8 variables of every cast).
  let P = p,
    V = v,
    n = 0;
  for (let i = 0; i < p.length; i++) if (Number.isFinite(p[i]) && Number.isFinite(v[i])) n++;
  if (n !== p.length) {
    P = new Float64Array(n);
    V = new Float64Array(n);
    for (let i = 0, k = 0; i < p.length; i++)
      if (Number.isFinite(p[i]) && Number.isFinite(v[i])) {
        P[k] = p[i];
        V[k++] = v[i];
      }
  }
  if (n < 2) return { monotonicShare: 0, multiValuedShare: 0, direction: 'none', segments: [] };
  let spanUp = 0;
  let spanDown = 0;
  let total = 0;
  for (let k = 0; k < n - 1; k++) {
    const dp = P[k + 1] - P[k];
    const dv = V[k + 1] - V[k];
    total += dp;
    if (dv > 0) spanUp += dp;
    else if (dv < 0) spanDown += dp;
  }
  const direction = spanUp === 0 && spanDown === 0 ? 'none' : spanUp >= spanDown ? 'increasing' : 'decreasing';
  const sign = direction === 'increasing' ? 1 : direction === 'decreasing' ? -1 : 0;
  const segments: PressureSegment[] = [];
  let open = -1;
  for (let k = 0; k < n - 1; k++) {
    const dv = V[k + 1] - V[k];
    const good = sign !== 0 && dv * sign > 0;
    if (good && open < 0) open = k;
    if (!good && open >= 0) {
      segments.push({ pTop: P[open], pBottom: P[k] });
      open = -1;
    }
  }
  if (open >= 0) segments.push({ pTop: P[open], pBottom: P[n - 1] });

  // Coverage count of the value axis by the non-flat intervals' closed ranges. Their end points
  // are levels' values: each such level gets the rank of its value among the distinct end points
  // (bp), found by sorting the levels by value — listed in the dominant direction, a nearly
  // monotonic profile comes nearly sorted — so no interval needs a search.
  const order = new Int32Array(n);
  const keys = new Float64Array(n);
  let m = 0;
  for (let j = 0; j < n; j++) {
    const k = sign < 0 ? n - 1 - j : j;
    if ((k > 0 && V[k - 1] !== V[k]) || (k < n - 1 && V[k] !== V[k + 1])) {
      order[m] = k;
      keys[m++] = V[k];
    }
  }
  sortByKey(keys, order, m, V);
  const rank = new Int32Array(n);
  const bpAll = new Float64Array(m);
  let nb = 0;
  for (let i = 0; i < m; i++) {
    if (i === 0 || keys[i] !== bpAll[nb - 1]) bpAll[nb++] = keys[i];
    rank[order[i]] = nb - 1;
  }
  const bp = bpAll.subarray(0, nb);
  const diff = new Int32Array(bp.length + 1);
  for (let k = 0; k < n - 1; k++) {
    const ra = rank[k];
    const rb = rank[k + 1];
    if (V[k] === V[k + 1]) continue;
    diff[ra < rb ? ra : rb]++;
    diff[ra < rb ? rb : ra]--;
  }
  const count = new Int32Array(bp.length); // count[i] covers (bp[i], bp[i+1])
  const prefix = new Float64Array(bp.length); // measure covered twice or more below bp[i]
  let c = 0;
  for (let i = 0; i < bp.length; i++) {
    c += diff[i];
    count[i] = c;
    if (i > 0) prefix[i] = prefix[i - 1] + (count[i - 1] >= 2 ? bp[i] - bp[i - 1] : 0);
  }
  let multi = 0;
  for (let k = 0; k < n - 1; k++) {
    const a = V[k];
    const b = V[k + 1];
    const dp = P[k + 1] - P[k];
    if (a === b) {
      multi += dp;
      continue;
    }
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    // the part of [lo, hi] covered twice: the prefix measure at its two end points
    const shared = prefix[a < b ? rank[k + 1] : rank[k]] - prefix[a < b ? rank[k] : rank[k + 1]];
    multi += (dp * shared) / (hi - lo);
  }
  return {
    monotonicShare: total > 0 ? (sign > 0 ? spanUp : sign < 0 ? spanDown : 0) / total : 0,
    multiValuedShare: total > 0 ? multi / total : 0,
    direction,
    segments,
  };
}

/**
 * Coordinate fitness at a resolution: levels are kept only once v has moved by at least
 * `tolerance` from the last kept level, so reversals smaller than the tolerance (sensor noise,
 * e.g. σ wiggles below the 0.01 kg/m³ inversion threshold, common practice) do not count. The
 * strict measure of `coordinateFitness` sees every wiggle; this one answers whether the variable
 * can serve as a coordinate at the resolution the analysis uses.
 */
export function coordinateFitnessAtResolution(
  p: Float64Array,
  v: Float64Array,
  tolerance: number,
): CoordinateFitness & { tolerance: number } {
  const kp: number[] = [];
  const kv: number[] = [];
  for (let i = 0; i < p.length; i++) {
    if (!Number.isFinite(p[i]) || !Number.isFinite(v[i])) continue;
    if (kv.length === 0 || Math.abs(v[i] - kv[kv.length - 1]) >= tolerance) {
      kp.push(p[i]);
      kv.push(v[i]);
    }
  }
  // the deepest level closes the span even when it moved less than the tolerance
  for (let i = p.length - 1; i >= 0; i--) {
    if (Number.isFinite(p[i]) && Number.isFinite(v[i])) {
      if (kp[kp.length - 1] !== p[i]) {
        kp.push(p[i]);
        kv.push(v[i]);
      }
      break;
    }
  }
  return { ...coordinateFitness(Float64Array.from(kp), Float64Array.from(kv)), tolerance };
}
