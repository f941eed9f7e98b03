// Analysis routes: derived variables and their preview, the T–S points, geostrophy, saved views.
import { z } from 'zod';
import { binQuery } from '../lib/bounds';
import type { Request } from 'express';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { HttpError, badRequest, conflict, notFound } from '../lib/errors';
import { Op } from 'sequelize';
import { Cast, DerivedVariable, SavedView, User } from '../models/index';
import { audit } from '../lib/audit';
import { compileFormula } from '../../shared/derived/index';
import { readColumns } from '../services/columns';
import { applyFlags, cached, dataVersion, invalidateDataVersion } from '../services/cruiseData';
import { geostrophicSection, transportPerLayer } from '../../shared/section/index';
import { loadLineCasts } from '../services/lines';
import { resolveLayerBoundaries } from '../services/levels';
import { referencePressureSchema } from '../../shared/api/levels';
import {
  derivedVariableListResponseSchema,
  savedViewListResponseSchema,
  savedViewResponseSchema,
} from '../../shared/api/resources';
import type { AppDeps } from '../lib/deps';

const uuidOr404 = (v: unknown, what: string) => {
  if (typeof v !== 'string' || !/^[0-9a-f-]{36}$/i.test(v)) throw notFound(`No such ${what}.`);
  return v;
};
const castCruise = async (req: Request) => {
  const id = String(req.params.id);
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  return (await Cast.findByPk(id, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
};
const json = (a: ArrayLike<number>) => Array.from(a, (v) => (Number.isFinite(v) ? v : null));
const NewVariable = z.object({
  name: z
    .string()
    .trim()
    .regex(/^[A-Za-z][A-Za-z0-9_]{0,39}$/, 'a name of letters, digits and _, starting with a letter'),
  formula: z.string().trim().min(1).max(500),
  unit: z.string().trim().max(40).nullish(),
  description: z.string().trim().max(500).nullish(),
});
const Preview = z.object({ formula: z.string().max(500) });
const lineParam = z.string().max(64).optional();
const TsQuery = z.object({ every: z.coerce.number().int().min(1).max(1000).default(4), line: lineParam });
const GeoQuery = z.object({
  pRef: z.union([z.literal('deepest_common'), z.coerce.number().min(0).max(11000)]).default('deepest_common'),
  ref: referencePressureSchema.default(0),
  levels: z.string().max(20000).optional(),
  bin: binQuery(20),
  /** pairs of adjacent stations closer than this, km, are skipped and named */
  minDistanceKm: z.coerce.number().min(0).max(500).default(2),
  line: lineParam,
});
const viewName = z.string().trim().min(1).max(100);
const viewQuery = z.string().max(4000);
const NewView = z.object({ name: viewName, query: viewQuery, shared: z.boolean().optional() }).strict();
const ViewPatch = z
  .object({ name: viewName.optional(), query: viewQuery.optional(), shared: z.boolean().optional() })
  .strict()
  .refine((b) => b.name !== undefined || b.query !== undefined || b.shared !== undefined, {
    message: 'Say what to change: name, query or shared.',
  });
type ViewRow = SavedView & { User?: User | null };
const viewJson = (v: ViewRow, me: string, myName?: string) => ({
  id: v.id,
  name: v.name,
  query: v.query,
  shared: v.shared,
  owner: { id: v.userId, name: v.User?.name ?? (v.userId === me && myName ? myName : 'a former member') },
  mine: v.userId === me,
  createdAt: v.createdAt,
  updatedAt: v.updatedAt,
});
/** A view the caller may read: their own, or one shared on this cruise; anything else is "no such view". */
async function visibleView(req: Request, cruiseId: string): Promise<ViewRow> {
  const id = uuidOr404(req.params.viewId, 'view');
  const v = (await SavedView.findOne({
    where: { id, cruiseId, [Op.or]: [{ userId: req.user!.id }, { shared: true }] },
    include: [{ model: User, attributes: ['id', 'name'] }],
  })) as ViewRow | null;
  if (!v) throw notFound('No such view.');
  return v;
}
/** A view the caller owns; a teammate's shared view is read-only to them (403 naming its owner). */
async function ownView(req: Request, cruiseId: string, what: 'change' | 'delete'): Promise<ViewRow> {
  const v = await visibleView(req, cruiseId);
  if (v.userId !== req.user!.id)
    throw new HttpError(
      403,
      'not_owner',
      `Only ${v.User?.name ?? 'the member who saved it'} can ${what} this view; copy it to keep your own.`,
    );
  return v;
}
const RESERVED = new Set([
  'pressure',
  'temperature',
  'SP',
  'SA',
  'CT',
  'pt0',
  'sigma0',
  'sigma1',
  'sigma2',
  'sigma3',
  'sigma4',
  'rho',
  'spiciness0',
  'z',
  'depth',
  'oxygen',
  'N2',
  'p_mid',
  'conductivity',
]);
const FORMULA_COLUMNS = [...RESERVED].filter((c) => c !== 'N2' && c !== 'p_mid');

export function analysisRoutes(deps: AppDeps): RouteSpec[] {
  const editors = ['analyst', 'chief_scientist'] as const;
  const formulaError = (message: string, position: number | null) =>
    badRequest(`The formula is not valid: ${message}`, [{ field: 'formula', message, position }], 'bad_formula');
  return [
    defineRoute({
      method: 'get',
      path: '/cruises/:id/derived-variables',
      summary: "The cruise's derived variables (mathjs formulas over cast columns)",
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: derivedVariableListResponseSchema,
      handler: async (_req, _res, ctx) =>
        (await DerivedVariable.findAll({ where: { cruiseId: ctx.cruiseId! }, order: [['name', 'ASC']] })).map((d) => ({
          id: d.id,
          name: d.name,
          formula: d.formula,
          unit: d.unit,
          description: d.description,
        })),
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/derived-variables',
      changesData: true,
      summary: 'Define a derived variable',
      rule: { kind: 'member', roles: [...editors], cruise: byParam() },
      body: NewVariable,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        if (RESERVED.has(b.name))
          throw badRequest(`${b.name} is the name of a cast column.`, [
            { field: 'name', message: 'taken by a cast column' },
          ]);
        const f = compileFormula(b.formula, FORMULA_COLUMNS);
        if (!f.ok) throw formulaError(f.error.message, f.error.position);
        if (await DerivedVariable.findOne({ where: { cruiseId: ctx.cruiseId!, name: b.name } }))
          throw conflict(`A derived variable named ${b.name} exists.`);
        const d = await deps.db.sequelize.transaction(async (transaction) => {
          const row = await DerivedVariable.create(
            {
              cruiseId: ctx.cruiseId!,
              name: b.name,
              formula: b.formula,
              unit: b.unit ?? null,
              description: b.description ?? null,
              createdBy: req.user!.id,
            },
            { transaction },
          );
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'create',
              entity: 'derived_variable',
              entityId: row.id,
              after: b,
            },
            transaction,
          );
          return row;
        });
        invalidateDataVersion(ctx.cruiseId!);
        res.status(201).json({
          id: d.id,
          name: d.name,
          formula: d.formula,
          unit: d.unit,
          description: d.description,
          variables: f.variables,
        });
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/cruises/:id/derived-variables/:varId',
      changesData: true,
      summary: 'Remove a derived variable',
      rule: { kind: 'member', roles: [...editors], cruise: byParam() },
      handler: async (req, res, ctx) => {
        const id = uuidOr404(req.params.varId, 'derived variable');
        await deps.db.sequelize.transaction(async (transaction) => {
          const d = await DerivedVariable.findOne({ where: { id, cruiseId: ctx.cruiseId! }, transaction });
          if (!d) throw notFound('No such derived variable.');
          await d.destroy({ transaction });
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'delete',
              entity: 'derived_variable',
              entityId: id,
              before: { name: d.name, formula: d.formula },
            },
            transaction,
          );
        });
        invalidateDataVersion(ctx.cruiseId!);
        res.status(204).end();
      },
    }),
    defineRoute({
      method: 'post',
      path: '/casts/:id/formula-preview',
      changesData: false,
      summary: 'Evaluate a formula on one cast',
      rule: { kind: 'member', roles: 'any', cruise: castCruise },
      body: Preview,
      handler: async (req, _res, ctx) => {
        const { formula } = ctx.body;
        const cols = (await readColumns([String(req.params.id)])).get(String(req.params.id))!;
        const usable = Object.fromEntries(
          Object.entries(cols.columns).filter(
            ([k, v]) => !k.startsWith('x:') && v.length === cols.columns.pressure.length,
          ),
        );
        const f = compileFormula(formula, Object.keys(usable));
        if (!f.ok) throw formulaError(f.error.message, f.error.position);
        return { pressure: json(usable.pressure), values: json(f.evaluate(usable)), variables: f.variables };
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/ts',
      summary: 'Conservative Temperature and Absolute Salinity of every cast, for the T–S diagram',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      query: TsQuery,
      handler: async (_req, _res, ctx) => {
        const { every, line } = ctx.query;
        const version = await dataVersion(ctx.cruiseId!);
        return cached(`ts:${ctx.cruiseId}:${version}:${every}:${line ?? ''}`, async () => {
          const resolved = await loadLineCasts(ctx.cruiseId!, line, []);
          const casts = resolved.casts;
          const x = resolved.stations.map((st) => st.x);
          return casts.map((c, i) => {
            const cols = applyFlags(c, [1, 2]);
            const pick = (a: Float64Array) => {
              const out: (number | null)[] = [];
              for (let k = 0; k < a.length; k += every) out.push(Number.isFinite(a[k]) ? a[k] : null);
              return out;
            };
            return {
              castId: c.id,
              station: c.station,
              x: x[i],
              SA: pick(cols.SA),
              CT: pick(cols.CT),
              p: pick(cols.pressure),
            };
          });
        });
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/geostrophy',
      summary: 'Geostrophic velocity between adjacent casts and transport per isopycnal layer',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      query: GeoQuery,
      handler: async (_req, _res, ctx) => {
        const q = ctx.query;
        const version = await dataVersion(ctx.cruiseId!);
        return cached(`geo:${ctx.cruiseId}:${version}:${JSON.stringify(q)}`, async () => {
          const resolved = await loadLineCasts(ctx.cruiseId!, q.line, []);
          const xOf = new Map(resolved.stations.map((st) => [st.castId, st.x]));
          const casts = resolved.casts.filter((c) => c.columns.pressure.length > 2);
          // Default layers: a thinned subset of the section's default levels (shared/api/levels.ts).
          const { text: levelsText, levels: boundaries } = resolveLayerBoundaries(casts, q.ref, q.levels);
          const choices = {
            pRef: q.pRef,
            ref: q.ref,
            levels: levelsText,
            bin: q.bin,
            minDistanceKm: q.minDistanceKm,
            line: resolved.id,
          };
          const convention =
            'v = ΔD / (f·L) between adjacent casts A and B; positive is 90° to the left of the direction from A to B (looking along the section from its first cast: for a section run eastward, positive is northward).';
          if (casts.length < 2)
            return { choices, convention, pressure: [], pairs: [], skipped: [], velocity: [], layers: [] };
          const sec = geostrophicSection(
            casts.map((c) => {
              const k = applyFlags(c, [1, 2]);
              return { id: c.station, lon: c.longitude, lat: c.latitude, p: k.pressure, SA: k.SA, CT: k.CT };
            }),
            {
              pRef: q.pRef,
              binSize: q.bin,
              sigmaRef: q.ref,
              positions: casts.map((c) => xOf.get(c.id)!),
              minDistanceKm: q.minDistanceKm,
            },
          );
          const layers = transportPerLayer(sec, boundaries);
          return {
            choices,
            convention,
            pressure: Array.from(sec.p),
            pairs: sec.pairs.map((p) => ({
              a: p.a,
              b: p.b,
              x: p.x,
              widthKm: p.width / 1000,
              pRef: Number.isFinite(p.pRef) ? p.pRef : null,
            })),
            skipped: sec.skipped.map((k) => ({
              ...k,
              why: `the stations are ${k.distanceKm.toFixed(2)} km apart, closer than ${q.minDistanceKm} km`,
            })),
            velocity: sec.grid.z,
            layers: layers.map((l) => ({
              sigmaTop: l.sigmaTop,
              sigmaBottom: l.sigmaBottom,
              transport: json(l.transport),
              total: l.total,
            })),
          };
        });
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/views',
      summary: 'The saved section views you may open: your own and those the team shared',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: savedViewListResponseSchema,
      handler: async (req, _res, ctx) => {
        const me = req.user!.id;
        const rows = await SavedView.findAll({
          where: { cruiseId: ctx.cruiseId!, [Op.or]: [{ userId: me }, { shared: true }] },
          include: [{ model: User, attributes: ['id', 'name'] }],
          order: [['updatedAt', 'DESC']],
          limit: 500,
        });
        // Your own first, then the team's, each newest first.
        return rows.map((v) => viewJson(v, me)).sort((a, b) => Number(b.mine) - Number(a.mine));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/views/:viewId',
      summary: 'One saved view: yours, or one the team shared',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: savedViewResponseSchema,
      handler: async (req, _res, ctx) => viewJson(await visibleView(req, ctx.cruiseId!), req.user!.id),
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/views',
      // a saved view is the member's own bookmark, not the cruise's data: kept on a locked cruise too
      changesData: false,
      summary: 'Save a section view (yours; shared with the team if asked)',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      body: NewView,
      response: savedViewResponseSchema,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const v = await SavedView.create({
          cruiseId: ctx.cruiseId!,
          userId: req.user!.id,
          name: b.name,
          query: b.query.replace(/^\?/, ''),
          shared: b.shared ?? false,
        });
        res.status(201).json(viewJson(v, req.user!.id, req.user!.name));
      },
    }),
    defineRoute({
      method: 'patch',
      path: '/cruises/:id/views/:viewId',
      changesData: false,
      summary: 'Rename, re-aim or share one of your saved views (the owner only)',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      body: ViewPatch,
      response: savedViewResponseSchema,
      handler: async (req, _res, ctx) => {
        const v = await ownView(req, ctx.cruiseId!, 'change');
        const b = ctx.body as z.infer<typeof ViewPatch>;
        await v.update({
          ...(b.name !== undefined ? { name: b.name } : {}),
          ...(b.query !== undefined ? { query: b.query.replace(/^\?/, '') } : {}),
          ...(b.shared !== undefined ? { shared: b.shared } : {}),
        });
        return viewJson(v, req.user!.id);
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/cruises/:id/views/:viewId',
      changesData: false,
      summary: 'Delete one of your saved views (the owner only)',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (req, res, ctx) => {
        const v = await ownView(req, ctx.cruiseId!, 'delete');
        await v.destroy();
        res.status(204).end();
      },
    }),
  ];
}
