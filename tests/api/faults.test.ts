// Faults, each against private instances so the shared test services are never touched:
// (a) a worker process killed with SIGKILL in the middle of an ingest,
// (b) a private PostgreSQL cluster stopped and started under a running web process,
// (c) a private S3 fake stopped while an upload request is on the wire.
// Each time the app must say what failed, lose nothing, duplicate nothing and recover by itself.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import http from 'node:http';
import type { Server } from 'node:http';
import pg from 'pg';
import request from 'supertest';
import { makeTestApp, createUser, addMember, agentFor, PASSWORD, type TestApp } from './helpers';
import { AuditEntry, Cast, Cruise, Upload } from '../../server/models/index';
import { createApp } from '../../server/app';
import { createStorage } from '../../server/services/storage';
import { startWorkers } from '../../server/jobs/worker';
import { hashPassword } from '../../server/auth/passwords';
import {
  castCsv,
  freePort,
  multipart,
  serviceEnv,
  sleep,
  spawnChild,
  startOwnPostgres,
  startOwnS3,
  waitHttp,
  zipBuffer,
  Session,
  type Child,
} from './fault-helpers';

let t: TestApp;
let db: pg.Client;
let cruiseId: string;
let techId: string;
const children: Child[] = [];
const cleanups: (() => Promise<void> | void)[] = [];

