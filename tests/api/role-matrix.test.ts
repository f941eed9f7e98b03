// The role × route matrix, built from the route table itself: every route the app mounts is
// exercised as anonymous, as a signed-in non-member, and as each cruise role, so a new route
// without a rule — or with the wrong one — fails here.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import request from 'supertest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { Cast, Cruise, Delivery, Upload } from '../../server/models/index';
import { ROLES, type Role } from '../../server/models/index';
import type { RouteSpec } from '../../server/lib/routeTable';
import { ensureDefaultLine } from '../../server/services/lines';

let t: TestApp;
const ids: Record<string, string> = {};
const agents: Record<string, { agent: ReturnType<typeof request.agent>; csrf: string }> = {};

beforeAll(async () => {
  t = await makeTestApp();
  const chief = await createUser('m-chief@example.test');
  const cruise = await Cruise.create({
    name: 'Matrix',
    ship: 'RV Matrix',
    startDate: '2026-01-01',
    endDate: '2026-01-10',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  ids.cruise = cruise.id;
  for (const role of ROLES) {
    const u = role === 'chief_scientist' ? chief : await createUser(`m-${role}@example.test`);
    await addMember(u.id, cruise.id, role);
    agents[role] = await agentFor(t.app, u.email);
  }
  await createUser('m-outsider@example.test');
  agents.outsider = await agentFor(t.app, 'm-outsider@example.test');
  await createUser('m-admin@example.test', { isAdmin: true });
  agents.admin = await agentFor(t.app, 'm-admin@example.test');
  agents.anonymous = await agentFor(t.app);
  const up = await Upload.create({
    cruiseId: cruise.id,
    filename: 'x.csv',
    storageKey: 'k',
    sha256: 'f'.repeat(64),
    size: 1,
    createdBy: chief.id,
    status: 'ready',
  });
  ids.upload = up.id;
  const cast = await Cast.create({
    cruiseId: cruise.id,
    uploadId: up.id,
    station: 'M1',
    cast: '1',
    latitude: 0,
    longitude: 0,
    time: null,
    bottomDepth: null,
    levels: 0,
    inversionCount: 0,
    inversions: [],
    sourceFile: 'x.csv',
    sourceSha256: 'f'.repeat(64),
  });
  ids.cast = cast.id;
  const d = await Delivery.create({
    cruiseId: cruise.id,
    kind: 'pressure',
    params: {},
    formats: ['csv'],
    error: null,
    releasedAt: null,
    releasedBy: null,
    createdBy: chief.id,
    status: 'queued',
  });
  ids.delivery = d.id;
  // the default line: it answers every role's DELETE with 409, so each role is tried on the same line
  ids.line = (await ensureDefaultLine(cruise.id)).id;
}, 120_000);
afterAll(async () => {
  await t?.close();
});

function urlFor(r: RouteSpec) {
  const entity = r.path.startsWith('/uploads/')
    ? ids.upload
    : r.path.startsWith('/casts/')
      ? ids.cast
      : r.path.startsWith('/deliveries/')
        ? ids.delivery
        : r.path.startsWith('/lines/')
          ? ids.line
          : ids.cruise;
  // the comparison's export finds its cruise by the first line in the query
  if (r.path === '/comparisons/export') return `/api/comparisons/export?lineA=${ids.line}&lineB=${ids.line}`;
  return (
    '/api' +
    r.path
      .replace(':id', entity)
      .replace(/:(userId|setId|varId|viewId|deliveryId|otherId|stationId)/, '00000000-0000-4000-8000-000000000000')
      .replace(':token', 'no-such-token')
  );
}
async function call(who: string, r: RouteSpec) {
  const a = agents[who];
  if (r.method === 'delete' && r.path === '/deliveries/:id') {
    // each caller gets its own delivery, since an allowed call removes it
    const d = await Delivery.create({
      cruiseId: ids.cruise,
      kind: 'pressure',
      params: {},
      formats: ['csv'],
      error: null,
      releasedAt: null,
      releasedBy: null,
      createdBy: null,
    });
    ids.delivery = d.id;
  }
  const req = a.agent[r.method](urlFor(r)).set('x-csrf-token', a.csrf);
  // the comparison finds its cruises by the lines in its body
  if (r.path === '/comparisons') return req.send({ lineA: ids.line, lineB: ids.line });
  return r.method === 'get' || r.method === 'delete' ? req : req.send({});
}
/** The guard's own answers carry these codes; a handler's 404 for a missing sub-resource says more. */
const guarded = (res: request.Response) =>
  (res.status === 401 && res.body?.error?.code === 'unauthenticated') ||
  (res.status === 403 && res.body?.error?.code === 'forbidden') ||
  (res.status === 404 && res.body?.error?.message === 'Not found');

describe('role × route matrix', () => {
  it('covers a non-trivial route table', () => {
    expect(t.app.routes.length).toBeGreaterThan(20);
  });
  it('every route answers by its rule for anonymous, outsider, admin and each role', async () => {
    const failures: string[] = [];
    for (const r of t.app.routes) {
      const label = `${r.method.toUpperCase()} ${r.path}`;
      const anon = await call('anonymous', r);
      if (r.rule.kind === 'public') {
        if (anon.status === 401 || anon.status === 403)
          failures.push(`${label}: public route refused anonymous (${anon.status})`);
        continue;
      }
      if (anon.status !== 401) failures.push(`${label}: anonymous got ${anon.status}, expected 401`);
      if (r.rule.kind === 'signed_in') {
        if (r.path === '/auth/logout') {
          const tmp = await agentFor(t.app, 'm-outsider@example.test');
          const res = await tmp.agent.post('/api/auth/logout').set('x-csrf-token', tmp.csrf);
          if (res.status !== 204) failures.push(`${label}: signed-in user got ${res.status}`);
          continue;
        }
        const out = await call('outsider', r);
        if (guarded(out)) failures.push(`${label}: signed-in user refused (${out.status})`);
        continue;
      }
      if (r.rule.kind === 'admin') {
        for (const role of ROLES) {
          const res = await call(role, r);
          if (res.status !== 403) failures.push(`${label}: ${role} got ${res.status}, expected 403`);
        }
        const adm = await call('admin', r);
        if (guarded(adm)) failures.push(`${label}: admin refused (${adm.status})`);
        continue;
      }
      const out = await call('outsider', r);
      if (out.status !== 404) failures.push(`${label}: non-member got ${out.status}, expected 404`);
      const adm = await call('admin', r);
      if (adm.status !== 404) failures.push(`${label}: site admin who is not a member got ${adm.status}, expected 404`);
      // Roles without the right first: an allowed DELETE would remove the entity the others are tried on.
      const isAllowed = (role: Role) =>
        r.rule.kind === 'member' && (r.rule.roles === 'any' || (r.rule.roles as Role[]).includes(role));
      for (const role of [...ROLES].sort((a, b) => Number(isAllowed(a)) - Number(isAllowed(b)))) {
        const allowed = isAllowed(role);
        const res = await call(role, r);
        if (allowed && guarded(res))
          failures.push(`${label}: ${role} refused (${res.status} ${res.body?.error?.code})`);
        if (!allowed && res.status !== 403) failures.push(`${label}: ${role} got ${res.status}, expected 403`);
      }
    }
    expect(failures).toEqual([]);
  }, 120_000);
  it('a cruise id that does not exist answers 404 like one you are not a member of', async () => {
    const res = await agents.chief_scientist.agent.get('/api/cruises/00000000-0000-4000-8000-000000000000');
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe('Not found');
  });
});
