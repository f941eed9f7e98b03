// Reads a cruise's casts for the section engine and the exports, and builds the regridded
// tables. Results are cached per cruise and parameters; the cache key carries the cruise's data
// version (casts, flags and layer sets), so any change makes new keys in every process.
import { Cast, Cruise } from '../models/index';
import { readColumns } from './columns';
import { remapToIsopycnals, binToPressure, flagNames, type InversionHandling, type SigmaInterpolation, type Inversion } from '../../shared/remap/index';
import { sigma_batch } from '../../shared/seawater/index';
import { ISOPYCNAL_COLUMNS, PRESSURE_COLUMNS, type DeliveryTable, type DeliveryColumn, type DeliveryRow, type Provenance } from './deliveries/index';
import { VERSION } from '../version';
import { resolveLevels } from './levels';
import { DEFAULT_LEVELS_RULE } from '../../shared/api/levels';
import { loadLineCasts, lineProvenanceNote } from './lines';

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

/** levels: a specification as asked for, or null for the default levels of the reference pressure;
 * line: a line id (docs/lines.md), or undefined for the cruise's default line. */
export type IsopycnalRequest = {
  ref: number; levels: string | null; handling: InversionHandling; interpolation: SigmaInterpolation; flags: number[]; extras: string[]; line?: string;
};

export const EOS = 'TEOS-10 (IOC, SCOR & IAPSO 2010); density from the 75-term polynomial of Roquet et al. (2015)';
export const SAAR_SOURCE = 'McDougall et al. (2012) SAAR atlas, regenerated from Debian python3-gsw 3.6.16';

export async function provenanceFor(cruiseId: string, who: string, p: Partial<Provenance>): Promise<Provenance> {
  const c = (await Cruise.findByPk(cruiseId))!;
  return {
    software: 'Sigmaline', version: VERSION, equationOfState: EOS,
    functions: ['SA_from_SP', 'CT_from_t', 'sigma_pr', 'Nsquared', 'z_from_p'], saarSource: SAAR_SOURCE,
    referencePressure: null, layerSet: null, inversionHandling: null, interpolation: null, flagsIncluded: [1, 2],
    exportedBy: who, exportedAt: new Date().toISOString(), cruise: { id: c.id, name: c.name, ship: c.ship }, ...p,
  };
}

const num = (v: number) => (Number.isFinite(v) ? v : null);

export async function isopycnalTable(cruiseId: string, who: string, q: IsopycnalRequest): Promise<DeliveryTable> {
  const line = await loadLineCasts(cruiseId, q.line, q.extras);
  const casts = line.casts;
  const { text: levelsText, levels, isDefault } = resolveLevels(casts, q.ref, q.levels);
  const extraCols: DeliveryColumn[] = q.extras.map((e) => ({ name: e.replace(/[^A-Za-z0-9_]/g, '_').replace(/^(\d)/, '_$1'), unit: null, type: 'number' }));
  const rows: DeliveryRow[] = [];
  for (const c of casts) {
    const cols = applyFlags(c, q.flags);
    const sigma = sigma_batch(cols.SA, cols.CT, q.ref);
    const props: Record<string, Float64Array> = { CT: cols.CT, SA: cols.SA };
    for (const e of q.extras) if (cols[e]) props[e] = cols[e];
    const r = remapToIsopycnals({ p: cols.pressure, z: cols.z, sigma, props }, levels, { handling: q.handling, interpolation: q.interpolation });
    for (let k = 0; k < levels.length; k++) {
      const thick = r.thicknessDepth ?? r.thickness;
      const row: DeliveryRow = [c.station, c.cast, c.latitude, c.longitude, q.ref, levels[k], num(r.pressure[k]), r.depth ? num(r.depth[k]) : null,
        num(r.props.CT[k]), num(r.props.SA[k]), num(thick[k]), r.crossings[k], flagNames(r.flags[k]).join(';') || null];
      for (const e of q.extras) row.push(r.props[e] ? num(r.props[e][k]) : null);
      rows.push(row);
    }
  }
  return { kind: 'isopycnal', columns: [...ISOPYCNAL_COLUMNS, ...extraCols], rows,
    provenance: await provenanceFor(cruiseId, who, { referencePressure: q.ref, layerSet: levelsText, inversionHandling: q.handling, interpolation: q.interpolation, flagsIncluded: q.flags,
      notes: [lineProvenanceNote(line), ...(isDefault ? [`Levels: the default policy, ${DEFAULT_LEVELS_RULE}.`] : [])] }) };
}

export async function pressureTable(cruiseId: string, who: string, q: { bin: number; flags: number[]; extras: string[]; line?: string }): Promise<DeliveryTable> {
  const line = await loadLineCasts(cruiseId, q.line, ['sigma0', 'temperature', 'SP', 'depth', ...q.extras]);
  const casts = line.casts;
  const rows: DeliveryRow[] = [];
  const extraCols: DeliveryColumn[] = q.extras.map((e) => ({ name: e.replace(/[^A-Za-z0-9_]/g, '_').replace(/^(\d)/, '_$1'), unit: null, type: 'number' }));
  for (const c of casts) {
    const cols = applyFlags(c, q.flags);
    const props: Record<string, Float64Array> = {};
    for (const n of ['CT', 'SA', 'sigma0', 'z', 'temperature', 'SP', ...q.extras]) if (cols[n]) props[n] = cols[n];
    const b = binToPressure(cols.pressure, props, q.bin);
    for (let k = 0; k < b.pressure.length; k++) {
      if (b.count[k] === 0) continue;
      const g = (n: string) => (b.props[n] ? num(b.props[n][k]) : null);
      const z = g('z');
      const row: DeliveryRow = [c.station, c.cast, c.latitude, c.longitude, b.pressure[k], b.count[k], g('CT'), g('SA'), g('sigma0'), z === null ? null : -z, g('temperature'), g('SP')];
      for (const e of q.extras) row.push(g(e));
      rows.push(row);
    }
  }
  return { kind: 'pressure', columns: [...PRESSURE_COLUMNS, ...extraCols], rows,
    provenance: await provenanceFor(cruiseId, who, { layerSet: `pressure bins of ${q.bin} dbar`, flagsIncluded: q.flags, notes: [lineProvenanceNote(line)] }) };
}
