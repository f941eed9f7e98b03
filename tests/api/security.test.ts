// Security properties of the real app (the role × route matrix is in role-matrix.test.ts):
// cruise isolation, CSRF on every state-changing route of the table, session fixation, cookie
// flags, the sign-in rate limit, the password policy, hostile upload and zip entry names, formula
// injection in CSV exports, script injection through cast metadata, and the helmet headers.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import request from 'supertest';
import { existsSync, mkdtempSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import { makeTestApp, createUser, addMember, agentFor, caughtMail, waitFor, PASSWORD, type TestApp } from './helpers';
import { Cast, Cruise, LayerSet, Membership, Upload } from '../../server/models/index';
import { ROLES, type Role } from '../../server/models/index';
import { createApp } from '../../server/app';
import { startWorkers } from '../../server/jobs/worker';
import type { RouteSpec } from '../../server/lib/routeTable';
import { castCsv, multipart, zipBuffer } from './fault-helpers';

type Agent = Awaited<ReturnType<typeof agentFor>>;
let t: TestApp;
const A: Record<string, string> = {};
const B: Record<string, string> = {};
const inA: Partial<Record<Role, Agent>> = {};
let chiefB: Agent;

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  for (const [ids, label] of [
    [A, 'a'],
    [B, 'b'],
  ] as const) {
    const chief = await createUser(`sec-${label}-chief_scientist@example.test`);
    const c = await Cruise.create({
      name: `Cruise ${label.toUpperCase()}`,
      ship: `RV ${label}`,
      startDate: '2026-02-01',
      endDate: '2026-02-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: chief.id,
    });
    ids.cruise = c.id;
    ids.chiefUser = chief.id;
    await addMember(chief.id, c.id, 'chief_scientist');
    for (const role of ROLES) {
      if (role === 'chief_scientist') continue;
      const u = await createUser(`sec-${label}-${role}@example.test`);
      await addMember(u.id, c.id, role);
    }
  }
  for (const role of ROLES) inA[role] = await agentFor(t.app, `sec-a-${role}@example.test`);
  chiefB = await agentFor(t.app, 'sec-b-chief_scientist@example.test');
  // cruise B gets a real upload, cast and layer set
  const techB = await agentFor(t.app, 'sec-b-technician@example.test');
  const up = await techB.agent
    .post(`/api/cruises/${B.cruise}/uploads`)
    .set('x-csrf-token', techB.csrf)
    .attach('files', Buffer.from(castCsv({ station: 'B1', maxP: 600, seed: 3 })), 'b1.csv');
  expect(up.status).toBe(202);
  B.upload = up.body.uploads[0].id;
  const done = await settle(techB, B.upload);
  expect(done.status, JSON.stringify(done.errors)).toBe('ready');
  B.cast = done.castIds[0];
  const ls = await chiefB.agent
    .post(`/api/cruises/${B.cruise}/layer-sets`)
    .set('x-csrf-token', chiefB.csrf)
    .send({ name: 'B layers', referencePressure: 0, levels: '26.0:0.1:27.0' });
  expect(ls.status).toBe(201);
  B.set = ls.body.id;
}, 120_000);
afterAll(async () => {
  await t?.close();
});

function settle(who: Agent, id: string) {
  return waitFor(async () => {
    const r = await who.agent.get(`/api/uploads/${id}`);
    return r.body.status === 'ready' || r.body.status === 'failed' ? r.body : null;
  }, 60_000);
}
const memberRoutes = () => (t.app.routes as RouteSpec[]).filter((r) => r.rule.kind === 'member');
function urlOf(r: RouteSpec, ids: Record<string, string>, childIds: Record<string, string> = ids) {
  const entity = r.path.startsWith('/uploads/') ? ids.upload : r.path.startsWith('/casts/') ? ids.cast : ids.cruise;
  return (
    '/api' +
    r.path
      .replace(':id', entity)
      .replace(':userId', childIds.chiefUser)
      .replace(':setId', childIds.set ?? '00000000-0000-4000-8000-000000000000')
  );
}
function send(a: Agent, r: RouteSpec, url: string, opts: { csrf?: string | null; body?: object } = {}) {
  let req: request.Test = (a.agent[r.method] as (u: string) => request.Test)(url);
  const token = opts.csrf === undefined ? a.csrf : opts.csrf;
  if (token !== null) req = req.set('x-csrf-token', token);
  return r.method === 'get' || r.method === 'delete' ? req : req.send(opts.body ?? {});
}
const sidOf = (res: request.Response) =>
  ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('sigmaline.sid='));

