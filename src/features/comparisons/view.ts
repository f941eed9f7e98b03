// The whole comparison view lives in the URL: which lines, the property and every choice, and
// which frames are shown per decade. Parsing is forgiving (bad values fall back to defaults).

export interface ComparisonView {
  a: string | null;
  b: string | null;
  property: string;
  ref: number;
  inversions: 'sort' | 'drop' | 'raw';
  pair: number;
  positions: 'stations' | 'regular';
  bin: number;
  levels: string | null;
  perDecade: boolean;
  /** A drawn line for the common positions, [lon, lat] vertices; null: A's own track. */
  line: [number, number][] | null;
}

export const DEFAULT_VIEW: ComparisonView = {
  a: null,
  b: null,
  property: 'CT',
  ref: 0,
  inversions: 'sort',
  pair: 20,
  positions: 'stations',
  bin: 10,
  levels: null,
  perDecade: false,
  line: null,
};

/** A drawn line as text: "lon lat; lon lat; …" (commas or spaces between the two numbers). */
export function lineText(line: [number, number][] | null): string {
  return line ? line.map(([lon, lat]) => `${lon} ${lat}`).join('; ') : '';
}

/** A drawn line from its text, or null when it is not 2–200 valid points (the API's own bounds). */
export function parseLineText(text: string): [number, number][] | null {
  const pts = text
    .split(';')
    .map((p) => p.trim())
    .filter(Boolean)
    .map((p) => p.split(/[\s,]+/).map(Number));
  if (pts.length < 2 || pts.length > 200) return null;
  if (!pts.every((p) => p.length === 2 && p.every(Number.isFinite))) return null;
  if (!pts.every(([lon, lat]) => Math.abs(lon) <= 540 && Math.abs(lat) <= 90)) return null;
  if (pts.every(([lon, lat]) => lon === pts[0][0] && lat === pts[0][1])) return null;
  return pts as [number, number][];
}

const LINE_PARAM = (line: [number, number][]) => line.map(([lon, lat]) => `${lon},${lat}`).join(';');
const REFS = [0, 1000, 2000, 3000, 4000];
const uuid = /^[0-9a-f-]{36}$/i;

export function parseView(sp: URLSearchParams): ComparisonView {
  const n = (k: string, d: number, ok: (v: number) => boolean) => {
    const v = Number(sp.get(k));
    return sp.has(k) && Number.isFinite(v) && ok(v) ? v : d;
  };
  const inv = sp.get('inversions');
  return {
    a: uuid.test(sp.get('a') ?? '') ? sp.get('a') : null,
    b: uuid.test(sp.get('b') ?? '') ? sp.get('b') : null,
    property: /^[A-Za-z_][\w:]{0,63}$/.test(sp.get('property') ?? '') ? sp.get('property')! : DEFAULT_VIEW.property,
    ref: n('ref', 0, (v) => REFS.includes(v)),
    inversions: inv === 'drop' || inv === 'raw' ? inv : 'sort',
    pair: n('pair', DEFAULT_VIEW.pair, (v) => v > 0 && v <= 500),
    positions: sp.get('positions') === 'regular' ? 'regular' : 'stations',
    bin: n('bin', DEFAULT_VIEW.bin, (v) => v > 0 && v <= 500),
    levels: sp.get('levels') || null,
    perDecade: sp.get('perDecade') === '1',
    line: parseLineText(sp.get('line') ?? ''),
  };
}

export function serialiseView(v: ComparisonView): URLSearchParams {
  const sp = new URLSearchParams();
  if (v.a) sp.set('a', v.a);
  if (v.b) sp.set('b', v.b);
  sp.set('property', v.property);
  sp.set('ref', String(v.ref));
  sp.set('inversions', v.inversions);
  sp.set('pair', String(v.pair));
  sp.set('positions', v.positions);
  sp.set('bin', String(v.bin));
  if (v.levels) sp.set('levels', v.levels);
  if (v.perDecade) sp.set('perDecade', '1');
  if (v.line) sp.set('line', LINE_PARAM(v.line));
  return sp;
}

/** The POST body of the comparison a view asks for. */
export function comparisonBody(v: ComparisonView) {
  return {
    lineA: v.a,
    lineB: v.b,
    property: v.property,
    ref: v.ref,
    inversions: v.inversions,
    pairDistanceKm: v.pair,
    positions: v.positions,
    bin: v.bin,
    ...(v.levels ? { levels: v.levels } : {}),
    ...(v.line ? { line: v.line } : {}),
    // five significant digits: the hover shows four, the colours far fewer; a smaller answer
    digits: 5,
  };
}

/** The export link of a view. */
export function exportHref(
  v: ComparisonView,
  format: 'csv' | 'nc',
  frame: 'pressure' | 'density' = 'pressure',
): string {
  const sp = new URLSearchParams({
    lineA: v.a ?? '',
    lineB: v.b ?? '',
    property: v.property,
    ref: String(v.ref),
    inversions: v.inversions,
    pairDistanceKm: String(v.pair),
    positions: v.positions,
    bin: String(v.bin),
    format,
    frame,
  });
  if (v.levels) sp.set('levels', v.levels);
  if (v.line) sp.set('line', LINE_PARAM(v.line));
  return `/api/comparisons/export?${sp.toString()}`;
}
