// Lines over ingested invented casts: the default line (one column per station, deepest cast, the
// off-line rule and the way back in), lines from a station list, picked casts and composites, the
// line parameter on every section-shaped route, and the checks of bad input.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { writeCasts, uploadAndWait, type InventedCast } from './lines-helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};

// Six stations along 40°S, 1° of longitude apart; S3 has a deep cast and a later shallow one; T1 is
// a side trip 4° north between S3 and S4; S3b sits 0.3 km from S3 (a re-occupation under another name).
const casts: InventedCast[] = [
  { station: 'S1', cast: '1', lat: -40, lon: 10, time: '2026-03-01T00:00:00Z', deep: 1500, bottom: 1600 },
  { station: 'S2', cast: '1', lat: -40, lon: 11, time: '2026-03-01T06:00:00Z', deep: 1500, bottom: 1600 },
  { station: 'S3', cast: '1', lat: -40, lon: 12, time: '2026-03-01T12:00:00Z', deep: 2000, bottom: 2100 },
  { station: 'S3', cast: '2', lat: -40, lon: 12, time: '2026-03-01T15:00:00Z', deep: 300, warm: 3 },
  { station: 'T1', cast: '1', lat: -36, lon: 13.5, time: '2026-03-02T00:00:00Z', deep: 1500 },
  { station: 'S3b', cast: '1', lat: -40.003, lon: 12, time: '2026-03-02T12:00:00Z', deep: 1500 },
  { station: 'S4', cast: '1', lat: -40, lon: 13, time: '2026-03-03T00:00:00Z', deep: 1500, bottom: 1600 },
  { station: 'S5', cast: '1', lat: -40, lon: 14, time: '2026-03-03T06:00:00Z', deep: 1500, bottom: 1600 },
  { station: 'S6', cast: '1', lat: -40, lon: 15, time: '2026-03-03T12:00:00Z', deep: 1500, bottom: 1600 },
];

/** Great-circle distance, km, by the spherical law of cosines on a 6371 km sphere (common practice;
 * written here on its own so the check does not lean on the project's haversine). */
const gcKm = (lon1: number, lat1: number, lon2: number, lat2: number) => {
  const r = Math.PI / 180;
  const c =
    Math.sin(lat1 * r) * Math.sin(lat2 * r) + Math.cos(lat1 * r) * Math.cos(lat2 * r) * Math.cos((lon2 - lon1) * r);
  return 6371 * Math.acos(Math.min(1, Math.max(-1, c)));
};

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const tech = await createUser('l-tech@example.test');
  const c = await Cruise.create({
    name: 'Lines',
    ship: 'RV Lines',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: tech.id,
  });
  cruiseId = c.id;
  await addMember(tech.id, c.id, 'technician');
  const an = await createUser('l-analyst@example.test');
  await addMember(an.id, c.id, 'analyst');
  who.tech = await agentFor(t.app, 'l-tech@example.test');
  who.analyst = await agentFor(t.app, 'l-analyst@example.test');
  await uploadAndWait(who.tech, cruiseId, writeCasts(casts));
}, 180_000);
afterAll(async () => {
  await t?.close();
});

type St = {
  station: string;
  castId: string;
  cast: string;
  x: number;
  choice: string;
  composite: unknown;
  note: string | null;
};
type LineJson = {
  id: string;
  name: string;
  isDefault: boolean;
  stations: St[];
  offLine: { station: string; offKm: number }[];
  excluded: { station: string; why: string }[];
};
const lines = async () => (await who.analyst.agent.get(`/api/cruises/${cruiseId}/lines`)).body as LineJson[];
const section = (q: Record<string, string | number>) =>
  who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'CT', coord: 'pressure', bin: 20, ...q });
const post = (body: object) =>
  who.analyst.agent.post(`/api/cruises/${cruiseId}/lines`).set('x-csrf-token', who.analyst.csrf).send(body);
const patch = (id: string, body: object) =>
  who.analyst.agent.patch(`/api/lines/${id}`).set('x-csrf-token', who.analyst.csrf).send(body);

