// Malformed but plausible input never makes a 5xx: a fuzz run generated from the route table over every
// route's path parameters, query parameters and body fields (names from the route's own zod schemas),
// with values an attacker or a careless script sends — NUL characters, impossible dates, 36-character
// ids that are not UUIDs, levels with 120 decimals, bin=1e-9, prototype keys, huge numbers. Every
// answer is below 500 and every error carries the error shape. A fixed seed keeps the run the same
// each time; then the explicit cases the outside test reported, and broken multipart bodies.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fc from 'fast-check';
import { z } from 'zod';
import request from 'supertest';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { castCsv } from './fault-helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise, Station } from '../../server/models/index';
import { ROLES, type Role } from '../../server/models/index';
import type { RouteSpec } from '../../server/lib/routeTable';

type Agent = Awaited<ReturnType<typeof agentFor>>;
let t: TestApp;
const ids: Record<string, string> = {};
const agents: Partial<Record<Role | 'anonymous', Agent>> = {};
const SEED = 1414;
const RUNS_PER_ROUTE = 6;

beforeAll(async () => {
  t = await makeTestApp({ LOGIN_FREE_FAILURES: '1000', LOGIN_MAX_FAILURES: '1000' });
  await startWorkers(t.deps, { concurrency: 1 });
  const chief = await createUser('fz-chief@example.test');
  const c = await Cruise.create({
    name: 'Fuzz',
    ship: 'RV Fuzz',
    startDate: '2026-06-01',
    endDate: '2026-06-10',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  ids.cruise = c.id;
  ids.user = chief.id;
  for (const role of ROLES) {
    const u = role === 'chief_scientist' ? chief : await createUser(`fz-${role}@example.test`);
    if (role !== 'chief_scientist') await addMember(u.id, c.id, role);
    else await addMember(u.id, c.id, role);
    agents[role] = await agentFor(t.app, u.email);
  }
  agents.anonymous = await agentFor(t.app);
  const a = agents.technician!;
  const up = await a.agent
    .post(`/api/cruises/${c.id}/uploads`)
    .set('x-csrf-token', a.csrf)
    .attach('files', Buffer.from(castCsv({ station: 'F1', maxP: 400 })), 'f1.csv');
  ids.upload = up.body.uploads[0].id;
  const done = await waitFor(async () => {
    const r = await a.agent.get(`/api/uploads/${ids.upload}`);
    return r.body.status === 'ready' ? r.body : null;
  }, 60_000);
  ids.cast = done.castIds[0];
}, 120_000);
afterAll(async () => {
  await t?.close();
});

// ---- hostile values -------------------------------------------------------------------------------
const NOT_UUID_36 = [
  'zzzzzzzz-zzzz-zzzz-zzzz-zzzzzzzzzzzz',
  '------------------------------------',
  '123456789012345678901234567890123456',
  '00000000-0000-4000-8000-00000000000g',
];
const hostileText = fc.oneof(
  fc.constantFrom(
    '',
    ' ',
    'a\u0000b',
    '\u0000',
    '2026-02-31',
    '0000-01-01',
    '9999-99-99',
    '1e-9',
    '-1',
    '0',
    '1e400',
    'NaN',
    'Infinity',
    '-0',
    'constructor',
    '__proto__',
    'toString',
    'prototype',
    '27.' + '1'.repeat(120),
    '1' + '0'.repeat(400),
    '24:1e-12:28',
    '24,23,22',
    ';=cmd|calc',
    '<script>',
    '%00',
    '\\',
    '..',
    '../../etc/passwd',
    'x'.repeat(2_000),
    ...NOT_UUID_36,
  ),
  fc.string({ maxLength: 40 }),
);
const hostileJson: fc.Arbitrary<unknown> = fc.oneof(
  hostileText,
  fc.constant('x'.repeat(25_000)),
  fc.constantFrom(null, true, false, 0, -1, 1e-9, 1e308, -1e308, 2 ** 53 + 1, 0.1, 24, 1000, 12001),
  fc.constantFrom([], {}, [null], ['\u0000'], { a: 1 }, [1, 2, 3], Array(50).fill('x')),
);

function schemaKeys(s: z.ZodType | undefined): string[] {
  if (!s) return [];
  const j = z.toJSONSchema(s, { unrepresentable: 'any', io: 'input' }) as { properties?: Record<string, unknown> };
  return Object.keys(j.properties ?? {});
}
const real = (name: string, r: RouteSpec) => {
  if (name === 'id')
    return r.path.startsWith('/uploads/')
      ? ids.upload
      : r.path.startsWith('/casts/')
        ? ids.cast
        : r.path.startsWith('/deliveries/')
          ? '00000000-0000-4000-8000-000000000000'
          : ids.cruise;
  if (name === 'userId') return ids.user;
  return '00000000-0000-4000-8000-000000000000';
};
function pathArb(r: RouteSpec) {
  const names = [...r.path.matchAll(/:(\w+)/g)].map((m) => m[1]);
  return fc
    .tuple(
      ...names.map((n) =>
        fc.oneof(
          { weight: 3, arbitrary: fc.constant(real(n, r)) },
          { weight: 2, arbitrary: fc.constantFrom(...NOT_UUID_36, 'a\u0000b', 'x') },
        ),
      ),
    )
    .map((vals) => names.reduce((p, n, i) => p.replace(`:${n}`, encodeURIComponent(vals[i])), r.path));
}
const fieldsArb = (keys: string[], value: fc.Arbitrary<unknown>) =>
  fc.record(Object.fromEntries([...keys, 'constructor', '__proto__', 'extra'].map((k) => [k, value])), {
    requiredKeys: [],
  });

function roleFor(r: RouteSpec): Role | 'anonymous' {
  if (r.rule.kind !== 'member') return r.rule.kind === 'public' ? 'anonymous' : 'chief_scientist';
  const roles = r.rule.roles;
  return roles === 'any' || roles.includes('chief_scientist') ? 'chief_scientist' : roles[0];
}
const qs = (q: Record<string, unknown>) =>
  Object.entries(q)
    .map(([k, v]) => `${encodeURIComponent(k)}=${encodeURIComponent(typeof v === 'string' ? v : JSON.stringify(v))}`)
    .join('&');
const shaped = (res: request.Response) =>
  res.status < 400 || (res.status === 404 && !res.body?.error)
    ? true
    : typeof res.body?.error?.code === 'string' &&
      typeof res.body.error.message === 'string' &&
      Array.isArray(res.body.error.details);

describe('fuzz over the route table', () => {
  it('no route answers 5xx to malformed parameters or bodies, and every error has the error shape', async () => {
    // Signing out or changing the password of the fuzzing accounts would only make the rest 401.
    const routes = (t.app.routes as RouteSpec[]).filter((r) => !['/auth/logout', '/auth/password'].includes(r.path));
    expect(routes.length).toBeGreaterThan(30);
    const failures: string[] = [];
    let sent = 0;
    for (const [k, r] of routes.entries()) {
      const cases = fc.sample(
        fc.record({
          path: pathArb(r),
          query: fieldsArb(schemaKeys(r.query), hostileText),
          body: fieldsArb(schemaKeys(r.body), hostileJson),
        }),
        { seed: SEED + k, numRuns: RUNS_PER_ROUTE },
      );
      const who = agents[roleFor(r)]!;
      for (const c of cases) {
        const url = `/api${c.path}${Object.keys(c.query).length ? `?${qs(c.query)}` : ''}`;
        let req = who.agent[r.method](url).set('x-csrf-token', who.csrf);
        if (r.method !== 'get' && r.method !== 'delete')
          req = req.set('content-type', 'application/json').send(JSON.stringify(c.body));
        const res = await req;
        sent++;
        if (res.status >= 500 || !shaped(res))
          failures.push(
            `${r.method.toUpperCase()} ${url.slice(0, 160)} ${JSON.stringify(c.body).slice(0, 120)} → ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`,
          );
      }
    }
    expect(sent).toBeGreaterThan(150);
    expect(failures).toEqual([]);
  }, 120_000);

  it('the cases of the outside test answer 400 with the error shape', async () => {
    const chief = agents.chief_scientist!;
    const base = `/api/cruises/${ids.cruise}`;
    const post = (url: string, body: object) => chief.agent.post(url).set('x-csrf-token', chief.csrf).send(body);
    const cases: [string, Promise<request.Response>][] = [
      ['NUL in a station name', post(`${base}/stations`, { name: 'ST\u000001', latitude: -30, longitude: -20 })],
      [
        'NUL in a cruise name',
        post('/api/cruises', { name: 'A\u0000B', ship: 'RV X', startDate: '2026-01-01', endDate: '2026-01-02' }),
      ],
      [
        '2026-02-31',
        post('/api/cruises', { name: 'Dates', ship: 'RV X', startDate: '2026-02-31', endDate: '2026-03-02' }),
      ],
      [
        '0000-01-01',
        post('/api/cruises', { name: 'Dates', ship: 'RV X', startDate: '0000-01-01', endDate: '2026-03-02' }),
      ],
      ['36-character id that is not a UUID', chief.agent.get('/api/uploads/zzzzzzzz-zzzz-zzzz-zzzz-zzzzzzzzzzzz')],
      ['36 dashes as a cast id', chief.agent.get('/api/casts/------------------------------------')],
      ['levels with 120 decimals', chief.agent.get(`${base}/section?coord=density&levels=${'27.' + '1'.repeat(120)}`)],
      ['bin=1e-9', chief.agent.get(`${base}/exports/pressure.csv?bin=1e-9`)],
      [
        'layer set with 120 decimals',
        post(`${base}/layer-sets`, { name: 'x', referencePressure: 0, levels: `26.${'1'.repeat(120)},27` }),
      ],
    ];
    for (const [label, p] of cases) {
      const res = await p;
      expect(res.status, label).toBe(400);
      expect(typeof res.body.error.code, label).toBe('string');
      expect(Array.isArray(res.body.error.details), label).toBe(true);
    }
    expect(await Station.count({ where: { cruiseId: ids.cruise, name: 'ST\u000001' } }).catch(() => 0)).toBe(0);
  });

  it('multipart without a boundary, or cut short, answers 400', async () => {
    const a = agents.technician!;
    const url = `/api/cruises/${ids.cruise}/uploads`;
    const noBoundary = await a.agent
      .post(url)
      .set('x-csrf-token', a.csrf)
      .set('content-type', 'multipart/form-data')
      .send('--x\r\nContent-Disposition: form-data; name="files"; filename="a.csv"\r\n\r\n1,2\r\n--x--\r\n');
    expect(noBoundary.status).toBe(400);
    expect(noBoundary.body.error.code).toBe('bad_body');
    const truncated = await a.agent
      .post(url)
      .set('x-csrf-token', a.csrf)
      .set('content-type', 'multipart/form-data; boundary=XYZ')
      .send(
        '--XYZ\r\nContent-Disposition: form-data; name="files"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\npressure,temperature\r\n1,2\r\n',
      );
    expect(truncated.status).toBe(400);
    expect(truncated.body.error.code).toBe('bad_body');
  });
});
