// The mapping step for what a file lacks (issue #12): files written here without a station, a cast,
// a position, a time or an oxygen unit → the upload lists what is missing → the answers (checked,
// remembered for the cruise) → a preview of the first rows as they will be read → retry → casts stored
// with the answers and notes saying where each value came from; a later upload uses what was remembered.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cast, CastColumn, Cruise } from '../../server/models/index';
import { runPythonJson } from '../reference/python';

let t: TestApp;
let cruiseId: string;
let tech: Awaited<ReturnType<typeof agentFor>>;
const dir = mkdtempSync(join(tmpdir(), 'sl-answers-'));

/** An invented cast table: pressure, temperature, salinity, and oxygen in ml/l with no unit in its header. */
function castFile(name: string, header: string[], o2: number, rows = 40): string {
  const lines = [...header, 'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen'];
  for (let i = 0; i < rows; i++) {
    const p = 2 + 5 * i;
    lines.push(`${p},${(18 - 0.05 * i).toFixed(4)},${(35.2 - 0.004 * i).toFixed(4)},${(o2 - 0.01 * i).toFixed(3)}`);
  }
  const path = join(dir, name);
  writeFileSync(path, lines.join('\n') + '\n');
  return path;
}

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('ans-chief@example.test');
  const c = await Cruise.create({
    name: 'Answers',
    ship: 'RV Answer',
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
  const u = await createUser('ans-tech@example.test');
  await addMember(u.id, c.id, 'technician');
  tech = await agentFor(t.app, 'ans-tech@example.test');
}, 120_000);
afterAll(async () => {
  await t?.close();
});

const settled = (id: string) =>
  waitFor(async () => {
    const r = await tech.agent.get(`/api/uploads/${id}`);
    return ['ready', 'failed', 'awaiting_decision'].includes(r.body.status) ? r.body : null;
  }, 60_000);
async function upload(files: string[]) {
  let req = tech.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', tech.csrf);
  for (const f of files) req = req.attach('files', f);
  const res = await req;
  expect(res.status).toBe(202);
  return Promise.all(res.body.uploads.map((u: { id: string }) => settled(u.id)));
}

