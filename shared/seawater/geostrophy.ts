/**
 * Geostrophy from hydrography.
 *
 * Dynamic height anomaly (TEOS-10 Manual, IOC, SCOR & IAPSO 2010, §3.27):
 *   D(p) = −∫_{p_ref}^{p} δ(SA, CT, p') dP',  δ = v(SA, CT, p) − v(SSO, 0 °C, p),
 * with v from the Roquet et al. (2015) polynomial and P in Pa. Bottle data are integrated the
 * way the TEOS-10 reference library does it (McDougall & Barker 2011, GSW Toolbox; method
 * description of geo_strf_dyn_height): where any gap between levels exceeds max_dp (1 dbar by
 * default) or p_ref is not a level, SA and CT are interpolated in pressure by a shape-preserving
 * piecewise cubic Hermite interpolant (Fritsch & Carlson 1980; derivatives by the weighted
 * harmonic mean of Fritsch & Butland 1984, one-sided three-point ends) onto a grid made of every
 * level, p_ref, and the multiples p₀ + k·max_dp that are not within 0.001·max_dp of a level; δ is
 * then integrated by the trapezoidal rule on that grid. Above the shallowest level, when p_ref lies
 * there, the first values are held constant up to p_ref (a mixed layer assumed).
 *
 * Geostrophic velocity between two casts (Fofonoff 1962; TEOS-10 Manual §3.27):
 *   v = (D_b − D_a) / (f L),  f = 2Ω sin φ at the mid latitude, L the great-circle distance,
 * positive 90° to the left of the direction from cast a to cast b.
 */
import { specvol_anom_standard, db2Pa } from './density';
import { z_from_p } from './depth';

export type DynHeightInterpolation = 'pchip' | 'linear';

export interface DynHeightOptions {
  /** Largest pressure gap integrated without interpolation, dbar (TEOS-10 library default 1). */
  max_dp?: number;
  /** How SA and CT are interpolated between levels (default 'pchip', as the library). */
  interpolation?: DynHeightInterpolation;
}

/** Sign of x as −1, 0, 1. */
const sgn = (x: number): number => (x > 0 ? 1 : x < 0 ? -1 : 0);

/** One-sided three-point end slope, limited so the interpolant keeps the data's shape. */
function pchipEndSlope(h0: number, h1: number, m0: number, m1: number): number {
  const d = ((2 * h0 + h1) * m0 - h0 * m1) / (h0 + h1);
  if (sgn(d) !== sgn(m0)) return 0;
  if (sgn(m0) !== sgn(m1) && Math.abs(d) > 3 * Math.abs(m0)) return 3 * m0;
  return d;
}

/**
 * Derivatives at the knots of a shape-preserving piecewise cubic Hermite interpolant
 * (Fritsch & Carlson 1980; Fritsch & Butland 1984 weighted harmonic mean). x increasing.
 * @param x abscissae, strictly increasing (here pressure, dbar)
 * @param y ordinates at x (any unit)
 * @param d output, written in place: the slopes dy/dx at x
 * @returns the slopes d (same array as passed)
 */
export function pchipSlopesFritschButland(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  d: Float64Array = new Float64Array(x.length),
): Float64Array {
  const n = x.length;
  if (n < 2) return d;
  if (n === 2) {
    d[0] = d[1] = (y[1] - y[0]) / (x[1] - x[0]);
    return d;
  }
  for (let i = 1; i < n - 1; i++) {
    const hm = x[i] - x[i - 1],
      hp = x[i + 1] - x[i];
    const mm = (y[i] - y[i - 1]) / hm,
      mp = (y[i + 1] - y[i]) / hp;
    if (mm === 0 || mp === 0 || sgn(mm) !== sgn(mp)) {
      d[i] = 0; // a local extremum or flat stretch: no overshoot
    } else {
      const w1 = 2 * hp + hm,
        w2 = hp + 2 * hm;
      d[i] = (w1 + w2) / (w1 / mm + w2 / mp);
    }
  }
  const h0 = x[1] - x[0],
    h1 = x[2] - x[1];
  d[0] = pchipEndSlope(h0, h1, (y[1] - y[0]) / h0, (y[2] - y[1]) / h1);
  const hl = x[n - 1] - x[n - 2],
    hl1 = x[n - 2] - x[n - 3];
  d[n - 1] = pchipEndSlope(hl, hl1, (y[n - 1] - y[n - 2]) / hl, (y[n - 2] - y[n - 3]) / hl1);
  return d;
}

