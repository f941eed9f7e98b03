/**
 * Density of seawater from the 75-term polynomial for specific volume of
 * Roquet, Madec, McDougall & Barker (2015), "Accurate polynomial expressions for the density
 * and specific volume of seawater using the TEOS-10 standard", Ocean Modelling 90, 29–43,
 * as TEOS-10 uses it (IOC, SCOR & IAPSO 2010, Manuals and Guides 56, with the polynomial
 * replacing the Gibbs-function density for ocean use).
 *
 * The polynomial is v(SA, CT, p) = Σ v_ijk · xs^i · ys^j · z^k with
 *   xs = sqrt(sfac·SA + offset), sfac = 1/(40·35.16504/35), offset = 24 g/kg · sfac,
 *   ys = CT / 40, z = p / 10⁴ dbar, and i + j + k ≤ 6.
 * Everything here (rho, alpha, beta, sigma_pr, enthalpy) is the same polynomial, its analytic
 * derivatives or its pressure integral, so the family stays self-consistent.
 *
 * Units: SA g/kg, CT °C (ITS-90), p sea pressure dbar (absolute minus 10.1325 dbar).
 * Outside the box of `ranges.ts` every function returns NaN (`checkRange` says why).
 */
import { inRange, SA_RANGE, T_RANGE } from './ranges';

/** 1 / (40 · 35.16504/35), the salinity scale of the polynomial (Roquet et al. 2015). */
export const sfac = 0.0248826675584615;
/** 24 g/kg · sfac: keeps the square root real down to SA = −24 g/kg (Roquet et al. 2015). */
export const offset = 5.971840214030754e-1;
/** Standard Ocean Reference Salinity, g/kg (Millero et al. 2008, TEOS-10). */
export const SSO = 35.16504;
/** Isobaric heat capacity used to define Conservative Temperature, J/(kg K) (TEOS-10). */
export const cp0 = 3991.86795711963;
/** dbar → Pa. */
export const db2Pa = 1e4;

/**
 * The 75 coefficients v_ijk of specific volume (m³/kg), transcribed from Roquet et al. (2015),
 * indexed [i = power of xs, j = power of ys, k = power of z, value].
 */
