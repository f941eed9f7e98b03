/**
 * Thorpe (1977, Phil. Trans. R. Soc. A 286, 125–181) reordering: the water parcels of a cast are
 * sorted so that σ increases with pressure, while the pressure grid stays where it is. Each
 * level's σ and properties travel together; the Thorpe displacement of a parcel is the pressure
 * it moves to minus the pressure it came from.
 */

export interface ThorpeResult {
  /** σ in the reordered cast, kg/m³ (non-decreasing). */
  sigma: Float64Array;
  /** Every property reordered with its parcel. */
  props: Record<string, Float64Array>;
  /** order[k] = original level of the parcel now at level k. */
  order: Int32Array;
  /** Thorpe displacement of the parcel from original level i, dbar (positive: moved down). */
  displacement: Float64Array;
  /** Whether any parcel moved. */
  changed: boolean;
}

/**
 * The Thorpe order of a cast: order[k] = original level of the parcel that belongs at level k,
 * by a stable sort on σ (ties keep their measured order), and the sorted σ. Insertion sort suits
 * nearly stable casts (cost grows with the overturned parcels only); a scrambled cast falls back
 * to a comparison sort. Returns whether any parcel moves. Buffers may be passed in for reuse.
 */
export function thorpeOrder(
  sigma: Float64Array,
  order: Int32Array = new Int32Array(sigma.length),
  sorted: Float64Array = new Float64Array(sigma.length),
): boolean {
  const n = sigma.length;
  let descents = 0;
  for (let i = 0; i < n; i++) order[i] = i;
  for (let i = 1; i < n; i++) if (sigma[i] < sigma[i - 1]) descents++;
  if (descents === 0) {
    sorted.set(sigma.subarray(0, n));
    return false;
  }
  if (descents * 64 < n) {
    for (let i = 1; i < n; i++) {
      const oi = order[i];
      const s = sigma[oi];
      let j = i - 1;
      while (j >= 0 && sigma[order[j]] > s) {
        order[j + 1] = order[j];
        j--;
      }
      order[j + 1] = oi;
    }
  } else {
    const idx = Array.from(order.subarray(0, n));
    idx.sort((a, b) => sigma[a] - sigma[b] || a - b);
    for (let i = 0; i < n; i++) order[i] = idx[i];
  }
  for (let k = 0; k < n; k++) sorted[k] = sigma[order[k]];
  return true;
}

/**
 * Thorpe reordering of a cast with its properties. p dbar, sigma kg/m³ (no NaN), props columns
 * of the same length; O(n) when the cast is already stable.
 */
export function thorpeSort(p: Float64Array, sigma: Float64Array, props: Record<string, Float64Array>): ThorpeResult {
  const n = sigma.length;
  const order = new Int32Array(n);
  const sig = new Float64Array(n);
  const changed = thorpeOrder(sigma, order, sig);
  const displacement = new Float64Array(n);
  const out: Record<string, Float64Array> = {};
  if (!changed) {
    for (const name of Object.keys(props)) out[name] = props[name];
    return { sigma, props: out, order, displacement, changed: false };
  }
  for (let k = 0; k < n; k++) displacement[order[k]] = p[k] - p[order[k]];
  for (const name of Object.keys(props)) {
    const src = props[name];
    const dst = new Float64Array(n);
    for (let k = 0; k < n; k++) dst[k] = src[order[k]];
    out[name] = dst;
  }
  return { sigma: sig, props: out, order, displacement, changed: true };
}

/** Thorpe scale L_T = rms of the displacements over the levels given (dbar); 0 for a stable cast. */
export function thorpeScale(displacement: Float64Array, from = 0, to = displacement.length): number {
  let s = 0;
  const n = to - from;
  if (n <= 0) return 0;
  for (let i = from; i < to; i++) s += displacement[i] * displacement[i];
  return Math.sqrt(s / n);
}