describe('the default line', () => {
  it('is there as soon as there are casts: every station once in first-occupation order, the deepest cast, the side trip off the line', async () => {
    const all = await lines();
    expect(all).toHaveLength(1);
    const d = all[0];
    expect(d.isDefault).toBe(true);
    expect(d.stations.map((s) => s.station)).toEqual(['S1', 'S2', 'S3', 'S3b', 'S4', 'S5', 'S6']);
    expect(d.stations.find((s) => s.station === 'S3')!.cast).toBe('1');
    expect(d.offLine.map((o) => o.station)).toEqual(['T1']);
    // T1 is 4° of latitude north of the 40°S parallel: about 445 km (independent great circle)
    expect(d.offLine[0].offKm).toBeGreaterThan(0.95 * gcKm(13.5, -36, 13.5, -40));
  });
  it('draws one column per station with x strictly increasing and within 2 % of the great-circle track', async () => {
    const s = (await section({})).body;
    expect(s.stations.map((x: { station: string }) => x.station)).toEqual(['S1', 'S2', 'S3', 'S3b', 'S4', 'S5', 'S6']);
    for (let i = 1; i < s.stations.length; i++) expect(s.stations[i].x).toBeGreaterThan(s.stations[i - 1].x);
    const track = gcKm(10, -40, 15, -40);
    expect(Math.abs(s.stations.at(-1).x - track) / track).toBeLessThan(0.02);
    expect(s.line.isDefault).toBe(true);
  });
  it('takes an off-line station back in with one PATCH, and leaves one out', async () => {
    const d = (await lines())[0];
    const r = await patch(d.id, { include: ['T1'] });
    expect(r.status).toBe(200);
    expect(r.body.stations.map((s: St) => s.station)).toContain('T1');
    expect(r.body.offLine).toEqual([]);
    const r2 = await patch(d.id, { include: [], exclude: ['S2'] });
    expect(r2.body.stations.map((s: St) => s.station)).not.toContain('S2');
    expect(r2.body.excluded).toEqual([{ station: 'S2', why: 'left out by the analyst' }]);
    expect((await section({})).body.stations.map((x: { station: string }) => x.station)).not.toContain('S2');
    await patch(d.id, { exclude: [] });
  });
  it('cannot be deleted or given a station list', async () => {
    const d = (await lines())[0];
    const del = await who.analyst.agent.delete(`/api/lines/${d.id}`).set('x-csrf-token', who.analyst.csrf);
    expect(del.status).toBe(409);
    expect(del.body.error.code).toBe('conflict');
    const p = await patch(d.id, { stations: ['S1', 'S2'] });
    expect(p.status).toBe(400);
  });
});

