// Repeat occupations (docs/occupations.md): two lines of (usually) two cruises compared on common
// positions — grids of both, the differences on pressure and on isopycnals, the heave, the
// Bindoff & McDougall (1994) decomposition, along-line means, the change of transport per layer —
// and which lines of other cruises count as occupations of a line (same name, same section
// identifier, or linked by hand). Access: the user must belong to both cruises (404 otherwise).
import { z } from 'zod';
import { gzipSync } from 'node:zlib';
import { QueryTypes } from 'sequelize';
import { randomBytes } from 'node:crypto';
import { Cruise, Line, Membership } from '../models/index';
import { cached, dataVersion, type CruiseCast } from './cruiseData';
import { loadLineCasts, ensureDefaultLine, type ResolvedLine } from './lines';
import { propertyColumns } from './sectionView';
import { levelsOrError, sigmaRange } from './levels';
import {
  compareOccupations,
  gridOccupationCast,
  type OccupationCast,
  type Comparison,
  type GriddedCast,
} from '../../shared/compare/index';
import { toRows } from '../../shared/section/index';
import { REFERENCE_PRESSURES, defaultLevels } from '../../shared/api/levels';
import { badRequest, notFound, conflict } from '../lib/errors';
import { membershipOf } from '../lib/routeTable';

const uuid = z.string().regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i, 'a line id');
/** A line the analyst draws for the common positions: [lon, lat] vertices in degrees, 2 to 200, not all at one point. */
const DrawnLine = z
  .array(z.tuple([z.number().finite().min(-540).max(540), z.number().finite().min(-90).max(90)]))
  .min(2, 'a drawn line needs at least two points')
  .max(200, 'a drawn line has at most 200 points')
  .refine(
    (pts) => pts.some(([lon, lat]) => lon !== pts[0][0] || lat !== pts[0][1]),
    'the points of a drawn line must not all be one point',
  );
export const ComparisonBody = z
  .object({
    lineA: uuid,
    lineB: uuid,
    property: z
      .string()
      .regex(/^[A-Za-z_][\w:]*$/)
      .max(64)
      .default('CT'),
    ref: z
      .number()
      .refine(
        (v) => (REFERENCE_PRESSURES as readonly number[]).includes(v),
        'the reference pressure is one of 0, 1000, 2000, 3000, 4000 dbar',
      )
      .default(0),
    levels: z.string().max(20000).optional(),
    inversions: z.enum(['sort', 'drop', 'raw']).default('sort'),
    interpolation: z.enum(['linear', 'pchip']).default('linear'),
    pairDistanceKm: z.number().positive().max(500).default(20),
    positions: z.enum(['stations', 'regular']).default('stations'),
    spacingKm: z.number().positive().max(1000).optional(),
    /** Common positions along a line the analyst draws instead of A's track (both occupations projected on it). */
    line: DrawnLine.optional(),
    /** Spacing of the pressure levels, dbar. */
    bin: z.number().positive().max(500).default(10),
    /** Deepest pressure level, dbar (default the deepest good level of either occupation). */
    pMax: z.number().positive().max(11000).optional(),
    /** σ bounds of the transport layers, ascending comma list (default six layers over the levels). */
    layers: z
      .string()
      .regex(/^\s*\d+(\.\d+)?(\s*,\s*\d+(\.\d+)?)+\s*$/, 'a comma list of σ values')
      .max(2000)
      .optional(),
    /** Flags kept (WOCE 1–9); levels flagged otherwise in either occupation are left out and counted. */
    flags: z.array(z.number().int().min(1).max(9)).max(9).default([1, 2]),
    /** Significant digits of the grids (a screen needs 6; exports use full precision). */
    digits: z.number().int().min(3).max(17).optional(),
  })
  .strict();
export type ComparisonBody = z.infer<typeof ComparisonBody>;

const UNITS: Record<string, string> = {
  CT: '°C',
  SA: 'g/kg',
  SP: '',
  temperature: '°C',
  pt0: '°C',
  oxygen: 'µmol/kg',
  sigma0: 'kg/m³',
  spiciness0: 'kg/m³',
};

// A line never moves to another cruise: its cruise is looked up once per process. (A deleted line
// still maps to its old cruise here; everything after the lookup reads the line itself and answers 404.)
const cruiseOfLine = new Map<string, string>();

