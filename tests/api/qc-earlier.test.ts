// The cast sheet's comparison with the previous occupation, and reopening proposals, through the HTTP API.
// Invented demo casts (a behaviour check, not a reference): fixtures/demo-earlier (TS-16-02, 2016) and
// fixtures/demo (TS-26-04, 2026) occupy the same invented line; CP-05_ct1 of the later cruise carries the
// section identifier CORROW that every earlier cast carries, so the two default lines are occupations of one line
// (docs/occupations.md). CP-03 of the later cruise has one planted salinity spike at 1204 dbar (a proposal).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';
import { greatCircleKm } from '../../shared/section/distance';

let t: TestApp;
const ids: Record<string, string> = {};
const castOf: Record<string, Record<string, string>> = { earlier: {}, later: {} };
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};

async function ingest(cruiseId: string, dir: string, files: string[], into: Record<string, string>) {
  const up = who.tech.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.tech.csrf);
  for (const f of files) up.attach('files', join(process.cwd(), dir, f));
  const res = await up;
  expect(res.status).toBe(202);
  for (const u of res.body.uploads) {
    const done = await waitFor(async () => {
      const r = await who.tech.agent.get(`/api/uploads/${u.id}`);
      return r.body.status === 'ready' ? r.body : null;
    }, 120_000);
    const cast = (await who.tech.agent.get(`/api/casts/${done.castIds[0]}`)).body;
    into[cast.station] = cast.id;
  }
}

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 1 });
  const tech = await createUser('e-tech@example.test', { name: 'E technician' });
  const laterOnly = await createUser('e-later-only@example.test');
  const analyst = await createUser('e-analyst@example.test');
  const mk = (name: string, start: string) =>
    Cruise.create({
      name,
      ship: 'RV Tessellate',
      startDate: start,
      endDate: start,
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: tech.id,
    });
  const a = await mk('TS-16-02', '2016-03-01');
  const b = await mk('TS-26-04', '2026-03-01');
  ids.earlier = a.id;
  ids.later = b.id;
  for (const c of [a, b]) {
    await addMember(tech.id, c.id, 'technician');
    await addMember(analyst.id, c.id, 'analyst');
  }
  await addMember(laterOnly.id, b.id, 'technician');
  who.tech = await agentFor(t.app, tech.email);
  who.laterOnly = await agentFor(t.app, laterOnly.email);
  who.analyst = await agentFor(t.app, analyst.email);
  await ingest(a.id, 'fixtures/demo-earlier/casts', ['CP-03.csv', 'CP-04.csv', 'CP-05.csv'], castOf.earlier);
  await ingest(b.id, 'fixtures/demo/casts', ['CP-03.csv', 'CP-04.csv', 'CP-05_ct1.csv'], castOf.later);
}, 300_000);
afterAll(async () => {
  await t?.close();
});

const post = (path: string, body: object, a = who.tech) =>
  a.agent.post(`/api${path}`).set('x-csrf-token', a.csrf).send(body);
const get = (path: string, a = who.tech) => a.agent.get(`/api${path}`);

type Earlier = {
  cruise: string;
  startDate: string;
  line: string;
  why: string[];
  partner: {
    id: string;
    station: string;
    time: string | null;
    offsetKm: number;
    columns: Record<string, (number | null)[]>;
  } | null;
  note: string | null;
};

