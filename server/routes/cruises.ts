import { z } from 'zod';

import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { badRequest, conflict, notFound } from '../lib/errors';
import {
  AuditEntry,
  Cast,
  Cruise,
  DerivedVariable,
  LayerSet,
  Line,
  Membership,
  Station,
  Upload,
  User,
  type Role,
} from '../models/index';
import { audit } from '../lib/audit';
import { auditSentence } from '../../shared/api/audit';
import { isUuid } from '../lib/input';
import type { AppDeps } from '../lib/deps';
import {
  applyStationTable,
  editStation,
  listStations,
  previewStationTable,
  removeStation,
  reorderStations,
} from '../services/stationPlan';
import {
  planApplyResponseSchema,
  planChangeSchema,
  stationListResponseSchema,
  stationOrderSchema,
  stationPatchSchema,
  stationResponseSchema,
  stationTableApplySchema,
  stationTableSchema,
  type StationPatch,
} from '../../shared/api/stations';

/** A calendar date YYYY-MM-DD that exists (no 2026-02-31), in years a cruise can have (1800–2200). */
const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'use YYYY-MM-DD')
  .refine((s) => {
    const [y, m, d] = s.split('-').map(Number);
    const t = new Date(Date.UTC(y, m - 1, d));
    return y >= 1800 && y <= 2200 && t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
  }, 'not a calendar date (years 1800–2200)');
const optionalText = z.string().trim().max(2000).nullable().optional();
const CruiseFields = z.object({
  name: z.string().trim().min(1, 'required').max(200),
  ship: z.string().trim().min(1, 'required').max(200),
  startDate: isoDate,
  endDate: isoDate,
  portStart: optionalText,
  portEnd: optionalText,
  region: optionalText,
  description: optionalText,
});
const CreateCruise = CruiseFields.refine((c) => c.endDate >= c.startDate, {
  message: 'the end date must not be before the start date',
  path: ['endDate'],
});
const PatchCruise = CruiseFields.partial().extend({ locked: z.boolean().optional() });
const NewStation = z.object({
  name: z.string().trim().min(1).max(100),
  latitude: z.number().min(-90).max(90),
  longitude: z.number().min(-180).max(360),
  plannedDepth: z.number().min(0).max(12000).nullable().optional(),
});

const withoutEmail = (v: unknown) => {
  if (!v || typeof v !== 'object' || Array.isArray(v)) return v;
  const { email: _email, ...rest } = v as Record<string, unknown>;
  return rest;
};

export async function cruiseJson(c: Cruise, role: Role | null) {
  const [stationCount, castCount] = await Promise.all([
    Station.count({ where: { cruiseId: c.id } }),
    Cast.count({ where: { cruiseId: c.id } }),
  ]);
  return {
    id: c.id,
    name: c.name,
    ship: c.ship,
    startDate: c.startDate,
    endDate: c.endDate,
    portStart: c.portStart,
    portEnd: c.portEnd,
    region: c.region,
    description: c.description,
    locked: c.locked,
    role,
    stationCount,
    castCount,
    createdAt: c.createdAt,
  };
}

const cruiseFields = (c: Cruise) => ({
  name: c.name,
  ship: c.ship,
  startDate: c.startDate,
  endDate: c.endDate,
  portStart: c.portStart,
  portEnd: c.portEnd,
  region: c.region,
  description: c.description,
  locked: c.locked,
});

