// Practical Salinity from conductivity: the Practical Salinity Scale 1978 (PSS-78) as given in
// UNESCO (1983), "Algorithms for computation of fundamental properties of seawater", Unesco
// Technical Papers in Marine Science 44 (Fofonoff & Millard), with the extension below SP = 2 of
// Hill, Dauphinee & Woods (1986), IEEE J. Oceanic Eng. 11, 109–112.
//
// Units: C in mS/cm, t in °C (ITS-90; PSS-78's own formulas take IPTS-68, t68 = 1.00024·t90),
// p in dbar (sea pressure). SP is unitless.

import { checkRange } from './ranges';

/** Conductivity of standard seawater, C(35, 15 °C IPTS-68, 0 dbar) = 42.9140 mS/cm (UNESCO 1983). */
export const C3515 = 42.914;

/**
 * IPTS-68 temperature from ITS-90: t68 = 1.00024·t90 (Saunders 1990; UNESCO/JPOTS).
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44; Hill, Dauphinee & Woods (1986).
 * @param t90 temperature (ITS-90), °C
 * @returns temperature on the IPTS-68 scale, °C
 */
export function t68_from_t90(t90: number): number {
  return 1.00024 * t90;
}

/**
 * ITS-90 temperature from IPTS-68: t90 = t68/1.00024 (Saunders 1990), °C.
 * @param t68 in-situ temperature (IPTS-68), °C
 * @returns temperature on the ITS-90 scale, °C
 */
export function t90_from_t68(t68: number): number {
  return t68 / 1.00024;
}

// UNESCO (1983), PSS-78 coefficients: a_i and b_i of the salinity polynomial in Rt^(1/2), k of
// its temperature correction, c_i of rt(t), the conductivity ratio of standard seawater, and
// d_i, e_i of Rp, the pressure correction.
const A = [0.008, -0.1692, 25.3851, 14.0941, -7.0261, 2.7081] as const;
const B = [0.0005, -0.0056, -0.0066, -0.0375, 0.0636, -0.0144] as const;
const K = 0.0162;
const C = [0.6766097, 2.00564e-2, 1.104259e-4, -6.9698e-7, 1.0031e-9] as const;
const D = [3.426e-2, 4.464e-4, 4.215e-1, -3.107e-3] as const;
const E = [2.07e-5, -6.37e-10, 3.989e-15] as const;

/** rt(t68): conductivity ratio of SP = 35 water at t to that at 15 °C (UNESCO 1983). */
function rt_of(t68: number): number {
  return C[0] + t68 * (C[1] + t68 * (C[2] + t68 * (C[3] + t68 * C[4])));
}

/** Rp(R, t68, p): the pressure correction of the conductivity ratio (UNESCO 1983). */
function Rp_of(R: number, t68: number, p: number): number {
  return 1 + (p * (E[0] + p * (E[1] + p * E[2]))) / (1 + D[0] * t68 + D[1] * t68 * t68 + (D[2] + D[3] * t68) * R);
}

/** PSS-78 salinity from Rt, the conductivity ratio at 0 dbar relative to SP = 35 at t. */
function sp_of_Rt(Rt: number, t68: number): number {
  const r = Math.sqrt(Rt);
  const ft = (t68 - 15) / (1 + K * (t68 - 15));
  const s = A[0] + r * (A[1] + r * (A[2] + r * (A[3] + r * (A[4] + r * A[5]))));
  const ds = B[0] + r * (B[1] + r * (B[2] + r * (B[3] + r * (B[4] + r * B[5]))));
  return s + ft * ds;
}

/** Hill et al. (1986): SP_PSS78 − a0/(1 + 1.5x + x²) − b0·f(t)/(1 + y^½ + y + y^(3/2)), x = 400 Rt, y = 100 Rt. */
function hill_raw(sp: number, Rt: number, t68: number): number {
  const x = 400 * Rt;
  const sqrty = 10 * Math.sqrt(Rt);
  const ft = (t68 - 15) / (1 + K * (t68 - 15));
  return sp - 0.008 / (1 + x * (1.5 + x)) - (0.0005 * ft) / (1 + sqrty * (1 + sqrty * (1 + sqrty)));
}

/**
 * The factor that makes the Hill et al. (1986) extension meet PSS-78 exactly at SP = 2 at this
 * temperature (the raw formulas differ there by about 10⁻⁴): 2 / hill_raw at the Rt where
 * PSS-78 gives 2. Without it, SP would jump at the boundary of the two definitions.
 */