describe('the earlier occupation beside the neighbours', () => {
  it('a cast of the demo line has its TS-16-02 partner, the same station then, with its own columns', async () => {
    const res = await get(`/casts/${castOf.later['CP-04']}/neighbours`);
    expect(res.status).toBe(200);
    expect(res.body.neighbours.map((n: { station: string }) => n.station)).toEqual(['CP-03', 'CP-05']);
    expect(res.body.pairDistanceKm).toBe(20);
    const earlier = res.body.earlier as Earlier[];
    expect(earlier).toHaveLength(1);
    const e = earlier[0];
    expect(e).toMatchObject({ cruise: 'TS-16-02', startDate: '2016-03-01', line: 'All stations' });
    expect(e.why).toContain('same section identifier');
    expect(e.partner?.station).toBe('CP-04');
    expect(e.partner?.id).toBe(castOf.earlier['CP-04']);
    expect(e.partner?.time?.slice(0, 4)).toBe('2016');
    // the distance is the great circle between the two casts' positions (their file headers)
    const here = (await get(`/casts/${castOf.later['CP-04']}`)).body;
    const then = (await get(`/casts/${castOf.earlier['CP-04']}`)).body;
    const km = greatCircleKm(here.longitude, here.latitude, then.longitude, then.latitude);
    expect(e.partner!.offsetKm).toBeCloseTo(km, 2);
    expect(e.partner!.offsetKm).toBeLessThan(20);
    // the overlay is the earlier cast's own profile, level for level
    expect(e.partner!.columns.pressure).toEqual(then.columns.pressure);
    expect(e.partner!.columns.temperature).toEqual(then.columns.temperature);
    expect(e.partner!.columns.CT).toEqual(then.columns.CT);
  });

  it('a user who is not in the earlier cruise gets no overlay (and the earlier cruise stays hidden)', async () => {
    const res = await get(`/casts/${castOf.later['CP-04']}/neighbours`, who.laterOnly);
    expect(res.status).toBe(200);
    expect(res.body.neighbours).toHaveLength(2);
    expect(res.body.earlier).toEqual([]);
    expect(JSON.stringify(res.body)).not.toContain('TS-16-02');
    expect((await get(`/casts/${castOf.earlier['CP-04']}`, who.laterOnly)).status).toBe(404);
  });

  it('the earlier cruise has no earlier occupation of its own (the later one is not "earlier")', async () => {
    const res = await get(`/casts/${castOf.earlier['CP-04']}/neighbours`);
    expect(res.status).toBe(200);
    expect(res.body.earlier).toEqual([]);
  });

  it('beyond the pairing distance there is no partner, and the answer says why; bad distances are refused', async () => {
    const res = await get(`/casts/${castOf.later['CP-04']}/neighbours?pairKm=0.01`);
    expect(res.status).toBe(200);
    const e = (res.body.earlier as Earlier[])[0];
    expect(e.partner).toBeNull();
    expect(e.note).toMatch(/No station of TS-16-02 within 0\.01 km \(the nearest, CP-04, is \d+\.\d km away\)/);
    for (const bad of ['0', '-3', '501', 'far'])
      expect((await get(`/casts/${castOf.later['CP-04']}/neighbours?pairKm=${bad}`)).status).toBe(400);
  });

  it('follow the line the user chose: its neighbours, and its own occupations', async () => {
    const mine = await post(
      `/cruises/${ids.later}/lines`,
      { name: 'Corrow short', stations: ['CP-05', 'CP-04', 'CP-03'] },
      who.analyst,
    );
    expect(mine.status).toBe(201);
    let res = await get(`/casts/${castOf.later['CP-04']}/neighbours?line=${mine.body.id}`);
    expect(res.body.order).toBe('the line “Corrow short”');
    expect(res.body.neighbours.map((n: { role: string; station: string }) => [n.role, n.station])).toEqual([
      ['previous', 'CP-05'],
      ['next', 'CP-03'],
    ]);
    // no line of that name in the earlier cruise yet: no earlier occupation of this line
    expect(res.body.earlier).toEqual([]);
    const then = await post(
      `/cruises/${ids.earlier}/lines`,
      { name: 'Corrow short', stations: ['CP-03', 'CP-04'] },
      who.analyst,
    );
    expect(then.status).toBe(201);
    res = await get(`/casts/${castOf.later['CP-04']}/neighbours?line=${mine.body.id}`);
    const e = (res.body.earlier as Earlier[])[0];
    expect(e).toMatchObject({ cruise: 'TS-16-02', line: 'Corrow short' });
    expect(e.why).toContain('same name');
    expect(e.partner?.station).toBe('CP-04');
    // a line of another cruise is not this cast's line
    expect((await get(`/casts/${castOf.later['CP-04']}/neighbours?line=${then.body.id}`)).status).toBe(404);
  });
});

