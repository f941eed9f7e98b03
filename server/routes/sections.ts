import { z } from 'zod';
import { binQuery } from '../lib/bounds';
import { gzipSync } from 'node:zlib';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { notFound } from '../lib/errors';
import { LayerSet } from '../models/index';
import { audit } from '../lib/audit';
import { levelsOrError } from '../services/levels';
import { referencePressureSchema } from '../../shared/api/levels';
import { cached, dataVersion, invalidateDataVersion } from '../services/cruiseData';
import { isopycnalTable, pressureTable } from '../services/deliveryTables';
import { csvStream, deliveryStem, type DeliveryTable } from '../services/deliveries/index';
import { buildSectionView, fileVariables, SectionQuery } from '../services/sectionView';
import { fileVariableListResponseSchema, layerSetListResponseSchema } from '../../shared/api/resources';
import type { AppDeps } from '../lib/deps';

const ref = referencePressureSchema;
const flags = z
  .string()
  .regex(/^\d(,\d)*$/, 'flags are a comma list of 1–9')
  .transform((s) => s.split(',').map(Number))
  .default([1, 2]);
const extras = z
  .string()
  .max(500)
  .transform((s) =>
    s
      .split(',')
      .map((x) => x.trim())
      .filter(Boolean),
  )
  .default([]);
export const IsopycnalQuery = z.object({
  ref: ref.default(0),
  levels: z.string().max(20000).optional(),
  inversions: z.enum(['sort', 'drop', 'raw']).default('sort'),
  interpolation: z.enum(['linear', 'pchip']).default('linear'),
  flags,
  extras,
  line: z.string().trim().min(1).max(100).optional(),
});
const PressureQuery = z.object({ bin: binQuery(2), flags, extras, line: z.string().trim().min(1).max(100).optional() });
/** `attachment; filename="<cruise>_<line>_<kind>_<ref>.csv"`, the delivery files' names. */
const attachment = (t: DeliveryTable, kind: 'isopycnal' | 'pressure', ref: { sigmaRef?: number; bin?: number }) =>
  `attachment; filename="${deliveryStem(t.provenance.expocode ?? t.provenance.cruise.name, t.provenance.line ?? 'default', kind, ref)}.csv"`;
const LayerSetBody = z.object({
  name: z.string().trim().min(1).max(100),
  referencePressure: ref,
  levels: z.string().trim().min(1).max(20000),
});

