// Two invented 60-cast occupations of one line for the comparison bench: 5000 levels a cast
// (1 dbar to 5000 dbar), a smooth thermocline, the later one heaved by up to 30 dbar.
import type { OccupationCast } from '../../shared/compare/index';

export function benchOccupations(casts = 60, levels = 5000): { a: OccupationCast[]; b: OccupationCast[] } {
  const make = (heave: number, t0: number): OccupationCast[] =>
    Array.from({ length: casts }, (_, i) => {
      const f = i / (casts - 1);
      const p = Float64Array.from({ length: levels }, (_, k) => 1 + k);
      const q = (v: number) => v - heave * Math.exp(-(((v - 500) / 300) ** 2));
      const CT = Float64Array.from(p, (v) => 1.5 + (16 + 3 * f) * Math.exp(-q(v) / 450));
      const SA = Float64Array.from(p, (v) => 34.9 - (0.5 + 0.1 * f) * Math.exp(-q(v) / 600));
      return { station: `S${i + 1}`, cast: '1', lon: -30 + 0.35 * i, lat: -35 + 0.03 * i, time: t0, p, SA, CT, C: CT };
    });
  return { a: make(0, Date.UTC(2016, 2, 1)), b: make(30, Date.UTC(2026, 2, 1)) };
}