export function cruiseRoutes(deps: AppDeps): RouteSpec[] {
  const { sequelize } = deps.db;
  return [
    defineRoute({
      method: 'post',
      path: '/cruises',
      summary: 'Create a cruise; the creator becomes its chief scientist',
      rule: { kind: 'signed_in' },
      body: CreateCruise,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const cruise = await sequelize.transaction(async (transaction) => {
          const c = await Cruise.create(
            {
              name: b.name,
              ship: b.ship,
              startDate: b.startDate,
              endDate: b.endDate,
              portStart: b.portStart ?? null,
              portEnd: b.portEnd ?? null,
              region: b.region ?? null,
              description: b.description ?? null,
              createdBy: req.user!.id,
            },
            { transaction },
          );
          await Membership.create({ userId: req.user!.id, cruiseId: c.id, role: 'chief_scientist' }, { transaction });
          await audit(
            {
              cruiseId: c.id,
              userId: req.user!.id,
              action: 'create',
              entity: 'cruise',
              entityId: c.id,
              after: cruiseFields(c),
            },
            transaction,
          );
          return c;
        });
        res.status(201).json(await cruiseJson(cruise, 'chief_scientist'));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises',
      summary: 'The cruises you belong to, with your role',
      rule: { kind: 'signed_in' },
      handler: async (req) => {
        const ms = await Membership.findAll({
          where: { userId: req.user!.id },
          include: [Cruise],
          order: [[Cruise, 'startDate', 'DESC']],
        });
        return Promise.all(ms.map((m) => cruiseJson((m as Membership & { Cruise: Cruise }).Cruise, m.role)));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id',
      summary: 'One cruise',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) => {
        const c = await Cruise.findByPk(ctx.cruiseId!);
        if (!c) throw notFound();
        return cruiseJson(c, ctx.role);
      },
    }),
    defineRoute({
      method: 'patch',
      path: '/cruises/:id',
      changesData: (req) => Object.keys((req.body ?? {}) as object).some((k) => k !== 'locked'),
      summary: 'Edit or lock a cruise',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: PatchCruise,
      handler: async (req, _res, ctx) => {
        const b = ctx.body;
        return sequelize.transaction(async (transaction) => {
          const c = await Cruise.findByPk(ctx.cruiseId!, { transaction, lock: true });
          if (!c) throw notFound();
          const before = cruiseFields(c);
          const next = { ...before, ...b };
          if (next.endDate < next.startDate)
            throw badRequest('The end date must not be before the start date.', [
              { field: 'endDate', message: 'before the start date' },
            ]);
          await c.update(b, { transaction });
          await audit(
            {
              cruiseId: c.id,
              userId: req.user!.id,
              action: b.locked !== undefined && b.locked !== before.locked ? (b.locked ? 'lock' : 'unlock') : 'update',
              entity: 'cruise',
              entityId: c.id,
              before,
              after: cruiseFields(c),
            },
            transaction,
          );
          return cruiseJson(c, ctx.role);
        });
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/stations',
      summary: 'Planned stations in plan order, with the live casts of each',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      response: stationListResponseSchema,
      handler: async (_req, _res, ctx) => listStations(ctx.cruiseId!),
    }),
    defineRoute({
      method: 'patch',
      path: '/cruises/:id/stations/:stationId',
      changesData: true,
      summary: "Edit a planned station's name, position or depth (an occupied station keeps its name)",
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: stationPatchSchema,
      response: stationResponseSchema,
      responses: { 409: 'renaming a station that has casts, or a name already planned' },
      handler: async (req, _res, ctx) =>
        editStation(deps, ctx.cruiseId!, String(req.params.stationId), ctx.body as StationPatch, req.user!.id),
    }),
    defineRoute({
      method: 'delete',
      path: '/cruises/:id/stations/:stationId',
      changesData: true,
      summary: 'Remove a planned station; refused (409 station_occupied) while it has casts',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      response: stationListResponseSchema,
      handler: async (req, _res, ctx) => removeStation(deps, ctx.cruiseId!, String(req.params.stationId), req.user!.id),
    }),
    defineRoute({
      method: 'put',
      path: '/cruises/:id/stations/order',
      changesData: true,
      summary: 'Put the plan in a new order (every station id once); the default line follows it',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: stationOrderSchema,
      response: stationListResponseSchema,
      handler: async (req, _res, ctx) =>
        reorderStations(deps, ctx.cruiseId!, (ctx.body as z.infer<typeof stationOrderSchema>).ids, req.user!.id),
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/stations/table/preview',
      changesData: false,
      summary: 'What a pasted or imported station table would change in the plan; writes nothing',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: stationTableSchema,
      response: planChangeSchema,
      responses: { 400: 'bad_station_table: each problem with its line and column' },
      handler: async (_req, _res, ctx) => {
        const b = ctx.body as z.infer<typeof stationTableSchema>;
        return previewStationTable(ctx.cruiseId!, b.text, b.mode);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/stations/table/apply',
      changesData: true,
      summary: 'Apply a previewed station table (its token): exactly the previewed change, in one transaction',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: stationTableApplySchema,
      response: planApplyResponseSchema,
      responses: { 409: 'plan_changed: the plan or its casts changed since the preview; nothing written' },
      handler: async (req, _res, ctx) => {
        const b = ctx.body as z.infer<typeof stationTableApplySchema>;
        return applyStationTable(deps, ctx.cruiseId!, b.text, b.mode, b.token, req.user!.id);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/cruises/:id/stations',
      changesData: true,
      summary: 'Add a planned station',
      rule: { kind: 'member', roles: ['chief_scientist'], cruise: byParam() },
      body: NewStation,
      handler: async (req, res, ctx) => {
        const b = ctx.body;
        const s = await sequelize.transaction(async (transaction) => {
          if (await Station.findOne({ where: { cruiseId: ctx.cruiseId!, name: b.name }, transaction }))
            throw conflict(`Station ${b.name} is already planned.`);
          const max = (await Station.max('order', { where: { cruiseId: ctx.cruiseId! }, transaction })) as
            number | null;
          const lon = b.longitude > 180 ? b.longitude - 360 : b.longitude;
          const st = await Station.create(
            {
              cruiseId: ctx.cruiseId!,
              name: b.name,
              latitude: b.latitude,
              longitude: lon,
              plannedDepth: b.plannedDepth ?? null,
              order: (max ?? 0) + 1,
            },
            { transaction },
          );
          await audit(
            {
              cruiseId: ctx.cruiseId!,
              userId: req.user!.id,
              action: 'create',
              entity: 'station',
              entityId: st.id,
              after: b,
            },
            transaction,
          );
          return st;
        });
        res.status(201).json({
          id: s.id,
          name: s.name,
          latitude: s.latitude,
          longitude: s.longitude,
          plannedDepth: s.plannedDepth,
          order: s.order,
          occupied: false,
          casts: 0,
        });
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/audit',
      summary: 'The audit trail of a cruise',
      rule: { kind: 'member', roles: ['chief_scientist', 'technician', 'analyst', 'pi'], cruise: byParam() },
      handler: async (_req, _res, ctx) => {
        const rows = await AuditEntry.findAll({
          where: { cruiseId: ctx.cruiseId! },
          include: [{ model: User, attributes: ['id', 'name'] }],
          order: [['at', 'DESC']],
          limit: 500,
        });
        // Invitations (and their addresses) are for chief scientists only: others see that one was sent.
        const hide = (r: AuditEntry, v: unknown) =>
          ctx.role !== 'chief_scientist' && r.entity === 'invitation' ? withoutEmail(v) : v;
        const subjects = await auditSubjects(rows);
        return rows.map((r) => {
          const u = (r as AuditEntry & { User?: User | null }).User;
          const before = hide(r, r.before);
          const after = hide(r, r.after);
          const actor = u ? { id: u.id, name: u.name } : null;
          const subject = subjects.get(`${r.entity}:${r.entityId}`) ?? nameIn(r.entity, before, after);
          return {
            id: String(r.id),
            at: r.at,
            actor,
            action: r.action,
            entity: r.entity,
            entityId: r.entityId,
            sentence: auditSentence({
              actor: actor?.name ?? null,
              action: r.action,
              entity: r.entity,
              subject,
              before,
              after,
            }),
            before,
            after,
          };
        });
      },
    }),
  ];
}

const castLabel = (c: { station: string; cast: string }) => `station ${c.station} cast ${c.cast}`;

/** A name carried in the entry itself (a removed file's name, a new station's). */
function nameIn(entity: string, before: unknown, after: unknown): string | null {
  for (const v of [after, before]) {
    const o = (v && typeof v === 'object' ? v : {}) as Record<string, unknown>;
    if (entity === 'upload' && typeof o.filename === 'string') return o.filename;
    if (entity === 'cast' && typeof o.station === 'string' && o.cast !== undefined)
      return castLabel({ station: o.station, cast: String(o.cast) });
    if (['station', 'line', 'layer_set', 'derived_variable', 'cruise'].includes(entity) && typeof o.name === 'string')
      return o.name;
  }
  return null;
}

/** The names of what the entries acted on, looked up in a few queries (one per kind). */
async function auditSubjects(rows: readonly AuditEntry[]): Promise<Map<string, string>> {
  const ids = (entity: string) => [
    ...new Set(rows.filter((r) => r.entity === entity && r.entityId && isUuid(r.entityId)).map((r) => r.entityId!)),
  ];
  const out = new Map<string, string>();
  const put = (entity: string, id: string, name: string) => out.set(`${entity}:${id}`, name);
  const proposalCasts = new Map<string, string>();
  for (const r of rows)
    if (r.entity === 'qc_proposal' && r.entityId) {
      const cast = (r.after as Record<string, unknown> | null)?.cast;
      if (typeof cast === 'string' && isUuid(cast)) proposalCasts.set(r.entityId, cast);
    }
  const castIds = [...new Set([...ids('cast'), ...proposalCasts.values()])];
  const [uploads, casts, lines, sets, vars, users, cruises] = await Promise.all([
    Upload.findAll({ where: { id: ids('upload') }, attributes: ['id', 'filename'] }),
    Cast.findAll({ where: { id: castIds }, attributes: ['id', 'station', 'cast'], paranoid: false }),
    Line.findAll({ where: { id: ids('line') }, attributes: ['id', 'name'] }),
    LayerSet.findAll({ where: { id: ids('layer_set') }, attributes: ['id', 'name'] }),
    DerivedVariable.findAll({ where: { id: ids('derived_variable') }, attributes: ['id', 'name'] }),
    User.findAll({ where: { id: ids('membership') }, attributes: ['id', 'name'] }),
    Cruise.findAll({ where: { id: ids('cruise') }, attributes: ['id', 'name'] }),
  ]);
  for (const u of uploads) put('upload', u.id, u.filename);
  const castName = new Map(casts.map((c) => [c.id, castLabel(c)]));
  for (const [id, name] of castName) put('cast', id, name);
  for (const [proposal, cast] of proposalCasts)
    if (castName.has(cast)) put('qc_proposal', proposal, castName.get(cast)!);
  for (const l of lines) put('line', l.id, l.name);
  for (const l of sets) put('layer_set', l.id, l.name);
  for (const d of vars) put('derived_variable', d.id, d.name);
  for (const u of users) put('membership', u.id, u.name);
  for (const c of cruises) put('cruise', c.id, c.name);
  return out;
}
