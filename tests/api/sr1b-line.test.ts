// The SR1B Drake Passage section of January 2015 as a line, through the whole app: ingest, the
// default line, a line from the station list, the distance axis, geostrophy and layer transports.
//
// Source: fixtures/real/sr1b-2015 (CCHDO "WOCE netCDF" CTD product of GO-SHIP line SR1B, RRS James Clark
// Ross cruise JR306, expocode 74JC20150110; see its SOURCE.md). Acknowledgement: "Data were collected and
// made publicly available by the International Global Ship-based Hydrographic Investigations Program
// (GO-SHIP; http://www.go-ship.org/) with National Capability funding from the UK Natural Environment
// Research Council to the National Oceanography Centre."
//
// The netCDF files are read here by Debian's python3 netCDF4 (an independent reading, not the app's
// parser) into the plain cast CSV (api.md) that the app ingests.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { uploadAndWait } from './lines-helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

const PY = process.env.GSW_PYTHON ?? '/usr/bin/python3';
const ZIP = join(process.cwd(), 'fixtures/real/sr1b-2015/74JC20150110_nc_ctd.zip');

const CONVERT = `
import sys, zipfile, io, os, datetime, netCDF4
out = sys.argv[2]
with zipfile.ZipFile(sys.argv[1]) as z:
    for name in sorted(n for n in z.namelist() if n.endswith('.nc')):
        d = netCDF4.Dataset('mem', memory=z.read(name))
        v = d.variables
        t = datetime.datetime(1980, 1, 1) + datetime.timedelta(minutes=float(v['time'][:].ravel()[0]))
        st = int(d.STATION_NUMBER); ca = int(d.CAST_NUMBER)
        rows = ['# station: %d' % st, '# cast: %d' % ca, '# latitude: %.5f' % float(v['latitude'][:].ravel()[0]),
                '# longitude: %.5f' % float(v['longitude'][:].ravel()[0]), '# time: %sZ' % t.strftime('%Y-%m-%dT%H:%M:%S'),
                '# bottom_depth: %s' % d.BOTTOM_DEPTH_METERS, 'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]']
        p, T, S = v['pressure'][:], v['temperature'][:], v['salinity'][:]
        for k in range(len(p)):
            if p[k] is not None and not any(hasattr(x, 'mask') and x.mask for x in (p[k], T[k], S[k])):
                rows.append('%.1f,%.4f,%.4f' % (p[k], T[k], S[k]))
        open(os.path.join(out, 'sr1b_%03d_%02d.csv' % (st, ca)), 'w').write('\\n'.join(rows) + '\\n')
`;

// Independent distances: gsw.distance of Debian's python3-gsw (TEOS-10 GSW toolbox), m between
// consecutive positions, summed.
const GSW_DISTANCE = `
import sys, json, numpy as np, gsw
pos = json.loads(sys.stdin.read())
d = gsw.distance(np.array([p[0] for p in pos]), np.array([p[1] for p in pos]))
print(json.dumps([0.0] + list(np.cumsum(d) / 1000.0)))
`;

let t: TestApp;
let cruiseId: string;
let who: Awaited<ReturnType<typeof agentFor>>;
let files: string[];

