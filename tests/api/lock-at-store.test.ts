// An ingest queued before the cruise was locked stores nothing once it is locked (issue #14, item 5):
// the job checks the lock at store time, rolls back, and marks the upload failed with a clear message.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { Cast, Cruise, Upload } from '../../server/models/index';
import { ingestUpload, LOCKED_AT_STORE_MESSAGE } from '../../server/services/ingest';
import { closeComputePool } from '../../server/jobs/computePool';
import { castCsv } from './fault-helpers';

let t: TestApp;
beforeAll(async () => {
  t = await makeTestApp();
}, 120_000);
afterAll(async () => {
  await closeComputePool();
  await t?.close();
}, 60_000);

describe('the lock at store time', () => {
  it('an upload queued before the lock stores no cast and says why', async () => {
    const chief = await createUser(`las-chief-${Date.now()}@example.test`);
    const c = await Cruise.create({
      name: 'Lock at store',
      ship: 'RV Probe',
      startDate: '2026-04-01',
      endDate: '2026-04-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: chief.id,
    });
    await addMember(chief.id, c.id, 'chief_scientist');
    const a = await agentFor(t.app, chief.email);
    // no worker runs: the upload stays queued
    const res = await a.agent
      .post(`/api/cruises/${c.id}/uploads`)
      .set('x-csrf-token', a.csrf)
      .attach('files', Buffer.from(castCsv({ station: 'LS1', latitude: -40, longitude: -20 })), 'st1.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const id = res.body.uploads[0].id as string;
    expect((await Upload.findByPk(id))!.status).toBe('queued');
    const lock = await a.agent.patch(`/api/cruises/${c.id}`).set('x-csrf-token', a.csrf).send({ locked: true });
    expect(lock.status).toBe(200);
    // the job runs after the lock
    await ingestUpload(t.deps, id);
    const u = (await Upload.findByPk(id))!;
    expect(u.status).toBe('failed');
    expect(u.errors).toEqual([expect.objectContaining({ code: 'cruise_locked', message: LOCKED_AT_STORE_MESSAGE })]);
    expect(await Cast.count({ where: { cruiseId: c.id } })).toBe(0);
    // unlocked, the same upload stores its cast
    expect(
      (await a.agent.patch(`/api/cruises/${c.id}`).set('x-csrf-token', a.csrf).send({ locked: false })).status,
    ).toBe(200);
    await ingestUpload(t.deps, id);
    expect((await Upload.findByPk(id))!.status).toBe('ready');
    expect(await Cast.count({ where: { cruiseId: c.id } })).toBe(1);
  });
});