/** The cruise of a line, or null (unknown id). */
export async function lineCruiseId(lineId: unknown): Promise<string | null> {
  if (typeof lineId !== 'string' || !uuid.safeParse(lineId).success) return null;
  const known = cruiseOfLine.get(lineId);
  if (known) return known;
  const cruiseId = (await Line.findByPk(lineId, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
  if (cruiseId) {
    if (cruiseOfLine.size > 50_000) cruiseOfLine.clear();
    cruiseOfLine.set(lineId, cruiseId);
  }
  return cruiseId;
}

/** The line and its cruise when the user belongs to that cruise; 404 (as if it did not exist) otherwise. */
async function lineForMember(userId: string, lineId: string): Promise<{ id: string; cruiseId: string }> {
  // a line of a cruise the user does not belong to answers exactly like a line that does not exist
  const cruiseId = await lineCruiseId(lineId);
  if (!cruiseId || !(await membershipOf(userId, cruiseId))) throw notFound('No such line.');
  return { id: lineId.toLowerCase(), cruiseId };
}

/** The line's row when the user belongs to its cruise; 404 otherwise. */
async function lineRowForMember(userId: string, lineId: string): Promise<Line> {
  const { id } = await lineForMember(userId, lineId);
  const row = await Line.findByPk(id);
  if (!row) throw notFound('No such line.');
  return row;
}

/** One line's casts as read for a comparison (cached per line, data version, property and kept flags). */
type LineData = {
  lineId: string;
  cruise: Cruise;
  line: Omit<ResolvedLine, 'casts'>;
  casts: OccupationCast[];
  raw: CruiseCast[];
  /** Deepest good level of any cast, dbar. */
  deepest: number;
  /** σ range per reference pressure (the default levels come from it), filled on first need. */
  ranges: Map<number, [number, number] | null>;
};

/** 1 where a level's T, S (or conductivity) or the property itself carries a flag not kept. */
function flaggedMask(c: CruiseCast, property: string, keep: number[]): Uint8Array {
  const n = c.columns.pressure.length;
  const bad = new Uint8Array(n);
  const own = `flag:${property.replace(/^x:/, '')}`;
  for (const [name, f] of Object.entries(c.flags)) {
    if (!/^flag:(temperature|salinity|conductivity)$/.test(name) && name !== own) continue;
    for (let i = 0; i < f.length && i < n; i++) if (!keep.includes(f[i])) bad[i] = 1;
  }
  return bad;
}

function deepestOf(casts: OccupationCast[]): number {
  let d = 0;
  for (const c of casts)
    for (let i = c.p.length - 1; i >= 0; i--)
      if (Number.isFinite(c.p[i]) && !c.bad?.[i] && Number.isFinite(c.SA[i])) {
        if (c.p[i] > d) d = c.p[i];
        break;
      }
  return d;
}

/** Bytes held by typed arrays reachable from a value (each array once), for the cache's budget. */
function typedBytes(v: unknown, seen = new Set<object>()): number {
  if (!v || typeof v !== 'object' || seen.has(v)) return 0;
  seen.add(v);
  if (ArrayBuffer.isView(v)) return v.byteLength;
  let n = 64;
  for (const x of Array.isArray(v) ? v : v instanceof Map ? [...v.values()] : Object.values(v))
    n += typeof x === 'string' ? 2 * x.length : typedBytes(x, seen);
  return n;
}

async function lineData(lineId: string, cruiseId: string, version: string, q: ComparisonBody): Promise<LineData> {
  const key = `cmp-line:${lineId}:${version}:${q.property}:${q.flags.join(',')}`;
  return cached(
    key,
    async () => {
      const cruise = await Cruise.findByPk(cruiseId);
      if (!cruise) throw notFound('No such line.');
      const extra =
        q.property.startsWith('x:') || /^(sigma\d|CT|SA|SP|temperature|pt0|spiciness0|rho|oxygen)$/.test(q.property)
          ? [q.property]
          : undefined;
      const { casts: all, ...line } = await loadLineCasts(cruiseId, lineId, extra);
      const raw = all.filter((c) => c.columns.pressure && c.columns.pressure.length > 1);
      const values = raw.length ? await propertyColumns(cruiseId, q.property, raw) : [];
      const casts = raw.map((c, i): OccupationCast => ({
        station: c.station,
        cast: c.cast,
        lon: c.longitude,
        lat: c.latitude,
        time: c.time ? c.time.getTime() : null,
        p: c.columns.pressure,
        SA: c.columns.SA,
        CT: c.columns.CT,
        C: values[i] ?? new Float64Array(c.columns.pressure.length).fill(NaN),
        bad: flaggedMask(c, q.property, q.flags),
      }));
      return { lineId, cruise, line, casts, raw, deepest: deepestOf(casts), ranges: new Map() };
    },
    typedBytes,
  );
}

function rangeOf(d: LineData, ref: number): [number, number] | null {
  if (!d.ranges.has(ref)) d.ranges.set(ref, sigmaRange(d.raw, ref));
  return d.ranges.get(ref)!;
}

/** The levels of a comparison: as asked, or the default levels of `ref` over both lines' σ range (as resolveLevels). */
function comparisonLevels(a: LineData, b: LineData, q: ComparisonBody): { text: string; levels: Float64Array } {
  if (q.levels != null) return { text: q.levels, levels: levelsOrError(q.levels) };
  const ra = rangeOf(a, q.ref);
  const rb = rangeOf(b, q.ref);
  const range: [number, number] | null =
    ra && rb ? [Math.min(ra[0], rb[0]), Math.max(ra[1], rb[1])] : (ra ?? rb ?? null);
  const text = defaultLevels(q.ref, range);
  return { text, levels: levelsOrError(text) };
}

/** Every cast of a line gridded for the comparison's gridding choices (cached: no pairing choice changes it). */
function griddedLine(
  d: LineData,
  version: string,
  q: ComparisonBody,
  levels: { text: string; levels: Float64Array },
  pressure: Float64Array,
): Promise<GriddedCast[]> {
  const key = `cmp-grid:${d.lineId}:${version}:${q.property}:${q.flags.join(',')}:${q.ref}:${levels.text}:${q.bin}:${pressure.length}:${q.inversions}:${q.interpolation}`;
  return cached(
    key,
    () =>
      d.casts.map((c) =>
        gridOccupationCast(c, {
          ref: q.ref,
          targets: levels.levels,
          pressure,
          handling: q.inversions,
          interpolation: q.interpolation,
        }),
      ),
    typedBytes,
  );
}

/** How long each stage of the last comparison built in this process took, ms (for the bench). */
export const lastBuildStages: Record<string, number> = {};

type Built = { a: LineData; b: LineData; levelsText: string; r: Comparison; q: ComparisonBody };

/** Read (or reuse) both lines, grid (or reuse) their casts, and compare them. */
async function compute(userId: string, q: ComparisonBody): Promise<Built> {
  const stages: Record<string, number> = {};
  let t = performance.now();
  const lap = (name: string) => {
    const now = performance.now();
    stages[name] = (stages[name] ?? 0) + now - t;
    t = now;
  };
  const { rowA, rowB, vA, vB } = await access(userId, q);
  const a = await lineData(rowA.id, rowA.cruiseId, vA, q);
  const b = await lineData(rowB.id, rowB.cruiseId, vB, q);
  lap('read casts');
  if (a.casts.length === 0 || b.casts.length === 0) {
    throw badRequest(`Line ${a.casts.length === 0 ? 'A' : 'B'} has no cast with a profile to compare.`, [
      { field: a.casts.length === 0 ? 'lineA' : 'lineB', message: 'no casts' },
    ]);
  }
  const lv = comparisonLevels(a, b, q);
  const pMax = q.pMax ?? Math.max(a.deepest, b.deepest);
  const np = Math.min(20000, Math.floor(pMax / q.bin + 1e-9) + 1);
  const pressure = Float64Array.from({ length: np }, (_, i) => i * q.bin);
  let layers: Float64Array | undefined;
  if (q.layers) {
    layers = Float64Array.from(q.layers.split(',').map(Number));
    for (let i = 1; i < layers.length; i++)
      if (!(layers[i] > layers[i - 1]))
        throw badRequest('The layer bounds must increase.', [{ field: 'layers', message: 'not increasing' }]);
  }
  lap('levels');
  const gA = await griddedLine(a, vA, q, lv, pressure);
  const gB = await griddedLine(b, vB, q, lv, pressure);
  lap('remap each occupation');
  const r = compareOccupations(
    a.casts,
    b.casts,
    {
      ref: q.ref,
      targets: lv.levels,
      pressure,
      handling: q.inversions,
      interpolation: q.interpolation,
      pairDistanceKm: q.pairDistanceKm,
      positions: q.positions,
      spacingKm: q.spacingKm,
      line: q.line,
      layers,
      stage: (name) => lap(name),
    },
    { A: gA, B: gB },
  );
  if (r.x.length === 0)
    throw badRequest(
      `No station of line A has a cast of line B within ${q.pairDistanceKm} km${q.line ? ' of the drawn line' : ''}.`,
      [{ field: 'pairDistanceKm', message: 'no pairs' }],
    );
  for (const k of Object.keys(lastBuildStages)) delete lastBuildStages[k];
  Object.assign(lastBuildStages, stages);
  return { a, b, levelsText: lv.text, r, q };
}

// ---- the answer ------------------------------------------------------------------------------

const P10 = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));
/** v to `digits` significant digits (as Number(v.toPrecision(digits)), without the string round trip where it can). */
function roundSig(v: number, digits: number): number {
  const a = Math.abs(v);
  if (a === 0 || !Number.isFinite(a)) return v;
  const k = digits - 1 - Math.floor(Math.log10(a));
  if (k < 0 || k > 22) return Number(v.toPrecision(digits));
  const r = Math.round(a * P10[k]) / P10[k];
  return v < 0 ? -r : r;
}
const cell = (v: number, digits?: number): number | null =>
  Number.isFinite(v) ? (digits ? roundSig(v, digits) : v) : null;

