// The QC desk through the API: proposals computed at intake, decided one by one or by test (technicians only,
// audited), the flag log with undo (refused while a later change covers the same levels), and the neighbours.
// Invented demo casts (fixtures/demo: a behaviour check, not a reference): CP-03 has one planted salinity spike
// at 1204 dbar, CP-02 and CP-04 are stable.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
const castOf: Record<string, string> = {};
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 1 });
  const chief = await createUser('q-chief@example.test');
  const c = await Cruise.create({
    name: 'QC',
    ship: 'RV QC',
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
    const u = await createUser(`q-${role}@example.test`, { name: `Q ${role}` });
    await addMember(u.id, c.id, role);
    who[role] = await agentFor(t.app, u.email);
  }
  const up = who.technician.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.technician.csrf);
  for (const s of ['CP-02', 'CP-03', 'CP-04']) up.attach('files', join(process.cwd(), `fixtures/demo/casts/${s}.csv`));
  const res = await up;
  for (const u of res.body.uploads) {
    const done = await waitFor(async () => {
      const r = await who.technician.agent.get(`/api/uploads/${u.id}`);
      return r.body.status === 'ready' ? r.body : null;
    }, 90_000);
    const cast = (await who.analyst.agent.get(`/api/casts/${done.castIds[0]}`)).body;
    castOf[cast.station] = cast.id;
  }
}, 180_000);
afterAll(async () => {
  await t?.close();
});

const tech = () => who.technician;
const post = (path: string, body: object, a = tech()) =>
  a.agent.post(`/api${path}`).set('x-csrf-token', a.csrf).send(body);
const get = (path: string) => who.analyst.agent.get(`/api${path}`);

