// POST /api/comparisons and its neighbours through the HTTP API: the invented demo line's two
// occupations (fixtures/demo-earlier TS-16-02 as A, fixtures/demo TS-26-04 as B; a stretch of 12
// stations across the planted heave) ingested through the intake; the answer's shape (api.md, "The
// comparison of two occupations"), the access rule (membership of both cruises, 404 otherwise), bad
// input, the occupations offered, links by hand, and both export files. The split into terms is that
// of Bindoff & McDougall (1994, J. Phys. Oceanogr. 24, 1137–1152).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';
import { runPythonJson } from '../reference/python';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';

let t: TestApp;
let analyst: Awaited<ReturnType<typeof agentFor>>;
let onlyB: Awaited<ReturnType<typeof agentFor>>;
let tech: Awaited<ReturnType<typeof agentFor>>;
const ids: Record<string, string> = {};
const STRETCH = (f: string) => {
  const n = Number(f.slice(3, 5));
  return n >= 18 && n <= 31;
};

async function ingest(cruiseId: string, dir: string) {
  const files = readdirSync(dir).filter(STRETCH).sort();
  let req = tech.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', tech.csrf);
  for (const f of files) req = req.attach('files', join(dir, f));
  expect((await req).status).toBe(202);
  await waitFor(
    async () => {
      const list = (await tech.agent.get(`/api/cruises/${cruiseId}/uploads`)).body as { status: string }[];
      return list.length === files.length && list.every((u) => u.status === 'ready' || u.status === 'failed');
    },
    150_000,
    500,
  );
}

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const u = await createUser('cmp-analyst@example.test');
  const b = await createUser('cmp-only-b@example.test');
  const te = await createUser('cmp-tech@example.test');
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
      createdBy: u.id,
    });
  const cA = await mk('TS-16-02 check', '2016-03-02');
  const cB = await mk('TS-26-04 check', '2026-03-01');
  ids.cruiseA = cA.id;
  ids.cruiseB = cB.id;
  for (const c of [cA, cB]) {
    await addMember(u.id, c.id, 'analyst');
    await addMember(te.id, c.id, 'technician');
  }
  await addMember(b.id, cB.id, 'pi');
  analyst = await agentFor(t.app, u.email);
  onlyB = await agentFor(t.app, b.email);
  tech = await agentFor(t.app, te.email);
  await ingest(cA.id, join(process.cwd(), 'fixtures/demo-earlier/casts'));
  await ingest(cB.id, join(process.cwd(), 'fixtures/demo/casts'));
  const lineOf = async (cruiseId: string) =>
    ((await analyst.agent.get(`/api/cruises/${cruiseId}/lines`)).body as { id: string; isDefault: boolean }[]).find(
      (l) => l.isDefault,
    )!.id;
  ids.lineA = await lineOf(cA.id);
  ids.lineB = await lineOf(cB.id);
}, 300_000);
afterAll(async () => {
  await t?.close();
});

const post = (who: typeof analyst, body: object) =>
  who.agent.post('/api/comparisons').set('x-csrf-token', who.csrf).send(body);

