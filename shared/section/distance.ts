/**
 * Along-track distance of a section's casts (docs/science.md §4): by great circle on a sphere of the
 * WGS-84 mean radius (6371.0088 km, enough for section plots), summed leg by leg from the first
 * cast, or as the projection of each cast on a great circle the analyst draws, measured from the
 * first cast's projection.
 */

/** WGS-84 mean Earth radius R1, km (Moritz 2000). */
export const EARTH_MEAN_RADIUS_KM = 6371.0088;

const RAD = Math.PI / 180;

/** Great-circle distance between two positions (degrees), km, by the haversine formula. */
export function greatCircleKm(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const p1 = lat1 * RAD;
  const p2 = lat2 * RAD;
  const sLat = Math.sin((p2 - p1) / 2);
  const sLon = Math.sin(((lon2 - lon1) * RAD) / 2);
  const a = sLat * sLat + Math.cos(p1) * Math.cos(p2) * sLon * sLon;
  return 2 * EARTH_MEAN_RADIUS_KM * Math.atan2(Math.sqrt(a), Math.sqrt(Math.max(0, 1 - a)));
}

type Vec3 = [number, number, number];
const unit = (lon: number, lat: number): Vec3 => [
  Math.cos(lat * RAD) * Math.cos(lon * RAD),
  Math.cos(lat * RAD) * Math.sin(lon * RAD),
  Math.sin(lat * RAD),
];
const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3, b: Vec3): Vec3 => [
  a[1] * b[2] - a[2] * b[1],
  a[2] * b[0] - a[0] * b[2],
  a[0] * b[1] - a[1] * b[0],
];

/**
 * Along-line distance (km) of a position on the great circle through A → B, measured from A,
 * positive towards B: the angle, about the circle's pole n = A × B/|A × B|, between A and the
 * position's foot on the circle.
 */
export function alongLineKm(lon: number, lat: number, a: [number, number], b: [number, number]): number {
  const A = unit(a[0], a[1]);
  const B = unit(b[0], b[1]);
  const nRaw = cross(A, B);
  const nLen = Math.hypot(nRaw[0], nRaw[1], nRaw[2]);
  if (nLen === 0) throw new RangeError('the drawn line needs two distinct, non-antipodal ends');
  const n: Vec3 = [nRaw[0] / nLen, nRaw[1] / nLen, nRaw[2] / nLen];
  const P = unit(lon, lat);
  const pn = dot(P, n);
  const foot: Vec3 = [P[0] - pn * n[0], P[1] - pn * n[1], P[2] - pn * n[2]];
  return EARTH_MEAN_RADIUS_KM * Math.atan2(dot(cross(A, foot), n), dot(A, foot));
}

export interface DistanceOptions {
  /** A line drawn by the analyst, [[lon, lat], [lon, lat]] in degrees: project on it instead. */
  line?: [[number, number], [number, number]];
  /** Distances already worked out along a line (line.ts lineDistances), km, one per cast in the order given. */
  positions?: ArrayLike<number>;
}

/**
 * Along-track distance of each cast from the first, km. lon/lat degrees, casts in track order.
 * Without a line: cumulative great-circle legs. With a line: projection on it minus the first
 * cast's projection (so casts behind the first come out negative).
 */
export function alongTrackDistance(lon: Float64Array, lat: Float64Array, opts: DistanceOptions = {}): Float64Array {
  const n = lon.length;
  const x = new Float64Array(n);
  if (n === 0) return x;
  if (opts.positions) {
    if (opts.positions.length !== n) throw new RangeError('one position per cast');
    for (let i = 0; i < n; i++) x[i] = opts.positions[i];
    return x;
  }
  if (opts.line) {
    const [a, b] = opts.line;
    for (let i = 0; i < n; i++) x[i] = alongLineKm(lon[i], lat[i], a, b);
    const x0 = x[0];
    for (let i = 0; i < n; i++) x[i] -= x0;
    return x;
  }
  for (let i = 1; i < n; i++) x[i] = x[i - 1] + greatCircleKm(lon[i - 1], lat[i - 1], lon[i], lat[i]);
  return x;
}
