// The section route over real ingested casts: both frames, the choices that made them, the bottom
// mask, inversion markers, derived variables as properties, gradients, and clear 400s.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { readdirSync } from 'node:fs';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};
// a stretch of the invented demo line (behaviour checks of the route, not science checks)
const files = readdirSync(join(process.cwd(), 'fixtures/demo/casts')).sort().slice(0, 12);

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const u = await createUser('s-tech@example.test');
  const c = await Cruise.create({
    name: 'Section',
    ship: 'RV Section',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'technician');
  const a = await createUser('s-analyst@example.test');
  await addMember(a.id, c.id, 'analyst');
  who.tech = await agentFor(t.app, 's-tech@example.test');
  who.analyst = await agentFor(t.app, 's-analyst@example.test');
  let req = who.tech.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.tech.csrf);
  for (const f of files) req = req.attach('files', join(process.cwd(), 'fixtures/demo/casts', f));
  await req;
  await waitFor(
    async () => {
      const l = (await who.tech.agent.get(`/api/cruises/${cruiseId}/uploads`)).body as { status: string }[];
      return l.length === files.length && l.every((u) => u.status === 'ready');
    },
    120_000,
    500,
  );
}, 180_000);
afterAll(async () => {
  await t?.close();
});

const section = (q: Record<string, string | number>) =>
  who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query(q);

describe('section route', () => {
  it('by pressure: grid, stations in track order, nothing below the bottom, isopycnals, the choices', async () => {
    const res = await section({ property: 'CT', coord: 'pressure', bin: 20 });
    expect(res.status).toBe(200);
    const s = res.body;
    expect(s.choices).toMatchObject({
      property: 'CT',
      coord: 'pressure',
      ref: 0,
      inversions: 'sort',
      interpolation: 'linear',
      bin: 20,
    });
    expect(s.stations).toHaveLength(files.length);
    for (let i = 1; i < s.stations.length; i++) expect(s.stations[i].x).toBeGreaterThan(s.stations[i - 1].x);
    for (const st of s.stations) {
      const ix = s.grid.x.findIndex((x: number) => Math.abs(x - st.x) < 1e-9);
      expect(ix).toBeGreaterThanOrEqual(0);
      s.grid.y.forEach((p: number, iy: number) => {
        if (p > st.bottom + 20) expect(s.grid.z[iy][ix]).toBeNull();
      });
    }
    // common practice: pressure increases with depth and the isopycnals lie deeper for denser water
    const firstStation = s.isopycnals
      .map((l: { sigma: number; p: (number | null)[] }) => l.p[0])
      .filter((v: number | null) => v !== null);
    for (let i = 1; i < firstStation.length; i++) expect(firstStation[i]).toBeGreaterThan(firstStation[i - 1]);
  });
  it('by density at σ2: the inversion markers of the planted cast sit where its cast sheet lists them', async () => {
    const s = (await section({ property: 'SA', coord: 'density', ref: 2000 })).body;
    expect(s.choices.sigma).toBe('sigma2');
    expect(s.grid.y[0]).toBeGreaterThan(30);
    const casts = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
      id: string;
      inversions: number;
    }[];
    expect(s.inversions.length).toBeGreaterThan(0);
    for (const m of s.inversions) {
      expect(casts.find((c) => c.id === m.castId)).toBeTruthy();
      expect(m.pBottom).toBeGreaterThan(m.pTop);
      expect(['spike', 'overturn']).toContain(m.class);
    }
  });
  it('takes a derived variable as the property, and gives slope and gradients on request', async () => {
    const dv = await who.analyst.agent
      .post(`/api/cruises/${cruiseId}/derived-variables`)
      .set('x-csrf-token', who.analyst.csrf)
      .send({ name: 'ctMinusSa', formula: 'CT - 2*SA', unit: 'degC' });
    expect(dv.status).toBe(201);
    const s = (await section({ property: 'ctMinusSa', coord: 'pressure', bin: 50 })).body;
    const ct = (await section({ property: 'CT', coord: 'pressure', bin: 50 })).body;
    const sa = (await section({ property: 'SA', coord: 'pressure', bin: 50 })).body;
    const iy = 3;
    const ix = 0;
    expect(s.grid.z[iy][ix]).toBeCloseTo(ct.grid.z[iy][ix] - 2 * sa.grid.z[iy][ix], 9);
    const g = (await section({ property: 'CT', coord: 'density', gradients: 'true', bin: 10 })).body;
    expect(g.gradients.slope.length).toBe(g.grid.y.length);
    expect(g.gradients.slope.flat().some((v: number | null) => v !== null && Number.isFinite(v))).toBe(true);
  });
  it('answers 400 with details for bad levels, an unknown property and a bad reference pressure', async () => {
    const a = await section({ coord: 'density', levels: '27:0:26' });
    expect(a.status).toBe(400);
    expect(a.body.error.details[0].field).toBe('levels');
    expect((await section({ property: 'nosuch' })).status).toBe(400);
    expect((await section({ ref: 1500 })).status).toBe(400);
  });
  it('serves the T–S points and the geostrophy with the reference named', async () => {
    const ts = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/ts?every=10`)).body;
    expect(ts).toHaveLength(files.length);
    const geo = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/geostrophy?pRef=1000`)).body;
    expect(geo.choices.pRef).toBe(1000);
    expect(geo.pairs).toHaveLength(files.length - 1);
    // zero velocity at the reference pressure (where both casts reach it)
    const ip = geo.pressure.indexOf(1000);
    for (let k = 0; k < geo.pairs.length; k++)
      if (geo.velocity[ip][k] !== null) expect(Math.abs(geo.velocity[ip][k])).toBeLessThan(1e-12);
  });
});