describe('the mapping step for what a file lacks', () => {
  const ids: string[] = [];
  it('an upload of files without station, cast, position, time or oxygen unit reports what each lacks', async () => {
    const a = castFile('bare-a.csv', ['# bottom_depth: 900'], 5.6);
    const b = castFile('bare-b.csv', ['# station: B-2', '# latitude: -41.5', '# longitude: 12.25'], 5.2);
    const done = await upload([a, b]);
    for (const d of done) ids.push(d.id);
    const [ua, ub] = done;
    expect(ua.status).toBe('failed');
    expect(ua.needs).toEqual([
      expect.objectContaining({
        file: 'bare-a.csv',
        missing: ['station', 'cast', 'position', 'time'],
        units: [{ column: 'oxygen', role: 'oxygen' }],
      }),
    ]);
    expect(ub.status).toBe('failed');
    expect(ub.needs[0]).toMatchObject({
      file: 'bare-b.csv',
      missing: ['cast', 'time'],
      units: [{ column: 'oxygen', role: 'oxygen' }],
      known: { station: 'B-2', latitude: -41.5, longitude: 12.25 },
    });
    expect(ub.errors[0].code).toBe('needs_answer');
    expect(await Cast.count({ where: { cruiseId } })).toBe(0);
  });

  it('a wrong answer (latitude 95, a unit not offered) is a 400 with the error shape and nothing is remembered', async () => {
    for (const body of [
      { casts: { 'bare-a.csv': { station: 'A-1', latitude: 95, longitude: 10 } } },
      { units: { oxygen: 'mg/dl' } },
      { casts: { 'bare-a.csv': { time: 'yesterday' } } },
      { casts: { 'bare-a.csv': { latitude: -40 } } },
    ]) {
      const res = await tech.agent
        .put(`/api/cruises/${cruiseId}/intake-answers`)
        .set('x-csrf-token', tech.csrf)
        .send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
    }
    const preview = await tech.agent
      .post(`/api/uploads/${ids[0]}/preview`)
      .set('x-csrf-token', tech.csrf)
      .send({ casts: { 'bare-a.csv': { latitude: 95, longitude: 0 } } });
    expect(preview.status).toBe(400);
    expect((await tech.agent.get(`/api/cruises/${cruiseId}/intake-answers`)).body).toEqual({ units: {}, casts: {} });
  });

  const answers = {
    units: { oxygen: 'ml/l' },
    casts: {
      'bare-a.csv': { station: 'A-1', cast: '2', latitude: -40.75, longitude: 11.5, time: '2026-03-05T06:30:00Z' },
      'bare-b.csv': { cast: '1', time: '2026-03-05T11:00:00Z' },
    },
  };

  it('previews the first rows as they will be read, with the answers applied and oxygen converted', async () => {
    const res = await tech.agent.post(`/api/uploads/${ids[0]}/preview`).set('x-csrf-token', tech.csrf).send(answers);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const f = res.body.files[0];
    expect(f.file).toBe('bare-a.csv');
    expect(f.metadata.station).toEqual({ value: 'A-1', source: 'answer' });
    expect(f.metadata.latitude).toEqual({ value: -40.75, source: 'answer' });
    expect(f.metadata.time).toEqual({ value: '2026-03-05T06:30:00Z', source: 'answer' });
    expect(f.stillMissing).toEqual([]);
    expect(f.columns.map((c: { name: string }) => c.name)).toEqual(['pressure', 'temperature', 'SP', 'oxygen']);
    expect(f.columns[3].unit).toBe('µmol/kg');
    expect(f.rows[0][0]).toBe(2);
    // 5.6 ml/l × 44.661 µmol/ml (common practice, the GO-SHIP conversion) per (1000 + σ0) kg/m³: ~240 µmol/kg
    expect(f.rows[0][3]).toBeGreaterThan(235);
    expect(f.rows[0][3]).toBeLessThan(250);
    // without the answers the preview says what is still missing
    const bare = (await tech.agent.post(`/api/uploads/${ids[0]}/preview`).set('x-csrf-token', tech.csrf).send({})).body;
    expect(bare.files[0].stillMissing).toEqual(['station', 'position', 'time', 'unit of oxygen']);
    expect(bare.files[0].metadata.station).toEqual({ value: null, source: 'missing' });
    // nothing was stored by a preview
    expect(await Cast.count({ where: { cruiseId } })).toBe(0);
  });

  it('answers are remembered for the cruise; retry stores the casts with them and notes where each value came from', async () => {
    const put = await tech.agent
      .put(`/api/cruises/${cruiseId}/intake-answers`)
      .set('x-csrf-token', tech.csrf)
      .send(answers);
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    expect(put.body.units).toEqual({ oxygen: 'ml/l' });
    for (const id of ids) {
      const r = await tech.agent.post(`/api/uploads/${id}/retry`).set('x-csrf-token', tech.csrf);
      expect(r.status).toBe(202);
    }
    const done = await Promise.all(ids.map(settled));
    for (const d of done) expect(d.status, JSON.stringify(d.errors)).toBe('ready');
    expect(done[0].needs).toBeNull();
    const a = (await tech.agent.get(`/api/casts/${done[0].castIds[0]}`)).body;
    expect(a).toMatchObject({ station: 'A-1', cast: '2', latitude: -40.75, longitude: 11.5 });
    expect(new Date(a.time).toISOString()).toBe('2026-03-05T06:30:00.000Z');
    expect(a.notes).toContainEqual(
      expect.stringMatching(/station A-1, cast 2, position -40.75, 11.5, time .* from the answers given at intake/),
    );
    expect(a.notes).toContainEqual(expect.stringMatching(/"oxygen": no unit in the file; ml\/l as answered at intake/));
    expect(a.notes).toContainEqual(expect.stringMatching(/oxygen converted from ml\/l to µmol\/l/));
    // Oxygen per kilogram with the potential density of the sample: 1 ml/l = 44.661 µmol/l (common
    // practice; Garcia & Gordon 1992, from memory), σ0 from the reference library (python3-gsw).
    const ref = runPythonJson<number[]>(`
import gsw, json
SA = gsw.SA_from_SP(35.2, 2, 11.5, -40.75)
CT = gsw.CT_from_t(SA, 18.0, 2)
print(json.dumps([float(gsw.sigma0(SA, CT))]))`);
    const expected = (5.6 * 44.661) / ((1000 + ref[0]) / 1000);
    expect(Math.abs(a.columns.oxygen[0] - expected)).toBeLessThan(1e-6);
    const b = (await tech.agent.get(`/api/casts/${done[1].castIds[0]}`)).body;
    expect(b).toMatchObject({ station: 'B-2', cast: '1', latitude: -41.5, longitude: 12.25 });
    expect(b.notes).toContainEqual(
      expect.stringMatching(/cast 1, time 2026-03-05T11:00:00Z from the answers given at intake/),
    );
    expect(b.notes.join(' ')).not.toMatch(/station B-2 from the answers/); // the file's own station
  });

  it('a second upload to the cruise uses the remembered answers: the oxygen unit, and a corrected file by its name', async () => {
    const c = castFile(
      'bare-c.csv',
      ['# station: C-3', '# latitude: -42', '# longitude: 13', '# time: 2026-03-06T01:00:00Z', '# cast: 1'],
      4.9,
    );
    // a corrected bare-a.csv (other bytes, same name): its remembered station, cast, position and time
    const a2 = castFile('bare-a.csv', ['# bottom_depth: 905'], 5.7, 30);
    const columnsBefore = await CastColumn.count();
    const done = await upload([c, a2]);
    const [dc, da] = done;
    expect(dc.status, JSON.stringify(dc.errors)).toBe('ready');
    const cc = (await tech.agent.get(`/api/casts/${dc.castIds[0]}`)).body;
    expect(cc.notes).toContainEqual(expect.stringMatching(/ml\/l as answered at intake/));
    expect(cc.columns.oxygen[0]).toBeGreaterThan(200); // converted from ml/l, not taken as µmol/kg
    // the corrected file asks whether it replaces A-1 cast 2 (it has the remembered station and cast)
    expect(da.status, JSON.stringify(da.errors)).toBe('awaiting_decision');
    expect(da.conflicts.items[0]).toMatchObject({ station: 'A-1', cast: '2', file: 'bare-a.csv' });
    expect(await CastColumn.count()).toBeGreaterThan(columnsBefore);
  });
});
