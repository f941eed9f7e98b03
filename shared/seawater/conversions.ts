// Potential temperature and Conservative Temperature from the TEOS-10 Gibbs function
// (IOC, SCOR & IAPSO 2010, Manual and Guides 56, §3.1 and §3.3; McDougall 2003, "Potential
// enthalpy: a conservative oceanic variable for evaluating heat content and heat fluxes", JPO 33).
//
// Units throughout: SA in g/kg, t / pt / CT in °C (ITS-90), p and p_ref in dbar (sea pressure).
// Outside the range of `ranges.ts` every function returns NaN (`checkRange` says why).

import { cp0 } from './density';
import { T0, tScale, collapse, collapsePair } from './gibbs';
import { inRange } from './ranges';

// Collapsed Gibbs polynomials in y = t/40: at the in-situ pressure and at the reference pressure.
const aInSitu = new Float64Array(8);
const aRef = new Float64Array(8);

const MAX_ITERATIONS = 12;
/**
 * Newton stops after a step in y = t/40 smaller than this (4·10⁻⁵ °C). Convergence is quadratic
 * with |∂³g/∂y³ / 2∂²g/∂y²| ≈ 0.08, so the error left after such a step is below 10⁻¹³ in y
 * (4·10⁻¹² °C), without paying for one more confirming step.
 */
const Y_TOLERANCE = 1e-6;

/**
 * A starting value for Newton's method, not a result: t − pt0 ≈ P·(…) with P = p/10⁴, T = t/40,
 * S = SA/40 − 0.875, a least-squares fit made for Sigmaline to its own converged pt0_from_t over
 * SA 0–42 g/kg, t −2–40 °C, p 0–10 000 dbar (largest error 0.06 °C). From there two Newton
 * steps reach the tolerance above where t itself as the start needs three.
 */
function pt0Guess(SA: number, t: number, p: number): number {
  const P = p * 1e-4,
    T = t / tScale,
    S = SA / tScale - 0.875;
  const drop =
    P * (0.3570249 + T * (3.3995953 + T * (-0.93233475 + 0.20916172 * T)) + S * (0.71230912 - 0.49400274 * T)) +
    P * P * (0.8212842 + T * (-1.08046095 + 0.35992254 * T) - 0.07870827 * P - 0.12634066 * S);
  return t - drop;
}

// The collapsed polynomial in y and its first two derivatives.

/** ∂g/∂y = Σ j a_j y^(j−1), J/kg (∂g/∂t = ∂g/∂y / 40). Grouped in powers of y² (Estrin's
 * scheme) so that the Newton loop waits on a shorter chain of multiplications. */
function gyAt(a: Float64Array, y: number): number {
  const y2 = y * y;
  return a[1] + 2 * a[2] * y + y2 * (3 * a[3] + 4 * a[4] * y + y2 * (5 * a[5] + 6 * a[6] * y + y2 * 7 * a[7]));
}

/** ∂²g/∂y² = Σ j(j−1) a_j y^(j−2), J/kg (∂²g/∂t² = ∂²g/∂y² / 1600), grouped as `gyAt`. */
function gyyAt(a: Float64Array, y: number): number {
  const y2 = y * y;
  return 2 * a[2] + 6 * a[3] * y + y2 * (12 * a[4] + 20 * a[5] * y + y2 * (30 * a[6] + 42 * a[7] * y));
}

/**
 * Solve ∂g/∂y (a, y) = target for y by Newton's method, starting at y0. With ∂g/∂y = −40·η
 * this finds the temperature of the given entropy η at the pressure `a` was collapsed at.
 */
function yOfEntropy(a: Float64Array, target: number, y0: number): number {
  // ∂g/∂y and ∂²g/∂y² share their powers of y: evaluated together, from the coefficients read once.
  const a1 = a[1],
    a2 = a[2],
    a3 = a[3],
    a4 = a[4],
    a5 = a[5],
    a6 = a[6],
    a7 = a[7];
  const b1 = 2 * a2,
    b2 = 3 * a3,
    b3 = 4 * a4,
    b4 = 5 * a5,
    b5 = 6 * a6,
    b6 = 7 * a7;
  const c0 = 2 * a2,
    c1 = 6 * a3,
    c2 = 12 * a4,
    c3 = 20 * a5,
    c4 = 30 * a6,
    c5 = 42 * a7;
  let y = y0;
  for (let n = 0; n < MAX_ITERATIONS; n++) {
    const y2 = y * y;
    const gy = a1 + b1 * y + y2 * (b2 + b3 * y + y2 * (b4 + b5 * y + y2 * b6));
    const gyy = c0 + c1 * y + y2 * (c2 + c3 * y + y2 * (c4 + c5 * y));
    const step = (gy - target) / gyy;
    y -= step;
    if (Math.abs(step) < Y_TOLERANCE) break;
  }
  return y;
}

