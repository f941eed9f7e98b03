// Lines over the 180° meridian and past the pole, a line made from a drawn polyline, and the
// latitude or longitude x axis, through the API on ingested invented casts.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { writeCasts, uploadAndWait, type InventedCast } from './lines-helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise, Station as PlanStation } from '../../server/models/index';

let t: TestApp;
const cruise: Record<string, string> = {};
let who: Awaited<ReturnType<typeof agentFor>>;

const R = 6371.0088;
/** An arc of d degrees of a great circle, km (equator and meridian arcs are exactly this). */
const arc = (d: number) => (R * d * Math.PI) / 180;
const at = (i: number) => `2026-04-0${1 + Math.floor(i / 4)}T${String((i % 4) * 6).padStart(2, '0')}:00:00Z`;
// Along the equator from 176°E to 176°W, 2° apart: the line crosses the 180° meridian.
// D2's file gives no bottom depth but the plan does (3000 m); D4 has neither: its bottom is not known.
const dateline: InventedCast[] = [176, 178, 180, -178, -176].map((lon, i) => ({
  station: `D${i + 1}`,
  cast: '1',
  lat: 0,
  lon,
  time: at(i),
  deep: 600,
  bottom: i === 1 || i === 3 ? null : 4000,
}));
// Up the 0° meridian to 89.5°N, over the pole, down the 180° meridian: within 1° of the pole.
const polar: InventedCast[] = [
  [0, 86],
  [0, 88],
  [0, 89.5],
  [180, 89.5],
  [180, 88],
  [180, 86],
].map(([lon, lat], i) => ({ station: `N${i + 1}`, cast: '1', lat, lon, time: at(i), deep: 600, bottom: 4000 }));
// occupied out of plan order: N4 before N3 (the default line follows the plan)
polar[2].time = at(3);
polar[3].time = at(2);

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const u = await createUser('g-analyst@example.test');
  who = await agentFor(t.app, 'g-analyst@example.test');
  for (const [name, casts] of [
    ['dateline', dateline],
    ['polar', polar],
  ] as const) {
    const c = await Cruise.create({
      name,
      ship: 'RV Geometry',
      startDate: '2026-04-01',
      endDate: '2026-04-09',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: u.id,
    });
    await addMember(u.id, c.id, 'chief_scientist');
    cruise[name] = c.id;
    const plan = name === 'polar' ? polar : dateline;
    for (const [i, p] of plan.entries()) {
      await PlanStation.create({
        cruiseId: c.id,
        name: p.station,
        latitude: p.lat,
        longitude: p.lon,
        plannedDepth: name === 'dateline' && i === 1 ? 3000 : null,
        order: i + 1,
      });
    }
    await uploadAndWait(who, c.id, writeCasts(casts));
  }
}, 240_000);
afterAll(async () => {
  await t?.close();
});

const section = (c: string, q: Record<string, string | number> = {}) =>
  who.agent.get(`/api/cruises/${cruise[c]}/section`).query({ property: 'CT', coord: 'pressure', bin: 50, ...q });
type Station = { station: string; x: number };

