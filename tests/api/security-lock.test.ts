// The lock of a cruise, held by the server from the route table: every state-changing member route
// declares whether it changes the cruise's data (`changesData`), and on a locked cruise each one
// that does answers 409 `locked` for a role that may otherwise call it. A new route that forgets to
// declare it fails the first test.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { Cast, Cruise, Line, Station, Upload } from '../../server/models/index';
import { ROLES, type Role } from '../../server/models/index';
import type { RouteSpec } from '../../server/lib/routeTable';

let t: TestApp;
const ids: Record<string, string> = {};
const agents: Partial<Record<Role, Awaited<ReturnType<typeof agentFor>>>> = {};
const ZERO = '00000000-0000-4000-8000-000000000000';

beforeAll(async () => {
  t = await makeTestApp();
  const chief = await createUser('lock-chief@example.test');
  const c = await Cruise.create({
    name: 'Lock',
    ship: 'RV Lock',
    startDate: '2026-05-01',
    endDate: '2026-05-10',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  ids.cruise = c.id;
  for (const role of ROLES) {
    const u = role === 'chief_scientist' ? chief : await createUser(`lock-${role}@example.test`);
    await addMember(u.id, c.id, role);
    agents[role] = await agentFor(t.app, u.email);
  }
  const up = await Upload.create({
    cruiseId: c.id,
    filename: 'x.csv',
    storageKey: 'k',
    sha256: 'e'.repeat(64),
    size: 1,
    createdBy: chief.id,
    status: 'failed',
  });
  ids.upload = up.id;
  const cast = await Cast.create({
    cruiseId: c.id,
    uploadId: up.id,
    station: 'L1',
    cast: '1',
    latitude: 0,
    longitude: 0,
    time: null,
    bottomDepth: null,
    levels: 0,
    inversionCount: 0,
    inversions: [],
    sourceFile: 'x.csv',
    sourceSha256: 'e'.repeat(64),
  });
  ids.cast = cast.id;
  const line = await Line.create({
    cruiseId: c.id,
    name: 'Lock line',
    stations: ['L1'],
    polyline: null,
    corridorKm: null,
    createdBy: chief.id,
  });
  ids.line = line.id;
}, 120_000);
afterAll(async () => {
  await t?.close();
});

const stateChangingMemberRoutes = () =>
  (t.app.routes as RouteSpec[]).filter((r) => r.method !== 'get' && r.rule.kind === 'member');
const urlFor = (r: RouteSpec) => {
  const entity = r.path.startsWith('/uploads/')
    ? ids.upload
    : r.path.startsWith('/casts/')
      ? ids.cast
      : r.path.startsWith('/deliveries/')
        ? ZERO
        : r.path.startsWith('/lines/')
          ? ids.line
          : ids.cruise;
  return '/api' + r.path.replace(':id', entity).replace(/:(\w+Id)\b/g, ZERO);
};
/** A plausible body: the lock must answer before the body is even looked at, so any body will do —
 * except for a route whose `changesData` depends on the body (the cruise PATCH: any field but `locked`). */
const bodyFor = (r: RouteSpec) =>
  r.method === 'patch' && r.path === '/cruises/:id' ? { name: 'Renamed while locked' } : {};
function allowedRole(r: RouteSpec): Role {
  if (r.rule.kind !== 'member') throw new Error('not a member route');
  const roles = r.rule.roles;
  return roles === 'any' ? 'chief_scientist' : roles.includes('chief_scientist') ? 'chief_scientist' : roles[0];
}

describe('the lock, from the route table', () => {
  it('every state-changing member route declares whether it changes data', () => {
    const routes = stateChangingMemberRoutes();
    expect(routes.length).toBeGreaterThan(10);
    const undeclared = routes
      .filter((r) => r.changesData === undefined)
      .map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(undeclared).toEqual([]);
    // the routes the outside test found open on a locked cruise are among those that change data
    const changing = new Set(routes.filter((r) => r.changesData).map((r) => `${r.method} ${r.path}`));
    for (const k of [
      'post /casts/:id/flags',
      'post /cruises/:id/stations',
      'post /uploads/:id/reprocess',
      'put /cruises/:id/column-mapping',
      'patch /cruises/:id',
      'post /uploads/:id/retry',
      'post /cruises/:id/uploads',
    ])
      expect(changing.has(k), k).toBe(true);
  });
  it('on a locked cruise every data change answers 409 locked; unlocking still works', async () => {
    const chief = agents.chief_scientist!;
    expect(
      (await chief.agent.patch(`/api/cruises/${ids.cruise}`).set('x-csrf-token', chief.csrf).send({ locked: true }))
        .body.locked,
    ).toBe(true);
    const stationsBefore = await Station.count({ where: { cruiseId: ids.cruise } });
    const failures: string[] = [];
    const routes = stateChangingMemberRoutes().filter((r) => r.changesData);
    for (const r of routes) {
      const a = agents[allowedRole(r)]!;
      const req = a.agent[r.method](urlFor(r)).set('x-csrf-token', a.csrf);
      const res = await (r.method === 'delete' ? req : req.send(bodyFor(r)));
      if (res.status !== 409 || res.body?.error?.code !== 'locked')
        failures.push(`${r.method.toUpperCase()} ${r.path} → ${res.status} ${res.body?.error?.code}`);
    }
    expect(failures).toEqual([]);
    expect(await Station.count({ where: { cruiseId: ids.cruise } })).toBe(stationsBefore);
    expect((await Cruise.findByPk(ids.cruise))!.name).toBe('Lock');
    // the lock says what it freezes
    const flag = await agents
      .technician!.agent.post(`/api/casts/${ids.cast}/flags`)
      .set('x-csrf-token', agents.technician!.csrf)
      .send({ variable: 'temperature', pFrom: 0, pTo: 10, flag: 4 });
    expect(flag.body.error.message).toMatch(/locked.*flags.*stations/);
    // unlocking is not a data change; unlocked, a data change goes through again
    const unlock = await chief.agent
      .patch(`/api/cruises/${ids.cruise}`)
      .set('x-csrf-token', chief.csrf)
      .send({ locked: false });
    expect(unlock.status).toBe(200);
    expect(unlock.body.locked).toBe(false);
    expect(
      (
        await chief.agent
          .post(`/api/cruises/${ids.cruise}/stations`)
          .set('x-csrf-token', chief.csrf)
          .send({ name: 'After unlock', latitude: -30, longitude: -20 })
      ).status,
    ).toBe(201);
  }, 60_000);
});
