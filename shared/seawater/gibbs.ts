// The TEOS-10 Gibbs function of seawater, g(SA, t, p) in J/kg, as the sum of
//  - the pure-water part g_W: the polynomial of IAPWS SR7-09 (2009), "Supplementary Release on a
//    Computationally Efficient Thermodynamic Formulation for Liquid Water for Oceanographic Use"
//    (Feistel 2003), Table 2: g_W = Σ g_jk y^j z^k;
//  - the saline part g_S: IAPWS R13-08 (2008), "Release on the IAPWS Formulation 2008 for the
//    Thermodynamic Properties of Seawater" (Feistel 2008), Table 2:
//    g_S = Σ_jk [ g_1jk x² ln x + Σ_{i≥2} g_ijk x^i ] y^j z^k,
// with x² = SA·sfac, y = t/40 °C and z = p/10⁴ dbar (IOC et al. 2010, Appendix H and eq. 2.6.1).
//
// Every thermodynamic conversion here works at fixed SA and p and varies only t. So instead of
// evaluating the whole three-variable polynomial at every Newton step, `collapse` sums it over x
// and z once into the eight coefficients a_j of a polynomial in y alone; the steps then cost a
// few multiplications each. That is exact algebra, not an approximation.

import { sfac } from './density';

/** Celsius zero point, K. */
export const T0 = 273.15;
/** Scale of temperature in the Gibbs function: y = t/40 °C. */
export const tScale = 40;
/** Scale of sea pressure in the Gibbs function: z = p/10⁴ dbar (100 MPa). */
export const pScale = 1e4;

/** [j, k, g_jk] of the pure-water Gibbs polynomial, IAPWS SR7-09 Table 2 (J/kg). */
const PURE_WATER: ReadonlyArray<readonly [number, number, number]> = [
  [0, 0, 0.101342743139674e3],
  [0, 1, 0.100015695367145e6],
  [0, 2, -0.25445765420363e4],
  [0, 3, 0.284517778446287e3],
  [0, 4, -0.333146754253611e2],
  [0, 5, 0.420263108803084e1],
  [0, 6, -0.546428511471039],
  [1, 0, 0.590578347909402e1],
  [1, 1, -0.270983805184062e3],
  [1, 2, 0.776153611613101e3],
  [1, 3, -0.19651255088122e3],
  [1, 4, 0.289796526294175e2],
  [1, 5, -0.213290083518327e1],
  [2, 0, -0.12357785933039e5],
  [2, 1, 0.14550364540468e4],
  [2, 2, -0.756558385769359e3],
  [2, 3, 0.273479662323528e3],
  [2, 4, -0.555604063817218e2],
  [2, 5, 0.434420671917197e1],
  [3, 0, 0.736741204151612e3],
  [3, 1, -0.67250778314507e3],
  [3, 2, 0.499360390819152e3],
  [3, 3, -0.239545330654412e3],
  [3, 4, 0.488012518593872e2],
  [3, 5, -0.166307106208905e1],
  [4, 0, -0.148185936433658e3],
  [4, 1, 0.397968445406972e3],
  [4, 2, -0.301815380621876e3],
  [4, 3, 0.152196371733841e3],
  [4, 4, -0.263748377232802e2],
  [5, 0, 0.580259125842571e2],
  [5, 1, -0.194618310617595e3],
  [5, 2, 0.120520654902025e3],
  [5, 3, -0.552723052340152e2],
  [5, 4, 0.648190668077221e1],
  [6, 0, -0.189843846514172e2],
  [6, 1, 0.635113936641785e2],
  [6, 2, -0.222897317140459e2],
  [6, 3, 0.817060541818112e1],
  [7, 0, 0.305081646487967e1],
  [7, 1, -0.963108119393062e1],
];

/**
 * [i, j, k, g_ijk] of the saline Gibbs polynomial, IAPWS R13-08 Table 2 (J/kg). i = 1 stands for
 * the x² ln x term.
 */
