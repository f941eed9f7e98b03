// A cast's life after ingest: replaced by a corrected file (the earlier version kept as history,
// the technician's flags carried over where the levels match), removed by the chief scientist
// (audited, restorable), a partly read cast accepted or rejected by the technician. Only live casts
// (neither removed nor superseded) exist for sections, tables and deliveries: the Cast model's
// default scope says so, and a unique index over live rows keeps one live cast per station and cast.
import type { Transaction } from 'sequelize';
import { AuditEntry, Cast, Upload, User, type UploadConflict } from '../models/index';
import { HttpError, notFound } from '../lib/errors';
import { auditedChange } from './changes';
import { readColumns, type StoredColumn } from './columns';
import { inversionsOfGoodLevels } from './processCast';
import type { AppDeps } from '../lib/deps';

const key = (station: string, cast: string) => `${station}\u0000${cast}`;

/** Two casts of one upload with the same station and cast: the files that clash. */
export function duplicatesWithin(
  casts: { file: string; station: string; cast: string }[],
): { station: string; cast: string; files: string[] }[] {
  const by = new Map<string, { station: string; cast: string; files: string[] }>();
  for (const c of casts) {
    const k = key(c.station, c.cast);
    const e = by.get(k) ?? { station: c.station, cast: c.cast, files: [] };
    e.files.push(c.file);
    by.set(k, e);
  }
  return [...by.values()].filter((e) => e.files.length > 1);
}

/** Live casts of the cruise with the station and cast of a new one, from another file. */
export async function conflictsWithLive(
  cruiseId: string,
  sha256: string,
  casts: { file: string; station: string; cast: string }[],
  transaction?: Transaction,
): Promise<UploadConflict[]> {
  if (casts.length === 0) return [];
  const live = await Cast.findAll({
    where: { cruiseId, station: [...new Set(casts.map((c) => c.station))] },
    attributes: ['id', 'station', 'cast', 'sourceFile', 'sourceSha256'],
    transaction,
  });
  const byKey = new Map(live.map((c) => [key(c.station, c.cast), c]));
  const out: UploadConflict[] = [];
  for (const c of casts) {
    const e = byKey.get(key(c.station, c.cast));
    if (e && !(e.sourceSha256 === sha256 && e.sourceFile === c.file))
      out.push({ file: c.file, station: c.station, cast: c.cast, existingCastId: e.id, existingFile: e.sourceFile });
  }
  return out;
}

type FlagEdit = { variable: string; pFrom: number; pTo: number; flag: number };

/**
 * The technician's flag edits of the earlier version (its audit trail), applied to the new version's
 * flag columns where a level of the same pressure exists in both (within 1e-6 dbar); levels of the
 * earlier version inside an edit with no match in the new one are listed.
 */
