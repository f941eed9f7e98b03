// parseUpload: one uploaded file (a cast, a station table, or a zip of them) to parsed casts and
// station rows, or to errors naming file, line and column. Never throws; all-or-nothing per upload.
import type { FileError, ParsedCast, ParseResult, StationRow } from '../../shared/schemas/cast';
import { ColumnMappingSchema } from '../../shared/schemas/cast';
import { detectFormat, type DetectedFormat } from './detect';
import { parseExchange } from './exchange';
import { parsePlain } from './plain';
import { parseStationTable } from './stationTable';
import { fileError, ParseFailure } from './text';
import { parseNetcdf } from './netcdf';
import { parseAcquisition } from './acquisition';

function bottleRefusal(file: string): FileError {
  return fileError(
    file,
    1,
    null,
    'exchange_bottle',
    'this is an exchange-format bottle file (sample data from the rosette); bottle data are not read yet. Upload the CTD files (_ct1.csv) of the cruise',
  );
}

function hdf5Refusal(file: string): FileError {
  return fileError(
    file,
    null,
    null,
    'netcdf_unsupported',
    'this is a netCDF-4 (HDF5) file, which is not read yet; save it as netCDF-3 classic and upload that',
  );
}
import { readZip, DEFAULT_ZIP_LIMITS, type ZipLimits } from './zip';

export type ParseOptions = {
  columnMapping?: Record<string, string>;
  /** Units a technician gave for columns without one, by column name (shared/api/intakeAnswers.ts). */
  unitAnswers?: Record<string, string>;
  maxBytes?: number; // of one file (and of each zip entry); default 50 MB
  zipLimits?: Partial<ZipLimits>;
  maxLevels?: number; // levels one cast may keep; default DEFAULT_MAX_LEVELS
  /** Leave out (and list) a few unreadable lines of a text file instead of refusing it (see build.ts). */
  salvage?: boolean;
};
export const DEFAULT_MAX_BYTES = 50 * 1024 * 1024;
/** A full-depth raw 24 Hz downcast (6000 dbar at 1 m/s) is about 150 000 scans. */
export const DEFAULT_MAX_LEVELS = 500_000;

/** A cast over the levels limit fails its file (the CAST_MAX_LEVELS setting; docs/security.md). */
function capLevels(r: One, maxLevels: number): One {
  if (!r.ok) return r;
  const big = r.casts.find((c) => c.profile.levels > maxLevels);
  if (!big) return r;
  return {
    ok: false,
    errors: [
      fileError(
        big.file,
        null,
        null,
        'too_many_levels',
        `the cast has ${big.profile.levels} levels (the limit is ${maxLevels}); split the file or average it to fewer scans`,
      ),
    ],
  };
}

export { detectFormat } from './detect';
export type { DetectedFormat } from './detect';

type One =
  | { ok: true; casts: ParsedCast[]; stations: StationRow[]; warnings: FileError[] }
  | { ok: false; errors: FileError[]; unmappedHeaders?: { file: string; headers: string[] } };

function failureOf(file: string, e: unknown): One {
  if (e instanceof ParseFailure) return { ok: false, errors: e.errors, unmappedHeaders: e.unmappedHeaders };
  const msg = e instanceof Error ? e.message : String(e);
  return { ok: false, errors: [fileError(file, null, null, 'internal_error', `the file could not be read: ${msg}`)] };
}

function parseSingle(
  file: string,
  bytes: Uint8Array,
  fmt: Exclude<DetectedFormat, 'zip'>,
  mapping: Record<string, string> | undefined,
  salvage = false,
  unitAnswers?: Record<string, string>,
): One {
  try {
    if (fmt === 'stationTable') {
      const r = parseStationTable(file, bytes);
      return { ok: true, casts: [], stations: r.stations, warnings: r.warnings };
    }
    if (fmt === 'netcdf') {
      const r = parseNetcdf(file, bytes, { columnMapping: mapping, unitAnswers });
      return { ok: true, casts: r.casts, stations: [], warnings: r.warnings };
    }
    if (fmt === 'acquisition') {
      const r = parseAcquisition(file, bytes, { columnMapping: mapping, unitAnswers, salvage });
      return { ok: true, casts: [r.cast], stations: [], warnings: r.warnings };
    }
    if (fmt === 'hdf5') return { ok: false, errors: [hdf5Refusal(file)] };
    if (fmt === 'exchangeBottle') return { ok: false, errors: [bottleRefusal(file)] };
    const r =
      fmt === 'exchange'
        ? parseExchange(file, bytes, { columnMapping: mapping, unitAnswers, salvage })
        : parsePlain(file, bytes, { columnMapping: mapping, unitAnswers, salvage });
    return { ok: true, casts: [r.cast], stations: [], warnings: r.warnings };
  } catch (e) {
    return failureOf(file, e);
  }
}