describe('cruise isolation', () => {
  it('every member of cruise A gets 404 for every route of cruise B', async () => {
    const failures: string[] = [];
    for (const role of ROLES) {
      for (const r of memberRoutes()) {
        const res = await send(inA[role]!, r, urlOf(r, B));
        if (res.status !== 404 || res.body?.error?.message !== 'Not found')
          failures.push(
            `${role} ${r.method.toUpperCase()} ${urlOf(r, B)} → ${res.status} ${JSON.stringify(res.body).slice(0, 120)}`,
          );
      }
    }
    expect(memberRoutes().length).toBeGreaterThan(15);
    expect(failures).toEqual([]);
  }, 120_000);
  it("B's children cannot be reached through A's cruise id either", async () => {
    const chief = inA.chief_scientist!;
    const set = await chief.agent
      .patch(`/api/cruises/${A.cruise}/layer-sets/${B.set}`)
      .set('x-csrf-token', chief.csrf)
      .send({ name: 'stolen' });
    expect(set.status).toBe(404);
    const role = await chief.agent
      .patch(`/api/cruises/${A.cruise}/members/${B.chiefUser}`)
      .set('x-csrf-token', chief.csrf)
      .send({ role: 'pi' });
    expect(role.status).toBe(404);
    const del = await chief.agent
      .delete(`/api/cruises/${A.cruise}/members/${B.chiefUser}`)
      .set('x-csrf-token', chief.csrf);
    expect(del.status).toBe(404);
    expect((await LayerSet.findByPk(B.set))!.name).toBe('B layers');
    expect((await Membership.findOne({ where: { cruiseId: B.cruise, userId: B.chiefUser } }))!.role).toBe(
      'chief_scientist',
    );
    const list = await chief.agent.get('/api/cruises');
    expect(list.body.map((c: { id: string }) => c.id)).toEqual([A.cruise]);
    // and B, unchanged, still sees its own things
    expect((await chiefB.agent.get(`/api/casts/${B.cast}`)).status).toBe(200);
    expect((await chiefB.agent.get(`/api/cruises/${B.cruise}`)).body.name).toBe('Cruise B');
  });
});

describe('CSRF', () => {
  const nonGet = () => (t.app.routes as RouteSpec[]).filter((r) => r.method !== 'get');
  it('every non-GET route of the table answers 403 without the token and with a wrong one', async () => {
    const chief = inA.chief_scientist!;
    const other = await agentFor(t.app); // a valid token, but of another session
    const anon = await agentFor(t.app);
    const failures: string[] = [];
    expect(nonGet().length).toBeGreaterThan(10);
    for (const r of nonGet()) {
      const url = urlOf(r, A);
      for (const [label, a, token] of [
        ['no token', chief, null],
        ['wrong token', chief, other.csrf],
        ['garbage token', chief, 'x'.repeat(43)],
        ['anonymous, no token', anon, null],
      ] as const) {
        const res = await send(a, r, url, { csrf: token });
        if (res.status !== 403 || res.body?.error?.code !== 'csrf')
          failures.push(`${r.method.toUpperCase()} ${r.path} (${label}) → ${res.status} ${res.body?.error?.code}`);
      }
    }
    expect(failures).toEqual([]);
    // nothing changed: the chief is still signed in and the cruise untouched
    expect((await chief.agent.get('/api/auth/me')).status).toBe(200);
    expect((await chief.agent.get(`/api/cruises/${A.cruise}`)).body.name).toBe('Cruise A');
  }, 60_000);
  it('the token counts only in the header, and the right one is accepted', async () => {
    const chief = inA.chief_scientist!;
    const inBody = await chief.agent
      .post(`/api/cruises/${A.cruise}/stations`)
      .send({ name: 'CSRF-1', latitude: -30, longitude: -20, _csrf: chief.csrf });
    expect(inBody.status).toBe(403);
    const inQuery = await chief.agent
      .post(`/api/cruises/${A.cruise}/stations?_csrf=${chief.csrf}`)
      .send({ name: 'CSRF-1', latitude: -30, longitude: -20 });
    expect(inQuery.status).toBe(403);
    const ok = await chief.agent
      .post(`/api/cruises/${A.cruise}/stations`)
      .set('x-csrf-token', chief.csrf)
      .send({ name: 'CSRF-1', latitude: -30, longitude: -20 });
    expect(ok.status).toBe(201);
  });
});