describe('proposals', () => {
  it('are computed at intake: the planted spike is proposed, the stable casts have none', async () => {
    const qc = (await get(`/casts/${castOf['CP-03']}/qc`)).body;
    expect(qc.proposals).toHaveLength(1);
    expect(qc.proposals[0]).toMatchObject({
      test: 'density_inversion',
      variable: 'salinity',
      pFrom: 1204,
      pTo: 1204,
      flag: 3,
      status: 'pending',
    });
    expect(qc.intakeInversions).toHaveLength(1);
    expect(qc.tests.map((x: { id: string }) => x.id)).toContain('spike');
    expect((await get(`/casts/${castOf['CP-02']}/qc`)).body.proposals).toEqual([]);
    expect((await get(`/casts/${castOf['CP-04']}/qc`)).body.proposals).toEqual([]);
    const pending = (await get(`/cruises/${cruiseId}/qc/pending`)).body;
    expect(pending).toEqual([{ castId: castOf['CP-03'], pending: 1 }]);
  });

  it('an analyst may not decide (403); a decision without a choice is refused (400)', async () => {
    const id = (await get(`/casts/${castOf['CP-03']}/qc`)).body.proposals[0].id;
    expect(
      (await post(`/casts/${castOf['CP-03']}/qc/decisions`, { ids: [id], decision: 'accept' }, who.analyst)).status,
    ).toBe(403);
    const bad = await post(`/casts/${castOf['CP-03']}/qc/decisions`, { decision: 'accept' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation');
    expect(
      (await post(`/casts/${castOf['CP-03']}/qc/decisions`, { test: 'nonsense', decision: 'accept' })).status,
    ).toBe(400);
  });

  it('accepting sets the proposed flag (silencing the inversion), logs it, audits it; undo brings it back to pending', async () => {
    const castId = castOf['CP-03'];
    const id = (await get(`/casts/${castId}/qc`)).body.proposals[0].id;
    const res = await post(`/casts/${castId}/qc/decisions`, { ids: [id], decision: 'accept' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ decided: 1, levels: 1 });
    const cast = (await get(`/casts/${castId}`)).body;
    const i = cast.columns.pressure.indexOf(1204);
    expect(cast.flags.salinity[i]).toBe(3);
    expect(cast.flags.salinity[i - 1]).toBe(2);
    expect(cast.inversions).toEqual([]);
    const qc = (await get(`/casts/${castId}/qc`)).body;
    expect(qc.proposals[0].status).toBe('accepted');
    expect(qc.intakeInversions).toHaveLength(1); // what intake found is kept
    expect((await post(`/casts/${castId}/qc/decisions`, { ids: [id], decision: 'reject' })).status).toBe(400); // not pending any more

    const log = (await get(`/casts/${castId}/flag-log`)).body;
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({
      who: 'Q technician',
      variable: 'salinity',
      pFrom: 1204,
      pTo: 1204,
      levels: 1,
      from: { salinity: [2] },
      to: 3,
      source: 'proposal',
      proposalId: id,
      undoable: true,
    });
    expect(log[0].reason).toMatch(/density inversion/);

    const trail = (await get(`/cruises/${cruiseId}/audit`)).body as {
      action: string;
      entityId: string;
      after: Record<string, unknown>;
    }[];
    expect(trail.find((a) => a.action === 'qc_accept')).toMatchObject({
      entityId: id,
      after: { status: 'accepted', test: 'density_inversion' },
    });
    expect(trail.find((a) => a.action === 'set_flag')).toMatchObject({ after: { proposal: id, flag: 3, levels: 1 } });

    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: log[0].id }, who.analyst)).status).toBe(403);
    const undo = await post(`/casts/${castId}/flag-log/undo`, { changeId: log[0].id });
    expect(undo.status).toBe(200);
    expect(undo.body.levels).toBe(1);
    const back = (await get(`/casts/${castId}`)).body;
    expect(back.flags.salinity[i]).toBe(2);
    expect(back.inversions).toHaveLength(1);
    expect((await get(`/casts/${castId}/qc`)).body.proposals[0].status).toBe('pending');
    const log2 = (await get(`/casts/${castId}/flag-log`)).body;
    expect(log2.map((e: { source: string; undoable: boolean }) => [e.source, e.undoable])).toEqual([
      ['undo', false],
      ['proposal', false],
    ]);
    expect(log2[1].undoneBy).toBe(log2[0].id);
    expect(log2[0]).toMatchObject({ from: { salinity: [3] }, to: [2], undoes: log[0].id });
    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: log[0].id })).status).toBe(409); // already undone
    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: log2[0].id })).status).toBe(409); // an undo is not undone
    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: 'x' })).status).toBe(400);
    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: '999999' })).status).toBe(404);
    expect(trail.length).toBeLessThan((await get(`/cruises/${cruiseId}/audit`)).body.length);
    expect(
      (await get(`/cruises/${cruiseId}/audit`)).body.some((a: { action: string }) => a.action === 'undo_flag'),
    ).toBe(true);
  });

  it('undo is refused while a later change covers the same levels, and restores each level’s own flag', async () => {
    const castId = castOf['CP-02'];
    const p = (await get(`/casts/${castId}`)).body.columns.pressure as number[];
    const a = await post(`/casts/${castId}/flags`, {
      variable: 'temperature',
      pFrom: 1000,
      pTo: 1010,
      flag: 4,
      reason: 'sensor A',
    });
    const b = await post(`/casts/${castId}/flags`, {
      variable: 'temperature',
      pFrom: 1006,
      pTo: 1020,
      flag: 3,
      reason: 'sensor B',
    });
    const c = await post(`/casts/${castId}/flags`, {
      variable: 'oxygen',
      pFrom: 1000,
      pTo: 1010,
      flag: 3,
      reason: 'other sensor',
    });
    expect([a.status, b.status, c.status]).toEqual([200, 200, 200]);
    const log = (await get(`/casts/${castId}/flag-log`)).body as {
      id: string;
      reason: string;
      undoable: boolean;
      from: Record<string, number[]>;
    }[];
    expect(log.map((e) => [e.reason, e.undoable])).toEqual([
      ['other sensor', true],
      ['sensor B', true],
      ['sensor A', false],
    ]);
    expect(log[1].from).toEqual({ temperature: [2, 4] });
    const refused = await post(`/casts/${castId}/flag-log/undo`, { changeId: a.body.changeId });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/undo it first/);
    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: b.body.changeId })).status).toBe(200);
    let flags = (await get(`/casts/${castId}`)).body.flags.temperature as number[];
    expect(flags[p.indexOf(1008)]).toBe(4); // back to A's flag, not to 2
    expect(flags[p.indexOf(1016)]).toBe(2);
    expect((await post(`/casts/${castId}/flag-log/undo`, { changeId: a.body.changeId })).status).toBe(200);
    flags = (await get(`/casts/${castId}`)).body.flags.temperature as number[];
    expect(flags.every((f) => f === 2)).toBe(true);
  });

  it('reject by test; a reprocess keeps the decision', async () => {
    const castId = castOf['CP-03'];
    const res = await post(`/casts/${castId}/qc/decisions`, {
      test: 'density_inversion',
      decision: 'reject',
      reason: 'real step in the thermocline',
    });
    expect(res.body).toEqual({ decided: 1, levels: 0 });
    expect((await get(`/cruises/${cruiseId}/qc/pending`)).body).toEqual([]);
    const uploadId = (await get(`/casts/${castId}`)).body.uploadId;
    expect((await post(`/uploads/${uploadId}/reprocess`, {})).status).toBe(202);
    await waitFor(async () => {
      const r = await tech().agent.get(`/api/uploads/${uploadId}`);
      return r.body.status === 'ready' ? r.body : null;
    }, 60_000);
    const qc = (await get(`/casts/${castId}/qc`)).body;
    expect(qc.proposals.map((x: { status: string }) => x.status)).toEqual(['rejected']);
  });
});

describe('neighbours', () => {
  it('are the previous and next station of the default line, each with the cast the line draws', async () => {
    const n = (await get(`/casts/${castOf['CP-03']}/neighbours`)).body;
    expect(n.order).toBe('the line “All stations”');
    expect(n.neighbours.map((x: { station: string; role: string }) => [x.role, x.station])).toEqual([
      ['previous', 'CP-02'],
      ['next', 'CP-04'],
    ]);
    expect(n.neighbours[0].columns.temperature.length).toBe(n.neighbours[0].columns.pressure.length);
    const first = (await get(`/casts/${castOf['CP-02']}/neighbours`)).body;
    expect(first.neighbours.map((x: { station: string }) => x.station)).toEqual(['CP-03']);
  });
  it('follow a named line, and refuse a line id that is not a uuid', async () => {
    const line = await post(
      `/cruises/${cruiseId}/lines`,
      { name: 'Reversed', stations: ['CP-04', 'CP-03', 'CP-02'] },
      who.analyst,
    );
    expect(line.status).toBe(201);
    const n = (await get(`/casts/${castOf['CP-03']}/neighbours?line=${line.body.id}`)).body;
    expect(n.order).toBe('the line “Reversed”');
    expect(n.neighbours.map((x: { station: string; role: string }) => [x.role, x.station])).toEqual([
      ['previous', 'CP-04'],
      ['next', 'CP-02'],
    ]);
    expect((await get(`/casts/${castOf['CP-03']}/neighbours?line=nope`)).status).toBe(400);
  });
});
