import {
  INTERPOLATIONS,
  INVERSION_HANDLINGS,
  REFERENCE_PRESSURES,
  type Interpolation,
  type InversionHandling,
  type ReferencePressure,
} from './types';
import { X_AXES, Y_AXES, type XAxisKind, type YAxisKind } from './types';

/** The palettes by key (see src/components/plot/colormaps.ts), or automatic by property. */
export const PALETTE_CHOICES = ['auto', 'hearth', 'brine', 'cleft', 'graphite'] as const;
export type PaletteChoice = (typeof PALETTE_CHOICES)[number];
/** Which frames the screen shows: both, or one at a time. */
export const FRAME_CHOICES = ['both', 'pressure', 'density'] as const;
export type FrameChoice = (typeof FRAME_CHOICES)[number];

/**
 * Everything that decides what the Section screen shows. It lives in the URL query, so a link
 * reproduces the view and back/forward step through changes; only values that differ from the
 * defaults are written, and anything unreadable falls back to its default.
 */
export interface SectionViewState {
  /** A cast column (CT, SA, sigma2, …) or a derived variable's name. */
  property: string;
  /** Reference pressure of σ, dbar: σ0 … σ4. */
  ref: ReferencePressure;
  /** A layer set's id, or null for the default levels of the reference pressure. */
  layerSet: string | null;
  inversions: InversionHandling;
  interpolation: Interpolation;
  /** Colour range of the property; null is automatic (the range of both frames). */
  range: { min: number; max: number } | null;
  /** What the density frame shows: the property on σ, or the pressure (depth) of the isopycnals. */
  densityShows: 'property' | 'depth';
  /** The station cursor: a cast id, or null before one is chosen. */
  station: string | null;
  /** How the T–S points are coloured. */
  tsColour: 'pressure' | 'station';
  /** Geostrophic reference: a pressure in dbar, or the deepest level common to each pair. */
  pRef: number | 'deepest_common';
  /** Colour range of the density frame; null is automatic (that frame's own range). */
  densityRange: { min: number; max: number } | null;
  palette: PaletteChoice;
  /** The property's contour interval: automatic, none, or a number in the property's unit. */
  contours: 'auto' | 'off' | number;
  /** The pressure frame's vertical axis, and whether the upper 1000 dbar are stretched. */
  yAxis: YAxisKind;
  stretch: boolean;
  /** The frames' horizontal axis (the data stay in distance along the track). */
  xAxis: XAxisKind;
  frames: FrameChoice;
  /** The line drawn (a line id), or null for the cruise's default line. */
  line: string | null;
}

export const DEFAULT_VIEW: Readonly<SectionViewState> = {
  property: 'CT',
  ref: 0,
  layerSet: null,
  inversions: 'sort',
  interpolation: 'linear',
  range: null,
  densityShows: 'property',
  station: null,
  tsColour: 'pressure',
  pRef: 'deepest_common',
  densityRange: null,
  palette: 'auto',
  contours: 'auto',
  yAxis: 'pressure',
  stretch: false,
  xAxis: 'distance',
  frames: 'both',
  line: null,
};

/** The URL parameter of each part of the state. Short, because people paste these links. */
export const PARAM = {
  property: 'property',
  ref: 'ref',
  layerSet: 'set',
  inversions: 'inv',
  interpolation: 'interp',
  rangeMin: 'cmin',
  rangeMax: 'cmax',
  densityShows: 'dframe',
  station: 'stn',
  tsColour: 'ts',
  pRef: 'pref',
  densityMin: 'dmin',
  densityMax: 'dmax',
  palette: 'pal',
  contours: 'cint',
  yAxis: 'yax',
  stretch: 'stretch',
  xAxis: 'xax',
  frames: 'show',
  line: 'line',
} as const;

/** Same rule as the server's `property` parameter: an identifier. */
const PROPERTY_RE = /^[A-Za-z_][\w:]*$/;
const ID_RE = /^[\w-]{1,64}$/;

function oneOf<T extends string | number>(options: readonly T[], raw: string | null, fallback: T): T {
  if (raw === null) return fallback;
  const hit = options.find((o) => String(o) === raw);
  return hit === undefined ? fallback : hit;
}

function finite(raw: string | null): number | null {
  if (raw === null || raw.trim() === '') return null;
  const n = Number(raw);
  return Number.isFinite(n) ? n : null;
}

