// The 1980 International Equation of State of Seawater (EOS-80) and the EOS-80 potential
// temperature, as given in UNESCO (1983), "Algorithms for computation of fundamental properties
// of seawater", Unesco Technical Papers in Marine Science 44 (Fofonoff & Millard): the
// one-atmosphere density of Millero & Poisson (1981), the secant bulk modulus of Millero et al.
// (1980), the adiabatic lapse rate of Bryden (1973) and Fofonoff's (1977) Runge–Kutta integral
// for potential temperature. For comparing with legacy σθ tables only: everything else in
// Sigmaline uses TEOS-10.
//
// EOS-80's own variables are Practical Salinity SP, IPTS-68 temperature and pressure in bars;
// the public functions take t in ITS-90 °C and p in dbar and convert (t68 = 1.00024·t90).

import { t68_from_t90, t90_from_t68 } from './pss78';
import { checkRange } from './ranges';

/** Density of SMOW pure water at one atmosphere, kg/m³, t68 in °C (UNESCO 1983). */
function rho_water(t: number): number {
  return 999.842594 + t * (6.793952e-2 + t * (-9.09529e-3 + t * (1.001685e-4 + t * (-1.120083e-6 + t * 6.536332e-9))));
}

/** One-atmosphere density ρ(S, t, 0), kg/m³ (Millero & Poisson 1981 in UNESCO 1983); t68 °C. */
function rho_surface(S: number, t: number): number {
  const s15 = S * Math.sqrt(S);
  const a = 0.824493 + t * (-4.0899e-3 + t * (7.6438e-5 + t * (-8.2467e-7 + t * 5.3875e-9)));
  const b = -5.72466e-3 + t * (1.0227e-4 - 1.6546e-6 * t);
  return rho_water(t) + a * S + b * s15 + 4.8314e-4 * S * S;
}

/**
 * Secant bulk modulus K(S, t68, p), bar, with p in dbar (UNESCO 1983, after Millero, Chen,
 * Bradshaw & Schleicher 1980): K = K(S, t, 0) + A·P + B·P² with P in bar.
 * @param S salinity on the Practical Salinity Scale (PSS-78), unitless
 * @param t68 in-situ temperature (IPTS-68), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns secant bulk modulus K(S, t68, p), bar
 */
export function secant_bulk_modulus_eos80(S: number, t68: number, p: number): number {
  const t = t68;
  const P = p / 10;
  const s15 = S * Math.sqrt(S);
  const Kw = 19652.21 + t * (148.4206 + t * (-2.327105 + t * (1.360477e-2 - 5.155288e-5 * t)));
  const Aw = 3.239908 + t * (1.43713e-3 + t * (1.16092e-4 - 5.77905e-7 * t));
  const Bw = 8.50935e-5 + t * (-6.12293e-6 + 5.2787e-8 * t);
  const K0 =
    Kw +
    S * (54.6746 + t * (-0.603459 + t * (1.09987e-2 - 6.167e-5 * t))) +
    s15 * (7.944e-2 + t * (1.6483e-2 - 5.3009e-4 * t));
  const A = Aw + S * (2.2838e-3 + t * (-1.0981e-5 - 1.6078e-6 * t)) + 1.91075e-4 * s15;
  const B = Bw + S * (-9.9348e-7 + t * (2.0816e-8 + 9.1697e-10 * t));
  return K0 + P * (A + P * B);
}

/**
 * EOS-80 in-situ density in its own variables: SP, t68 °C, p dbar → kg/m³ (UNESCO 1983).
 * @param S salinity on the Practical Salinity Scale (PSS-78), unitless
 * @param t68 in-situ temperature (IPTS-68), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns in-situ density (EOS-80), kg/m³
 */
export function rho_eos80_t68(S: number, t68: number, p: number): number {
  return rho_surface(S, t68) / (1 - p / 10 / secant_bulk_modulus_eos80(S, t68, p));
}

/**
 * Adiabatic lapse rate Γ(S, t68, p), °C/dbar (Bryden 1973, as given in UNESCO 1983); p in dbar.
 * @param S salinity on the Practical Salinity Scale (PSS-78), unitless
 * @param t68 in-situ temperature (IPTS-68), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns adiabatic lapse rate, °C/dbar
 */
