// The ingest pipeline run by the background job: read the raw bytes from object storage, parse,
// validate, derive the TEOS-10 columns, find the inversions, and store every cast of the upload in
// one transaction (all or nothing). Re-running it for the same upload stores nothing twice.
import { Op } from 'sequelize';
import { Cast, CastColumn, ColumnMapping, Station, Upload } from '../models/index';
import { parseUpload } from '../parsers/index';
import type { ParsedCast, StationRow, FileError } from '../../shared/schemas/cast';
import { processCast, inversionsOfGoodLevels, type ProcessedCast } from './processCast';
import { writeColumns } from './columns';
import { recordQcAtIntake } from './qcProposals';
import { invalidateDataVersion } from './cruiseData';
import { audit } from '../lib/audit';
import { logger } from '../lib/logger';
import type { AppDeps } from '../lib/deps';

export class IngestFault extends Error {}

export async function ingestUpload(deps: AppDeps, uploadId: string, opts: { reprocess?: boolean } = {}): Promise<void> {
  const { sequelize } = deps.db;
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
  const mapping = Object.fromEntries((await ColumnMapping.findAll({ where: { cruiseId: upload.cruiseId } })).map((m) => [m.header, m.role]));
  const parsed = await parseUpload(upload.filename, bytes, { columnMapping: mapping, maxBytes: deps.settings.UPLOAD_MAX_BYTES,
    zipLimits: { maxTotalBytes: deps.settings.UPLOAD_MAX_INFLATED_BYTES }, maxLevels: deps.settings.CAST_MAX_LEVELS });
  await upload.update({ progress: 0.3 });
  if (!parsed.ok) {
    await upload.update({ status: 'failed', progress: 1, errors: parsed.errors, unmappedHeaders: parsed.unmappedHeaders?.headers ?? null });
    return;
  }

  // Station tables: fill or update the plan; casts without a position take it from the plan.
  const stations = await Station.findAll({ where: { cruiseId: upload.cruiseId } });
  const plan = new Map(stations.map((s) => [s.name, s]));
  const rowsByStation = new Map<string, StationRow>(parsed.stations.map((r) => [r.station, r]));

  const errors: FileError[] = [];
  const processed: { parsed: ParsedCast; out: ProcessedCast }[] = [];
  for (const c of parsed.casts) {
    const row = c.metadata.station ? rowsByStation.get(c.metadata.station) : undefined;
    const planned = c.metadata.station ? plan.get(c.metadata.station) : undefined;
    const md = { ...c.metadata };
    md.latitude ??= row?.latitude ?? planned?.latitude ?? null;
    md.longitude ??= row?.longitude ?? planned?.longitude ?? null;
    md.bottomDepth ??= row?.bottomDepth ?? null;
    md.time ??= row?.time ?? null;
    if (!md.station) { errors.push({ file: c.file, line: null, column: null, code: 'bad_metadata', message: `${c.file}: no station identifier (add a "# station:" line or a station table).` }); continue; }
    if (md.latitude == null || md.longitude == null) { errors.push({ file: c.file, line: null, column: null, code: 'bad_metadata', message: `${c.file}: station ${md.station} has no position (add "# latitude:"/"# longitude:" lines, a station table, or plan the station first).` }); continue; }
    const result = processCast({ ...c, metadata: md }, { inversionThreshold: deps.settings.INVERSION_THRESHOLD });
    if (!result.ok) { errors.push(...result.errors); continue; }
    processed.push({ parsed: { ...c, metadata: md }, out: result.cast });
  }
  if (errors.length) {
    await upload.update({ status: 'failed', progress: 1, errors });
    return;
  }
  await upload.update({ progress: 0.7 });

  try {
    const castIds = await sequelize.transaction(async (transaction) => {
      const ids: string[] = [];
      let order = (Math.max(0, ...stations.map((s) => s.order)));
      for (const r of parsed.stations) {
        const s = plan.get(r.station);
        if (s) await s.update({ latitude: r.latitude, longitude: r.longitude, plannedDepth: r.bottomDepth ?? s.plannedDepth }, { transaction });
        else plan.set(r.station, await Station.create({ cruiseId: upload.cruiseId, name: r.station, latitude: r.latitude, longitude: r.longitude, plannedDepth: r.bottomDepth, order: ++order }, { transaction }));
      }
      for (const { parsed: c, out } of processed) {
        const existing = await Cast.findOne({ where: { cruiseId: upload.cruiseId, sourceSha256: upload.sha256, sourceFile: c.file }, transaction });
        if (existing && !opts.reprocess) { ids.push(existing.id); continue; }
        if (existing) {
          // Re-run processing in place: same cast id, new derived columns and inversions; quality
          // flags a technician set are kept and still silence the levels they mark.
          const oldFlags = await CastColumn.findAll({ where: { castId: existing.id, kind: 'flag' }, transaction });
          const kept = Object.fromEntries(oldFlags.map((r) => [r.name, new Uint8Array(r.values)]));
          await CastColumn.destroy({ where: { castId: existing.id }, transaction });
          const columns = out.columns.map((col) => (col.kind === 'flag' && kept[col.name]?.length === col.values.length ? { ...col, values: kept[col.name] } : col));
          await writeColumns(existing.id, columns, transaction);
          const byName = Object.fromEntries(columns.filter((col) => col.kind !== 'flag').map((col) => [col.name, col.values as Float64Array]));
          const flagsNow = Object.fromEntries(columns.filter((col) => col.kind === 'flag').map((col) => [col.name, col.values as Uint8Array]));
          const inversions = inversionsOfGoodLevels(byName, flagsNow, deps.settings.INVERSION_THRESHOLD);
          existing.changed('updatedAt', true);
          await existing.update({ levels: out.levels, inversions, inversionCount: inversions.length, fitness: out.fitness, notes: [...c.notes, ...out.notes], updatedAt: new Date() }, { transaction });
          ids.push(existing.id);
          continue;
        }
        const md = c.metadata;
        const cast = await Cast.create({
          cruiseId: upload.cruiseId, uploadId: upload.id, station: md.station!, cast: md.cast ?? '1', latitude: md.latitude!, longitude: md.longitude!,
          time: md.time ? new Date(md.time) : null, bottomDepth: md.bottomDepth, levels: out.levels, inversionCount: out.inversions.length,
          inversions: out.inversions, fitness: out.fitness, metadata: { ...md.extra, format: c.format, units: c.units, profile: c.profile, saar: out.saar, mixedLayer: out.mld },
          notes: [...c.notes, ...out.notes], sourceFile: c.file, sourceSha256: upload.sha256,
        }, { transaction });
        await writeColumns(cast.id, out.columns, transaction);
        ids.push(cast.id);
      }
      // QC desk: proposals of the automatic tests and what the intake found (server/services/qcProposals.ts)
      await recordQcAtIntake(deps, { cruiseId: upload.cruiseId, castIds: ids, processed }, { reprocess: !!opts.reprocess }, transaction);
      await upload.update({ status: 'ready', progress: 1, castIds: ids, warnings: parsed.warnings, errors: [] }, { transaction });
      await audit({ cruiseId: upload.cruiseId, userId: upload.createdBy, action: opts.reprocess ? 'reprocess' : 'ingest', entity: 'upload', entityId: upload.id, after: { casts: ids.length, stations: parsed.stations.length } }, transaction);
      return ids;
    });
    invalidateDataVersion(upload.cruiseId);
    logger.info({ uploadId, casts: castIds.length }, 'upload ingested');
  } catch (err) {
    await Upload.update({ status: 'queued', progress: 0 }, { where: { id: uploadId, status: { [Op.ne]: 'ready' } } }).catch(() => undefined);
    throw err;
  }
}