beforeAll(async () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-sr1b-'));
  execFileSync(PY, ['-c', CONVERT, ZIP, dir]);
  files = readdirSync(dir)
    .sort()
    .map((f) => join(dir, f));
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const u = await createUser('sr1b-chief@example.test');
  const c = await Cruise.create({
    name: 'SR1B 2015 (real data, tests only)',
    ship: 'RRS James Clark Ross',
    startDate: '2015-01-10',
    endDate: '2015-01-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'chief_scientist');
  who = await agentFor(t.app, 'sr1b-chief@example.test');
  await uploadAndWait(who, cruiseId, files);
}, 300_000);
afterAll(async () => {
  await t?.close();
});

type Station = { station: string; x: number; latitude: number; longitude: number };

describe('SR1B 2015 (GO-SHIP, CCHDO; see the acknowledgement at the head of this file) as a line', () => {
  let lineId: string;
  it('the default line and a line from the station list both have 30 columns, one per station in order', async () => {
    expect(files).toHaveLength(30);
    const lines = (await who.agent.get(`/api/cruises/${cruiseId}/lines`)).body;
    expect(lines[0].stations).toHaveLength(30);
    expect(lines[0].offLine).toEqual([]);
    const names = Array.from({ length: 30 }, (_, i) => String(i + 1));
    const r = await who.agent
      .post(`/api/cruises/${cruiseId}/lines`)
      .set('x-csrf-token', who.csrf)
      .send({ name: 'SR1B', stations: names });
    expect(r.status).toBe(201);
    lineId = r.body.id;
    const s = (
      await who.agent
        .get(`/api/cruises/${cruiseId}/section`)
        .query({ property: 'CT', coord: 'pressure', bin: 20, line: lineId })
    ).body;
    expect(s.stations.map((x: Station) => x.station)).toEqual(names);
  });
  it('x strictly increases and lies within 2 % of the great-circle track (gsw.distance of python3-gsw)', async () => {
    const s = (
      await who.agent
        .get(`/api/cruises/${cruiseId}/section`)
        .query({ property: 'CT', coord: 'pressure', bin: 20, line: lineId })
    ).body;
    const st = s.stations as Station[];
    for (let i = 1; i < st.length; i++) expect(st[i].x).toBeGreaterThan(st[i - 1].x);
    const ref = JSON.parse(
      execFileSync(PY, ['-c', GSW_DISTANCE], {
        input: JSON.stringify(st.map((x) => [x.longitude, x.latitude])),
      }).toString(),
    ) as number[];
    for (let i = 1; i < st.length; i++) expect(Math.abs(st[i].x - ref[i]) / ref[i]).toBeLessThan(0.02);
    // Drake Passage is about 800 km wide along this line (from memory: the SR1B line is some 750–850 km)
    expect(st[29].x).toBeGreaterThan(700);
    expect(st[29].x).toBeLessThan(900);
  });
  it('geostrophic speeds stay under 1.5 m/s and the transport per layer is reported', async () => {
    // Layers in σ0 (kg/m³): surface water, the intermediate layers, upper and lower circumpolar deep water.
    const levels = '20,26.8,27.2,27.5,27.7,27.8,28.5';
    const g = (await who.agent.get(`/api/cruises/${cruiseId}/geostrophy`).query({ line: lineId, levels, bin: 20 }))
      .body;
    // 29 consecutive pairs; on the shelf stations 3 and 4 are 2.0 km apart (gsw.distance), and a pair
    // closer than the 2 km minimum is skipped and named rather than divided by a near-zero width
    expect(g.pairs.length + g.skipped.length).toBe(29);
    for (const k of g.skipped) expect(k.distanceKm).toBeLessThan(2);
    expect(g.skipped.length).toBeLessThanOrEqual(1);
    let max = 0;
    for (const row of g.velocity as (number | null)[][])
      for (const v of row) if (v !== null && Math.abs(v) > max) max = Math.abs(v);
    expect(max).toBeGreaterThan(0.1);
    expect(max).toBeLessThan(1.5);
    const total = (g.layers as { total: number }[]).reduce((a, l) => a + l.total, 0);
    const one = (
      await who.agent.get(`/api/cruises/${cruiseId}/geostrophy`).query({ line: lineId, levels: '20,28.5', bin: 20 })
    ).body;
    expect(total).toBeCloseTo(one.layers[0].total, 6);
    // Cunningham, Alderson, King & Brandon (2003), "Transport and variability of the Antarctic
    // Circumpolar Current in Drake Passage", JGR 108(C5): baroclinic transport relative to the deepest
    // common level 107–150 Sv across six SR1B occupations (from memory). Eastward flow: the line runs
    // northward, so positive (to its left) is westward and the ACC comes out negative.
    expect(-total).toBeGreaterThan(90);
    expect(-total).toBeLessThan(170);
    console.log(
      `SR1B 2015 transport per σ0 layer (Sv, relative to the deepest common level): ${(
        g.layers as { sigmaTop: number; sigmaBottom: number; total: number }[]
      )
        .map((l) => `${l.sigmaTop}–${l.sigmaBottom}: ${l.total.toFixed(1)}`)
        .join('; ')}; total ${total.toFixed(1)}; max |v| ${max.toFixed(2)} m/s`,
    );
  });
});