describe('distance along a line', () => {
  it('across the 180° meridian: one column per station, x strictly increasing, 2° equator arcs', async () => {
    const s = (await section('dateline')).body;
    expect(s.stations.map((x: Station) => x.station)).toEqual(['D1', 'D2', 'D3', 'D4', 'D5']);
    s.stations.forEach((st: Station, i: number) =>
      expect(Math.abs(st.x - arc(2 * i))).toBeLessThan(0.02 * arc(2) + 1e-9),
    );
    for (let i = 1; i < s.grid.x.length; i++) expect(s.grid.x[i]).toBeGreaterThan(s.grid.x[i - 1]);
    expect(s.gaps).toEqual([]);
  });
  it('over the pole: no station off the line, x strictly increasing, the whole line an 8° meridian arc within 2 %', async () => {
    const lines = (await who.agent.get(`/api/cruises/${cruise.polar}/lines`)).body;
    expect(lines[0].offLine).toEqual([]);
    const s = (await section('polar')).body;
    expect(s.stations.map((x: Station) => x.station)).toEqual(['N1', 'N2', 'N3', 'N4', 'N5', 'N6']);
    for (let i = 1; i < s.stations.length; i++) expect(s.stations[i].x).toBeGreaterThan(s.stations[i - 1].x);
    expect(Math.abs(s.stations[5].x - arc(8)) / arc(8)).toBeLessThan(0.02);
    expect(s.stations[3].x - s.stations[2].x).toBeCloseTo(arc(1), 3);
  });
  it('offers longitude as x across the 180° meridian (unwrapped), and refuses latitude over the pole', async () => {
    const s = (await section('dateline', { xAxis: 'longitude' })).body;
    expect(s.choices).toMatchObject({ xAxis: 'longitude', xUnit: '°E' });
    expect(s.stations.map((x: Station) => x.x)).toEqual([176, 178, 180, 182, 184]);
    const bad = await section('polar', { xAxis: 'latitude' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('xAxis');
  });
});

describe('a line from a drawn polyline', () => {
  it('takes the stations within the corridor in order of their projection, and draws x as the projection', async () => {
    // drawn from east to west, across the meridian, stopping short of D1
    const r = await who.agent
      .post(`/api/cruises/${cruise.dateline}/lines`)
      .set('x-csrf-token', who.csrf)
      .send({
        name: 'Westward',
        polyline: [
          [-175, 0.1],
          [179, -0.1],
          [177, 0],
        ],
        corridorKm: 40,
      });
    expect(r.status).toBe(201);
    expect(r.body.stations.map((x: Station) => x.station)).toEqual(['D5', 'D4', 'D3', 'D2']);
    const s = (await section('dateline', { line: r.body.id })).body;
    expect(s.stations.map((x: Station) => x.station)).toEqual(['D5', 'D4', 'D3', 'D2']);
    for (let i = 1; i < s.stations.length; i++) expect(s.stations[i].x - s.stations[i - 1].x).toBeCloseTo(arc(2), -1);
  });
  it('refuses a polyline with fewer than two stations near it', async () => {
    const r = await who.agent
      .post(`/api/cruises/${cruise.dateline}/lines`)
      .set('x-csrf-token', who.csrf)
      .send({
        name: 'Nowhere',
        polyline: [
          [100, 40],
          [101, 41],
        ],
      });
    expect(r.status).toBe(400);
    expect(r.body.error.details[0].field).toBe('polyline');
  });
});

describe('the bottom', () => {
  it('comes from the file, else the station plan, as pressure; where neither gives it, the cast stops short and no land is drawn', async () => {
    const s = (await section('dateline', { bin: 20 })).body;
    const st = (name: string) => s.stations.find((x: { station: string }) => x.station === name);
    // common practice: sea pressure in dbar runs 1–2 % above the depth in metres at these depths
    expect(st('D1').bottomKnown).toBe(true);
    expect(st('D1').bottom).toBeGreaterThan(4000);
    expect(st('D1').bottom).toBeLessThan(4000 * 1.025);
    expect(st('D2').bottomKnown).toBe(true);
    expect(st('D2').bottomDepth).toBe(3000);
    expect(st('D2').bottom).toBeGreaterThan(3000);
    expect(st('D2').bottom).toBeLessThan(3000 * 1.025);
    expect(st('D4').bottomKnown).toBe(false);
    expect(st('D4').bottomDepth).toBeNull();
    expect(st('D4').bottom).toBeLessThanOrEqual(600);
    expect(s.bottom.map((b: { known: boolean }) => b.known)).toEqual([true, true, true, false, true]);
    const lines = (await who.agent.get(`/api/cruises/${cruise.dateline}/lines`)).body;
    expect(lines[0].stations.map((x: { bottomSource: string | null }) => x.bottomSource)).toEqual([
      'file',
      'plan',
      'file',
      null,
      'file',
    ]);
    // nothing is drawn below where D4 stopped
    const ix = s.grid.x.findIndex((x: number) => Math.abs(x - st('D4').x) < 1e-9);
    s.grid.y.forEach((p: number, iy: number) => {
      if (p > st('D4').bottom + 20) expect(s.grid.z[iy][ix]).toBeNull();
    });
  });
  it('the default line follows the plan order, not the order of occupation', async () => {
    const lines = (await who.agent.get(`/api/cruises/${cruise.polar}/lines`)).body;
    expect(lines[0].stations.map((x: { station: string }) => x.station)).toEqual(['N1', 'N2', 'N3', 'N4', 'N5', 'N6']);
  });
});
