// Cast intake end to end against the real services: multipart upload → object storage → pg-boss
// job → parsed, derived and stored casts; duplicates, bad files, size limit, storage outage.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readFileSync } from 'node:fs';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cast, CastColumn, Cruise, Upload } from '../../server/models/index';
import { sendEarly } from './early-answer';
import { multipart } from './fault-helpers';

let t: TestApp;
let cruiseId: string;
let tech: Awaited<ReturnType<typeof agentFor>>;
let analyst: Awaited<ReturnType<typeof agentFor>>;
const sample = (f: string) => join(process.cwd(), 'fixtures/samples', f);

beforeAll(async () => {
  t = await makeTestApp({ UPLOAD_MAX_BYTES: String(2 * 1024 * 1024) });
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('i-chief@example.test');
  const c = await Cruise.create({
    name: 'Intake',
    ship: 'RV Intake',
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
  const u = await createUser('i-tech@example.test');
  await addMember(u.id, c.id, 'technician');
  const a = await createUser('i-analyst@example.test');
  await addMember(a.id, c.id, 'analyst');
  tech = await agentFor(t.app, 'i-tech@example.test');
  analyst = await agentFor(t.app, 'i-analyst@example.test');
}, 120_000);
afterAll(async () => {
  await t?.close();
});

async function upload(files: string[], who = tech) {
  let req = who.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.csrf);
  for (const f of files) req = req.attach('files', f);
  return req;
}
const settled = (id: string) =>
  waitFor(async () => {
    const r = await tech.agent.get(`/api/uploads/${id}`);
    return r.body.status === 'ready' || r.body.status === 'failed' ? r.body : null;
  }, 60_000);

describe('intake', () => {
  it('takes a plain CSV to a ready cast with TEOS-10 columns and the raw bytes in object storage', async () => {
    const res = await upload([sample('plain.csv')]);
    expect(res.status).toBe(202);
    expect(res.body.uploads[0]).toMatchObject({ filename: 'plain.csv', status: 'queued' });
    const done = await settled(res.body.uploads[0].id);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
    expect(done.castIds).toHaveLength(1);
    const cast = (await analyst.agent.get(`/api/casts/${done.castIds[0]}`)).body;
    expect(cast.station).toBe(/# station: (.+)/.exec(readFileSync(sample('plain.csv'), 'utf8'))![1].trim());
    for (const k of ['pressure', 'temperature', 'SP', 'SA', 'CT', 'sigma0', 'sigma2'])
      expect(cast.columns[k]?.length, k).toBe(cast.levels);
    // common practice: open-ocean surface σ0 lies roughly between 20 and 27 kg/m³
    expect(cast.columns.sigma0[0]).toBeGreaterThan(20);
    expect(cast.columns.sigma0[0]).toBeLessThan(27);
    const up = await Upload.findByPk(done.id);
    expect((await t.deps.storage.get(up!.storageKey)).equals(readFileSync(sample('plain.csv')))).toBe(true);
    expect(up!.storageKey).toBe(`cruises/${cruiseId}/raw/${up!.sha256}`);
    const list = (await analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body;
    expect(list.map((c: { id: string }) => c.id)).toContain(done.castIds[0]);
  });
  it('recognises the same bytes uploaded again and stores no duplicate cast', async () => {
    const before = await Cast.count({ where: { cruiseId } });
    const res = await upload([sample('plain.csv')]);
    expect(res.status).toBe(202);
    expect(res.body.uploads[0].duplicate).toBe(true);
    expect(await Cast.count({ where: { cruiseId } })).toBe(before);
  });
  it('ingests a zip of several formats in one go', async () => {
    const res = await upload([sample('casts.zip')]);
    const done = await settled(res.body.uploads[0].id);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
    expect(done.castIds.length).toBeGreaterThan(1);
  });
  it('fails a bad file with file, line and column, and writes no cast', async () => {
    const before = await CastColumn.count();
    const dir = mkdtempSync(join(tmpdir(), 'sl-'));
    const bad = join(dir, 'bad-text.csv');
    writeFileSync(
      bad,
      '# station: 9\n# latitude: -30\n# longitude: -20\npressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]\n2,18.1,35.1\n4,eighteen,35.1\n',
    );
    const res = await upload([bad]);
    const done = await settled(res.body.uploads[0].id);
    expect(done.status).toBe('failed');
    expect(done.errors[0]).toMatchObject({ file: 'bad-text.csv', line: 6, column: 2 });
    expect(await CastColumn.count()).toBe(before);
  });
  it('answers 413 with a message for a file over the limit', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-'));
    const big = join(dir, 'big.csv');
    writeFileSync(big, Buffer.alloc(3 * 1024 * 1024, 65));
    const res = await upload([big]);
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/limit/);
  });
  it('a locked cruise takes no more uploads (409), and the lock is audited', async () => {
    const chief = await agentFor(t.app, 'i-chief@example.test');
    expect(
      (await chief.agent.patch(`/api/cruises/${cruiseId}`).set('x-csrf-token', chief.csrf).send({ locked: true })).body
        .locked,
    ).toBe(true);
    const res = await upload([sample('plain-tab.tsv')]);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('locked');
    expect(
      (await chief.agent.patch(`/api/cruises/${cruiseId}`).set('x-csrf-token', chief.csrf).send({ locked: false })).body
        .locked,
    ).toBe(false);
    const trail = (await chief.agent.get(`/api/cruises/${cruiseId}/audit`)).body as { action: string }[];
    expect(trail.map((a) => a.action)).toEqual(expect.arrayContaining(['lock', 'unlock']));
  });
  it('a technician of another cruise cannot upload here (404), an analyst here may not (403)', async () => {
    // The guard answers before the body is read; the client copes with the early answer (no EPIPE).
    const cookie = (who: typeof tech) =>
      (who.agent as unknown as { jar: { getCookies(o: object): { toValueString(): string }[] } }).jar
        .getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false })
        .map((c) => c.toValueString())
        .join('; ');
    const other = await createUser('i-other-tech@example.test');
    const otherCruise = await Cruise.create({
      name: 'Other',
      ship: 'RV Other',
      startDate: '2026-03-01',
      endDate: '2026-03-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: other.id,
    });
    await addMember(other.id, otherCruise.id, 'technician');
    const stranger = await agentFor(t.app, 'i-other-tech@example.test');
    // 8 MB: far more than the socket buffers, so the answer comes while the body is being written
    const { body, contentType } = multipart([{ filename: 'big.csv', data: Buffer.alloc(8 * 1024 * 1024, 65) }]);
    for (const [who, status] of [
      [analyst, 403],
      [stranger, 404],
    ] as const) {
      for (let i = 0; i < 3; i++) {
        const res = await sendEarly(
          t.app,
          'POST',
          `/api/cruises/${cruiseId}/uploads`,
          { cookie: cookie(who), 'x-csrf-token': who.csrf, 'content-type': contentType },
          body,
        );
        expect(res.status).toBe(status);
      }
    }
  });
});

