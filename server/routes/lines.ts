// Lines of a cruise (docs/lines.md): list, make, edit, delete. The default line is made on first
// need and cannot be deleted; its stations follow the casts and the plan.
import { z } from 'zod';
import type { Request } from 'express';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { notFound } from '../lib/errors';
import { Line } from '../models/index';
import { auditedChange } from '../services/changes';
import { cached, dataVersion, loadCruiseCasts } from '../services/cruiseData';
import { listLines, createLine, updateLine, deleteLine, resolveLine, lineJson } from '../services/lines';
import type { AppDeps } from '../lib/deps';

const lineCruise = async (req: Request) => {
  const id = String(req.params.id);
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  return (await Line.findByPk(id, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
};
const stationName = z.string().trim().min(1).max(100);
const uuid = z.string().regex(/^[0-9a-f-]{36}$/i, 'a cast id');
const Choice = z.union([
  uuid,
  z.object({ shallow: uuid, deep: uuid, joinPressure: z.number().finite().positive().max(11000) }),
]);
const Polyline = z
  .array(z.tuple([z.number().min(-540).max(540), z.number().min(-90).max(90)]))
  .min(2)
  .max(200);
const LineBase = z.object({
  name: z.string().trim().min(1).max(100),
  stations: z.array(stationName).min(1).max(2000),
  casts: z.record(stationName, Choice.nullable()),
  polyline: Polyline.nullable(),
  corridorKm: z.number().positive().max(1000),
  include: z.array(stationName).max(2000),
  exclude: z.array(stationName).max(2000),
});
const NewLine = LineBase.pick({ name: true })
  .extend(LineBase.pick({ stations: true, casts: true, polyline: true, corridorKm: true }).partial().shape)
  .strict();
const PatchLine = LineBase.partial().strict();

export function lineRoutes(deps: AppDeps): RouteSpec[] {
  const editors = ['chief_scientist', 'analyst'] as const;
  const one = async (row: Line) =>
    lineJson(await resolveLine(row.cruiseId, row, await loadCruiseCasts(row.cruiseId, [])));
  return [
    defineRoute({
      method: 'get',
      path: '/cruises/:id/lines',
      summary: "The cruise's lines (the default line first), each station with its chosen cast",
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) => {
        const version = await dataVersion(ctx.cruiseId!);
        return cached(`lines:${ctx.cruiseId}:${version}`, () => listLines(ctx.cruiseId!));
      },
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/lines',
      changesData: true,
      summary: 'Make a line from a station list or a drawn polyline',
      rule: { kind: 'member', roles: [...editors], cruise: byParam() },
      body: NewLine,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const row = await auditedChange(
          deps.db.sequelize,
          { cruiseId: ctx.cruiseId!, userId: req.user!.id, action: 'create', entity: 'line' },
          async (transaction) => {
            const r = await createLine(ctx.cruiseId!, req.user!.id, b, transaction);
            return { result: r, entityId: r.id, after: b };
          },
        );
        res.status(201).json(await one(row));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/lines/:id',
      summary: 'One line with its stations, casts, off-line and excluded stations',
      rule: { kind: 'member', roles: 'any', cruise: lineCruise },
      handler: async (req) => one((await Line.findByPk(String(req.params.id)))!),
    }),
    defineRoute({
      method: 'patch',
      path: '/lines/:id',
      changesData: true,
      summary: 'Rename, reorder, include or exclude stations, choose casts or composites, redraw',
      rule: { kind: 'member', roles: [...editors], cruise: lineCruise },
      body: PatchLine,
      handler: async (req, _res, ctx) => {
        const b = ctx.body;
        const row = await auditedChange(
          deps.db.sequelize,
          { cruiseId: ctx.cruiseId!, userId: req.user!.id, action: 'update', entity: 'line' },
          async (transaction) => {
            const r = await Line.findByPk(String(req.params.id), { transaction, lock: true });
            if (!r) throw notFound('No such line.');
            const before = {
              name: r.name,
              stations: r.stations,
              casts: r.casts,
              include: r.include,
              exclude: r.exclude,
              polyline: r.polyline,
              corridorKm: r.corridorKm,
            };
            await updateLine(r, b, transaction);
            return { result: r, entityId: r.id, before, after: b };
          },
        );
        return one(row);
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/lines/:id',
      changesData: true,
      summary: 'Delete a line (not the default line)',
      rule: { kind: 'member', roles: [...editors], cruise: lineCruise },
      handler: async (req, res, ctx) => {
        await auditedChange(
          deps.db.sequelize,
          { cruiseId: ctx.cruiseId!, userId: req.user!.id, action: 'delete', entity: 'line' },
          async (transaction) => {
            const r = await Line.findByPk(String(req.params.id), { transaction, lock: true });
            if (!r) throw notFound('No such line.');
            await deleteLine(r, transaction);
            return { result: null, entityId: r.id, before: { name: r.name, stations: r.stations, casts: r.casts } };
          },
        );
        res.status(204).end();
      },
    }),
  ];
}