describe('POST /api/comparisons', () => {
  it('answers the documented shape, ten years apart, with the planted heave in the north', async () => {
    const res = await post(analyst, {
      lineA: ids.lineA,
      lineB: ids.lineB,
      property: 'CT',
      ref: 0,
      inversions: 'sort',
      pairDistanceKm: 20,
    });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const c = res.body;
    for (const k of [
      'choices',
      'years',
      'x',
      'pairs',
      'excluded',
      'pressure',
      'sigma',
      'onPressure',
      'onDensity',
      'decomposition',
      'means',
    ])
      expect(c).toHaveProperty(k);
    expect(Object.keys(c.onPressure).sort()).toEqual(['A', 'B', 'diff']);
    expect(Object.keys(c.onDensity).sort()).toEqual(['A', 'B', 'diff', 'heave', 'pA', 'pB']);
    for (const k of ['waterMassTerm', 'heaveTerm', 'residual']) expect(c.decomposition).toHaveProperty(k);
    expect(Object.keys(c.means.onPressure).sort()).toEqual(['diff', 'heaveTerm', 'residual', 'waterMassTerm']);
    expect(Object.keys(c.means.onDensity).sort()).toEqual(['diff', 'heave']);
    expect(c.years).toBeGreaterThan(9.9);
    expect(c.years).toBeLessThan(10.1);
    expect(c.occupations.A.cruise).toBe('TS-16-02 check');
    expect(c.occupations.B.cruise).toBe('TS-26-04 check');
    // A has no CP-07 anyway; this stretch is CP-18…CP-31 without CP-29 in either
    expect(c.pairs.map((p: { stationA: string }) => p.stationA)).toEqual([
      'CP-18',
      'CP-19',
      'CP-20',
      'CP-21',
      'CP-22',
      'CP-23',
      'CP-24',
      'CP-25',
      'CP-26',
      'CP-27',
      'CP-28',
      'CP-30',
      'CP-31',
    ]);
    expect(c.onPressure.diff).toHaveLength(c.pressure.length);
    expect(c.onPressure.diff[0]).toHaveLength(c.x.length);
    // the three terms add up to the change on pressure at every cell
    let cells = 0;
    c.onPressure.diff.forEach((row: (number | null)[], i: number) =>
      row.forEach((d, j) => {
        if (d === null || c.decomposition.residual[i][j] === null) return;
        cells++;
        expect(
          Math.abs(
            c.decomposition.waterMassTerm[i][j] + c.decomposition.heaveTerm[i][j] + c.decomposition.residual[i][j] - d,
          ),
        ).toBeLessThan(1e-9);
      }),
    );
    expect(cells).toBeGreaterThan(1000);
    // planted: +40 dbar at 450 dbar from CP-24 on (scripts/make-demo-earlier.ts)
    const j = c.pairs.findIndex((p: { stationA: string }) => p.stationA === 'CP-28');
    const i450 = c.pressure.indexOf(450);
    expect(c.decomposition.heave[i450][j]).toBeGreaterThan(36);
    expect(c.decomposition.heave[i450][j]).toBeLessThan(44);
    const jS = c.pairs.findIndex((p: { stationA: string }) => p.stationA === 'CP-18');
    expect(Math.abs(c.decomposition.heave[i450][jS])).toBeLessThan(4);
  });

  it('gives the same answer again (cached) and a different one for other choices', async () => {
    const body = { lineA: ids.lineA, lineB: ids.lineB, property: 'SA', pairDistanceKm: 20, bin: 20 };
    const one = await post(analyst, body);
    const two = await post(analyst, body);
    expect(one.status).toBe(200);
    expect(two.body).toEqual(one.body);
    expect(one.body.pressure[1]).toBe(20);
  });

  it('needs membership of both cruises: 404 otherwise, as if the line did not exist', async () => {
    const res = await post(onlyB, { lineA: ids.lineB, lineB: ids.lineA });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    const swapped = await post(onlyB, { lineA: ids.lineA, lineB: ids.lineB });
    expect(swapped.status).toBe(404);
    const none = await post(analyst, { lineA: ids.lineA, lineB: '00000000-0000-4000-8000-000000000000' });
    expect(none.status).toBe(404);
  });

  it('refuses bad choices with a 400 naming the field', async () => {
    const res = await post(analyst, { lineA: ids.lineA, lineB: ids.lineB, pairDistanceKm: -3, ref: 500 });
    expect(res.status).toBe(400);
    const fields = res.body.error.details.map((d: { field: string }) => d.field);
    expect(fields).toContain('pairDistanceKm');
    expect(fields).toContain('ref');
    const levels = await post(analyst, { lineA: ids.lineA, lineB: ids.lineB, levels: '27:-1:26' });
    expect(levels.status).toBe(400);
    expect(levels.body.error.details[0].field).toBe('levels');
  });
});

