import { p_from_z } from '../../../shared/seawater/depth';
import type { SectionStation, XAxisKind, YAxisKind } from './types';
export { X_AXES, Y_AXES } from './types';
export type { XAxisKind, YAxisKind } from './types';

/**
 * The axes of a section frame. The data stay in their own coordinates (pressure in dbar and
 * distance along the track in km); an axis choice changes where they are drawn and what the ticks
 * say: depth ticks sit at the pressures of round depths, a stretched upper ocean draws pressure
 * through a piecewise-linear map, latitude or longitude ticks sit at the distances where the track
 * passes round values.
 */

/** The upper ocean's share of the height and its depth, in the stretched axis. */
export const STRETCH = { topDbar: 1000, share: 0.5 } as const;

export interface YScale {
  /** Pressure (dbar) to the plotted coordinate. */
  toAxis(p: number): number;
  /** The plotted coordinate back to pressure. */
  fromAxis(v: number): number;
  /** Tick positions (plotted coordinate) and labels; null lets the library choose (plain pressure). */
  ticks: { vals: number[]; text: string[] } | null;
  title: string;
  /** How the axis was made, for the caption. */
  caption: string;
}

/** Round steps: 1, 2, 5 × 10ⁿ, the smallest that gives at most `count` intervals over `span`. */
export function niceStep(span: number, count: number): number {
  if (!(span > 0)) return 1;
  const raw = span / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * mag >= raw) return m * mag;
  return 10 * mag;
}

function roundValues(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}

/**
 * A piecewise-linear stretch: 0…topDbar over `share` of the height, the rest below. Continuous
 * and increasing, so every level keeps its order; with pMax ≤ topDbar it is the identity.
 */
export function stretchMap(pMax: number, topDbar: number = STRETCH.topDbar, share: number = STRETCH.share) {
  if (!(pMax > topDbar)) return { to: (p: number) => p, from: (v: number) => v };
  // Plotted in pressure units of the whole column: the top reaches share·pMax.
  const a = (share * pMax) / topDbar;
  const b = ((1 - share) * pMax) / (pMax - topDbar);
  const knee = share * pMax;
  return {
    to: (p: number) => (p <= topDbar ? p * a : knee + (p - topDbar) * b),
    from: (v: number) => (v <= knee ? v / a : topDbar + (v - knee) / b),
  };
}

/** The vertical scale of the pressure frame for an axis kind, stretched or not, down to pMax. */
export function yScale(kind: YAxisKind, stretched: boolean, pMax: number, meanLatitude: number | null): YScale {
  const map = stretched ? stretchMap(pMax) : { to: (p: number) => p, from: (v: number) => v };
  const lat = meanLatitude ?? 0;
  const stretchText =
    stretched && pMax > STRETCH.topDbar
      ? `; upper ${STRETCH.topDbar} dbar stretched over ${STRETCH.share * 100} % of the height`
      : '';
  if (kind === 'depth') {
    // Depth ticks: the sea pressure of each round depth at the section's mean latitude (TEOS-10 p_from_z).
    const dMax = pMax; // depth is within 1 % of pressure; the tick list is trimmed by pressure below
    const vals: number[] = [],
      text: string[] = [];
    const marks = stretched
      ? [
          ...roundValues(0, Math.min(1000, dMax), 200),
          ...roundValues(1000, dMax * 1.02, niceStep(dMax - 1000, 5)).slice(1),
        ]
      : roundValues(0, dMax * 1.02, niceStep(dMax, 8));
    for (const d of marks) {
      const p = p_from_z(-d, lat);
      if (Number.isFinite(p) && p <= pMax * 1.02) {
        vals.push(map.to(p));
        text.push(String(d));
      }
    }
    return {
      toAxis: map.to,
      fromAxis: map.from,
      ticks: { vals, text },
      title: 'Depth (m)',
      caption: `depth from pressure by TEOS-10 (p_from_z) at the mean latitude ${Math.abs(lat).toFixed(1)}°${lat < 0 ? 'S' : 'N'}${stretchText}`,
    };
  }
  if (!stretched || pMax <= STRETCH.topDbar)
    return {
      toAxis: map.to,
      fromAxis: map.from,
      ticks: null,
      title: 'Pressure (dbar)',
      caption: `pressure axis${stretchText}`,
    };
  const marks = [...roundValues(0, 1000, 200), ...roundValues(1000, pMax, niceStep(pMax - 1000, 5)).slice(1)];
  return {
    toAxis: map.to,
    fromAxis: map.from,
    ticks: { vals: marks.map(map.to), text: marks.map(String) },
    title: 'Pressure (dbar)',
    caption: `pressure axis${stretchText}`,
  };
}

export interface XScale {
  title: string;
  /** Ticks at the distances (km) of round values; null lets the library choose (plain distance). */
  ticks: { vals: number[]; text: string[] } | null;
  caption: string;
}

const hemi = (v: number, kind: 'latitude' | 'longitude', digits: number) =>
  `${Math.abs(v).toFixed(digits)}°${kind === 'latitude' ? (v < 0 ? 'S' : v > 0 ? 'N' : '') : v < 0 ? 'W' : v > 0 ? 'E' : ''}`;

/**
 * The horizontal scale: distance along the track, or latitude or longitude labelled at the
 * distances where the track passes round values (interpolated linearly between stations). Where
 * the coordinate runs back on itself along the track, each station is labelled instead.
 */
export function xScale(kind: XAxisKind, stations: readonly SectionStation[]): XScale {
  if (kind === 'distance')
    return { title: 'Distance along the track (km)', ticks: null, caption: 'x: distance along the track' };
  const pts = stations
    .map((s) => ({ x: s.x, v: kind === 'latitude' ? s.latitude : s.longitude }))
    .filter((q): q is { x: number; v: number } => q.v !== null && Number.isFinite(q.v))
    .sort((a, b) => a.x - b.x);
  const title = kind === 'latitude' ? 'Latitude' : 'Longitude';
  if (pts.length < 2)
    return { title, ticks: null, caption: `x: ${kind} (too few positioned stations; distance shown)` };
  const d = pts.slice(1).map((q, i) => q.v - pts[i].v);
  const monotone = d.every((v) => v >= 0) || d.every((v) => v <= 0);
  const lo = Math.min(...pts.map((q) => q.v)),
    hi = Math.max(...pts.map((q) => q.v));
  if (!monotone || hi - lo < 1e-6) {
    const every = Math.max(1, Math.ceil(pts.length / 10));
    const picked = pts.filter((_, i) => i % every === 0);
    return {
      title,
      ticks: { vals: picked.map((q) => q.x), text: picked.map((q) => hemi(q.v, kind, 2)) },
      caption: `x: ${kind} of the stations (the track turns back in ${kind})`,
    };
  }
  const step = niceStep(hi - lo, 7);
  const digits = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const vals: number[] = [],
    text: string[] = [];
  for (const v of roundValues(lo, hi, step)) {
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1],
        b = pts[i];
      if ((v - a.v) * (v - b.v) <= 0 && a.v !== b.v) {
        vals.push(a.x + ((v - a.v) / (b.v - a.v)) * (b.x - a.x));
        text.push(hemi(v, kind, digits));
        break;
      }
    }
  }
  return { title, ticks: { vals, text }, caption: `x: ${kind}, placed along the track between stations` };
}

/** The mean latitude of the stations that have one, or null. */
export function meanLatitude(stations: readonly SectionStation[]): number | null {
  const l = stations.map((s) => s.latitude).filter((v): v is number => v !== null && Number.isFinite(v));
  return l.length ? l.reduce((s, v) => s + v, 0) / l.length : null;
}
