// Repeat occupations (docs/occupations.md): compare two lines, export the comparison, and list or
// link the lines of other cruises that are occupations of a line. Every route needs membership of
// both cruises involved: the rule guards the first line's cruise, the service the second's (404).
import { z } from 'zod';
import type { Request } from 'express';
import { defineRoute, type RouteSpec } from '../lib/routeTable';
import {
  ComparisonBody,
  buildComparison,
  comparisonBodyBytes,
  lineCruiseId,
  occupationsOf,
  linkLines,
  unlinkLines,
} from '../services/comparisons';
import { comparisonCsv, comparisonNetcdf } from '../services/comparisonExport';
import type { AppDeps } from '../lib/deps';

const bodyLineA = async (req: Request) => lineCruiseId((req.body as { lineA?: unknown } | undefined)?.lineA);
const queryLineA = async (req: Request) => lineCruiseId(req.query.lineA);
const paramLine = async (req: Request) => lineCruiseId(req.params.id);

const num = (v: unknown) => (typeof v === 'string' && v.trim() !== '' && Number.isFinite(Number(v)) ? Number(v) : v);
/** The comparison's choices from a query string (numbers and the flag list as text). */
export const ComparisonQuery = z.preprocess((raw) => {
  const q = { ...(raw as Record<string, unknown>) };
  for (const k of ['ref', 'pairDistanceKm', 'spacingKm', 'bin', 'pMax', 'digits']) if (k in q) q[k] = num(q[k]);
  if (typeof q.flags === 'string') q.flags = q.flags.split(',').map(num);
  // a drawn line in a link: "lon,lat;lon,lat;…"
  if (typeof q.line === 'string') q.line = q.line.split(';').map((pt) => pt.split(',').map(num));
  delete q.format;
  delete q.frame;
  return q;
}, ComparisonBody);
const ExportQuery = z
  .object({ format: z.enum(['csv', 'nc']).default('csv'), frame: z.enum(['pressure', 'density']).default('pressure') })
  .passthrough();
const LinkBody = z.object({ line: z.string().regex(/^[0-9a-f-]{36}$/i, 'a line id') }).strict();

export function comparisonRoutes(_deps: AppDeps): RouteSpec[] {
  const readers = ['pi', 'chief_scientist', 'analyst'] as const;
  const editors = ['chief_scientist', 'analyst'] as const;
  return [
    defineRoute({
      method: 'post',
      path: '/comparisons',
      changesData: false,
      summary:
        'Two occupations of one line on common positions: grids of both, differences on pressure and on isopycnals, heave, the Bindoff & McDougall split, means, transport change',
      rule: { kind: 'member', roles: 'any', cruise: bodyLineA },
      body: ComparisonBody,
      handler: async (req, res, ctx) => {
        const body = await comparisonBodyBytes(req.user!.id, ctx.body);
        res.type('application/json').setHeader('vary', 'accept-encoding');
        if (/\bgzip\b/.test(String(req.headers['accept-encoding'] ?? '')))
          res.setHeader('content-encoding', 'gzip').send(body.gz);
        else res.send(body.json);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/comparisons/export',
      summary: 'A comparison as CSV (one frame) or NetCDF-CF, with provenance naming both cruises and lines',
      rule: { kind: 'member', roles: [...readers], cruise: queryLineA },
      query: ExportQuery,
      handler: async (req, res) => {
        const parsed = ComparisonQuery.safeParse(req.query);
        if (!parsed.success) {
          res.status(400).json({
            error: {
              code: 'validation',
              message: 'The query string is not valid.',
              details: parsed.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })),
            },
          });
          return;
        }
        const e = ExportQuery.parse(req.query);
        const c = await buildComparison(req.user!.id, parsed.data);
        const base = `comparison-${c.choices.property.replace(/[^A-Za-z0-9_]/g, '_')}`;
        if (e.format === 'nc') {
          res.setHeader('content-type', 'application/x-netcdf');
          res.setHeader('content-disposition', `attachment; filename="${base}.nc"`);
          res.send(comparisonNetcdf(c, req.user!.email));
          return;
        }
        res.setHeader('content-type', 'text/csv; charset=utf-8');
        res.setHeader('content-disposition', `attachment; filename="${base}-${e.frame}.csv"`);
        res.send(comparisonCsv(c, e.frame, req.user!.email));
      },
    }),
    defineRoute({
      method: 'get',
      path: '/lines/:id/occupations',
      summary:
        'Lines of your other cruises that are occupations of this line (same name, same section identifier, or linked by hand)',
      rule: { kind: 'member', roles: 'any', cruise: paramLine },
      handler: async (req) => occupationsOf(req.user!.id, String(req.params.id)),
    }),
    defineRoute({
      method: 'post',
      path: '/lines/:id/occupations',
      changesData: true,
      summary: 'Link a line of another cruise by hand as an occupation of this line',
      rule: { kind: 'member', roles: [...editors], cruise: paramLine },
      body: LinkBody,
      handler: async (req, res, ctx) => {
        await linkLines(req.user!.id, String(req.params.id), ctx.body.line);
        res.status(201).json(await occupationsOf(req.user!.id, String(req.params.id)));
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/lines/:id/occupations/:otherId',
      changesData: true,
      summary: 'Remove a link made by hand',
      rule: { kind: 'member', roles: [...editors], cruise: paramLine },
      handler: async (req, res) => {
        await unlinkLines(req.user!.id, String(req.params.id), String(req.params.otherId));
        res.status(204).end();
      },
    }),
  ];
}