const V_TABLE: ReadonlyArray<readonly [number, number, number, number]> = [
  [0, 0, 0, 1.0769995862e-3],
  [0, 0, 1, -6.0799143809e-5],
  [0, 0, 2, 9.9856169219e-6],
  [0, 0, 3, -1.1309361437e-6],
  [0, 0, 4, 1.053115308e-7],
  [0, 0, 5, -1.2647261286e-8],
  [0, 0, 6, 1.961350393e-9],
  [0, 1, 0, -1.5649734675e-5],
  [0, 1, 1, 1.8505765429e-5],
  [0, 1, 2, -1.1736386731e-6],
  [0, 1, 3, -3.6527006553e-7],
  [0, 1, 4, 3.1454099902e-7],
  [0, 2, 0, 2.7762106484e-5],
  [0, 2, 1, -1.1716606853e-5],
  [0, 2, 2, 2.130502874e-6],
  [0, 2, 3, 2.8695905159e-7],
  [0, 3, 0, -1.6521159259e-5],
  [0, 3, 1, 7.9279656173e-6],
  [0, 3, 2, -4.6132540037e-7],
  [0, 4, 0, 6.9111322702e-6],
  [0, 4, 1, -3.4102187482e-6],
  [0, 4, 2, -6.3352916514e-8],
  [0, 5, 0, -8.053961554e-7],
  [0, 5, 1, 5.0736766814e-7],
  [0, 6, 0, 2.0543094268e-7],
  [1, 0, 0, -3.1038981976e-4],
  [1, 0, 1, 2.4262468747e-5],
  [1, 0, 2, -5.8484432984e-7],
  [1, 0, 3, 3.6310188515e-7],
  [1, 0, 4, -1.1147125423e-7],
  [1, 1, 0, 3.5009599764e-5],
  [1, 1, 1, -9.5677088156e-6],
  [1, 1, 2, -5.5699154557e-6],
  [1, 1, 3, -2.7295696237e-7],
  [1, 2, 0, -3.7435842344e-5],
  [1, 2, 1, -2.3678308361e-7],
  [1, 2, 2, 3.913738708e-7],
  [1, 3, 0, 2.4141479483e-5],
  [1, 3, 1, -3.4558773655e-6],
  [1, 3, 2, 7.7618888092e-9],
  [1, 4, 0, -8.7595873154e-6],
  [1, 4, 1, 1.2956717783e-6],
  [1, 5, 0, -3.30527589e-7],
  [2, 0, 0, 6.6928067038e-4],
  [2, 0, 1, -3.4792460974e-5],
  [2, 0, 2, -4.8122251597e-6],
  [2, 0, 3, 1.674630378e-8],
  [2, 1, 0, -4.3592678561e-5],
  [2, 1, 1, 1.1100834765e-5],
  [2, 1, 2, 5.4620748834e-6],
  [2, 2, 0, 3.590782276e-5],
  [2, 2, 1, 2.9283346295e-6],
  [2, 2, 2, -6.5731104067e-7],
  [2, 3, 0, -1.4353633048e-5],
  [2, 3, 1, 3.1655306078e-7],
  [2, 4, 0, 4.3703680598e-6],
  [3, 0, 0, -8.5047933937e-4],
  [3, 0, 1, 3.7470777305e-5],
  [3, 0, 2, 4.9263106998e-6],
  [3, 1, 0, 3.4532461828e-5],
  [3, 1, 1, -9.8447117844e-6],
  [3, 1, 2, -1.3544185627e-6],
  [3, 2, 0, -1.8698584187e-5],
  [3, 2, 1, -4.88261392e-7],
  [3, 3, 0, 2.2863324556e-6],
  [4, 0, 0, 5.8086069943e-4],
  [4, 0, 1, -1.7322218612e-5],
  [4, 0, 2, -1.7811974727e-6],
  [4, 1, 0, -1.1959409788e-5],
  [4, 1, 1, 2.590922526e-6],
  [4, 2, 0, 3.8595339244e-6],
  [5, 0, 0, -2.1092370507e-4],
  [5, 0, 1, 3.0927427253e-6],
  [5, 1, 0, 1.3864594581e-6],
  [6, 0, 0, 3.1932457305e-5],
];

const DEG = 6;
/** Cube side: 8 so that the pressure integral (total degree 7) fits the same layout. */
const N = 8;
/** Dense index of c_ijk in an 8×8×8 cube; entries above the polynomial's degree stay zero. */
const cubeIndex = (i: number, j: number, k: number): number => (k * N + j) * N + i;

function buildCube(
  transform: (i: number, j: number, k: number) => { i: number; j: number; k: number; factor: number } | null,
): Float64Array {
  const cube = new Float64Array(N * N * N);
  for (const [i, j, k, value] of V_TABLE) {
    const t = transform(i, j, k);
    if (t) cube[cubeIndex(t.i, t.j, t.k)] += value * t.factor;
  }
  return cube;
}

/** v itself. */
const V = buildCube((i, j, k) => ({ i, j, k, factor: 1 }));
/** ∂v/∂xs (the derivative lowers the power of xs). */
const V_XS = buildCube((i, j, k) => (i === 0 ? null : { i: i - 1, j, k, factor: i }));
/** ∂v/∂ys. */
const V_YS = buildCube((i, j, k) => (j === 0 ? null : { i, j: j - 1, k, factor: j }));
/**
 * ∫₀^z v dz' (raises the power of z), times 10⁸ below to give dynamic enthalpy in J/kg
 * (dP = 10⁴ dbar·Pa/dbar · 10⁴ dz).
 */
const V_INT_Z = buildCube((i, j, k) => ({ i, j, k: k + 1, factor: 1 / (k + 1) }));

/**
 * Evaluate Σ c_ijk xs^i ys^j z^k (i + j + k ≤ deg) by nested Horner: z outer, ys middle,
 * xs inner.
 */
