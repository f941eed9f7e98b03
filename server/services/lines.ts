// Lines (docs/lines.md): a cruise's named, ordered station lists, each station with the cast chosen
// for it. Every section-shaped view and file is drawn from one line; without one asked for, from
// the cruise's default line, which is worked out from the casts and the plan at every read (so it
// is always current as casts arrive) and holds only the analyst's choices in its row.
import { QueryTypes, type Transaction } from 'sequelize';
import { Cast, Line, Station, type LineCastChoice } from '../models/index';
import { loadCruiseCasts, applyFlags, type CruiseCast } from './cruiseData';
import { readColumns } from './columns';
import { badRequest, conflict, notFound } from '../lib/errors';
import { offLineStations, stationsNearPolyline, lineDistances, type OffLineStation } from '../../shared/section/index';

export const DEFAULT_LINE_NAME = 'All stations';
/** Off-line rule factor: stations more than this many median station spacings off their neighbours' circle. */
export const OFF_LINE_FACTOR = 3;
export const DEFAULT_CORRIDOR_KM = 30;

export interface CompositeInfo {
  shallowCastId: string;
  shallowCast: string;
  deepCastId: string;
  deepCast: string;
  joinPressure: number;
}

export interface ResolvedStation {
  station: string;
  /** The cast drawn for the station (the deep cast of a composite). */
  castId: string;
  cast: string;
  latitude: number;
  longitude: number;
  /** How the cast was chosen: the station's deepest good cast, picked by the analyst, or a composite. */
  choice: 'deepest' | 'picked' | 'composite';
  composite: CompositeInfo | null;
  /** Deepest good pressure of the cast drawn, dbar. */
  deepest: number;
  /** Every cast at the station, deepest first, for the editor. */
  candidates: { castId: string; cast: string; deepest: number }[];
  note: string | null;
  /** Distance along the line, km. */
  x: number;
  /** Bottom depth at the station, m: from the cast's file, else the station plan; null when unknown. */
  bottomDepth: number | null;
  bottomSource: 'file' | 'plan' | null;
}

export interface ResolvedLine {
  id: string;
  name: string;
  isDefault: boolean;
  polyline: [number, number][] | null;
  corridorKm: number | null;
  stations: ResolvedStation[];
  /** Default line: stations left out by the off-line rule (PATCH include brings one back). */
  offLine: (OffLineStation & { castId: string; latitude: number; longitude: number })[];
  /** Default line: stations the analyst left out; any line: stations with no usable cast. */
  excluded: { station: string; why: string }[];
  /** Default line: the off-line stations the analyst took back in. */
  include: string[];
  /** The data of each station's cast, in line order (composites joined), for the section engine. */
  casts: CruiseCast[];
}

/** Deepest pressure with good T and S (flags 1, 2 or none) and finite SA and CT, dbar; -Infinity if none. */
export function deepestGood(c: CruiseCast): number {
  const k = applyFlags(c, [1, 2]);
  let deep = -Infinity;
  const p = k.pressure;
  if (!p) return deep;
  for (let i = 0; i < p.length; i++)
    if (Number.isFinite(p[i]) && Number.isFinite(k.SA?.[i]) && Number.isFinite(k.CT?.[i]) && p[i] > deep) deep = p[i];
  return deep;
}

/**
 * A composite cast: the shallow cast's levels above joinPressure, the deep cast's from it down
 * (dbar). Columns both casts carry, at their own length, are joined; flags likewise.
 */
export function compositeCast(shallow: CruiseCast, deep: CruiseCast, joinPressure: number): CruiseCast {
  const ps = shallow.columns.pressure;
  const pd = deep.columns.pressure;
  const top: number[] = [];
  const bottom: number[] = [];
  for (let i = 0; i < ps.length; i++) if (ps[i] < joinPressure) top.push(i);
  for (let i = 0; i < pd.length; i++) if (pd[i] >= joinPressure) bottom.push(i);
  const join = <T extends Float64Array | Uint8Array>(a: T, b: T, make: (n: number) => T): T => {
    const out = make(top.length + bottom.length);
    top.forEach((i, j) => {
      out[j] = a[i];
    });
    bottom.forEach((i, j) => {
      out[top.length + j] = b[i];
    });
    return out;
  };
  const columns: Record<string, Float64Array> = {};
  for (const [name, a] of Object.entries(shallow.columns)) {
    const b = deep.columns[name];
    if (b && a.length === ps.length && b.length === pd.length) columns[name] = join(a, b, (n) => new Float64Array(n));
  }
  const flags: Record<string, Uint8Array> = {};
  for (const [name, a] of Object.entries(shallow.flags)) {
    const b = deep.flags[name];
    if (b && a.length === ps.length && b.length === pd.length) flags[name] = join(a, b, (n) => new Uint8Array(n));
  }
  const inversions = [
    ...shallow.inversions.filter((v) => v.pBottom < joinPressure),
    ...deep.inversions.filter((v) => v.pTop >= joinPressure),
  ];
  return {
    ...deep,
    cast: `${shallow.cast}+${deep.cast}`,
    bottomDepth: deep.bottomDepth ?? shallow.bottomDepth,
    inversions,
    columns,
    flags,
  };
}