describe('common positions along a drawn line', () => {
  type Answer = {
    x: (number | null)[];
    positions: { latitude: number; longitude: number }[];
    pairs: { stationA: string; stationB: string; x: number }[];
    excluded: { station: string; line: string; why: string }[];
    onPressure: Record<string, (number | null)[][]>;
    onDensity: Record<string, (number | null)[][]>;
    decomposition: Record<string, (number | null)[][]>;
    choices: { line: [number, number][] | null };
  };
  const base = () => ({ lineA: ids.lineA, lineB: ids.lineB, property: 'CT', pairDistanceKm: 20 });
  const close = (u: (number | null)[][], v: (number | null)[][]) => {
    expect(u.length).toBe(v.length);
    let n = 0;
    u.forEach((row, i) =>
      row.forEach((a, j) => {
        const b = v[i][j];
        if (a === null || b === null) return expect(a).toBe(b);
        n++;
        expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(a)));
      }),
    );
    return n;
  };

  it("a drawn line along A's own track gives the answer of A's track", async () => {
    const own = (await post(analyst, base())).body as Answer;
    const track = own.positions.map((q) => [q.longitude, q.latitude] as [number, number]);
    const res = await post(analyst, { ...base(), line: track });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const drawn = res.body as Answer;
    expect(drawn.choices.line).toEqual(track);
    expect(drawn.pairs.map((q) => [q.stationA, q.stationB])).toEqual(own.pairs.map((q) => [q.stationA, q.stationB]));
    expect(drawn.excluded).toEqual(own.excluded);
    drawn.x.forEach((v, j) => expect(Math.abs(v! - own.x[j]!)).toBeLessThan(1e-6));
    let cells = 0;
    for (const k of ['A', 'B', 'diff']) cells += close(drawn.onPressure[k], own.onPressure[k]);
    for (const k of ['heave', 'diff']) cells += close(drawn.onDensity[k], own.onDensity[k]);
    for (const k of ['waterMassTerm', 'heaveTerm', 'residual'])
      cells += close(drawn.decomposition[k], own.decomposition[k]);
    expect(cells).toBeGreaterThan(10_000);
  });

  it('stations without a partner within the pairing distance of a shortened, offset line are left out and listed', async () => {
    const own = (await post(analyst, base())).body as Answer;
    const n = own.positions.length;
    // the southern half of A's track as it is, then the line bends 0.4° of latitude (≈ 44 km) north of it
    const half = Math.floor(n / 2);
    const track = own.positions.slice(0, half).map((q) => [q.longitude, q.latitude] as [number, number]);
    const last = own.positions[n - 1];
    track.push([last.longitude, last.latitude + 0.4]);
    const res = await post(analyst, { ...base(), line: track });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const c = res.body as Answer;
    const kept = c.pairs.map((q) => q.stationA);
    const left = c.excluded.filter((e) => e.line === 'A').map((e) => e.station);
    // every A station is either paired or listed, never both, and the far ones are listed with the reason
    expect([...kept, ...left].sort()).toEqual(own.pairs.map((q) => q.stationA).sort());
    expect(kept.length).toBeGreaterThanOrEqual(half);
    expect(left.length).toBeGreaterThan(0);
    expect(left).toContain(own.pairs[n - 1].stationA);
    for (const e of c.excluded.filter((x) => x.line === 'A'))
      expect(e.why).toMatch(/farther than 20 km from the drawn line \(\d+\.\d km\)/);
    expect(c.excluded.filter((e) => e.line === 'B').length).toBeGreaterThan(0);
    expect(c.onPressure.diff[0]).toHaveLength(kept.length);
    // positions run along the drawn line from its first point
    expect(Math.abs(c.x[0]!)).toBeLessThan(1);
  });

  it('refuses a drawn line that is not one', async () => {
    for (const line of [
      [[-30, -40]],
      [
        [-30, -40],
        [-30, -40],
      ],
      [
        [-30, -95],
        [-29, -40],
      ],
      Array.from({ length: 201 }, (_, i) => [-30 + i * 0.01, -40]),
      'CP-18,CP-19',
    ]) {
      const res = await post(analyst, { ...base(), line });
      expect(res.status).toBe(400);
      expect(res.body.error.details.map((d: { field: string }) => d.field.split('.')[0])).toContain('line');
    }
  });

  it('digits round each cell to that many significant digits, as toPrecision does', async () => {
    const full = (await post(analyst, base())).body as Answer;
    const six = (await post(analyst, { ...base(), digits: 6 })).body as Answer;
    let n = 0;
    full.decomposition.residual.forEach((row, i) =>
      row.forEach((v, j) => {
        if (v === null) return expect(six.decomposition.residual[i][j]).toBeNull();
        n++;
        expect(six.decomposition.residual[i][j]).toBe(Number(v.toPrecision(6)));
      }),
    );
    expect(n).toBeGreaterThan(1000);
  });
});