describe('sessions and cookies', () => {
  it('the session id changes at sign-in; the pre-login cookie is not signed in', async () => {
    await createUser('fix@example.test');
    const agent = request.agent(t.app);
    const pre = await agent.get('/api/auth/csrf');
    const before = sidOf(pre)!.split(';')[0];
    expect(before).toMatch(/^sigmaline\.sid=s%3A/);
    const login = await agent
      .post('/api/auth/login')
      .set('x-csrf-token', pre.body.token)
      .send({ email: 'fix@example.test', password: PASSWORD });
    expect(login.status).toBe(200);
    const after = sidOf(login)!.split(';')[0];
    expect(after).not.toBe(before);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', before)).status).toBe(401);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', after)).status).toBe(200);
    // the pre-login CSRF token does not survive either (it belonged to the old session)
    const stale = await request(t.app)
      .post(`/api/cruises`)
      .set('Cookie', after)
      .set('x-csrf-token', pre.body.token)
      .send({ name: 'X', ship: 'Y', startDate: '2026-01-01', endDate: '2026-01-02' });
    expect(stale.status).toBe(403);
    // after sign-out the signed-in cookie is dead too
    const token = (await request(t.app).get('/api/auth/csrf').set('Cookie', after)).body.token;
    expect((await request(t.app).post('/api/auth/logout').set('Cookie', after).set('x-csrf-token', token)).status).toBe(
      204,
    );
    expect((await request(t.app).get('/api/auth/me').set('Cookie', after)).status).toBe(401);
  });
  it('the session cookie is HttpOnly and SameSite=Lax, and not Secure over plain http', async () => {
    const res = await request(t.app).get('/api/auth/csrf');
    const c = sidOf(res)!;
    expect(c).toMatch(/;\s*HttpOnly/i);
    expect(c).toMatch(/;\s*SameSite=Lax/i);
    expect(c).not.toMatch(/;\s*Secure/i);
  });
  it('with an https PUBLIC_URL the cookie is Secure (and never sent over plain http)', async () => {
    // X-Forwarded-Proto counts only from a configured proxy (here the loopback one)
    const app = createApp(
      { ...t.deps, settings: { ...t.settings, PUBLIC_URL: 'https://sigmaline.example.org', TRUST_PROXY: 'loopback' } },
      { staticDir: '/nonexistent' },
    );
    try {
      const viaProxy = await request(app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
      const c = sidOf(viaProxy)!;
      expect(c).toMatch(/;\s*Secure/i);
      expect(c).toMatch(/;\s*HttpOnly/i);
      expect(c).toMatch(/;\s*SameSite=Lax/i);
      const plain = await request(app).get('/api/auth/csrf');
      expect(sidOf(plain)).toBeUndefined();
    } finally {
      await app.close();
    }
  });
});

