// The station plan through the API: edit, remove (refused while a station has casts), reorder (the
// default line and the section follow), and a station table previewed (nothing written) and applied
// (exactly the previewed change, or 409 and nothing written), with the lock, the roles and bad rows.
// Casts are invented (tests/api/lines-helpers.ts); no real data here.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { writeCasts, uploadAndWait, type InventedCast } from './lines-helpers';
import { startWorkers } from '../../server/jobs/worker';
import { AuditEntry, Cast, Cruise, Station } from '../../server/models/index';
import { planApplyResponseSchema, planChangeSchema, stationListResponseSchema } from '../../shared/api/stations';

let t: TestApp;
let cruiseId: string;
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};

// P1, P2, P3 occupied along 40°S; P4 and X planned only.
const casts: InventedCast[] = [
  { station: 'P1', cast: '1', lat: -40, lon: 10, time: '2026-04-01T00:00:00Z', deep: 800 },
  { station: 'P2', cast: '1', lat: -40, lon: 11, time: '2026-04-01T06:00:00Z', deep: 800 },
  { station: 'P3', cast: '1', lat: -40, lon: 12, time: '2026-04-01T12:00:00Z', deep: 800 },
];

const url = (p = '') => `/api/cruises/${cruiseId}/stations${p}`;
const send = (role: string, method: 'post' | 'patch' | 'put' | 'delete', path: string, body?: object) => {
  const a = who[role];
  const r = a.agent[method](path).set('x-csrf-token', a.csrf);
  return body === undefined ? r : r.send(body);
};
const plan = async () => stationListResponseSchema.parse((await who.chief.agent.get(url())).body);
/** Everything a plan change could write: the stations as rows, and the count of audit entries. */
const snapshot = async () => ({
  rows: (await Station.findAll({ where: { cruiseId }, order: [['order', 'ASC']], raw: true })).map((s) => ({
    ...s,
    createdAt: undefined,
  })),
  audits: await AuditEntry.count({ where: { cruiseId } }),
});
const defaultLine = async () =>
  (
    (await who.analyst.agent.get(`/api/cruises/${cruiseId}/lines`)).body as {
      isDefault: boolean;
      stations: { station: string }[];
    }[]
  )
    .find((l) => l.isDefault)!
    .stations.map((s) => s.station);
const sectionStations = async () =>
  (
    await who.analyst.agent
      .get(`/api/cruises/${cruiseId}/section`)
      .query({ property: 'CT', coord: 'pressure', bin: 20 })
  ).body.stations.map((s: { station: string }) => s.station);

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('sp-chief@example.test');
  const c = await Cruise.create({
    name: 'Plan',
    ship: 'RV Plan',
    startDate: '2026-04-01',
    endDate: '2026-04-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  cruiseId = c.id;
  await addMember(chief.id, c.id, 'chief_scientist');
  for (const role of ['technician', 'analyst', 'pi'] as const) {
    const u = await createUser(`sp-${role}@example.test`);
    await addMember(u.id, c.id, role);
    who[role] = await agentFor(t.app, `sp-${role}@example.test`);
  }
  who.chief = await agentFor(t.app, 'sp-chief@example.test');
  for (const [name, lon] of [
    ['P1', 10],
    ['P2', 11],
    ['P3', 12],
    ['P4', 13],
    ['X', 20],
  ] as const) {
    const r = await send('chief', 'post', url(), { name, latitude: -40, longitude: lon, plannedDepth: 4000 });
    expect(r.status).toBe(201);
  }
  await uploadAndWait(who.technician, cruiseId, writeCasts(casts));
}, 180_000);
afterAll(async () => {
  await t?.close();
});

