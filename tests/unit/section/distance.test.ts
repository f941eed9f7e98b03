import { describe, expect, it } from 'vitest';
import { alongTrackDistance, EARTH_MEAN_RADIUS_KM } from '../../../shared/section';

const deg = (Math.PI / 180) * EARTH_MEAN_RADIUS_KM; // km per degree of arc on the mean sphere

describe('alongTrackDistance', () => {
  it('sums great-circle legs: along the equator and a meridian, arc = R·Δangle (analytic case)', () => {
    const x = alongTrackDistance(Float64Array.from([0, 0.5, 1.5]), Float64Array.from([0, 0, 0]));
    expect(x[1]).toBeCloseTo(0.5 * deg, 9);
    expect(x[2]).toBeCloseTo(1.5 * deg, 9);
    const m = alongTrackDistance(Float64Array.from([-20, -20]), Float64Array.from([-35, -33]));
    expect(m[1]).toBeCloseTo(2 * deg, 9);
  });

  it('projects on a drawn line: off-line casts land at the foot of their perpendicular (analytic case)', () => {
    // Line along the equator; the foot of (lon, lat) is (lon, 0), so the distance is lon·R·π/180.
    const x = alongTrackDistance(Float64Array.from([1, 2, 1.5]), Float64Array.from([0.3, -0.4, 0.1]), {
      line: [
        [0, 0],
        [10, 0],
      ],
    });
    expect(x[0]).toBe(0);
    expect(x[1]).toBeCloseTo(1 * deg, 9);
    expect(x[2]).toBeCloseTo(0.5 * deg, 9);
  });
});
