// Reads a cruise's casts for the section engine and the exports, and builds the regridded
// tables. Results are cached per cruise and parameters; the cache key carries the cruise's data
// version (casts, flags and layer sets), so any change makes new keys in every process.
import { Cast } from '../models/index';
import { readColumns } from './columns';
import type { Inversion } from '../../shared/remap/index';

export type CruiseCast = {
  id: string;
  station: string;
  cast: string;
  latitude: number;
  longitude: number;
  time: Date | null;
  bottomDepth: number | null;
  inversions: Inversion[];
  columns: Record<string, Float64Array>;
  flags: Record<string, Uint8Array>;
  units: Record<string, string | null>;
};

// The cache of built grids (sections, T–S points, geostrophy): bounded by count and by bytes
// (SECTION_CACHE_MAX_BYTES, set by createApp), oldest out first; identical requests arriving while
// one is being built wait for that one build instead of starting their own.
const cache = new Map<string, { at: number; value: unknown; bytes: number }>();
const inflight = new Map<string, Promise<unknown>>();
const MAX_CACHE = 200;
let maxBytes = 128 * 1024 * 1024;
let cacheBytes = 0;
const stats = { builds: 0, hits: 0, joined: 0 };

export function configureCache(opts: { maxBytes: number }) {
  maxBytes = opts.maxBytes;
  evict(0);
}
/** Counts since start: builds run, cache hits, requests that joined a build in flight; bytes held. */
export function cacheStats() {
  return { ...stats, bytes: cacheBytes, entries: cache.size };
}

/** Rough bytes of a cached value: buffers by length, anything else by its JSON text (2 bytes a char). */
function sizeOf(v: unknown): number {
  if (Buffer.isBuffer(v)) return v.byteLength;
  if (v && typeof v === 'object' && !Array.isArray(v) && Object.values(v).every((x) => Buffer.isBuffer(x))) {
    return Object.values(v as Record<string, Buffer>).reduce((a, b) => a + b.byteLength, 0);
  }
  try {
    return 2 * (JSON.stringify(v)?.length ?? 0);
  } catch {
    return Number.POSITIVE_INFINITY;
  }
}

function evict(room: number) {
  for (const [k, e] of cache) {
    if (cache.size < MAX_CACHE && cacheBytes + room <= maxBytes) break;
    cache.delete(k);
    cacheBytes -= e.bytes;
  }
}

/** The cached value of key, made once; `size` gives its bytes when it is not buffers or JSON (typed arrays). */
export function cached<T>(key: string, make: () => Promise<T> | T, size?: (value: T) => number): Promise<T> {
  const hit = cache.get(key);
  if (hit) {
    stats.hits++;
    return Promise.resolve(hit.value as T);
  }
  const running = inflight.get(key);
  if (running) {
    stats.joined++;
    return running as Promise<T>;
  }
  stats.builds++;
  const p = Promise.resolve()
    .then(make)
    .then((value) => {
      const bytes = size ? size(value) : sizeOf(value);
      if (bytes <= maxBytes) {
        evict(bytes);
        cache.set(key, { at: Date.now(), value, bytes });
        cacheBytes += bytes;
      }
      return value;
    })
    .finally(() => inflight.delete(key));
  inflight.set(key, p);
  return p;
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
    { replacements: { id: cruiseId } },
  );
  return (rows as { v: string }[])[0].v;
}

/** names undefined: every column. stations: only the casts at these stations (a line's), else all. */
export async function loadCruiseCasts(cruiseId: string, names?: string[], stations?: string[]): Promise<CruiseCast[]> {
  const casts = await Cast.findAll({
    where: stations ? { cruiseId, station: stations } : { cruiseId },
    // only what a section, a line or a file reads (not the fitness figures or notes)
    attributes: ['id', 'station', 'cast', 'latitude', 'longitude', 'time', 'bottomDepth', 'inversions'],
    order: [
      ['time', 'ASC NULLS LAST'],
      ['station', 'ASC'],
      ['cast', 'ASC'],
    ],
  });
  const wanted = names
    ? [...new Set(['pressure', 'SA', 'CT', 'z', ...names, 'flag:temperature', 'flag:salinity', 'flag:conductivity'])]
    : undefined;
  const cols = await readColumns(
    casts.map((c) => c.id),
    wanted,
  );
  // A cast row without its profile columns (never written by the ingest, but possible by hand) is left out.
  return casts
    .filter((c) => {
      const k = cols.get(c.id)!.columns;
      return k.pressure && k.SA && k.CT;
    })
    .map((c) => {
      const k = cols.get(c.id)!;
      return {
        id: c.id,
        station: c.station,
        cast: c.cast,
        latitude: c.latitude,
        longitude: c.longitude,
        time: c.time,
        bottomDepth: c.bottomDepth,
        inversions: c.inversions as Inversion[],
        columns: k.columns,
        flags: k.flags,
        units: k.units,
      };
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
