// The CPU-bound half of an ingest: parse the uploaded bytes (inflating a zip), fill positions from
// the station table or the cruise's plan, and derive every cast (server/services/processCast.ts).
// Pure: no I/O, so it runs in a worker thread (server/jobs/computePool.ts) and never on the web
// process's event loop. The store half stays in server/services/ingest.ts.
import { parseUpload } from '../parsers/index';
import type { FileError, ParsedCast, StationRow } from '../../shared/schemas/cast';
import { processCast, type ProcessedCast } from '../services/processCast';

export type PlannedStation = { latitude: number | null; longitude: number | null };

export type ComputeRequest = {
  filename: string;
  bytes: Uint8Array;
  mapping: Record<string, string>;
  maxBytes: number;
  inversionThreshold: number;
  /** The cruise's planned stations by name (positions for casts that carry none). */
  plan: Record<string, PlannedStation>;
};

/** A parsed cast without its columns (they live on in `out.columns`), as the store needs it. */
export type CastHead = Omit<ParsedCast, 'columns' | 'extras' | 'flags'>;

export type ComputeTimings = { parseMs: number; deriveMs: number };

export type ComputeResult =
  | { kind: 'parse_failed'; errors: FileError[]; unmappedHeaders: string[] | null; timings: ComputeTimings }
  | { kind: 'invalid'; errors: FileError[]; timings: ComputeTimings }
  | { kind: 'ok'; stations: StationRow[]; warnings: FileError[]; processed: { parsed: CastHead; out: ProcessedCast }[]; timings: ComputeTimings };

/** Parse and derive one upload. `onParsed` is called between the two halves (for progress). */
export async function computeUpload(req: ComputeRequest, onParsed?: () => void): Promise<ComputeResult> {
  const t0 = performance.now();
  const bytes = Buffer.from(req.bytes.buffer, req.bytes.byteOffset, req.bytes.byteLength);
  const parsed = await parseUpload(req.filename, bytes, { columnMapping: req.mapping, maxBytes: req.maxBytes });
  const t1 = performance.now();
  if (!parsed.ok) {
    return { kind: 'parse_failed', errors: parsed.errors, unmappedHeaders: parsed.unmappedHeaders?.headers ?? null, timings: { parseMs: t1 - t0, deriveMs: 0 } };
  }
  onParsed?.();

  // Station tables: casts without a position take it from the table, else from the plan.
  const rowsByStation = new Map<string, StationRow>(parsed.stations.map((r) => [r.station, r]));
  const errors: FileError[] = [];
  const processed: { parsed: CastHead; out: ProcessedCast }[] = [];
  for (const c of parsed.casts) {
    const row = c.metadata.station ? rowsByStation.get(c.metadata.station) : undefined;
    const planned = c.metadata.station ? req.plan[c.metadata.station] : undefined;
    const md = { ...c.metadata };
    md.latitude ??= row?.latitude ?? planned?.latitude ?? null;
    md.longitude ??= row?.longitude ?? planned?.longitude ?? null;
    md.bottomDepth ??= row?.bottomDepth ?? null;
    md.time ??= row?.time ?? null;
    if (!md.station) { errors.push({ file: c.file, line: null, column: null, code: 'bad_metadata', message: `${c.file}: no station identifier (add a "# station:" line or a station table).` }); continue; }
    if (md.latitude == null || md.longitude == null) { errors.push({ file: c.file, line: null, column: null, code: 'bad_metadata', message: `${c.file}: station ${md.station} has no position (add "# latitude:"/"# longitude:" lines, a station table, or plan the station first).` }); continue; }
    const result = processCast({ ...c, metadata: md }, { inversionThreshold: req.inversionThreshold });
    if (!result.ok) { errors.push(...result.errors); continue; }
    const { columns: _c, extras: _e, flags: _f, ...head } = c;
    processed.push({ parsed: { ...head, metadata: md }, out: result.cast });
  }
  const timings = { parseMs: t1 - t0, deriveMs: performance.now() - t1 };
  if (errors.length) return { kind: 'invalid', errors, timings };
  return { kind: 'ok', stations: parsed.stations, warnings: parsed.warnings, processed, timings };
}

/** The distinct buffers of a result's columns, to hand them over to another thread without a copy. */
export function transferablesOf(r: ComputeResult): ArrayBuffer[] {
  if (r.kind !== 'ok') return [];
  const seen = new Set<ArrayBuffer>();
  for (const { out } of r.processed) for (const col of out.columns) if (col.values.buffer instanceof ArrayBuffer) seen.add(col.values.buffer);
  return [...seen];
}