/** The cruise's default line row, made on first need (one per cruise, by a unique index). */
export async function ensureDefaultLine(cruiseId: string, transaction?: Transaction): Promise<Line> {
  const found = await Line.findOne({ where: { cruiseId, isDefault: true }, transaction });
  if (found) return found;
  await Line.sequelize!.query(
    `INSERT INTO lines (id, cruise_id, name, is_default, stations, casts, include, exclude, created_at, updated_at)
     VALUES (gen_random_uuid(), :cruiseId, :name, true, '[]', '{}', '[]', '[]', now(), now()) ON CONFLICT (cruise_id) WHERE is_default DO NOTHING`,
    { replacements: { cruiseId, name: DEFAULT_LINE_NAME }, type: QueryTypes.INSERT, transaction },
  );
  return (await Line.findOne({ where: { cruiseId, isDefault: true }, transaction }))!;
}

/** A line of the cruise by id (404 when it is not one of the cruise's), or the default line. */
export async function lineRow(cruiseId: string, lineId: string | undefined | null): Promise<Line> {
  if (!lineId) return ensureDefaultLine(cruiseId);
  if (!/^[0-9a-f-]{36}$/i.test(lineId)) throw notFound('No such line.');
  const row = await Line.findOne({ where: { id: lineId, cruiseId } });
  if (!row) throw notFound('No such line.');
  return row;
}

type StationCasts = { station: string; casts: CruiseCast[]; deepest: Map<string, number> };

function groupByStation(all: CruiseCast[]): Map<string, StationCasts> {
  const by = new Map<string, StationCasts>();
  for (const c of all) {
    let g = by.get(c.station);
    if (!g) {
      g = { station: c.station, casts: [], deepest: new Map() };
      by.set(c.station, g);
    }
    g.casts.push(c);
    g.deepest.set(c.id, deepestGood(c));
  }
  return by;
}

/** The station's deepest good cast (the earlier occupation on a tie); null when no cast has good data. */
function deepestCast(g: StationCasts): CruiseCast | null {
  let best: CruiseCast | null = null;
  let bestP = -Infinity;
  for (const c of g.casts) {
    const p = g.deepest.get(c.id)!;
    if (p > bestP) {
      best = c;
      bestP = p;
    }
  }
  return best && Number.isFinite(bestP) ? best : null;
}

function pickCast(
  g: StationCasts,
  choice: LineCastChoice | undefined,
): {
  cast: CruiseCast;
  choice: ResolvedStation['choice'];
  composite: CompositeInfo | null;
  note: string | null;
} | null {
  const deepest = deepestCast(g);
  if (choice !== undefined) {
    const byId = new Map(g.casts.map((c) => [c.id, c]));
    if (typeof choice === 'string') {
      const c = byId.get(choice);
      if (c && Number.isFinite(g.deepest.get(c.id)!)) return { cast: c, choice: 'picked', composite: null, note: null };
    } else {
      const s = byId.get(choice.shallow);
      const d = byId.get(choice.deep);
      if (s && d) {
        return {
          cast: compositeCast(s, d, choice.joinPressure),
          choice: 'composite',
          composite: {
            shallowCastId: s.id,
            shallowCast: s.cast,
            deepCastId: d.id,
            deepCast: d.cast,
            joinPressure: choice.joinPressure,
          },
          note: `composite: cast ${s.cast} above ${choice.joinPressure} dbar, cast ${d.cast} from ${choice.joinPressure} dbar down`,
        };
      }
    }
    if (deepest)
      return {
        cast: deepest,
        choice: 'deepest',
        composite: null,
        note: 'the cast chosen for this station is gone; its deepest good cast stands in',
      };
    return null;
  }
  return deepest ? { cast: deepest, choice: 'deepest', composite: null, note: null } : null;
}

/** Station names of the default line in order: the plan's order where there is a plan, then the
 * other stations in order of first occupation (casts come in time order). */