describe('occupations of a line', () => {
  it('offers the other cruise by its section identifier, and links by hand', async () => {
    const offered = await analyst.agent.get(`/api/lines/${ids.lineB}/occupations`);
    expect(offered.status).toBe(200);
    const found = offered.body.occupations.find((o: { lineId: string }) => o.lineId === ids.lineA);
    expect(found.why).toContain('same section identifier');
    expect(found.sectionId).toBe('CORROW');
    // a named line of A is not an occupation of B's default line until linked by hand
    const made = await analyst.agent
      .post(`/api/cruises/${ids.cruiseA}/lines`)
      .set('x-csrf-token', analyst.csrf)
      .send({ name: 'Northern stretch', stations: ['CP-24', 'CP-25', 'CP-26'] });
    expect(made.status).toBe(201);
    const named = made.body.id as string;
    const before = (await analyst.agent.get(`/api/lines/${ids.lineB}/occupations`)).body.occupations.map(
      (o: { lineId: string }) => o.lineId,
    );
    expect(before).not.toContain(named);
    const link = await analyst.agent
      .post(`/api/lines/${ids.lineB}/occupations`)
      .set('x-csrf-token', analyst.csrf)
      .send({ line: named });
    expect(link.status).toBe(201);
    expect(link.body.occupations.find((o: { lineId: string }) => o.lineId === named).why).toEqual(['linked by hand']);
    const del = await analyst.agent
      .delete(`/api/lines/${ids.lineB}/occupations/${named}`)
      .set('x-csrf-token', analyst.csrf);
    expect(del.status).toBe(204);
    const again = await analyst.agent
      .delete(`/api/lines/${ids.lineB}/occupations/${named}`)
      .set('x-csrf-token', analyst.csrf);
    expect(again.status).toBe(404);
    // linking a line of a cruise you do not belong to: 404
    const outsider = await onlyB.agent
      .post(`/api/lines/${ids.lineB}/occupations`)
      .set('x-csrf-token', onlyB.csrf)
      .send({ line: named });
    expect([403, 404]).toContain(outsider.status);
  });
});

describe('exports', () => {
  const q = () => new URLSearchParams({ lineA: ids.lineA, lineB: ids.lineB, property: 'CT', pairDistanceKm: '20' });
  it('CSV names both cruises and lines in its provenance', async () => {
    const res = await analyst.agent.get(`/api/comparisons/export?${q()}&format=csv&frame=density`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const text = res.text;
    expect(text).toMatch(/^# occupation_A: earlier: TS-16-02 check .*line "All stations"/m);
    expect(text).toMatch(/^# occupation_B: later: TS-26-04 check /m);
    expect(text).toMatch(/Bindoff & McDougall \(1994/);
    const header = text.split(/\r\n/).find((l) => !l.startsWith('#'))!;
    expect(header).toBe(
      'position_km,latitude,longitude,station_A,station_B,sigma0,pressure_A,pressure_B,heave,CT_A,CT_B,CT_diff',
    );
  });
  it('NetCDF-CF reads back with the reference interpreter, grids and provenance intact', async () => {
    const res = await analyst.agent
      .get(`/api/comparisons/export?${q()}&format=nc`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (d: Buffer) => chunks.push(d));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    const dir = mkdtempSync(join(tmpdir(), 'cmp-'));
    writeFileSync(join(dir, 'c.nc'), res.body as Buffer);
    const info = runPythonJson<{ conv: string; a: string; b: string; heave: number[]; np: number; nx: number }>(
      `
import sys, json, netCDF4, numpy as np
d = netCDF4.Dataset(sys.argv[1])
h = d.variables['heave'][:]
print(json.dumps(dict(conv=d.Conventions, a=d.occupation_A, b=d.occupation_B, heave=[float(np.ma.max(h)), int(np.ma.count(h))],
  np=len(d.dimensions['pressure']), nx=len(d.dimensions['position']))))
`,
      { args: [join(dir, 'c.nc')] },
    );
    expect(info.conv).toMatch(/^CF-/);
    expect(info.a).toContain('TS-16-02 check');
    expect(info.b).toContain('TS-26-04 check');
    expect(info.nx).toBe(13);
    expect(info.heave[0]).toBeGreaterThan(30);
    expect(info.heave[1]).toBeGreaterThan(100);
  });
  it('technicians may not export; readers may', async () => {
    const res = await tech.agent.get(`/api/comparisons/export?${q()}&format=csv`);
    expect(res.status).toBe(403);
  });
});