describe('the plan', () => {
  it('lists the stations in order with their live casts', async () => {
    const p = await plan();
    expect(p.map((s) => [s.name, s.order, s.occupied, s.casts])).toEqual([
      ['P1', 1, true, 1],
      ['P2', 2, true, 1],
      ['P3', 3, true, 1],
      ['P4', 4, false, 0],
      ['X', 5, false, 0],
    ]);
  });
  it('edits a position and a depth; renames a station without casts; an occupied station keeps its name', async () => {
    const p = await plan();
    const p2 = p.find((s) => s.name === 'P2')!;
    const ok = await send('chief', 'patch', url(`/${p2.id}`), { latitude: -40.25, plannedDepth: 4100 });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ name: 'P2', latitude: -40.25, longitude: 11, plannedDepth: 4100, casts: 1 });
    const rename = await send('chief', 'patch', url(`/${p2.id}`), { name: 'P2a' });
    expect(rename.status).toBe(409);
    expect(rename.body.error.code).toBe('station_occupied');
    expect(rename.body.error.message).toMatch(/Station P2 has 1 cast/);
    const x = p.find((s) => s.name === 'X')!;
    expect((await send('chief', 'patch', url(`/${x.id}`), { name: 'P4' })).status).toBe(409); // already planned
    const r = await send('chief', 'patch', url(`/${x.id}`), { name: 'X1', longitude: 340 });
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ name: 'X1', longitude: -20 });
    expect((await send('chief', 'patch', url(`/${x.id}`), {})).status).toBe(400);
    expect((await send('chief', 'patch', url(`/${x.id}`), { latitude: 91 })).status).toBe(400);
    expect((await send('chief', 'patch', url('/00000000-0000-4000-8000-000000000000'), { latitude: 1 })).status).toBe(
      404,
    );
    const trail = await AuditEntry.findAll({
      where: { cruiseId, entity: 'station', entityId: x.id, action: 'update' },
    });
    expect(trail.map((e) => (e.after as { name: string }).name)).toEqual(['X1']);
  });
  it('refuses to remove a station that has casts (the casts stay); removes one without and closes the gap', async () => {
    const p = await plan();
    const p1 = p.find((s) => s.name === 'P1')!;
    const r = await send('chief', 'delete', url(`/${p1.id}`));
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('station_occupied');
    expect(await Cast.count({ where: { cruiseId, station: 'P1' } })).toBe(1);
    const x1 = p.find((s) => s.name === 'X1')!;
    const del = await send('chief', 'delete', url(`/${x1.id}`));
    expect(del.status).toBe(200);
    expect(stationListResponseSchema.parse(del.body).map((s) => [s.name, s.order])).toEqual([
      ['P1', 1],
      ['P2', 2],
      ['P3', 3],
      ['P4', 4],
    ]);
    expect(await AuditEntry.count({ where: { cruiseId, entity: 'station', entityId: x1.id, action: 'delete' } })).toBe(
      1,
    );
  });
  it('reorders the plan; the default line and the section follow the new order', async () => {
    expect(await defaultLine()).toEqual(['P1', 'P2', 'P3']);
    expect(await sectionStations()).toEqual(['P1', 'P2', 'P3']);
    const p = await plan();
    const id = (n: string) => p.find((s) => s.name === n)!.id;
    const r = await send('chief', 'put', url('/order'), { ids: [id('P3'), id('P1'), id('P4'), id('P2')] });
    expect(r.status).toBe(200);
    expect(stationListResponseSchema.parse(r.body).map((s) => s.name)).toEqual(['P3', 'P1', 'P4', 'P2']);
    expect(await defaultLine()).toEqual(['P3', 'P1', 'P2']);
    expect(await sectionStations()).toEqual(['P3', 'P1', 'P2']);
    // an order that misses a station, or names one twice, changes nothing
    expect((await send('chief', 'put', url('/order'), { ids: [id('P3'), id('P1'), id('P4')] })).status).toBe(409);
    expect((await send('chief', 'put', url('/order'), { ids: [id('P3'), id('P3'), id('P4'), id('P2')] })).status).toBe(
      400,
    );
    expect((await plan()).map((s) => s.name)).toEqual(['P3', 'P1', 'P4', 'P2']);
    // back to the plan's first order for the table tests
    await send('chief', 'put', url('/order'), { ids: [id('P1'), id('P2'), id('P3'), id('P4')] });
    expect(await defaultLine()).toEqual(['P1', 'P2', 'P3']);
  });
});

