import type { Section, SectionStation } from './types';

/** Index of the value in a sorted axis nearest to v (−1 for an empty axis). */
export function nearestIndex(axis: readonly number[], v: number): number {
  if (!axis.length || !Number.isFinite(v)) return -1;
  let lo = 0, hi = axis.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (axis[mid] <= v) lo = mid;
    else hi = mid;
  }
  return Math.abs(axis[hi] - v) < Math.abs(axis[lo] - v) ? hi : lo;
}

/** The grid value in the cell nearest to (x, y), or null where the grid has none. */
export function sampleGrid(grid: Section['grid'], x: number, y: number): number | null {
  const ix = nearestIndex(grid.x, x);
  const iy = nearestIndex(grid.y, y);
  if (ix < 0 || iy < 0) return null;
  const v = grid.z[iy]?.[ix];
  return v === undefined || v === null || !Number.isFinite(v) ? null : v;
}

export function nearestStation(stations: readonly SectionStation[], x: number): SectionStation | null {
  let best: SectionStation | null = null;
  for (const s of stations) if (!best || Math.abs(s.x - x) < Math.abs(best.x - x)) best = s;
  return best;
}

/** The station `step` places along the track from the current one (clamped at the ends). */
export function stepStation(stations: readonly SectionStation[], currentId: string | null, step: number): SectionStation | null {
  if (!stations.length) return null;
  const ordered = [...stations].sort((a, b) => a.x - b.x);
  const at = ordered.findIndex((s) => s.id === currentId);
  if (at < 0) return step >= 0 ? ordered[0] : ordered[ordered.length - 1];
  return ordered[Math.max(0, Math.min(ordered.length - 1, at + step))];
}

/** min and max of the finite values of some grids, or null when there are none. */
export function gridRange(...grids: (Section['grid'] | undefined)[]): { min: number; max: number } | null {
  let min = Infinity, max = -Infinity;
  for (const g of grids) {
    if (!g) continue;
    for (const row of g.z) for (const v of row) if (v !== null && Number.isFinite(v)) { if (v < min) min = v; if (v > max) max = v; }
  }
  if (!Number.isFinite(min)) return null;
  return min === max ? { min: min - 0.5, max: max + 0.5 } : { min, max };
}

/** Digits worth showing for a value of a span (a σ anomaly of 27.413 vs a pressure of 1250). */
export function digitsFor(span: number): number {
  if (!Number.isFinite(span) || span <= 0) return 3;
  return Math.max(0, Math.min(5, 3 - Math.floor(Math.log10(span))));
}

export function formatValue(v: number | null | undefined, digits: number): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits);
}
