// Quality flags on a level range: technicians only, audited with before and after, and what
// depends on them is redone: the flagged spike stops raising an inversion warning and the section
// no longer uses the level.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
let castId: string;
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 1 });
  const chief = await createUser('f-chief@example.test');
  const c = await Cruise.create({
    name: 'Flags',
    ship: 'RV Flags',
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
  for (const role of ['technician', 'analyst'] as const) {
    const u = await createUser(`f-${role}@example.test`);
    await addMember(u.id, c.id, role);
    who[role] = await agentFor(t.app, u.email);
  }
  // a cast with one planted single-scan spike (invented demo file; a behaviour check)
  const res = await who.technician.agent
    .post(`/api/cruises/${cruiseId}/uploads`)
    .set('x-csrf-token', who.technician.csrf)
    .attach('files', join(process.cwd(), 'fixtures/demo/casts/CP-03.csv'));
  const done = await waitFor(async () => {
    const r = await who.technician.agent.get(`/api/uploads/${res.body.uploads[0].id}`);
    return r.body.status === 'ready' ? r.body : null;
  }, 60_000);
  castId = done.castIds[0];
}, 120_000);
afterAll(async () => {
  await t?.close();
});

describe('quality flags', () => {
  it('an analyst may not set flags (403) and a bad range is refused (400)', async () => {
    expect(
      (
        await who.analyst.agent
          .post(`/api/casts/${castId}/flags`)
          .set('x-csrf-token', who.analyst.csrf)
          .send({ variable: 'salinity', pFrom: 1200, pTo: 1206, flag: 4 })
      ).status,
    ).toBe(403);
    expect(
      (
        await who.technician.agent
          .post(`/api/casts/${castId}/flags`)
          .set('x-csrf-token', who.technician.csrf)
          .send({ variable: 'salinity', pFrom: 1206, pTo: 1200, flag: 4 })
      ).status,
    ).toBe(400);
    expect(
      (
        await who.technician.agent
          .post(`/api/casts/${castId}/flags`)
          .set('x-csrf-token', who.technician.csrf)
          .send({ variable: 'salinity', pFrom: 1200, pTo: 1206, flag: 7 })
      ).status,
    ).toBe(400);
  });
  it('flagging the spike bad removes its warning, is audited, and changes the section', async () => {
    const before = (await who.analyst.agent.get(`/api/casts/${castId}`)).body;
    expect(before.inversions).toHaveLength(1);
    const pSpike = before.inversions[0].pBottom;
    const sectionBefore = (
      await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'SA', bin: 2 })
    ).body;
    const res = await who.technician.agent
      .post(`/api/casts/${castId}/flags`)
      .set('x-csrf-token', who.technician.csrf)
      .send({ variable: 'salinity', pFrom: pSpike, pTo: pSpike, flag: 4, reason: 'conductivity cell spike' });
    expect(res.status).toBe(200);
    expect(res.body.levels).toBe(1);
    const after = (await who.analyst.agent.get(`/api/casts/${castId}`)).body;
    expect(after.inversions).toEqual([]);
    const i = after.columns.pressure.indexOf(pSpike);
    expect(after.flags.salinity[i]).toBe(4);
    expect(after.flags.salinity[i - 1]).toBe(2);
    const list = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body;
    expect(list[0].inversions).toBe(0);
    const sectionAfter = (
      await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'SA', bin: 2 })
    ).body;
    const iy = sectionBefore.grid.y.indexOf(pSpike);
    expect(sectionBefore.grid.z[iy][0]).toBeCloseTo(before.columns.SA[i], 12);
    expect(sectionAfter.grid.z[iy]?.[0] ?? null).not.toBe(sectionBefore.grid.z[iy][0]); // the bad level is no longer used
    const trail = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/audit`)).body;
    const entry = trail.find((a: { action: string }) => a.action === 'set_flag');
    expect(entry.before).toEqual({ flagsInRange: { salinity: [2] } });
    expect(entry.after).toMatchObject({ variable: 'salinity', flag: 4, levels: 1, reason: 'conductivity cell spike' });
  });
  it('re-running processing keeps the cast id and the flags a technician set', async () => {
    const cast = (await who.analyst.agent.get(`/api/casts/${castId}`)).body;
    const res = await who.technician.agent
      .post(`/api/uploads/${cast.uploadId}/reprocess`)
      .set('x-csrf-token', who.technician.csrf);
    expect(res.status).toBe(202);
    await waitFor(async () => {
      const r = await who.technician.agent.get(`/api/uploads/${cast.uploadId}`);
      return r.body.status === 'ready' ? r.body : null;
    }, 60_000);
    const again = (await who.analyst.agent.get(`/api/casts/${castId}`)).body;
    expect(again.flags.salinity).toEqual(cast.flags.salinity);
    expect(again.inversions).toEqual([]);
    expect(
      (await who.analyst.agent.post(`/api/uploads/${cast.uploadId}/reprocess`).set('x-csrf-token', who.analyst.csrf))
        .status,
    ).toBe(403);
  });
});
