// The CPU-bound half of an ingest: parse the uploaded bytes (inflating a zip), fill positions from
// the station table or the cruise's plan, and derive every cast (server/services/processCast.ts).
// Pure: no I/O, so it runs in a worker thread (server/jobs/computePool.ts) and never on the web
// process's event loop. The store half stays in server/services/ingest.ts.
import { parseUpload } from '../parsers/index';
import type { FileError, ParsedCast, StationRow } from '../../shared/schemas/cast';
import { processCast, type ProcessedCast } from '../services/processCast';
import type { AskedField, CastAnswer, FileNeed } from '../../shared/api/intakeAnswers';
import { qcProfileFromColumns, runQc, type QcProposal } from '../../shared/qc/index';

export type PlannedStation = { latitude: number | null; longitude: number | null };

export type ParseRequest = {
  filename: string;
  bytes: Uint8Array;
  mapping: Record<string, string>;
  /** units answered at intake for columns without one (shared/api/intakeAnswers.ts) */
  unitAnswers?: Record<string, string>;
  maxBytes: number;
  /** total inflated bytes a zip may hold */
  maxInflatedBytes?: number;
  /** levels one cast may keep */
  maxLevels?: number;
  /** leave out (and list) a few unreadable lines of a text file instead of refusing it */
  salvage?: boolean;
};

/** A parsed cast without its columns (they live on in `out.columns`), as the store needs it. */
export type CastHead = Omit<ParsedCast, 'columns' | 'extras' | 'flags'>;

export type ParseOutcome =
  | { kind: 'parse_failed'; errors: FileError[]; unmappedHeaders: string[] | null; parseMs: number }
  | { kind: 'parsed'; casts: ParsedCast[]; stations: StationRow[]; warnings: FileError[]; parseMs: number };

export type DeriveRequest = {
  casts: ParsedCast[];
  stations: StationRow[];
  /** The cruise's planned stations by name (positions for casts that carry none). */
  plan: Record<string, PlannedStation>;
  inversionThreshold: number;
  /** metadata answered at intake, by file (shared/api/intakeAnswers.ts) */
  castAnswers?: Record<string, CastAnswer>;
};
/**
 * A derived cast as it crosses back to the thread that stores it: its column buffers are
 * transferred; its fitness (thousands of segments for a raw 24 Hz cast, ~1.8 MB of JSON) comes
 * as one JSON text, which the store binds as a parameter, so the storing thread neither rebuilds
 * nor re-serialises that object graph; the automatic QC proposals are computed here too.
 */
export type DerivedCast = {
  parsed: CastHead;
  out: Omit<ProcessedCast, 'fitness'>;
  fitnessJson: string;
  proposals: QcProposal[];
};
export type DeriveOutcome = {
  errors: FileError[];
  /** what each file lacks (the Intake screen asks); only files that lack anything */
  needs: FileNeed[];
  processed: DerivedCast[];
  deriveMs: number;
};

/** The first half: parse (and inflate) the upload. */
export async function parseForIngest(req: ParseRequest): Promise<ParseOutcome> {
  const t0 = performance.now();
  const bytes = Buffer.from(req.bytes.buffer, req.bytes.byteOffset, req.bytes.byteLength);
  const parsed = await parseUpload(req.filename, bytes, {
    columnMapping: req.mapping,
    unitAnswers: req.unitAnswers,
    maxBytes: req.maxBytes,
    maxLevels: req.maxLevels,
    salvage: req.salvage,
    zipLimits: req.maxInflatedBytes ? { maxTotalBytes: req.maxInflatedBytes } : undefined,
  });
  const parseMs = performance.now() - t0;
  if (!parsed.ok)
    return {
      kind: 'parse_failed',
      errors: parsed.errors,
      unmappedHeaders: parsed.unmappedHeaders?.headers ?? null,
      parseMs,
    };
  return { kind: 'parsed', casts: parsed.casts, stations: parsed.stations, warnings: parsed.warnings, parseMs };
}

/** The second half, for some of an upload's casts: positions from the station table or the plan,
 * then every derived column (processCast). Casts come back in the order given. */
