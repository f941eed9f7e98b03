/**
 * Common positions of two occupations of one line (docs/occupations.md): the stations of the later
 * occupation B are projected onto the track of the earlier occupation A (its stations in line
 * order), or both onto a straight line the analyst draws; each A station is paired with the nearest
 * B cast within a pairing distance; stations without a partner are left out and listed.
 */
import { alongTrackDistance, greatCircleKm } from '../section/distance';
import { projectOnPolyline } from '../section/line';

/** Where an occupation's cast is, and what it is called. */
export interface Place {
  station: string;
  cast: string;
  /** Degrees east. */
  lon: number;
  /** Degrees north. */
  lat: number;
}

export interface PositionOptions {
  /** Largest distance between an A station and its partner in B, km. */
  pairDistanceKm: number;
  /** 'stations': A's paired stations; 'regular': every spacingKm between the shared ends. */
  positions: 'stations' | 'regular';
  /** Spacing of the regular positions, km (default the median spacing of A's paired stations). */
  spacingKm?: number;
  /**
   * A line the analyst draws, [lon, lat] vertices in degrees: both occupations are projected on it
   * (positions along it from its first point); casts of either farther than the pairing distance
   * from it are left out and listed.
   */
  line?: [number, number][];
}

export interface Pair {
  /** Position of the A station along the line, km. */
  x: number;
  stationA: string;
  castA: string;
  stationB: string;
  castB: string;
  /** Great-circle distance between the two casts, km. */
  offsetKm: number;
}

export interface Excluded {
  station: string;
  line: 'A' | 'B';
  why: string;
}

/** Linear weights of one occupation at each common position: value = (1 − w)·cast[k0] + w·cast[k1]. */
export interface Weights {
  k0: Int32Array;
  k1: Int32Array;
  w: Float64Array;
}

export interface CommonPositions {
  /** Common positions along the line, km. */
  x: Float64Array;
  /** Longitude and latitude of each common position (on A's track), degrees. */
  lon: Float64Array;
  lat: Float64Array;
  /** Indices (into the given A and B lists) of the casts used, each ordered along the line. */
  usedA: number[];
  usedB: number[];
  /** Along-line position of each used cast, km (same order as usedA/usedB). */
  xA: Float64Array;
  xB: Float64Array;
  /** Interpolation weights into usedA / usedB at each common position. */
  weightsA: Weights;
  weightsB: Weights;
  pairs: Pair[];
  excluded: Excluded[];
}

/** Weights of positions x in an ascending list of cast positions xc; exact hits take the cast itself. */
function weightsAt(x: Float64Array, xc: Float64Array, fallback?: Int32Array): Weights {
  const m = x.length;
  const k0 = new Int32Array(m).fill(-1);
  const k1 = new Int32Array(m).fill(-1);
  const w = new Float64Array(m);
  const n = xc.length;
  for (let j = 0; j < m; j++) {
    const v = x[j];
    let hit = -1;
    for (let k = 0; k < n; k++)
      if (Math.abs(xc[k] - v) <= 1e-6) {
        hit = k;
        break;
      }
    if (hit >= 0) {
      k0[j] = hit;
      k1[j] = hit;
      continue;
    }
    if (n >= 2 && v > xc[0] && v < xc[n - 1]) {
      let k = 0;
      while (k < n - 2 && xc[k + 1] < v) k++;
      k0[j] = k;
      k1[j] = k + 1;
      w[j] = (v - xc[k]) / (xc[k + 1] - xc[k]);
      continue;
    }
    // Beyond the ends of the occupation: its paired cast stands in, if it has one.
    if (fallback && fallback[j] >= 0) {
      k0[j] = fallback[j];
      k1[j] = fallback[j];
    }
  }
  return { k0, k1, w };
}

const median = (v: number[]): number => {
  const s = [...v].sort((a, b) => a - b);
  const h = s.length >> 1;
  return s.length === 0 ? NaN : s.length % 2 ? s[h] : 0.5 * (s[h - 1] + s[h]);
};

/**
 * The common positions of occupations A (stations in line order) and B (any order): pairing,
 * projection, exclusions and the interpolation weights of both at each position.
 */
