/**
 * Geometry of a line (docs/lines.md): the stations' distance along it, the off-line rule, and the
 * stations near a drawn polyline. Positions are degrees on a sphere of the mean Earth radius, worked
 * as unit vectors, so nothing here cares where the 180° meridian or the poles are.
 */
import { EARTH_MEAN_RADIUS_KM, greatCircleKm } from './distance';

export interface LinePoint {
  station: string;
  lon: number;
  lat: number;
}

type Vec3 = [number, number, number];
const RAD = Math.PI / 180;
const unit = (lon: number, lat: number): Vec3 => [
  Math.cos(lat * RAD) * Math.cos(lon * RAD),
  Math.cos(lat * RAD) * Math.sin(lon * RAD),
  Math.sin(lat * RAD),
];
const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3, b: Vec3): Vec3 => [
  a[1] * b[2] - a[2] * b[1],
  a[2] * b[0] - a[0] * b[2],
  a[0] * b[1] - a[1] * b[0],
];
const norm = (a: Vec3) => Math.hypot(a[0], a[1], a[2]);
const angle = (a: Vec3, b: Vec3) => Math.atan2(norm(cross(a, b)), dot(a, b));

/**
 * Distance (km) of a position from the great circle through a and b (the whole circle, not only the
 * arc between them), from the angle between the position and the circle's pole (common practice:
 * cross-track distance on a sphere). NaN when a and b coincide or are antipodal.
 */
export function crossTrackKm(p: [number, number], a: [number, number], b: [number, number]): number {
  const n = cross(unit(a[0], a[1]), unit(b[0], b[1]));
  const len = norm(n);
  if (len < 1e-12) return NaN;
  const s = dot(unit(p[0], p[1]), n) / len;
  return EARTH_MEAN_RADIUS_KM * Math.abs(Math.asin(Math.max(-1, Math.min(1, s))));
}

const median = (v: number[]): number => {
  if (!v.length) return NaN;
  const s = [...v].sort((x, y) => x - y);
  const h = s.length >> 1;
  return s.length % 2 ? s[h] : 0.5 * (s[h - 1] + s[h]);
};

export interface OffLineStation {
  station: string;
  /** Distance from the great circle through its neighbours on the line, km. */
  offKm: number;
  /** The median station spacing of the line when the station was left out, km. */
  spacingKm: number;
}

/**
 * The off-line rule: a station more than `factor` median station spacings (default 3) from the
 * great circle through its neighbours on the line is off the line. An end station is measured
 * against the circle through the two stations next to it. Stations are taken out one at a time,
 * the farthest first, and the rest measured again, so one side trip does not pull its neighbours
 * off with it. At least two stations always stay. Points in line order.
 */
export function offLineStations(points: LinePoint[], factor = 3): OffLineStation[] {
  const kept = [...points];
  const out: OffLineStation[] = [];
  while (kept.length >= 3) {
    const legs: number[] = [];
    for (let i = 1; i < kept.length; i++) {
      const d = greatCircleKm(kept[i - 1].lon, kept[i - 1].lat, kept[i].lon, kept[i].lat);
      if (d > 1e-6) legs.push(d);
    }
    const spacing = median(legs);
    if (!(spacing > 0)) break;
    let worst = -1;
    let worstKm = 0;
    for (let i = 0; i < kept.length; i++) {
      const [ia, ib] = i === 0 ? [1, 2] : i === kept.length - 1 ? [i - 1, i - 2] : [i - 1, i + 1];
      const p = kept[i];
      const a = kept[ia];
      const b = kept[ib];
      // Neighbours closer than half a spacing do not fix a direction: the distance to the nearer
      // one stands in for the distance to their circle.
      const ab = greatCircleKm(a.lon, a.lat, b.lon, b.lat);
      let off = ab >= 0.5 * spacing ? crossTrackKm([p.lon, p.lat], [a.lon, a.lat], [b.lon, b.lat]) : NaN;
      if (!Number.isFinite(off))
        off = Math.min(greatCircleKm(p.lon, p.lat, a.lon, a.lat), greatCircleKm(p.lon, p.lat, b.lon, b.lat));
      if (off > worstKm) {
        worstKm = off;
        worst = i;
      }
    }
    if (worst < 0 || worstKm <= factor * spacing) break;
    out.push({ station: kept[worst].station, offKm: worstKm, spacingKm: spacing });
    kept.splice(worst, 1);
  }
  return out;
}

/** Where a position falls on a polyline of great-circle legs: along-line distance and offset, km. */
export interface PolylineFoot {
  alongKm: number;
  offsetKm: number;
}