/**
 * Evaluate the interpolant through (x, y) with knot slopes d at increasing targets xi into yi
 * (cubic Hermite basis; targets outside the knots take the end values).
 */
function hermiteAt(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  d: ArrayLike<number> | null,
  xi: ArrayLike<number>,
  yi: Float64Array,
): void {
  const n = x.length;
  let j = 0;
  for (let m = 0; m < xi.length; m++) {
    const t0 = xi[m];
    if (t0 <= x[0]) {
      yi[m] = y[0];
      continue;
    }
    if (t0 >= x[n - 1]) {
      yi[m] = y[n - 1];
      continue;
    }
    while (j < n - 2 && t0 > x[j + 1]) j++;
    const h = x[j + 1] - x[j];
    const t = (t0 - x[j]) / h;
    if (d === null) {
      yi[m] = y[j] + t * (y[j + 1] - y[j]);
      continue;
    }
    const t2 = t * t,
      t3 = t2 * t;
    yi[m] =
      y[j] * (2 * t3 - 3 * t2 + 1) +
      d[j] * h * (t3 - 2 * t2 + t) +
      y[j + 1] * (3 * t2 - 2 * t3) +
      d[j + 1] * h * (t3 - t2);
  }
}

/**
 * The integration grid: every level of p, p_ref, and the multiples p[0] + k·dp that are not
 * within 0.001·dp of a level (nor just below... above p_ref by less than that). Returns the grid,
 * where each level landed in it, and where p_ref landed.
 */
function integrationGrid(
  p: ArrayLike<number>,
  p_ref: number,
  dp: number,
): { grid: Float64Array; levelAt: Int32Array; refAt: number } {
  const n = p.length;
  const tol = 0.001 * dp;
  const cap = n + Math.ceil((p[n - 1] - p[0]) / dp) + 2;
  const grid = new Float64Array(cap);
  const levelAt = new Int32Array(n);
  let g = 0;
  grid[g] = p[0];
  levelAt[0] = 0;
  let refAt = p_ref <= p[0] + tol ? 0 : -1;
  let k = 1; // next uniform multiple
  let lev = 1; // next level to place
  g = 1;
  while (lev < n) {
    const uniform = p[0] + dp * k;
    if (refAt < 0 && p_ref <= uniform && p_ref <= p[lev]) {
      grid[g] = p_ref;
      refAt = g;
      if (p_ref === p[lev]) levelAt[lev++] = g;
      if (uniform < p_ref + tol) k++; // the multiple is too close to p_ref to keep
      g++;
      continue;
    }
    if (uniform < p[lev] - tol) {
      grid[g++] = uniform;
      k++;
    } else {
      // The multiple is skipped for the level; a reference between the two must still get its point.
      if (refAt < 0 && p_ref < p[lev]) {
        grid[g] = p_ref;
        refAt = g;
        g++;
      }
      grid[g] = p[lev];
      if (refAt < 0 && p_ref === p[lev]) refAt = g;
      levelAt[lev++] = g;
      if (uniform < grid[g] + tol) k++; // the multiple is too close to the level to keep
      g++;
    }
  }
  return { grid: grid.subarray(0, g), levelAt, refAt };
}

/**
 * Dynamic height anomaly D (m²/s²) at each level of a cast, relative to p_ref (dbar).
 * SA g/kg, CT °C, p dbar (strictly increasing where finite), p_ref dbar (default 0, the sea surface).
 * Levels with a NaN in SA, CT or p are skipped and come back NaN; when p_ref is deeper than the
 * deepest good level, or fewer than two levels are good, every level comes back NaN.
 * TEOS-10 Manual §3.27 with the reference library's integration between bottles (see file head).
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual §3.27; McDougall & Barker (2011), GSW Toolbox guide.
 * @param SA Absolute Salinity, g/kg
 * @param CT Conservative Temperature (ITS-90), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param p_ref reference pressure, dbar
 * @param options max_dp, the largest gap between levels integrated without interpolation (dbar, default 1),
 *   and the interpolation between levels (default 'pchip')
 * @returns dynamic height anomaly at each level, m²/s²
 */
