// Where an ingest's time went, per upload: kept in memory (the last 2000) for the ingest
// benchmark and logged at debug level. Nothing here is needed to ingest.
import { logger } from '../lib/logger';

export type IngestTiming = {
  uploadId: string;
  casts: number;
  levels: number;
  /** From the job's creation to its start in a worker (null when not known). */
  queueWaitMs: number | null;
  /** Upload row, raw bytes from object storage, column mapping and station plan. */
  fetchMs: number;
  parseMs: number;
  deriveMs: number;
  /** Waiting for a free compute thread (and the hand-over to it and back). */
  computeWaitMs: number;
  /** The all-or-nothing transaction that stores the casts and their columns. */
  storeMs: number;
};

const kept: IngestTiming[] = [];
let total = 0;

export function recordIngestTiming(t: IngestTiming): void {
  kept.push(t);
  total++;
  if (kept.length > 2000) kept.splice(0, kept.length - 2000);
  logger.debug(t, 'ingest timing');
}

/** A mark to read later timings from. */
export function ingestTimingsMark(): number {
  return total;
}

/** The timings recorded in this process since `mark` (from `ingestTimingsMark`). */
export function ingestTimingsSince(mark: number): IngestTiming[] {
  return kept.slice(Math.max(0, kept.length - (total - mark)));
}