function defaultOrder(plan: Station[], groups: Map<string, StationCasts>): string[] {
  const names = plan.map((s) => s.name).filter((n) => groups.has(n));
  const seen = new Set(names);
  for (const name of groups.keys())
    if (!seen.has(name)) {
      names.push(name);
      seen.add(name);
    }
  return names;
}

/**
 * Resolve a line into its stations in order, each with its chosen cast (composites joined), the
 * distance along the line, and what was left out and why. `all` is the cruise's casts as
 * loadCruiseCasts gives them (time order).
 */
export async function resolveLine(cruiseId: string, row: Line, all: CruiseCast[]): Promise<ResolvedLine> {
  const groups = groupByStation(all);
  const plan = await Station.findAll({
    where: { cruiseId },
    attributes: ['name', 'order', 'plannedDepth'],
    order: [
      ['order', 'ASC'],
      ['name', 'ASC'],
    ],
  });
  const plannedDepth = new Map(plan.map((s) => [s.name, s.plannedDepth]));
  const excluded: ResolvedLine['excluded'] = [];
  let offLine: ResolvedLine['offLine'] = [];
  const chosen: {
    station: string;
    pick: NonNullable<ReturnType<typeof pickCast>>;
    g: StationCasts;
    fromPlan: boolean;
  }[] = [];
  const take = (name: string) => {
    const g = groups.get(name);
    if (!g) {
      excluded.push({ station: name, why: 'no cast at this station' });
      return;
    }
    const pick = pickCast(g, row.casts[name]);
    if (!pick) {
      excluded.push({ station: name, why: 'no cast with good data at this station' });
      return;
    }
    chosen.push({ station: name, pick, g, fromPlan: false });
  };
  if (row.isDefault) {
    const exclude = new Set(row.exclude);
    const order = defaultOrder(plan, groups).filter((n) => {
      if (exclude.has(n)) {
        excluded.push({ station: n, why: 'left out by the analyst' });
        return false;
      }
      return true;
    });
    for (const n of order) take(n);
    const include = new Set(row.include);
    const off = offLineStations(
      chosen.map((c) => ({ station: c.station, lon: c.pick.cast.longitude, lat: c.pick.cast.latitude })),
      OFF_LINE_FACTOR,
    ).filter((o) => !include.has(o.station));
    const offSet = new Set(off.map((o) => o.station));
    offLine = off.map((o) => {
      const c = chosen.find((x) => x.station === o.station)!;
      return { ...o, castId: c.pick.cast.id, latitude: c.pick.cast.latitude, longitude: c.pick.cast.longitude };
    });
    for (let i = chosen.length - 1; i >= 0; i--) if (offSet.has(chosen[i].station)) chosen.splice(i, 1);
  } else {
    for (const n of row.stations) take(n);
  }
  // The bottom: the cast's bottom depth, else the plan's depth of the station; else unknown.
  for (const c of chosen) {
    const planned = plannedDepth.get(c.station);
    if (c.pick.cast.bottomDepth === null && planned !== null && planned !== undefined && Number.isFinite(planned)) {
      c.pick = { ...c.pick, cast: { ...c.pick.cast, bottomDepth: planned } };
      c.fromPlan = true;
    }
  }
  const x = lineDistances(
    chosen.map((c) => ({ lon: c.pick.cast.longitude, lat: c.pick.cast.latitude })),
    row.polyline,
  );
  const stations: ResolvedStation[] = chosen.map((c, i) => ({
    station: c.station,
    castId: c.pick.cast.id,
    cast: c.pick.cast.cast,
    latitude: c.pick.cast.latitude,
    longitude: c.pick.cast.longitude,
    choice: c.pick.choice,
    composite: c.pick.composite,
    deepest: deepestGood(c.pick.cast),
    note: c.pick.note,
    x: x[i],
    bottomDepth: c.pick.cast.bottomDepth,
    bottomSource: c.pick.cast.bottomDepth === null ? null : c.fromPlan ? 'plan' : 'file',
    candidates: c.g.casts
      .map((k) => ({ castId: k.id, cast: k.cast, deepest: c.g.deepest.get(k.id)! }))
      .filter((k) => Number.isFinite(k.deepest))
      .sort((a, b) => b.deepest - a.deepest),
  }));
  return {
    id: row.id,
    name: row.name,
    isDefault: row.isDefault,
    polyline: row.polyline,
    corridorKm: row.corridorKm,
    stations,
    offLine,
    excluded,
    include: row.include,
    casts: chosen.map((c) => c.pick.cast),
  };
}

