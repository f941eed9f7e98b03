// The QC desk of a cast: proposals of the automatic tests and their decisions, the flag log with undo, and the
// neighbouring casts to compare with. Routes parse, call one service, answer.
import { z } from 'zod';
import { defineRoute, byParam, type RouteSpec } from '../lib/routeTable';
import { castCruise } from './casts';
import { QC_TESTS, QC_TEST_INFO } from '../../shared/qc/index';
import { decideProposals, pendingOfCruise, qcOfCast, reopenProposals } from '../services/qcProposals';
import { flagLog, undoFlagChange } from '../services/qcFlags';
import { neighboursOf } from '../services/qcNeighbours';
import type { AppDeps } from '../lib/deps';

const FLAGGERS = ['technician', 'chief_scientist'] as const;

const Decide = z
  .object({
    ids: z.array(z.uuid()).max(2000).optional(),
    test: z.enum(QC_TESTS).optional(),
    decision: z.enum(['accept', 'reject']),
    reason: z.string().trim().max(500).optional(),
  })
  .refine((b) => (b.ids?.length ?? 0) > 0 || b.test, {
    message: 'Say which proposals: their ids, or a test.',
    path: ['ids'],
  });

const Reopen = z
  .object({
    ids: z.array(z.uuid()).max(2000).optional(),
    test: z.enum(QC_TESTS).optional(),
    reason: z.string().trim().max(500).optional(),
  })
  .refine((b) => (b.ids?.length ?? 0) > 0 || b.test, {
    message: 'Say which proposals: their ids, or a test.',
    path: ['ids'],
  });

const NeighbourQuery = z.object({
  line: z.uuid().optional(),
  /** pairing distance of the earlier occupation's partner, km */
  pairKm: z.coerce.number().positive().max(500).optional(),
});

const Undo = z.object({ changeId: z.string().regex(/^\d{1,18}$/, 'a flag-log entry number') });

export function qcRoutes(deps: AppDeps): RouteSpec[] {
  return [
    defineRoute({
      method: 'get',
      path: '/casts/:id/qc',
      summary: 'Proposals of the automatic QC tests for a cast, and the inversions its intake found',
      rule: { kind: 'member', roles: 'any', cruise: castCruise },
      handler: async (req) => ({
        tests: QC_TESTS.map((t) => ({ id: t, ...QC_TEST_INFO[t] })),
        ...(await qcOfCast(deps, String(req.params.id))),
      }),
    }),
    defineRoute({
      method: 'post',
      changesData: true,
      path: '/casts/:id/qc/decisions',
      summary: 'Accept or reject pending QC proposals of a cast, by id or by test (audited)',
      rule: { kind: 'member', roles: [...FLAGGERS], cruise: castCruise },
      body: Decide,
      handler: async (req, _res, ctx) => decideProposals(deps, String(req.params.id), ctx.body, req.user!.id),
    }),
    defineRoute({
      method: 'post',
      changesData: true,
      path: '/casts/:id/qc/reopen',
      summary:
        'Reopen rejected QC proposals of a cast (back to pending), by id or by test (audited); accepted ones are undone in the flag log',
      rule: { kind: 'member', roles: [...FLAGGERS], cruise: castCruise },
      body: Reopen,
      handler: async (req, _res, ctx) => reopenProposals(deps, String(req.params.id), ctx.body, req.user!.id),
    }),
    defineRoute({
      method: 'get',
      path: '/casts/:id/flag-log',
      summary: 'Every flag change of a cast, newest first, with what each replaced',
      rule: { kind: 'member', roles: 'any', cruise: castCruise },
      handler: async (req) => flagLog(String(req.params.id)),
    }),
    defineRoute({
      method: 'post',
      changesData: true,
      path: '/casts/:id/flag-log/undo',
      summary: 'Undo one flag change of a cast (audited)',
      rule: { kind: 'member', roles: [...FLAGGERS], cruise: castCruise },
      body: Undo,
      handler: async (req, _res, ctx) => undoFlagChange(deps, String(req.params.id), ctx.body.changeId, req.user!.id),
    }),
    defineRoute({
      method: 'get',
      path: '/casts/:id/neighbours',
      summary:
        'The previous and next station’s casts along the line, and the same station in earlier occupations of the line (cruises the user belongs to), for overlays',
      rule: { kind: 'member', roles: 'any', cruise: castCruise },
      query: NeighbourQuery,
      handler: async (req, _res, ctx) => {
        const q = ctx.query;
        return neighboursOf(req.user!.id, String(req.params.id), { line: q.line ?? null, pairKm: q.pairKm });
      },
    }),
    defineRoute({
      method: 'get',
      path: '/cruises/:id/qc/pending',
      summary: 'Pending QC proposals per cast of a cruise',
      rule: { kind: 'member', roles: 'any', cruise: byParam() },
      handler: async (_req, _res, ctx) => pendingOfCruise(ctx.cruiseId!),
    }),
  ];
}
