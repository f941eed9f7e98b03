// Geometry of lines: cross-track distance, the off-line rule, projection on a drawn polyline,
// distance along a line across the 180° meridian and over the pole, unwrapped longitudes.
import { describe, it, expect } from 'vitest';
import {
  crossTrackKm,
  offLineStations,
  projectOnPolyline,
  lineDistances,
  stationsNearPolyline,
  unwrapLongitudes,
  MIN_STEP_KM,
} from '../../../shared/section';

const R = 6371.0088;
const deg = (d: number) => (d * Math.PI) / 180;
/** An arc of d degrees on the sphere, km (a meridian arc or an equator arc is exactly this). */
const arc = (d: number) => R * deg(d);

describe('crossTrackKm', () => {
  it('is the latitude arc for a point off the equator (the equator is the circle)', () => {
    // any point at latitude φ lies an arc φ from the equator (geometry of the sphere)
    expect(crossTrackKm([40, 10], [0, 0], [20, 0])).toBeCloseTo(arc(10), 6);
    expect(crossTrackKm([179, -5], [170, 0], [-170, 0])).toBeCloseTo(arc(5), 6);
  });
  it('is the longitude arc at the equator for a meridian circle, and NaN for coincident ends', () => {
    expect(crossTrackKm([3, 0], [0, 10], [0, 40])).toBeCloseTo(arc(3), 6);
    expect(crossTrackKm([3, 0], [0, 10], [0, 10])).toBeNaN();
  });
});

describe('offLineStations', () => {
  const along = Array.from({ length: 8 }, (_, i) => ({ station: `P${i}`, lon: i, lat: 0 }));
  it('finds a side trip and leaves its neighbours on the line', () => {
    const pts = [...along.slice(0, 4), { station: 'X', lon: 3.5, lat: 4 }, ...along.slice(4)];
    const off = offLineStations(pts);
    expect(off.map((o) => o.station)).toEqual(['X']);
    expect(off[0].offKm).toBeCloseTo(arc(4), -1);
    expect(off[0].spacingKm).toBeCloseTo(arc(1), 3);
  });
  it('keeps a station two spacings off, drops one four spacings off, and measures the end stations too', () => {
    expect(offLineStations([...along, { station: 'E', lon: 8, lat: 2 }])).toEqual([]);
    expect(offLineStations([{ station: 'E', lon: 0, lat: 4 }, ...along.slice(1)]).map((o) => o.station)).toEqual(['E']);
  });
  it('leaves a straight line alone across the 180° meridian and over the pole', () => {
    const dateline = [176, 178, 180, -178, -176].map((lon, i) => ({ station: `D${i}`, lon, lat: 0 }));
    expect(offLineStations(dateline)).toEqual([]);
    const pole = [
      [0, 86],
      [0, 88],
      [0, 89.5],
      [180, 89.5],
      [180, 88],
      [180, 86],
    ].map(([lon, lat], i) => ({ station: `N${i}`, lon, lat }));
    expect(offLineStations(pole)).toEqual([]);
  });
});

describe('distance along a line', () => {
  it('sums great-circle legs across the 180° meridian (equator arcs)', () => {
    const x = lineDistances([176, 178, 180, -178, -176].map((lon) => ({ lon, lat: 0 })));
    expect(Array.from(x)).toEqual(Array.from(x).sort((a, b) => a - b));
    for (let i = 0; i < 5; i++) expect(x[i]).toBeCloseTo(arc(2 * i), 6);
  });
  it('passes over the pole: 86°N on 0°E to 86°N on 180°E is an 8° meridian arc, x strictly increasing', () => {
    const pts = [
      [0, 86],
      [0, 88],
      [0, 89.5],
      [180, 89.5],
      [180, 88],
      [180, 86],
    ].map(([lon, lat]) => ({ lon, lat }));
    const x = lineDistances(pts);
    for (let i = 1; i < x.length; i++) expect(x[i]).toBeGreaterThan(x[i - 1]);
    expect(x[3] - x[2]).toBeCloseTo(arc(1), 6);
    expect(x[5]).toBeCloseTo(arc(8), 6);
  });
  it('stretches a leg between coincident stations to the minimum step', () => {
    const x = lineDistances([
      { lon: 5, lat: 5 },
      { lon: 5, lat: 5 },
      { lon: 6, lat: 5 },
    ]);
    expect(x[1] - x[0]).toBeCloseTo(MIN_STEP_KM, 12);
    expect(x[2]).toBeGreaterThan(x[1]);
  });
  it('projects on a drawn polyline: the foot, the offset, measured from the first station', () => {
    const poly: [number, number][] = [
      [170, 0],
      [180, 0],
      [-170, 0],
    ];
    const f = projectOnPolyline(175, 1, poly);
    expect(f.alongKm).toBeCloseTo(arc(5), 0);
    expect(f.offsetKm).toBeCloseTo(arc(1), 6);
    const g = projectOnPolyline(-175, -2, poly);
    expect(g.alongKm).toBeCloseTo(arc(15), 0);
    const x = lineDistances(
      [
        { lon: 175, lat: 1 },
        { lon: -175, lat: -2 },
      ],
      poly,
    );
    expect(x[0]).toBe(0);
    expect(x[1]).toBeCloseTo(arc(10), 0);
  });
  it('takes the stations within the corridor, ordered by their projection', () => {
    const poly: [number, number][] = [
      [170, 0],
      [-170, 0],
    ];
    const pts = [
      { station: 'C', lon: -175, lat: 0.2 },
      { station: 'A', lon: 172, lat: -0.1 },
      { station: 'far', lon: 178, lat: 3 },
      { station: 'B', lon: 179.5, lat: 0 },
    ];
    expect(stationsNearPolyline(pts, poly, 50).map((p) => p.station)).toEqual(['A', 'B', 'C']);
  });
  it('unwraps longitudes across the 180° meridian, either way', () => {
    expect(Array.from(unwrapLongitudes([176, 179, -179, -176]))).toEqual([176, 179, 181, 184]);
    expect(Array.from(unwrapLongitudes([-176, -179, 179]))).toEqual([-176, -179, -181]);
  });
});
