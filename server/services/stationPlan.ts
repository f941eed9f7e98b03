// The station plan of a cruise: edit, remove and reorder planned stations, and read a pasted or
// imported station table into a change of the plan that is first previewed (nothing written) and then
// applied exactly as previewed (a token stands for the plan, its casts and the change).
//
// Occupied stations (a live cast carries the station's name) keep their name and stay in the plan:
// the casts stay where they are, and the default line orders them by the plan (server/services/lines.ts).
import { createHash } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { Cast, Station } from '../models/index';
import { audit } from '../lib/audit';
import { HttpError, badRequest, notFound } from '../lib/errors';
import { invalidateDataVersion } from './cruiseData';
import {
  parseStationTable,
  type PlanChange,
  type StationPatch,
  type StationResponse,
  type TableRow,
} from '../../shared/api/stations';
import type { AppDeps } from '../lib/deps';

type Values = { latitude: number; longitude: number; plannedDepth: number | null };
const valuesOf = (s: Station): Values => ({
  latitude: s.latitude,
  longitude: s.longitude,
  plannedDepth: s.plannedDepth,
});
const normLon = (lon: number) => (lon > 180 ? lon - 360 : lon);
/** Two coordinates or depths the same to the table's precision (1e-9 of a degree is 0.1 mm). */
const same = (a: number | null, b: number | null) => (a === null || b === null ? a === b : Math.abs(a - b) <= 1e-9);

async function plan(cruiseId: string, transaction?: Transaction) {
  return Station.findAll({
    where: { cruiseId },
    order: [
      ['order', 'ASC'],
      ['name', 'ASC'],
    ],
    transaction,
  });
}

/** Live casts a station name carries in the cruise. */
async function castCounts(cruiseId: string, transaction?: Transaction): Promise<Map<string, number>> {
  const rows = (await Cast.sequelize!.query(
    `SELECT station, count(*)::int AS n FROM casts
      WHERE cruise_id = :cruiseId AND removed_at IS NULL AND superseded_by IS NULL GROUP BY station`,
    { replacements: { cruiseId }, type: QueryTypes.SELECT, transaction },
  )) as { station: string; n: number }[];
  return new Map(rows.map((r) => [r.station, r.n]));
}

/** Holds the cruise's row for the transaction: plan changes of one cruise run one after the other. */
async function lockCruise(cruiseId: string, transaction: Transaction) {
  await Station.sequelize!.query('SELECT id FROM cruises WHERE id = :cruiseId FOR UPDATE', {
    replacements: { cruiseId },
    type: QueryTypes.SELECT,
    transaction,
  });
}

export function stationJson(s: Station, casts: number): StationResponse {
  return {
    id: s.id,
    name: s.name,
    latitude: s.latitude,
    longitude: s.longitude,
    plannedDepth: s.plannedDepth,
    order: s.order,
    occupied: casts > 0,
    casts,
  };
}

export async function listStations(cruiseId: string, transaction?: Transaction): Promise<StationResponse[]> {
  const [stations, counts] = await Promise.all([plan(cruiseId, transaction), castCounts(cruiseId, transaction)]);
  return stations.map((s) => stationJson(s, counts.get(s.name) ?? 0));
}

async function stationOf(cruiseId: string, stationId: string, transaction: Transaction): Promise<Station> {
  const s = await Station.findOne({ where: { id: stationId, cruiseId }, transaction });
  if (!s) throw notFound('No such station in this cruise.');
  return s;
}

const occupiedMessage = (name: string, n: number, what: string) =>
  `Station ${name} has ${n} cast${n === 1 ? '' : 's'}: ${what}`;

/** Edit a planned station's name, position or depth. An occupied station keeps its name (its casts carry it). */
export async function editStation(
  deps: AppDeps,
  cruiseId: string,
  stationId: string,
  patch: StationPatch,
  userId: string,
): Promise<StationResponse> {
  const out = await deps.db.sequelize.transaction(async (transaction) => {
    await lockCruise(cruiseId, transaction);
    const s = await stationOf(cruiseId, stationId, transaction);
    const counts = await castCounts(cruiseId, transaction);
    const n = counts.get(s.name) ?? 0;
    if (patch.name !== undefined && patch.name !== s.name) {
      if (n > 0)
        throw new HttpError(
          409,
          'station_occupied',
          occupiedMessage(
            s.name,
            n,
            'its casts carry this name, so the plan keeps it. Correct the position or depth here; a wrong name in the cast files is corrected by uploading the files again.',
          ),
          [{ field: 'name', message: 'occupied station' }],
        );
      if (await Station.findOne({ where: { cruiseId, name: patch.name }, transaction }))
        throw new HttpError(409, 'conflict', `Station ${patch.name} is already planned.`, [
          { field: 'name', message: 'already planned' },
        ]);
    }
    const before = { name: s.name, ...valuesOf(s) };
    await s.update(
      {
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        ...(patch.latitude !== undefined ? { latitude: patch.latitude } : {}),
        ...(patch.longitude !== undefined ? { longitude: normLon(patch.longitude) } : {}),
        ...(patch.plannedDepth !== undefined ? { plannedDepth: patch.plannedDepth } : {}),
      },
      { transaction },
    );
    await audit(
      {
        cruiseId,
        userId,
        action: 'update',
        entity: 'station',
        entityId: s.id,
        before,
        after: { name: s.name, ...valuesOf(s) },
      },
      transaction,
    );
    return stationJson(s, counts.get(s.name) ?? 0);
  });
  invalidateDataVersion(cruiseId);
  return out;
}

