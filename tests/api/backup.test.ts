// Backups as README.md documents them: pg_dump -Fc of a database holding a cruise with casts,
// pg_restore --no-owner into a fresh database, the original dropped, and an app built on the
// restored database reads the cruise, its uploads, casts (every column) and audit trail back
// identical; the queue schema comes back working too.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import {
  makeTestApp,
  createUser,
  addMember,
  agentFor,
  createDatabase,
  dropDatabase,
  waitFor,
  PASSWORD,
  type TestApp,
} from './helpers';
import { Cruise } from '../../server/models/index';
import { createApp, type App } from '../../server/app';
import { connectServices } from '../../server/services/index';
import { loadSettings } from '../../server/config';
import { startWorkers } from '../../server/jobs/worker';
import { castCsv, runAsPostgres, zipBuffer } from './fault-helpers';

let t: TestApp | null = null;
let restoredUrl = '';
let restored: { app: App; close(): Promise<void> } | null = null;
const dir = mkdtempSync(join(tmpdir(), 'sl-backup-'));
chmodSync(dir, 0o777);

afterAll(async () => {
  await restored?.close().catch(() => undefined);
  await t?.close().catch(() => undefined);
  if (restoredUrl) await dropDatabase(restoredUrl);
  rmSync(dir, { recursive: true, force: true });
}, 60_000);

type Snapshot = Record<string, unknown>;
async function snapshot(app: App, cruiseId: string, email: string): Promise<Snapshot> {
  const a = await agentFor(app, email);
  const get = async (p: string) => {
    const r = await a.agent.get(p);
    expect(r.status, p).toBe(200);
    return r.body;
  };
  const casts = await get(`/api/cruises/${cruiseId}/casts`);
  const out: Snapshot = {
    cruise: await get(`/api/cruises/${cruiseId}`),
    members: await get(`/api/cruises/${cruiseId}/members`),
    stations: await get(`/api/cruises/${cruiseId}/stations`),
    uploads: await get(`/api/cruises/${cruiseId}/uploads`),
    layerSets: await get(`/api/cruises/${cruiseId}/layer-sets`),
    audit: await get(`/api/cruises/${cruiseId}/audit`),
    casts,
  };
  for (const c of casts as { id: string }[]) out[`cast ${c.id}`] = await get(`/api/casts/${c.id}`);
  return out;
}

