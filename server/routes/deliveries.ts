import { z } from 'zod';
import { binBody } from '../lib/bounds';
import type { Request } from 'express';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { HttpError, notFound } from '../lib/errors';
import { Cruise, Delivery, Membership, User } from '../models/index';
import { audit } from '../lib/audit';
import { QUEUES } from '../services/queue';
import { escapeHtml, MAIL_SUBJECTS, quoted } from '../services/mailer';
import { levelsOrError } from '../services/levels';
import { referencePressureSchema } from '../../shared/api/levels';
import { lineRow } from '../services/lines';
import type { AppDeps } from '../lib/deps';
import type { Role } from '../models/index';
import { DELIVERY_BUILDERS, mayDownload, releaseRecipients } from '../services/deliveryAccess';

const deliveryCruise = async (req: Request) => {
  const id = String(req.params.id);
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  return (await Delivery.findByPk(id, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
};
const NewDelivery = z.object({
  kind: z.enum(['isopycnal', 'pressure', 'package']),
  ref: referencePressureSchema.default(0),
  levels: z.string().trim().max(20000).optional(),
  inversions: z.enum(['sort', 'drop', 'raw']).default('sort'),
  interpolation: z.enum(['linear', 'pchip']).default('linear'),
  bin: binBody(2),
  flags: z.array(z.number().int().min(1).max(9)).min(1).max(9).default([1, 2]),
  formats: z
    .array(z.enum(['csv', 'xlsx', 'nc', 'exchange']))
    .min(1)
    .max(4),
  /** a line id; without it, the cruise's default line */
  line: z.string().trim().min(1).max(100).nullable().optional(),
  /** derived variables to add (stored derived columns or the cruise's derived variables, by name) */
  extras: z
    .array(
      z
        .string()
        .regex(/^[A-Za-z_][\w:]*$/)
        .max(64),
    )
    .max(20)
    .optional(),
});

/** A delivery as the API answers it; `canDownload` is the one download rule for the asking member. */
export const deliveryJson = (d: Delivery, role: Role | null = null) => ({
  id: d.id,
  kind: d.kind,
  params: d.params,
  formats: d.formats,
  status: d.status,
  progress: d.progress,
  files: (d.files ?? []).map((f) => ({ format: f.format, filename: f.filename, size: f.size, sha256: f.sha256 })),
  released: d.released,
  releasedAt: d.releasedAt,
  releasedBy: d.releasedBy,
  createdBy: d.createdBy,
  createdAt: d.createdAt,
  error: d.error,
  canDownload: mayDownload(role, d),
});

export function deliveryRoutes(deps: AppDeps): RouteSpec[] {
  const builders = DELIVERY_BUILDERS;
  return [
    defineRoute({
      method: 'get',
      path: '/cruises/:id/deliveries',
      summary: 'Deliveries of a cruise',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) =>
        (await Delivery.findAll({ where: { cruiseId: ctx.cruiseId! }, order: [['createdAt', 'DESC']] })).map((d) =>
          deliveryJson(d, ctx.role),
        ),
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/deliveries',
      changesData: false,
      summary: 'Build a delivery (tables or a data package) in the background',
      rule: { kind: 'member', roles: [...builders], cruise: byParam() },
      body: NewDelivery,
      responses: { 202: 'queued' },
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        if (b.kind !== 'pressure' && b.levels) levelsOrError(b.levels);
        b.line = (await lineRow(ctx.cruiseId!, b.line)).id;
        const d = await deps.db.sequelize.transaction(async (transaction) => {
          const row = await Delivery.create(
            {
              cruiseId: ctx.cruiseId!,
              kind: b.kind,
              params: { ...b },
              formats: b.formats,
              error: null,
              releasedAt: null,
              releasedBy: null,
              createdBy: req.user!.id,
            },
            { transaction },
          );
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'create',
              entity: 'delivery',
              entityId: row.id,
              after: b,
            },
            transaction,
          );
          return row;
        });
        await deps.queue.send(QUEUES.delivery, { deliveryId: d.id });
        res.status(202).json(deliveryJson(d, ctx.role));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/deliveries/:id',
      summary: 'One delivery with its status and files',
      rule: { kind: 'member', roles: 'any', cruise: deliveryCruise },
      handler: async (req, _res, ctx) => deliveryJson((await Delivery.findByPk(String(req.params.id)))!, ctx.role),
    }),
    defineRoute({
      method: 'get',
      path: '/deliveries/:id/download',
      summary:
        'Download one file of a delivery (redirect to a presigned object-storage URL): any member once released, builders before',
      rule: { kind: 'member', roles: 'any', cruise: deliveryCruise },
      query: z.object({ format: z.enum(['csv', 'xlsx', 'nc', 'zip', 'exchange']) }),
      handler: async (req, res, ctx) => {
        const d = (await Delivery.findByPk(String(req.params.id)))!;
        if (!mayDownload(ctx.role, d)) {
          throw new HttpError(
            403,
            'forbidden',
            'This delivery is not released yet: until the PI releases it, only the PI, the chief scientist and analysts may download it.',
          );
        }
        if (d.status !== 'ready') throw new HttpError(409, 'not_ready', 'This delivery is not built yet.');
        const f = d.files.find((x) => x.format === ctx.query.format);
        if (!f) throw notFound('This delivery has no file in that format.');
        res.redirect(302, await deps.storage.presignedGetUrl(f.key, f.filename));
      },
    }),
    defineRoute({
      method: 'post',
      path: '/deliveries/:id/release',
      changesData: false,
      summary: "Release a delivery to the team (PI); it is frozen and the cruise's members are e-mailed",
      rule: { kind: 'member', roles: ['pi'], cruise: deliveryCruise },
      handler: async (req, _res, ctx) => {
        const d = await deps.db.sequelize.transaction(async (transaction) => {
          const row = (await Delivery.findByPk(String(req.params.id), { transaction, lock: true }))!;
          if (row.released) throw new HttpError(409, 'released', 'This delivery is already released.');
          if (row.status !== 'ready') throw new HttpError(409, 'not_ready', 'Only a built delivery can be released.');
          await row.update({ released: true, releasedAt: new Date(), releasedBy: req.user!.id }, { transaction });
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'release',
              entity: 'delivery',
              entityId: row.id,
              before: { released: false },
              after: { released: true },
            },
            transaction,
          );
          return row;
        });
        const cruise = (await Cruise.findByPk(ctx.cruiseId!))!;
        const members = await Membership.findAll({ where: { cruiseId: ctx.cruiseId! }, include: [User] });
        const link = `${deps.settings.PUBLIC_URL}/cruises/${cruise.id}/deliveries`;
        const what = `${d.kind === 'package' ? 'data package' : `${d.kind} table`} (${d.files.map((f) => f.filename).join(', ')})`;
        const to = releaseRecipients(
          members.map((m) => ({ role: m.role, email: (m as Membership & { User: User }).User.email })),
        );
        await deps.mailer.send({
          to,
          subject: MAIL_SUBJECTS.release,
          text: `${quoted(req.user!.name)} released the ${what} of the cruise ${quoted(cruise.name)}.\n\nDownload it here:\n${link}\n\nProvisional research data; not for navigation or safety-of-life use.`,
          html: `<p>${escapeHtml(req.user!.name)} released the ${escapeHtml(what)} of <b>${escapeHtml(cruise.name)}</b>.</p><p><a href="${escapeHtml(link)}">Open the deliveries</a></p><p><small>Provisional research data; not for navigation or safety-of-life use.</small></p>`,
        });
        return deliveryJson(d, ctx.role);
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/deliveries/:id',
      changesData: false,
      summary: 'Delete a delivery that is not released',
      rule: { kind: 'member', roles: [...builders], cruise: deliveryCruise },
      handler: async (req, res, ctx) => {
        await deps.db.sequelize.transaction(async (transaction) => {
          const d = (await Delivery.findByPk(String(req.params.id), { transaction, lock: true }))!;
          if (d.released) throw new HttpError(409, 'released', 'A released delivery cannot change.');
          await d.destroy({ transaction });
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'delete',
              entity: 'delivery',
              entityId: d.id,
              before: deliveryJson(d),
            },
            transaction,
          );
        });
        res.status(204).end();
      },
    }),
  ];
}