const SALINE: ReadonlyArray<readonly [number, number, number, number]> = [
  [1, 0, 0, 0.581281456626732e4],
  [2, 0, 0, 0.141627648484197e4],
  [3, 0, 0, -0.243214662381794e4],
  [4, 0, 0, 0.202580115603697e4],
  [5, 0, 0, -0.109166841042967e4],
  [6, 0, 0, 0.37460123787784e3],
  [7, 0, 0, -0.485891069025409e2],
  [1, 1, 0, 0.851226734946706e3],
  [2, 1, 0, 0.168072408311545e3],
  [3, 1, 0, -0.493407510141682e3],
  [4, 1, 0, 0.543835333000098e3],
  [5, 1, 0, -0.196028306689776e3],
  [6, 1, 0, 0.367571622995805e2],
  [2, 2, 0, 0.880031352997204e3],
  [3, 2, 0, -0.430664675978042e2],
  [4, 2, 0, -0.685572509204491e2],
  [2, 3, 0, -0.225267649263401e3],
  [3, 3, 0, -0.100227370861875e2],
  [4, 3, 0, 0.493667694856254e2],
  [2, 4, 0, 0.914260447751259e2],
  [3, 4, 0, 0.875600661808945],
  [4, 4, 0, -0.171397577419788e2],
  [2, 5, 0, -0.216603240875311e2],
  [4, 5, 0, 0.249697009569508e1],
  [2, 6, 0, 0.213016970847183e1],
  [2, 0, 1, -0.331049154044839e4],
  [3, 0, 1, 0.199459603073901e3],
  [4, 0, 1, -0.547919133532887e2],
  [5, 0, 1, 0.360284195611086e2],
  [2, 1, 1, 0.729116529735046e3],
  [3, 1, 1, -0.175292041186547e3],
  [4, 1, 1, -0.226683558512829e2],
  [2, 2, 1, -0.860764303783977e3],
  [3, 2, 1, 0.383058066002476e3],
  [2, 3, 1, 0.694244814133268e3],
  [3, 3, 1, -0.460319931801257e3],
  [2, 4, 1, -0.297728741987187e3],
  [3, 4, 1, 0.234565187611355e3],
  [2, 0, 2, 0.384794152978599e3],
  [3, 0, 2, -0.522940909281335e2],
  [4, 0, 2, -0.408193978912261e1],
  [2, 1, 2, -0.343956902961561e3],
  [3, 1, 2, 0.831923927801819e2],
  [2, 2, 2, 0.337409530269367e3],
  [3, 2, 2, -0.541917262517112e2],
  [2, 3, 2, -0.204889641964903e3],
  [2, 4, 2, 0.74726141138756e2],
  [2, 0, 3, -0.965324320107458e2],
  [3, 0, 3, 0.680444942726459e2],
  [4, 0, 3, -0.301755111971161e2],
  [2, 1, 3, 0.124687671116248e3],
  [3, 1, 3, -0.29483064349429e2],
  [2, 2, 3, -0.178314556207638e3],
  [3, 2, 3, 0.256398487389914e2],
  [2, 3, 3, 0.113561697840594e3],
  [2, 4, 3, -0.364872919001588e2],
  [2, 0, 4, 0.158408172766824e2],
  [3, 0, 4, -0.341251932441282e1],
  [2, 1, 4, -0.31656964386073e2],
  [2, 2, 4, 0.442040358308e2],
  [2, 3, 4, -0.111282734326413e2],
  [2, 0, 5, -0.262480156590992e1],
  [2, 1, 5, 0.704658803315449e1],
  [2, 2, 5, -0.792001547211682e1],
];

/** Degree in y of the collapsed polynomial (both parts reach y^7 at most). */
export const Y_DEGREE = 7;

// The tables in flat typed arrays, the terms without pressure (k = 0) first, so that at the sea
// surface, where every potential temperature and CT is evaluated, `collapseFromTables` reads only those.
const byK =
  <T extends readonly number[]>(k: (r: T) => number) =>
  (r: T, s: T) =>
    k(r) - k(s);
const WATER = [...PURE_WATER].sort(byK((r) => r[1]));
const SALT = [...SALINE].sort(byK((r) => r[2]));
const W_J = Int32Array.from(WATER, (r) => r[0]);
const W_K = Int32Array.from(WATER, (r) => r[1]);
const W_G = Float64Array.from(WATER, (r) => r[2]);
const S_I = Int32Array.from(SALT, (r) => r[0]);
const S_J = Int32Array.from(SALT, (r) => r[1]);
const S_K = Int32Array.from(SALT, (r) => r[2]);
const S_G = Float64Array.from(SALT, (r) => r[3]);
const N_W = W_G.length;
const N_S = S_G.length;
const N_W_SURFACE = WATER.filter((r) => r[1] === 0).length;
const N_S_SURFACE = SALT.filter((r) => r[2] === 0).length;

// Scratch powers, reused by every call (the functions are synchronous and never re-entered).
const xPow = new Float64Array(8);
const zPow = new Float64Array(7);

/**
 * Sum the Gibbs function over salinity and pressure: fills a[0..7] so that
 * g(SA, t, p) = Σ_j a_j y^j with y = t/40, in J/kg. SA in g/kg (≥ 0), p in dbar.
 * Reads the tables term by term; `collapse` is the same sum in Horner form, for speed, and a
 * unit test holds the two equal.
 * Reference: IAPWS SR7-09 (2009) and IAPWS R13-08 (2008); IOC, SCOR & IAPSO (2010), Appendix H.
 * @param SA Absolute Salinity, g/kg
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param a output, written in place: the collapsed Gibbs coefficients in y = t/40 at (SA, p)
 * @returns nothing: the coefficients are written into a
 */
