// Every API route is declared here through `defineRoute`, with the rule that guards it. The
// guard runs before the handler, so a route cannot exist without a rule; the same table feeds the
// OpenAPI document and the role × route security test.
import type { Request, Response, NextFunction, Router, RequestHandler } from 'express';
import type { z } from 'zod';
import { QueryTypes } from 'sequelize';
import { Membership, type Role } from '../models/index';
import { HttpError, unauthorized, forbidden, notFound, badRequest } from './errors';
import { idProblem, inputProblem, isUuid } from './input';

// Memberships are read at most twice a second per process and user: a change made through this
// process drops them at once (invalidateMemberships); one made by another web process is seen
// within half a second. (A plain query: this runs on every cruise request.)
const MEMBERSHIP_TTL_MS = 500;
const memberships = new Map<string, { at: number; role: Role | null }>();
export function invalidateMemberships(cruiseId: string) {
  for (const key of memberships.keys()) if (key.endsWith(`:${cruiseId}`)) memberships.delete(key);
}
/** The user's role in the cruise, or null (held for half a second, as above). */
export async function membershipOf(userId: string, cruiseId: string): Promise<{ role: Role } | null> {
  const key = `${userId}:${cruiseId}`;
  const hit = memberships.get(key);
  if (hit && Date.now() - hit.at < MEMBERSHIP_TTL_MS) return hit.role ? { role: hit.role } : null;
  const [m] = (await Membership.sequelize!.query('SELECT role FROM memberships WHERE user_id = :u AND cruise_id = :c', {
    replacements: { u: userId, c: cruiseId },
    type: QueryTypes.SELECT,
  })) as { role: Role }[];
  if (memberships.size > 10_000) memberships.clear();
  memberships.set(key, { at: Date.now(), role: m?.role ?? null });
  return m ?? null;
}

export type Rule =
  | { kind: 'public' }
  | { kind: 'signed_in' }
  | { kind: 'admin' }
  /** a member of the cruise that the route's resource belongs to, with one of the roles (or any role) */
  | { kind: 'member'; roles: Role[] | 'any'; cruise: (req: Request) => Promise<string | null> };

/**
 * One route: its method and path, the rule that guards it, the zod schemas of its body and query (the
 * handler receives them parsed and typed) and, where declared, of its answer (OpenAPI carries it and the
 * API tests check answers against it).
 */
export type RouteSpec<B extends z.ZodType = z.ZodType, Q extends z.ZodType = z.ZodType> = {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string; // express path under /api, e.g. /cruises/:id
  summary: string;
  rule: Rule;
  body?: B;
  query?: Q;
  /** the schema of a 2xx JSON answer */
  response?: z.ZodType;
  responses?: Record<number, string>;
  /** extra middleware run after the rule and before the body is parsed (e.g. multer); an error it
   * reports that is not an HttpError or a limit is the client's malformed body (400 bad_body) */
  before?: RequestHandler[];
  /** The route changes the cruise's data: on a locked cruise the table answers 409 `locked` before
   * the handler runs. A function decides per request (e.g. a PATCH that only unlocks). Every
   * state-changing member route declares it, true or false (tests/api/security-lock.test.ts). */
  changesData?: boolean | ((req: Request) => boolean);
  handler: (req: Request, res: Response, ctx: RouteContext<z.output<B>, z.output<Q>>) => Promise<unknown> | unknown;
};

export type RouteContext<B = unknown, Q = unknown> = { cruiseId: string | null; role: Role | null; body: B; query: Q };

export const byParam =
  (name = 'id') =>
  async (req: Request) => {
    const v = req.params[name];
    return typeof v === 'string' && isUuid(v) ? v : null;
  };

