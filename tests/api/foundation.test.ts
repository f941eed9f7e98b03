import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import request from 'supertest';
import { makeTestApp, createUser, agentFor, caughtMail, waitFor, PASSWORD, type TestApp } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await makeTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('health and contract', () => {
  it('reports every part ok when PostgreSQL, S3 and the queue answer', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok', storage: 'ok', queue: 'ok' });
  });
  it('serves an OpenAPI 3 document listing every route of the table', async () => {
    const res = await request(t.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toMatch(/^3\./);
    for (const r of t.app.routes) {
      const path = '/api' + r.path.replace(/:(\w+)/g, '{$1}');
      expect(res.body.paths[path]?.[r.method], `${r.method} ${path}`).toBeTruthy();
    }
  });
  it('answers unknown API routes with the error shape', async () => {
    const res = await request(t.app).get('/api/nope');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
  it('sets helmet headers', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('sign-in, CSRF and sessions', () => {
  beforeAll(async () => {
    await createUser('ana@example.test', { name: 'Ana' });
  });
  it('refuses a state-changing request without the CSRF header (403)', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'ana@example.test', password: PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
  });
  it('signs in with the right password, regenerates the session, and /me answers', async () => {
    const agent = request.agent(t.app);
    const first = await agent.get('/api/auth/csrf');
    const cookieBefore = String(first.headers['set-cookie']);
    const login = await agent
      .post('/api/auth/login')
      .set('x-csrf-token', first.body.token)
      .send({ email: 'ANA@example.test', password: PASSWORD });
    expect(login.status).toBe(200);
    expect(login.body.user.email).toBe('ana@example.test');
    const cookieAfter = String(login.headers['set-cookie']);
    expect(cookieAfter.split(';')[0]).not.toBe(cookieBefore.split(';')[0]); // session fixation guard
    expect(cookieAfter).toMatch(/HttpOnly/i);
    expect(cookieAfter).toMatch(/SameSite=Lax/i);
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.memberships).toEqual([]);
  });
  it('401 for a wrong password and for /me when signed out', async () => {
    const { agent, csrf } = await agentFor(t.app);
    expect(
      (
        await agent
          .post('/api/auth/login')
          .set('x-csrf-token', csrf)
          .send({ email: 'ana@example.test', password: 'wrong-password-1' })
      ).status,
    ).toBe(401);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });
  it('slows repeated failed sign-ins with a growing delay (429 with Retry-After), never a lockout', async () => {
    await createUser('bo@example.test');
    const { agent, csrf } = await agentFor(t.app);
    const codes: number[] = [];
    const free = t.settings.LOGIN_FREE_FAILURES;
    for (let i = 0; i < free + 1; i++) {
      codes.push(
        (
          await agent
            .post('/api/auth/login')
            .set('x-csrf-token', csrf)
            .send({ email: 'bo@example.test', password: `bad-guess-${i}` })
        ).status,
      );
    }
    expect(codes.slice(0, free).every((c) => c === 401)).toBe(true);
    expect(codes.at(-1)).toBe(429);
    // even the right password waits for the delay to pass
    const waiting = await agent
      .post('/api/auth/login')
      .set('x-csrf-token', csrf)
      .send({ email: 'bo@example.test', password: PASSWORD });
    expect(waiting.status).toBe(429);
    expect(Number(waiting.headers['retry-after'])).toBeGreaterThan(0);
  });
  it('signs out (204) and the session no longer works', async () => {
    const { agent, csrf } = await agentFor(t.app, 'ana@example.test');
    expect((await agent.post('/api/auth/logout').set('x-csrf-token', csrf)).status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });
  it('resets a password through the e-mailed link, once', async () => {
    await createUser('cy@example.test');
    const { agent, csrf } = await agentFor(t.app);
    const earlier = (await caughtMail()).filter((m) => m.to.includes('cy@example.test')).length;
    expect(
      (await agent.post('/api/auth/password-reset').set('x-csrf-token', csrf).send({ email: 'cy@example.test' }))
        .status,
    ).toBe(202);
    // the reset mail leaves from a queue after the answer
    const mail = await waitFor(async () => {
      const to = (await caughtMail()).filter((m) => m.to.includes('cy@example.test'));
      return to.length > earlier && to.at(-1);
    });
    const token = /\/reset\/([\w-]+)/.exec(mail.text)![1];
    const weak = await agent
      .post('/api/auth/password-reset/confirm')
      .set('x-csrf-token', csrf)
      .send({ token, password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.code).toBe('weak_password');
    expect(
      (
        await agent
          .post('/api/auth/password-reset/confirm')
          .set('x-csrf-token', csrf)
          .send({ token, password: 'new-secret-2026' })
      ).status,
    ).toBe(204);
    expect(
      (
        await agent
          .post('/api/auth/password-reset/confirm')
          .set('x-csrf-token', csrf)
          .send({ token, password: 'other-secret-2026' })
      ).status,
    ).toBe(400);
    await agentFor(t.app, 'cy@example.test', 'new-secret-2026');
  });
});

describe('cruises and invitations', () => {
  it('creates a cruise (creator is chief scientist), validates, and hides it from non-members', async () => {
    await createUser('chief@example.test');
    await createUser('outsider@example.test');
    const chief = await agentFor(t.app, 'chief@example.test');
    const bad = await chief.agent
      .post('/api/cruises')
      .set('x-csrf-token', chief.csrf)
      .send({ name: '', ship: 'RV Example', startDate: '2026-05-02', endDate: '2026-05-01' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { field: string }) => d.field)).toEqual(expect.arrayContaining(['name']));
    const res = await chief.agent
      .post('/api/cruises')
      .set('x-csrf-token', chief.csrf)
      .send({ name: 'Test line', ship: 'RV Example', startDate: '2026-05-01', endDate: '2026-05-20' });
    expect(res.status).toBe(201);
    expect(res.body.role).toBe('chief_scientist');
    const list = await chief.agent.get('/api/cruises');
    expect(list.body.map((c: { id: string }) => c.id)).toContain(res.body.id);
    const out = await agentFor(t.app, 'outsider@example.test');
    expect((await out.agent.get(`/api/cruises/${res.body.id}`)).status).toBe(404);
    expect((await out.agent.get('/api/cruises')).body).toEqual([]);
  });
  it('invites by e-mail; following the link creates the account with the role', async () => {
    const chief = await agentFor(t.app, 'chief@example.test');
    const cruise = (
      await chief.agent
        .post('/api/cruises')
        .set('x-csrf-token', chief.csrf)
        .send({ name: 'Invite line', ship: 'RV Example', startDate: '2026-06-01', endDate: '2026-06-20' })
    ).body;
    const inv = await chief.agent
      .post(`/api/cruises/${cruise.id}/members`)
      .set('x-csrf-token', chief.csrf)
      .send({ email: 'newtech@example.test', role: 'technician' });
    expect(inv.status).toBe(201);
    const mail = (await caughtMail()).filter((m) => m.to.includes('newtech@example.test')).at(-1)!;
    // the cruise name (user text) is quoted in the body, never in the subject
    expect(mail.subject).not.toContain('Invite line');
    expect(mail.text).toContain('"Invite line"');
    const token = /\/invite\/([\w-]+)/.exec(mail.text)![1];
    const anon = await agentFor(t.app);
    const info = await anon.agent.get(`/api/invitations/${token}`);
    expect(info.body).toMatchObject({ email: 'newtech@example.test', role: 'technician', accountExists: false });
    const accept = await anon.agent
      .post(`/api/invitations/${token}/accept`)
      .set('x-csrf-token', anon.csrf)
      .send({ name: 'New Tech', password: 'tech-pass-2026' });
    expect(accept.status).toBe(200);
    const me = await anon.agent.get('/api/auth/me');
    expect(me.body.memberships).toEqual([{ cruiseId: cruise.id, role: 'technician' }]);
    expect((await anon.agent.get(`/api/invitations/${token}`)).status).toBe(404); // used
    const members = await chief.agent.get(`/api/cruises/${cruise.id}/members`);
    expect(members.body.map((m: { email: string; role: string }) => `${m.email}:${m.role}`)).toEqual(
      expect.arrayContaining(['newtech@example.test:technician', 'chief@example.test:chief_scientist']),
    );
    const trail = await chief.agent.get(`/api/cruises/${cruise.id}/audit`);
    expect(trail.body.map((a: { action: string }) => a.action)).toEqual(
      expect.arrayContaining(['create', 'invite', 'accept_invitation']),
    );
  });
});
