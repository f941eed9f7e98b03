// The history of a cast through the API: each version with its file, who uploaded it and when, and for
// each replacement the flagged levels carried over from the earlier version and those listed as not
// carried (levels the corrected file lacks). Invented cast files; no real data here.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';
import { castHistoryResponseSchema } from '../../shared/api/castHistory';

let t: TestApp;
let cruiseId: string;
let tech: Awaited<ReturnType<typeof agentFor>>;
let pi: Awaited<ReturnType<typeof agentFor>>;
const dir = mkdtempSync(join(tmpdir(), 'sl-history-'));

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const c = await createUser('h-chief@example.test');
  const cr = await Cruise.create({
    name: 'History',
    ship: 'RV History',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: c.id,
  });
  cruiseId = cr.id;
  await addMember(c.id, cr.id, 'chief_scientist');
  const u = await createUser('h-tech@example.test', { name: 'Tess Tech' });
  await addMember(u.id, cr.id, 'technician');
  const p = await createUser('h-pi@example.test');
  await addMember(p.id, cr.id, 'pi');
  tech = await agentFor(t.app, 'h-tech@example.test');
  pi = await agentFor(t.app, 'h-pi@example.test');
}, 120_000);
afterAll(async () => {
  await t?.close();
});

/** An invented cast of station H1, 2–200 dbar every 2 dbar; `skip` leaves levels out. */
function castFile(name: string, o: { skip?: number[]; warm?: number } = {}): string {
  const lines = [
    '# station: H1',
    '# cast: 1',
    '# latitude: -30.5',
    '# longitude: -20.25',
    '# time: 2026-03-04T05:00:00Z',
    'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]',
  ];
  for (let p = 2; p <= 200; p += 2) {
    if (o.skip?.includes(p)) continue;
    const tt = 4 + 16 * Math.exp(-p / 300) + (o.warm ?? 0);
    lines.push(`${p},${tt.toFixed(4)},${(34.6 + Math.exp(-p / 250)).toFixed(4)}`);
  }
  const f = join(dir, name);
  writeFileSync(f, lines.join('\n') + '\n');
  return f;
}
const post = (path: string, body: object = {}) => tech.agent.post(path).set('x-csrf-token', tech.csrf).send(body);
async function uploadSettled(file: string) {
  const r = await tech.agent
    .post(`/api/cruises/${cruiseId}/uploads`)
    .set('x-csrf-token', tech.csrf)
    .attach('files', file);
  expect(r.status).toBe(202);
  const id = r.body.uploads[0].id as string;
  const settle = () =>
    waitFor(async () => {
      const u = await tech.agent.get(`/api/uploads/${id}`);
      return ['ready', 'failed', 'awaiting_decision'].includes(u.body.status) ? u.body : null;
    }, 60_000);
  let u = await settle();
  if (u.status === 'awaiting_decision') {
    expect((await post(`/api/uploads/${id}/replace-decision`, { replace: true })).status).toBe(202);
    u = await settle();
  }
  expect(u.status, JSON.stringify(u.errors)).toBe('ready');
  return u.castIds[0] as string;
}

describe('cast history', () => {
  it('lists every version with who, when, which file, and the flags each replacement carried or listed', async () => {
    const v1 = await uploadSettled(castFile('H1-a.csv'));
    const first = castHistoryResponseSchema.parse((await pi.agent.get(`/api/casts/${v1}/history`)).body);
    expect(first.versions).toHaveLength(1);
    expect(first.versions[0].replacement).toBeNull();
    // the technician flags 10–20 dbar of the temperature questionable (3): 6 levels, 10, 12, …, 20
    expect(
      (await post(`/api/casts/${v1}/flags`, { variable: 'temperature', pFrom: 10, pTo: 20, flag: 3 })).status,
    ).toBe(200);
    // the corrected file lacks 12 and 14 dbar: 4 levels carried, 2 listed
    const v2 = await uploadSettled(castFile('H1-b.csv', { warm: 0.01, skip: [12, 14] }));
    // a third file with every level: the flags carried onto v2 come over again (4; 12 and 14 are not flagged on v2)
    const v3 = await uploadSettled(castFile('H1-c.csv', { warm: 0.02 }));
    const r = await pi.agent.get(`/api/casts/${v3}/history`);
    expect(r.status).toBe(200);
    const h = castHistoryResponseSchema.parse(r.body);
    expect(h.station).toBe('H1');
    expect(h.versions.map((v) => [v.id, v.uploadFile, v.live])).toEqual([
      [v1, 'H1-a.csv', false],
      [v2, 'H1-b.csv', false],
      [v3, 'H1-c.csv', true],
    ]);
    expect(h.versions.map((v) => v.uploadedBy?.name)).toEqual(['Tess Tech', 'Tess Tech', 'Tess Tech']);
    expect(h.versions[0].supersededBy).toBe(v2);
    expect(h.versions[1].supersededBy).toBe(v3);
    const [, b, c] = h.versions;
    expect(b.replacement).toMatchObject({
      replacedCastId: v1,
      replacedFile: 'H1-a.csv',
      flagsCarried: 4,
      notCarriedCount: 2,
    });
    expect(b.replacement!.notCarried).toEqual([
      { variable: 'temperature', pressure: 12, flag: 3 },
      { variable: 'temperature', pressure: 14, flag: 3 },
    ]);
    expect(c.replacement).toMatchObject({ replacedCastId: v2, replacedFile: 'H1-b.csv', notCarriedCount: 0 });
    // the carried edit (10–20 dbar) is set again on v3, where every level of 10–20 that v2 had exists: 4
    expect(c.replacement!.flagsCarried).toBe(4);
    // the history is the same asked from any version
    expect(castHistoryResponseSchema.parse((await pi.agent.get(`/api/casts/${v1}/history`)).body)).toEqual(h);
  });
});