const list = (a: Float64Array, digits?: number) => Array.from(a, (v) => cell(v, digits));

const ZEROS = '0'.repeat(24);
/**
 * The JSON text of roundSig(v, digits) (the same number; written from the integer mantissa, about
 * twice as fast as String(roundSig(…))); NaN and ±Infinity as null.
 */
function sigText(v: number, digits: number): string {
  if (!Number.isFinite(v)) return 'null';
  const a = Math.abs(v);
  if (a === 0) return '0';
  const k = digits - 1 - Math.floor(Math.log10(a));
  if (k < 0 || k > 22 || digits > 15) return String(Number(v.toPrecision(digits)));
  let m = Math.round(a * P10[k]);
  let e = k;
  while (e > 0 && m % 10 === 0) {
    m /= 10;
    e--;
  }
  let s = String(m);
  if (e > 0) {
    if (s.length <= e) s = ZEROS.slice(0, e - s.length + 1) + s;
    s = `${s.slice(0, s.length - e)}.${s.slice(s.length - e)}`;
  }
  return v < 0 ? `-${s}` : s;
}

/** A grid as JSON text ([level][position], null empty), written straight from the typed array. */
function gridJson(g: Float64Array, nx: number, ny: number, digits?: number): string {
  const rows = new Array<string>(ny);
  const cells = new Array<string>(nx);
  for (let i = 0; i < ny; i++) {
    const o = i * nx;
    for (let j = 0; j < nx; j++) {
      const v = g[o + j];
      cells[j] = digits ? sigText(v, digits) : Number.isFinite(v) ? String(v) : 'null';
    }
    rows[i] = `[${cells.join(',')}]`;
  }
  return `[${rows.join(',')}]`;
}