function evalCube(c: Float64Array, xs: number, ys: number, z: number, deg = DEG): number {
  let r = 0;
  for (let k = deg; k >= 0; k--) {
    let inner = 0;
    for (let j = deg - k; j >= 0; j--) {
      const base = (k * N + j) * N;
      let row = 0;
      for (let i = deg - k - j; i >= 0; i--) row = row * xs + c[base + i];
      inner = inner * ys + row;
    }
    r = r * z + inner;
  }
  return r;
}

/**
 * Collapse the cube at a fixed z into 28 coefficients of a polynomial in (xs, ys), laid out
 * row by row (j = 0..6, i = 0..6−j). Used for potential density at a fixed reference pressure.
 */
function collapseAtZ(c: Float64Array, z: number): Float64Array {
  const out = new Float64Array(28);
  let n = 0;
  for (let j = 0; j <= DEG; j++) {
    for (let i = 0; i <= DEG - j; i++) {
      let s = 0;
      for (let k = DEG - i - j; k >= 0; k--) s = s * z + c[cubeIndex(i, j, k)];
      out[n++] = s;
    }
  }
  return out;
}

/**
 * Specific volume at fixed pressure, hand-unrolled Horner over the 28 collapsed coefficients
 * (the hot loop of sigma_pr over a whole cruise: one sqrt, 27 multiply-adds).
 */
function evalPlane(q: Float64Array, xs: number, ys: number): number {
  const r0 = q[0] + xs * (q[1] + xs * (q[2] + xs * (q[3] + xs * (q[4] + xs * (q[5] + xs * q[6])))));
  const r1 = q[7] + xs * (q[8] + xs * (q[9] + xs * (q[10] + xs * (q[11] + xs * q[12]))));
  const r2 = q[13] + xs * (q[14] + xs * (q[15] + xs * (q[16] + xs * q[17])));
  const r3 = q[18] + xs * (q[19] + xs * (q[20] + xs * q[21]));
  const r4 = q[22] + xs * (q[23] + xs * q[24]);
  const r5 = q[25] + xs * q[26];
  const r6 = q[27];
  return r0 + ys * (r1 + ys * (r2 + ys * (r3 + ys * (r4 + ys * (r5 + ys * r6)))));
}

const xsOf = (SA: number): number => Math.sqrt(sfac * SA + offset);

/**
 * Specific volume v, m³/kg. SA g/kg, CT °C, p dbar. Roquet et al. (2015) 75-term polynomial.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns specific volume, m³/kg
 */
export function specvol(SA: number, CT: number, p: number): number {
  if (!inRange(SA, CT, p)) return NaN;
  return evalCube(V, xsOf(SA), CT * 0.025, p * 1e-4);
}

/**
 * In-situ density ρ = 1/v, kg/m³. SA g/kg, CT °C, p dbar. Roquet et al. (2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns in-situ density, kg/m³
 */
export function rho(SA: number, CT: number, p: number): number {
  return 1 / specvol(SA, CT, p);
}

/**
 * Thermal expansion coefficient with respect to CT, α = (1/v) ∂v/∂CT, 1/K.
 * SA g/kg, CT °C, p dbar. Analytic derivative of the Roquet et al. (2015) polynomial.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns thermal expansion coefficient with respect to Conservative Temperature, 1/K
 */
export function alpha(SA: number, CT: number, p: number): number {
  if (!inRange(SA, CT, p)) return NaN;
  const xs = xsOf(SA),
    ys = CT * 0.025,
    z = p * 1e-4;
  return (0.025 * evalCube(V_YS, xs, ys, z)) / evalCube(V, xs, ys, z);
}

/**
 * Saline contraction coefficient at constant CT, β = −(1/v) ∂v/∂SA, kg/g.
 * SA g/kg, CT °C, p dbar. Analytic derivative of the Roquet et al. (2015) polynomial
 * (∂xs/∂SA = sfac / (2 xs)).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns saline contraction coefficient at constant Conservative Temperature, kg/g
 */
