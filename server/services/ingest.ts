// The ingest pipeline run by the background job: read the raw bytes from object storage, parse,
// validate, derive the TEOS-10 columns, find the inversions, and store every cast of the upload in
// one transaction (all or nothing). Re-running it for the same upload stores nothing twice.
import { Op } from 'sequelize';
import { Cast, CastColumn, ColumnMapping, Cruise, Station, Upload } from '../models/index';
import type { ParsedCast } from '../../shared/schemas/cast';
import { inversionsOfGoodLevels } from './processCast';
import type { DerivedCast } from '../jobs/ingestCompute';
import { computePool } from '../jobs/computePool';
import { recordIngestTiming } from '../jobs/ingestTimings';
import { writeColumns, writeColumnsOfCasts, type StoredColumn } from './columns';
import { recordQcAtIntake } from './qcProposals';
import { invalidateDataVersion } from './cruiseData';
import { loadIntakeAnswers } from './intakeAnswers';
import { audit } from '../lib/audit';
import { liveKey, replacementGate, supersede, inversionsAfterFlags, type Gate } from './castLife';
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { logger } from '../lib/logger';
import type { AppDeps } from '../lib/deps';

export class IngestFault extends Error {}
/** The cruise was locked after the upload was queued: the store is rolled back (nothing is stored). */
class CruiseLockedAtStore extends Error {}

/** What an upload says when its cruise was locked before its casts could be stored. */
export const LOCKED_AT_STORE_MESSAGE =
  'The cruise was locked before this upload could be stored; nothing was stored. A chief scientist can unlock the cruise, then retry the upload.';