describe('sign-in back-off', () => {
  it('after the free failures every attempt waits a growing delay, even with the right password, in every web process; other accounts are not slowed', async () => {
    const free = t.settings.LOGIN_FREE_FAILURES;
    expect(free).toBe(3);
    await createUser('rl@example.test');
    await createUser('rl-other@example.test');
    const a = await agentFor(t.app);
    for (let i = 0; i < free; i++) {
      const r = await a.agent
        .post('/api/auth/login')
        .set('x-csrf-token', a.csrf)
        .send({ email: 'rl@example.test', password: `wrong-${i}-password` });
      expect(r.status).toBe(401);
    }
    const right = await a.agent
      .post('/api/auth/login')
      .set('x-csrf-token', a.csrf)
      .send({ email: 'RL@example.test', password: PASSWORD });
    expect(right.status).toBe(429);
    expect(right.body.error.message).toMatch(/Too many failed sign-in attempts; try again in \d+ s/);
    expect(Number(right.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    // a second app on the same database (another web process) makes the same caller wait as well
    const app2 = createApp(t.deps, { staticDir: '/nonexistent' });
    try {
      const b = request.agent(app2);
      const tok = (await b.get('/api/auth/csrf')).body.token;
      expect(
        (
          await b
            .post('/api/auth/login')
            .set('x-csrf-token', tok)
            .send({ email: 'rl@example.test', password: PASSWORD })
        ).status,
      ).toBe(429);
    } finally {
      await app2.close();
    }
    expect(
      (
        await a.agent
          .post('/api/auth/login')
          .set('x-csrf-token', a.csrf)
          .send({ email: 'rl-other@example.test', password: PASSWORD })
      ).status,
    ).toBe(200);
  });
});

describe('password policy', () => {
  const weak = ['short-1', 'abcdefghijklmnop', '12345678901234', '          ', 'Ab1'];
  it('invitation accept refuses weak passwords and takes a good one', async () => {
    const chief = inA.chief_scientist!;
    const email = `invitee-${Date.now()}@example.test`;
    expect(
      (
        await chief.agent
          .post(`/api/cruises/${A.cruise}/members`)
          .set('x-csrf-token', chief.csrf)
          .send({ email, role: 'analyst' })
      ).status,
    ).toBe(201);
    const mail = await waitFor(
      async () => (await caughtMail()).find((m) => m.to.some((x) => x.includes(email))),
      20_000,
    );
    const token = /\/invite\/([\w-]+)/.exec(mail.text)![1];
    const a = await agentFor(t.app);
    for (const pw of weak) {
      const r = await a.agent
        .post(`/api/invitations/${token}/accept`)
        .set('x-csrf-token', a.csrf)
        .send({ name: 'Invitee', password: pw });
      expect(r.status, pw).toBe(400);
      expect(r.body.error.code, pw).toBe('weak_password');
    }
    const tooLong = await a.agent
      .post(`/api/invitations/${token}/accept`)
      .set('x-csrf-token', a.csrf)
      .send({ name: 'Invitee', password: 'a1'.repeat(101) });
    expect(tooLong.status).toBe(400);
    const ok = await a.agent
      .post(`/api/invitations/${token}/accept`)
      .set('x-csrf-token', a.csrf)
      .send({ name: 'Invitee', password: 'sea-water-2026' });
    expect(ok.status).toBe(200);
    expect((await a.agent.get('/api/auth/me')).body.user.email).toBe(email);
    await agentFor(t.app, email, 'sea-water-2026');
  });
  it('password reset refuses weak passwords, takes a good one, and the link works once', async () => {
    const email = `reset-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@example.test`;
    await createUser(email);
    const a = await agentFor(t.app);
    expect((await a.agent.post('/api/auth/password-reset').set('x-csrf-token', a.csrf).send({ email })).status).toBe(
      202,
    );
    const mail = await waitFor(
      async () => (await caughtMail()).find((m) => m.to.some((x) => x.includes(email))),
      20_000,
    );
    const token = /\/reset\/([\w-]+)/.exec(mail.text)![1];
    for (const pw of weak) {
      const r = await a.agent
        .post('/api/auth/password-reset/confirm')
        .set('x-csrf-token', a.csrf)
        .send({ token, password: pw });
      expect(r.status, pw).toBe(400);
      expect(r.body.error.code, pw).toBe('weak_password');
    }
    await agentFor(t.app, email, PASSWORD); // the old password still works: nothing changed yet
    expect(
      (
        await a.agent
          .post('/api/auth/password-reset/confirm')
          .set('x-csrf-token', a.csrf)
          .send({ token, password: 'deep-water-4000' })
      ).status,
    ).toBe(204);
    await expect(agentFor(t.app, email, PASSWORD)).rejects.toThrow(/401/);
    await agentFor(t.app, email, 'deep-water-4000');
    const again = await a.agent
      .post('/api/auth/password-reset/confirm')
      .set('x-csrf-token', a.csrf)
      .send({ token, password: 'other-water-5000' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid_token');
  });
});

describe('hostile file names', () => {
  it('upload names with ../ (and backslashes) are stored as a bare safe name; the object key is the content hash', async () => {
    const tech = inA.technician!;
    const names = ['../../../etc/evil name.csv', '..\\..\\windows\\evil2.csv', '/abs/path/evil3.csv'];
    for (const [i, filename] of names.entries()) {
      const m = multipart([{ filename, data: castCsv({ station: `PATH${i}`, maxP: 300, seed: 40 + i }) }]);
      const res = await tech.agent
        .post(`/api/cruises/${A.cruise}/uploads`)
        .set('x-csrf-token', tech.csrf)
        .set('content-type', m.contentType)
        .send(m.body);
      expect(res.status, JSON.stringify(res.body)).toBe(202);
      const u = res.body.uploads[0];
      expect(u.filename).not.toMatch(/[\\/]|\.\./);
      expect(u.filename).toMatch(/^evil[23 ]?.*\.csv$|^evil name\.csv$/);
      const row = await Upload.findByPk(u.id);
      expect(row!.storageKey).toBe(`cruises/${A.cruise}/raw/${row!.sha256}`);
      const done = await settle(tech, u.id);
      expect(done.status, JSON.stringify(done.errors)).toBe('ready');
      const cast = await Cast.findByPk(done.castIds[0]);
      expect(cast!.sourceFile).not.toMatch(/[\\/]|\.\./);
    }
    expect(existsSync('/etc/evil name.csv')).toBe(false);
    expect(existsSync(join(tmpdir(), '..', 'etc', 'evil name.csv'))).toBe(false);
  });
  it('a zip with a ../ entry or an absolute entry is refused whole: failed, naming the entry, no cast written', async () => {
    const tech = inA.technician!;
    for (const bad of ['../../escape.csv', '/etc/abs-entry.csv']) {
      const zip = await zipBuffer([
        { name: 'ok/good.csv', data: castCsv({ station: 'ZOK', maxP: 200 }) },
        { name: 'x', rawName: bad, data: castCsv({ station: 'ZBAD', maxP: 200 }) },
      ]);
      const res = await tech.agent
        .post(`/api/cruises/${A.cruise}/uploads`)
        .set('x-csrf-token', tech.csrf)
        .attach('files', zip, `unsafe-${bad.length}.zip`);
      expect(res.status).toBe(202);
      const done = await settle(tech, res.body.uploads[0].id);
      expect(done.status).toBe('failed');
      expect(done.errors[0].code).toBe('zip_unsafe_path');
      expect(done.errors[0].message).toContain(JSON.stringify(bad));
      expect(await Cast.count({ where: { uploadId: done.id } })).toBe(0);
      expect(await Cast.count({ where: { cruiseId: A.cruise, station: ['ZOK', 'ZBAD'] } })).toBe(0);
    }
  });
});

describe('injection through cast metadata', () => {
  const hostile = ['=HYPERLINK("http://evil.example/x","click")', '+1', '-1', '@x', '=1+2'];
  const script = '<script>alert("station")</script><img src=x onerror=alert(1)>';
  let scriptCast = '';
  beforeAll(async () => {
    const tech = inA.technician!;
    const files = [...hostile, script].map((station, i) => ({
      name: `inj${i}.csv`,
      data: castCsv({
        station,
        latitude: -31 - i * 0.3,
        longitude: -19 - i * 0.2,
        time: new Date(Date.UTC(2026, 1, 3, i)).toISOString(),
        maxP: 1200,
        seed: 90 + i,
      }),
    }));
    const zip = await zipBuffer(files);
    const res = await tech.agent
      .post(`/api/cruises/${A.cruise}/uploads`)
      .set('x-csrf-token', tech.csrf)
      .attach('files', zip, 'injection.zip');
    const done = await settle(tech, res.body.uploads[0].id);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
    const casts = await Cast.findAll({ where: { uploadId: done.id } });
    expect(casts.map((c) => c.station).sort()).toEqual([...hostile, script].sort());
    scriptCast = casts.find((c) => c.station === script)!.id;
  }, 90_000);

  for (const path of ['isopycnal.csv', 'pressure.csv']) {
    it(`formula-like station ids come out neutralised in ${path}`, async () => {
      const res = await inA
        .analyst!.agent.get(`/api/cruises/${A.cruise}/exports/${path}`)
        .buffer(true)
        .parse((r, cb) => {
          let s = '';
          r.on('data', (d: Buffer) => {
            s += d;
          });
          r.on('end', () => cb(null, s));
        });
      expect(res.status).toBe(200);
      const text = res.body as string;
      const rows = parseCsv(
        text
          .split('\r\n')
          .filter((l) => !l.startsWith('#'))
          .join('\r\n'),
        { relax_column_count: false },
      ) as string[][];
      const header = rows[0];
      const si = header.indexOf('station');
      const stations = new Set(rows.slice(1).map((r) => r[si]));
      for (const h of hostile) {
        expect(stations.has(`'${h}`), `${h} neutralised`).toBe(true);
        expect(stations.has(h), `${h} raw`).toBe(false);
      }
      // no cell anywhere starts a formula unless it is a plain number
      const bad = rows
        .slice(1)
        .flat()
        .filter((cell) => /^[=+\-@\t\r]/.test(cell) && !Number.isFinite(Number(cell)));
      expect(bad).toEqual([]);
      // nor does any comma-separated piece of a comment line
      for (const line of text.split('\r\n').filter((l) => l.startsWith('#'))) {
        for (const piece of line.split(',').slice(1)) expect(piece.trimStart(), line).not.toMatch(/^[=+@]/);
      }
    });
  }

  it('a station named <script>… is returned as data (JSON, nosniff), byte for byte', async () => {
    const res = await inA.pi!.agent.get(`/api/casts/${scriptCast}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.body.station).toBe(script);
    const list = await inA.pi!.agent.get(`/api/cruises/${A.cruise}/casts`);
    expect(list.body.map((c: { station: string }) => c.station)).toContain(script);
  });

  it('the served HTML carries a CSP that blocks inline script, and the client never injects HTML', async () => {
    const dist = join(process.cwd(), 'dist');
    let staticDir = dist;
    if (!existsSync(join(dist, 'index.html'))) {
      staticDir = mkdtempSync(join(tmpdir(), 'sl-static-'));
      writeFileSync(
        join(staticDir, 'index.html'),
        '<!doctype html><html><head><script type="module" src="/assets/main.js"></script></head><body><div id="root"></div></body></html>',
      );
    }
    const app = createApp(t.deps, { staticDir });
    try {
      const res = await request(app).get(`/cruises/${A.cruise}/casts/${scriptCast}`);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/html/);
      const csp = String(res.headers['content-security-policy']);
      const dir = Object.fromEntries(
        csp
          .split(';')
          .map((d) => d.trim().split(/\s+/))
          .filter((d) => d[0])
          .map(([k, ...v]) => [k, v]),
      );
      const scriptSrc = dir['script-src'] ?? dir['default-src'];
      expect(scriptSrc).toBeDefined();
      expect(scriptSrc).not.toContain("'unsafe-inline'");
      expect(scriptSrc).not.toContain("'unsafe-eval'");
      expect(scriptSrc).not.toContain('*');
      expect(dir['script-src-attr']).toEqual(["'none'"]);
      expect(dir['object-src']).toEqual(["'none'"]);
      expect(dir['base-uri']).toEqual(["'self'"]);
      expect(dir['frame-ancestors']).toEqual(["'self'"]);
      // the page itself has no inline script, so the CSP costs it nothing
      const html = String(res.text);
      for (const m of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)) {
        expect(m[1]).toMatch(/\bsrc=/);
        expect(m[2].trim()).toBe('');
      }
      expect(html).not.toContain('<script>alert');
    } finally {
      await app.close();
    }
    // React escapes text; nothing in the client writes raw HTML
    const offenders: string[] = [];
    const walk = (d: string) => {
      for (const f of readdirSync(d)) {
        const p = join(d, f);
        if (statSync(p).isDirectory()) walk(p);
        else if (
          /\.(tsx?|jsx?)$/.test(f) &&
          /dangerouslySetInnerHTML|\.innerHTML\s*=|outerHTML\s*=|insertAdjacentHTML|document\.write\(/.test(
            readFileSync(p, 'utf8'),
          )
        )
          offenders.push(p);
      }
    };
    walk(join(process.cwd(), 'src'));
    expect(offenders).toEqual([]);
  });
});

describe('helmet headers', () => {
  it('API answers and pages carry the hardening headers', async () => {
    for (const path of ['/api/health', '/api/auth/me', '/api/nope']) {
      const h = (await request(t.app).get(path)).headers;
      expect(h['content-security-policy'], path).toContain("default-src 'self'");
      expect(h['strict-transport-security'], path).toMatch(/max-age=\d{7,}/);
      expect(h['x-content-type-options'], path).toBe('nosniff');
      expect(h['x-frame-options'], path).toBe('SAMEORIGIN');
      expect(h['referrer-policy'], path).toBe('no-referrer');
      expect(h['cross-origin-opener-policy'], path).toBe('same-origin');
      expect(h['cross-origin-resource-policy'], path).toBe('same-origin');
      expect(h['x-dns-prefetch-control'], path).toBe('off');
      expect(h['x-permitted-cross-domain-policies'], path).toBe('none');
      expect(h['x-xss-protection'], path).toBe('0');
      expect(h['x-powered-by'], path).toBeUndefined();
    }
  });
});
