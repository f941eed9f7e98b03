import { describe, expect, it } from 'vitest';
import { buildDensitySection, buildPressureSection, isopycnalLines, type SectionCast } from '../../../shared/section';

const KM_PER_DEG = (Math.PI / 180) * 6371.0088;

/**
 * Analytic casts along the equator: T = 20 − 0.01·p + 0.001·x_km and σ = 24 + 0.002·p + 0.0001·x_km,
 * both linear in pressure and distance, so linear interpolation in distance is exact.
 */
function cast(id: string, lonDeg: number, pDeep: number): SectionCast {
  const xKm = lonDeg * KM_PER_DEG;
  const n = pDeep + 1;
  const p = Float64Array.from({ length: n }, (_, i) => i);
  return {
    id,
    station: id,
    lon: lonDeg,
    lat: 0,
    bottomDepth: null,
    p,
    sigma: p.map((v) => 24 + 0.002 * v + 0.0001 * xKm),
    props: { T: p.map((v) => 20 - 0.01 * v + 0.001 * xKm) },
  };
}

describe('buildPressureSection', () => {
  const casts = [
    cast('A', 0, 1000),
    cast('B', 0.1, 2000),
    cast('C', 0.2, 2000),
    cast('D', 0.3, 2000),
    cast('E', 0.8, 2000),
  ];
  const g = buildPressureSection(casts, { property: 'T', binSize: 10, distanceKm: 2 });
  const castCols = [0, 0.1, 0.2, 0.3, 0.8].map((lon) => g.x.findIndex((v) => Math.abs(v - lon * KM_PER_DEG) < 1e-6));
  // Index of the grid column nearest to a distance (the regular columns are 2 km apart).
  const col = (xKm: number) =>
    g.x.reduce((best, v, i) => (Math.abs(v - xKm) < Math.abs(g.x[best] - xKm) ? i : best), 0);

  it('interpolates linearly in distance between casts (analytic case: the field is linear in x)', () => {
    const ix = col(0.1 * KM_PER_DEG + 4);
    expect(ix).toBeGreaterThan(0);
    const xKm = g.x[ix];
    for (const iy of [10, 100, 150]) {
      const p = g.y[iy];
      // Bin mean of the 1-dbar samples in [p − 5, p + 5) is the field at p − 0.5.
      expect(g.z[iy][ix]).toBeCloseTo(20 - 0.01 * (p - 0.5) + 0.001 * xKm, 9);
    }
  });

  it('leaves the gap wider than 1.5× the median spacing empty, casts excepted (docs/science.md §4)', () => {
    // Spacings 0.1° ×3 and 0.5°: median 0.1°, so the D–E gap (0.5°) is empty.
    expect(g.gaps).toHaveLength(1);
    const inside = col(0.3 * KM_PER_DEG + 20);
    expect(g.z.every((row) => row[inside] === null)).toBe(true);
    expect(castCols.every((i) => i >= 0)).toBe(true);
    expect(g.z[50][castCols[4]]).not.toBeNull();
  });

  it('draws nothing below the bottom line between a shallow and a deep cast (docs/science.md §4)', () => {
    // A ends at 1000 dbar, B at 2000 dbar: halfway the bottom line is at 1500 dbar.
    const ix = col(0.05 * KM_PER_DEG);
    const x0 = g.x[ix];
    const bottomLine = 1000 + (1000 * x0) / (0.1 * KM_PER_DEG);
    const below = Math.ceil(bottomLine / 10) * 10 + 10;
    const above = Math.floor(bottomLine / 10) * 10 - 10;
    expect(above).toBeGreaterThan(1000);
    const row = (p: number) => g.y.indexOf(p);
    expect(g.z[row(below)][ix]).toBeNull();
    expect(g.z[row(above)][ix]).not.toBeNull(); // B's water carried above the bottom line
    expect(g.z[row(above)][ix]).toBeCloseTo(20 - 0.01 * (above - 0.5) + 0.001 * (0.1 * KM_PER_DEG), 9);
    expect(g.z[row(500)][ix]).toBeCloseTo(20 - 0.01 * 499.5 + 0.001 * x0, 9);
    expect(g.bottom[0].p).toBe(1000);
  });
});

describe('buildDensitySection and isopycnalLines', () => {
  const casts = [cast('A', 0, 2000), cast('B', 0.1, 2000), cast('C', 0.2, 2000)];
  const targets = Float64Array.from([24.5, 25.0, 26.0, 29.0]);
  const g = buildDensitySection(casts, {
    property: 'T',
    targets,
    handling: 'sort',
    interpolation: 'linear',
    distanceKm: 3,
  });

  it('puts each isopycnal at its analytic pressure, interpolated along distance (analytic case)', () => {
    for (let ix = 0; ix < g.x.length; ix++) {
      for (let j = 0; j < 3; j++) {
        const pExact = (targets[j] - 24 - 0.0001 * g.x[ix]) / 0.002;
        expect(Math.abs((g.pressure[j][ix] as number) - pExact)).toBeLessThan(1e-9);
        expect(Math.abs((g.z[j][ix] as number) - (20 - 0.01 * pExact + 0.001 * g.x[ix]))).toBeLessThan(1e-9);
      }
      expect(g.z[3][ix]).toBeNull(); // denser than any water
    }
  });

  it('gives the same pressures as isopycnal lines at the casts', () => {
    const lines = isopycnalLines(casts, targets, 'sort');
    expect(lines.p[3].every((v) => v === null)).toBe(true);
    const ixB = g.x.findIndex((v) => Math.abs(v - lines.x[1]) < 1e-6);
    expect(lines.p[1][1]).toBe(g.pressure[1][ixB]);
  });
});
