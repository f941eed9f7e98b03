import { describe, expect, it } from 'vitest';
import { degreeLabel, fitStationFrame, unwrapLongitudes } from '../../../src/features/cruises';

const W = 800;
const H = 460;
const M = 30;

function inside(frame: ReturnType<typeof fitStationFrame>, lon: number, lat: number) {
  const xy = frame.projection([lon, lat]);
  expect(xy).not.toBeNull();
  const [x, y] = xy as [number, number];
  expect(x).toBeGreaterThanOrEqual(M - 0.5);
  expect(x).toBeLessThanOrEqual(W - M + 0.5);
  expect(y).toBeGreaterThanOrEqual(M - 0.5);
  expect(y).toBeLessThanOrEqual(H - M + 0.5);
  return [x, y];
}

describe('station map frame', () => {
  it('fits a section line inside the margins, north up and east to the right', () => {
    const line = [
      { latitude: -30, longitude: -40 },
      { latitude: -32, longitude: -35 },
      { latitude: -34.5, longitude: -28 },
    ];
    const frame = fitStationFrame(line, W, H, M);
    const pts = line.map((s) => inside(frame, s.longitude, s.latitude));
    expect(pts[1][0]).toBeGreaterThan(pts[0][0]);
    expect(pts[1][1]).toBeGreaterThan(pts[0][1]);
    expect(frame.west).toBeLessThan(-40);
    expect(frame.east).toBeGreaterThan(-28);
    for (const m of frame.meridians) expect(m).toBeGreaterThanOrEqual(frame.west - 1e-9);
  });

  it('takes the short way across the antimeridian', () => {
    expect(unwrapLongitudes([179, -179, 178.5])).toEqual([179, 181, 178.5]);
    const stations = [
      { latitude: -20, longitude: 178 },
      { latitude: -21, longitude: -178 },
    ];
    const frame = fitStationFrame(stations, W, H, M);
    expect(frame.east - frame.west).toBeLessThan(30);
    const [a] = inside(frame, 178, -20);
    const [b] = inside(frame, -178, -21);
    expect(b).toBeGreaterThan(a);
  });

  it('gives a single station a view of a few degrees', () => {
    const frame = fitStationFrame([{ latitude: 10, longitude: 5 }], W, H, M);
    inside(frame, 5, 10);
    expect(frame.north - frame.south).toBeGreaterThanOrEqual(2);
  });

  it('labels degrees with hemisphere and minutes', () => {
    expect(degreeLabel(-35, 'lat')).toBe('35°S');
    expect(degreeLabel(-20.5, 'lon')).toBe('20°30′W');
    expect(degreeLabel(190, 'lon')).toBe('170°W');
    expect(degreeLabel(0, 'lat')).toBe('0°');
  });
});