/** Potential enthalpy h0 = g − (T0 + t)·∂g/∂t at the collapsed pressure (0 dbar), J/kg. */
function enthalpyAt(a: Float64Array, y: number): number {
  // g and ∂g/∂y in one pass over the coefficients (the same sums as gAt and gyAt).
  const a0 = a[0],
    a1 = a[1],
    a2 = a[2],
    a3 = a[3],
    a4 = a[4],
    a5 = a[5],
    a6 = a[6],
    a7 = a[7];
  const y2 = y * y;
  const g = a0 + a1 * y + y2 * (a2 + a3 * y + y2 * (a4 + a5 * y + y2 * (a6 + a7 * y)));
  const gy = a1 + 2 * a2 * y + y2 * (3 * a3 + 4 * a4 * y + y2 * (5 * a5 + 6 * a6 * y + y2 * 7 * a7));
  return g - ((T0 + tScale * y) * gy) / tScale;
}

/**
 * Potential temperature pt_from_t(SA, t, p, p_ref), °C: the temperature a parcel of (SA, t, p)
 * has when moved without exchange of heat or salt to p_ref, i.e. the solution of
 * η(SA, pt, p_ref) = η(SA, t, p) with entropy η = −∂g/∂T (IOC et al. 2010, eq. 3.1.3).
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param p_ref reference pressure, dbar
 * @returns potential temperature referenced to p_ref (ITS-90), °C; NaN outside the range
 */
export function pt_from_t(SA: number, t: number, p: number, p_ref: number): number {
  if (!inRange(SA, t, p) || !inRange(SA, t, p_ref)) return NaN;
  collapsePair(SA, p, p_ref, aInSitu, aRef);
  const y = t / tScale;
  return tScale * yOfEntropy(aRef, gyAt(aInSitu, y), y);
}

/**
 * Potential temperature referenced to the sea surface, pt_from_t(SA, t, p, 0), °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns potential temperature referenced to 0 dbar (ITS-90), °C
 */
export function pt0_from_t(SA: number, t: number, p: number): number {
  if (!inRange(SA, t, p)) return NaN;
  collapsePair(SA, p, 0, aInSitu, aRef);
  const y = t / tScale;
  return tScale * yOfEntropy(aRef, gyAt(aInSitu, y), pt0Guess(SA, t, p) / tScale);
}

/**
 * Conservative Temperature CT_from_pt(SA, pt), °C: potential enthalpy at 0 dbar divided by
 * cp0 = 3991.86795711963 J/(kg K) (McDougall 2003; IOC et al. 2010, eq. 3.3.1).
 * @param SA Absolute Salinity, g/kg
 * @param pt potential temperature referenced to 0 dbar (ITS-90), °C
 * @returns Conservative Temperature (ITS-90), °C
 */
export function CT_from_pt(SA: number, pt: number): number {
  if (!inRange(SA, pt, 0)) return NaN;
  collapse(SA, 0, aRef);
  return enthalpyAt(aRef, pt / tScale) / cp0;
}

/**
 * Conservative Temperature CT_from_t(SA, t, p), °C: CT_from_pt(SA, pt0_from_t(SA, t, p)).
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns Conservative Temperature (ITS-90), °C
 */
export function CT_from_t(SA: number, t: number, p: number): number {
  if (!inRange(SA, t, p)) return NaN;
  collapsePair(SA, p, 0, aInSitu, aRef);
  const y = t / tScale;
  const y0 = yOfEntropy(aRef, gyAt(aInSitu, y), pt0Guess(SA, t, p) / tScale);
  return enthalpyAt(aRef, y0) / cp0;
}

/**
 * pt0_from_t and CT_from_t of one parcel from one Newton solve (the same sums as the two
 * functions above, which each solve for pt0): pair[0] = pt0 °C, pair[1] = CT °C; NaN outside the
 * range. SA g/kg, t °C (ITS-90), p dbar.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param pair output, written in place: [pt0 °C, CT °C]
 * @returns nothing: pt0 and CT are written into pair
 */
export function pt0_CT_from_t(SA: number, t: number, p: number, pair: Float64Array): void {
  if (!inRange(SA, t, p)) {
    pair[0] = NaN;
    pair[1] = NaN;
    return;
  }
  collapsePair(SA, p, 0, aInSitu, aRef);
  const y = t / tScale;
  const y0 = yOfEntropy(aRef, gyAt(aInSitu, y), pt0Guess(SA, t, p) / tScale);
  pair[0] = tScale * y0;
  pair[1] = enthalpyAt(aRef, y0) / cp0;
}

