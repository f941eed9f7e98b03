// The second hardening round (docs/security.md): one test (or a few) per promise, each written to
// fail on the code before its fix. Timing comparisons use medians and generous margins, so a loaded
// 2-core machine does not make them flaky.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import request from 'supertest';
import { makeTestApp, createUser, addMember, agentFor, caughtMail, waitFor, PASSWORD, type TestApp } from './helpers';
import { castCsv, zipBuffer, sleep } from './fault-helpers';
import { createApp, type App } from '../../server/app';
import { startWorkers } from '../../server/jobs/worker';
import { AuditEntry, Cruise, LoginAttempt, Membership, PasswordReset, User } from '../../server/models/index';
import { cacheStats } from '../../server/services/cruiseData';
import { backoffMs } from '../../server/auth/limiter';
import { hashToken, newToken } from '../../server/auth/tokens';
import type { Settings } from '../../server/config';
import { MAIL_SUBJECTS, type Mailer } from '../../server/services/mailer';

type Agent = Awaited<ReturnType<typeof agentFor>>;
let t: TestApp;
let cruiseId: string;
let chief: Agent;
let analyst: Agent;
const extraApps: App[] = [];
/** Another web process on the same database with other settings (or another mailer). */
function appWith(settings: Partial<Settings>, mailer?: Mailer) {
  const app = createApp(
    { ...t.deps, mailer: mailer ?? t.deps.mailer, settings: { ...t.settings, ...settings } },
    { staticDir: '/nonexistent' },
  );
  extraApps.push(app);
  return app;
}
const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
};
async function timed(fn: () => Promise<unknown>) {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
}
const settle = (who: Agent, id: string) =>
  waitFor(async () => {
    const r = await who.agent.get(`/api/uploads/${id}`);
    return r.body.status === 'ready' || r.body.status === 'failed' ? r.body : null;
  }, 60_000);
async function newCruise(name: string, chiefId: string) {
  const c = await Cruise.create({
    name,
    ship: 'RV Hardening',
    startDate: '2026-04-01',
    endDate: '2026-04-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chiefId,
  });
  await addMember(chiefId, c.id, 'chief_scientist');
  return c.id;
}

beforeAll(async () => {
  // High sign-in limits here (the timing tests fail many sign-ins); the back-off has its own app.
  t = await makeTestApp({
    LOGIN_FREE_FAILURES: '1000',
    LOGIN_MAX_FAILURES: '1000',
    CAST_MAX_LEVELS: '2000',
    UPLOAD_MAX_INFLATED_BYTES: String(400_000),
    SECTION_CACHE_MAX_BYTES: String(64 * 1024 * 1024),
  });
  await startWorkers(t.deps, { concurrency: 2 });
  const c = await createUser('h-chief@example.test');
  cruiseId = await newCruise('Hardening', c.id);
  const a = await createUser('h-analyst@example.test');
  await addMember(a.id, cruiseId, 'analyst');
  const tech = await createUser('h-tech@example.test');
  await addMember(tech.id, cruiseId, 'technician');
  chief = await agentFor(t.app, 'h-chief@example.test');
  analyst = await agentFor(t.app, 'h-analyst@example.test');
  const files = await zipBuffer(
    [1, 2, 3].map((i) => ({
      name: `h${i}.csv`,
      data: castCsv({ station: `H${i}`, maxP: 800, longitude: -20 + i * 0.3, seed: i }),
    })),
  );
  const up = await chief.agent
    .post(`/api/cruises/${cruiseId}/uploads`)
    .set('x-csrf-token', chief.csrf)
    .attach('files', files, 'h.zip');
  expect(up.status).toBe(202);
  const done = await settle(chief, up.body.uploads[0].id);
  expect(done.status, JSON.stringify(done.errors)).toBe('ready');
}, 120_000);
afterAll(async () => {
  for (const a of extraApps) await a.close();
  await t?.close();
});