export function geo_strf_dyn_height(
  SA: ArrayLike<number>,
  CT: ArrayLike<number>,
  p: ArrayLike<number>,
  p_ref = 0,
  options: DynHeightOptions = {},
): Float64Array {
  const maxDp = options.max_dp ?? 1;
  const interpolation = options.interpolation ?? 'pchip';
  const n = SA.length;
  if (CT.length !== n || p.length !== n) throw new RangeError('SA, CT and p differ in length');
  const out = new Float64Array(n).fill(NaN);

  const good: number[] = [];
  for (let i = 0; i < n; i++)
    if (Number.isFinite(SA[i]) && Number.isFinite(CT[i]) && Number.isFinite(p[i])) good.push(i);
  for (let i = 1; i < good.length; i++) {
    if (!(p[good[i]] > p[good[i - 1]])) throw new RangeError(`pressure must increase down the cast (level ${good[i]})`);
  }
  if (good.length < 2 || p[good[good.length - 1]] < p_ref) return out;

  // Hold the first values constant from p_ref down to the shallowest level, if p_ref is above it.
  const pad: number[] = [];
  for (let q = p_ref; q < p[good[0]]; q += maxDp) pad.push(q);
  const m = pad.length + good.length;
  const pp = new Float64Array(m),
    sa = new Float64Array(m),
    ct = new Float64Array(m);
  for (let i = 0; i < pad.length; i++) {
    pp[i] = pad[i];
    sa[i] = SA[good[0]];
    ct[i] = CT[good[0]];
  }
  for (let i = 0; i < good.length; i++) {
    pp[pad.length + i] = p[good[i]];
    sa[pad.length + i] = SA[good[i]];
    ct[pad.length + i] = CT[good[i]];
  }

  let largestGap = 0;
  let refLevel = -1;
  for (let i = 0; i < m; i++) {
    if (i > 0) largestGap = Math.max(largestGap, pp[i] - pp[i - 1]);
    if (refLevel < 0 && pp[i] === p_ref) refLevel = i;
  }

  let D: Float64Array; // D on the cast's (padded) levels, relative to the shallowest
  let dAtRef: number;
  if (largestGap <= maxDp && refLevel >= 0) {
    // Fine enough already: the trapezoidal rule on the levels themselves.
    D = new Float64Array(m);
    let bPrev = specvol_anom_standard(sa[0], ct[0], pp[0]);
    for (let i = 1; i < m; i++) {
      const b = specvol_anom_standard(sa[i], ct[i], pp[i]);
      D[i] = D[i - 1] - 0.5 * (b + bPrev) * (pp[i] - pp[i - 1]) * db2Pa;
      bPrev = b;
    }
    dAtRef = D[refLevel];
  } else {
    const { grid, levelAt, refAt } = integrationGrid(pp, p_ref, maxDp);
    const saI = new Float64Array(grid.length),
      ctI = new Float64Array(grid.length);
    if (interpolation === 'pchip') {
      hermiteAt(pp, sa, pchipSlopesFritschButland(pp, sa), grid, saI);
      hermiteAt(pp, ct, pchipSlopesFritschButland(pp, ct), grid, ctI);
    } else {
      hermiteAt(pp, sa, null, grid, saI);
      hermiteAt(pp, ct, null, grid, ctI);
    }
    const Dg = new Float64Array(grid.length);
    let bPrev = specvol_anom_standard(saI[0], ctI[0], grid[0]);
    for (let i = 1; i < grid.length; i++) {
      const b = specvol_anom_standard(saI[i], ctI[i], grid[i]);
      Dg[i] = Dg[i - 1] - 0.5 * (b + bPrev) * (grid[i] - grid[i - 1]) * db2Pa;
      bPrev = b;
    }
    D = new Float64Array(m);
    for (let i = 0; i < m; i++) D[i] = Dg[levelAt[i]];
    dAtRef = Dg[refAt];
  }
  for (let i = 0; i < good.length; i++) out[good[i]] = D[pad.length + i] - dAtRef;
  return out;
}