export function collapseFromTables(SA: number, p: number, a: Float64Array): void {
  const x2 = sfac * SA;
  const x = Math.sqrt(x2);
  const z = p / pScale;
  // xPow[1] holds the x² ln x term (its limit at SA = 0 is 0), xPow[i ≥ 2] holds x^i.
  xPow[1] = x > 0 ? 0.5 * x2 * Math.log(x2) : 0;
  xPow[2] = x2;
  for (let i = 3; i < 8; i++) xPow[i] = xPow[i - 1] * x;
  zPow[0] = 1;
  for (let k = 1; k < 7; k++) zPow[k] = zPow[k - 1] * z;
  for (let j = 0; j <= Y_DEGREE; j++) a[j] = 0;
  const nW = z === 0 ? N_W_SURFACE : N_W;
  const nS = z === 0 ? N_S_SURFACE : N_S;
  for (let n = 0; n < nW; n++) a[W_J[n]] += W_G[n] * zPow[W_K[n]];
  for (let n = 0; n < nS; n++) a[S_J[n]] += S_G[n] * xPow[S_I[n]] * zPow[S_K[n]];
}

/**
 * As `collapseFromTables`: a_j = Σ_k z^k (g_jk + g_1jk x² ln x + Σ_{i≥2} g_ijk x^i), with the
 * coefficients of the two tables written out (Horner form in x at the surface, sums of powers
 * at depth). The conversions call this once or twice per point: it is the hot path of CT_from_t.
 * Reference: IAPWS SR7-09 (2009) and IAPWS R13-08 (2008); IOC, SCOR & IAPSO (2010), Appendix H.
 * @param SA Absolute Salinity, g/kg
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param a output, written in place: the collapsed Gibbs coefficients in y = t/40 at (SA, p)
 * @returns nothing: the coefficients are written into a
 */
export function collapse(SA: number, p: number, a: Float64Array): void {
  const x2 = sfac * SA;
  const x = Math.sqrt(x2);
  fill(x2, x, x > 0 ? 0.5 * x2 * Math.log(x2) : 0, p / pScale, a, true);
}

/**
 * `collapse` at two pressures of one parcel (in-situ p into `a`, reference p_ref into `b`),
 * sharing the square root and the logarithm of salinity. The conversions need only the
 * derivatives ∂g/∂y and ∂²g/∂y² at the in-situ pressure, so there a[0] (g's part free of y)
 * is not summed and is left NaN; at the reference pressure everything is.
 * Reference: IAPWS SR7-09 (2009) and IAPWS R13-08 (2008); IOC, SCOR & IAPSO (2010), Appendix H.
 * @param SA Absolute Salinity, g/kg
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param p_ref reference pressure, dbar
 * @param a output, written in place: the collapsed coefficients at p
 * @param b output, written in place: the collapsed coefficients at p_ref
 * @returns nothing: the coefficients are written into a and b
 */
export function collapsePair(SA: number, p: number, p_ref: number, a: Float64Array, b: Float64Array): void {
  const x2 = sfac * SA;
  const x = Math.sqrt(x2);
  const lx = x > 0 ? 0.5 * x2 * Math.log(x2) : 0;
  fill(x2, x, lx, p / pScale, a, false);
  fill(x2, x, lx, p_ref / pScale, b, true);
}