describe('1. upload limits (settings)', () => {
  it('a cast over CAST_MAX_LEVELS fails naming its file; a zip over UPLOAD_MAX_INFLATED_BYTES fails naming the zip', async () => {
    expect(t.settings.CAST_MAX_LEVELS).toBe(2000);
    const long = await chief.agent
      .post(`/api/cruises/${cruiseId}/uploads`)
      .set('x-csrf-token', chief.csrf)
      .attach('files', Buffer.from(castCsv({ station: 'LONG', maxP: 3000, step: 1 })), 'long-cast.csv');
    const a = await settle(chief, long.body.uploads[0].id);
    expect(a.status).toBe('failed');
    expect(a.errors[0]).toMatchObject({ file: 'long-cast.csv', code: 'too_many_levels' });
    expect(a.errors[0].message).toMatch(/3000 levels \(the limit is 2000\)/);
    // five entries of ~100 kB each: each under every per-entry limit, together over 400 kB
    const big = await zipBuffer(
      [1, 2, 3, 4, 5].map((i) => ({
        name: `b${i}.csv`,
        data: castCsv({ station: `B${i}`, maxP: 1900, step: 0.5, seed: i }).slice(0, 100_000),
      })),
    );
    const z = await chief.agent
      .post(`/api/cruises/${cruiseId}/uploads`)
      .set('x-csrf-token', chief.csrf)
      .attach('files', big, 'many.zip');
    const b = await settle(chief, z.body.uploads[0].id);
    expect(b.status).toBe('failed');
    expect(b.errors[0]).toMatchObject({ file: 'many.zip', code: 'zip_too_large' });
  }, 60_000);
});

describe('2. costly parameters', () => {
  it('bins below 0.5 dbar, over-precise or huge level lists answer 400, not a huge answer or a 500', async () => {
    const base = `/api/cruises/${cruiseId}`;
    for (const url of [
      `${base}/section?bin=0.01`,
      `${base}/section?bin=1e-9`,
      `${base}/exports/pressure.csv?bin=0.001`,
      `${base}/geostrophy?bin=0.0001`,
      `${base}/section?coord=density&levels=${'27.' + '1'.repeat(120)}`,
      `${base}/section?coord=density&levels=26.1234567,27`,
      `${base}/section?coord=density&levels=24:0.00000001:28`,
      `${base}/exports/isopycnal.csv?levels=1${'0'.repeat(400)}`,
    ]) {
      const res = await chief.agent.get(url);
      expect(res.status, url).toBe(400);
      expect(res.body.error.code, url).toBeTruthy();
    }
    expect(
      (
        await chief.agent
          .post(`${base}/deliveries`)
          .set('x-csrf-token', chief.csrf)
          .send({ kind: 'pressure', bin: 1e-9, formats: ['csv'] })
      ).status,
    ).toBe(400);
    expect((await chief.agent.get(`${base}/section?bin=0.5`)).status).toBe(200);
  });
  it('20 identical concurrent uncached section requests make one computation', async () => {
    const url = `/api/cruises/${cruiseId}/section?property=CT&bin=7`;
    const before = cacheStats();
    const answers = await Promise.all(Array.from({ length: 20 }, () => analyst.agent.get(url)));
    const after = cacheStats();
    expect(answers.map((r) => r.status)).toEqual(Array(20).fill(200));
    expect(new Set(answers.map((r) => JSON.stringify(r.body))).size).toBe(1);
    expect(after.builds - before.builds).toBe(1);
    expect(after.joined - before.joined + after.hits - before.hits).toBe(19);
  });
  it('the cache is capped by bytes: past the cap the oldest grid is dropped and built again', async () => {
    const small = appWith({ SECTION_CACHE_MAX_BYTES: 1 });
    const a = await agentFor(small, 'h-analyst@example.test');
    const one = await a.agent.get(`/api/cruises/${cruiseId}/section?property=SA&bin=9`);
    expect(one.status).toBe(200);
    const bytes = Buffer.byteLength(JSON.stringify(one.body));
    // room for one answer but not two (the cache holds it plain and gzipped)
    const capped = appWith({ SECTION_CACHE_MAX_BYTES: Math.round(bytes * 1.6) });
    const b = await agentFor(capped, 'h-analyst@example.test');
    const urls = ['SA&bin=11', 'SA&bin=13', 'SA&bin=11'].map((q) => `/api/cruises/${cruiseId}/section?property=${q}`);
    const s0 = cacheStats();
    for (const u of urls) expect((await b.agent.get(u)).status).toBe(200);
    const s1 = cacheStats();
    expect(s1.builds - s0.builds).toBe(3); // the first grid was dropped for the second
    expect(s1.bytes).toBeLessThanOrEqual(Math.round(bytes * 1.6));
  });
});

