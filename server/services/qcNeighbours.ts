// The casts a technician compares a cast with: the previous and the next station of its line (the cruise's
// default line unless one is named; server/services/lines.ts), each with the cast the line draws there. A cast
// whose station is not on the line (off-line, excluded) falls back on the station plan, then on track order.
// `neighbourStations` is the one place that decides. Beside them, the same station in each earlier occupation of
// the line (`earlierPartners`): the occupations come from server/services/comparisons.ts (`occupationsOf`, which
// offers only lines of cruises the user belongs to), the partner is the earlier line's station nearest this cast
// within the pairing distance, as a comparison pairs stations (shared/compare/positions.ts).
import { Cast, Cruise, Station } from '../models/index';
import { lineRow, loadLineCasts } from './lines';
import { readColumns } from './columns';
import { occupationsOf } from './comparisons';
import { greatCircleKm } from '../../shared/section/distance';
import { notFound } from '../lib/errors';

/** Pairing distance of the earlier occupation's partner, km: the comparison's default (comparisons.ts). */
export const EARLIER_PAIR_KM = 20;
/** At most this many earlier occupations are offered (newest first). */
const EARLIER_MAX = 4;

const trackOrder = (a: Cast, b: Cast) =>
  (a.time?.getTime() ?? Infinity) - (b.time?.getTime() ?? Infinity) ||
  a.station.localeCompare(b.station) ||
  a.cast.localeCompare(b.cast);

/** The casts before and after `cast` along its line (else along the station plan, else in track order). */
export async function neighbourStations(
  cast: Cast,
  lineId?: string | null,
): Promise<{ previous: Cast | null; next: Cast | null; order: string }> {
  const line = await loadLineCasts(cast.cruiseId, lineId ?? null, ['pressure']);
  const k0 = line.stations.findIndex((s) => s.station === cast.station);
  if (k0 >= 0) {
    const prev = line.stations[k0 - 1];
    const next = line.stations[k0 + 1];
    const rows = await Cast.findAll({ where: { id: [prev?.castId, next?.castId].filter((x): x is string => !!x) } });
    const byId = new Map(rows.map((r) => [r.id, r]));
    return {
      previous: prev ? (byId.get(prev.castId) ?? null) : null,
      next: next ? (byId.get(next.castId) ?? null) : null,
      order: `the line “${line.name}”`,
    };
  }
  const casts = await Cast.findAll({
    where: { cruiseId: cast.cruiseId },
    attributes: ['id', 'cruiseId', 'station', 'cast', 'time', 'latitude', 'longitude'],
  });
  const plan = await Station.findAll({ where: { cruiseId: cast.cruiseId }, attributes: ['name', 'order'] });
  const rank = new Map(plan.map((s) => [s.name, s.order]));
  if (rank.has(cast.station)) {
    // first cast of each occupied, planned station, in plan order
    const byStation = new Map<string, Cast>();
    for (const c of [...casts].sort(trackOrder))
      if (rank.has(c.station) && !byStation.has(c.station)) byStation.set(c.station, c);
    const stations = [...byStation.keys()].sort((a, b) => rank.get(a)! - rank.get(b)!);
    const k = stations.indexOf(cast.station);
    return {
      previous: k > 0 ? byStation.get(stations[k - 1])! : null,
      next: k >= 0 && k < stations.length - 1 ? byStation.get(stations[k + 1])! : null,
      order: 'the station plan',
    };
  }
  const sorted = [...casts].sort(trackOrder);
  const k = sorted.findIndex((c) => c.id === cast.id);
  return {
    previous: k > 0 ? sorted[k - 1] : null,
    next: k >= 0 && k < sorted.length - 1 ? sorted[k + 1] : null,
    order: 'track order',
  };
}

const COLUMNS = ['pressure', 'temperature', 'SP', 'conductivity', 'oxygen', 'SA', 'CT', 'N2', 'p_mid'];
const json = (a: Float64Array | undefined) => (a ? Array.from(a, (v) => (Number.isFinite(v) ? v : null)) : undefined);

export interface NeighbourProfile {
  id: string;
  station: string;
  cast: string;
  /** which side: the previous or the next station */
  role: 'previous' | 'next';
  columns: Record<string, (number | null)[] | undefined>;
  extras: Record<string, (number | null)[]>;
}

/** One earlier occupation of the line, with the cast of the same station then (or why there is none). */
export interface EarlierOccupation {
  cruiseId: string;
  cruise: string;
  ship: string;
  /** the cruise's start date, YYYY-MM-DD */
  startDate: string;
  lineId: string;
  line: string;
  /** why the line counts as an occupation of this one (same name, section identifier, linked by hand) */
  why: string[];
  partner: {
    id: string;
    station: string;
    cast: string;
    /** the partner cast's time, ISO, or null when its file gave none */
    time: string | null;
    /** great-circle distance from this cast, km */
    offsetKm: number;
    columns: Record<string, (number | null)[] | undefined>;
    extras: Record<string, (number | null)[]>;
  } | null;
  /** when there is no partner: why */
  note: string | null;
}