function occupationJson(d: LineData) {
  const times = d.casts.map((c) => c.time).filter((t): t is number => t !== null);
  let lo = Infinity;
  let hi = -Infinity;
  for (const t of times) {
    if (t < lo) lo = t;
    if (t > hi) hi = t;
  }
  return {
    lineId: d.lineId,
    line: d.line.name,
    isDefaultLine: d.line.isDefault,
    cruiseId: d.cruise.id,
    cruise: d.cruise.name,
    ship: d.cruise.ship,
    firstCast: times.length ? new Date(lo).toISOString() : null,
    lastCast: times.length ? new Date(hi).toISOString() : null,
    casts: d.casts.length,
    lineExcluded: d.line.excluded,
  };
}

/** T–S points of the gridded occupation at the common positions (every level, thinned past 8000 points). */
function tsPoints(SA: Float64Array, CT: Float64Array) {
  let n = 0;
  for (let i = 0; i < SA.length; i++) if (Number.isFinite(SA[i]) && Number.isFinite(CT[i])) n++;
  const step = Math.max(1, Math.ceil(n / 8000));
  const sa: number[] = [];
  const ct: number[] = [];
  let k = 0;
  for (let i = 0; i < SA.length; i++) {
    if (!(Number.isFinite(SA[i]) && Number.isFinite(CT[i]))) continue;
    if (k++ % step === 0) {
      sa.push(roundSig(SA[i], 6));
      ct.push(roundSig(CT[i], 6));
    }
  }
  return { SA: sa, CT: ct };
}