describe('object storage down during an upload', () => {
  it('answers 503 with a message and records nothing', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-s3-'));
    const port = 46000 + Math.floor(Math.random() * 1000);
    const s3 = new S3rver({
      address: '127.0.0.1',
      port,
      silent: true,
      directory: dir,
      configureBuckets: [{ name: 'outage', configs: [] }],
    });
    await s3.run();
    const t2 = await makeTestApp({ S3_ENDPOINT: `http://127.0.0.1:${port}`, S3_BUCKET: 'outage' });
    try {
      const chief = await createUser('o-chief@example.test');
      const c = await Cruise.create({
        name: 'Outage',
        ship: 'RV Outage',
        startDate: '2026-03-01',
        endDate: '2026-03-20',
        portStart: null,
        portEnd: null,
        region: null,
        description: null,
        createdBy: chief.id,
      });
      await addMember(chief.id, c.id, 'chief_scientist');
      const a = await agentFor(t2.app, 'o-chief@example.test');
      expect((await t2.app) && (await a.agent.get('/api/health')).body.storage).toBe('ok');
      await s3.close();
      const res = await a.agent
        .post(`/api/cruises/${c.id}/uploads`)
        .set('x-csrf-token', a.csrf)
        .attach('files', sample('plain.csv'));
      expect(res.status).toBe(503);
      expect(res.body.error.message).toMatch(/storage/i);
      expect(await Upload.count({ where: { cruiseId: c.id } })).toBe(0);
      const health = await a.agent.get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body.storage).toBe('down');
    } finally {
      await t2.close();
    }
  }, 60_000);
});
