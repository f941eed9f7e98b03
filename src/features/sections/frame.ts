import type { Section, SectionStation } from './types';

/** Index of the value in a sorted axis nearest to v (−1 for an empty axis). */
export function nearestIndex(axis: readonly number[], v: number): number {
  if (!axis.length || !Number.isFinite(v)) return -1;
  let lo = 0,
    hi = axis.length - 1;
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
export function stepStation(
  stations: readonly SectionStation[],
  currentId: string | null,
  step: number,
): SectionStation | null {
  if (!stations.length) return null;
  const ordered = [...stations].sort((a, b) => a.x - b.x);
  const at = ordered.findIndex((s) => s.id === currentId);
  if (at < 0) return step >= 0 ? ordered[0] : ordered[ordered.length - 1];
  return ordered[Math.max(0, Math.min(ordered.length - 1, at + step))];
}

/** min and max of the finite values of some grids, or null when there are none. */
export function gridRange(...grids: (Section['grid'] | undefined)[]): { min: number; max: number } | null {
  let min = Infinity,
    max = -Infinity;
  for (const g of grids) {
    if (!g) continue;
    for (const row of g.z)
      for (const v of row)
        if (v !== null && Number.isFinite(v)) {
          if (v < min) min = v;
          if (v > max) max = v;
        }
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

/** Which ends of a fixed colour range the grid's values pass: those ends get an extension mark. */
export function rangeExtensions(
  grid: Section['grid'] | undefined,
  range: { min: number; max: number } | null,
): { below: number; above: number } {
  const out = { below: 0, above: 0 };
  if (!grid || !range) return out;
  for (const row of grid.z)
    for (const v of row) {
      if (v === null || !Number.isFinite(v)) continue;
      if (v < range.min) out.below++;
      else if (v > range.max) out.above++;
    }
  return out;
}

export interface LineLabel {
  x: number;
  y: number;
  text: string;
}

/**
 * Labels along lines (isopycnals), not piled at one edge: each line is offered places along its
 * wet length (the middle first, then towards either end) and takes the first that keeps clear of
 * every label placed so far, by `room` in units of the frame (x and y scaled to 0–1). A line with
 * no clear place goes unlabelled rather than overprinted.
 */
export function placeLineLabels(
  lines: readonly { xs: readonly number[]; ys: readonly (number | null)[]; text: string }[],
  xSpan: readonly [number, number],
  ySpan: readonly [number, number],
  room = 0.06,
): LineLabel[] {
  const placed: LineLabel[] = [];
  const nx = (x: number) => (x - xSpan[0]) / (xSpan[1] - xSpan[0] || 1);
  const ny = (y: number) => (y - ySpan[0]) / (ySpan[1] - ySpan[0] || 1);
  const fractions = [0.5, 0.3, 0.7, 0.15, 0.85, 0.4, 0.6];
  lines.forEach((line, k) => {
    const wet = line.ys.map((y, i) => (y === null ? -1 : i)).filter((i) => i >= 0);
    if (wet.length < 2) return;
    // Neighbouring lines start from different places, so a stack of close lines fans out.
    const order = fractions.map((_, j) => fractions[(j + k) % fractions.length]);
    for (const f of order) {
      const pos = f * (wet.length - 1);
      const i0 = wet[Math.floor(pos)],
        i1 = wet[Math.min(wet.length - 1, Math.floor(pos) + 1)];
      const w = pos - Math.floor(pos);
      const x = line.xs[i0] + (line.xs[i1] - line.xs[i0]) * w;
      const y = (line.ys[i0] as number) + ((line.ys[i1] as number) - (line.ys[i0] as number)) * w;
      if (placed.every((p) => Math.hypot(nx(p.x) - nx(x), (ny(p.y) - ny(y)) * 1.6) >= room)) {
        placed.push({ x, y, text: line.text });
        return;
      }
    }
  });
  return placed;
}
