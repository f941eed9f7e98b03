/**
 * Density inversions of a cast: pressure intervals where σ decreases with pressure by more than a
 * threshold (docs/science.md §3.1). Common practice treats smaller ones (default 0.01 kg/m³) as noise.
 *
 * Definition used here (one downward scan, O(n)):
 * - M is the running maximum of σ above the current level, held at level kM (the heavy parcel).
 * - A level with σ < M opens (or extends) a run that lasts until σ recovers to M − recovery
 *   (recovery defaults to 0: full recovery).
 * - The run is an inversion when its deficit, M minus the lightest σ inside it, exceeds the
 *   threshold. It is reported from the heavy parcel (iTop = kM) to the last light level
 *   (iBottom); `levels` = iBottom − iTop is the number of levels lighter than the parcel above.
 * - Class: 'spike' when levels ≤ spikeMaxLevels (default 2 scans, typical of conductivity /
 *   temperature sensor lag) or when the interval is thinner than overturnMinThickness
 *   (default 1 dbar); otherwise 'overturn'.
 */

export type InversionClass = 'spike' | 'overturn';

export interface Inversion {
  /** Index of the heavy level above the light water (the level holding the running maximum). */
  iTop: number;
  /** Index of the last level lighter than that maximum. */
  iBottom: number;
  /** Pressure of iTop and iBottom, dbar. */
  pTop: number;
  pBottom: number;
  /** Depth (m, positive down, = −z) of iTop and iBottom when heights z were given. */
  depthTop: number | null;
  depthBottom: number | null;
  /** Density deficit, kg/m³: the maximum σ above minus the minimum σ within (> 0). */
  deficit: number;
  /** Most negative N² (s⁻²) on mid-points inside [pTop, pBottom], when N² was given. */
  minN2: number | null;
  class: InversionClass;
  /** Number of levels lighter than the heavy parcel (iBottom − iTop). */
  levels: number;
}

export interface InversionOptions {
  /** Smallest deficit reported, kg/m³ (default 0.01). */
  threshold?: number;
  /** N² on mid-points, s⁻²: length n − 1 (between levels k and k+1) unless p_mid is given. */
  N2?: Float64Array;
  /** Pressures of the N² mid-points, dbar. */
  p_mid?: Float64Array;
  /** Height z of each level, m (negative below the surface), for the depths of the interval. */
  z?: Float64Array;
  /** Largest number of light levels classed a spike (default 2). */
  spikeMaxLevels?: number;
  /** Thinnest interval (pBottom − pTop, dbar) classed an overturn (default 1). */
  overturnMinThickness?: number;
  /** σ counts as recovered within this much of the running maximum, kg/m³ (default 0). */
  recovery?: number;
}

/** Most negative N² on the mid-points inside [pTop, pBottom], or null. */
function minN2In(opts: InversionOptions, iTop: number, iBottom: number, pTop: number, pBottom: number): number | null {
  const N2 = opts.N2;
  if (!N2) return null;
  let best = Infinity;
  if (opts.p_mid) {
    const pm = opts.p_mid;
    for (let k = 0; k < pm.length; k++) if (pm[k] >= pTop && pm[k] <= pBottom && N2[k] < best) best = N2[k];
  } else {
    for (let k = iTop; k < iBottom && k < N2.length; k++) if (N2[k] < best) best = N2[k];
  }
  return Number.isFinite(best) ? best : null;
}

/**
 * Inverted intervals of σ (kg/m³) against pressure p (dbar, increasing down the cast) by the
 * running-maximum scan described at the head of this file. NaN σ levels extend a run but never
 * set its deficit. A stable profile (σ non-decreasing) gives [].
 */
export function detectInversions(p: Float64Array, sigma: Float64Array, opts: InversionOptions = {}): Inversion[] {
  const threshold = opts.threshold ?? 0.01;
  const spikeMax = opts.spikeMaxLevels ?? 2;
  const minThick = opts.overturnMinThickness ?? 1;
  const recovery = opts.recovery ?? 0;
  const z = opts.z;
  const n = sigma.length;
  const found: Inversion[] = [];
  let k = 0;
  while (k < n && !Number.isFinite(sigma[k])) k++;
  if (k >= n) return found;
  let M = sigma[k];
  let kM = k;
  k++;
  while (k < n) {
    const s = sigma[k];
    if (s >= M) {
      M = s;
      kM = k;
      k++;
      continue;
    }
    // A run of water lighter than the parcel at kM (or of missing values) starts at k.
    let j = k;
    let minS = Infinity;
    let lastLight = k;
    const recovered = M - recovery;
    // The interval ends at the last level lighter than the parcel above by more than the
    // threshold: in weakly stratified deep water σ can stay a hair below the maximum for many
    // scans after a one-scan spike, and that tail is sensor noise, not part of the inversion.
    // For a spike (few such levels) it likewise starts just above the first of them: the running
    // maximum may have been set a few noisy scans higher up. An overturn keeps its whole extent
    // from the heavy parcel down.
    const significant = M - threshold;
    let firstLight = -1;
    let nLight = 0;
    while (j < n && !(sigma[j] >= recovered)) {
      const v = sigma[j];
      if (v < minS) minS = v;
      if (v < significant) {
        lastLight = j;
        nLight++;
        if (firstLight < 0) firstLight = j;
      }
      j++;
    }
    const deficit = M - minS;
    if (deficit > threshold) {
      const iBottom = lastLight;
      const spikeTop = Math.max(kM, firstLight - 1);
      const isSpike = nLight <= spikeMax || iBottom - kM <= spikeMax || p[iBottom] - p[kM] < minThick;
      const iTop = isSpike ? spikeTop : kM;
      const pTop = p[iTop];
      const pBottom = p[iBottom];
      const levels = iBottom - iTop;
      const cls: InversionClass = isSpike ? 'spike' : 'overturn';
      found.push({
        iTop,
        iBottom,
        pTop,
        pBottom,
        depthTop: z ? -z[iTop] : null,
        depthBottom: z ? -z[iBottom] : null,
        deficit,
        minN2: minN2In(opts, iTop, iBottom, pTop, pBottom),
        class: cls,
        levels,
      });
    }
    if (j < n && sigma[j] > M) {
      M = sigma[j];
      kM = j;
    } else if (j < n && sigma[j] === M) kM = j;
    k = j + 1;
  }
  return found;
}