export function beta(SA: number, CT: number, p: number): number {
  if (!inRange(SA, CT, p)) return NaN;
  const xs = xsOf(SA),
    ys = CT * 0.025,
    z = p * 1e-4;
  return (-evalCube(V_XS, xs, ys, z) * 0.5 * sfac) / (xs * evalCube(V, xs, ys, z));
}

/**
 * v, α and β together at one point (N² needs all three; the cube is walked three times).
 * Reference: Roquet, Madec, McDougall & Barker (2015), Ocean Modelling 90, 29–43; IOC, SCOR & IAPSO (2010).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns specific volume (m³/kg), alpha (1/K) and beta (kg/g) in one evaluation
 */
export function specvol_alpha_beta(
  SA: number,
  CT: number,
  p: number,
): { specvol: number; alpha: number; beta: number } {
  if (!inRange(SA, CT, p)) return { specvol: NaN, alpha: NaN, beta: NaN };
  const xs = xsOf(SA),
    ys = CT * 0.025,
    z = p * 1e-4;
  const v = evalCube(V, xs, ys, z);
  return {
    specvol: v,
    alpha: (0.025 * evalCube(V_YS, xs, ys, z)) / v,
    beta: (-evalCube(V_XS, xs, ys, z) * 0.5 * sfac) / (xs * v),
  };
}

/**
 * Specific volume anomaly relative to the standard ocean SSO = 35.16504 g/kg, CT = 0 °C at
 * the same pressure, m³/kg (TEOS-10 Manual §3.7; the integrand of dynamic height anomaly).
 * Reference: Roquet, Madec, McDougall & Barker (2015), Ocean Modelling 90, 29–43; IOC, SCOR & IAPSO (2010).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns specific volume anomaly from the standard ocean (SSO, 0 °C), m³/kg
 */
export function specvol_anom_standard(SA: number, CT: number, p: number): number {
  if (!inRange(SA, CT, p)) return NaN;
  const z = p * 1e-4;
  return evalCube(V, xsOf(SA), CT * 0.025, z) - evalCube(V, XS_SSO, 0, z);
}

const XS_SSO = xsOf(SSO);

/**
 * Specific volume of the standard ocean (SSO, CT = 0) at pressure p dbar, m³/kg.
 * Reference: Roquet, Madec, McDougall & Barker (2015), Ocean Modelling 90, 29–43; IOC, SCOR & IAPSO (2010).
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns specific volume of the standard ocean (SA = 35.16504 g/kg, CT = 0 °C) at p, m³/kg
 */
export function specvol_SSO_0(p: number): number {
  return evalCube(V, XS_SSO, 0, p * 1e-4);
}

/**
 * Dynamic enthalpy h̃ = ∫₀^P v dP', J/kg, the pressure integral of the polynomial
 * (Young 2010; TEOS-10 Manual §3.32; Roquet et al. 2015). SA g/kg, CT °C, p dbar.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns dynamic enthalpy, J/kg
 */
export function dynamic_enthalpy(SA: number, CT: number, p: number): number {
  if (!inRange(SA, CT, p)) return NaN;
  return evalCube(V_INT_Z, xsOf(SA), CT * 0.025, p * 1e-4, DEG + 1) * 1e8;
}

/**
 * Dynamic enthalpy of the standard ocean (SSO, CT = 0), J/kg; used by z_from_p (TEOS-10).
 * Reference: Roquet, Madec, McDougall & Barker (2015), Ocean Modelling 90, 29–43; IOC, SCOR & IAPSO (2010).
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns enthalpy of the standard ocean (SA = 35.16504 g/kg, CT = 0 °C) at p, J/kg
 */
export function enthalpy_SSO_0(p: number): number {
  return evalCube(V_INT_Z, XS_SSO, 0, p * 1e-4, DEG + 1) * 1e8;
}

/**
 * Specific enthalpy h = cp0·CT + h̃, J/kg (TEOS-10 Manual eq. 3.32.x). SA g/kg, CT °C, p dbar.
 * Reference: Roquet, Madec, McDougall & Barker (2015), Ocean Modelling 90, 29–43; IOC, SCOR & IAPSO (2010).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns specific enthalpy, J/kg
 */