export async function carryFlags(
  oldCastId: string,
  columns: StoredColumn[],
  transaction: Transaction,
): Promise<{ edits: FlagEdit[]; carried: number; notCarried: { variable: string; pressure: number; flag: number }[] }> {
  const entries = await AuditEntry.findAll({
    where: { entity: 'cast', entityId: oldCastId, action: 'set_flag' },
    order: [
      ['at', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction,
  });
  const edits: FlagEdit[] = entries
    .map((e) => e.after as FlagEdit)
    .filter((a) => a && typeof a.pFrom === 'number' && typeof a.pTo === 'number');
  if (edits.length === 0) return { edits, carried: 0, notCarried: [] };
  const oldP = (await readColumns([oldCastId], ['pressure'])).get(oldCastId)!.columns.pressure ?? new Float64Array(0);
  const newP = columns.find((c) => c.name === 'pressure')!.values as Float64Array;
  const near = (sorted: Float64Array) => (p: number) => {
    let lo = 0,
      hi = sorted.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (Math.abs(sorted[mid] - p) <= 1e-6) return true;
      if (sorted[mid] < p) lo = mid + 1;
      else hi = mid - 1;
    }
    return false;
  };
  const hasLevel = near(Float64Array.from(newP).sort());
  const inOld = near(Float64Array.from(oldP).sort());
  let carried = 0;
  const notCarried: { variable: string; pressure: number; flag: number }[] = [];
  for (const e of edits) {
    const vars = e.variable === 'all' ? ['temperature', 'salinity', 'conductivity', 'oxygen'] : [e.variable];
    for (const v of vars) {
      let col = columns.find((c) => c.name === `flag:${v}`);
      if (!col) {
        if (e.variable === 'all' && v !== 'temperature') continue;
        col = { name: `flag:${v}`, unit: null, kind: 'flag', values: new Uint8Array(newP.length).fill(2) };
        columns.push(col);
      }
      const f = col.values as Uint8Array;
      for (let i = 0; i < newP.length; i++) {
        const p = newP[i];
        if (p >= e.pFrom && p <= e.pTo && inOld(p)) {
          f[i] = e.flag;
          carried++;
        }
      }
      for (const q of oldP)
        if (q >= e.pFrom && q <= e.pTo && !hasLevel(q)) notCarried.push({ variable: v, pressure: q, flag: e.flag });
    }
  }
  return { edits, carried, notCarried };
}

/**
 * Make `newId` the live version of the cast `old` (same station and cast): the old row becomes
 * history (superseded), the new row's flags take the old row's edits. Called inside the ingest's
 * transaction before the new row is written, so the one-live-cast index is never violated.
 */
export async function supersede(
  old: Cast,
  newId: string,
  columns: StoredColumn[],
  userId: string | null,
  file: string,
  transaction: Transaction,
) {
  const flags = await carryFlags(old.id, columns, transaction);
  await old.update({ supersededBy: newId, supersededAt: new Date() }, { transaction });
  return {
    ...flags,
    note:
      `replaces the earlier version from ${old.sourceFile} (cast ${old.id}); ${flags.carried} flagged level${flags.carried === 1 ? '' : 's'} carried over` +
      (flags.notCarried.length
        ? `; ${flags.notCarried.length} could not be (no level at ${[...new Set(flags.notCarried.map((n) => n.pressure))].slice(0, 10).join(', ')} dbar in ${file})`
        : ''),
  };
}

/** Inversions of a new version after carried flags, as the flag route computes them. */
export function inversionsAfterFlags(columns: StoredColumn[], threshold: number) {
  const byName = Object.fromEntries(
    columns.filter((c) => c.kind !== 'flag').map((c) => [c.name, c.values as Float64Array]),
  );
  const flags = Object.fromEntries(
    columns.filter((c) => c.kind === 'flag').map((c) => [c.name, c.values as Uint8Array]),
  );
  return inversionsOfGoodLevels(byName, flags, threshold);
}

async function findAny(castId: string): Promise<Cast> {
  if (!/^[0-9a-f-]{36}$/i.test(castId)) throw notFound('No such cast.');
  const c = await Cast.unscoped().findByPk(castId);
  if (!c) throw notFound('No such cast.');
  return c;
}

/** The cruise of any cast, live or not (for the access rule of the cast-life routes). */
export async function cruiseOfAnyCast(castId: string): Promise<string | null> {
  if (!/^[0-9a-f-]{36}$/i.test(castId)) return null;
  return (await Cast.unscoped().findByPk(castId, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
}

export async function removeCast(deps: AppDeps, castId: string, userId: string, reason: string | null) {
  const c = await findAny(castId);
  if (c.removedAt) throw new HttpError(409, 'already_removed', 'This cast is already removed.');
  if (c.supersededBy)
    throw new HttpError(
      409,
      'superseded',
      'This version was replaced by a corrected file; remove the live version instead.',
    );
  await auditedChange(
    deps.db.sequelize,
    { cruiseId: c.cruiseId, userId, action: 'remove_cast', entity: 'cast' },
    async (transaction) => {
      await c.update({ removedAt: new Date(), removedBy: userId }, { transaction });
      return {
        result: null,
        entityId: c.id,
        after: { station: c.station, cast: c.cast, file: c.sourceFile, reason },
      };
    },
  );
  return castLifeJson(c);
}

export async function restoreCast(deps: AppDeps, castId: string, userId: string) {
  const c = await findAny(castId);
  if (!c.removedAt) throw new HttpError(409, 'not_removed', 'This cast is not removed.');
  const live = await Cast.findOne({ where: { cruiseId: c.cruiseId, station: c.station, cast: c.cast } });
  if (live)
    throw new HttpError(
      409,
      'duplicate_cast',
      `Station ${c.station} cast ${c.cast} already has a live cast (from ${live.sourceFile}); remove it first to restore this one.`,
      [{ castId: live.id }],
    );
  await auditedChange(
    deps.db.sequelize,
    { cruiseId: c.cruiseId, userId, action: 'restore_cast', entity: 'cast' },
    async (transaction) => {
      await c.update({ removedAt: null, removedBy: null }, { transaction });
      return { result: null, entityId: c.id, after: { station: c.station, cast: c.cast, file: c.sourceFile } };
    },
  );
  return castLifeJson(c);
}

/** The technician's decision on a partly read cast: accept it as it is, or reject it (removed, restorable). */
export async function decideSalvage(deps: AppDeps, castId: string, userId: string, decision: 'accept' | 'reject') {
  const c = await findAny(castId);
  if (!c.partlyRead || c.partlyRead.decision !== null)
    throw new HttpError(409, 'not_pending', 'This cast is not a partly read cast awaiting a decision.');
  if (c.removedAt || c.supersededBy) throw new HttpError(409, 'not_live', 'This cast is no longer live.');
  await auditedChange(
    deps.db.sequelize,
    {
      cruiseId: c.cruiseId,
      userId,
      action: decision === 'accept' ? 'accept_partly_read' : 'reject_partly_read',
      entity: 'cast',
    },
    async (transaction) => {
      const partlyRead = {
        ...c.partlyRead!,
        decision: 'accepted' as const,
        decidedBy: userId,
        decidedAt: new Date().toISOString(),
      };
      if (decision === 'accept') await c.update({ partlyRead }, { transaction });
      else await c.update({ removedAt: new Date(), removedBy: userId }, { transaction });
      return {
        result: null,
        entityId: c.id,
        after: { station: c.station, cast: c.cast, dropped: c.partlyRead!.dropped.length },
      };
    },
  );
  return castLifeJson(c);
}

export function castLifeJson(c: Cast) {
  return {
    id: c.id,
    station: c.station,
    cast: c.cast,
    sourceFile: c.sourceFile,
    live: !c.removedAt && !c.supersededBy,
    removedAt: c.removedAt,
    removedBy: c.removedBy,
    supersededBy: c.supersededBy,
    supersededAt: c.supersededAt,
    partlyRead: c.partlyRead,
    createdAt: c.createdAt,
  };
}

type NotCarried = { variable: string; pressure: number; flag: number };
/** What a version replaced, and the flags carried over to it or listed as not carried (at most 200 listed). */
function replacementJson(e: AuditEntry | undefined) {
  if (!e) return null;
  const before = (e.before ?? {}) as { castId?: string; file?: string };
  const after = (e.after ?? {}) as { flagsCarried?: number; notCarried?: NotCarried[] };
  const notCarried = Array.isArray(after.notCarried) ? after.notCarried : [];
  return {
    replacedCastId: before.castId ?? null,
    replacedFile: before.file ?? null,
    at: e.at,
    flagsCarried: typeof after.flagsCarried === 'number' ? after.flagsCarried : 0,
    notCarriedCount: notCarried.length,
    notCarried: notCarried.slice(0, 200),
  };
}

/** Every version of a cast's station and cast, oldest first: who uploaded which file, when; which is live. */
export async function castHistory(castId: string) {
  const c = await findAny(castId);
  const versions = await Cast.unscoped().findAll({
    where: { cruiseId: c.cruiseId, station: c.station, cast: c.cast },
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  const uploads = await Upload.findAll({
    where: { id: versions.map((v) => v.uploadId).filter((x): x is string => !!x) },
    attributes: ['id', 'filename', 'createdBy', 'createdAt'],
  });
  const users = await User.findAll({
    where: {
      id: [
        ...new Set(
          [...uploads.map((u) => u.createdBy), ...versions.map((v) => v.removedBy)].filter((x): x is string => !!x),
        ),
      ],
    },
    attributes: ['id', 'name', 'email'],
  });
  // the replacement of each later version: what it replaced and which flags came over (the ingest's audit)
  const replacements = await AuditEntry.findAll({
    where: { entity: 'cast', action: 'replace_cast', entityId: versions.map((v) => v.id) },
    attributes: ['entityId', 'before', 'after', 'at'],
  });
  const replacedBy = new Map(replacements.map((r) => [r.entityId, r]));
  const up = new Map(uploads.map((u) => [u.id, u]));
  const who = (id: string | null | undefined) => {
    const u = users.find((x) => x.id === id);
    return u ? { id: u.id, name: u.name } : null;
  };
  return {
    station: c.station,
    cast: c.cast,
    versions: versions.map((v) => {
      const u = v.uploadId ? up.get(v.uploadId) : undefined;
      return {
        ...castLifeJson(v),
        uploadId: v.uploadId,
        uploadFile: u?.filename ?? null,
        uploadedBy: who(u?.createdBy),
        uploadedAt: u?.createdAt ?? v.createdAt,
        removedBy: who(v.removedBy),
        replacement: replacementJson(replacedBy.get(v.id)),
      };
    }),
  };
}

/** Removed casts of a cruise (restorable), newest removal first. */
export async function removedCasts(cruiseId: string) {
  const rows = await Cast.unscoped().findAll({
    where: { cruiseId, supersededBy: null },
    order: [['removedAt', 'DESC']],
  });
  return rows.filter((r) => r.removedAt).map(castLifeJson);
}

/** A technician (or chief) removes an upload that produced nothing: failed, or ready with no cast. */
export async function removeEmptyUpload(deps: AppDeps, uploadId: string, userId: string) {
  const u = await Upload.findByPk(uploadId);
  if (!u) throw notFound('No such upload.');
  const produced = await Cast.unscoped().count({ where: { uploadId: u.id } });
  if (produced > 0)
    throw new HttpError(
      409,
      'upload_has_casts',
      `This upload produced ${produced} cast${produced > 1 ? 's' : ''}; a chief scientist removes casts one by one.`,
    );
  if (u.status === 'queued' || u.status === 'processing')
    throw new HttpError(409, 'upload_busy', 'This upload is still being processed.');
  await auditedChange(
    deps.db.sequelize,
    { cruiseId: u.cruiseId, userId, action: 'remove_upload', entity: 'upload' },
    async (transaction) => {
      const before = { filename: u.filename, status: u.status, sha256: u.sha256 };
      await u.destroy({ transaction });
      return { result: null, entityId: u.id, before };
    },
  );
  return { removed: u.id };
}

export type Gate = { stop: true } | { stop: false; replace: Map<string, Cast>; skipped: UploadConflict[] };

/**
 * Before anything is written: two casts of the upload with one station and cast fail it; casts whose
 * station and cast are already live wait for the technician's answer (replace them, or keep the
 * earlier ones and leave these out), recorded on the upload.
 */
export async function replacementGate(
  upload: Upload,
  casts: { file: string; station: string; cast: string }[],
): Promise<Gate> {
  const dup = duplicatesWithin(casts);
  if (dup.length) {
    await upload.update({
      status: 'failed',
      progress: 1,
      errors: dup.map((d) => ({
        file: d.files[1],
        line: null,
        column: null,
        code: 'duplicate_cast',
        message: `station ${d.station} cast ${d.cast} is in more than one file of this upload (${d.files.join(', ')}); a station and cast can have one live cast`,
      })),
    });
    return { stop: true };
  }
  const conflicts = await conflictsWithLive(upload.cruiseId, upload.sha256, casts);
  if (conflicts.length === 0) return { stop: false, replace: new Map(), skipped: [] };
  const decision = upload.conflicts?.decision ?? null;
  if (decision === null) {
    await upload.update({ status: 'awaiting_decision', progress: 1, conflicts: { items: conflicts, decision: null } });
    return { stop: true };
  }
  if (decision === 'keep') return { stop: false, replace: new Map(), skipped: conflicts };
  const olds = await Cast.findAll({ where: { id: conflicts.map((c) => c.existingCastId) } });
  return { stop: false, replace: new Map(olds.map((o) => [key(o.station, o.cast), o])), skipped: [] };
}

export const liveKey = key;