/**
 * Projection of a position on a polyline ([[lon, lat], …], degrees) made of great-circle legs:
 * the nearest point of any leg (a foot inside the leg, or the leg's nearer end), its distance along
 * the polyline from the first vertex, and the position's distance from it.
 */
export function projectOnPolyline(lon: number, lat: number, polyline: [number, number][]): PolylineFoot {
  if (polyline.length < 2) throw new RangeError('a polyline needs at least two points');
  const P = unit(lon, lat);
  let best: PolylineFoot = { alongKm: NaN, offsetKm: Infinity };
  let start = 0;
  for (let k = 0; k + 1 < polyline.length; k++) {
    const A = unit(polyline[k][0], polyline[k][1]);
    const B = unit(polyline[k + 1][0], polyline[k + 1][1]);
    const legRad = angle(A, B);
    const nRaw = cross(A, B);
    const nLen = norm(nRaw);
    let along: number;
    let off: number;
    if (nLen < 1e-12) {
      along = 0;
      off = angle(P, A);
    } else {
      const n: Vec3 = [nRaw[0] / nLen, nRaw[1] / nLen, nRaw[2] / nLen];
      const pn = dot(P, n);
      const foot: Vec3 = [P[0] - pn * n[0], P[1] - pn * n[1], P[2] - pn * n[2]];
      const t = Math.atan2(dot(cross(A, foot), n), dot(A, foot));
      if (t >= 0 && t <= legRad && norm(foot) > 1e-12) {
        along = t;
        off = Math.abs(Math.asin(Math.max(-1, Math.min(1, pn))));
      } else {
        const dA = angle(P, A);
        const dB = angle(P, B);
        along = dA <= dB ? 0 : legRad;
        off = Math.min(dA, dB);
      }
    }
    const offKm = off * EARTH_MEAN_RADIUS_KM;
    if (offKm < best.offsetKm - 1e-9) best = { alongKm: start + along * EARTH_MEAN_RADIUS_KM, offsetKm: offKm };
    start += legRad * EARTH_MEAN_RADIUS_KM;
  }
  return best;
}

/** Smallest step kept between two stations' x, km: coincident stations still get increasing x. */
export const MIN_STEP_KM = 1e-3;

/**
 * Distance along a line of each station, km, stations in line order: great-circle legs summed from
 * the first station, or with a polyline the projection on it measured from the first station's
 * foot. x strictly increases: a leg shorter than MIN_STEP_KM (two stations at one place, or two
 * with one foot on the polyline) is stretched to it.
 */
export function lineDistances(
  points: { lon: number; lat: number }[],
  polyline?: [number, number][] | null,
): Float64Array {
  const n = points.length;
  const x = new Float64Array(n);
  if (!n) return x;
  if (polyline && polyline.length >= 2) {
    for (let i = 0; i < n; i++) x[i] = projectOnPolyline(points[i].lon, points[i].lat, polyline).alongKm;
    const x0 = x[0];
    for (let i = 0; i < n; i++) x[i] -= x0;
  } else {
    for (let i = 1; i < n; i++)
      x[i] = x[i - 1] + greatCircleKm(points[i - 1].lon, points[i - 1].lat, points[i].lon, points[i].lat);
  }
  for (let i = 1; i < n; i++) if (!(x[i] >= x[i - 1] + MIN_STEP_KM)) x[i] = x[i - 1] + MIN_STEP_KM;
  return x;
}

/**
 * Stations within corridorKm of a drawn polyline, ordered by their projection on it (ties by
 * offset), with their along-line distance and offset.
 */
export function stationsNearPolyline(
  points: LinePoint[],
  polyline: [number, number][],
  corridorKm: number,
): (LinePoint & PolylineFoot)[] {
  return points
    .map((p) => ({ ...p, ...projectOnPolyline(p.lon, p.lat, polyline) }))
    .filter((p) => p.offsetKm <= corridorKm)
    .sort((a, b) => a.alongKm - b.alongKm || a.offsetKm - b.offsetKm);
}

/**
 * Longitudes made continuous along a line (no jump of 360° where it crosses the 180° meridian),
 * for a longitude x axis: each step is taken the short way round.
 */
export function unwrapLongitudes(lon: ArrayLike<number>): Float64Array {
  const out = new Float64Array(lon.length);
  for (let i = 0; i < lon.length; i++) {
    if (i === 0) {
      out[0] = lon[0];
      continue;
    }
    let d = lon[i] - lon[i - 1];
    d -= 360 * Math.round(d / 360);
    out[i] = out[i - 1] + d;
  }
  return out;
}