describe('3. no account enumeration by timing', () => {
  it('a failed sign-in costs the same for an unknown address and an account (medians within a wide margin)', async () => {
    await createUser('timing-known@example.test');
    const a = await agentFor(t.app);
    const known: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 8; i++) {
      known.push(
        await timed(() =>
          a.agent
            .post('/api/auth/login')
            .set('x-csrf-token', a.csrf)
            .send({ email: 'timing-known@example.test', password: `wrong-${i}-guess` })
            .expect(401),
        ),
      );
      unknown.push(
        await timed(() =>
          a.agent
            .post('/api/auth/login')
            .set('x-csrf-token', a.csrf)
            .send({ email: `timing-nobody-${i}@example.test`, password: `wrong-${i}-guess` })
            .expect(401),
        ),
      );
    }
    const [k, u] = [median(known), median(unknown)];
    // Before the dummy hash an unknown address skipped the argon2 check: ~10× faster.
    expect(Math.max(k, u) / Math.min(k, u), `known ${k.toFixed(1)} ms, unknown ${u.toFixed(1)} ms`).toBeLessThan(2.5);
  }, 60_000);
  it('a reset request answers before any mail is sent, for an account as for an unknown address', async () => {
    // a mailer that takes 400 ms a message: a request that waited for it would show
    const slow: Mailer = {
      ...t.deps.mailer,
      send: async (m) => {
        await sleep(400);
        await t.deps.mailer.send(m);
      },
    };
    const app = appWith({}, slow);
    const a = await agentFor(app);
    const known: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 6; i++) {
      const email = `timing-reset-${i}-${Date.now()}@example.test`;
      await createUser(email);
      known.push(
        await timed(() =>
          a.agent.post('/api/auth/password-reset').set('x-csrf-token', a.csrf).send({ email }).expect(202),
        ),
      );
      unknown.push(
        await timed(() =>
          a.agent
            .post('/api/auth/password-reset')
            .set('x-csrf-token', a.csrf)
            .send({ email: `nobody-${i}-${Date.now()}@example.test` })
            .expect(202),
        ),
      );
    }
    const [k, u] = [median(known), median(unknown)];
    expect(k, `known ${k.toFixed(1)} ms, unknown ${u.toFixed(1)} ms`).toBeLessThan(u + 250);
    // and the mail does arrive, from the queue
    const last = `timing-reset-5-`;
    await waitFor(async () => (await caughtMail()).find((m) => m.to.some((x) => x.startsWith(last))), 20_000);
  }, 60_000);
});

describe('4. a reset or a password change ends the other sessions', () => {
  it('after a reset, every session opened before it is signed out', async () => {
    const email = `sess-reset-${Date.now()}@example.test`;
    await createUser(email);
    const s1 = await agentFor(t.app, email);
    const s2 = await agentFor(t.app, email);
    const token = newToken();
    const u = (await User.findOne({ where: { email } }))!;
    await PasswordReset.create({
      userId: u.id,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + 3600_000),
      usedAt: null,
    });
    const anon = await agentFor(t.app);
    expect(
      (
        await anon.agent
          .post('/api/auth/password-reset/confirm')
          .set('x-csrf-token', anon.csrf)
          .send({ token, password: 'brand-new-2026' })
      ).status,
    ).toBe(204);
    expect((await s1.agent.get('/api/auth/me')).status).toBe(401);
    expect((await s2.agent.get('/api/auth/me')).status).toBe(401);
    await agentFor(t.app, email, 'brand-new-2026');
  });
  it('a password change keeps the session that made it and ends the others', async () => {
    const email = `sess-change-${Date.now()}@example.test`;
    await createUser(email);
    const mine = await agentFor(t.app, email);
    const other = await agentFor(t.app, email);
    const wrong = await mine.agent
      .post('/api/auth/password')
      .set('x-csrf-token', mine.csrf)
      .send({ currentPassword: 'not-my-password-1', password: 'changed-pass-2026' });
    expect(wrong.status).toBe(401);
    expect((await other.agent.get('/api/auth/me')).status).toBe(200);
    const ok = await mine.agent
      .post('/api/auth/password')
      .set('x-csrf-token', mine.csrf)
      .send({ currentPassword: PASSWORD, password: 'changed-pass-2026' });
    expect(ok.status).toBe(204);
    expect((await mine.agent.get('/api/auth/me')).status).toBe(200);
    expect((await other.agent.get('/api/auth/me')).status).toBe(401);
    await agentFor(t.app, email, 'changed-pass-2026');
  });
});