export function adiabatic_lapse_rate_eos80(S: number, t68: number, p: number): number {
  const t = t68;
  const ds = S - 35;
  return (
    3.5803e-5 +
    t * (8.5258e-6 + t * (-6.836e-8 + t * 6.6228e-10)) +
    (1.8932e-6 - 4.2393e-8 * t) * ds +
    (1.8741e-8 + t * (-6.7795e-10 + t * (8.733e-12 - 5.4481e-14 * t)) + (-1.1351e-10 + 2.7759e-12 * t) * ds) * p +
    (-4.6206e-13 + t * (1.8676e-14 - 2.1687e-16 * t)) * p * p
  );
}

/**
 * EOS-80 potential temperature in its own variables: the fourth-order Runge–Kutta integral of
 * the lapse rate from p to p_ref (Fofonoff 1977, as given in UNESCO 1983). SP, t68 °C, dbar.
 * @param S salinity on the Practical Salinity Scale (PSS-78), unitless
 * @param t68 in-situ temperature (IPTS-68), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param p_ref reference pressure, dbar
 * @returns potential temperature (EOS-80, IPTS-68), °C
 */
export function pt_eos80_t68(S: number, t68: number, p: number, p_ref: number): number {
  const h = p_ref - p;
  let xk = h * adiabatic_lapse_rate_eos80(S, t68, p);
  let t = t68 + 0.5 * xk;
  let q = xk;
  let pp = p + 0.5 * h;
  xk = h * adiabatic_lapse_rate_eos80(S, t, pp);
  t += 0.29289322 * (xk - q);
  q = 0.58578644 * xk + 0.121320344 * q;
  xk = h * adiabatic_lapse_rate_eos80(S, t, pp);
  t += 1.707106781 * (xk - q);
  q = 3.414213562 * xk - 4.121320344 * q;
  pp += 0.5 * h;
  xk = h * adiabatic_lapse_rate_eos80(S, t, pp);
  return t + (xk - 2 * q) / 6;
}

function usable(SP: number, t: number, p: number): boolean {
  return checkRange({ SP, t, p }) === null;
}

/**
 * EOS-80 in-situ density rho_eos80(SP, t, p): SP unitless, t ITS-90 °C, p dbar → kg/m³.
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44 (Fofonoff & Millard).
 * @param SP Practical Salinity (PSS-78), unitless
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns in-situ density (EOS-80), kg/m³
 */
export function rho_eos80(SP: number, t: number, p: number): number {
  if (!usable(SP, t, p)) return NaN;
  return rho_eos80_t68(SP, t68_from_t90(t), p);
}

/**
 * EOS-80 potential temperature pt_eos80(SP, t, p, p_ref), ITS-90 °C (t ITS-90 °C, p and p_ref dbar).
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44 (Fofonoff & Millard).
 * @param SP Practical Salinity (PSS-78), unitless
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param p_ref reference pressure, dbar
 * @returns potential temperature (EOS-80), °C ITS-90
 */
export function pt_eos80(SP: number, t: number, p: number, p_ref: number): number {
  if (!usable(SP, t, p) || !usable(SP, t, p_ref)) return NaN;
  return t90_from_t68(pt_eos80_t68(SP, t68_from_t90(t), p, p_ref));
}

/**
 * EOS-80 potential density anomaly σθ = ρ(SP, θ, 0) − 1000 kg/m³ with θ referenced to 0 dbar
 * (UNESCO 1983): SP unitless, t ITS-90 °C, p dbar. The legacy "sigma-theta" of older tables.
 * @param SP Practical Salinity (PSS-78), unitless
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns potential density anomaly σθ (EOS-80), kg/m³
 */
export function sigma_theta_eos80(SP: number, t: number, p: number): number {
  if (!usable(SP, t, p)) return NaN;
  return rho_surface(SP, pt_eos80_t68(SP, t68_from_t90(t), p, 0)) - 1000;
}

/**
 * sigma_theta_eos80 over columns → kg/m³. Allocates only the output.
 * Reference: UNESCO (1983), Unesco Technical Papers in Marine Science 44 (Fofonoff & Millard).
 * @param SP Practical Salinity (PSS-78), unitless
 * @param t in-situ temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param out optional output column of the same length (allocated when absent)
 * @returns σθ (EOS-80) for each level, kg/m³
 */
export function sigma_theta_eos80_batch(
  SP: Float64Array,
  t: Float64Array,
  p: Float64Array,
  out?: Float64Array,
): Float64Array {
  const n = SP.length;
  if (t.length !== n || p.length !== n) throw new RangeError('sigma_theta_eos80_batch: input columns differ in length');
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) o[i] = sigma_theta_eos80(SP[i], t[i], p[i]);
  return o;
}
