/**
 * Mixed-layer depth by the density-threshold criterion of de Boyer Montégut, Madec, Fischer,
 * Lazar & Iudicone (2004), "Mixed layer depth over the global ocean: an examination of profile
 * data and a profile-based climatology", J. Geophys. Res. 109, C12003: the mixed layer ends at
 * the shallowest level below the reference level where σ0 exceeds its value at the reference
 * level (10 dbar) by the threshold (0.03 kg/m³). The crossing is placed by linear interpolation
 * of σ0 in pressure between the two levels that bracket it.
 */

export interface MldOptions {
  /** Density threshold Δσ0, kg/m³ (default 0.03, de Boyer Montégut et al. 2004). */
  threshold?: number;
  /** Reference pressure, dbar (default 10, de Boyer Montégut et al. 2004). */
  p_ref?: number;
}

export type MldStatus =
  | 'ok'
  /** no level at or near the reference pressure: the cast starts too deep or is empty */
  | 'no_reference'
  /** the threshold is never exceeded: mixed to the bottom of the cast (a lower bound) */
  | 'mixed_to_bottom';

export interface MldResult {
  /** Mixed-layer pressure, dbar (NaN unless status is 'ok'; the deepest level for 'mixed_to_bottom'). */
  p_mld: number;
  /** σ0 at the reference level, kg/m³. */
  sigma0_ref: number;
  status: MldStatus;
  /** Why the value is what it is, for the cast's notes. */
  reason: string;
}

/**
 * Mixed-layer pressure (dbar) from σ0 (kg/m³) and p (dbar, increasing). The reference σ0 is
 * interpolated linearly to p_ref; a cast whose first good level is deeper than p_ref has no
 * reference (NaN with a reason). Convert to depth with z_from_p.
 * Reference: de Boyer Montégut et al. (2004), J. Geophys. Res. 109, C12003.
 * @param sigma0 potential density anomaly referenced to 0 dbar, kg/m³
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param options p_ref, the reference level (dbar, default 10), and threshold (kg/m³, default 0.03)
 * @returns the mixed-layer depth (dbar) and how it was found
 */
export function mixed_layer_depth(
  sigma0: ArrayLike<number>,
  p: ArrayLike<number>,
  options: MldOptions = {},
): MldResult {
  const threshold = options.threshold ?? 0.03;
  const pRef = options.p_ref ?? 10;
  const idx: number[] = [];
  for (let i = 0; i < p.length; i++) if (Number.isFinite(p[i]) && Number.isFinite(sigma0[i])) idx.push(i);
  if (idx.length === 0 || p[idx[0]] > pRef) {
    return {
      p_mld: NaN,
      sigma0_ref: NaN,
      status: 'no_reference',
      reason: `no good sample at or above the ${pRef} dbar reference level`,
    };
  }
  // σ0 at p_ref, linear between the samples that bracket it (or the last sample above it).
  let k = 0;
  while (k + 1 < idx.length && p[idx[k + 1]] <= pRef) k++;
  let sRef = sigma0[idx[k]];
  if (p[idx[k]] < pRef && k + 1 < idx.length) {
    const a = idx[k],
      b = idx[k + 1];
    sRef = sigma0[a] + ((pRef - p[a]) / (p[b] - p[a])) * (sigma0[b] - sigma0[a]);
  }
  const target = sRef + threshold;
  let prevP = pRef,
    prevS = sRef;
  for (let m = k + 1; m < idx.length; m++) {
    const i = idx[m];
    if (p[i] <= pRef) continue;
    if (sigma0[i] >= target) {
      const p_mld = prevP + ((target - prevS) / (sigma0[i] - prevS)) * (p[i] - prevP);
      return {
        p_mld,
        sigma0_ref: sRef,
        status: 'ok',
        reason: `σ0 exceeds its ${pRef} dbar value by ${threshold} kg/m³`,
      };
    }
    prevP = p[i];
    prevS = sigma0[i];
  }
  return {
    p_mld: p[idx[idx.length - 1]],
    sigma0_ref: sRef,
    status: 'mixed_to_bottom',
    reason: `σ0 never exceeds its ${pRef} dbar value by ${threshold} kg/m³; mixed at least to the deepest sample`,
  };
}