describe('6. mail is no relay', () => {
  it('invitations are limited per cruise and per sender (429), and no user text is in the subject', async () => {
    const app = appWith({ INVITES_PER_CRUISE_PER_HOUR: 3, INVITES_PER_SENDER_PER_HOUR: 4 });
    const sender = await createUser(`relay-${Date.now()}@example.test`);
    const c1 = await newCruise('URGENT: wire 5000 EUR to account 123', sender.id);
    const c2 = await newCruise('Second', sender.id);
    const a = await agentFor(app, sender.email);
    const invite = (c: string, i: number) =>
      a.agent
        .post(`/api/cruises/${c}/members`)
        .set('x-csrf-token', a.csrf)
        .send({ email: `relay-to-${i}-${Date.now()}@example.test`, role: 'analyst' });
    const codes = [];
    for (let i = 0; i < 4; i++) codes.push((await invite(c1, i)).status);
    expect(codes).toEqual([201, 201, 201, 429]);
    expect((await invite(c2, 10)).status).toBe(201); // the fourth of this sender
    const capped = await invite(c2, 11);
    expect(capped.status).toBe(429);
    expect(capped.body.error.message).toMatch(/You have sent as many invitations/);
    const mails = await waitFor(async () => {
      const m = (await caughtMail()).filter((x) => x.to.some((to) => to.startsWith('relay-to-0-')));
      return m.length ? m : null;
    });
    expect(mails.at(-1)!.subject).not.toMatch(/URGENT|wire/);
    expect(mails.at(-1)!.text).toContain('"URGENT: wire 5000 EUR to account 123"');
  });
  it('every mail the app sends has a fixed subject: invitations, resets and releases carry no user text', async () => {
    const sender = await createUser(`subj-${Date.now()}@example.test`);
    const c = await newCruise('FREE MONEY "click" http://evil.example', sender.id);
    const a = await agentFor(t.app, sender.email);
    const to = `subj-to-${Date.now()}@example.test`;
    expect(
      (await a.agent.post(`/api/cruises/${c}/members`).set('x-csrf-token', a.csrf).send({ email: to, role: 'pi' }))
        .status,
    ).toBe(201);
    expect(
      (await a.agent.post('/api/auth/password-reset').set('x-csrf-token', a.csrf).send({ email: sender.email })).status,
    ).toBe(202);
    const mine = await waitFor(async () => {
      const m = (await caughtMail()).filter((x) => x.to.includes(to) || x.to.includes(sender.email));
      return m.length >= 2 ? m : null;
    });
    expect(mine.map((m) => m.subject).sort()).toEqual([MAIL_SUBJECTS.invitation('pi'), MAIL_SUBJECTS.reset].sort());
    // the cruise's name is in the invitation's body, quoted on one line (its own quotes turned into ')
    expect(mine.find((m) => m.to.includes(to))!.text).toContain(`"FREE MONEY 'click' http://evil.example"`);
    // every mail caught so far in this run (invitations, resets, releases of the other test files too)
    const fixedSubjects = new Set<string>([
      MAIL_SUBJECTS.reset,
      MAIL_SUBJECTS.release,
      ...(['chief_scientist', 'technician', 'analyst', 'pi'] as const).map((r) => MAIL_SUBJECTS.invitation(r)),
    ]);
    for (const m of await caughtMail()) expect(fixedSubjects.has(m.subject), m.subject).toBe(true);
  });
  it(`reset mails are limited per address`, async () => {
    const email = `reset-limit-${Date.now()}@example.test`;
    await createUser(email);
    const a = await agentFor(t.app);
    const codes = [];
    for (let i = 0; i < t.settings.RESET_MAILS_PER_ADDRESS_PER_HOUR + 2; i++)
      codes.push((await a.agent.post('/api/auth/password-reset').set('x-csrf-token', a.csrf).send({ email })).status);
    expect(codes).toEqual([...Array(t.settings.RESET_MAILS_PER_ADDRESS_PER_HOUR).fill(202), 429, 429]);
    await sleep(1500);
    expect((await caughtMail()).filter((m) => m.to.includes(email)).length).toBe(
      t.settings.RESET_MAILS_PER_ADDRESS_PER_HOUR,
    );
  });
});