/** The casts of a line (or the default line) in line order with their distances: what every section-shaped route draws from. */
export async function loadLineCasts(
  cruiseId: string,
  lineId: string | undefined | null,
  names?: string[],
): Promise<ResolvedLine> {
  const row = await lineRow(cruiseId, lineId);
  // a drawn line needs only the casts at its stations; the default line weighs every station
  const all = await loadCruiseCasts(cruiseId, names, row.isDefault ? undefined : row.stations);
  return resolveLine(cruiseId, row, all);
}

/** A provenance note naming the line and its stations (every file carries it). */
export function lineProvenanceNote(l: ResolvedLine): string {
  const st = l.stations.map((s) =>
    s.composite
      ? `${s.station} (casts ${s.composite.shallowCast}+${s.composite.deepCast} joined at ${s.composite.joinPressure} dbar)`
      : `${s.station} (cast ${s.cast})`,
  );
  return `Line: ${l.name}${l.isDefault ? ' (the default line)' : ''}, id ${l.id}; ${l.stations.length} stations in order: ${st.join(', ')}`;
}

/** The JSON of a resolved line (without the cast data). */
export function lineJson(l: ResolvedLine) {
  const { casts: _casts, ...rest } = l;
  void _casts;
  return rest;
}

export async function listLines(cruiseId: string): Promise<ReturnType<typeof lineJson>[]> {
  await ensureDefaultLine(cruiseId);
  const rows = await Line.findAll({
    where: { cruiseId },
    order: [
      ['isDefault', 'DESC'],
      ['name', 'ASC'],
      ['createdAt', 'ASC'],
    ],
  });
  const all = await loadCruiseCasts(cruiseId, []);
  const out = [];
  for (const r of rows) out.push(lineJson(await resolveLine(cruiseId, r, all)));
  return out;
}

export type LineInput = {
  name?: string;
  stations?: string[];
  casts?: Record<string, LineCastChoice | null>;
  include?: string[];
  exclude?: string[];
  polyline?: [number, number][] | null;
  corridorKm?: number | null;
};

/** Checks of a line's stations and cast choices against the cruise's casts; throws 400 with details. */
async function checkInput(
  cruiseId: string,
  input: LineInput,
  isDefault: boolean,
): Promise<{ stations?: string[]; casts?: Record<string, LineCastChoice> }> {
  const rows = await Cast.findAll({
    where: { cruiseId },
    attributes: ['id', 'station', 'cast', 'latitude', 'longitude', 'time'],
    order: [
      ['time', 'ASC NULLS LAST'],
      ['station', 'ASC'],
      ['cast', 'ASC'],
    ],
  });
  const stationsKnown = new Map<string, { lon: number; lat: number }>();
  for (const r of rows)
    if (!stationsKnown.has(r.station)) stationsKnown.set(r.station, { lon: r.longitude, lat: r.latitude });
  const details: { field: string; message: string }[] = [];
  let stations = input.stations;
  if (isDefault && stations)
    throw badRequest('The default line takes its stations from the casts and the plan; use include and exclude.', [
      { field: 'stations', message: 'not for the default line' },
    ]);
  if (input.polyline && input.polyline.length >= 2 && !isDefault) {
    // stations near the drawn polyline, ordered by their projection on it
    const pool = stations ?? [...stationsKnown.keys()];
    const points = pool.filter((s) => stationsKnown.has(s)).map((s) => ({ station: s, ...stationsKnown.get(s)! }));
    const near = stationsNearPolyline(points, input.polyline, input.corridorKm ?? DEFAULT_CORRIDOR_KM);
    stations = near.map((p) => p.station);
    if (stations.length < 2)
      details.push({
        field: 'polyline',
        message: `fewer than two stations lie within ${input.corridorKm ?? DEFAULT_CORRIDOR_KM} km of the drawn line`,
      });
  }
  if (stations) {
    const seen = new Set<string>();
    stations.forEach((s, i) => {
      if (!stationsKnown.has(s)) details.push({ field: `stations[${i}]`, message: `no cast at station ${s}` });
      if (seen.has(s)) details.push({ field: `stations[${i}]`, message: `station ${s} is listed twice` });
      seen.add(s);
    });
    if (!isDefault && stations.length < 1)
      details.push({ field: 'stations', message: 'a line needs at least one station' });
  }
  for (const [k, list] of [
    ['include', input.include],
    ['exclude', input.exclude],
  ] as const) {
    if (list && !isDefault)
      details.push({ field: k, message: 'only the default line takes include and exclude; edit the stations list' });
  }
  let casts: Record<string, LineCastChoice> | undefined;
  if (input.casts) {
    casts = {};
    const byId = new Map(rows.map((r) => [r.id, r]));
    const needRange: string[] = [];
    for (const [station, choice] of Object.entries(input.casts)) {
      if (choice === null) continue;
      const ids = typeof choice === 'string' ? [choice] : [choice.shallow, choice.deep];
      for (const id of ids) {
        const c = byId.get(id);
        if (!c) details.push({ field: `casts.${station}`, message: `no cast ${id} in this cruise` });
        else if (c.station !== station)
          details.push({
            field: `casts.${station}`,
            message: `cast ${c.cast} (${id}) is at station ${c.station}, not ${station}`,
          });
      }
      if (typeof choice !== 'string') {
        if (choice.shallow === choice.deep)
          details.push({ field: `casts.${station}`, message: 'a composite needs two different casts' });
        needRange.push(choice.shallow, choice.deep);
      }
      casts[station] = choice;
    }
    if (!details.length && needRange.length) {
      const cols = await readColumns([...new Set(needRange)], ['pressure']);
      for (const [station, choice] of Object.entries(casts)) {
        if (typeof choice === 'string') continue;
        const ps = cols.get(choice.shallow)?.columns.pressure;
        const pd = cols.get(choice.deep)?.columns.pressure;
        if (!ps?.length || !pd?.length) {
          details.push({ field: `casts.${station}`, message: 'a cast of the composite has no profile' });
          continue;
        }
        if (!(ps[0] < choice.joinPressure))
          details.push({
            field: `casts.${station}.joinPressure`,
            message: `the shallow cast starts at ${ps[0]} dbar, below the join`,
          });
        if (!(pd[0] <= choice.joinPressure && pd[pd.length - 1] > choice.joinPressure))
          details.push({
            field: `casts.${station}.joinPressure`,
            message: `the deep cast spans ${pd[0]}–${pd[pd.length - 1]} dbar and does not cross the join`,
          });
        if (ps[ps.length - 1] < choice.joinPressure - 50)
          details.push({
            field: `casts.${station}.joinPressure`,
            message: `the shallow cast stops at ${ps[ps.length - 1]} dbar, more than 50 dbar above the join`,
          });
      }
    }
  }
  if (details.length) throw badRequest('The line is not valid.', details);
  return { stations, casts };
}