export function commonPositions(a: Place[], b: Place[], opts: PositionOptions): CommonPositions {
  const excluded: Excluded[] = [];
  const lonA = Float64Array.from(a, (c) => c.lon);
  const latA = Float64Array.from(a, (c) => c.lat);
  const drawn = opts.line && opts.line.length >= 2 ? opts.line : null;
  // Without a drawn line the track is A's stations in line order (cumulative great circle, as a section).
  const track: [number, number][] = drawn ?? a.map((c) => [c.lon, c.lat]);
  const onTrack = (lon: number, lat: number) => {
    if (track.length === 1) return { x: 0, offsetKm: greatCircleKm(track[0][0], track[0][1], lon, lat) };
    const f = projectOnPolyline(lon, lat, track);
    return { x: f.alongKm, offsetKm: f.offsetKm };
  };
  const projA = drawn ? a.map((c) => onTrack(c.lon, c.lat)) : null;
  const xAll = projA ? Float64Array.from(projA, (f) => f.x) : alongTrackDistance(lonA, latA);
  const lineName = drawn ? 'the drawn line' : 'line A';
  // B on A's track (or on the drawn line), with the distance to it as the offset.
  const projB = b.map((c) => onTrack(c.lon, c.lat));
  const eligibleB: number[] = [];
  b.forEach((c, i) => {
    if (projB[i].offsetKm <= opts.pairDistanceKm) eligibleB.push(i);
    else
      excluded.push({
        station: c.station,
        line: 'B',
        why: `farther than ${opts.pairDistanceKm} km from ${lineName} (${projB[i].offsetKm.toFixed(1)} km)`,
      });
  });
  const pairs: Pair[] = [];
  const pairedA: number[] = [];
  const partner: number[] = [];
  a.forEach((c, i) => {
    if (projA && projA[i].offsetKm > opts.pairDistanceKm) {
      excluded.push({
        station: c.station,
        line: 'A',
        why: `farther than ${opts.pairDistanceKm} km from the drawn line (${projA[i].offsetKm.toFixed(1)} km)`,
      });
      return;
    }
    let best = -1;
    let d = Infinity;
    for (const k of eligibleB) {
      const dk = greatCircleKm(c.lon, c.lat, b[k].lon, b[k].lat);
      if (dk < d) {
        d = dk;
        best = k;
      }
    }
    if (best < 0 || d > opts.pairDistanceKm) {
      excluded.push({ station: c.station, line: 'A', why: `no cast of B within ${opts.pairDistanceKm} km` });
      return;
    }
    pairedA.push(i);
    partner.push(best);
    pairs.push({
      x: xAll[i],
      stationA: c.station,
      castA: c.cast,
      stationB: b[best].station,
      castB: b[best].cast,
      offsetKm: d,
    });
  });
  // B casts that are near the line but beyond both ends of A's paired stretch add nothing.
  const usedA = [...pairedA].sort((p, q) => xAll[p] - xAll[q]);
  const xA = Float64Array.from(usedA, (i) => xAll[i]);
  const lo = xA.length ? xA[0] : 0;
  const hi = xA.length ? xA[xA.length - 1] : 0;
  const usedB = eligibleB
    .filter((i) => {
      if (partner.includes(i)) return true;
      const inside = projB[i].x >= lo - opts.pairDistanceKm && projB[i].x <= hi + opts.pairDistanceKm;
      if (!inside)
        excluded.push({
          station: b[i].station,
          line: 'B',
          why: `beyond the ends of the paired stretch of ${lineName}`,
        });
      return inside;
    })
    .sort((p, q) => projB[p].x - projB[q].x);
  const xB = Float64Array.from(usedB, (i) => projB[i].x);

  let x: Float64Array;
  if (opts.positions === 'regular' && xA.length >= 2) {
    const spacings: number[] = [];
    for (let i = 1; i < xA.length; i++) spacings.push(xA[i] - xA[i - 1]);
    const step = opts.spacingKm && opts.spacingKm > 0 ? opts.spacingKm : median(spacings);
    const start = Math.max(lo, xB.length ? xB[0] : lo);
    const end = Math.min(hi, xB.length ? xB[xB.length - 1] : hi);
    const n = step > 0 && end > start ? Math.min(2000, Math.floor((end - start) / step + 1e-9) + 1) : 1;
    x = Float64Array.from({ length: n }, (_, i) => start + i * step);
  } else {
    x = Float64Array.from(xA);
  }
  const weightsA = weightsAt(x, xA);
  // Positions at an A station take B's partner of that station when B does not bracket them.
  const fallbackB = new Int32Array(x.length).fill(-1);
  for (let j = 0; j < x.length; j++) {
    const ia = usedA.findIndex((_, k) => Math.abs(xA[k] - x[j]) <= 1e-6);
    if (ia >= 0) fallbackB[j] = usedB.indexOf(partner[pairedA.indexOf(usedA[ia])]);
  }
  const weightsB = weightsAt(x, xB, fallbackB);
  const lon = new Float64Array(x.length);
  const lat = new Float64Array(x.length);
  for (let j = 0; j < x.length; j++) {
    const { k0, k1, w } = { k0: weightsA.k0[j], k1: weightsA.k1[j], w: weightsA.w[j] };
    if (k0 < 0) {
      lon[j] = NaN;
      lat[j] = NaN;
      continue;
    }
    const c0 = a[usedA[k0]];
    const c1 = a[usedA[k1]];
    lon[j] = c0.lon + w * (c1.lon - c0.lon);
    lat[j] = c0.lat + w * (c1.lat - c0.lat);
  }
  return { x, lon, lat, usedA, usedB, xA, xB, weightsA, weightsB, pairs: pairs.sort((p, q) => p.x - q.x), excluded };
}