const profileOf = (all: Record<string, Float64Array>) => {
  const extras: Record<string, (number | null)[]> = {};
  for (const [k, v] of Object.entries(all)) if (k.startsWith('x:')) extras[k.slice(2)] = json(v)!;
  return { columns: Object.fromEntries(COLUMNS.map((n) => [n, json(all[n])])), extras };
};

/**
 * The same station in each earlier occupation of the cast's line (the chosen line, else the default line),
 * newest first. Only occupations in cruises the user belongs to are considered (occupationsOf); "earlier" is a
 * cruise that started before this one. The partner is the station of the earlier line nearest this cast, if
 * within `pairKm`.
 */
export async function earlierPartners(
  userId: string,
  cast: Cast,
  lineId: string | null,
  pairKm: number,
): Promise<EarlierOccupation[]> {
  const row = await lineRow(cast.cruiseId, lineId);
  const here = (await Cruise.findByPk(cast.cruiseId, { attributes: ['startDate'] }))!;
  const { occupations } = await occupationsOf(userId, row.id);
  const earlier = occupations
    .filter((o) => o.startDate < String(here.startDate))
    .sort((a, b) => b.startDate.localeCompare(a.startDate))
    .slice(0, EARLIER_MAX);
  const found: {
    o: (typeof earlier)[number];
    castId: string | null;
    station?: string;
    cast?: string;
    km?: number;
    note: string | null;
  }[] = [];
  for (const o of earlier) {
    if (!Number.isFinite(cast.latitude) || !Number.isFinite(cast.longitude)) {
      found.push({ o, castId: null, note: 'This cast has no position to pair it by.' });
      continue;
    }
    const line = await loadLineCasts(o.cruiseId, o.lineId, ['pressure']);
    let best: (typeof line.stations)[number] | null = null;
    let d = Infinity;
    for (const s of line.stations) {
      const k = greatCircleKm(cast.longitude, cast.latitude, s.longitude, s.latitude);
      if (k < d) {
        d = k;
        best = s;
      }
    }
    if (!best || d > pairKm)
      found.push({
        o,
        castId: null,
        note: best
          ? `No station of ${o.cruise} within ${pairKm} km (the nearest, ${best.station}, is ${d.toFixed(1)} km away).`
          : `The line of ${o.cruise} has no station with a cast.`,
      });
    else found.push({ o, castId: best.castId, station: best.station, cast: best.cast, km: d, note: null });
  }
  const ids = found.map((f) => f.castId).filter((x): x is string => !!x);
  const cols = ids.length ? await readColumns(ids) : new Map();
  const times = new Map(
    (ids.length ? await Cast.findAll({ where: { id: ids }, attributes: ['id', 'time'] }) : []).map((c) => [
      c.id,
      c.time,
    ]),
  );
  return found.map(({ o, castId, station, cast: castName, km, note }) => ({
    cruiseId: o.cruiseId,
    cruise: o.cruise,
    ship: o.ship,
    startDate: o.startDate,
    lineId: o.lineId,
    line: o.line,
    why: o.why,
    partner:
      castId && cols.get(castId)
        ? {
            id: castId,
            station: station!,
            cast: castName!,
            time: times.get(castId)?.toISOString() ?? null,
            offsetKm: Number(km!.toFixed(2)),
            ...profileOf(cols.get(castId)!.columns),
          }
        : null,
    note,
  }));
}

/**
 * The neighbouring casts with their measured and TEOS-10 columns (and extras), for overlays; and the same station
 * in the earlier occupations of the line that the user may see.
 */
export async function neighboursOf(
  userId: string,
  castId: string,
  opts: { line?: string | null; pairKm?: number } = {},
): Promise<{ order: string; neighbours: NeighbourProfile[]; pairDistanceKm: number; earlier: EarlierOccupation[] }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  const lineId = opts.line ?? null;
  const pairKm = opts.pairKm ?? EARLIER_PAIR_KM;
  const { previous, next, order } = await neighbourStations(c, lineId);
  const list = [
    previous && { cast: previous, role: 'previous' as const },
    next && { cast: next, role: 'next' as const },
  ].filter((x) => !!x);
  const cols = await readColumns(list.map((x) => x.cast.id));
  return {
    order,
    neighbours: list.map(({ cast, role }) => ({
      id: cast.id,
      station: cast.station,
      cast: cast.cast,
      role,
      ...profileOf(cols.get(cast.id)!.columns),
    })),
    pairDistanceKm: pairKm,
    earlier: await earlierPartners(userId, c, lineId, pairKm),
  };
}