export async function createLine(
  cruiseId: string,
  userId: string | null,
  input: LineInput & { name: string },
  transaction: Transaction,
): Promise<Line> {
  if (!input.stations && !input.polyline)
    throw badRequest('A line needs its stations or a drawn polyline.', [{ field: 'stations', message: 'required' }]);
  const checked = await checkInput(cruiseId, input, false);
  return Line.create(
    {
      cruiseId,
      name: input.name,
      isDefault: false,
      stations: checked.stations ?? [],
      casts: checked.casts ?? {},
      polyline: input.polyline ?? null,
      corridorKm: input.polyline ? (input.corridorKm ?? DEFAULT_CORRIDOR_KM) : null,
      createdBy: userId,
    },
    { transaction },
  );
}

export async function updateLine(row: Line, input: LineInput, transaction: Transaction): Promise<Line> {
  const polylineChanged = input.polyline !== undefined;
  const checked = await checkInput(
    row.cruiseId,
    {
      ...input,
      polyline: polylineChanged ? input.polyline : undefined,
      stations: input.stations ?? (polylineChanged && input.polyline ? undefined : input.stations),
    },
    row.isDefault,
  );
  const next: Partial<Line> = {};
  if (input.name !== undefined) next.name = input.name;
  if (checked.stations) next.stations = checked.stations;
  if (input.casts) {
    const merged = { ...row.casts };
    for (const [k, v] of Object.entries(input.casts)) {
      if (v === null) delete merged[k];
      else merged[k] = v;
    }
    next.casts = merged;
  }
  if (input.include) next.include = input.include;
  if (input.exclude) next.exclude = input.exclude;
  if (polylineChanged) {
    next.polyline = input.polyline ?? null;
    next.corridorKm = input.polyline ? (input.corridorKm ?? row.corridorKm ?? DEFAULT_CORRIDOR_KM) : null;
  } else if (input.corridorKm !== undefined) next.corridorKm = input.corridorKm;
  row.changed('updatedAt', true);
  return row.update({ ...next, updatedAt: new Date() }, { transaction });
}

export async function deleteLine(row: Line, transaction: Transaction): Promise<void> {
  if (row.isDefault) throw conflict('The default line cannot be deleted.');
  await row.destroy({ transaction });
}