/** Remove a planned station; refused while it has casts (they stay, and they keep the station in the plan). */
export async function removeStation(deps: AppDeps, cruiseId: string, stationId: string, userId: string) {
  await deps.db.sequelize.transaction(async (transaction) => {
    await lockCruise(cruiseId, transaction);
    const s = await stationOf(cruiseId, stationId, transaction);
    const n = (await castCounts(cruiseId, transaction)).get(s.name) ?? 0;
    if (n > 0)
      throw new HttpError(
        409,
        'station_occupied',
        occupiedMessage(
          s.name,
          n,
          'an occupied station stays in the plan, which places it in the default line. Remove its casts first if the station was never meant to be there.',
        ),
      );
    await s.destroy({ transaction });
    // close the gap so the plan stays numbered 1…n
    await Station.sequelize!.query(
      'UPDATE stations SET "order" = "order" - 1, updated_at = now() WHERE cruise_id = :cruiseId AND "order" > :order',
      {
        replacements: { cruiseId, order: s.order },
        transaction,
      },
    );
    await audit(
      {
        cruiseId,
        userId,
        action: 'delete',
        entity: 'station',
        entityId: s.id,
        before: { name: s.name, ...valuesOf(s) },
      },
      transaction,
    );
  });
  invalidateDataVersion(cruiseId);
  return listStations(cruiseId);
}

/** Give the plan a new order: every station id once. */
export async function reorderStations(deps: AppDeps, cruiseId: string, ids: string[], userId: string) {
  if (new Set(ids).size !== ids.length)
    throw badRequest('A station is named twice in the new order.', [{ field: 'ids', message: 'duplicate' }]);
  await deps.db.sequelize.transaction(async (transaction) => {
    await lockCruise(cruiseId, transaction);
    const stations = await plan(cruiseId, transaction);
    const byId = new Map(stations.map((s) => [s.id, s]));
    if (ids.length !== stations.length || ids.some((id) => !byId.has(id)))
      throw new HttpError(
        409,
        'plan_changed',
        'The new order does not hold the stations of the plan as it is now; reload the plan and try again.',
      );
    const before = stations.map((s) => s.name);
    for (const [i, id] of ids.entries()) {
      const s = byId.get(id)!;
      if (s.order !== i + 1) await s.update({ order: i + 1 }, { transaction });
    }
    await audit(
      {
        cruiseId,
        userId,
        action: 'reorder',
        entity: 'station_plan',
        entityId: cruiseId,
        before: { order: before },
        after: { order: ids.map((id) => byId.get(id)!.name) },
      },
      transaction,
    );
  });
  invalidateDataVersion(cruiseId);
  return listStations(cruiseId);
}

type Mode = PlanChange['mode'];

/** The table's rows, or a 400 naming each bad line and column. */
function readTable(text: string): TableRow[] {
  const t = parseStationTable(text);
  if (!t.ok) {
    const first = t.problems[0];
    throw badRequest(
      `The station table has ${t.problems.length} problem${t.problems.length === 1 ? '' : 's'}; nothing was changed. First: line ${first.line}${first.column ? `, column ${first.column}` : ''}: ${first.message}.`,
      t.problems.map((p) => ({ line: p.line, column: p.column, field: p.field, message: p.message })),
      'bad_station_table',
    );
  }
  return t.rows;
}