/** 409 when the route changes data and the cruise is locked (read fresh: a lock takes effect at once). */
async function checkLock(spec: RouteSpec, req: Request, cruiseId: string | null): Promise<void> {
  if (!spec.changesData || !cruiseId) return;
  if (typeof spec.changesData === 'function' && !spec.changesData(req)) return;
  const [row] = (await Membership.sequelize!.query('SELECT locked FROM cruises WHERE id = :c', {
    replacements: { c: cruiseId },
    type: QueryTypes.SELECT,
  })) as { locked: boolean }[];
  if (row?.locked) {
    throw new HttpError(
      409,
      'locked',
      'This cruise is locked: its casts, flags, stations, mappings, layer sets and derived variables are frozen. A chief scientist can unlock it.',
    );
  }
}

/** Errors of a `before` middleware (multipart parsing): the body is the client's. */
const clientBodyError = (err: unknown) => {
  if (!err || err instanceof HttpError) return err;
  const e = err as { code?: unknown; message?: string };
  if (typeof e.code === 'string' && (e.code.startsWith('LIMIT_') || /^E[A-Z]+$/.test(e.code))) return err; // limits; disk faults stay 5xx
  return badRequest(`The request body could not be read: ${e.message ?? 'malformed'}.`, [], 'bad_body');
};

async function check(rule: Rule, req: Request): Promise<{ cruiseId: string | null; role: Role | null }> {
  if (rule.kind === 'public') return { cruiseId: null, role: null };
  if (!req.user) throw unauthorized();
  if (rule.kind === 'signed_in') return { cruiseId: null, role: null };
  if (rule.kind === 'admin') {
    if (!req.user.isAdmin) throw forbidden('Only a site admin may do this.');
    return { cruiseId: null, role: null };
  }
  const cruiseId = await rule.cruise(req);
  if (!cruiseId) throw notFound();
  // Not a member: answer as if the cruise did not exist.
  const m = await membershipOf(req.user.id, cruiseId);
  if (!m) throw notFound();
  if (rule.roles !== 'any' && !rule.roles.includes(m.role)) throw forbidden();
  return { cruiseId, role: m.role };
}

/** Declares a route; `ctx.body` and `ctx.query` are typed from the route's own schemas. */
export function defineRoute<B extends z.ZodType = z.ZodType, Q extends z.ZodType = z.ZodType>(
  spec: RouteSpec<B, Q>,
): RouteSpec {
  return spec as unknown as RouteSpec;
}

export function mountRoutes(router: Router, specs: RouteSpec[]) {
  for (const spec of specs) {
    const guard: RequestHandler = (req, _res, next) => {
      // Malformed input answers 400 before anything reads it (server/lib/input.ts).
      const problem = inputProblem(req);
      if (problem) return next(problem);
      check(spec.rule, req)
        .then(async (ctx) => {
          const child = idProblem(req, 'children');
          if (child) throw child;
          await checkLock(spec, req, ctx.cruiseId);
          (req as Request & { routeCtx?: object }).routeCtx = ctx;
          next();
        })
        .catch(next);
    };
    const before = (spec.before ?? []).map(
      (mw): RequestHandler =>
        (req, res, next) =>
          mw(req, res, (err?: unknown) => next(clientBodyError(err))),
    );
    const run = (req: Request, res: Response, next: NextFunction) => {
      const base = (req as Request & { routeCtx?: { cruiseId: string | null; role: Role | null } }).routeCtx ?? {
        cruiseId: null,
        role: null,
      };
      let body: unknown = req.body;
      let query: unknown = req.query;
      if (spec.body) {
        const r = spec.body.safeParse(req.body ?? {});
        if (!r.success)
          return next(
            badRequest(
              'The request body is not valid.',
              r.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })),
            ),
          );
        body = r.data;
      }
      if (spec.query) {
        const r = spec.query.safeParse(req.query ?? {});
        if (!r.success)
          return next(
            badRequest(
              'The query string is not valid.',
              r.error.issues.map((i) => ({ field: i.path.join('.'), message: i.message })),
            ),
          );
        query = r.data;
      }
      Promise.resolve(spec.handler(req, res, { ...base, body, query })).then((out) => {
        if (res.headersSent || out === undefined) return;
        res.json(out);
      }, next);
    };
    router[spec.method](spec.path, guard, ...before, run);
  }
}

export { HttpError };