describe('a station table', () => {
  // P1 as planned; P2 moved (degrees and minutes); P3 with a new depth; N1, N2 new; P4 not named.
  const table = [
    'station\tlatitude\tlongitude\tdepth',
    'P1\t-40\t10\t4000',
    "P2\t40°30.0'S\t11 00.0 E\t4100",
    'N1\t40 00.0 S\t14.5\t3900',
    'P3\t-40\t12\t4300',
    'N2\t-40\t15\t',
  ].join('\n');

  it('previews what it would change and writes nothing', async () => {
    const before = await snapshot();
    const r = await send('chief', 'post', url('/table/preview'), { text: table, mode: 'merge' });
    expect(r.status).toBe(200);
    const c = planChangeSchema.parse(r.body);
    expect(c.added.map((a) => [a.name, a.line, a.latitude, a.longitude, a.plannedDepth])).toEqual([
      ['N1', 4, -40, 14.5, 3900],
      ['N2', 6, -40, 15, null],
    ]);
    expect(c.changed.map((x) => [x.name, x.fields, x.before.latitude, x.after.latitude])).toEqual([
      ['P2', ['latitude'], -40.25, -40.5],
      ['P3', ['plannedDepth'], -40, -40],
    ]);
    expect(c.changed[1].before.plannedDepth).toBe(4000);
    expect(c.changed[1].after.plannedDepth).toBe(4300);
    expect(c.removed).toEqual([]);
    expect(c.unchanged.map((u) => [u.name, u.named])).toEqual([
      ['P1', true],
      ['P4', false],
    ]);
    expect(c.order).toEqual(['P1', 'P2', 'P3', 'P4', 'N1', 'N2']);
    expect(c.orderChanged).toBe(false);
    expect(await snapshot()).toEqual(before);
    // the same table in replace mode: P4 (no casts) would go, the plan takes the table's order
    const rep = planChangeSchema.parse(
      (await send('chief', 'post', url('/table/preview'), { text: table, mode: 'replace' })).body,
    );
    expect(rep.removed.map((x) => x.name)).toEqual(['P4']);
    expect(rep.order).toEqual(['P1', 'P2', 'N1', 'P3', 'N2']);
    expect(rep.orderChanged).toBe(false);
    expect(rep.token).not.toBe(c.token);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses bad rows naming line and column, and writes nothing', async () => {
    const before = await snapshot();
    const bad = 'station,lat,lon,depth\nP1,-40,10,4000\nQ2,-40 75.0,11,4000\nQ3,-40,11 30 N,\n';
    for (const path of ['/table/preview', '/table/apply']) {
      const r = await send('chief', 'post', url(path), { text: bad, mode: 'merge', token: '0'.repeat(64) });
      expect(r.status, path).toBe(400);
      expect(r.body.error.code).toBe('bad_station_table');
      expect(r.body.error.message).toMatch(/line 3, column 2/);
      expect(r.body.error.details.map((d: { line: number; column: number }) => [d.line, d.column])).toEqual([
        [3, 2],
        [4, 3],
      ]);
    }
    expect((await send('chief', 'post', url('/table/preview'), { text: 'x'.repeat(200_001) })).status).toBe(400);
    expect(await snapshot()).toEqual(before);
  });

  it('applies exactly the previewed change, in order, audited; a stale token changes nothing', async () => {
    const preview = planChangeSchema.parse(
      (await send('chief', 'post', url('/table/preview'), { text: table, mode: 'replace' })).body,
    );
    // a token of another mode does not confirm this one
    const merge = planChangeSchema.parse(
      (await send('chief', 'post', url('/table/preview'), { text: table, mode: 'merge' })).body,
    );
    const before = await snapshot();
    const wrong = await send('chief', 'post', url('/table/apply'), {
      text: table,
      mode: 'replace',
      token: merge.token,
    });
    expect(wrong.status).toBe(409);
    expect(wrong.body.error.code).toBe('plan_changed');
    expect(await snapshot()).toEqual(before);

    const r = await send('chief', 'post', url('/table/apply'), { text: table, mode: 'replace', token: preview.token });
    expect(r.status).toBe(200);
    const out = planApplyResponseSchema.parse(r.body);
    expect(out.applied).toEqual(preview);
    const now = await plan();
    expect(now.map((s) => s.name)).toEqual(preview.order);
    expect(now.map((s) => s.order)).toEqual([1, 2, 3, 4, 5]);
    expect(now.find((s) => s.name === 'P2')!.latitude).toBe(-40.5);
    expect(now.find((s) => s.name === 'P3')!.plannedDepth).toBe(4300);
    expect(now.find((s) => s.name === 'N2')!.plannedDepth).toBeNull();
    expect(out.stations).toEqual(now);
    const a = await AuditEntry.findAll({ where: { cruiseId, action: 'import_stations' } });
    expect(a).toHaveLength(1);
    expect((a[0].after as { removed: { name: string }[] }).removed.map((x) => x.name)).toEqual(['P4']);
    // the same confirmation again: the plan has changed since that preview
    const again = await send('chief', 'post', url('/table/apply'), {
      text: table,
      mode: 'replace',
      token: preview.token,
    });
    expect(again.status).toBe(409);
    // and a preview now says nothing would change
    const nothing = planChangeSchema.parse(
      (await send('chief', 'post', url('/table/preview'), { text: table, mode: 'replace' })).body,
    );
    expect(nothing.empty).toBe(true);
  });

  it('keeps occupied stations that a replacing table leaves out, and says so', async () => {
    const c = planChangeSchema.parse(
      (await send('chief', 'post', url('/table/preview'), { text: 'N1,-40,14.5\nP2,-40.5,11\n', mode: 'replace' }))
        .body,
    );
    expect(c.keptOccupied.map((k) => [k.name, k.casts])).toEqual([
      ['P1', 1],
      ['P3', 1],
    ]);
    expect(c.removed.map((x) => x.name)).toEqual(['N2']);
    expect(c.order).toEqual(['N1', 'P2', 'P1', 'P3']);
    expect(c.orderChanged).toBe(true);
    const r = await send('chief', 'post', url('/table/apply'), {
      text: 'N1,-40,14.5\nP2,-40.5,11\n',
      mode: 'replace',
      token: c.token,
    });
    expect(r.status).toBe(200);
    expect((await plan()).map((s) => s.name)).toEqual(['N1', 'P2', 'P1', 'P3']);
    expect(await defaultLine()).toEqual(['P2', 'P1', 'P3']);
    expect(await Cast.count({ where: { cruiseId } })).toBe(3);
  });

  it('a cast arriving between preview and apply makes the preview stale', async () => {
    const text = 'N1,-40,14.5\nP2,-40.5,11\nP1,-40,10\nP3,-40,12\nZ9,-41,16\n';
    const c = planChangeSchema.parse(
      (await send('chief', 'post', url('/table/preview'), { text, mode: 'merge' })).body,
    );
    expect(c.added.map((a) => a.name)).toEqual(['Z9']);
    await uploadAndWait(
      who.technician,
      cruiseId,
      writeCasts([{ station: 'N1', cast: '1', lat: -40, lon: 14.5, time: '2026-04-02T00:00:00Z', deep: 600 }]),
    );
    const r = await send('chief', 'post', url('/table/apply'), { text, mode: 'merge', token: c.token });
    expect(r.status).toBe(409);
    expect((await plan()).map((s) => s.name)).not.toContain('Z9');
  });
});

