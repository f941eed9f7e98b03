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
 * Stable sort of the parcels by σ (ties keep their measured order), O(n) when the cast is
 * already stable. p dbar, sigma kg/m³ (no NaN), props columns of the same length.
 */
export function thorpeSort(p: Float64Array, sigma: Float64Array, props: Record<string, Float64Array>): ThorpeResult {
  const n = sigma.length;
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  let sorted = true;
  for (let i = 1; i < n; i++) if (sigma[i] < sigma[i - 1]) { sorted = false; break; }
  const displacement = new Float64Array(n);
  if (sorted) {
    const same: Record<string, Float64Array> = {};
    for (const name of Object.keys(props)) same[name] = props[name];
    return { sigma, props: same, order, displacement, changed: false };
  }
  // Insertion sort suits nearly stable casts (cost grows with the overturned parcels only);
  // a fully scrambled cast falls back to the engine's stable comparison sort.
  let descents = 0;
  for (let i = 1; i < n; i++) if (sigma[i] < sigma[i - 1]) descents++;
  if (descents * 64 < n) {
    for (let i = 1; i < n; i++) {
      const oi = order[i];
      const s = sigma[oi];
      let j = i - 1;
      while (j >= 0 && sigma[order[j]] > s) { order[j + 1] = order[j]; j--; }
      order[j + 1] = oi;
    }
  } else {
    const idx = Array.from(order);
    idx.sort((a, b) => sigma[a] - sigma[b] || a - b);
    for (let i = 0; i < n; i++) order[i] = idx[i];
  }
  const sig = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    sig[k] = sigma[order[k]];
    displacement[order[k]] = p[k] - p[order[k]];
  }
  const out: Record<string, Float64Array> = {};
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