describe('pg_dump / pg_restore', () => {
  let cruiseId = '';
  let original: Snapshot = {};
  let storageKey = '';
  beforeAll(async () => {
    t = await makeTestApp();
    await startWorkers(t.deps, { concurrency: 2 });
    const chief = await createUser('bk-chief@example.test');
    const c = await Cruise.create({
      name: 'Backup line',
      ship: 'RV Restore',
      startDate: '2026-04-01',
      endDate: '2026-04-12',
      portStart: 'Port A',
      portEnd: 'Port B',
      region: 'South Atlantic',
      description: 'invented',
      createdBy: chief.id,
    });
    cruiseId = c.id;
    await addMember(chief.id, c.id, 'chief_scientist');
    const tech = await createUser('bk-tech@example.test');
    await addMember(tech.id, c.id, 'technician');
    const a = await agentFor(t.app, 'bk-tech@example.test');
    const zip = await zipBuffer(
      Array.from({ length: 4 }, (_, i) => ({
        name: `bk${i}.csv`,
        data: castCsv({
          station: `BK${i}`,
          latitude: -36 + i * 0.5,
          longitude: -22 + i * 0.4,
          time: new Date(Date.UTC(2026, 3, 2, i * 6)).toISOString(),
          maxP: 2500,
          step: 1,
          seed: 300 + i,
        }),
      })),
    );
    const up = await a.agent
      .post(`/api/cruises/${cruiseId}/uploads`)
      .set('x-csrf-token', a.csrf)
      .attach('files', zip, 'backup-line.zip');
    expect(up.status).toBe(202);
    const done = await waitFor(async () => {
      const r = await a.agent.get(`/api/uploads/${up.body.uploads[0].id}`);
      return r.body.status !== 'queued' && r.body.status !== 'processing' ? r.body : null;
    }, 60_000);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
    const ch = await agentFor(t.app, 'bk-chief@example.test');
    expect(
      (
        await ch.agent
          .post(`/api/cruises/${cruiseId}/layer-sets`)
          .set('x-csrf-token', ch.csrf)
          .send({ name: 'Thermocline', referencePressure: 0, levels: '25.0:0.2:27.0' })
      ).status,
    ).toBe(201);
    original = await snapshot(t.app, cruiseId, 'bk-chief@example.test');
    storageKey = (original.uploads as { id: string }[]).length
      ? `cruises/${cruiseId}/raw/${(original.uploads as { sha256: string }[])[0].sha256}`
      : '';
  }, 120_000);

  it('restores into a fresh database and reads the cruise and every cast back identical', async () => {
    expect(Object.keys(original).filter((k) => k.startsWith('cast ')).length).toBe(4);
    const src = new URL(t!.databaseUrl);
    const dump = join(dir, 'sigmaline.dump');
    const t0 = Date.now();
    runAsPostgres('pg_dump', [
      '-h',
      src.hostname,
      '-p',
      src.port,
      '-U',
      'postgres',
      '-Fc',
      '-f',
      dump,
      src.pathname.slice(1),
    ]);
    const dumpMs = Date.now() - t0;
    const size = statSync(dump).size;
    expect(size).toBeGreaterThan(100_000); // 4 casts × 2500 levels × ~20 columns of float64 are in it

    restoredUrl = await createDatabase();
    const t1 = Date.now();
    // exactly as README.md says: pg_restore -d "$NEW_DATABASE_URL" --no-owner sigmaline.dump
    execFileSync(
      `${process.env.PG_BIN ?? '/usr/lib/postgresql/15/bin'}/pg_restore`,
      ['-d', restoredUrl, '--no-owner', '--exit-on-error', dump],
      { stdio: ['ignore', 'pipe', 'pipe'] },
    );
    const restoreMs = Date.now() - t1;
    console.log(`[backup] pg_dump ${dumpMs} ms (${(size / 1024).toFixed(0)} KiB), pg_restore ${restoreMs} ms`);

    // the original goes away, so whatever is read next can only come from the restored copy
    const bucket = t!.settings.S3_BUCKET;
    await t!.close();
    t = null;

    const settings = loadSettings({ ...process.env, NODE_ENV: 'test', DATABASE_URL: restoredUrl, S3_BUCKET: bucket });
    const deps = await connectServices(settings, { poolMax: 5 });
    const app = createApp(deps, { staticDir: '/nonexistent' });
    restored = {
      app,
      async close() {
        await app.close();
        await deps.close();
      },
    };
    expect((await request(app).get('/api/health')).body).toEqual({
      status: 'ok',
      db: 'ok',
      storage: 'ok',
      queue: 'ok',
    });
    const back = await snapshot(app, cruiseId, 'bk-chief@example.test'); // the password hash came back too
    // the audit trail grows by nothing from reading; compare everything
    expect(Object.keys(back).sort()).toEqual(Object.keys(original).sort());
    for (const k of Object.keys(original)) expect(back[k], k).toEqual(original[k]);
    // the raw file the restored rows point at is still in object storage
    expect(await deps.storage.exists(storageKey)).toBe(true);

    // and the restored database takes new work: the queue schema came back working
    await startWorkers(deps, { concurrency: 1 });
    const a = await agentFor(app, 'bk-tech@example.test', PASSWORD);
    const up = await a.agent
      .post(`/api/cruises/${cruiseId}/uploads`)
      .set('x-csrf-token', a.csrf)
      .attach('files', Buffer.from(castCsv({ station: 'BK-AFTER', maxP: 500, seed: 999 })), 'after-restore.csv');
    expect(up.status).toBe(202);
    const done = await waitFor(async () => {
      const r = await a.agent.get(`/api/uploads/${up.body.uploads[0].id}`);
      return r.body.status === 'ready' || r.body.status === 'failed' ? r.body : null;
    }, 60_000);
    expect(done.status).toBe('ready');
    expect((await a.agent.get(`/api/cruises/${cruiseId}/casts`)).body).toHaveLength(5);
  }, 120_000);
});
