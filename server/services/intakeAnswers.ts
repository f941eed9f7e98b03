// The intake's answers of a cruise (shared/api/intakeAnswers.ts): what a technician said about files
// that lack a station, cast, position, time or the unit of a column. Remembered per cruise, read by
// the ingest (server/services/ingest.ts) and the preview of an upload.
import { QueryTypes, type Transaction } from 'sequelize';
import {
  CastAnswerSchema,
  unitAnswerKey,
  type CastAnswer,
  type FilePreview,
  type IntakeAnswers,
  type UploadPreview,
  type ValueSource,
} from '../../shared/api/intakeAnswers';
import { variableInfo } from '../../shared/api/variables';
import type { AppDeps } from '../lib/deps';
import { audit } from '../lib/audit';
import { HttpError } from '../lib/errors';
import { ColumnMapping, Station, type Upload } from '../models/index';
import { computePool } from '../jobs/computePool';
import type { ParsedCast } from '../../shared/schemas/cast';

type Row = { kind: string; key: string; value: unknown };

/** The cruise's remembered answers; a stored value that no longer passes the schema is left out. */
export async function loadIntakeAnswers(deps: AppDeps, cruiseId: string): Promise<IntakeAnswers> {
  const rows = await deps.db.sequelize.query<Row>(
    'SELECT kind, key, value FROM intake_answers WHERE cruise_id = :cruiseId ORDER BY kind, key',
    { replacements: { cruiseId }, type: QueryTypes.SELECT },
  );
  const out: IntakeAnswers = { units: {}, casts: {} };
  for (const r of rows) {
    if (r.kind === 'unit' && typeof r.value === 'string') out.units[r.key] = r.value as IntakeAnswers['units'][string];
    if (r.kind === 'cast') {
      const a = CastAnswerSchema.safeParse(r.value);
      if (a.success) out.casts[r.key] = a.data;
    }
  }
  return out;
}

/** Answers with the unit keys folded as the parsers look them up. */
export function foldAnswers(a: IntakeAnswers): IntakeAnswers {
  return { units: Object.fromEntries(Object.entries(a.units).map(([k, v]) => [unitAnswerKey(k), v])), casts: a.casts };
}

/** Remembered answers with new ones laid over them (a file's answer merges field by field). */
export function mergeAnswers(base: IntakeAnswers, over: IntakeAnswers): IntakeAnswers {
  const f = foldAnswers(over);
  const casts: Record<string, CastAnswer> = { ...base.casts };
  for (const [file, a] of Object.entries(f.casts)) casts[file] = { ...casts[file], ...a };
  return { units: { ...base.units, ...f.units }, casts };
}

/** Remember answers for the cruise (upsert, audited), in one transaction. */
export async function saveIntakeAnswers(
  deps: AppDeps,
  cruiseId: string,
  userId: string,
  answers: IntakeAnswers,
): Promise<IntakeAnswers> {
  const before = await loadIntakeAnswers(deps, cruiseId);
  const merged = mergeAnswers(before, answers);
  const f = foldAnswers(answers);
  await deps.db.sequelize.transaction(async (transaction: Transaction) => {
    const put = (kind: string, key: string, value: unknown) =>
      deps.db.sequelize.query(
        `INSERT INTO intake_answers (cruise_id, kind, key, value, updated_by, updated_at)
         VALUES (:cruiseId, :kind, :key, CAST(:value AS jsonb), :userId, now())
         ON CONFLICT (cruise_id, kind, key) DO UPDATE SET value = EXCLUDED.value, updated_by = EXCLUDED.updated_by,
           updated_at = EXCLUDED.updated_at`,
        { replacements: { cruiseId, kind, key, value: JSON.stringify(value), userId }, transaction },
      );
    for (const [k, v] of Object.entries(f.units)) await put('unit', k, v);
    for (const file of Object.keys(f.casts)) await put('cast', file, merged.casts[file]);
    await audit(
      { cruiseId, userId, action: 'intake_answers', entity: 'cruise', entityId: cruiseId, after: f },
      transaction,
    );
  });
  return merged;
}

const PREVIEW_FILES = 12;
const PREVIEW_ROWS = 8;
const PREVIEW_COLUMNS = ['pressure', 'temperature', 'SP', 'oxygen'] as const;

/**
 * The first rows of an upload's files as they will be read with these answers (laid over the
 * remembered ones, nothing stored): parsed with the cruise's column mapping and the unit answers,
 * metadata filled as the ingest fills it, derived (oxygen per kilogram) where the cast can be.
 */