/** Earth's rotation rate, rad/s (Groten 2004, as TEOS-10). */
export const OMEGA = 7.292115e-5;
/** Mean Earth radius, m (WGS-84 mean radius R1 = 6 371 008.8 m, Moritz 2000). */
export const EARTH_MEAN_RADIUS = 6371008.8;

/**
 * Coriolis parameter f = 2Ω sin φ, 1/s; lat degrees.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual §3.27; McDougall & Barker (2011), GSW Toolbox guide.
 * @param lat latitude, degrees north
 * @returns Coriolis parameter, 1/s
 */
export function f(lat: number): number {
  return 2 * OMEGA * Math.sin((lat * Math.PI) / 180);
}

/**
 * Great-circle distance (haversine) between two positions, m; lon/lat degrees. An optional
 * sea pressure p (dbar) shortens the arc to the radius at that depth, (R + z(p)).
 * Reference: the haversine formula (common practice), with the depth correction of the TEOS-10
 * library's distance function (McDougall & Barker 2011, GSW Toolbox guide).
 * @param lon_a longitude of station A, degrees east
 * @param lat_a latitude of station A, degrees north
 * @param lon_b longitude of station B, degrees east
 * @param lat_b latitude of station B, degrees north
 * @param p sea pressure at which the arc is measured, dbar (0, the surface, unless given)
 * @param radius radius of the sphere, m (the Earth’s mean radius unless given)
 * @returns great-circle distance between A and B, m
 */
export function distance(
  lon_a: number,
  lat_a: number,
  lon_b: number,
  lat_b: number,
  p = 0,
  radius = EARTH_MEAN_RADIUS,
): number {
  const r = Math.PI / 180;
  const phiA = lat_a * r,
    phiB = lat_b * r;
  const sLat = Math.sin((phiB - phiA) / 2),
    sLon = Math.sin(((lon_b - lon_a) * r) / 2);
  const a = sLat * sLat + Math.cos(phiA) * Math.cos(phiB) * sLon * sLon;
  const angle = 2 * Math.atan2(Math.sqrt(a), Math.sqrt(1 - a));
  const z = p === 0 ? 0 : z_from_p(p, 0.5 * (lat_a + lat_b));
  return (radius + z) * angle;
}

export interface GeostrophicVelocityOptions {
  /** Earth radius for the distance, m (default the WGS-84 mean radius 6 371 008.8 m). */
  radius?: number;
  /** Pressures of D_a and D_b (dbar), when the tiny (R + z) correction of the distance is wanted. */
  p_a?: ArrayLike<number>;
  p_b?: ArrayLike<number>;
}

/**
 * Geostrophic velocity between casts a and b, m/s, level by level: v = (D_b − D_a)/(f L),
 * f at the mid latitude, L the great-circle distance. D_a, D_b dynamic height anomalies m²/s²
 * on the same levels and relative to the same reference; lon/lat degrees. Positive v is 90° to
 * the left of the direction a → b (Fofonoff 1962; TEOS-10 Manual §3.27).
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual §3.27; McDougall & Barker (2011), GSW Toolbox guide.
 * @param D_a dynamic height anomaly profile of station A, m²/s²
 * @param D_b dynamic height anomaly profile of station B, m²/s²
 * @param lon_a longitude of station A, degrees east
 * @param lat_a latitude of station A, degrees north
 * @param lon_b longitude of station B, degrees east
 * @param lat_b latitude of station B, degrees north
 * @param options radius of the Earth (m, default the mean radius) and the pressures of D_a and D_b (dbar) for
 *   the (R + z) correction of the distance
 * @returns geostrophic velocity at each level relative to the reference, m/s
 */
export function geostrophic_velocity(
  D_a: ArrayLike<number>,
  D_b: ArrayLike<number>,
  lon_a: number,
  lat_a: number,
  lon_b: number,
  lat_b: number,
  options: GeostrophicVelocityOptions = {},
): Float64Array {
  const n = D_a.length;
  if (D_b.length !== n) throw new RangeError('D_a and D_b differ in length');
  const radius = options.radius ?? EARTH_MEAN_RADIUS;
  const fMid = f(0.5 * (lat_a + lat_b));
  const L0 = distance(lon_a, lat_a, lon_b, lat_b, 0, radius);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let L = L0;
    if (options.p_a && options.p_b) {
      const pm = 0.5 * (options.p_a[i] + options.p_b[i]);
      L = pm === 0 ? L0 : distance(lon_a, lat_a, lon_b, lat_b, pm, radius);
    }
    v[i] = (D_b[i] - D_a[i]) / (fMid * L);
  }
  return v;
}

