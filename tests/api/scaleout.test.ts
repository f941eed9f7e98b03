// Scale-out on one PostgreSQL and one S3: two web processes and two worker processes (children of
// this test, on loopback). A session made on web 1 is good on web 2; 50 distinct uploads sent
// through both web processes are each ingested exactly once, and both workers take jobs.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import pg from 'pg';
import { makeTestApp, createUser, addMember, PASSWORD, type TestApp } from './helpers';
import { Cruise } from '../../server/models/index';
import { castCsv, freePort, serviceEnv, spawnChild, waitHttp, Session, sleep, type Child } from './fault-helpers';

let t: TestApp;
let db: pg.Client;
let cruiseId: string;
const webs: { child: Child; url: string }[] = [];
const workers: Child[] = [];
const N = 50;

beforeAll(async () => {
  // The in-process app creates the database, runs the migrations and installs the queue schema.
  process.env.JOB_EXPIRE_SECONDS = '120';
  process.env.QUEUE_MAINTENANCE_SECONDS = '1';
  t = await makeTestApp();
  const chief = await createUser('so-chief@example.test');
  const c = await Cruise.create({
    name: 'Scale-out',
    ship: 'RV Scale',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  cruiseId = c.id;
  await addMember(chief.id, c.id, 'chief_scientist');
  const tech = await createUser('so-tech@example.test');
  await addMember(tech.id, c.id, 'technician');
  db = new pg.Client({ connectionString: t.databaseUrl });
  await db.connect();
  const env = serviceEnv(t.settings, { JOB_EXPIRE_SECONDS: '120' });
  for (const i of [1, 2]) {
    const port = await freePort();
    webs.push({
      child: spawnChild(`web${i}`, 'server/index.ts', {
        ...env,
        PORT: String(port),
        PUBLIC_URL: `http://127.0.0.1:${port}`,
      }),
      url: `http://127.0.0.1:${port}`,
    });
  }
  for (const i of [1, 2])
    workers.push(spawnChild(`worker${i}`, 'server/jobs/worker.ts', { ...env, WORKER_CONCURRENCY: '2' }));
  await Promise.all([
    ...webs.map((w) => waitHttp(`${w.url}/api/health`, 90_000, w.child)),
    ...workers.map((w) => w.waitForLog(/ingest.*workers? started/, 90_000)),
  ]);
}, 150_000);

afterAll(async () => {
  await Promise.all([...webs.map((w) => w.child.stop()), ...workers.map((w) => w.stop())]);
  await db?.end().catch(() => undefined);
  await t?.close();
}, 60_000);

describe('two web processes, two workers', () => {
  it('the web processes are two different processes answering on two ports', async () => {
    expect(webs[0].child.pid).not.toBe(webs[1].child.pid);
    for (const w of webs) expect((await fetch(`${w.url}/api/health`)).status).toBe(200);
  });

  it('a session made on web 1 is signed in on web 2 with the same cookie (and its CSRF token works there)', async () => {
    const s = new Session(webs[0].url);
    await s.signIn('so-chief@example.test', PASSWORD);
    expect(s.cookie).toMatch(/^sigmaline\.sid=/);
    const me2 = await s.req('GET', '/api/auth/me', { base: webs[1].url });
    expect(me2.status).toBe(200);
    expect(me2.body.user.email).toBe('so-chief@example.test');
    // a state-changing request on web 2 with the token fetched on web 1
    const st = await s.req('POST', `/api/cruises/${cruiseId}/stations`, {
      base: webs[1].url,
      json: { name: 'SO-PLAN', latitude: -34, longitude: -21 },
    });
    expect(st.status, JSON.stringify(st.body)).toBe(201);
    // signing out on web 2 ends the session on web 1 too
    const cookie = s.cookie;
    expect((await s.req('POST', '/api/auth/logout', { base: webs[1].url })).status).toBe(204);
    const s2 = new Session(webs[0].url);
    s2.cookie = cookie;
    expect((await s2.req('GET', '/api/auth/me')).status).toBe(401);
  });

  it(`${N} distinct uploads through both web processes are each ingested exactly once across both workers`, async () => {
    const s = new Session(webs[0].url);
    await s.signIn('so-tech@example.test', PASSWORD);
    const uploadIds: string[] = [];
    const t0 = Date.now();
    // five at a time, alternating web processes
    for (let k = 0; k < N; k += 5) {
      const batch = await Promise.all(
        Array.from({ length: 5 }, (_, j) => {
          const i = k + j;
          const file = {
            filename: `so-${String(i).padStart(3, '0')}.csv`,
            data: castCsv({
              station: `SO${i}`,
              latitude: -40 + i * 0.1,
              longitude: -25 + i * 0.05,
              time: new Date(Date.UTC(2026, 2, 5, i)).toISOString(),
              maxP: 400,
              seed: 1000 + i,
            }),
          };
          return s.upload(cruiseId, [file], webs[i % 2].url);
        }),
      );
      for (const r of batch) {
        expect(r.status, JSON.stringify(r.body)).toBe(202);
        expect(r.body.uploads[0].duplicate).toBeUndefined();
        uploadIds.push(r.body.uploads[0].id);
      }
    }
    expect(new Set(uploadIds).size).toBe(N);
    const end = Date.now() + 120_000;
    let states: Record<string, number>;
    for (;;) {
      const { rows } = await db.query<{ status: string; n: string }>(
        'SELECT status, count(*) AS n FROM uploads WHERE cruise_id = $1 GROUP BY status',
        [cruiseId],
      );
      states = Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
      if ((states.ready ?? 0) + (states.failed ?? 0) >= N) break;
      if (Date.now() > end) throw new Error(`uploads not settled after 120 s: ${JSON.stringify(states)}`);
      await sleep(250);
    }
    const wall = (Date.now() - t0) / 1000;
    expect(states).toEqual({ ready: N });

    // exactly N casts, one per upload, no duplicate source and no duplicate station
    const casts = await db.query<{ upload_id: string; station: string; source_sha256: string }>(
      'SELECT upload_id, station, source_sha256 FROM casts WHERE cruise_id = $1',
      [cruiseId],
    );
    expect(casts.rows).toHaveLength(N);
    expect(new Set(casts.rows.map((r) => r.upload_id))).toEqual(new Set(uploadIds));
    expect(new Set(casts.rows.map((r) => r.source_sha256)).size).toBe(N);
    expect(new Set(casts.rows.map((r) => r.station)).size).toBe(N);
    const cols = await db.query<{ n: string }>(
      'SELECT count(DISTINCT cast_id) AS n FROM cast_columns c JOIN casts k ON k.id = c.cast_id WHERE k.cruise_id = $1',
      [cruiseId],
    );
    expect(Number(cols.rows[0].n)).toBe(N);

    // the queue: one job per upload, each completed on its first try
    const jobs = await db.query<{ upload: string; state: string; retry_count: number }>(
      "SELECT data->>'uploadId' AS upload, state, retry_count FROM pgboss.job WHERE name = 'ingest-upload' UNION ALL SELECT data->>'uploadId', state, retry_count FROM pgboss.archive WHERE name = 'ingest-upload'",
    );
    const mine = jobs.rows.filter((j) => uploadIds.includes(j.upload));
    expect(mine).toHaveLength(N);
    expect(mine.every((j) => j.state === 'completed' && j.retry_count === 0)).toBe(true);

    // which worker ingested which upload: each worker logs "upload ingested" with the upload id
    const byWorker = workers.map((w) =>
      w
        .logs()
        .filter((l) => l.msg === 'upload ingested')
        .map((l) => String(l.uploadId)),
    );
    const all = byWorker.flat();
    expect(all.filter((id) => uploadIds.includes(id)).sort()).toEqual([...uploadIds].sort());
    expect(new Set(all).size).toBe(all.length); // nobody ingested an upload twice
    for (const [i, ids] of byWorker.entries()) expect(ids.length, `worker${i + 1} took no job`).toBeGreaterThan(0);
    // the web processes ingest nothing themselves
    for (const w of webs) expect(w.child.logs().some((l) => l.msg === 'upload ingested')).toBe(false);
    console.log(
      `[scaleout] ${N} uploads via 2 web processes, ingested by 2 workers (${byWorker.map((ids) => ids.length).join(' + ')} jobs) in ${wall.toFixed(1)} s`,
    );
  }, 150_000);
});