/**
 * The comparison answer (api.md, "The comparison of two occupations"); `grid` turns each typed grid
 * into what the caller sends: rows for the exports, JSON text for the POST body.
 */
function answerOf<G>(x: Built, grid: (g: Float64Array, ny: number) => G) {
  const { a, b, q, levelsText, r } = x;
  const np = r.pressure.length;
  const ns = r.sigma.length;
  const d = q.digits;
  const P = (g: Float64Array) => grid(g, np);
  const S = (g: Float64Array) => grid(g, ns);
  const castIdA = new Map(a.line.stations.map((s) => [s.station, s.castId]));
  const castIdB = new Map(b.line.stations.map((s) => [s.station, s.castId]));
  const perDecade = r.years && Math.abs(r.years) > 1e-6 ? 10 / r.years : null;
  const { digits: _d, line: drawn, ...rest } = q;
  void _d;
  return {
    choices: {
      ...rest,
      line: drawn ?? null,
      levels: levelsText,
      sigma: `sigma${q.ref / 1000}`,
      pressureLevels: `0:${q.bin}:${r.pressure[np - 1] ?? 0}`,
      digits: d ?? null,
    },
    unit: UNITS[q.property] ?? '',
    occupations: { A: occupationJson(a), B: occupationJson(b) },
    years: r.years,
    perDecade,
    x: list(r.x),
    positions: Array.from(r.x, (_, j) => ({ latitude: cell(r.lat[j]), longitude: cell(r.lon[j]) })),
    pairs: r.pairs.map((p) => ({
      ...p,
      castIdA: castIdA.get(p.stationA) ?? null,
      castIdB: castIdB.get(p.stationB) ?? null,
    })),
    excluded: [
      ...a.line.excluded.map((e) => ({ ...e, line: 'A' as const })),
      ...b.line.excluded.map((e) => ({ ...e, line: 'B' as const })),
      ...r.excluded,
    ],
    counts: r.counts,
    pressure: Array.from(r.pressure),
    sigma: Array.from(r.sigma),
    onPressure: { A: P(r.onPressure.A), B: P(r.onPressure.B), diff: P(r.onPressure.diff) },
    onDensity: {
      pA: S(r.onDensity.pA),
      pB: S(r.onDensity.pB),
      heave: S(r.onDensity.heave),
      A: S(r.onDensity.A),
      B: S(r.onDensity.B),
      diff: S(r.onDensity.diff),
    },
    decomposition: {
      waterMassTerm: P(r.decomposition.waterMassTerm),
      heaveTerm: P(r.decomposition.heaveTerm),
      residual: P(r.decomposition.residual),
      heave: P(r.decomposition.heave),
    },
    means: {
      onPressure: {
        diff: list(r.means.onPressure.diff, d),
        waterMassTerm: list(r.means.onPressure.waterMassTerm, d),
        heaveTerm: list(r.means.onPressure.heaveTerm, d),
        residual: list(r.means.onPressure.residual, d),
      },
      onDensity: { heave: list(r.means.onDensity.heave, d), diff: list(r.means.onDensity.diff, d) },
    },
    transport: r.transport,
    ts: { A: tsPoints(r.onPressure.SA_A, r.onPressure.CT_A), B: tsPoints(r.onPressure.SA_B, r.onPressure.CT_B) },
  };
}
export type ComparisonAnswer = ReturnType<typeof answerOf<(number | null)[][]>>;

