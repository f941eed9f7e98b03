// Analysis routes: derived variables and their preview, the T–S points, geostrophy, saved views.
import { z } from 'zod';
import { binQuery } from '../lib/bounds';
import type { Request } from 'express';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { badRequest, conflict, notFound } from '../lib/errors';
import { Cast, DerivedVariable, SavedView } from '../models/index';
import { audit } from '../lib/audit';
import { compileFormula } from '../../shared/derived/index';
import { readColumns } from '../services/columns';
import { applyFlags, cached, dataVersion, invalidateDataVersion } from '../services/cruiseData';
import { geostrophicSection, transportPerLayer } from '../../shared/section/index';
import { loadLineCasts } from '../services/lines';
import { resolveLayerBoundaries } from '../services/levels';
import { referencePressureSchema } from '../../shared/api/levels';
import { derivedVariableListResponseSchema } from '../../shared/api/resources';
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
const NewView = z.object({ name: z.string().trim().min(1).max(100), query: z.string().max(4000) });
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
      summary: 'Your saved section views',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (req, _res, ctx) =>
        (
          await SavedView.findAll({
            where: { cruiseId: ctx.cruiseId!, userId: req.user!.id },
            order: [['createdAt', 'DESC']],
          })
        ).map((v) => ({ id: v.id, name: v.name, query: v.query, createdAt: v.createdAt })),
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/views',
      changesData: false,
      summary: 'Save a section view',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      body: NewView,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const v = await SavedView.create({
          cruiseId: ctx.cruiseId!,
          userId: req.user!.id,
          name: b.name,
          query: b.query.replace(/^\?/, ''),
        });
        res.status(201).json({ id: v.id, name: v.name, query: v.query, createdAt: v.createdAt });
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/cruises/:id/views/:viewId',
      changesData: false,
      summary: 'Delete one of your saved views',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (req, res, ctx) => {
        const id = uuidOr404(req.params.viewId, 'view');
        const n = await SavedView.destroy({ where: { id, cruiseId: ctx.cruiseId!, userId: req.user!.id } });
        if (!n) throw notFound('No such view.');
        res.status(204).end();
      },
    }),
  ];
}
