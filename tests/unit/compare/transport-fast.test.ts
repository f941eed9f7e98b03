// The comparison's transport per layer, computed straight from its grids (layerTransportOnGrids),
// against the section engine's own route (geostrophicSection + transportPerLayer, whose velocity and
// dynamic height are checked against the TEOS-10 reference library in tests/reference/): the same
// Sv to rounding, on invented occupations (a smooth thermocline, the later one heaved; invented
// data, not for the demo).
import { describe, it, expect } from 'vitest';
import { benchOccupations } from '../../bench/comparisons-data';
import { compareOccupations, layerTransportChange } from '../../../shared/compare/index';

describe('transport change from the grids', () => {
  it('equals the section engine to 1e-9 relative', () => {
    const { a, b } = benchOccupations(12, 3000);
    // B displaced along the line so that it is interpolated between its casts
    const bb = b.map((c) => ({ ...c, lon: c.lon + 0.07, lat: c.lat + 0.01 }));
    const pressure = Float64Array.from({ length: 300 }, (_, i) => i * 10);
    const opts = {
      ref: 0,
      targets: Float64Array.from({ length: 60 }, (_, i) => 24.2 + i * 0.05),
      pressure,
      handling: 'sort' as const,
      pairDistanceKm: 20,
      positions: 'stations' as const,
      layers: Float64Array.from([24.5, 25.5, 26.5, 27, 27.5]),
    };
    const r = compareOccupations(a, bb, opts);
    const ref = layerTransportChange(
      r.lon,
      r.lat,
      pressure,
      { SA: r.onPressure.SA_A, CT: r.onPressure.CT_A },
      { SA: r.onPressure.SA_B, CT: r.onPressure.CT_B },
      0,
      opts.layers,
    );
    expect(r.transport).toHaveLength(4);
    let big = 0;
    r.transport.forEach((l, i) => {
      big = Math.max(big, Math.abs(ref[i].A), Math.abs(ref[i].B));
      for (const k of ['A', 'B', 'change'] as const)
        expect(Math.abs(l[k] - ref[i][k])).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(ref[i].A)));
    });
    expect(big).toBeGreaterThan(0.01);
  });
});