export function parseViewState(search: URLSearchParams | string): SectionViewState {
  const q = typeof search === 'string' ? new URLSearchParams(search) : search;
  const property = q.get(PARAM.property);
  const layerSet = q.get(PARAM.layerSet);
  const station = q.get(PARAM.station);
  const min = finite(q.get(PARAM.rangeMin));
  const max = finite(q.get(PARAM.rangeMax));
  const pRefRaw = q.get(PARAM.pRef);
  const pRefNumber = finite(pRefRaw);
  const dmin = finite(q.get(PARAM.densityMin));
  const dmax = finite(q.get(PARAM.densityMax));
  const cintRaw = q.get(PARAM.contours);
  const cint = finite(cintRaw);
  const line = q.get(PARAM.line);
  return {
    property: property && property.length <= 64 && PROPERTY_RE.test(property) ? property : DEFAULT_VIEW.property,
    ref: oneOf(REFERENCE_PRESSURES, q.get(PARAM.ref), DEFAULT_VIEW.ref),
    layerSet: layerSet && ID_RE.test(layerSet) ? layerSet : null,
    inversions: oneOf(INVERSION_HANDLINGS, q.get(PARAM.inversions), DEFAULT_VIEW.inversions),
    interpolation: oneOf(INTERPOLATIONS, q.get(PARAM.interpolation), DEFAULT_VIEW.interpolation),
    // A range is both ends, lower first; half a range or an empty one is no range.
    range: min !== null && max !== null && min < max ? { min, max } : null,
    densityShows: oneOf(['property', 'depth'] as const, q.get(PARAM.densityShows), DEFAULT_VIEW.densityShows),
    station: station && ID_RE.test(station) ? station : null,
    tsColour: oneOf(['pressure', 'station'] as const, q.get(PARAM.tsColour), DEFAULT_VIEW.tsColour),
    pRef: pRefNumber !== null && pRefNumber > 0 && pRefNumber <= 12000 ? pRefNumber : DEFAULT_VIEW.pRef,
    densityRange: dmin !== null && dmax !== null && dmin < dmax ? { min: dmin, max: dmax } : null,
    palette: oneOf(PALETTE_CHOICES, q.get(PARAM.palette), DEFAULT_VIEW.palette),
    contours: cintRaw === 'off' ? 'off' : cint !== null && cint > 0 ? cint : 'auto',
    yAxis: oneOf(Y_AXES, q.get(PARAM.yAxis), DEFAULT_VIEW.yAxis),
    stretch: q.get(PARAM.stretch) === '1',
    xAxis: oneOf(X_AXES, q.get(PARAM.xAxis), DEFAULT_VIEW.xAxis),
    frames: oneOf(FRAME_CHOICES, q.get(PARAM.frames), DEFAULT_VIEW.frames),
    line: line && ID_RE.test(line) ? line : null,
  };
}

/** The query string of a state (no leading `?`), defaults left out, in a fixed order. */
export function serialiseViewState(state: SectionViewState): string {
  const q = new URLSearchParams();
  if (state.property !== DEFAULT_VIEW.property) q.set(PARAM.property, state.property);
  if (state.ref !== DEFAULT_VIEW.ref) q.set(PARAM.ref, String(state.ref));
  if (state.layerSet) q.set(PARAM.layerSet, state.layerSet);
  if (state.inversions !== DEFAULT_VIEW.inversions) q.set(PARAM.inversions, state.inversions);
  if (state.interpolation !== DEFAULT_VIEW.interpolation) q.set(PARAM.interpolation, state.interpolation);
  if (state.range) {
    q.set(PARAM.rangeMin, String(state.range.min));
    q.set(PARAM.rangeMax, String(state.range.max));
  }
  if (state.densityShows !== DEFAULT_VIEW.densityShows) q.set(PARAM.densityShows, state.densityShows);
  if (state.station) q.set(PARAM.station, state.station);
  if (state.tsColour !== DEFAULT_VIEW.tsColour) q.set(PARAM.tsColour, state.tsColour);
  if (state.pRef !== DEFAULT_VIEW.pRef) q.set(PARAM.pRef, String(state.pRef));
  if (state.densityRange) {
    q.set(PARAM.densityMin, String(state.densityRange.min));
    q.set(PARAM.densityMax, String(state.densityRange.max));
  }
  if (state.palette !== DEFAULT_VIEW.palette) q.set(PARAM.palette, state.palette);
  if (state.contours !== DEFAULT_VIEW.contours) q.set(PARAM.contours, String(state.contours));
  if (state.yAxis !== DEFAULT_VIEW.yAxis) q.set(PARAM.yAxis, state.yAxis);
  if (state.stretch) q.set(PARAM.stretch, '1');
  if (state.xAxis !== DEFAULT_VIEW.xAxis) q.set(PARAM.xAxis, state.xAxis);
  if (state.frames !== DEFAULT_VIEW.frames) q.set(PARAM.frames, state.frames);
  if (state.line) q.set(PARAM.line, state.line);
  return q.toString();
}

/** The section route's query for one frame of this view. */
export function sectionQueryString(
  state: SectionViewState,
  coord: 'pressure' | 'density',
  levels: string | null,
): string {
  const q = new URLSearchParams();
  q.set('property', coord === 'density' && state.densityShows === 'depth' ? 'pressure' : state.property);
  q.set('coord', coord);
  q.set('ref', String(state.ref));
  if (levels) q.set('levels', levels);
  q.set('inversions', state.inversions);
  q.set('interpolation', state.interpolation);
  q.set('bin', '10');
  if (state.line) q.set('line', state.line);
  return q.toString();
}

export function geostrophyQueryString(state: SectionViewState, levels: string | null): string {
  const q = new URLSearchParams();
  q.set('pRef', String(state.pRef));
  q.set('ref', String(state.ref));
  if (levels) q.set('levels', levels);
  if (state.line) q.set('line', state.line);
  return q.toString();
}

/** σ0 … σ4 as people write it. */
export function sigmaName(ref: number): string {
  return `σ${ref / 1000}`;
}

export const INVERSION_HANDLING_TEXT: Record<InversionHandling, { label: string; explain: string }> = {
  sort: {
    label: 'Sort (reorder parcels)',
    explain:
      'Reorder the water parcels so σ increases downward while the pressure grid stays put; each level’s properties move with it (Thorpe reordering).',
  },
  drop: {
    label: 'Drop inverted levels',
    explain: 'Remove the levels inside inverted intervals and interpolate across the gap.',
  },
  raw: {
    label: 'Raw (first crossing)',
    explain: 'Keep the profile as measured; where an isopycnal is crossed more than once, use the first crossing.',
  },
};

export const INTERPOLATION_TEXT: Record<Interpolation, string> = {
  linear: 'Linear in σ',
  pchip: 'Monotone cubic (Fritsch–Carlson)',
};
