// Cast life: remove and restore a cast (chief scientist), its history of versions, the decision on a
// partly read cast and on a corrected file that would replace live casts (technician), and removing
// an upload that produced nothing. The work is in server/services/castLife.ts.
import { z } from 'zod';
import type { Request } from 'express';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { HttpError, notFound } from '../lib/errors';
import { Upload } from '../models/index';
import { audit } from '../lib/audit';
import { QUEUES } from '../services/queue';
import {
  castHistory,
  cruiseOfAnyCast,
  decideSalvage,
  removeCast,
  removedCasts,
  removeEmptyUpload,
  restoreCast,
} from '../services/castLife';
import { uploadJson } from './uploads';
import type { AppDeps } from '../lib/deps';
import { castHistoryResponseSchema } from '../../shared/api/castHistory';

const anyCastCruise = (req: Request) => cruiseOfAnyCast(String(req.params.id));
const uploadCruise = async (req: Request) => {
  const id = String(req.params.id);
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  return (await Upload.findByPk(id, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
};
const RemoveBody = z.object({ reason: z.string().trim().max(500).optional() });
const SalvageBody = z.object({ decision: z.enum(['accept', 'reject']) });
const ReplaceBody = z.object({ replace: z.boolean() });

export function castLifeRoutes(deps: AppDeps): RouteSpec[] {
  const intake = ['technician', 'chief_scientist'] as const;
  return [
    defineRoute({
      method: 'post',
      path: '/casts/:id/remove',
      changesData: true,
      summary: 'Remove a cast from everything (audited, restorable)',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: anyCastCruise },
      body: RemoveBody,
      handler: async (req, _res, ctx) => removeCast(deps, String(req.params.id), req.user!.id, ctx.body.reason ?? null),
    }),
    defineRoute({
      method: 'post',
      path: '/casts/:id/restore',
      changesData: true,
      summary: 'Restore a removed cast',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: anyCastCruise },
      handler: async (req) => restoreCast(deps, String(req.params.id), req.user!.id),
    }),
    defineRoute({
      method: 'get',
      path: '/casts/:id/history',
      summary:
        "Every version of a cast's station and cast: file, who, when, live or not, and the flags each replacement carried over",
      rule: { kind: 'member', roles: 'any', cruise: anyCastCruise },
      response: castHistoryResponseSchema,
      handler: async (req) => castHistory(String(req.params.id)),
    }),
    defineRoute({
      method: 'post',
      path: '/casts/:id/partly-read',
      changesData: true,
      summary: 'Accept or reject a partly read cast (lines left out)',
      rule: { kind: 'member', roles: [...intake], cruise: anyCastCruise },
      body: SalvageBody,
      handler: async (req, _res, ctx) => decideSalvage(deps, String(req.params.id), req.user!.id, ctx.body.decision),
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/removed-casts',
      summary: 'Removed casts of a cruise (restorable)',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) => removedCasts(ctx.cruiseId!),
    }),
    defineRoute({
      method: 'post',
      path: '/uploads/:id/replace-decision',
      changesData: true,
      summary: 'Answer an upload whose casts would replace live ones: replace them, or keep the earlier ones',
      rule: { kind: 'member', roles: [...intake], cruise: uploadCruise },
      body: ReplaceBody,
      handler: async (req, res, ctx) => {
        const u = await Upload.findByPk(String(req.params.id));
        if (!u) throw notFound();
        if (u.status !== 'awaiting_decision' || !u.conflicts)
          throw new HttpError(409, 'no_decision_needed', 'This upload is not waiting for a decision.');
        const { replace } = ctx.body;
        await u.update({
          status: 'queued',
          progress: 0,
          attempts: u.attempts + 1,
          conflicts: { ...u.conflicts, decision: replace ? 'replace' : 'keep' },
        });
        await audit({
          cruiseId: u.cruiseId,
          userId: req.user!.id,
          action: replace ? 'replace_decision' : 'keep_decision',
          entity: 'upload',
          entityId: u.id,
          after: { casts: u.conflicts.items.length },
        });
        await deps.queue.send(QUEUES.ingest, { uploadId: u.id }, { singletonKey: `ingest:${u.id}:${u.attempts}` });
        res.status(202).json(uploadJson(u));
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/uploads/:id',
      changesData: true,
      summary: 'Remove an upload that produced no cast (failed, or waiting for a decision)',
      rule: { kind: 'member', roles: [...intake], cruise: uploadCruise },
      handler: async (req) => removeEmptyUpload(deps, String(req.params.id), req.user!.id),
    }),
  ];
}