/** Fill a cast's missing metadata from the station table row of its station (and cast). */
export function applyStationTable(casts: ParsedCast[], stations: StationRow[], tableFile = 'station table'): void {
  for (const c of casts) {
    const st = c.metadata.station;
    if (st === null) continue;
    const row =
      stations.find((s) => s.station === st && s.cast !== null && s.cast === c.metadata.cast) ??
      stations.find((s) => s.station === st && s.cast === null) ??
      (c.metadata.cast === null ? stations.find((s) => s.station === st) : undefined);
    if (!row) continue;
    const filled: string[] = [];
    const md = c.metadata;
    if (md.latitude === null) {
      md.latitude = row.latitude;
      filled.push('latitude');
    }
    if (md.longitude === null) {
      md.longitude = row.longitude;
      filled.push('longitude');
    }
    if (md.time === null && row.time !== null) {
      md.time = row.time;
      filled.push('time');
    }
    if (md.bottomDepth === null && row.bottomDepth !== null) {
      md.bottomDepth = row.bottomDepth;
      filled.push('bottom depth');
    }
    if (md.cast === null && row.cast !== null) {
      md.cast = row.cast;
      filled.push('cast');
    }
    if (filled.length > 0) c.notes.push(`${filled.join(', ')} from ${tableFile} line ${row.line}`);
  }
}

const SKIP_IN_ZIP = /\.(pdf|md|docx?|xlsx?|odt|ods|png|jpe?g|gif|html?|xml|json)$|(^|\/)readme[^/]*$/i;

export async function parseUpload(filename: string, bytes: Buffer, options: ParseOptions = {}): Promise<ParseResult> {
  try {
    const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
    if (!(bytes instanceof Uint8Array))
      return { ok: false, errors: [fileError(filename, null, null, 'internal_error', 'no file content')] };
    if (bytes.length > maxBytes)
      return {
        ok: false,
        errors: [
          fileError(
            filename,
            null,
            null,
            'file_too_large',
            `the file is ${bytes.length} bytes (the limit is ${maxBytes})`,
          ),
        ],
      };
    let mapping: Record<string, string> | undefined;
    if (options.columnMapping !== undefined) {
      const m = ColumnMappingSchema.safeParse(options.columnMapping);
      if (!m.success)
        return {
          ok: false,
          errors: [
            fileError(
              filename,
              null,
              null,
              'bad_mapping',
              `the column mapping is not valid: ${m.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`,
            ),
          ],
        };
      mapping = m.data;
    }
    const fmt = detectFormat(filename, bytes);
    if (fmt !== 'zip') {
      const r = capLevels(
        parseSingle(filename, bytes, fmt, mapping, options.salvage, options.unitAnswers),
        options.maxLevels ?? DEFAULT_MAX_LEVELS,
      );
      if (r.ok && r.stations.length > 0) applyStationTable(r.casts, r.stations, filename);
      return r;
    }
    const buf = Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes);
    const { files, skipped } = await readZip(filename, buf, {
      ...DEFAULT_ZIP_LIMITS,
      maxEntryBytes: maxBytes,
      ...options.zipLimits,
    });
    const casts: ParsedCast[] = [];
    const stations: StationRow[] = [];
    const warnings: FileError[] = skipped.map((p) =>
      fileError(p, null, null, 'skipped', `zip entry ${p} skipped (hidden or system file)`),
    );
    const errors: FileError[] = [];
    let unmapped: { file: string; headers: string[] } | undefined;
    let tableFile = '';
    for (const f of files) {
      if (SKIP_IN_ZIP.test(f.path)) {
        warnings.push(fileError(f.path, null, null, 'skipped', `zip entry ${f.path} is not a cast file; skipped`));
        continue;
      }
      const r = capLevels(
        parseSingle(
          f.path,
          f.bytes,
          detectFormat(f.path, f.bytes) as Exclude<DetectedFormat, 'zip'>,
          mapping,
          options.salvage,
          options.unitAnswers,
        ),
        options.maxLevels ?? DEFAULT_MAX_LEVELS,
      );
      if (r.ok) {
        casts.push(...r.casts);
        if (r.stations.length > 0) tableFile = f.path;
        stations.push(...r.stations);
        warnings.push(...r.warnings);
      } else {
        errors.push(...r.errors);
        unmapped ??= r.unmappedHeaders;
      }
    }
    if (errors.length > 0) return unmapped ? { ok: false, errors, unmappedHeaders: unmapped } : { ok: false, errors };
    if (casts.length === 0 && stations.length === 0)
      return {
        ok: false,
        errors: [fileError(filename, null, null, 'zip_empty', 'the zip holds no cast files or station tables')],
      };
    applyStationTable(casts, stations, tableFile);
    return { ok: true, casts, stations, warnings };
  } catch (e) {
    const r = failureOf(filename, e);
    return r.ok
      ? r
      : { ok: false, errors: r.errors, ...(r.unmappedHeaders ? { unmappedHeaders: r.unmappedHeaders } : {}) };
  }
}