export function enthalpy(SA: number, CT: number, p: number): number {
  return cp0 * CT + dynamic_enthalpy(SA, CT, p);
}

/** Reference pressures TEOS-10 names σ0 … σ4 for, dbar. */
export const SIGMA_REFERENCE_PRESSURES = [0, 1000, 2000, 3000, 4000] as const;
export type SigmaReference = (typeof SIGMA_REFERENCE_PRESSURES)[number];

const PLANES = new Map<number, Float64Array>();
function planeAt(p_ref: number): Float64Array {
  let q = PLANES.get(p_ref);
  if (!q) {
    q = collapseAtZ(V, p_ref * 1e-4);
    if (PLANES.size < 64) PLANES.set(p_ref, q);
  }
  return q;
}

/**
 * Potential density anomaly σ_pr = ρ(SA, CT, p_ref) − 1000 kg/m³ for any reference pressure
 * p_ref dbar (TEOS-10 names 0…4000 dbar σ0…σ4). SA g/kg, CT °C. Roquet et al. (2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p_ref reference pressure, dbar
 * @returns potential density anomaly referenced to p_ref (density minus 1000 kg/m³), kg/m³
 */
export function sigma_pr(SA: number, CT: number, p_ref: number): number {
  if (!inRange(SA, CT, p_ref)) return NaN;
  return 1 / evalPlane(planeAt(p_ref), xsOf(SA), CT * 0.025) - 1000;
}

/** σ0, potential density anomaly referenced to 0 dbar, kg/m³. SA g/kg, CT °C. Roquet et al. (2015). */
export const sigma0 = (SA: number, CT: number): number => sigma_pr(SA, CT, 0);
/** σ1, referenced to 1000 dbar, kg/m³. SA g/kg, CT °C. Roquet et al. (2015). */
export const sigma1 = (SA: number, CT: number): number => sigma_pr(SA, CT, 1000);
/** σ2, referenced to 2000 dbar, kg/m³. SA g/kg, CT °C. Roquet et al. (2015). */
export const sigma2 = (SA: number, CT: number): number => sigma_pr(SA, CT, 2000);
/** σ3, referenced to 3000 dbar, kg/m³. SA g/kg, CT °C. Roquet et al. (2015). */
export const sigma3 = (SA: number, CT: number): number => sigma_pr(SA, CT, 3000);
/** σ4, referenced to 4000 dbar, kg/m³. SA g/kg, CT °C. Roquet et al. (2015). */
export const sigma4 = (SA: number, CT: number): number => sigma_pr(SA, CT, 4000);

// ---------------------------------------------------------------------------------------------
// Batch forms on Float64Array columns: one output array, nothing allocated per point.

function outFor(n: number, out?: Float64Array): Float64Array {
  if (out && out.length < n) throw new RangeError(`output column too short: ${out.length} < ${n}`);
  return out ?? new Float64Array(n);
}

function checkLengths(...cols: ArrayLike<number>[]): number {
  const n = cols[0].length;
  for (const c of cols) if (c.length !== n) throw new RangeError('columns differ in length');
  return n;
}

/**
 * σ_pr over columns: SA g/kg, CT °C, one reference pressure p_ref dbar → kg/m³.
 * Reference: Roquet, Madec, McDougall & Barker (2015), Ocean Modelling 90, 29–43; IOC, SCOR & IAPSO (2010).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p_ref reference pressure, dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns potential density anomaly referenced to p_ref for each level, kg/m³
 */
