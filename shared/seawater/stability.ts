/**
 * Static stability of a cast (TEOS-10 Manual, IOC, SCOR & IAPSO 2010, §3.10, eq. 3.10.2):
 *   N² = g² (β ΔSA − α ΔCT) / (v ΔP)
 * evaluated between adjacent levels with SA, CT and p at the mid-point of each pair, g the mean
 * of the gravity at the two levels (TEOS-10 gravity by latitude and pressure), and v, α, β from
 * the Roquet et al. (2015) polynomial.
 */
import { specvol_alpha_beta, db2Pa } from './density';
import { grav } from './depth';

export interface NsquaredResult {
  /** Buoyancy frequency squared at the mid-points, s⁻² (length n − 1). */
  N2: Float64Array;
  /** Mid-point pressures, dbar (length n − 1). */
  p_mid: Float64Array;
}

/**
 * Buoyancy frequency squared N² (s⁻²) between adjacent levels of a cast.
 * SA g/kg, CT °C, p dbar (increasing), lat degrees (one latitude for the cast, or one per level).
 * A pair with a NaN gives NaN at its mid-point.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual §3.10; Roquet et al. (2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lat latitude, degrees north
 * @returns N² between adjacent levels (1/s²) and the mid-point pressures (dbar)
 */
export function Nsquared(
  SA: ArrayLike<number>,
  CT: ArrayLike<number>,
  p: ArrayLike<number>,
  lat: number | ArrayLike<number>,
): NsquaredResult {
  const n = SA.length;
  if (CT.length !== n || p.length !== n) throw new RangeError('SA, CT and p differ in length');
  const m = Math.max(0, n - 1);
  const N2 = new Float64Array(m);
  const p_mid = new Float64Array(m);
  const latAt = (i: number): number => (typeof lat === 'number' ? lat : lat[i]);
  let gUpper = n > 0 ? grav(latAt(0), p[0]) : NaN;
  for (let i = 0; i < m; i++) {
    const gLower = grav(latAt(i + 1), p[i + 1]);
    const g = 0.5 * (gUpper + gLower);
    const pm = 0.5 * (p[i] + p[i + 1]);
    const { specvol, alpha, beta } = specvol_alpha_beta(0.5 * (SA[i] + SA[i + 1]), 0.5 * (CT[i] + CT[i + 1]), pm);
    const dSA = SA[i + 1] - SA[i];
    const dCT = CT[i + 1] - CT[i];
    const dp = p[i + 1] - p[i];
    N2[i] = ((g * g) / (specvol * db2Pa * dp)) * (beta * dSA - alpha * dCT);
    p_mid[i] = pm;
    gUpper = gLower;
  }
  return { N2, p_mid };
}
