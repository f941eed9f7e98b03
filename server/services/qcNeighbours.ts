// The casts a technician compares a cast with: the previous and the next station of its line (the cruise's
// default line unless one is named; server/services/lines.ts), each with the cast the line draws there. A cast
// whose station is not on the line (off-line, excluded) falls back on the station plan, then on track order.
// `neighbourStations` is the one place that decides.
import { Cast, Station } from '../models/index';
import { loadLineCasts } from './lines';
import { readColumns } from './columns';
import { notFound } from '../lib/errors';

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

const COLUMNS = ['pressure', 'temperature', 'SP', 'conductivity', 'oxygen', 'SA', 'CT'];
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

/** The neighbouring casts with their measured and TEOS-10 columns (and extras), for overlays. */
export async function neighboursOf(
  castId: string,
  lineId?: string | null,
): Promise<{ order: string; neighbours: NeighbourProfile[] }> {
  const c = await Cast.findByPk(castId);
  if (!c) throw notFound();
  const { previous, next, order } = await neighbourStations(c, lineId);
  const list = [
    previous && { cast: previous, role: 'previous' as const },
    next && { cast: next, role: 'next' as const },
  ].filter((x) => !!x);
  const cols = await readColumns(list.map((x) => x.cast.id));
  return {
    order,
    neighbours: list.map(({ cast, role }) => {
      const all = cols.get(cast.id)!.columns;
      const extras: Record<string, (number | null)[]> = {};
      for (const [k, v] of Object.entries(all)) if (k.startsWith('x:')) extras[k.slice(2)] = json(v)!;
      return {
        id: cast.id,
        station: cast.station,
        cast: cast.cast,
        role,
        columns: Object.fromEntries(COLUMNS.map((n) => [n, json(all[n])])),
        extras,
      };
    }),
  };
}
