import { z } from 'zod';
import type { Request } from 'express';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { notFound } from '../lib/errors';
import { Cast } from '../models/index';
import { readColumns } from '../services/columns';
import { setFlag } from '../services/qcFlags';
import type { AppDeps } from '../lib/deps';

export const castCruise = async (req: Request) => {
  const id = String(req.params.id);
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  return (await Cast.findByPk(id, { attributes: ['cruiseId'] }))?.cruiseId ?? null;
};
const toJsonArray = (a: ArrayLike<number>) => Array.from(a, (v) => (Number.isFinite(v) ? v : null));

export const castSummary = (c: Cast) => ({
  id: c.id,
  station: c.station,
  cast: c.cast,
  latitude: c.latitude,
  longitude: c.longitude,
  time: c.time,
  bottomDepth: c.bottomDepth,
  levels: c.levels,
  inversions: c.inversionCount,
  uploadId: c.uploadId,
  sourceFile: c.sourceFile,
  partlyRead: c.partlyRead ?? null,
});

const FlagEdit = z.object({
  variable: z.enum(['temperature', 'salinity', 'conductivity', 'oxygen', 'all']),
  pFrom: z.number().min(-10).max(12000),
  pTo: z.number().min(-10).max(12000),
  flag: z.union([z.literal(1), z.literal(2), z.literal(3), z.literal(4), z.literal(9)]),
  reason: z.string().trim().max(500).optional(),
});

export function castRoutes(deps: AppDeps): RouteSpec[] {
  return [
    defineRoute({
      method: 'get',
      path: '/cruises/:id/casts',
      summary: 'Casts of a cruise, in track order',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) =>
        (
          await Cast.findAll({
            where: { cruiseId: ctx.cruiseId! },
            order: [
              ['time', 'ASC NULLS LAST'],
              ['station', 'ASC'],
              ['cast', 'ASC'],
            ],
          })
        ).map(castSummary),
    }),
    defineRoute({
      method: 'get',
      path: '/casts/:id',
      summary: 'One cast: metadata, columns, inversions, fitness and notes',
      rule: { kind: 'member', roles: 'any', cruise: castCruise },
      handler: async (req) => {
        const c = await Cast.findByPk(String(req.params.id));
        if (!c) throw notFound();
        const cols = (await readColumns([c.id])).get(c.id)!;
        const columns: Record<string, (number | null)[]> = {};
        const extras: Record<string, { unit: string | null; values: (number | null)[] }> = {};
        for (const [name, v] of Object.entries(cols.columns)) {
          if (name.startsWith('x:')) extras[name.slice(2)] = { unit: cols.units[name], values: toJsonArray(v) };
          else columns[name] = toJsonArray(v);
        }
        const flags: Record<string, number[]> = {};
        for (const [name, v] of Object.entries(cols.flags)) flags[name.replace(/^flag:/, '')] = Array.from(v);
        const units = Object.fromEntries(
          Object.entries(cols.units).filter(([k]) => !k.startsWith('x:') && !k.startsWith('flag:')),
        );
        return {
          ...castSummary(c),
          metadata: c.metadata,
          notes: c.notes,
          fitness: c.fitness,
          inversions: c.inversions,
          columns,
          units,
          extras,
          flags,
        };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/casts/:id/flags',
      changesData: true,
      summary: 'Set a quality flag (1–9 scale) on a pressure range of a variable',
      rule: { kind: 'member', roles: ['technician', 'chief_scientist'], cruise: castCruise },
      body: FlagEdit,
      handler: async (req, _res, ctx) => setFlag(deps, String(req.params.id), ctx.body, req.user!.id),
    }),
  ];
}
