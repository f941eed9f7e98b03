import multer from 'multer';
import { createReadStream } from 'node:fs';
import { unlink } from 'node:fs/promises';
import { z } from 'zod';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { HttpError, badRequest, notFound } from '../lib/errors';
import { ColumnMapping, Cruise, Upload } from '../models/index';
import { audit } from '../lib/audit';
import { hashingDiskStorage, type StagedFile } from '../services/uploadStore';
import { QUEUES } from '../services/queue';
import { logger } from '../lib/logger';
import type { AppDeps } from '../lib/deps';
import type { Request } from 'express';
import { IntakeAnswersSchema, UploadPreviewSchema } from '../../shared/api/intakeAnswers';
import { loadIntakeAnswers, previewUpload, saveIntakeAnswers } from '../services/intakeAnswers';

export const uploadJson = (u: Upload) => ({
  id: u.id,
  filename: u.filename,
  status: u.status,
  progress: u.progress,
  size: Number(u.size),
  sha256: u.sha256,
  errors: u.errors,
  warnings: u.warnings,
  castIds: u.castIds,
  unmappedHeaders: u.unmappedHeaders,
  conflicts: u.conflicts ?? null,
  needs: u.needs ?? null,
  createdAt: u.createdAt,
  updatedAt: u.updatedAt,
});