export async function ingestUpload(
  deps: AppDeps,
  uploadId: string,
  opts: { reprocess?: boolean; queuedAt?: Date } = {},
): Promise<void> {
  const { sequelize } = deps.db;
  const t0 = performance.now();
  const upload = await Upload.findByPk(uploadId);
  if (!upload) return; // deleted meanwhile
  if (upload.status === 'ready' && !opts.reprocess) return; // a retried job after success: nothing to do
  await upload.update({ status: 'processing', progress: 0.05 });

  let bytes: Buffer;
  try {
    bytes = await deps.storage.get(upload.storageKey);
  } catch (err) {
    await upload.update({ status: 'queued', progress: 0 });
    throw new IngestFault(`object storage unavailable: ${(err as Error).message}`);
  }
  const mapping = Object.fromEntries(
    (await ColumnMapping.findAll({ where: { cruiseId: upload.cruiseId } })).map((m) => [m.header, m.role]),
  );
  // What the technician answered for this cruise's files (units of columns, metadata of files).
  const answers = await loadIntakeAnswers(deps, upload.cruiseId);
  // Station tables: fill or update the plan; casts without a position take it from the plan.
  const stations = await Station.findAll({ where: { cruiseId: upload.cruiseId } });
  const plan = new Map(stations.map((s) => [s.name, s]));
  const tFetched = performance.now();

  // Parse, then derive, in the compute pool's threads, never on this process's event loop; the
  // casts of a zip are shared out over the threads.
  const pool = computePool();
  const parsedUpload = await pool.parse({
    filename: upload.filename,
    bytes,
    mapping,
    unitAnswers: answers.units,
    maxBytes: deps.settings.UPLOAD_MAX_BYTES,
    maxInflatedBytes: deps.settings.UPLOAD_MAX_INFLATED_BYTES,
    maxLevels: deps.settings.CAST_MAX_LEVELS,
    salvage: true,
  });
  if (parsedUpload.kind === 'parse_failed') {
    await upload.update({
      status: 'failed',
      progress: 1,
      errors: parsedUpload.errors,
      unmappedHeaders: parsedUpload.unmappedHeaders,
      needs: null,
    });
    return;
  }
  await Upload.update({ progress: 0.3 }, { where: { id: uploadId, status: 'processing' } });
  const planned = Object.fromEntries(stations.map((s) => [s.name, { latitude: s.latitude, longitude: s.longitude }]));
  const shares = Math.max(1, Math.min(pool.size, parsedUpload.casts.length));
  const per = Math.ceil(parsedUpload.casts.length / shares);
  const derivedParts = await Promise.all(
    Array.from({ length: shares }, (_, k) =>
      pool.derive({
        casts: parsedUpload.casts.slice(k * per, (k + 1) * per),
        stations: parsedUpload.stations,
        plan: planned,
        inversionThreshold: deps.settings.INVERSION_THRESHOLD,
        castAnswers: answers.casts,
      }),
    ),
  );
  const derivedErrors = derivedParts.flatMap((d) => d.errors);
  if (derivedErrors.length) {
    // What the files lack is listed for the whole upload, so the Intake screen asks it all at once.
    const needs = derivedParts.flatMap((d) => d.needs);
    await upload.update({ status: 'failed', progress: 1, errors: derivedErrors, needs: needs.length ? needs : null });
    return;
  }
  const parsed = { stations: parsedUpload.stations, warnings: parsedUpload.warnings };
  const processed = derivedParts.flatMap((d) => d.processed);
  const computed = {
    timings: { parseMs: parsedUpload.parseMs, deriveMs: derivedParts.reduce((s, d) => s + d.deriveMs, 0) },
  };
  const tComputed = performance.now();
  // Cast life: one live cast per station and cast; a corrected file asks whether it replaces.
  const gate = opts.reprocess
    ? null
    : await replacementGate(
        upload,
        processed.map((p) => ({
          file: p.parsed.file,
          station: p.parsed.metadata.station!,
          cast: p.parsed.metadata.cast ?? '1',
        })),
      );
  if (gate?.stop) return;
  const skippedKeys = new Set((gate && !gate.stop ? gate.skipped : []).map((s) => liveKey(s.station, s.cast)));
  await upload.update({ progress: 0.7 });

  try {
    const castIds = await sequelize.transaction(async (transaction) => {
      // The lock is checked here, at store time, whatever it was when the upload was queued: the
      // cruise row is read FOR SHARE, so a lock that comes now waits until this store has committed.
      const cruise = await Cruise.findByPk(upload.cruiseId, { transaction, lock: transaction.LOCK.SHARE });
      if (!cruise || cruise.locked) throw new CruiseLockedAtStore();
      const ids: string[] = [];
      const pendingColumns: { castId: string; columns: StoredColumn[] }[] = [];
      let order = Math.max(0, ...stations.map((s) => s.order));
      for (const r of parsed.stations) {
        const s = plan.get(r.station);
        if (s)
          await s.update(
            { latitude: r.latitude, longitude: r.longitude, plannedDepth: r.bottomDepth ?? s.plannedDepth },
            { transaction },
          );
        else
          plan.set(
            r.station,
            await Station.create(
              {
                cruiseId: upload.cruiseId,
                name: r.station,
                latitude: r.latitude,
                longitude: r.longitude,
                plannedDepth: r.bottomDepth,
                order: ++order,
              },
              { transaction },
            ),
          );
      }
      for (const { parsed: c, out, fitnessJson } of processed) {
        if (skippedKeys.has(liveKey(c.metadata.station!, c.metadata.cast ?? '1'))) continue;
        const existing = await Cast.findOne({
          where: { cruiseId: upload.cruiseId, sourceSha256: upload.sha256, sourceFile: c.file },
          transaction,
        });
        if (existing && !opts.reprocess) {
          ids.push(existing.id);
          continue;
        }
        if (existing) {
          // Re-run processing in place: same cast id, new derived columns and inversions; quality
          // flags a technician set are kept and still silence the levels they mark.
          const oldFlags = await CastColumn.findAll({ where: { castId: existing.id, kind: 'flag' }, transaction });
          const kept = Object.fromEntries(oldFlags.map((r) => [r.name, new Uint8Array(r.values)]));
          await CastColumn.destroy({ where: { castId: existing.id }, transaction });
          const columns = out.columns.map((col) =>
            col.kind === 'flag' && kept[col.name]?.length === col.values.length
              ? { ...col, values: kept[col.name] }
              : col,
          );
          await writeColumns(existing.id, columns, transaction);
          const byName = Object.fromEntries(
            columns.filter((col) => col.kind !== 'flag').map((col) => [col.name, col.values as Float64Array]),
          );
          const flagsNow = Object.fromEntries(
            columns.filter((col) => col.kind === 'flag').map((col) => [col.name, col.values as Uint8Array]),
          );
          const inversions = inversionsOfGoodLevels(byName, flagsNow, deps.settings.INVERSION_THRESHOLD);
          existing.changed('updatedAt', true);
          await existing.update(
            {
              levels: out.levels,
              inversions,
              inversionCount: inversions.length,
              notes: [...c.notes, ...out.notes],
              updatedAt: new Date(),
            },
            { transaction },
          );
          await storeFitness(existing.id, fitnessJson, transaction);
          ids.push(existing.id);
          continue;
        }
        const md = c.metadata;
        const life = await newVersionOf(gate, c, out, upload, deps.settings.INVERSION_THRESHOLD, transaction);
        const cast = await Cast.create(
          {
            cruiseId: upload.cruiseId,
            uploadId: upload.id,
            station: md.station!,
            cast: md.cast ?? '1',
            latitude: md.latitude!,
            longitude: md.longitude!,
            time: md.time ? new Date(md.time) : null,
            bottomDepth: md.bottomDepth,
            levels: out.levels,
            inversionCount: out.inversions.length,
            inversions: out.inversions,
            fitness: {},
            metadata: {
              ...md.extra,
              format: c.format,
              units: c.units,
              profile: c.profile,
              saar: out.saar,
              mixedLayer: out.mld,
            },
            notes: [...c.notes, ...out.notes, ...life.notes],
            sourceFile: c.file,
            sourceSha256: upload.sha256,
            ...life.fields,
          },
          { transaction },
        );
        if (life.replaced)
          await audit(
            {
              cruiseId: upload.cruiseId,
              userId: upload.createdBy,
              action: 'replace_cast',
              entity: 'cast',
              entityId: cast.id,
              before: { castId: life.replaced, file: life.replacedFile },
              after: { file: c.file, upload: upload.id, flagsCarried: life.carried, notCarried: life.notCarried },
            },
            transaction,
          );
        await storeFitness(cast.id, fitnessJson, transaction);
        pendingColumns.push({ castId: cast.id, columns: out.columns });
        ids.push(cast.id);
      }
      await writeColumnsOfCasts(pendingColumns, transaction);
      // QC desk: proposals of the automatic tests and what the intake found (server/services/qcProposals.ts)
      // (the casts left out for an earlier version have no id here, so they are left out of the batch too)
      const kept = processed.filter(
        ({ parsed: c }) => !skippedKeys.has(liveKey(c.metadata.station!, c.metadata.cast ?? '1')),
      );
      await recordQcAtIntake(
        deps,
        { cruiseId: upload.cruiseId, castIds: ids, processed: kept },
        { reprocess: !!opts.reprocess },
        transaction,
      );
      const keptNote = skippedKeys.size
        ? [
            {
              file: upload.filename,
              line: null,
              column: null,
              code: 'kept_earlier',
              message: `${skippedKeys.size} cast${skippedKeys.size > 1 ? 's' : ''} left out: the earlier versions were kept`,
            },
          ]
        : [];
      await upload.update(
        {
          status: 'ready',
          progress: 1,
          castIds: ids,
          warnings: [...parsed.warnings, ...keptNote],
          errors: [],
          needs: null,
        },
        { transaction },
      );
      await audit(
        {
          cruiseId: upload.cruiseId,
          userId: upload.createdBy,
          action: opts.reprocess ? 'reprocess' : 'ingest',
          entity: 'upload',
          entityId: upload.id,
          after: { casts: ids.length, stations: parsed.stations.length },
        },
        transaction,
      );
      return ids;
    });
    invalidateDataVersion(upload.cruiseId);
    const tStored = performance.now();
    recordIngestTiming({
      uploadId,
      casts: castIds.length,
      levels: processed.reduce((n, p) => n + p.out.levels, 0),
      queueWaitMs: opts.queuedAt ? Math.max(0, Date.now() - (tStored - t0) - opts.queuedAt.getTime()) : null,
      fetchMs: tFetched - t0,
      parseMs: computed.timings.parseMs,
      deriveMs: computed.timings.deriveMs,
      computeWaitMs: Math.max(0, tComputed - tFetched - computed.timings.parseMs - computed.timings.deriveMs / shares),
      storeMs: tStored - tComputed,
    });
    logger.info({ uploadId, casts: castIds.length }, 'upload ingested');
  } catch (err) {
    if (err instanceof CruiseLockedAtStore) {
      await upload.update({
        status: 'failed',
        progress: 1,
        castIds: [],
        errors: [
          { file: upload.filename, line: null, column: null, code: 'cruise_locked', message: LOCKED_AT_STORE_MESSAGE },
        ],
      });
      logger.info({ uploadId }, 'upload not stored: the cruise is locked');
      return;
    }
    await Upload.update(
      { status: 'queued', progress: 0 },
      { where: { id: uploadId, status: { [Op.ne]: 'ready' } } },
    ).catch(() => undefined);
    throw err;
  }
}

