/**
 * Height and pressure, and gravity by latitude, as TEOS-10 defines them (IOC, SCOR & IAPSO 2010,
 * Manuals and Guides 56, and McDougall & Barker 2011, the GSW Toolbox guide): the geopotential
 * is matched to the dynamic enthalpy of the standard ocean (SSO, CT = 0 °C) from the
 * Roquet et al. (2015) polynomial, with gravity that grows downward as g = gs(φ)(1 − γ z).
 *
 * Units: p sea pressure dbar, z height m (negative below the sea surface), lat degrees north.
 */
import { db2Pa, enthalpy_SSO_0, specvol_SSO_0 } from './density';
import { P_RANGE, LAT_RANGE } from './ranges';

const usable = (p: number, lat: number): boolean =>
  p >= P_RANGE[0] && p <= P_RANGE[1] && lat >= LAT_RANGE[0] && lat <= LAT_RANGE[1];

/** Vertical gradient of gravity, 1/m (TEOS-10, after Moritz 2000: 2.26e-7 per metre of depth). */
const GAMMA = 2.26e-7;
const DEG2RAD = Math.PI / 180;

/**
 * Gravity at the sea surface, m/s², by latitude in degrees (Geodetic Reference System 1980,
 * Moritz 2000, as used by TEOS-10): 9.780327 (1 + 5.2792e-3 sin²φ + 2.32e-5 sin⁴φ).
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual; McDougall & Barker (2011), GSW Toolbox guide.
 * @param lat latitude, degrees north
 * @returns gravitational acceleration at the sea surface, m/s²
 */
export function grav_surface(lat: number): number {
  const s = Math.sin(lat * DEG2RAD);
  const sin2 = s * s;
  return 9.780327 * (1 + (5.2792e-3 + 2.32e-5 * sin2) * sin2);
}

/**
 * Height z (m, negative in the ocean) from sea pressure p (dbar) at latitude lat (degrees),
 * TEOS-10: solves gs(z − γz²/2) = −(h̃_SSO,0(p) − geo_strf_dyn_height − sea_surface_geopotential)
 * for z. The optional dynamic height anomaly (m²/s²) and sea-surface geopotential (m²/s²) follow
 * the TEOS-10 definition; they default to 0.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual; McDougall & Barker (2011), GSW Toolbox guide.
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lat latitude, degrees north
 * @param geo_strf_dyn_height dynamic height anomaly, m²/s² (0 unless given)
 * @param sea_surface_geopotential geopotential at zero sea pressure, m²/s² (0 unless given)
 * @returns height, m (negative below the sea surface)
 */
export function z_from_p(p: number, lat: number, geo_strf_dyn_height = 0, sea_surface_geopotential = 0): number {
  if (!usable(p, lat)) return NaN;
  const B = grav_surface(lat);
  const A = -0.5 * GAMMA * B;
  const C = enthalpy_SSO_0(p) - geo_strf_dyn_height - sea_surface_geopotential;
  // Root of A z² + B z + C = 0 written so that it does not cancel near the surface.
  return (-2 * C) / (B + Math.sqrt(B * B - 4 * A * C));
}

/**
 * Sea pressure p (dbar) from height z (m, negative in the ocean) at latitude lat (degrees):
 * the inverse of z_from_p. First guess from Saunders (1981, J. Phys. Oceanogr. 11, 573–574),
 * then Newton steps on f(p) = h̃_SSO,0(p) + gs(z − γz²/2) − Φ with ∂f/∂p = 10⁴·v_SSO,0(p),
 * iterated until the step is below 1e-12 dbar (TEOS-10 stops after one and a half steps; going
 * on to convergence keeps p_from_z(z_from_p(p)) = p to rounding).
 * @param z height, m (negative below the sea surface)
 * @param lat latitude, degrees north
 * @param geo_strf_dyn_height dynamic height anomaly, m²/s² (0 unless given)
 * @param sea_surface_geopotential geopotential at zero sea pressure, m²/s² (0 unless given)
 * @returns sea pressure, dbar
 */
export function p_from_z(z: number, lat: number, geo_strf_dyn_height = 0, sea_surface_geopotential = 0): number {
  if (!(z <= 5 && z >= -10100) || !(lat >= -90 && lat <= 90)) return NaN; // the pressure box of ranges.ts, in metres
  const s = Math.sin(lat * DEG2RAD);
  const sin2 = s * s;
  const gs = grav_surface(lat);
  const c1 = 5.25e-3 * sin2 + 5.92e-3;
  let p = (-2 * z) / (1 - c1 + Math.sqrt((1 - c1) * (1 - c1) + 8.84e-6 * z));
  const target = gs * (z - 0.5 * GAMMA * z * z) - (geo_strf_dyn_height + sea_surface_geopotential);
  for (let it = 0; it < 8; it++) {
    const f = enthalpy_SSO_0(p) + target;
    const step = f / (db2Pa * specvol_SSO_0(p));
    p -= step;
    if (Math.abs(step) < 1e-12) break;
  }
  return p;
}

/**
 * Gravitational acceleration, m/s², at latitude lat (degrees) and sea pressure p (dbar):
 * g = gs(φ)(1 − γ z(p, φ)) (TEOS-10; Moritz 2000 surface gravity).
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual; McDougall & Barker (2011), GSW Toolbox guide.
 * @param lat latitude, degrees north
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns gravitational acceleration at latitude and pressure, m/s²
 */
export function grav(lat: number, p: number): number {
  return grav_surface(lat) * (1 - GAMMA * z_from_p(p, lat));
}

/**
 * Depth below the sea surface, m (positive down), from height z m.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual; McDougall & Barker (2011), GSW Toolbox guide.
 * @param z height, m (negative below the sea surface)
 * @returns depth, m (positive downward)
 */
export function depth_from_z(z: number): number {
  return -z;
}

/**
 * Height z over a column of pressures, one latitude, m.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual; McDougall & Barker (2011), GSW Toolbox guide.
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lat latitude, degrees north
 * @param out optional output column of the same length (allocated when absent)
 * @returns height for each level, m
 */
export function z_from_p_batch(p: Float64Array, lat: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(p.length);
  for (let i = 0; i < p.length; i++) o[i] = z_from_p(p[i], lat);
  return o;
}

/**
 * Depth (m, positive down) over a column of pressures, one latitude.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual; McDougall & Barker (2011), GSW Toolbox guide.
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lat latitude, degrees north
 * @param out optional output column of the same length (allocated when absent)
 * @returns depth for each level, m (positive downward)
 */
export function depth_from_p_batch(p: Float64Array, lat: number, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(p.length);
  for (let i = 0; i < p.length; i++) o[i] = -z_from_p(p[i], lat);
  return o;
}
