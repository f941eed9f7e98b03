// Repeat occupations (docs/occupations.md): two lines of (usually) two cruises compared on common
// positions — grids of both, the differences on pressure and on isopycnals, the heave, the
// Bindoff & McDougall (1994) decomposition, along-line means, the change of transport per layer —
// and which lines of other cruises count as occupations of a line (same name, same section
// identifier, or linked by hand). Access: the user must belong to both cruises (404 otherwise).
import { z } from 'zod';
import { gzipSync } from 'node:zlib';
import { QueryTypes } from 'sequelize';
import { Cruise, Line, Membership } from '../models/index';
import { cached, dataVersion, type CruiseCast } from './cruiseData';
import { loadLineCasts, ensureDefaultLine, type ResolvedLine } from './lines';
import { propertyColumns } from './sectionView';
import { resolveLevels } from './levels';
import { compareOccupations, type OccupationCast, type Comparison } from '../../shared/compare/index';
import { toRows } from '../../shared/section/index';
import { REFERENCE_PRESSURES } from '../../shared/api/levels';
import { badRequest, notFound, conflict } from '../lib/errors';

const uuid = z.string().regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i, 'a line id');
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

/** The cruise of a line, or null (unknown id). */
export async function lineCruiseId(lineId: unknown): Promise<string | null> {
  if (typeof lineId !== 'string' || !uuid.safeParse(lineId).success) return null;
  return (await Line.findByPk(lineId, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
}

/** The line's row when the user belongs to its cruise; 404 (as if it did not exist) otherwise. */
async function lineForMember(userId: string, lineId: string): Promise<Line> {
  // a line of a cruise the user does not belong to answers exactly like a line that does not exist
  const row = uuid.safeParse(lineId).success ? await Line.findByPk(lineId) : null;
  if (!row) throw notFound('No such line.');
  const m = await Membership.findOne({ where: { userId, cruiseId: row.cruiseId }, attributes: ['role'] });
  if (!m) throw notFound('No such line.');
  return row;
}

type Occupation = { row: Line; cruise: Cruise; line: ResolvedLine; casts: OccupationCast[]; raw: CruiseCast[] };

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

async function loadOccupation(row: Line, q: ComparisonBody): Promise<Occupation> {
  const cruise = (await Cruise.findByPk(row.cruiseId))!;
  const extra =
    q.property.startsWith('x:') || /^(sigma\d|CT|SA|SP|temperature|pt0|spiciness0|rho|oxygen)$/.test(q.property)
      ? [q.property]
      : undefined;
  const line = await loadLineCasts(row.cruiseId, row.id, extra);
  const raw = line.casts.filter((c) => c.columns.pressure && c.columns.pressure.length > 1);
  const values = raw.length ? await propertyColumns(row.cruiseId, q.property, raw) : [];
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
  return { row, cruise, line, casts, raw };
}

function deepest(o: Occupation[]): number {
  let d = 0;
  for (const occ of o)
    for (const c of occ.casts) {
      for (let i = c.p.length - 1; i >= 0; i--)
        if (Number.isFinite(c.p[i]) && !c.bad?.[i] && Number.isFinite(c.SA[i])) {
          if (c.p[i] > d) d = c.p[i];
          break;
        }
    }
  return d;
}

const rowsOf = (g: Float64Array, nx: number, ny: number, digits?: number) => {
  const rows = toRows(g, nx, ny);
  return digits ? rows.map((r) => r.map((v) => (v === null ? null : Number(v.toPrecision(digits))))) : rows;
};
const list = (a: Float64Array, digits?: number) =>
  Array.from(a, (v) => (Number.isFinite(v) ? (digits ? Number(v.toPrecision(digits)) : v) : null));

function occupationJson(o: Occupation) {
  const times = o.casts.map((c) => c.time).filter((t): t is number => t !== null);
  return {
    lineId: o.row.id,
    line: o.line.name,
    isDefaultLine: o.line.isDefault,
    cruiseId: o.cruise.id,
    cruise: o.cruise.name,
    ship: o.cruise.ship,
    firstCast: times.length ? new Date(Math.min(...times)).toISOString() : null,
    lastCast: times.length ? new Date(Math.max(...times)).toISOString() : null,
    casts: o.casts.length,
    lineExcluded: o.line.excluded,
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
      sa.push(Number(SA[i].toPrecision(6)));
      ct.push(Number(CT[i].toPrecision(6)));
    }
  }
  return { SA: sa, CT: ct };
}

/** The comparison answer (api.md, "The comparison of two occupations"), from the two loaded occupations. */
function answer(a: Occupation, b: Occupation, q: ComparisonBody, levelsText: string, r: Comparison) {
  const nx = r.x.length;
  const np = r.pressure.length;
  const ns = r.sigma.length;
  const d = q.digits;
  const P = (g: Float64Array) => rowsOf(g, nx, np, d);
  const S = (g: Float64Array) => rowsOf(g, nx, ns, d);
  const castIdA = new Map(a.line.stations.map((s) => [s.station, s.castId]));
  const castIdB = new Map(b.line.stations.map((s) => [s.station, s.castId]));
  const perDecade = r.years && Math.abs(r.years) > 1e-6 ? 10 / r.years : null;
  const { digits: _d, ...rest } = q;
  void _d;
  return {
    choices: {
      ...rest,
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
    positions: Array.from(r.x, (_, j) => ({ latitude: r.lat[j], longitude: r.lon[j] })),
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
export type ComparisonAnswer = ReturnType<typeof answer>;

/** The cache key of a comparison: both lines (and their last change), both cruises' data versions, the choices. */
async function comparisonKey(userId: string, q: ComparisonBody): Promise<{ key: string; rowA: Line; rowB: Line }> {
  const [rowA, rowB] = await Promise.all([lineForMember(userId, q.lineA), lineForMember(userId, q.lineB)]);
  const [vA, vB] = await Promise.all([dataVersion(rowA.cruiseId), dataVersion(rowB.cruiseId)]);
  return {
    key: `comparison:${rowA.id}:${rowA.updatedAt.getTime()}:${vA}:${rowB.id}:${rowB.updatedAt.getTime()}:${vB}:${JSON.stringify(q)}`,
    rowA,
    rowB,
  };
}

/** The comparison serialised, plain and gzipped, cached like a section: a warm read is a lookup and a write. */
export async function comparisonBodyBytes(userId: string, q: ComparisonBody): Promise<{ json: Buffer; gz: Buffer }> {
  const { key } = await comparisonKey(userId, q);
  return cached(`bytes:${key}`, async () => {
    const json = Buffer.from(JSON.stringify(await buildComparison(userId, q)));
    return { json, gz: gzipSync(json, { level: 6 }) };
  });
}

/** Build (or read from the cache) the comparison of two lines for a user who belongs to both cruises. */
export async function buildComparison(userId: string, q: ComparisonBody): Promise<ComparisonAnswer> {
  const { key, rowA, rowB } = await comparisonKey(userId, q);
  return cached(key, async () => {
    const a = await loadOccupation(rowA, q);
    const b = await loadOccupation(rowB, q);
    if (a.casts.length === 0 || b.casts.length === 0) {
      throw badRequest(`Line ${a.casts.length === 0 ? 'A' : 'B'} has no cast with a profile to compare.`, [
        { field: a.casts.length === 0 ? 'lineA' : 'lineB', message: 'no casts' },
      ]);
    }
    const lv = resolveLevels([...a.raw, ...b.raw], q.ref, q.levels ?? null);
    const pMax = q.pMax ?? deepest([a, b]);
    const np = Math.min(20000, Math.floor(pMax / q.bin + 1e-9) + 1);
    const pressure = Float64Array.from({ length: np }, (_, i) => i * q.bin);
    let layers: Float64Array | undefined;
    if (q.layers) {
      layers = Float64Array.from(q.layers.split(',').map(Number));
      for (let i = 1; i < layers.length; i++)
        if (!(layers[i] > layers[i - 1]))
          throw badRequest('The layer bounds must increase.', [{ field: 'layers', message: 'not increasing' }]);
    }
    const r = compareOccupations(a.casts, b.casts, {
      ref: q.ref,
      targets: lv.levels,
      pressure,
      handling: q.inversions,
      interpolation: q.interpolation,
      pairDistanceKm: q.pairDistanceKm,
      positions: q.positions,
      spacingKm: q.spacingKm,
      layers,
    });
    if (r.x.length === 0)
      throw badRequest(`No station of line A has a cast of line B within ${q.pairDistanceKm} km.`, [
        { field: 'pairDistanceKm', message: 'no pairs' },
      ]);
    return answer(a, b, q, lv.text, r);
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
  const row = await lineForMember(userId, lineId);
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
  const a = await lineForMember(userId, lineId);
  const b = await lineForMember(userId, otherId);
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
  const a = await lineForMember(userId, lineId);
  const b = await lineForMember(userId, otherId);
  const [x, y] = a.id < b.id ? [a.id, b.id] : [b.id, a.id];
  const [, n] = (await Line.sequelize!.query('DELETE FROM line_links WHERE line_a = :x AND line_b = :y', {
    replacements: { x, y },
  })) as [unknown, { rowCount?: number } | number];
  const count = typeof n === 'number' ? n : (n?.rowCount ?? 0);
  if (!count) throw notFound('The two lines are not linked by hand.');
}