export interface CastTS {
  SA: ArrayLike<number>;
  CT: ArrayLike<number>;
  lon: number;
  lat: number;
}

export interface StrfVelocityResult {
  /** Velocity on the shared levels, m/s (NaN where either cast has no data). */
  v: Float64Array;
  /** The reference pressure used, dbar (NaN when the casts share no level). */
  p_ref: number;
  D_a: Float64Array;
  D_b: Float64Array;
  /** Great-circle distance between the casts, m. */
  distance: number;
}

/**
 * Geostrophic velocity between two casts on the same pressure levels p (dbar), relative to a
 * reference pressure (dbar) or to the deepest level where both casts have data
 * ('deepest_common', the usual level-of-no-motion choice for a station pair).
 * SA g/kg, CT °C, lon/lat degrees.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual §3.27; McDougall & Barker (2011), GSW Toolbox guide.
 * @param a station A: its SA (g/kg) and CT (°C) columns, lon and lat (degrees)
 * @param b station B, as a
 * @param p the common pressure levels of both columns, dbar
 * @param reference reference pressure of the velocity (level of no motion), dbar, or 'deepest_common'
 * @param options max_dp and interpolation as for geo_strf_dyn_height, and the Earth's radius (m)
 * @returns the velocity profile (m/s) and what was integrated
 */
export function geo_strf_velocity(
  a: CastTS,
  b: CastTS,
  p: ArrayLike<number>,
  reference: number | 'deepest_common',
  options: DynHeightOptions & { radius?: number } = {},
): StrfVelocityResult {
  const n = p.length;
  let p_ref: number;
  if (reference === 'deepest_common') {
    p_ref = NaN;
    for (let i = n - 1; i >= 0; i--) {
      const both =
        Number.isFinite(a.SA[i]) && Number.isFinite(a.CT[i]) && Number.isFinite(b.SA[i]) && Number.isFinite(b.CT[i]);
      if (both && Number.isFinite(p[i])) {
        p_ref = p[i];
        break;
      }
    }
  } else {
    p_ref = reference;
  }
  const L = distance(a.lon, a.lat, b.lon, b.lat, 0, options.radius ?? EARTH_MEAN_RADIUS);
  if (!Number.isFinite(p_ref)) {
    const nan = new Float64Array(n).fill(NaN);
    return { v: nan, p_ref: NaN, D_a: nan.slice(), D_b: nan.slice(), distance: L };
  }
  const D_a = geo_strf_dyn_height(a.SA, a.CT, p, p_ref, options);
  const D_b = geo_strf_dyn_height(b.SA, b.CT, p, p_ref, options);
  const v = geostrophic_velocity(D_a, D_b, a.lon, a.lat, b.lon, b.lat, { radius: options.radius });
  return { v, p_ref, D_a, D_b, distance: L };
}

/**
 * Volume transport per layer between adjacent levels, m³/s: the mean velocity of the two levels
 * times the layer's thickness in metres (from z_from_p at the mid latitude) times the distance L (m).
 * v m/s, p dbar, lat degrees. Layers touching a NaN give NaN.
 * Reference: IOC, SCOR & IAPSO (2010), TEOS-10 Manual §3.27; McDougall & Barker (2011), GSW Toolbox guide.
 * @param v geostrophic velocity at each level, m/s
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param L horizontal distance between the two stations, m
 * @param lat latitude, degrees north
 * @returns volume transport of each layer between adjacent levels, m³/s
 */
export function layer_transport(v: ArrayLike<number>, p: ArrayLike<number>, L: number, lat: number): Float64Array {
  const out = new Float64Array(Math.max(0, v.length - 1));
  for (let i = 0; i < out.length; i++) {
    const dz = z_from_p(p[i], lat) - z_from_p(p[i + 1], lat);
    out[i] = 0.5 * (v[i] + v[i + 1]) * dz * L;
  }
  return out;
}