/** The sums proper: x2 = x², lx = x² ln x, z = p/10⁴ dbar; `withG0` false skips a[0] away from the surface. */
function fill(x2: number, x: number, lx: number, z: number, a: Float64Array, withG0 = true): void {
  if (z === 0) {
    a[0] =
      101.342743139674 +
      5812.81456626732 * lx +
      x2 *
        (1416.27648484197 +
          x *
            (-2432.14662381794 +
              x * (2025.80115603697 + x * (-1091.66841042967 + x * (374.60123787784 + x * -48.5891069025409)))));
    a[1] =
      5.90578347909402 +
      851.226734946706 * lx +
      x2 *
        (168.072408311545 +
          x * (-493.407510141682 + x * (543.835333000098 + x * (-196.028306689776 + x * 36.7571622995805))));
    a[2] = -12357.785933039 + x2 * (880.031352997204 + x * (-43.0664675978042 + x * -68.5572509204491));
    a[3] = 736.741204151612 + x2 * (-225.267649263401 + x * (-10.0227370861875 + x * 49.3667694856254));
    a[4] = -148.185936433658 + x2 * (91.4260447751259 + x * (0.875600661808945 + x * -17.1397577419788));
    a[5] = 58.0259125842571 + x2 * (-21.6603240875311 + x * (x * 2.49697009569508));
    a[6] = -18.9843846514172 + x2 * 2.13016970847183;
    a[7] = 3.05081646487967;
    return;
  }
  // Powers written out rather than nested: the eight sums are independent, which lets the
  // processor overlap them (nested Horner form would be one long chain of dependent steps).
  const x3 = x2 * x,
    x4 = x2 * x2,
    x5 = x4 * x,
    x6 = x4 * x2,
    x7 = x6 * x;
  const z2 = z * z,
    z3 = z2 * z,
    z4 = z2 * z2,
    z5 = z4 * z,
    z6 = z4 * z2;
  a[0] = !withG0
    ? NaN
    : 101.342743139674 +
      5812.81456626732 * lx +
      1416.27648484197 * x2 -
      2432.14662381794 * x3 +
      2025.80115603697 * x4 -
      1091.66841042967 * x5 +
      374.60123787784 * x6 -
      48.5891069025409 * x7 +
      z *
        (100015.695367145 -
          3310.49154044839 * x2 +
          199.459603073901 * x3 -
          54.7919133532887 * x4 +
          36.0284195611086 * x5) +
      z2 * (-2544.5765420363 + 384.794152978599 * x2 - 52.2940909281335 * x3 - 4.08193978912261 * x4) +
      z3 * (284.517778446287 - 96.5324320107458 * x2 + 68.0444942726459 * x3 - 30.1755111971161 * x4) +
      z4 * (-33.3146754253611 + 15.8408172766824 * x2 - 3.41251932441282 * x3) +
      z5 * (4.20263108803084 - 2.62480156590992 * x2) +
      z6 * -0.546428511471039;
  a[1] =
    5.90578347909402 +
    851.226734946706 * lx +
    168.072408311545 * x2 -
    493.407510141682 * x3 +
    543.835333000098 * x4 -
    196.028306689776 * x5 +
    36.7571622995805 * x6 +
    z * (-270.983805184062 + 729.116529735046 * x2 - 175.292041186547 * x3 - 22.6683558512829 * x4) +
    z2 * (776.153611613101 - 343.956902961561 * x2 + 83.1923927801819 * x3) +
    z3 * (-196.51255088122 + 124.687671116248 * x2 - 29.483064349429 * x3) +
    z4 * (28.9796526294175 - 31.656964386073 * x2) +
    z5 * (-2.13290083518327 + 7.04658803315449 * x2);
  a[2] =
    -12357.785933039 +
    880.031352997204 * x2 -
    43.0664675978042 * x3 -
    68.5572509204491 * x4 +
    z * (1455.0364540468 - 860.764303783977 * x2 + 383.058066002476 * x3) +
    z2 * (-756.558385769359 + 337.409530269367 * x2 - 54.1917262517112 * x3) +
    z3 * (273.479662323528 - 178.314556207638 * x2 + 25.6398487389914 * x3) +
    z4 * (-55.5604063817218 + 44.2040358308 * x2) +
    z5 * (4.34420671917197 - 7.92001547211682 * x2);
  a[3] =
    736.741204151612 -
    225.267649263401 * x2 -
    10.0227370861875 * x3 +
    49.3667694856254 * x4 +
    z * (-672.50778314507 + 694.244814133268 * x2 - 460.319931801257 * x3) +
    z2 * (499.360390819152 - 204.889641964903 * x2) +
    z3 * (-239.545330654412 + 113.561697840594 * x2) +
    z4 * (48.8012518593872 - 11.1282734326413 * x2) +
    z5 * -1.66307106208905;
  a[4] =
    -148.185936433658 +
    91.4260447751259 * x2 +
    0.875600661808945 * x3 -
    17.1397577419788 * x4 +
    z * (397.968445406972 - 297.728741987187 * x2 + 234.565187611355 * x3) +
    z2 * (-301.815380621876 + 74.726141138756 * x2) +
    z3 * (152.196371733841 - 36.4872919001588 * x2) +
    z4 * -26.3748377232802;
  a[5] =
    58.0259125842571 -
    21.6603240875311 * x2 +
    2.49697009569508 * x4 +
    z * -194.618310617595 +
    z2 * 120.520654902025 +
    z3 * -55.2723052340152 +
    z4 * 6.48190668077221;
  a[6] =
    -18.9843846514172 + 2.13016970847183 * x2 + z * 63.5113936641785 + z2 * -22.2897317140459 + z3 * 8.17060541818112;
  a[7] = 3.05081646487967 + z * -9.63108119393062;
}