export function sigma_batch(SA: Float64Array, CT: Float64Array, p_ref: number, out?: Float64Array): Float64Array {
  const n = checkLengths(SA, CT);
  const o = outFor(n, out);
  if (!inRange(SA_RANGE[0], T_RANGE[0], p_ref)) return o.fill(NaN, 0, n);
  const q = planeAt(p_ref);
  // The 28 coefficients as locals: V8 keeps them in registers across the loop, which is what
  // makes this kernel as fast as the C library (evalPlane re-reads them from memory per point).
  const q0 = q[0],
    q1 = q[1],
    q2 = q[2],
    q3 = q[3],
    q4 = q[4],
    q5 = q[5],
    q6 = q[6];
  const q7 = q[7],
    q8 = q[8],
    q9 = q[9],
    q10 = q[10],
    q11 = q[11],
    q12 = q[12];
  const q13 = q[13],
    q14 = q[14],
    q15 = q[15],
    q16 = q[16],
    q17 = q[17];
  const q18 = q[18],
    q19 = q[19],
    q20 = q[20],
    q21 = q[21];
  const q22 = q[22],
    q23 = q[23],
    q24 = q[24],
    q25 = q[25],
    q26 = q[26],
    q27 = q[27];
  const saLo = SA_RANGE[0],
    saHi = SA_RANGE[1],
    tLo = T_RANGE[0],
    tHi = T_RANGE[1];
  for (let m = 0; m < n; m++) {
    const xs = Math.sqrt(sfac * SA[m] + offset),
      ys = CT[m] * 0.025;
    const r0 = q0 + xs * (q1 + xs * (q2 + xs * (q3 + xs * (q4 + xs * (q5 + xs * q6)))));
    const r1 = q7 + xs * (q8 + xs * (q9 + xs * (q10 + xs * (q11 + xs * q12))));
    const r2 = q13 + xs * (q14 + xs * (q15 + xs * (q16 + xs * q17)));
    const r3 = q18 + xs * (q19 + xs * (q20 + xs * q21));
    const r4 = q22 + xs * (q23 + xs * q24);
    const r5 = q25 + xs * q26;
    o[m] = 1 / (r0 + ys * (r1 + ys * (r2 + ys * (r3 + ys * (r4 + ys * (r5 + ys * q27)))))) - 1000;
  }
  // Out-of-range points to NaN in a second, branch-predictable pass: inside the kernel the test
  // doubled its cost. NaN inputs are NaN already.
  for (let m = 0; m < n; m++) {
    const sa = SA[m],
      ct = CT[m];
    if (sa < saLo || sa > saHi || ct < tLo || ct > tHi) o[m] = NaN;
  }
  return o;
}

/** σ0 over columns, kg/m³ (Roquet et al. 2015). */
export const sigma0_batch = (SA: Float64Array, CT: Float64Array, out?: Float64Array): Float64Array =>
  sigma_batch(SA, CT, 0, out);

/**
 * In-situ density over columns, kg/m³. SA g/kg, CT °C, p dbar (Roquet et al. 2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns in-situ density for each level, kg/m³
 */
export function rho_batch(SA: Float64Array, CT: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = checkLengths(SA, CT, p);
  const o = outFor(n, out);
  for (let m = 0; m < n; m++) o[m] = 1 / specvol(SA[m], CT[m], p[m]);
  return o;
}

/**
 * Specific volume over columns, m³/kg. SA g/kg, CT °C, p dbar (Roquet et al. 2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns specific volume for each level, m³/kg
 */
export function specvol_batch(SA: Float64Array, CT: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = checkLengths(SA, CT, p);
  const o = outFor(n, out);
  for (let m = 0; m < n; m++) o[m] = specvol(SA[m], CT[m], p[m]);
  return o;
}

/**
 * α over columns, 1/K (Roquet et al. 2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns thermal expansion coefficient for each level, 1/K
 */
export function alpha_batch(SA: Float64Array, CT: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = checkLengths(SA, CT, p);
  const o = outFor(n, out);
  for (let m = 0; m < n; m++) o[m] = alpha(SA[m], CT[m], p[m]);
  return o;
}

/**
 * β over columns, kg/g (Roquet et al. 2015).
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns saline contraction coefficient for each level, kg/g
 */
export function beta_batch(SA: Float64Array, CT: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = checkLengths(SA, CT, p);
  const o = outFor(n, out);
  for (let m = 0; m < n; m++) o[m] = beta(SA[m], CT[m], p[m]);
  return o;
}