export async function previewUpload(deps: AppDeps, upload: Upload, candidate: IntakeAnswers): Promise<UploadPreview> {
  const answers = mergeAnswers(await loadIntakeAnswers(deps, upload.cruiseId), candidate);
  let bytes: Buffer;
  try {
    bytes = await deps.storage.get(upload.storageKey);
  } catch {
    throw new HttpError(503, 'storage_unavailable', 'The file could not be read back from object storage; try again.');
  }
  const mapping = Object.fromEntries(
    (await ColumnMapping.findAll({ where: { cruiseId: upload.cruiseId } })).map((m) => [m.header, m.role]),
  );
  const stations = await Station.findAll({ where: { cruiseId: upload.cruiseId } });
  const pool = computePool();
  const parsed = await pool.parse({
    filename: upload.filename,
    bytes,
    mapping,
    unitAnswers: answers.units,
    maxBytes: deps.settings.UPLOAD_MAX_BYTES,
    maxInflatedBytes: deps.settings.UPLOAD_MAX_INFLATED_BYTES,
    maxLevels: deps.settings.CAST_MAX_LEVELS,
    salvage: true,
  });
  if (parsed.kind === 'parse_failed')
    return { files: [], more: 0, errors: parsed.errors.map((e) => ({ file: e.file, message: e.message })) };
  // The files that lack something first, then the others, as many as a screen can show.
  const needy = (c: ParsedCast) =>
    c.metadata.station === null ||
    c.metadata.latitude === null ||
    c.metadata.time === null ||
    c.metadata.cast === null ||
    (c.unitsNeeded?.length ?? 0) > 0;
  const casts = [...parsed.casts.filter(needy), ...parsed.casts.filter((c) => !needy(c))].slice(0, PREVIEW_FILES);
  // What the parser read, before the derive takes the buffers to its thread.
  const raw = new Map(
    casts.map((c) => [
      c.file,
      {
        levels: c.profile.levels,
        vertical: c.vertical,
        cols: {
          pressure: c.columns.pressure?.slice(0, PREVIEW_ROWS),
          depth: c.columns.depth?.slice(0, PREVIEW_ROWS),
          temperature: c.columns.temperature.slice(0, PREVIEW_ROWS),
          SP: c.columns.salinity?.slice(0, PREVIEW_ROWS),
          conductivity: c.columns.conductivity?.slice(0, PREVIEW_ROWS),
          oxygen: c.columns.oxygen?.slice(0, PREVIEW_ROWS),
        },
        units: c.units,
        unitsNeeded: c.unitsNeeded ?? [],
        metadata: c.metadata,
        notes: c.notes,
      },
    ]),
  );
  const planned = Object.fromEntries(stations.map((s) => [s.name, { latitude: s.latitude, longitude: s.longitude }]));
  const derived = await pool.derive({
    casts,
    stations: parsed.stations,
    plan: planned,
    inversionThreshold: deps.settings.INVERSION_THRESHOLD,
    castAnswers: answers.casts,
  });
  const byFile = new Map(derived.processed.map((p) => [p.parsed.file, p]));
  const needByFile = new Map(derived.needs.map((n) => [n.file, n]));
  const files: FilePreview[] = casts.map((c) => {
    const r = raw.get(c.file)!;
    const p = byFile.get(c.file);
    const need = needByFile.get(c.file);
    const md = p?.parsed.metadata;
    const answer = answers.casts[c.file];
    const fromFileName = (what: string) => r.notes.some((n) => n.includes(what) && /file name/.test(n));
    const src = (field: 'station' | 'cast' | 'latitude' | 'longitude' | 'time', value: unknown): ValueSource => {
      if (r.metadata[field] !== null) return fromFileName(field) ? 'file name' : 'file';
      if (value === null || value === undefined) return field === 'cast' ? 'default' : 'missing';
      if (answer && answer[field] !== undefined) return 'answer';
      return parsed.stations.length ? 'station table' : 'plan';
    };
    const station = md?.station ?? r.metadata.station ?? answer?.station ?? null;
    const cast = md?.cast ?? r.metadata.cast ?? answer?.cast ?? null;
    const lat = md?.latitude ?? r.metadata.latitude ?? answer?.latitude ?? null;
    const lon = md?.longitude ?? r.metadata.longitude ?? answer?.longitude ?? null;
    const time = md?.time ?? r.metadata.time ?? answer?.time ?? null;
    // Values as they will be stored: the derived columns when the cast can be derived (oxygen per
    // kilogram), else what the parser read (oxygen per litre where the file gave a volume unit).
    const cols: { name: string; label: string; unit: string; values: ArrayLike<number> | undefined }[] = [];
    const stored = (name: string) => p?.out.columns.find((col) => col.name === name);
    for (const name of PREVIEW_COLUMNS) {
      const s = stored(name);
      const info = variableInfo(name)!;
      const rv = r.cols[name];
      if (s)
        cols.push({ name, label: info.label, unit: name === 'oxygen' ? (s.unit ?? '') : info.unit, values: s.values });
      else if (rv)
        cols.push({
          name,
          label: info.label,
          unit: name !== 'oxygen' ? info.unit : r.unitsNeeded.length ? 'unit not stated' : (r.units.oxygen ?? ''),
          values: rv,
        });
    }
    if (!cols.some((col) => col.name === 'pressure') && r.cols.depth)
      cols.unshift({ name: 'depth', label: 'Depth', unit: 'm', values: r.cols.depth });
    const n = Math.min(PREVIEW_ROWS, r.levels);
    const rows: (number | null)[][] = [];
    for (let i = 0; i < n; i++)
      rows.push(
        cols.map((col) => {
          const x = col.values?.[i];
          return x === undefined || !Number.isFinite(x) ? null : x;
        }),
      );
    const stillMissing = [
      ...(need?.missing.filter((m) => m !== 'cast') ?? []),
      ...(need?.units.map((u) => `unit of ${u.column}`) ?? []),
    ];
    return {
      file: c.file,
      metadata: {
        station: { value: station, source: src('station', station) },
        cast: { value: cast ?? '1', source: src('cast', cast) },
        latitude: { value: lat, source: src('latitude', lat) },
        longitude: { value: lon, source: src('longitude', lon) },
        time: { value: time, source: src('time', time) },
      },
      columns: cols.map(({ name, label, unit }) => ({ name, label, unit })),
      rows,
      levels: r.levels,
      notes: p ? [...p.parsed.notes, ...p.out.notes] : r.notes,
      stillMissing,
    };
  });
  return {
    files,
    more: Math.max(0, parsed.casts.length - files.length),
    errors: derived.errors
      .filter((e) => e.code !== 'bad_metadata' && e.code !== 'needs_answer')
      .map((e) => ({ file: e.file, message: e.message })),
  };
}