beforeAll(async () => {
  // every process of this test (the in-process app and the children) shares the queue policy
  process.env.JOB_EXPIRE_SECONDS = '20';
  process.env.QUEUE_MAINTENANCE_SECONDS = '1';
  t = await makeTestApp();
  const chief = await createUser('f-chief@example.test');
  const c = await Cruise.create({
    name: 'Faults',
    ship: 'RV Fault',
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
  const tech = await createUser('f-tech@example.test');
  techId = tech.id;
  await addMember(tech.id, c.id, 'technician');
  db = new pg.Client({ connectionString: t.databaseUrl });
  await db.connect();
}, 120_000);

afterAll(async () => {
  await Promise.all(children.map((c) => c.stop('SIGKILL')));
  for (const f of cleanups.reverse()) await Promise.resolve(f()).catch(() => undefined);
  await db?.end().catch(() => undefined);
  await t?.close();
}, 60_000);

const uploadState = async (id: string) =>
  (await db.query<{ status: string; progress: number }>('SELECT status, progress FROM uploads WHERE id = $1', [id]))
    .rows[0];
const jobsOf = async (uploadId: string) =>
  (
    await db.query<{ state: string; retry_count: number }>(
      "SELECT state, retry_count FROM pgboss.job WHERE name = 'ingest-upload' AND data->>'uploadId' = $1 UNION ALL SELECT state, retry_count FROM pgboss.archive WHERE name = 'ingest-upload' AND data->>'uploadId' = $1",
      [uploadId],
    )
  ).rows;

describe('(a) a worker killed with SIGKILL mid-ingest', () => {
  it('the job is retried by another worker and every cast of the upload is stored exactly once', async () => {
    const M = 40;
    const env = serviceEnv(t.settings, { WORKER_CONCURRENCY: '1', JOB_EXPIRE_SECONDS: '20' });
    const a = spawnChild('worker-A', 'server/jobs/worker.ts', env);
    children.push(a);
    await a.waitForLog(/ingest.*workers? started/, 90_000);

    // a zip of many deep casts, so the ingest takes long enough to be caught in flight
    const zip = await zipBuffer(
      Array.from({ length: M }, (_, i) => ({
        name: `deep/k${String(i).padStart(2, '0')}.csv`,
        data: castCsv({
          station: `K${i}`,
          latitude: -30 - i * 0.2,
          longitude: -10 - i * 0.1,
          time: new Date(Date.UTC(2026, 2, 6, i)).toISOString(),
          maxP: 4000,
          step: 1,
          seed: 500 + i,
        }),
      })),
    );
    const tech = await agentFor(t.app, 'f-tech@example.test');
    const res = await tech.agent
      .post(`/api/cruises/${cruiseId}/uploads`)
      .set('x-csrf-token', tech.csrf)
      .attach('files', zip, 'deep-section.zip');
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const uploadId = res.body.uploads[0].id as string;

    // wait until worker A has the job and has parsed the zip (it is deriving the casts), then kill it without warning
    const end = Date.now() + 60_000;
    let st = await uploadState(uploadId);
    while (!(st.status === 'processing' && st.progress >= 0.3)) {
      if (Date.now() > end)
        throw new Error(`worker A never started the job: ${JSON.stringify(st)}\n${a.output().slice(-2000)}`);
      await sleep(20);
      st = await uploadState(uploadId);
    }
    a.proc.kill('SIGKILL');
    await a.exited;
    const atKill = await uploadState(uploadId);
    const castsAtKill = await Cast.count({ where: { uploadId } });
    console.log(
      `[faults] worker A (pid ${a.pid}) killed with the upload ${atKill.status} at progress ${atKill.progress}; casts stored at that moment: ${castsAtKill}`,
    );
    expect(atKill.status).toBe('processing');
    expect(castsAtKill).toBe(0); // killed in flight: the all-or-nothing transaction had not committed
    expect(a.output()).not.toMatch(/upload ingested/);
    expect((await jobsOf(uploadId)).map((j) => j.state)).toEqual(['active']);

    // another worker starts; the job expires, pg-boss retries it, worker B ingests it
    const b = spawnChild('worker-B', 'server/jobs/worker.ts', env);
    children.push(b);
    await b.waitForLog(/ingest.*workers? started/, 90_000);
    const t0 = Date.now();
    const end2 = Date.now() + 90_000;
    for (st = await uploadState(uploadId); st.status !== 'ready'; st = await uploadState(uploadId)) {
      if (st.status === 'failed' || Date.now() > end2)
        throw new Error(`upload ended ${JSON.stringify(st)}\n${b.output().slice(-3000)}`);
      await sleep(200);
    }
    console.log(
      `[faults] worker B (pid ${b.pid}) finished the retried job ${((Date.now() - t0) / 1000).toFixed(1)} s after it started`,
    );
    const casts = await db.query<{ station: string; source_file: string }>(
      'SELECT station, source_file FROM casts WHERE upload_id = $1',
      [uploadId],
    );
    expect(casts.rows).toHaveLength(M);
    expect(new Set(casts.rows.map((r) => r.source_file)).size).toBe(M);
    expect(new Set(casts.rows.map((r) => r.station)).size).toBe(M);
    const up = await Upload.findByPk(uploadId);
    expect(up!.castIds).toHaveLength(M);
    expect(new Set(up!.castIds).size).toBe(M);
    const colsPerCast = await db.query<{ n: string }>(
      'SELECT count(*) AS n FROM cast_columns c JOIN casts k ON k.id = c.cast_id WHERE k.upload_id = $1 GROUP BY c.cast_id',
      [uploadId],
    );
    expect(colsPerCast.rows).toHaveLength(M);
    expect(new Set(colsPerCast.rows.map((r) => r.n)).size).toBe(1); // every cast has the same full set of columns
    const jobs = await jobsOf(uploadId);
    expect(jobs).toHaveLength(1);
    expect(jobs[0].state).toBe('completed');
    expect(jobs[0].retry_count).toBeGreaterThanOrEqual(1);
    expect(b.logs().filter((l) => l.msg === 'upload ingested' && l.uploadId === uploadId)).toHaveLength(1);
    expect(await AuditEntry.count({ where: { entityId: uploadId, action: 'ingest' } })).toBe(1);
    await b.stop();
  }, 170_000);
});

describe('(b) PostgreSQL stopped and started under a running web process', () => {
  it('reads fail clearly while it is down (health 503 naming db, reads 503 db_unavailable) and the app recovers by itself', async () => {
    const own = startOwnPostgres();
    const pgc = await own;
    cleanups.push(() => pgc.destroy());
    const admin = new pg.Client({ connectionString: pgc.url('postgres') });
    await admin.connect();
    await admin.query('CREATE DATABASE sl_fault_restart');
    await admin.end();
    const dbUrl = pgc.url('sl_fault_restart');
    const port = await freePort();
    const web = spawnChild(
      'web-pg',
      'server/index.ts',
      serviceEnv({ ...t.settings, DATABASE_URL: dbUrl }, { PORT: String(port) }),
    );
    children.push(web);
    const base = `http://127.0.0.1:${port}`;
    await waitHttp(`${base}/api/health`, 90_000, web);

    // an account, a cruise and a membership, written straight into the private database
    const c = new pg.Client({ connectionString: dbUrl });
    await c.connect();
    const u = await c.query<{ id: string }>(
      "INSERT INTO users (id, email, name, password_hash, is_admin, created_at, updated_at) VALUES (gen_random_uuid(), 'pg-reader@example.test', 'Reader', $1, false, now(), now()) RETURNING id",
      [await hashPassword(PASSWORD)],
    );
    const cr = await c.query<{ id: string }>(
      "INSERT INTO cruises (id, name, ship, start_date, end_date, locked, settings, created_by, created_at, updated_at) VALUES (gen_random_uuid(), 'Restart', 'RV Restart', '2026-03-01', '2026-03-20', false, '{}', $1, now(), now()) RETURNING id",
      [u.rows[0].id],
    );
    await c.query(
      "INSERT INTO memberships (id, user_id, cruise_id, role, created_at, updated_at) VALUES (gen_random_uuid(), $1, $2, 'analyst', now(), now())",
      [u.rows[0].id, cr.rows[0].id],
    );
    await c.end();
    const id = cr.rows[0].id;

    const s = new Session(base);
    await s.signIn('pg-reader@example.test', PASSWORD);
    expect((await s.req('GET', `/api/cruises/${id}`)).body.name).toBe('Restart');

    // a reader polling all along
    const seen: { at: number; status: number | 'no answer' }[] = [];
    let reading = true;
    const reader = (async () => {
      while (reading) {
        try {
          seen.push({ at: Date.now(), status: (await s.req('GET', `/api/cruises/${id}`)).status });
        } catch {
          seen.push({ at: Date.now(), status: 'no answer' });
        }
        await sleep(50);
      }
    })();
    await sleep(500);

    pgc.stop('fast');
    const downAt = Date.now();
    const health = await fetch(`${base}/api/health`);
    const hb = (await health.json()) as { status: string; db: string; error: { code: string; message: string } };
    console.log(`[faults] with PostgreSQL down /api/health answered ${health.status} ${JSON.stringify(hb)}`);
    expect(health.status).toBe(503);
    expect(hb.db).toBe('down');
    expect(hb.error.message).toMatch(/\bdb\b/);
    const read = await s.req('GET', `/api/cruises/${id}`);
    console.log(
      `[faults] with PostgreSQL down GET /api/cruises/:id answered ${read.status} ${JSON.stringify(read.body)}`,
    );
    expect(read.status).toBe(503);
    expect(read.body.error.code).toBe('db_unavailable');
    expect(read.body.error.message).toMatch(/database is not reachable/);
    const list = await s.req('GET', '/api/cruises');
    expect(list.status).toBe(503);
    expect(list.body.error.code).toBe('db_unavailable');
    const anon = await fetch(`${base}/api/cruises`); // no session to load: the route itself needs the database
    expect([401, 503]).toContain(anon.status);
    await sleep(2000);
    expect(web.alive()).toBe(true);

    pgc.start();
    const upAt = Date.now();
    // recovers without restarting the web process: the same session reads the cruise again
    const end = Date.now() + 30_000;
    let back = await s.req('GET', `/api/cruises/${id}`);
    while (back.status !== 200) {
      if (Date.now() > end)
        throw new Error(`no recovery 30 s after restart: ${back.status} ${JSON.stringify(back.body)}`);
      await sleep(200);
      back = await s.req('GET', `/api/cruises/${id}`);
    }
    const recovered = Date.now();
    await sleep(1500);
    reading = false;
    await reader;
    expect(back.body.name).toBe('Restart');
    expect(web.alive()).toBe(true);
    const h2 = await waitHealthy(base, 20_000);
    expect(h2).toBe(200);
    const during = seen.filter((x) => x.at > downAt && x.at < upAt);
    const after = seen.filter((x) => x.at > recovered);
    console.log(
      `[faults] PostgreSQL down ${((upAt - downAt) / 1000).toFixed(1)} s; reads while down: ${during.length} (statuses ${[...new Set(during.map((x) => x.status))].join(', ')}); back to 200 ${((recovered - upAt) / 1000).toFixed(1)} s after restart`,
    );
    expect(seen.some((x) => x.status === 'no answer')).toBe(false); // the process always answered
    expect(during.length).toBeGreaterThan(0);
    expect(during.every((x) => x.status === 503)).toBe(true);
    expect(after.length).toBeGreaterThan(0);
    expect(after.every((x) => x.status === 200)).toBe(true);
    await web.stop();
  }, 170_000);
});

async function waitHealthy(base: string, ms: number) {
  const end = Date.now() + ms;
  for (;;) {
    const r = await fetch(`${base}/api/health`);
    if (r.status === 200 || Date.now() > end) return r.status;
    await sleep(250);
  }
}

describe('(c) the S3 fake stopped while an upload is on the wire', () => {
  it('answers 503 with a message, records nothing, and an upload works once S3 is back', async () => {
    const bucket = 'fault-outage';
    const s3 = await startOwnS3(bucket);
    cleanups.push(() => s3.destroy());
    const storage = createStorage({
      endpoint: s3.endpoint,
      bucket,
      region: t.settings.S3_REGION,
      accessKeyId: t.settings.S3_ACCESS_KEY_ID,
      secretAccessKey: t.settings.S3_SECRET_ACCESS_KEY,
    });
    const deps = { ...t.deps, storage };
    const app = createApp(deps, { staticDir: '/nonexistent' });
    const port = await freePort();
    const server: Server = await new Promise((resolve) => {
      const sv = app.listen(port, '127.0.0.1', () => resolve(sv));
    });
    cleanups.push(async () => {
      await new Promise((r) => server.close(r));
      await app.close();
    });
    await startWorkers(deps, { concurrency: 1 });
    const base = `http://127.0.0.1:${port}`;
    const s = new Session(base);
    await s.signIn('f-tech@example.test', PASSWORD);
    expect((await (await fetch(`${base}/api/health`)).json()).storage).toBe('ok');

    const uploadsBefore = await Upload.count({ where: { cruiseId } });
    const auditBefore = await AuditEntry.count({ where: { cruiseId, action: 'upload' } });
    const jobsBefore = Number((await db.query('SELECT count(*) AS n FROM pgboss.job')).rows[0].n);
    const csv = castCsv({ station: 'S3-OUT', latitude: -33, longitude: -18, maxP: 3000, step: 1, seed: 77 });
    const m = multipart([{ filename: 'outage.csv', data: csv }]);
    // send half the body, stop S3, then send the rest
    const res = await new Promise<{ status: number; body: { error: { code: string; message: string } } }>(
      (resolve, reject) => {
        const req = http.request(
          `${base}/api/cruises/${cruiseId}/uploads`,
          {
            method: 'POST',
            headers: {
              'content-type': m.contentType,
              'content-length': String(m.body.length),
              cookie: s.cookie!,
              'x-csrf-token': s.csrf!,
            },
          },
          (r) => {
            let text = '';
            r.on('data', (d) => {
              text += d;
            });
            r.on('end', () => resolve({ status: r.statusCode!, body: JSON.parse(text) }));
          },
        );
        req.on('error', reject);
        const half = Math.floor(m.body.length / 2);
        req.write(m.body.subarray(0, half));
        sleep(200)
          .then(() => s3.stop())
          .then(() => {
            req.end(m.body.subarray(half));
          }, reject);
      },
    );
    console.log(`[faults] upload with S3 stopped mid-request answered ${res.status} ${JSON.stringify(res.body)}`);
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('storage_unavailable');
    expect(res.body.error.message).toMatch(/storage/i);
    expect(res.body.error.message).toMatch(/outage\.csv/);
    expect(await Upload.count({ where: { cruiseId } })).toBe(uploadsBefore);
    expect(await AuditEntry.count({ where: { cruiseId, action: 'upload' } })).toBe(auditBefore);
    expect(Number((await db.query('SELECT count(*) AS n FROM pgboss.job')).rows[0].n)).toBe(jobsBefore);
    const h = await fetch(`${base}/api/health`);
    const hb = await h.json();
    expect(h.status).toBe(503);
    expect(hb.storage).toBe('down');
    expect(hb.error.message).toMatch(/storage/);

    await s3.start();
    expect(await waitHealthy(base, 20_000)).toBe(200);
    const again = await s.upload(cruiseId, [{ filename: 'outage.csv', data: csv }]);
    expect(again.status, JSON.stringify(again.body)).toBe(202);
    expect(again.body.uploads[0].duplicate).toBeUndefined();
    const id = again.body.uploads[0].id as string;
    const end = Date.now() + 60_000;
    let st = await uploadState(id);
    while (st.status !== 'ready') {
      if (st.status === 'failed' || Date.now() > end)
        throw new Error(`upload after S3 came back ended ${JSON.stringify(st)}`);
      await sleep(200);
      st = await uploadState(id);
    }
    const up = await Upload.findByPk(id);
    expect((await storage.get(up!.storageKey)).toString()).toBe(csv);
    expect(await Cast.count({ where: { uploadId: id } })).toBe(1);
    expect(await Upload.count({ where: { cruiseId, filename: 'outage.csv' } })).toBe(1);
    expect(up!.createdBy).toBe(techId);
    // and the app stays usable through supertest too
    expect((await request(app).get('/api/health')).status).toBe(200);
  }, 120_000);
});