export function sectionRoutes(deps: AppDeps): RouteSpec[] {
  const readers = ['pi', 'chief_scientist', 'analyst'] as const;
  const editors = ['analyst', 'chief_scientist'] as const;
  return [
    defineRoute({
      method: 'get',
      path: '/cruises/:id/exports/isopycnal.csv',
      summary: 'The isopycnal table (CSV with provenance comment lines)',
      rule: { kind: 'member', roles: [...readers], cruise: byParam() },
      query: IsopycnalQuery,
      handler: async (req, res, ctx) => {
        const q = ctx.query;
        const table = await isopycnalTable(ctx.cruiseId!, req.user!.email, {
          ref: q.ref,
          levels: q.levels ?? null,
          handling: q.inversions,
          interpolation: q.interpolation,
          flags: q.flags,
          extras: q.extras,
          line: q.line ?? null,
        });
        res.setHeader('content-type', 'text/csv; charset=utf-8');
        res.setHeader('content-disposition', attachment(table, 'isopycnal', { sigmaRef: q.ref }));
        csvStream(table).pipe(res);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/exports/pressure.csv',
      summary: 'The pressure-binned table (CSV with provenance comment lines)',
      rule: { kind: 'member', roles: [...readers], cruise: byParam() },
      query: PressureQuery,
      handler: async (req, res, ctx) => {
        const q = ctx.query;
        const table = await pressureTable(ctx.cruiseId!, req.user!.email, q);
        res.setHeader('content-type', 'text/csv; charset=utf-8');
        res.setHeader('content-disposition', attachment(table, 'pressure', { bin: q.bin }));
        csvStream(table).pipe(res);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/section',
      summary: 'A section grid by pressure or by density, with stations, bottom, isopycnals and inversion markers',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      query: SectionQuery,
      handler: async (_req, res, ctx) => {
        const q = ctx.query;
        const version = await dataVersion(ctx.cruiseId!);
        // The cache holds the serialised grid, plain and gzipped: a warm read is a lookup and a write.
        const body = await cached(`section:${ctx.cruiseId}:${version}:${JSON.stringify(q)}`, async () => {
          const json = Buffer.from(JSON.stringify(await buildSectionView(ctx.cruiseId!, q)));
          // level 1: a third of level 6's time on a 1–2 MB grid, for a slightly larger body
          return { json, gz: gzipSync(json, { level: 1 }) };
        });
        res.type('application/json').setHeader('vary', 'accept-encoding');
        if (/\bgzip\b/.test(String(_req.headers['accept-encoding'] ?? '')))
          res.setHeader('content-encoding', 'gzip').send(body.gz);
        else res.send(body.json);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/file-variables',
      summary:
        'Extra variables the casts carry (fluorescence, PAR, a second sensor…) with their units; drawable as `x:<name>`',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: fileVariableListResponseSchema,
      handler: async (_req, _res, ctx) => fileVariables(ctx.cruiseId!),
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/layer-sets',
      summary: 'Layer sets (target isopycnals per reference pressure)',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: layerSetListResponseSchema,
      handler: async (_req, _res, ctx) => {
        const rows = await LayerSet.findAll({
          where: { cruiseId: ctx.cruiseId! },
          order: [
            ['referencePressure', 'ASC'],
            ['name', 'ASC'],
          ],
        });
        return rows.map((r) => ({
          id: r.id,
          name: r.name,
          referencePressure: r.referencePressure,
          levels: r.levels,
          count: levelsOrError(r.levels).length,
        }));
      },
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/layer-sets',
      changesData: true,
      summary: 'Create a layer set',
      rule: { kind: 'member', roles: [...editors], cruise: byParam() },
      body: LayerSetBody,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const n = levelsOrError(b.levels).length;
        const row = await deps.db.sequelize.transaction(async (transaction) => {
          const r = await LayerSet.create(
            {
              cruiseId: ctx.cruiseId!,
              name: b.name,
              referencePressure: b.referencePressure,
              levels: b.levels,
              createdBy: req.user!.id,
            },
            { transaction },
          );
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'create',
              entity: 'layer_set',
              entityId: r.id,
              after: b,
            },
            transaction,
          );
          return r;
        });
        invalidateDataVersion(ctx.cruiseId!);
        res
          .status(201)
          .json({ id: row.id, name: row.name, referencePressure: row.referencePressure, levels: row.levels, count: n });
      },
    }),
    defineRoute({
      method: 'patch',
      path: '/cruises/:id/layer-sets/:setId',
      changesData: true,
      summary: 'Edit a layer set',
      rule: { kind: 'member', roles: [...editors], cruise: byParam() },
      body: LayerSetBody.partial(),
      handler: async (req, _res, ctx) => {
        const b = ctx.body;
        if (b.levels) levelsOrError(b.levels);
        if (!/^[0-9a-f-]{36}$/i.test(String(req.params.setId))) throw notFound('No such layer set.');
        const out = await deps.db.sequelize.transaction(async (transaction) => {
          const r = await LayerSet.findOne({
            where: { id: String(req.params.setId), cruiseId: ctx.cruiseId! },
            transaction,
            lock: true,
          });
          if (!r) throw notFound('No such layer set.');
          const before = { name: r.name, referencePressure: r.referencePressure, levels: r.levels };
          await r.update(b, { transaction });
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'update',
              entity: 'layer_set',
              entityId: r.id,
              before,
              after: b,
            },
            transaction,
          );
          return {
            id: r.id,
            name: r.name,
            referencePressure: r.referencePressure,
            levels: r.levels,
            count: levelsOrError(r.levels).length,
          };
        });
        invalidateDataVersion(ctx.cruiseId!);
        return out;
      },
    }),
  ];
}