/** The answer as JSON text: the small parts by JSON.stringify, each grid written straight from its typed array. */
function answerJson(x: Built): string {
  const nx = x.r.x.length;
  const texts: string[] = [];
  const tag = `@@grid:${randomBytes(6).toString('hex')}:`;
  const obj = answerOf(x, (g, ny) => {
    texts.push(gridJson(g, nx, ny, x.q.digits));
    return `${tag}${texts.length - 1}@@`;
  });
  return JSON.stringify(obj).replace(new RegExp(`"${tag}(\\d+)@@"`, 'g'), (_, i: string) => texts[Number(i)]);
}

/** Both lines checked for the user (404 unless a member of both cruises) and both cruises' data versions. */
async function access(userId: string, q: ComparisonBody) {
  const [rowA, rowB] = await Promise.all([lineForMember(userId, q.lineA), lineForMember(userId, q.lineB)]);
  const [vA, vB] = await Promise.all([dataVersion(rowA.cruiseId), dataVersion(rowB.cruiseId)]);
  return { rowA, rowB, vA, vB };
}

/**
 * The cache key of a comparison: both lines, both cruises' data versions (which move with any change
 * of their casts, flags, lines, stations, layer sets or derived variables) and every choice.
 */
async function comparisonKey(userId: string, q: ComparisonBody): Promise<string> {
  const { rowA, rowB, vA, vB } = await access(userId, q);
  return `comparison:${rowA.id}:${vA}:${rowB.id}:${vB}:${JSON.stringify(q)}`;
}

/**
 * The comparison as the POST body, plain and gzipped, cached like a section: a warm read is the
 * access check (memberships and data versions are held for half a second), a lookup and a write.
 */
export async function comparisonBodyBytes(userId: string, q: ComparisonBody): Promise<{ json: Buffer; gz: Buffer }> {
  const key = await comparisonKey(userId, q);
  return cached(`bytes:${key}`, async () => {
    const built = await compute(userId, q);
    let t = performance.now();
    const json = Buffer.from(answerJson(built));
    lastBuildStages['JSON of the answer'] = performance.now() - t;
    t = performance.now();
    // level 1: a third of the time of level 6 for a body some 15 % larger (docs/occupations.md)
    const gz = gzipSync(json, { level: 1 });
    lastBuildStages.gzip = performance.now() - t;
    return { json, gz };
  });
}

/** The comparison of two lines as an object (the exports), for a user who belongs to both cruises. */
export async function buildComparison(userId: string, q: ComparisonBody): Promise<ComparisonAnswer> {
  const built = await compute(userId, q);
  const nx = built.r.x.length;
  return answerOf(built, (g, ny) => {
    const rows = toRows(g, nx, ny);
    return q.digits ? rows.map((row) => row.map((v) => (v === null ? null : roundSig(v, q.digits!)))) : rows;
  });
}

// ---- occupations of one line ----------------------------------------------------------------

/** The section identifier of a cruise's casts (SECT_ID or WOCE_ID of their files, the commonest), upper case. */
async function sectionIds(cruiseIds: string[]): Promise<Map<string, string>> {
  if (!cruiseIds.length) return new Map();
  const rows = (await Line.sequelize!.query(
    `SELECT cruise_id AS "cruiseId", s, count(*)::int AS n FROM (
       SELECT cruise_id, upper(trim(coalesce(metadata->>'SECT_ID', metadata->>'sect_id', metadata->>'WOCE_ID', metadata->>'woce_id', metadata->>'section'))) AS s
       FROM casts WHERE cruise_id IN (:ids)) t WHERE s IS NOT NULL AND s <> '' GROUP BY cruise_id, s ORDER BY n DESC`,
    { replacements: { ids: cruiseIds }, type: QueryTypes.SELECT },
  )) as { cruiseId: string; s: string; n: number }[];
  const out = new Map<string, string>();
  for (const r of rows) if (!out.has(r.cruiseId)) out.set(r.cruiseId, r.s);
  return out;
}

const normal = (s: string) => s.trim().toLowerCase().replace(/\s+/g, ' ');

export type OccupationOffer = {
  lineId: string;
  line: string;
  isDefault: boolean;
  cruiseId: string;
  cruise: string;
  ship: string;
  startDate: string;
  why: ('same name' | 'same section identifier' | 'linked by hand')[];
  sectionId: string | null;
  linked: boolean;
};