describe('reopening proposals', () => {
  const castId = () => castOf.later['CP-03'];
  const proposal = async () => (await get(`/casts/${castId()}/qc`)).body.proposals[0];

  it('a rejected proposal is reopened (pending again), audited; only technicians and the chief scientist may', async () => {
    const p = await proposal();
    expect(p).toMatchObject({ test: 'density_inversion', pFrom: 1204, status: 'pending', flagChangeId: null });
    // a pending proposal is not reopened
    expect((await post(`/casts/${castId()}/qc/reopen`, { ids: [p.id] })).status).toBe(400);
    expect((await post(`/casts/${castId()}/qc/decisions`, { ids: [p.id], decision: 'reject' })).status).toBe(200);
    expect((await proposal()).status).toBe('rejected');
    expect((await get(`/cruises/${ids.later}/qc/pending`)).body).toEqual([]);
    expect((await post(`/casts/${castId()}/qc/reopen`, { ids: [p.id] }, who.analyst)).status).toBe(403);
    expect((await post(`/casts/${castId()}/qc/reopen`, {})).status).toBe(400);
    expect((await post(`/casts/${castId()}/qc/reopen`, { ids: ['nope'] })).status).toBe(400);
    const res = await post(`/casts/${castId()}/qc/reopen`, { ids: [p.id], reason: 'second look: a cell lag' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ reopened: 1 });
    expect(await proposal()).toMatchObject({ id: p.id, status: 'pending', decidedAt: null });
    expect((await get(`/cruises/${ids.later}/qc/pending`)).body).toEqual([{ castId: castId(), pending: 1 }]);
    // the flags did not move: a rejection set none, a reopening sets none
    expect((await get(`/casts/${castId()}/flag-log`)).body).toEqual([]);
    const trail = (await get(`/cruises/${ids.later}/audit`)).body as {
      action: string;
      entityId: string;
      before: Record<string, unknown>;
      after: Record<string, unknown>;
    }[];
    const reopen = trail.find((a) => a.action === 'qc_reopen');
    expect(reopen).toMatchObject({
      entityId: p.id,
      before: { status: 'rejected' },
      after: { status: 'pending', test: 'density_inversion', reason: 'second look: a cell lag' },
    });
    expect(reopen!.before.decidedAt).toEqual(expect.any(String));
  });

  it('by test: every rejected proposal of the test; nothing to reopen is no error', async () => {
    expect(
      (await post(`/casts/${castId()}/qc/decisions`, { test: 'density_inversion', decision: 'reject' })).status,
    ).toBe(200);
    expect((await post(`/casts/${castId()}/qc/reopen`, { test: 'density_inversion' })).body).toEqual({ reopened: 1 });
    expect((await post(`/casts/${castId()}/qc/reopen`, { test: 'density_inversion' })).body).toEqual({ reopened: 0 });
    expect((await proposal()).status).toBe('pending');
  });

  it('an accepted proposal is not reopened here (409 names its flag-log entry); undoing that entry reopens it', async () => {
    const p = await proposal();
    expect((await post(`/casts/${castId()}/qc/decisions`, { ids: [p.id], decision: 'accept' })).status).toBe(200);
    const accepted = await proposal();
    expect(accepted.status).toBe('accepted');
    expect(accepted.flagChangeId).toMatch(/^\d+$/);
    const refused = await post(`/casts/${castId()}/qc/reopen`, { ids: [p.id] });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain(`#${accepted.flagChangeId}`);
    expect((await post(`/casts/${castId()}/flag-log/undo`, { changeId: accepted.flagChangeId })).status).toBe(200);
    expect(await proposal()).toMatchObject({ status: 'pending', flagChangeId: null });
  });
});