function hill_ratio_at_sp2(t68: number): number {
  // Rt of SP = 2 by Newton's method on the PSS-78 polynomial, from Rt ≈ SP/35.
  let Rt = 2 / 35;
  for (let n = 0; n < 20; n++) {
    const h = 1e-7 * Rt;
    const f = sp_of_Rt(Rt, t68) - 2;
    const slope = (sp_of_Rt(Rt + h, t68) - sp_of_Rt(Rt - h, t68)) / (2 * h);
    const step = f / slope;
    Rt -= step;
    if (Math.abs(step) < 1e-15) break;
  }
  return 2 / hill_raw(2, Rt, t68);
}

/**
 * Practical Salinity SP_from_C(C, t, p) from conductivity C (mS/cm), in-situ temperature t (°C,
 * ITS-90) and sea pressure p (dbar): PSS-78 (UNESCO 1983) for SP ≥ 2 and Hill et al. (1986)
 * below. NaN outside 0 ≤ SP ≤ 42 and the ranges of `ranges.ts` (`checkRange` says why).
 * @param C conductivity, mS/cm
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns Practical Salinity (PSS-78), unitless; NaN outside its range
 */
export function SP_from_C(C: number, t: number, p: number): number {
  if (!(C >= 0 && C <= 100 && t >= -6 && t <= 40 && p >= -5 && p <= 10000)) return NaN;
  const sp = sp_of_C(C, t68_from_t90(t), p);
  // The upper end of PSS-78 with room for rounding, so that SP = 42 survives a round trip via C.
  return sp <= 42 + 1e-9 ? sp : NaN;
}

/** PSS-78 with the Hill extension, without the upper limit of SP = 42. */
function sp_of_C(C: number, t68: number, p: number): number {
  const R = C / C3515;
  const Rt = R / (rt_of(t68) * Rp_of(R, t68, p));
  if (!(Rt >= 0)) return NaN;
  const sp = sp_of_Rt(Rt, t68);
  if (sp >= 2) return sp;
  return Math.max(0, hill_ratio_at_sp2(t68) * hill_raw(sp, Rt, t68));
}

/**
 * Why SP_from_C(C, t, p) is NaN, or null when it is a number.
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44; Hill, Dauphinee & Woods (1986).
 * @param C conductivity, mS/cm
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns why SP_from_C gives NaN for these inputs, or null when it gives a number
 */
export function SP_from_C_reason(C: number, t: number, p: number): string | null {
  const inputs = checkRange({ C, t, p });
  if (inputs) return inputs;
  const sp = SP_from_C(C, t, p);
  if (Number.isNaN(sp)) return `C = ${C} mS/cm at t = ${t} °C gives a salinity above SP = 42, where PSS-78 ends`;
  return null;
}

/**
 * Conductivity C_from_SP(SP, t, p), mS/cm: the inverse of SP_from_C, found by the secant method
 * (SP grows monotonically with C). For tests and for making demo casts.
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44; Hill, Dauphinee & Woods (1986).
 * @param SP Practical Salinity (PSS-78), unitless
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns conductivity, mS/cm
 */
export function C_from_SP(SP: number, t: number, p: number): number {
  if (checkRange({ SP, t, p })) return NaN;
  const t68 = t68_from_t90(t);
  // Start from conductivity proportional to salinity at this temperature (SP = 35 ↔ R = rt).
  let c0 = (C3515 * rt_of(t68) * Math.max(SP, 0.01)) / 35;
  let c1 = c0 * 1.001;
  let f0 = sp_of_C(c0, t68, p) - SP;
  for (let n = 0; n < 50; n++) {
    const f1 = sp_of_C(c1, t68, p) - SP;
    if (f1 === 0 || f1 === f0) return c1;
    const c2 = c1 - (f1 * (c1 - c0)) / (f1 - f0);
    c0 = c1;
    f0 = f1;
    c1 = c2;
    if (Math.abs(c1 - c0) < 1e-13 * c1) break;
  }
  return c1;
}

/**
 * SP_from_C over columns: C mS/cm, t °C, p dbar → SP. Allocates only the output.
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44; Hill, Dauphinee & Woods (1986).
 * @param C conductivity, mS/cm
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns Practical Salinity for each level, unitless
 */
export function SP_from_C_batch(C: Float64Array, t: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = C.length;
  if (t.length !== n || p.length !== n) throw new RangeError('SP_from_C_batch: input columns differ in length');
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = SP_from_C(C[i], t[i], p[i]);
  return o;
}