describe('8. races and counted passwords', () => {
  it('two concurrent confirms of one reset token: one wins', async () => {
    for (let round = 0; round < 2; round++) {
      const email = `race-${round}-${Date.now()}@example.test`;
      const u = await createUser(email);
      const token = newToken();
      await PasswordReset.create({
        userId: u.id,
        tokenHash: hashToken(token),
        expiresAt: new Date(Date.now() + 3600_000),
        usedAt: null,
      });
      const [x, y] = [await agentFor(t.app), await agentFor(t.app)];
      const answers = await Promise.all([
        x.agent
          .post('/api/auth/password-reset/confirm')
          .set('x-csrf-token', x.csrf)
          .send({ token, password: 'first-winner-2026' }),
        y.agent
          .post('/api/auth/password-reset/confirm')
          .set('x-csrf-token', y.csrf)
          .send({ token, password: 'second-winner-2026' }),
      ]);
      expect(answers.map((r) => r.status).sort()).toEqual([204, 400]);
    }
  });
  it('two chief scientists demoting each other at once leave the cruise with one', async () => {
    for (let round = 0; round < 3; round++) {
      const x = await createUser(`chief-x-${round}-${Date.now()}@example.test`);
      const y = await createUser(`chief-y-${round}-${Date.now()}@example.test`);
      const c = await newCruise(`Mutual ${round}`, x.id);
      await addMember(y.id, c, 'chief_scientist');
      const [ax, ay] = [await agentFor(t.app, x.email), await agentFor(t.app, y.email)];
      const answers = await Promise.all([
        ax.agent.patch(`/api/cruises/${c}/members/${y.id}`).set('x-csrf-token', ax.csrf).send({ role: 'analyst' }),
        ay.agent.patch(`/api/cruises/${c}/members/${x.id}`).set('x-csrf-token', ay.csrf).send({ role: 'analyst' }),
      ]);
      expect(await Membership.count({ where: { cruiseId: c, role: 'chief_scientist' } })).toBe(1);
      expect(answers.map((r) => r.status).sort()).toEqual([200, 400]);
    }
  });
  it('wrong passwords on an invitation accept for an existing account count for the sign-in back-off', async () => {
    const app = appWith({ LOGIN_FREE_FAILURES: 3, LOGIN_MAX_FAILURES: 8, LOGIN_BACKOFF_BASE_MS: 60_000 });
    const email = `accept-${Date.now()}@example.test`;
    await createUser(email);
    const inviter = await agentFor(app, 'h-chief@example.test');
    expect(
      (
        await inviter.agent
          .post(`/api/cruises/${cruiseId}/members`)
          .set('x-csrf-token', inviter.csrf)
          .send({ email, role: 'pi' })
      ).status,
    ).toBe(201);
    const mail = await waitFor(async () => (await caughtMail()).find((m) => m.to.includes(email)));
    const token = /\/invite\/([\w-]+)/.exec(mail.text)![1];
    const a = await agentFor(app);
    for (let i = 0; i < 3; i++)
      expect(
        (
          await a.agent
            .post(`/api/invitations/${token}/accept`)
            .set('x-csrf-token', a.csrf)
            .send({ password: `guess-${i}-wrong` })
        ).status,
      ).toBe(401);
    expect(await LoginAttempt.count({ where: { email, succeeded: false } })).toBe(3);
    expect(
      (await a.agent.post(`/api/invitations/${token}/accept`).set('x-csrf-token', a.csrf).send({ password: PASSWORD }))
        .status,
    ).toBe(429);
    expect(
      (await a.agent.post('/api/auth/login').set('x-csrf-token', a.csrf).send({ email, password: PASSWORD })).status,
    ).toBe(429);
  });
});