describe('a line from a station list', () => {
  let id: string;
  it('gives one column per station in the listed order, x strictly increasing, within 2 % of the track', async () => {
    const r = await post({ name: 'Back west', stations: ['S6', 'S4', 'S3', 'S1'] });
    expect(r.status).toBe(201);
    id = r.body.id;
    const s = (await section({ line: id })).body;
    expect(s.stations.map((x: { station: string }) => x.station)).toEqual(['S6', 'S4', 'S3', 'S1']);
    for (let i = 1; i < s.stations.length; i++) expect(s.stations[i].x).toBeGreaterThan(s.stations[i - 1].x);
    const legs = gcKm(15, -40, 13, -40) + gcKm(13, -40, 12, -40) + gcKm(12, -40, 10, -40);
    expect(Math.abs(s.stations.at(-1).x - legs) / legs).toBeLessThan(0.02);
    expect(s.choices.line).toBe(id);
    expect((await lines()).map((l) => l.name)).toEqual(['All stations', 'Back west']);
  });
  it('picks another cast, and joins a composite (shallow above the join, deep below, noted)', async () => {
    const d = (await lines())[0];
    const s3 = d.stations.find((s) => s.station === 'S3')!;
    const shallowId = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body.find(
      (c: { station: string; cast: string }) => c.station === 'S3' && c.cast === '2',
    ).id;
    const picked = await post({ name: 'Shallow S3', stations: ['S2', 'S3', 'S4'], casts: { S3: shallowId } });
    expect(picked.status).toBe(201);
    expect(picked.body.stations[1]).toMatchObject({ station: 'S3', cast: '2', choice: 'picked' });
    const deep = await post({ name: 'Deep S3', stations: ['S2', 'S3', 'S4'] });
    const comp = await post({
      name: 'Composite S3',
      stations: ['S2', 'S3', 'S4'],
      casts: { S3: { shallow: shallowId, deep: s3.castId, joinPressure: 200 } },
    });
    expect(comp.status).toBe(201);
    expect(comp.body.stations[1]).toMatchObject({ station: 'S3', choice: 'composite', cast: '2+1' });
    expect(comp.body.stations[1].note).toMatch(/200 dbar/);
    const [a, b, c] = await Promise.all(
      [picked, deep, comp].map(async (l) => (await section({ line: l.body.id })).body),
    );
    const col = (s: typeof a) => s.grid.x.findIndex((x: number) => Math.abs(x - s.stations[1].x) < 1e-9);
    const at = (s: typeof a, p: number) => s.grid.z[s.grid.y.findIndex((y: number) => Math.abs(y - p) < 1e-9)][col(s)];
    expect(at(c, 100)).toBeCloseTo(at(a, 100), 9); // above the join: the shallow cast
    expect(at(c, 100)).not.toBeCloseTo(at(b, 100), 3);
    expect(at(c, 1000)).toBeCloseTo(at(b, 1000), 9); // below the join: the deep cast
    expect(c.stations[1].choice).toBe('composite');
  });
  it('takes the join pressure the analyst chooses, moves it, refuses one the shallow cast cannot reach, and names it in the files', async () => {
    const d = (await lines())[0];
    const s3 = d.stations.find((s) => s.station === 'S3')!;
    const shallowId = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body.find(
      (c: { station: string; cast: string }) => c.station === 'S3' && c.cast === '2',
    ).id;
    const only = (await post({ name: 'Only shallow S3', stations: ['S2', 'S3', 'S4'], casts: { S3: shallowId } })).body;
    const deep = (await post({ name: 'Only deep S3', stations: ['S2', 'S3', 'S4'] })).body;
    const made = await post({
      name: 'Join moved',
      stations: ['S2', 'S3', 'S4'],
      casts: { S3: { shallow: shallowId, deep: s3.castId, joinPressure: 200 } },
    });
    expect(made.status).toBe(201);
    const [a, b] = await Promise.all([only, deep].map(async (l) => (await section({ line: l.id })).body));
    const at = (s: typeof a, p: number) => {
      const j = s.grid.x.findIndex((x: number) => Math.abs(x - s.stations[1].x) < 1e-9);
      return s.grid.z[s.grid.y.findIndex((y: number) => Math.abs(y - p) < 1e-9)][j] as number;
    };
    // S3's shallow cast is 3 °C warmer (lines-helpers): 240 dbar is below a join at 200, above one at 280
    const c200 = (await section({ line: made.body.id })).body;
    expect(at(c200, 240)).toBeCloseTo(at(b, 240), 9);
    const moved = await patch(made.body.id, {
      casts: { S3: { shallow: shallowId, deep: s3.castId, joinPressure: 280 } },
    });
    expect(moved.status).toBe(200);
    expect(moved.body.stations[1].composite).toMatchObject({ joinPressure: 280, shallowCast: '2', deepCast: '1' });
    expect(moved.body.stations[1].note).toMatch(/cast 2 above 280 dbar, cast 1 from 280 dbar down/);
    const c280 = (await section({ line: made.body.id })).body;
    expect(at(c280, 240)).toBeCloseTo(at(a, 240), 9);
    expect(at(c280, 240) - at(b, 240)).toBeGreaterThan(2);
    expect(at(c280, 1000)).toBeCloseTo(at(b, 1000), 9);
    expect(c280.stations[1].composite).toMatchObject({ joinPressure: 280 });
    // the shallow cast stops at 300 dbar: a join at 400 would leave a hole, refused with its field
    const far = await patch(made.body.id, {
      casts: { S3: { shallow: shallowId, deep: s3.castId, joinPressure: 400 } },
    });
    expect(far.status).toBe(400);
    expect(far.body.error.details.map((x: { field: string }) => x.field)).toContain('casts.S3.joinPressure');
    expect((await who.analyst.agent.get(`/api/lines/${made.body.id}`)).body.stations[1].composite.joinPressure).toBe(
      280,
    );
    // the files name the join in their provenance
    const csv = await who.analyst.agent
      .get(`/api/cruises/${cruiseId}/exports/pressure.csv`)
      .query({ line: made.body.id, bin: 50 });
    expect(csv.status).toBe(200);
    expect(csv.text).toMatch(/S3 \(casts 2\+1 joined at 280 dbar\)/);
  });
  it('renames, reorders and deletes', async () => {
    const r = await patch(id, { name: 'Westward', stations: ['S1', 'S3', 'S6'] });
    expect(r.status).toBe(200);
    expect(r.body.name).toBe('Westward');
    expect(r.body.stations.map((s: St) => s.station)).toEqual(['S1', 'S3', 'S6']);
    expect((await who.analyst.agent.delete(`/api/lines/${id}`).set('x-csrf-token', who.analyst.csrf)).status).toBe(204);
    expect((await section({ line: id })).status).toBe(404);
  });
  it('refuses unknown or repeated stations, a cast of another station, a bad composite, with details', async () => {
    const a = await post({ name: 'Bad', stations: ['S1', 'NOPE', 'S1'] });
    expect(a.status).toBe(400);
    expect(a.body.error.details.map((d: { field: string }) => d.field)).toEqual(['stations[1]', 'stations[2]']);
    const d = (await lines())[0];
    const s1 = d.stations.find((s) => s.station === 'S1')!;
    const b = await post({ name: 'Bad', stations: ['S1', 'S2'], casts: { S2: s1.castId } });
    expect(b.status).toBe(400);
    expect(b.body.error.details[0].message).toMatch(/is at station S1/);
    const s3 = d.stations.find((s) => s.station === 'S3')!;
    const c = await post({
      name: 'Bad',
      stations: ['S3'],
      casts: { S3: { shallow: s3.castId, deep: s3.castId, joinPressure: 100 } },
    });
    expect(c.status).toBe(400);
    expect((await post({ name: '' })).status).toBe(400);
    expect(
      (
        await who.tech.agent
          .post(`/api/cruises/${cruiseId}/lines`)
          .set('x-csrf-token', who.tech.csrf)
          .send({ name: 'T', stations: ['S1'] })
      ).status,
    ).toBe(403);
  });
});