export function deriveForIngest(req: DeriveRequest): DeriveOutcome {
  const t0 = performance.now();
  // Station tables: casts without a position take it from the table, else from the plan.
  const rowsByStation = new Map<string, StationRow>(req.stations.map((r) => [r.station, r]));
  const errors: FileError[] = [];
  const processed: DerivedCast[] = [];
  const needs: FileNeed[] = [];
  for (const c of req.casts) {
    const answer = req.castAnswers?.[c.file];
    const md = { ...c.metadata };
    const notes: string[] = [];
    // The file's own values first; then the technician's answer for this file; then the station table
    // and the plan. Every value that did not come from the file says where it came from.
    if (answer) {
      const given: string[] = [];
      if (md.station === null && answer.station !== undefined) {
        md.station = answer.station;
        given.push(`station ${answer.station}`);
      }
      if (md.cast === null && answer.cast !== undefined) {
        md.cast = answer.cast;
        given.push(`cast ${answer.cast}`);
      }
      if (
        (md.latitude === null || md.longitude === null) &&
        answer.latitude !== undefined &&
        answer.longitude !== undefined
      ) {
        md.latitude = answer.latitude;
        md.longitude = answer.longitude;
        given.push(`position ${answer.latitude}, ${answer.longitude}`);
      }
      if (md.time === null && answer.time !== undefined) {
        md.time = answer.time;
        given.push(`time ${answer.time}`);
      }
      if (given.length) notes.push(`${given.join(', ')} from the answers given at intake (the file does not say)`);
    }
    const row = md.station ? rowsByStation.get(md.station) : undefined;
    const planned = md.station ? req.plan[md.station] : undefined;
    if (md.latitude == null || md.longitude == null) {
      if (row) {
        md.latitude = row.latitude;
        md.longitude = row.longitude;
      } else if (planned?.latitude != null && planned.longitude != null) {
        md.latitude = planned.latitude;
        md.longitude = planned.longitude;
        notes.push(`position from the cruise's station plan (station ${md.station})`);
      }
    }
    md.bottomDepth ??= row?.bottomDepth ?? null;
    md.time ??= row?.time ?? null;
    const missing: AskedField[] = [];
    if (!md.station) missing.push('station');
    if (md.cast === null) missing.push('cast');
    if (md.latitude == null || md.longitude == null) missing.push('position');
    if (md.time === null) missing.push('time');
    const units = c.unitsNeeded ?? [];
    if (missing.length || units.length)
      needs.push({
        file: c.file,
        missing,
        units,
        known: {
          station: c.metadata.station,
          cast: c.metadata.cast,
          latitude: c.metadata.latitude,
          longitude: c.metadata.longitude,
          time: c.metadata.time,
        },
      });
    if (!md.station) {
      errors.push({
        file: c.file,
        line: null,
        column: null,
        code: 'bad_metadata',
        message: `${c.file}: no station identifier (add a "# station:" line or a station table, or answer below).`,
      });
      continue;
    }
    if (md.latitude == null || md.longitude == null) {
      errors.push({
        file: c.file,
        line: null,
        column: null,
        code: 'bad_metadata',
        message: `${c.file}: station ${md.station} has no position (add "# latitude:"/"# longitude:" lines, a station table, plan the station first, or answer below).`,
      });
      continue;
    }
    if (units.length) {
      errors.push({
        file: c.file,
        line: null,
        column: null,
        code: 'needs_answer',
        message: `${c.file}: the unit of ${units.map((u) => `"${u.column}"`).join(', ')} is not stated (${units.map((u) => u.role).join(', ')}: ml/l, µmol/l or µmol/kg?); answer below.`,
      });
      continue;
    }
    const result = processCast({ ...c, metadata: md }, { inversionThreshold: req.inversionThreshold });
    if (!result.ok) {
      errors.push(...result.errors);
      continue;
    }
    const { columns: _c, extras: _e, flags: _f, ...head } = c;
    const { fitness, ...out } = result.cast;
    processed.push({
      parsed: { ...head, metadata: md, notes: [...c.notes, ...notes] },
      out,
      fitnessJson: JSON.stringify(fitness),
      proposals: qcProposalsOf(out.columns, md.latitude, md.longitude, req.inversionThreshold),
    });
  }
  return { errors, needs, processed, deriveMs: performance.now() - t0 };
}

/** The automatic QC tests' proposals of a derived cast (as server/services/qcProposals.ts stores them). */
function qcProposalsOf(
  columns: ProcessedCast['columns'],
  latitude: number,
  longitude: number,
  threshold: number,
): QcProposal[] {
  const cols = Object.fromEntries(
    columns.filter((x) => x.kind !== 'flag').map((x) => [x.name, x.values as Float64Array]),
  );
  if (!cols.pressure || cols.pressure.length === 0) return [];
  return runQc(qcProfileFromColumns(cols, latitude, longitude), { inversionThreshold: threshold });
}

/** The distinct buffers of parsed casts' columns, to hand them to another thread without a copy. */
export function parsedTransferables(casts: ParsedCast[]): ArrayBuffer[] {
  const seen = new Set<ArrayBuffer>();
  const add = (a: ArrayBufferView | undefined) => {
    if (a && a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  };
  for (const c of casts) {
    for (const v of Object.values(c.columns)) add(v);
    for (const e of Object.values(c.extras)) add(e.values);
    for (const f of Object.values(c.flags)) add(f);
  }
  return [...seen];
}

/** The distinct buffers of derived casts' columns. */
export function derivedTransferables(processed: { out: Pick<ProcessedCast, 'columns'> }[]): ArrayBuffer[] {
  const seen = new Set<ArrayBuffer>();
  for (const { out } of processed)
    for (const col of out.columns) if (col.values.buffer instanceof ArrayBuffer) seen.add(col.values.buffer);
  return [...seen];
}