/**
 * The lines of other cruises the user belongs to that are occupations of this line: the same name
 * (lines other than the default line, whose name says nothing), the same section identifier of
 * their casts, or linked by hand. The line itself comes first.
 */
export async function occupationsOf(
  userId: string,
  lineId: string,
): Promise<{ line: OccupationOffer; occupations: OccupationOffer[] }> {
  const row = await lineRowForMember(userId, lineId);
  const mine = (await Membership.findAll({ where: { userId }, attributes: ['cruiseId'] })).map((m) => m.cruiseId);
  const cruises = new Map((await Cruise.findAll({ where: { id: mine } })).map((c) => [c.id, c]));
  // default lines are made on first need: a cruise nobody has drawn yet has none stored
  for (const id of mine) await ensureDefaultLine(id);
  const lines = await Line.findAll({ where: { cruiseId: mine } });
  const sects = await sectionIds(mine);
  const links = (await Line.sequelize!.query(
    'SELECT line_a AS a, line_b AS b FROM line_links WHERE line_a = :id OR line_b = :id',
    { replacements: { id: row.id }, type: QueryTypes.SELECT },
  )) as { a: string; b: string }[];
  const linked = new Set(links.map((l) => (l.a === row.id ? l.b : l.a)));
  const mySect = sects.get(row.cruiseId) ?? null;
  const offer = (l: Line, why: OccupationOffer['why']): OccupationOffer => {
    const c = cruises.get(l.cruiseId)!;
    return {
      lineId: l.id,
      line: l.name,
      isDefault: l.isDefault,
      cruiseId: c.id,
      cruise: c.name,
      ship: c.ship,
      startDate: String(c.startDate),
      why,
      sectionId: sects.get(l.cruiseId) ?? null,
      linked: linked.has(l.id),
    };
  };
  const out: OccupationOffer[] = [];
  for (const l of lines) {
    if (l.cruiseId === row.cruiseId) continue;
    const why: OccupationOffer['why'] = [];
    if (!l.isDefault && !row.isDefault && normal(l.name) === normal(row.name)) why.push('same name');
    // a section identifier names the cruise's line as a whole: its default line, and lines of the same name
    if (
      mySect &&
      sects.get(l.cruiseId) === mySect &&
      (l.isDefault === row.isDefault || normal(l.name) === normal(row.name))
    )
      why.push('same section identifier');
    if (linked.has(l.id)) why.push('linked by hand');
    if (why.length) out.push(offer(l, why));
  }
  out.sort((p, q) => p.startDate.localeCompare(q.startDate) || p.line.localeCompare(q.line));
  return { line: offer(row, []), occupations: out };
}

/** Link two lines by hand as occupations of one line (idempotent); both cruises must be the user's. */
export async function linkLines(userId: string, lineId: string, otherId: string): Promise<void> {
  const a = await lineRowForMember(userId, lineId);
  const b = await lineRowForMember(userId, otherId);
  if (a.id === b.id)
    throw badRequest('A line is not an occupation of itself.', [{ field: 'line', message: 'same line' }]);
  if (a.cruiseId === b.cruiseId)
    throw conflict('Both lines belong to the same cruise; an occupation is a line of another cruise.');
  const [x, y] = a.id < b.id ? [a.id, b.id] : [b.id, a.id];
  await Line.sequelize!.query(
    `INSERT INTO line_links (id, line_a, line_b, created_by, created_at) VALUES (gen_random_uuid(), :x, :y, :u, now()) ON CONFLICT (line_a, line_b) DO NOTHING`,
    { replacements: { x, y, u: userId }, type: QueryTypes.INSERT },
  );
}

/** Remove a link made by hand; 404 when there is none. */
export async function unlinkLines(userId: string, lineId: string, otherId: string): Promise<void> {
  const a = await lineRowForMember(userId, lineId);
  const b = await lineRowForMember(userId, otherId);
  const [x, y] = a.id < b.id ? [a.id, b.id] : [b.id, a.id];
  const [, n] = (await Line.sequelize!.query('DELETE FROM line_links WHERE line_a = :x AND line_b = :y', {
    replacements: { x, y },
  })) as [unknown, { rowCount?: number } | number];
  const count = typeof n === 'number' ? n : (n?.rowCount ?? 0);
  if (!count) throw notFound('The two lines are not linked by hand.');
}
