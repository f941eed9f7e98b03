import type { PlotSelectionEvent } from 'plotly.js';
import type { CastDetail } from './types';

/** A pressure range picked on the plot or in a table, with what it came from when that says more. */
export interface Pick {
  pFrom: number;
  pTo: number;
  variable?: string;
  flag?: number;
}

/** The pressure range of a box selection, from its y range or, failing that, the points inside it. */
export function rangeOfSelection(event: PlotSelectionEvent | undefined): [number, number] | null {
  if (!event) return null;
  const range = (event as { range?: Record<string, number[]> }).range;
  if (range) {
    const y = Object.entries(range).find(([axis]) => axis.startsWith('y'))?.[1];
    if (y && y.length === 2 && y.every(Number.isFinite)) return [Math.min(y[0], y[1]), Math.max(y[0], y[1])];
  }
  const ys = (event.points ?? []).map((pt) => Number(pt.y)).filter(Number.isFinite);
  return ys.length ? [Math.min(...ys), Math.max(...ys)] : null;
}

/**
 * The levels a drag covers, as the pressures of the first and last level inside its pressure span; a span
 * thinner than the level spacing (a sideways drag) takes the level nearest its middle. Null without levels.
 */
export function snapToLevels(
  span: [number, number],
  pressure: readonly (number | null)[],
): { pFrom: number; pTo: number } | null {
  const [a, b] = span;
  let lo = Infinity;
  let hi = -Infinity;
  let nearest: number | null = null;
  const mid = (a + b) / 2;
  for (const p of pressure) {
    if (p == null) continue;
    if (p >= a && p <= b) {
      lo = Math.min(lo, p);
      hi = Math.max(hi, p);
    }
    if (nearest == null || Math.abs(p - mid) < Math.abs(nearest - mid)) nearest = p;
  }
  if (lo <= hi) return { pFrom: lo, pTo: hi };
  return nearest == null ? null : { pFrom: nearest, pTo: nearest };
}

/** What a box selection picks: the levels of its pressure span, whatever the drag's direction. */
export function spanOfSelection(
  event: PlotSelectionEvent | undefined,
  pressure: readonly (number | null)[],
): Pick | null {
  const r = rangeOfSelection(event);
  return r ? snapToLevels(r, pressure) : null;
}

/** Runs of consecutive levels with the same flag 3 or 4 in the flags of the named variables. */
export function flaggedRuns(
  flags: CastDetail['flags'],
  sources: readonly string[],
  pressure: readonly (number | null)[],
): { flag: 3 | 4; variable: string; indices: number[]; pFrom: number; pTo: number }[] {
  const out: { flag: 3 | 4; variable: string; indices: number[]; pFrom: number; pTo: number }[] = [];
  for (const name of sources) {
    const f = flags[name];
    if (!f) continue;
    let cur: (typeof out)[number] | null = null;
    f.forEach((v, i) => {
      if (v === 3 || v === 4) {
        if (cur && cur.flag === v && cur.indices[cur.indices.length - 1] === i - 1) cur.indices.push(i);
        else {
          cur = { flag: v, variable: name, indices: [i], pFrom: pressure[i] ?? NaN, pTo: pressure[i] ?? NaN };
          out.push(cur);
        }
        cur.pTo = pressure[i] ?? cur.pTo;
      } else cur = null;
    });
  }
  return out;
}
