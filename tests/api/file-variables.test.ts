// Every variable a file carries can be drawn in the section and delivered (issue #12): two invented
// acquisition-software exports with two sensor pairs, fluorescence and beam transmission (written from
// fixtures/samples/acquisition-two-pairs.txt) → the cruise's file variables with their units → a section
// of each → the pressure table and the isopycnal export carry them, each with its flag column.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
let who: Awaited<ReturnType<typeof agentFor>>;

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('fv-chief@example.test');
  const c = await Cruise.create({
    name: 'File variables',
    ship: 'RV Sensor',
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
  who = await agentFor(t.app, 'fv-chief@example.test');
  const sample = readFileSync(join(process.cwd(), 'fixtures/samples/acquisition-two-pairs.txt'), 'utf8');
  const dir = mkdtempSync(join(tmpdir(), 'sl-fv-'));
  const files = [0, 1, 2].map((k) => {
    const path = join(dir, `k-1${k}.cnv`);
    writeFileSync(
      path,
      sample
        .replace('** Station: K-11', `** Station: K-1${k}`)
        .replace('NMEA Latitude = 34 07.50 S', `NMEA Latitude = 34 ${String(7 + 20 * k).padStart(2, '0')}.50 S`),
    );
    return path;
  });
  let req = who.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.csrf);
  for (const f of files) req = req.attach('files', f);
  const res = await req;
  for (const u of res.body.uploads as { id: string }[]) {
    const done = await waitFor(async () => {
      const r = await who.agent.get(`/api/uploads/${u.id}`);
      return r.body.status === 'ready' || r.body.status === 'failed' ? r.body : null;
    }, 60_000);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
  }
}, 180_000);
afterAll(async () => {
  await t?.close();
});

describe('extra variables of the files', () => {
  let vars: { name: string; label: string; unit: string; casts: number }[] = [];
  it('are listed with the units the files gave, for the section property control', async () => {
    const res = await who.agent.get(`/api/cruises/${cruiseId}/file-variables`);
    expect(res.status).toBe(200);
    vars = res.body;
    const by = Object.fromEntries(vars.map((v) => [v.name, v]));
    expect(by['x:fluorescence']).toMatchObject({ label: 'fluorescence', unit: 'mg/m^3', casts: 3 });
    expect(by['x:transmission']).toMatchObject({ unit: '%', casts: 3 });
    // the secondary sensor pair is kept (temperature and salinity of the second sensors)
    const secondary = vars.filter((v) => /temperature|salinity|conductivity/i.test(v.name));
    expect(secondary.length).toBeGreaterThanOrEqual(2);
    for (const v of vars) expect(v.casts).toBe(3);
  });
  it('each can be drawn as a section, with its unit', async () => {
    for (const v of vars) {
      const res = await who.agent
        .get(`/api/cruises/${cruiseId}/section`)
        .query({ property: v.name, coord: 'pressure' });
      expect(res.status, `${v.name}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(200);
      expect(res.body.unit, v.name).toBe(v.unit);
      const finite = (res.body.grid.z as (number | null)[][]).flat().filter((x) => x !== null && Number.isFinite(x));
      expect(finite.length, v.name).toBeGreaterThan(10);
    }
    // fluorescence in the file rises 0.001 per 2 dbar from 0.1 at 2 dbar: the grid holds those values
    const fl = await who.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'x:fluorescence' });
    const z = (fl.body.grid.z as (number | null)[][]).flat().filter((x): x is number => x !== null);
    expect(Math.min(...z)).toBeGreaterThanOrEqual(0.1 - 1e-9);
    expect(Math.max(...z)).toBeLessThan(0.1 + 0.001 * 150 + 1e-9);
    // and on density coordinates too
    const dens = await who.agent
      .get(`/api/cruises/${cruiseId}/section`)
      .query({ property: 'x:fluorescence', coord: 'density' });
    expect(dens.status).toBe(200);
    expect(dens.body.unit).toBe('mg/m^3');
  });
  it('the pressure table and the isopycnal export carry each, followed by its flag column', async () => {
    for (const [path, query] of [
      ['exports/pressure.csv', { bin: 10 }],
      ['exports/isopycnal.csv', { ref: 0, levels: '25.6:0.1:26.6' }],
    ] as const) {
      const res = await who.agent.get(`/api/cruises/${cruiseId}/${path}`).query(query);
      expect(res.status, path).toBe(200);
      const rows = parse(res.text, { comment: '#', columns: true, skip_empty_lines: true }) as Record<string, string>[];
      expect(rows.length, path).toBeGreaterThan(0);
      const cols = Object.keys(rows[0]);
      for (const v of vars) {
        const bare = v.name.slice(2).replace(/[^A-Za-z0-9_]/g, '_');
        const col = cols.find((c) => c.endsWith(bare));
        expect(col, `${path}: ${v.name} in ${cols.join(',')}`).toBeDefined();
        expect(cols[cols.indexOf(col!) + 1]).toBe(`${col}_flag`);
        expect(
          rows.some((r) => r[col!] !== '' && Number.isFinite(Number(r[col!]))),
          `${path} ${col}`,
        ).toBe(true);
      }
    }
  });
});