/** What the table would change in the plan (pure: the plan, its cast counts and the rows in, the change out). */
export function planChange(
  stations: Station[],
  counts: Map<string, number>,
  rows: TableRow[],
  mode: Mode,
): Omit<PlanChange, 'token'> {
  const byName = new Map(stations.map((s) => [s.name, s]));
  const named = new Set(rows.map((r) => r.name));
  const added: PlanChange['added'] = [];
  const changed: PlanChange['changed'] = [];
  const unchanged: PlanChange['unchanged'] = [];
  const removed: PlanChange['removed'] = [];
  const keptOccupied: PlanChange['keptOccupied'] = [];
  for (const r of rows) {
    const after: Values = { latitude: r.latitude, longitude: r.longitude, plannedDepth: r.plannedDepth };
    const s = byName.get(r.name);
    if (!s) {
      added.push({ name: r.name, line: r.line, ...after });
      continue;
    }
    const before = valuesOf(s);
    const fields = (['latitude', 'longitude', 'plannedDepth'] as const).filter((f) => !same(before[f], after[f]));
    if (fields.length) changed.push({ id: s.id, name: s.name, line: r.line, before, after, fields: [...fields] });
    else unchanged.push({ id: s.id, name: s.name, named: true });
  }
  let order: string[];
  if (mode === 'merge') {
    for (const s of stations) if (!named.has(s.name)) unchanged.push({ id: s.id, name: s.name, named: false });
    order = [...stations.map((s) => s.name), ...added.map((a) => a.name)];
  } else {
    for (const s of stations)
      if (!named.has(s.name)) {
        const n = counts.get(s.name) ?? 0;
        if (n > 0) keptOccupied.push({ id: s.id, name: s.name, casts: n });
        else removed.push({ id: s.id, name: s.name, ...valuesOf(s) });
      }
    order = [...rows.map((r) => r.name), ...keptOccupied.map((k) => k.name)];
  }
  const survivors = new Set(order);
  const oldOrder = stations.map((s) => s.name).filter((n) => survivors.has(n));
  const newOrderOfOld = order.filter((n) => byName.has(n));
  const orderChanged = oldOrder.some((n, i) => newOrderOfOld[i] !== n);
  return {
    mode,
    rows: rows.length,
    added,
    changed,
    removed,
    unchanged,
    keptOccupied,
    order,
    orderChanged,
    empty: added.length === 0 && changed.length === 0 && removed.length === 0 && !orderChanged,
  };
}

/** The token of a change: it stands for the plan as it is, its occupied stations, and the change itself. */
function tokenOf(stations: Station[], counts: Map<string, number>, change: Omit<PlanChange, 'token'>): string {
  const h = createHash('sha256');
  h.update(
    JSON.stringify({
      plan: stations.map((s) => [s.id, s.name, s.latitude, s.longitude, s.plannedDepth, s.order]),
      casts: stations.map((s) => counts.get(s.name) ?? 0),
      change,
    }),
  );
  return h.digest('hex');
}

async function changeNow(cruiseId: string, text: string, mode: Mode, transaction?: Transaction): Promise<PlanChange> {
  const rows = readTable(text);
  const [stations, counts] = await Promise.all([plan(cruiseId, transaction), castCounts(cruiseId, transaction)]);
  const change = planChange(stations, counts, rows, mode);
  return { ...change, token: tokenOf(stations, counts, change) };
}

/** What a station table would change in the plan. Writes nothing. */
export async function previewStationTable(cruiseId: string, text: string, mode: Mode): Promise<PlanChange> {
  return changeNow(cruiseId, text, mode);
}

/**
 * Apply the previewed change: in one transaction, with the cruise held, the change is worked out again
 * and applied only when it is the one previewed (same token); else 409 and nothing written.
 */
export async function applyStationTable(
  deps: AppDeps,
  cruiseId: string,
  text: string,
  mode: Mode,
  token: string,
  userId: string,
) {
  const result = await deps.db.sequelize.transaction(async (transaction) => {
    await lockCruise(cruiseId, transaction);
    const change = await changeNow(cruiseId, text, mode, transaction);
    if (change.token !== token)
      throw new HttpError(
        409,
        'plan_changed',
        'The plan or its casts changed since this preview; nothing was changed. Preview the table again.',
      );
    if (change.empty) return { applied: change, stations: await listStations(cruiseId, transaction) };
    const stations = await plan(cruiseId, transaction);
    const byName = new Map(stations.map((s) => [s.name, s]));
    if (change.removed.length)
      await Station.destroy({ where: { cruiseId, id: change.removed.map((r) => r.id) }, transaction });
    for (const c of change.changed)
      await byName
        .get(c.name)!
        .update(
          { latitude: c.after.latitude, longitude: c.after.longitude, plannedDepth: c.after.plannedDepth },
          { transaction },
        );
    const position = new Map(change.order.map((n, i) => [n, i + 1]));
    // existing stations take their new places first (no two rows share an order while rows are added)
    for (const s of stations) {
      const o = position.get(s.name);
      if (o !== undefined && s.order !== o) await s.update({ order: o }, { transaction });
    }
    if (change.added.length)
      await Station.bulkCreate(
        change.added.map((a) => ({
          cruiseId,
          name: a.name,
          latitude: a.latitude,
          longitude: a.longitude,
          plannedDepth: a.plannedDepth,
          order: position.get(a.name)!,
        })),
        { transaction },
      );
    const { token: _t, unchanged: _u, ...recorded } = change;
    void _t;
    void _u;
    await audit(
      {
        cruiseId,
        userId,
        action: 'import_stations',
        entity: 'station_plan',
        entityId: cruiseId,
        before: { order: stations.map((s) => s.name) },
        after: recorded,
      },
      transaction,
    );
    return { applied: change, stations: await listStations(cruiseId, transaction) };
  });
  invalidateDataVersion(cruiseId);
  return result;
}