describe('roles and the lock', () => {
  it('only the chief scientist edits the plan', async () => {
    const p = await plan();
    const id = p[0].id;
    for (const role of ['technician', 'analyst', 'pi']) {
      expect((await send(role, 'patch', url(`/${id}`), { latitude: -41 })).status, role).toBe(403);
      expect((await send(role, 'delete', url(`/${id}`))).status, role).toBe(403);
      expect((await send(role, 'put', url('/order'), { ids: p.map((s) => s.id) })).status, role).toBe(403);
      expect((await send(role, 'post', url('/table/preview'), { text: 'A,1,1' })).status, role).toBe(403);
      expect(
        (await send(role, 'post', url('/table/apply'), { text: 'A,1,1', token: '0'.repeat(64) })).status,
        role,
      ).toBe(403);
      expect((await who[role].agent.get(url())).status, role).toBe(200);
    }
  });
  it('a locked cruise answers 409 to every change of the plan and keeps it', async () => {
    const p = await plan();
    const free = p[0];
    const text = 'Q1,-42,10\n';
    const preview = planChangeSchema.parse((await send('chief', 'post', url('/table/preview'), { text })).body);
    expect((await send('chief', 'patch', `/api/cruises/${cruiseId}`, { locked: true })).status).toBe(200);
    const before = await snapshot();
    const answers = [
      await send('chief', 'patch', url(`/${free.id}`), { latitude: -41 }),
      await send('chief', 'delete', url(`/${free.id}`)),
      await send('chief', 'put', url('/order'), { ids: [...p.map((s) => s.id)].reverse() }),
      await send('chief', 'post', url('/table/apply'), { text, mode: 'merge', token: preview.token }),
      await send('chief', 'post', url(), { name: 'L1', latitude: 0, longitude: 0 }),
    ];
    expect(answers.map((a) => [a.status, a.body.error?.code])).toEqual(Array(5).fill([409, 'locked']));
    expect(await snapshot()).toEqual(before);
    // the preview writes nothing, so it still answers on a locked cruise
    expect((await send('chief', 'post', url('/table/preview'), { text })).status).toBe(200);
    expect((await send('chief', 'patch', `/api/cruises/${cruiseId}`, { locked: false })).status).toBe(200);
  });
});
