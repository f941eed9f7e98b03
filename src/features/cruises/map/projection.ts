import { geoProjection, type GeoProjection } from 'd3-geo';

/**
 * Fitting a station map to a cruise. The map is an equidistant cylindrical projection whose
 * standard parallel is the middle latitude of the stations: distances along meridians and
 * along that parallel are true, so a section looks as long east–west as it is, and meridians
 * and parallels stay straight lines, which keeps the degree labels at the frame's edges.
 */

export interface StationPoint {
  latitude: number;
  longitude: number;
}

export interface MapFrame {
  projection: GeoProjection;
  /** Visible extent in degrees; `west`/`east` may run past ±180 when the view straddles the antimeridian. */
  west: number;
  east: number;
  south: number;
  north: number;
  /** Graticule spacing in degrees, and the meridians/parallels that get a label. */
  step: number;
  meridians: number[];
  parallels: number[];
}

const NICE_STEPS = [0.1, 0.2, 0.25, 0.5, 1, 2, 2.5, 5, 10, 15, 20, 30, 45];
const MAX_LAT = 85;

/** Longitudes of the stations made continuous: across the antimeridian if that is the shorter way. */
export function unwrapLongitudes(lons: readonly number[]): number[] {
  if (lons.length === 0) return [];
  const plain = [...lons];
  const shifted = lons.map((l) => (l < 0 ? l + 360 : l));
  const span = (xs: number[]) => Math.max(...xs) - Math.min(...xs);
  return span(shifted) < span(plain) ? shifted : plain;
}

export function niceStep(span: number, targetLines = 6): number {
  const raw = span / targetLines;
  return NICE_STEPS.find((s) => s >= raw) ?? 45;
}

function ticks(from: number, to: number, step: number): number[] {
  const out: number[] = [];
  const eps = step * 1e-6;
  for (let v = Math.ceil((from - eps) / step) * step; v <= to + eps; v += step) {
    out.push(Math.round(v / step) * step);
  }
  return out.map((v) => Number(v.toFixed(6)));
}

export function fitStationFrame(
  stations: readonly StationPoint[],
  width: number,
  height: number,
  margin = 28,
): MapFrame {
  const valid = stations.filter(
    (s) => Number.isFinite(s.latitude) && Number.isFinite(s.longitude) && Math.abs(s.latitude) <= 90,
  );
  const lons = unwrapLongitudes(valid.map((s) => s.longitude));
  const lats = valid.map((s) => s.latitude);

  let west = lons.length ? Math.min(...lons) : -30;
  let east = lons.length ? Math.max(...lons) : 30;
  let south = lats.length ? Math.min(...lats) : -20;
  let north = lats.length ? Math.max(...lats) : 20;

  // Breathing room: a sixth of the span, at least half a degree, and never a view under 2°.
  const padLon = Math.max((east - west) / 6, 0.5, (2 - (east - west)) / 2);
  const padLat = Math.max((north - south) / 6, 0.5, (2 - (north - south)) / 2);
  west -= padLon;
  east += padLon;
  south = Math.max(-MAX_LAT, south - padLat);
  north = Math.min(MAX_LAT, north + padLat);

  const centerLon = (west + east) / 2;
  const midLat = (south + north) / 2;
  const k = Math.max(Math.cos((midLat * Math.PI) / 180), 0.2);

  const raw = Object.assign((lambda: number, phi: number): [number, number] => [lambda * k, phi], {
    invert: (x: number, y: number): [number, number] => [x / k, y],
  });
  const projection = geoProjection(raw).rotate([-centerLon, 0]).precision(0.1);

  projection.fitExtent(
    [
      [margin, margin],
      [width - margin, height - margin],
    ],
    {
      type: 'MultiPoint',
      coordinates: [
        [west, south],
        [east, north],
        [west, north],
        [east, south],
      ],
    },
  );
  projection.clipExtent([
    [0, 0],
    [width, height],
  ]);

  // The fitted view keeps the aspect ratio, so one direction shows more than was asked: read
  // the true visible extent back from the frame's corners.
  const topLeft = projection.invert?.([0, 0]);
  const bottomRight = projection.invert?.([width, height]);
  if (topLeft && bottomRight) {
    const [lonA, latA] = topLeft;
    const [lonB, latB] = bottomRight;
    // invert() returns longitudes in [-180, 180]; bring them back next to the centre.
    const near = (lon: number) => lon + 360 * Math.round((centerLon - lon) / 360);
    west = near(lonA);
    east = near(lonB);
    if (east < west) east += 360;
    north = Math.min(90, latA);
    south = Math.max(-90, latB);
  }

  const step = niceStep(Math.max(east - west, north - south), 8);
  return {
    projection,
    west,
    east,
    south,
    north,
    step,
    meridians: ticks(west, east, step),
    parallels: ticks(south, north, step).filter((p) => Math.abs(p) < 90),
  };
}

/** Wrap a longitude into [-180, 180). */
export function wrapLongitude(lon: number): number {
  return ((((lon + 180) % 360) + 360) % 360) - 180;
}

/** A degree label for a graticule line: `35°S`, `20°30′W`, `0°`. */
export function degreeLabel(value: number, axis: 'lat' | 'lon'): string {
  const v = axis === 'lon' ? wrapLongitude(value) : value;
  const abs = Math.abs(v);
  let deg = Math.floor(abs + 1e-9);
  let min = Math.round((abs - deg) * 60);
  if (min === 60) {
    deg += 1;
    min = 0;
  }
  const text = min === 0 ? `${deg}°` : `${deg}°${String(min).padStart(2, '0')}′`;
  if (abs < 1e-9 || (axis === 'lon' && Math.abs(abs - 180) < 1e-9)) return text;
  const hemi = axis === 'lat' ? (v < 0 ? 'S' : 'N') : v < 0 ? 'W' : 'E';
  return `${text}${hemi}`;
}