/** Solve h0(SA, pt) = cp0·CT for y = pt/40 with `aRef` collapsed at 0 dbar. */
function yOfCT(CT: number): number {
  const target = cp0 * CT;
  let y = CT / tScale;
  for (let n = 0; n < MAX_ITERATIONS; n++) {
    // dh0/dy = −(T0 + t)·∂²g/∂y² / 40.
    const slope = (-(T0 + tScale * y) * gyyAt(aRef, y)) / tScale;
    const step = (enthalpyAt(aRef, y) - target) / slope;
    y -= step;
    if (Math.abs(step) < Y_TOLERANCE) break;
  }
  return y;
}

/**
 * Potential temperature (ref. 0 dbar) of a given Conservative Temperature, pt_from_CT(SA, CT), °C:
 * the inverse of CT_from_pt, by Newton's method on potential enthalpy.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @returns potential temperature referenced to 0 dbar (ITS-90), °C
 */
export function pt_from_CT(SA: number, CT: number): number {
  if (!inRange(SA, CT, 0)) return NaN;
  collapse(SA, 0, aRef);
  return tScale * yOfCT(CT);
}

/**
 * In-situ temperature t_from_CT(SA, CT, p), °C: the inverse of CT_from_t, via pt_from_CT and then
 * the potential temperature of that parcel brought from 0 dbar to p.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns in-situ temperature (ITS-90), °C
 */
export function t_from_CT(SA: number, CT: number, p: number): number {
  if (!inRange(SA, CT, p)) return NaN;
  collapse(SA, 0, aRef);
  const y0 = yOfCT(CT);
  collapse(SA, p, aInSitu);
  // In reverse, the parcel warms on the way down by about what pt0Guess takes off.
  const pt = tScale * y0;
  return tScale * yOfEntropy(aInSitu, gyAt(aRef, y0), (2 * pt - pt0Guess(SA, pt, p)) / tScale);
}

// Batch forms over a cast's columns (Float64Array in, Float64Array out). They allocate the output
// when `out` is not given and nothing per point; NaN marks a point outside the range.

function sameLength(name: string, ...columns: ArrayLike<number>[]): number {
  const n = columns[0].length;
  for (const c of columns) {
    if (c.length !== n) throw new RangeError(`${name}: input columns differ in length`);
  }
  return n;
}

/**
 * pt0_from_t over columns: SA g/kg, t °C, p dbar → pt °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns potential temperature referenced to 0 dbar for each level, °C
 */
export function pt0_from_t_batch(SA: Float64Array, t: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = sameLength('pt0_from_t_batch', SA, t, p);
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = pt0_from_t(SA[i], t[i], p[i]);
  return o;
}

/**
 * pt_from_t over columns to one reference pressure p_ref (dbar) → pt °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param p_ref reference pressure, dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns potential temperature referenced to p_ref for each level, °C
 */
export function pt_from_t_batch(
  SA: Float64Array,
  t: Float64Array,
  p: Float64Array,
  p_ref: number,
  out?: Float64Array,
): Float64Array {
  const n = sameLength('pt_from_t_batch', SA, t, p);
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = pt_from_t(SA[i], t[i], p[i], p_ref);
  return o;
}

/**
 * CT_from_pt over columns: SA g/kg, pt °C → CT °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param pt potential temperature referenced to 0 dbar (ITS-90), °C
 * @param out optional output column of the same length (allocated when absent)
 * @returns Conservative Temperature for each level, °C
 */
export function CT_from_pt_batch(SA: Float64Array, pt: Float64Array, out?: Float64Array): Float64Array {
  const n = sameLength('CT_from_pt_batch', SA, pt);
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = CT_from_pt(SA[i], pt[i]);
  return o;
}

/**
 * CT_from_t over columns: SA g/kg, t °C, p dbar → CT °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns Conservative Temperature for each level, °C
 */
export function CT_from_t_batch(SA: Float64Array, t: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = sameLength('CT_from_t_batch', SA, t, p);
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = CT_from_t(SA[i], t[i], p[i]);
  return o;
}

/**
 * pt_from_CT over columns: SA g/kg, CT °C → pt °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param out optional output column of the same length (allocated when absent)
 * @returns potential temperature referenced to 0 dbar for each level, °C
 */
export function pt_from_CT_batch(SA: Float64Array, CT: Float64Array, out?: Float64Array): Float64Array {
  const n = sameLength('pt_from_CT_batch', SA, CT);
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = pt_from_CT(SA[i], CT[i]);
  return o;
}

/**
 * t_from_CT over columns: SA g/kg, CT °C, p dbar → t °C.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual, §3.1 and §3.3; McDougall (2003), J. Phys. Oceanogr. 33.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns in-situ temperature for each level, °C
 */
export function t_from_CT_batch(SA: Float64Array, CT: Float64Array, p: Float64Array, out?: Float64Array): Float64Array {
  const n = sameLength('t_from_CT_batch', SA, CT, p);
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = t_from_CT(SA[i], CT[i], p[i]);
  return o;
}