describe('the line parameter on every section-shaped route', () => {
  it('geostrophy: consecutive stations of the line; the coincident pair skipped and named', async () => {
    const g = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/geostrophy`)).body;
    expect(g.skipped).toHaveLength(1);
    expect(g.skipped[0]).toMatchObject({ a: 'S3', b: 'S3b' });
    expect(g.skipped[0].why).toMatch(/closer than 2 km/);
    expect(g.pairs.map((p: { a: string; b: string }) => `${p.a}-${p.b}`)).toEqual([
      'S1-S2',
      'S2-S3',
      'S3b-S4',
      'S4-S5',
      'S5-S6',
    ]);
    const line = await post({ name: 'Three', stations: ['S1', 'S4', 'S6'] });
    const g2 = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/geostrophy`).query({ line: line.body.id })).body;
    expect(g2.pairs.map((p: { a: string; b: string }) => `${p.a}-${p.b}`)).toEqual(['S1-S4', 'S4-S6']);
    expect(g2.skipped).toEqual([]);
  });
  it('ts, isopycnal.csv and pressure.csv take the line; the files name the line and its stations', async () => {
    const line = (await lines()).find((l) => l.name === 'Three')!;
    const ts = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/ts`).query({ line: line.id })).body;
    expect(ts.map((c: { station: string }) => c.station)).toEqual(['S1', 'S4', 'S6']);
    const iso = await who.analyst.agent.get(`/api/cruises/${cruiseId}/exports/isopycnal.csv`).query({ line: line.id });
    expect(iso.status).toBe(200);
    expect(iso.text).toMatch(/Line: Three.*S1 \(cast 1\), S4 \(cast 1\), S6 \(cast 1\)/);
    const rows = iso.text
      .split('\n')
      .filter((l) => l && !l.startsWith('#'))
      .slice(1);
    expect(new Set(rows.map((r) => r.split(',')[0]))).toEqual(new Set(['S1', 'S4', 'S6']));
    const pres = await who.analyst.agent
      .get(`/api/cruises/${cruiseId}/exports/pressure.csv`)
      .query({ line: line.id, bin: 50 });
    expect(
      new Set(
        pres.text
          .split('\n')
          .filter((l) => l && !l.startsWith('#'))
          .slice(1)
          .map((r) => r.split(',')[0]),
      ),
    ).toEqual(new Set(['S1', 'S4', 'S6']));
    const def = await who.analyst.agent.get(`/api/cruises/${cruiseId}/exports/pressure.csv`).query({ bin: 50 });
    expect(def.text).toMatch(/Line: All stations \(the default line\)/);
  });
  it('deliveries keep the line; a line of another cruise or a bad id is 404', async () => {
    const line = (await lines()).find((l) => l.name === 'Three')!;
    const d = await who.analyst.agent
      .post(`/api/cruises/${cruiseId}/deliveries`)
      .set('x-csrf-token', who.analyst.csrf)
      .send({ kind: 'pressure', formats: ['csv'], line: line.id });
    expect(d.status).toBe(202);
    expect(d.body.params.line).toBe(line.id);
    const bad = await who.analyst.agent
      .post(`/api/cruises/${cruiseId}/deliveries`)
      .set('x-csrf-token', who.analyst.csrf)
      .send({ kind: 'pressure', formats: ['csv'], line: '00000000-0000-4000-8000-000000000000' });
    expect(bad.status).toBe(404);
    expect((await section({ line: 'not-a-line' })).status).toBe(404);
  });
});