/** A cast's fitness, from the JSON text the compute thread made, bound as one parameter (no object
 * graph to rebuild and no SQL escaping on this event loop). */
async function storeFitness(castId: string, json: string, transaction: Transaction) {
  await Cast.sequelize!.query('UPDATE casts SET fitness = $1::jsonb WHERE id = $2', {
    bind: [json, castId],
    transaction,
    type: QueryTypes.UPDATE,
  });
}

/**
 * The new cast's life fields: partly read (its dropped lines, awaiting a decision), and, when it
 * replaces a live cast, a fixed id the earlier version points to, the carried flags and their note.
 */
async function newVersionOf(
  gate: Gate | null,
  c: Pick<ParsedCast, 'file' | 'metadata' | 'dropped'>,
  out: DerivedCast['out'],
  upload: Upload,
  threshold: number,
  transaction: Transaction,
) {
  const partlyRead = c.dropped && c.dropped.length ? { dropped: c.dropped, decision: null } : null;
  const old = gate && !gate.stop ? gate.replace.get(liveKey(c.metadata.station!, c.metadata.cast ?? '1')) : undefined;
  if (!old)
    return {
      fields: { partlyRead },
      notes: [] as string[],
      replaced: null,
      replacedFile: null,
      carried: 0,
      notCarried: [] as unknown[],
    };
  const id = randomUUID();
  const s = await supersede(old, id, out.columns, upload.createdBy, c.file, transaction);
  // The carried edits belong to the new version's own trail too, so a later replacement carries them again.
  for (const e of s.edits)
    await audit(
      {
        cruiseId: upload.cruiseId,
        userId: upload.createdBy,
        action: 'set_flag',
        entity: 'cast',
        entityId: id,
        after: { ...e, carriedFrom: old.id },
      },
      transaction,
    );
  const inversions = s.carried > 0 ? inversionsAfterFlags(out.columns, threshold) : out.inversions;
  return {
    fields: { id, partlyRead, inversions, inversionCount: inversions.length },
    notes: [s.note],
    replaced: old.id,
    replacedFile: old.sourceFile,
    carried: s.carried,
    notCarried: s.notCarried,
  };
}