const uploadCruise = async (req: Request) => {
  const id = String(req.params.id);
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  return (await Upload.findByPk(id, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
};
const safeName = (name: string) =>
  name
    .replace(/\\/g, '/')
    .split('/')
    .pop()!
    .replace(/[^\w.\- ()+]/g, '_')
    .slice(0, 200) || 'unnamed';
const Mapping = z.object({
  mapping: z.record(
    z.string().min(1).max(200),
    z.enum(['pressure', 'depth', 'temperature', 'salinity', 'conductivity', 'oxygen', 'extra', 'ignore']),
  ),
});

export function uploadRoutes(deps: AppDeps): RouteSpec[] {
  const { storage, queue, settings } = deps;
  const upload = multer({
    storage: hashingDiskStorage(),
    limits: { fileSize: settings.UPLOAD_MAX_BYTES, files: 200, fields: 20 },
  });
  const intake = ['technician', 'chief_scientist'] as const;

  async function enqueue(u: Upload) {
    await queue.send(QUEUES.ingest, { uploadId: u.id }, { singletonKey: `ingest:${u.id}:${u.attempts}` });
  }

  return [
    defineRoute({
      method: 'post',
      path: '/cruises/:id/uploads',
      changesData: true,
      summary: 'Upload cast files (multipart field `files`; a zip is allowed)',
      rule: { kind: 'member', roles: [...intake], cruise: byParam() },
      before: [(req, res, next) => upload.array('files')(req, res, next)],
      responses: {
        202: 'accepted; each file is queued',
        413: 'a file is over the size limit',
        503: 'object storage unavailable',
      },
      handler: async (req, res, ctx) => {
        const files = (req.files as unknown as (Express.Multer.File & StagedFile)[]) ?? [];
        try {
          if (!files.length) throw badRequest('Send one or more files in the multipart field "files".', [], 'no_files');
          const cruise = await Cruise.findByPk(ctx.cruiseId!);
          if (cruise?.locked) throw new HttpError(409, 'locked', 'This cruise is locked; no more uploads.');
          const out = [];
          for (const f of files) {
            const filename = safeName(f.originalname);
            const existing = await Upload.findOne({ where: { cruiseId: ctx.cruiseId!, sha256: f.sha256 } });
            if (existing && existing.status !== 'failed') {
              out.push({ ...uploadJson(existing), duplicate: true });
              continue;
            }
            const key = `cruises/${ctx.cruiseId}/raw/${f.sha256}`;
            try {
              if (!(await storage.exists(key)))
                await storage.put(key, createReadStream(f.path), 'application/octet-stream', f.size);
            } catch (err) {
              logger.warn({ err }, 'object storage write failed');
              throw new HttpError(
                503,
                'storage_unavailable',
                `Object storage is not reachable; ${filename} was not stored. Nothing was recorded; try again when storage is back.`,
              );
            }
            const u = existing
              ? await existing.update({
                  filename,
                  status: 'queued',
                  progress: 0,
                  errors: [],
                  warnings: [],
                  needs: null,
                  attempts: existing.attempts + 1,
                })
              : await Upload.create({
                  cruiseId: ctx.cruiseId!,
                  filename,
                  storageKey: key,
                  sha256: f.sha256,
                  size: f.size,
                  createdBy: req.user!.id,
                });
            await audit({
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'upload',
              entity: 'upload',
              entityId: u.id,
              after: { filename, sha256: f.sha256, size: f.size },
            });
            await enqueue(u);
            out.push(uploadJson(u));
          }
          res.status(202).json({ uploads: out });
        } finally {
          await Promise.all(files.map((f) => unlink(f.path).catch(() => undefined)));
        }
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/uploads',
      summary: 'Uploads of a cruise, newest first',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) =>
        (await Upload.findAll({ where: { cruiseId: ctx.cruiseId! }, order: [['createdAt', 'DESC']], limit: 500 })).map(
          uploadJson,
        ),
    }),
    defineRoute({
      method: 'get',
      path: '/uploads/:id',
      summary: 'Status, progress and errors of one upload',
      rule: { kind: 'member', roles: 'any', cruise: uploadCruise },
      handler: async (req) => {
        const u = await Upload.findByPk(String(req.params.id));
        if (!u) throw notFound();
        return uploadJson(u);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/retry',
      changesData: true,
      summary: 'Process a failed upload again (after a column mapping, say)',
      rule: { kind: 'member', roles: [...intake], cruise: uploadCruise },
      handler: async (req, res) => {
        const u = await Upload.findByPk(String(req.params.id));
        if (!u) throw notFound();
        if (u.status !== 'failed') throw new HttpError(409, 'not_failed', 'Only a failed upload can be retried.');
        await u.update({ status: 'queued', progress: 0, errors: [], needs: null, attempts: u.attempts + 1 });
        await audit({ cruiseId: u.cruiseId, userId: req.user!.id, action: 'retry', entity: 'upload', entityId: u.id });
        await enqueue(u);
        res.status(202).json(uploadJson(u));
      },
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/reprocess',
      changesData: true,
      summary: "Re-run processing of an upload's casts in place (flags kept)",
      rule: { kind: 'member', roles: [...intake], cruise: uploadCruise },
      handler: async (req, res) => {
        const u = await Upload.findByPk(String(req.params.id));
        if (!u) throw notFound();
        if (u.status !== 'ready') throw new HttpError(409, 'not_ready', 'Only a processed upload can be reprocessed.');
        await u.update({ status: 'queued', progress: 0 });
        await audit({
          cruiseId: u.cruiseId,
          userId: req.user!.id,
          action: 'reprocess_requested',
          entity: 'upload',
          entityId: u.id,
        });
        await queue.send(QUEUES.ingest, { uploadId: u.id, reprocess: true });
        res.status(202).json(uploadJson(u));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/intake-answers',
      summary: "The cruise's remembered intake answers: units of columns without one, metadata of files",
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: IntakeAnswersSchema,
      handler: async (_req, _res, ctx) => loadIntakeAnswers(deps, ctx.cruiseId!),
    }),
    defineRoute({
      method: 'put',
      path: '/cruises/:id/intake-answers',
      changesData: true,
      summary: 'Remember what files lack (station, cast, position, time, unit of a column) for this cruise',
      rule: { kind: 'member', roles: [...intake], cruise: byParam() },
      body: IntakeAnswersSchema,
      response: IntakeAnswersSchema,
      handler: async (req, _res, ctx) => saveIntakeAnswers(deps, ctx.cruiseId!, req.user!.id, ctx.body),
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/preview',
      changesData: false,
      summary: "The first rows of an upload's files as they will be read with these answers (nothing stored)",
      rule: { kind: 'member', roles: [...intake], cruise: uploadCruise },
      body: IntakeAnswersSchema,
      response: UploadPreviewSchema,
      handler: async (req, _res, ctx) => {
        const u = await Upload.findByPk(String(req.params.id));
        if (!u) throw notFound();
        return previewUpload(deps, u, ctx.body);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/column-mapping',
      summary: "The cruise's remembered header → column role mapping",
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) =>
        Object.fromEntries(
          (await ColumnMapping.findAll({ where: { cruiseId: ctx.cruiseId! } })).map((m) => [m.header, m.role]),
        ),
    }),
    defineRoute({
      method: 'put',
      path: '/cruises/:id/column-mapping',
      changesData: true,
      summary: 'Remember how unrecognised headers map to column roles',
      rule: { kind: 'member', roles: [...intake], cruise: byParam() },
      body: Mapping,
      handler: async (req, _res, ctx) => {
        const { mapping } = ctx.body;
        await deps.db.sequelize.transaction(async (transaction) => {
          for (const [header, role] of Object.entries(mapping)) {
            await ColumnMapping.upsert(
              { cruiseId: ctx.cruiseId!, header, role },
              { transaction, conflictFields: ['cruise_id', 'header'] as never },
            );
          }
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'column_mapping',
              entity: 'cruise',
              entityId: ctx.cruiseId!,
              after: mapping,
            },
            transaction,
          );
        });
        return Object.fromEntries(
          (await ColumnMapping.findAll({ where: { cruiseId: ctx.cruiseId! } })).map((m) => [m.header, m.role]),
        );
      },
    }),
  ];
}
