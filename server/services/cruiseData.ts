// Reads a cruise's casts for the section engine and the exports, and builds the regridded
// tables. Results are cached per cruise and parameters; the cache key carries the cruise's data
// version (casts, flags and layer sets), so any change makes new keys in every process.
import { Cast } from '../models/index';
import { readColumns } from './columns';
import type { Inversion } from '../../shared/remap/index';

export type CruiseCast = {
  id: string; station: string; cast: string; latitude: number; longitude: number; time: Date | null; bottomDepth: number | null;
  inversions: Inversion[]; columns: Record<string, Float64Array>; flags: Record<string, Uint8Array>; units: Record<string, string | null>;
};

const cache = new Map<string, { at: number; value: unknown }>();
const MAX_CACHE = 200;
export function cached<T>(key: string, make: () => Promise<T> | T): Promise<T> {
  const hit = cache.get(key);
  if (hit) return Promise.resolve(hit.value as T);
  return Promise.resolve(make()).then((value) => {
    if (cache.size >= MAX_CACHE) cache.delete(cache.keys().next().value!);
    cache.set(key, { at: Date.now(), value });
    return value;
  });
}

// The version is read at most every half second per process: a change made through this process
// drops it at once (invalidateDataVersion); one made by another process shows within 0.5 s.
const VERSION_TTL_MS = 500;
const versions = new Map<string, { at: number; v: string }>();
export function invalidateDataVersion(cruiseId: string) {
  versions.delete(cruiseId);
}

/** A short fingerprint of everything a grid of this cruise depends on. */
export async function dataVersion(cruiseId: string): Promise<string> {
  const hit = versions.get(cruiseId);
  if (hit && Date.now() - hit.at < VERSION_TTL_MS) return hit.v;
  const v = await readDataVersion(cruiseId);
  versions.set(cruiseId, { at: Date.now(), v });
  return v;
}

async function readDataVersion(cruiseId: string): Promise<string> {
  const [rows] = await Cast.sequelize!.query(
    `SELECT (SELECT count(*) || ':' || coalesce(extract(epoch from max(updated_at)) * 1000, 0) FROM casts WHERE cruise_id = :id) || ':' ||
            (SELECT count(*) || ':' || coalesce(extract(epoch from max(updated_at)) * 1000, 0) FROM layer_sets WHERE cruise_id = :id) || ':' ||
            (SELECT count(*) || ':' || coalesce(extract(epoch from max(updated_at)) * 1000, 0) FROM derived_variables WHERE cruise_id = :id) || ':' ||
            (SELECT count(*) || ':' || coalesce(extract(epoch from max(updated_at)) * 1000, 0) FROM lines WHERE cruise_id = :id) || ':' ||
            (SELECT count(*) || ':' || coalesce(extract(epoch from max(updated_at)) * 1000, 0) FROM stations WHERE cruise_id = :id) AS v`,
    { replacements: { id: cruiseId } });
  return (rows as { v: string }[])[0].v;
}

/** names undefined: every column. */
export async function loadCruiseCasts(cruiseId: string, names?: string[]): Promise<CruiseCast[]> {
  const casts = await Cast.findAll({ where: { cruiseId }, order: [['time', 'ASC NULLS LAST'], ['station', 'ASC'], ['cast', 'ASC']] });
  const wanted = names ? [...new Set(['pressure', 'SA', 'CT', 'z', ...names, 'flag:temperature', 'flag:salinity', 'flag:conductivity'])] : undefined;
  const cols = await readColumns(casts.map((c) => c.id), wanted);
  // A cast row without its profile columns (never written by the ingest, but possible by hand) is left out.
  return casts.filter((c) => { const k = cols.get(c.id)!.columns; return k.pressure && k.SA && k.CT; }).map((c) => {
    const k = cols.get(c.id)!;
    return { id: c.id, station: c.station, cast: c.cast, latitude: c.latitude, longitude: c.longitude, time: c.time, bottomDepth: c.bottomDepth,
      inversions: c.inversions as Inversion[], columns: k.columns, flags: k.flags, units: k.units };
  });
}

/** Levels flagged outside `include` (1–9 scale; by default 1 and 2 kept) in T or S are set to NaN. */
export function applyFlags(c: CruiseCast, include: number[]): Record<string, Float64Array> {
  const bad = new Uint8Array(c.columns.pressure.length);
  // Only the flags of the variables density is made from decide whether a level is used.
  for (const [name, f] of Object.entries(c.flags)) {
    if (!/^flag:(temperature|salinity|conductivity)$/.test(name)) continue;
    for (let i = 0; i < f.length; i++) if (!include.includes(f[i])) bad[i] = 1;
  }
  if (!bad.some((b) => b)) return c.columns;
  const keep: number[] = [];
  for (let i = 0; i < bad.length; i++) if (!bad[i]) keep.push(i);
  const out: Record<string, Float64Array> = {};
  for (const [name, v] of Object.entries(c.columns)) {
    if (v.length !== bad.length) continue;
    const w = new Float64Array(keep.length);
    for (let j = 0; j < keep.length; j++) w[j] = v[keep[j]];
    out[name] = w;
  }
  return out;
}
