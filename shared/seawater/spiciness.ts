/**
 * Spiciness referenced to 0 dbar, kg/m³ (McDougall & Krzysik 2015, "Spiciness", J. Mar. Res. 73,
 * 141–152): a polynomial in the same scaled variables as the Roquet et al. (2015) density,
 *   spiciness0 = Σ_{i,j=0..6} s_ij · xs^i · ys^j,  xs = sqrt(sfac·SA + offset), ys = CT/40,
 * built to be orthogonal to σ0 in the (SA, CT) plane.
 */
import { sfac, offset } from './density';
import { inRange } from './ranges';

/**
 * Coefficients s_ij of McDougall & Krzysik (2015), row i = power of xs, column j = power of ys
 * (their s01 … s49, seven to a row).
 */
const S: ReadonlyArray<readonly number[]> = [
  [
    -9.22982898371678e1, -1.35727873628866e1, 1.8735365099401e1, -1.61360047373455e1, 3.76112762286425e1,
    -4.27086671461257e1, 2.00820111041594e1,
  ],
  [
    2.87969717584045e2, 1.13747111959674e1, 6.0737719299068e1, -7.37514033570187e1, -7.51171878953574e1,
    1.63310989721504e2, -8.83222751638095e1,
  ],
  [
    -6.41725302237048e2, 2.79732530789261e1, -2.49466901993728e2, 3.26691295035416e2, 2.66389243708181e1,
    -2.93170905757579e2, 1.76053907144524e2,
  ],
  [
    8.27634318120224e2, -7.02156220126926e1, 3.82973336590803e2, -5.06206828083959e2, 6.69626565169529e1,
    3.02851235050766e2, -1.96345285604621e2,
  ],
  [
    -5.74040806713526e2, 7.03285905478333e1, -2.97870298879716e2, 3.88340373735118e2, -8.29188936089122e1,
    -1.87602137195354e2, 1.27096944425793e2,
  ],
  [
    2.11671167892147e2, -3.15140919876285e1, 1.16458864953602e2, -1.50029730802344e2, 3.76293848660589e1,
    6.472474243732e1, -4.47159994408867e1,
  ],
  [
    -3.23533339449055e1, 5.30648562097667, -1.82051249177948e1, 2.33184351090495e1, -6.22909903460368,
    -9.55975464301446, 6.61877073960113,
  ],
];
const FLAT = Float64Array.from(S.flat());

/**
 * spiciness0(SA g/kg, CT °C) in kg/m³ (McDougall & Krzysik 2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @returns spiciness referenced to 0 dbar, kg/m³
 */
export function spiciness0(SA: number, CT: number): number {
  if (!inRange(SA, CT, 0)) return NaN;
  const xs = Math.sqrt(sfac * SA + offset);
  const ys = CT * 0.025;
  let r = 0;
  for (let i = 6; i >= 0; i--) {
    let row = 0;
    for (let j = 6; j >= 0; j--) row = row * ys + FLAT[i * 7 + j];
    r = r * xs + row;
  }
  return r;
}

/**
 * spiciness0 over columns SA g/kg, CT °C → kg/m³.
 * Reference: McDougall & Krzysik (2015), J. Mar. Res. 73, 141–152.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param out optional output column of the same length (allocated when absent)
 * @returns spiciness referenced to 0 dbar for each level, kg/m³
 */
export function spiciness0_batch(SA: Float64Array, CT: Float64Array, out?: Float64Array): Float64Array {
  if (SA.length !== CT.length) throw new RangeError('SA and CT differ in length');
  const o = out ?? new Float64Array(SA.length);
  for (let m = 0; m < SA.length; m++) o[m] = spiciness0(SA[m], CT[m]);
  return o;
}
