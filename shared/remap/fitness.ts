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

/**
 * Measure of the part of [lo, hi] covered by two or more of the value ranges, given the sorted
 * breakpoints and the prefix measure P(b_i) of "covered at least twice" up to each breakpoint.
 */
function coveredTwice(bp: Float64Array, prefix: Float64Array, count: Int32Array, v: number): number {
  // P(v) = prefix at the last breakpoint ≤ v, plus the partial elementary segment.
  let lo = 0;
  let hi = bp.length;
  while (lo < hi) { const mid = (lo + hi) >>> 1; if (bp[mid] <= v) lo = mid + 1; else hi = mid; }
  const i = lo - 1;
  if (i < 0) return 0;
  if (i >= bp.length - 1) return prefix[bp.length - 1];
  return prefix[i] + (count[i] >= 2 ? v - bp[i] : 0);
}

/**
 * Coordinate fitness of v against pressure p (dbar, increasing; levels with NaN are skipped).
 * Monotonic share: intervals whose Δv has the dominant sign, weighted by Δp. Multi-valued share:
 * for each interval, the part of its value range that some other interval also covers (a
 * coverage count over the value axis, O(n log n)), mapped back to pressure linearly; flat
 * intervals (Δv = 0) count as multi-valued in full.
 */
export function coordinateFitness(p: Float64Array, v: Float64Array): CoordinateFitness {
  const keep: number[] = [];
  for (let i = 0; i < p.length; i++) if (Number.isFinite(p[i]) && Number.isFinite(v[i])) keep.push(i);
  const n = keep.length;
  if (n < 2) return { monotonicShare: 0, multiValuedShare: 0, direction: 'none', segments: [] };
  let spanUp = 0;
  let spanDown = 0;
  let total = 0;
  for (let k = 0; k < n - 1; k++) {
    const dp = p[keep[k + 1]] - p[keep[k]];
    const dv = v[keep[k + 1]] - v[keep[k]];
    total += dp;
    if (dv > 0) spanUp += dp;
    else if (dv < 0) spanDown += dp;
  }
  const direction = spanUp === 0 && spanDown === 0 ? 'none' : spanUp >= spanDown ? 'increasing' : 'decreasing';
  const sign = direction === 'increasing' ? 1 : direction === 'decreasing' ? -1 : 0;
  const segments: PressureSegment[] = [];
  let open = -1;
  for (let k = 0; k < n - 1; k++) {
    const dv = v[keep[k + 1]] - v[keep[k]];
    const good = sign !== 0 && dv * sign > 0;
    if (good && open < 0) open = k;
    if (!good && open >= 0) { segments.push({ pTop: p[keep[open]], pBottom: p[keep[k]] }); open = -1; }
  }
  if (open >= 0) segments.push({ pTop: p[keep[open]], pBottom: p[keep[n - 1]] });

  // Coverage count of the value axis by the non-flat intervals' closed ranges.
  const events: number[] = [];
  for (let k = 0; k < n - 1; k++) {
    const a = v[keep[k]];
    const b = v[keep[k + 1]];
    if (a !== b) events.push(Math.min(a, b), Math.max(a, b));
  }
  const bpAll = Float64Array.from(events).sort();
  const bpList: number[] = [];
  for (let i = 0; i < bpAll.length; i++) if (i === 0 || bpAll[i] !== bpAll[i - 1]) bpList.push(bpAll[i]);
  const bp = Float64Array.from(bpList);
  const diff = new Int32Array(bp.length + 1);
  const find = (x: number): number => {
    let lo = 0;
    let hi = bp.length;
    while (lo < hi) { const mid = (lo + hi) >>> 1; if (bp[mid] < x) lo = mid + 1; else hi = mid; }
    return lo;
  };
  for (let k = 0; k < n - 1; k++) {
    const a = v[keep[k]];
    const b = v[keep[k + 1]];
    if (a === b) continue;
    diff[find(Math.min(a, b))]++;
    diff[find(Math.max(a, b))]--;
  }
  const count = new Int32Array(bp.length); // count[i] covers (bp[i], bp[i+1])
  const prefix = new Float64Array(bp.length);
  let c = 0;
  for (let i = 0; i < bp.length; i++) {
    c += diff[i];
    count[i] = c;
    if (i > 0) prefix[i] = prefix[i - 1] + (count[i - 1] >= 2 ? bp[i] - bp[i - 1] : 0);
  }
  let multi = 0;
  for (let k = 0; k < n - 1; k++) {
    const a = v[keep[k]];
    const b = v[keep[k + 1]];
    const dp = p[keep[k + 1]] - p[keep[k]];
    if (a === b) { multi += dp; continue; }
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    const shared = coveredTwice(bp, prefix, count, hi) - coveredTwice(bp, prefix, count, lo);
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
export function coordinateFitnessAtResolution(p: Float64Array, v: Float64Array, tolerance: number): CoordinateFitness & { tolerance: number } {
  const kp: number[] = [];
  const kv: number[] = [];
  for (let i = 0; i < p.length; i++) {
    if (!Number.isFinite(p[i]) || !Number.isFinite(v[i])) continue;
    if (kv.length === 0 || Math.abs(v[i] - kv[kv.length - 1]) >= tolerance) { kp.push(p[i]); kv.push(v[i]); }
  }
  // the deepest level closes the span even when it moved less than the tolerance
  for (let i = p.length - 1; i >= 0; i--) {
    if (Number.isFinite(p[i]) && Number.isFinite(v[i])) { if (kp[kp.length - 1] !== p[i]) { kp.push(p[i]); kv.push(v[i]); } break; }
  }
  return { ...coordinateFitness(Float64Array.from(kp), Float64Array.from(kv)), tolerance };
}