describe('10. proxies and back-off', () => {
  it('X-Forwarded-For counts only from a configured proxy', async () => {
    const email = `xff-${Date.now()}@example.test`;
    const plain = await agentFor(appWith({ TRUST_PROXY: '' }));
    await plain.agent
      .post('/api/auth/login')
      .set('x-csrf-token', plain.csrf)
      .set('X-Forwarded-For', '203.0.113.7')
      .send({ email, password: 'not-it-at-all' });
    const proxied = await agentFor(appWith({ TRUST_PROXY: 'loopback' }));
    await proxied.agent
      .post('/api/auth/login')
      .set('x-csrf-token', proxied.csrf)
      .set('X-Forwarded-For', '203.0.113.8')
      .send({ email, password: 'not-it-at-all' });
    const ips = (await LoginAttempt.findAll({ where: { email }, order: [['id', 'ASC']] })).map((r) => r.ip);
    expect(ips[0]).not.toBe('203.0.113.7');
    expect(ips[0]).toMatch(/127\.0\.0\.1|::1/);
    expect(ips[1]).toBe('203.0.113.8');
    expect(() => createApp({ ...t.deps, settings: { ...t.settings, TRUST_PROXY: 'true' } })).toThrow(/TRUST_PROXY/);
  });
  it('without a trusted proxy, X-Forwarded-Proto does not make the cookie Secure', async () => {
    const app = appWith({ PUBLIC_URL: 'https://sigmaline.example.org', TRUST_PROXY: '' });
    const res = await request(app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
    expect(([] as string[]).concat(res.headers['set-cookie'] ?? []).some((c) => c.startsWith('sigmaline.sid='))).toBe(
      false,
    );
  });
  it('failures slow the account for that address with a growing delay; another address signs in; after the wait it works', async () => {
    expect(
      [0, 1, 2, 3, 4, 5].map((f) => backoffMs(f, 3, { LOGIN_BACKOFF_BASE_MS: 1000, LOGIN_BACKOFF_MAX_MS: 5000 })),
    ).toEqual([0, 0, 0, 1000, 2000, 4000]);
    expect(backoffMs(40, 3, { LOGIN_BACKOFF_BASE_MS: 1000, LOGIN_BACKOFF_MAX_MS: 5000 })).toBe(5000);
    const app = appWith({
      TRUST_PROXY: 'loopback',
      LOGIN_FREE_FAILURES: 2,
      LOGIN_MAX_FAILURES: 8,
      LOGIN_BACKOFF_BASE_MS: 1500,
    });
    const email = `backoff-${Date.now()}@example.test`;
    await createUser(email);
    const from = async (ip: string, password: string) => {
      const a = await agentFor(app);
      return a.agent
        .post('/api/auth/login')
        .set('x-csrf-token', a.csrf)
        .set('X-Forwarded-For', ip)
        .send({ email, password });
    };
    expect((await from('198.51.100.1', 'bad-guess-0001')).status).toBe(401);
    expect((await from('198.51.100.1', 'bad-guess-0002')).status).toBe(401);
    const waiting = await from('198.51.100.1', PASSWORD);
    expect(waiting.status).toBe(429);
    // the owner elsewhere is not locked out
    expect((await from('198.51.100.2', PASSWORD)).status).toBe(200);
    await sleep(Number(waiting.headers['retry-after']) * 1000 + 200);
    expect((await from('198.51.100.1', PASSWORD)).status).toBe(200);
  }, 30_000);
});

describe('11. prototype keys in query parameters', () => {
  it('constructor, __proto__, toString … as a name or value answer 400', async () => {
    const base = `/api/cruises/${cruiseId}`;
    for (const url of [
      `${base}/section?property=constructor`,
      `${base}/section?property=__proto__`,
      `${base}/section?__proto__=x`,
      `${base}/section?constructor=1`,
      `${base}/exports/pressure.csv?extras=toString`,
      `${base}/exports/isopycnal.csv?extras=CT,hasOwnProperty`,
      `${base}/ts?every=1&valueOf=2`,
      `${base}/section?property=prototype`,
    ]) {
      const res = await chief.agent.get(url);
      expect(res.status, url).toBe(400);
      expect(res.body.error.code, url).toBe('bad_query');
    }
    const mapping = await chief.agent
      .put(`${base}/column-mapping`)
      .set('x-csrf-token', chief.csrf)
      .set('content-type', 'application/json')
      .send('{"mapping":{"__proto__":"pressure"}}');
    expect(mapping.status).toBe(400);
  });
});

describe('12. invitation addresses in the audit trail', () => {
  it('chief scientists see them; other roles see that an invitation was sent', async () => {
    const email = `audit-invitee-${Date.now()}@example.test`;
    expect(
      (
        await chief.agent
          .post(`/api/cruises/${cruiseId}/members`)
          .set('x-csrf-token', chief.csrf)
          .send({ email, role: 'technician' })
      ).status,
    ).toBe(201);
    const asChief = (await chief.agent.get(`/api/cruises/${cruiseId}/audit`)).body as {
      entity: string;
      after: { email?: string };
    }[];
    expect(asChief.find((e) => e.entity === 'invitation' && e.after.email === email)).toBeTruthy();
    const asAnalyst = (await analyst.agent.get(`/api/cruises/${cruiseId}/audit`)).body as {
      entity: string;
      after: { email?: string; role?: string };
    }[];
    const invites = asAnalyst.filter((e) => e.entity === 'invitation');
    expect(invites.length).toBeGreaterThan(0);
    expect(JSON.stringify(asAnalyst)).not.toContain(email);
    expect(invites.every((e) => e.after.email === undefined && typeof e.after.role === 'string')).toBe(true);
    expect(await AuditEntry.count({ where: { cruiseId, entity: 'invitation' } })).toBe(invites.length);
  });
});
