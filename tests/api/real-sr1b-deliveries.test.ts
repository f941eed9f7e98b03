// The real SR1B section delivered as an isopycnal table (CSV), a NetCDF and CTD exchange files, each
// read back and checked against an independent reading of the data office's own files with Debian's
// python3-netcdf4: times, positions and the measured values at the written decimals.
//
// Real data: fixtures/real/sr1b-2015 (CCHDO distribution of GO-SHIP SR1B, RRS James Clark Ross
// JR306, expocode 74JC20150110). "Data were collected and made publicly available by the
// International Global Ship-based Hydrographic Investigations Program (GO-SHIP;
// http://www.go-ship.org/) with National Capability funding from the UK Natural Environment
// Research Council to the National Oceanography Centre."
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';
import { unzip } from '../support/zip';

const ZIP = join(process.cwd(), 'fixtures/real/sr1b-2015/74JC20150110_nc_ctd.zip');
const PY = process.env.GSW_PYTHON ?? '/usr/bin/python3';
let t: TestApp;
let analyst: Awaited<ReturnType<typeof agentFor>>;
let tech: Awaited<ReturnType<typeof agentFor>>;
const cruises: string[] = [];

async function upload(cruiseId: string, file: string | Buffer, name?: string) {
  const req = tech.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', tech.csrf);
  const res = await (typeof file === 'string' ? req.attach('files', file) : req.attach('files', file, name));
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  for (const u of res.body.uploads as { id: string }[]) {
    const done = await waitFor(
      async () => {
        const r = await tech.agent.get(`/api/uploads/${u.id}`);
        return ['ready', 'failed'].includes(r.body.status) ? r.body : null;
      },
      120_000,
      250,
    );
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
  }
}

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const te = await createUser('sr1bd-tech@example.test');
  const an = await createUser('sr1bd-analyst@example.test');
  for (const name of ['SR1B 2015 (test)', 'SR1B round trip (test)']) {
    const c = await Cruise.create({
      name,
      ship: 'RV Test',
      startDate: '2015-01-10',
      endDate: '2015-01-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: te.id,
    });
    await addMember(te.id, c.id, 'technician');
    await addMember(an.id, c.id, 'analyst');
    cruises.push(c.id);
  }
  tech = await agentFor(t.app, te.email);
  analyst = await agentFor(t.app, an.email);
  await upload(cruises[0], ZIP);
}, 200_000);
afterAll(async () => {
  await t?.close();
});

async function build(body: object) {
  const res = await analyst.agent
    .post(`/api/cruises/${cruises[0]}/deliveries`)
    .set('x-csrf-token', analyst.csrf)
    .send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  return waitFor(async () => {
    const r = await analyst.agent.get(`/api/deliveries/${res.body.id}`);
    return ['ready', 'failed'].includes(r.body.status) ? r.body : null;
  }, 90_000);
}
async function download(id: string, format: string): Promise<Buffer> {
  const res = await analyst.agent.get(`/api/deliveries/${id}/download?format=${format}`).redirects(0);
  expect(res.status).toBe(302);
  return Buffer.from(await (await fetch(res.headers.location)).arrayBuffer());
}

// Independent reading of the data office's files: per cast, time (ISO UTC), position, p, t, SP.
const FILES = String.raw`
import sys, json, zipfile, netCDF4
out = {}
with zipfile.ZipFile(sys.argv[1]) as z:
    for name in z.namelist():
        if not name.endswith('.nc'): continue
        ds = netCDF4.Dataset('m', memory=z.read(name))
        st = str(ds.getncattr('STATION_NUMBER')).strip()
        tv = ds.variables['time']
        when = netCDF4.num2date(float(tv[:].ravel()[0]), tv.units, only_use_cftime_datetimes=False)
        def col(n):
            return [None if v is None else float(v) for v in ds.variables[n][:].astype('float64').filled(float('nan')).tolist()]
        out[st] = {'time': when.strftime('%Y-%m-%dT%H:%M:%SZ'), 'expocode': str(ds.getncattr('EXPOCODE')).strip(),
                   'p': col('pressure'), 't': col('temperature'), 'SP': col('salinity')}
print(json.dumps(out))
`;
type Files = Record<string, { time: string; expocode: string; p: number[]; t: number[]; SP: number[] }>;
const files = (): Files =>
  JSON.parse(execFileSync(PY, ['-c', FILES, ZIP], { encoding: 'utf8', maxBuffer: 64 << 20 })) as Files;

describe('SR1B real section delivered (GO-SHIP, CCHDO distribution; acknowledgement in the file header)', () => {
  it('as an isopycnal table, a NetCDF and exchange files, each read back and checked against the files', async () => {
    const src = files(); // Debian python3-netcdf4 on the data office's files
    const stations = Object.keys(src);
    expect(stations.length).toBe(30);
    const d = await build({ kind: 'isopycnal', ref: 0, levels: '26.8:0.1:27.8', formats: ['csv', 'nc', 'exchange'] });
    expect(d.status, d.error).toBe('ready');
    const expo = src[stations[0]].expocode;
    expect(expo).toBe('74JC20150110');
    for (const f of d.files as { filename: string }[]) expect(f.filename.startsWith(`${expo}_`), f.filename).toBe(true);

    // CSV: the cruise is the expocode, times and positions are the files' own
    const rows = parse((await download(d.id, 'csv')).toString('utf8'), {
      comment: '#',
      columns: true,
      skip_empty_lines: true,
    }) as Record<string, string>[];
    expect(new Set(rows.map((r) => r.cruise))).toEqual(new Set([expo]));
    const byStation = new Map(rows.map((r) => [String(Number(r.station)), r]));
    let timed = 0;
    for (const st of stations) {
      const r = byStation.get(String(Number(st)));
      if (!r) continue; // a station the default line leaves out
      expect(r.time, st).toBe(src[st].time);
      timed++;
    }
    expect(timed).toBeGreaterThanOrEqual(25);
    expect(rows.length).toBe(timed * 11);

    // NetCDF: read back with python3-netcdf4 (time decoded to the same instants)
    const dir = mkdtempSync(join(tmpdir(), 'sl-sr1b-'));
    writeFileSync(join(dir, 'd.nc'), await download(d.id, 'nc'));
    const py = JSON.parse(
      execFileSync(PY, [join(process.cwd(), 'tests/support/cf_readback.py'), join(dir, 'd.nc')], {
        encoding: 'utf8',
        maxBuffer: 64 << 20,
      }),
    ) as {
      time: string[];
      profile_id: string[];
      globals: Record<string, unknown>;
      checks: Record<string, { value_where_flag9: number }>;
    };
    expect(py.globals.expocode).toBe(expo);
    py.profile_id.forEach((id, i) => {
      const st = stations.find((s) => `${Number(s)}` === String(Number(id.split('_')[0])))!;
      expect(py.time[i], id).toBe(src[st].time);
    });
    expect(py.checks.CT.value_where_flag9).toBe(0);

    // Exchange files: read back by our intake into a second cruise, p, t and SP equal the data office's
    // values at the written decimals (0.1 dbar, 1e-4 °C, 1e-4)
    const zip = await download(d.id, 'exchange');
    const entries = await unzip(zip);
    expect(entries.size).toBe(timed);
    await upload(cruises[1], zip, 'sr1b-exchange.zip');
    const back = (await analyst.agent.get(`/api/cruises/${cruises[1]}/casts`)).body as {
      id: string;
      station: string;
    }[];
    expect(back.length).toBe(timed);
    let compared = 0;
    for (const c of back) {
      const st = stations.find((s) => Number(s) === Number(c.station))!;
      const cast = (await analyst.agent.get(`/api/casts/${c.id}`)).body as {
        columns: Record<string, (number | null)[]>;
      };
      const want = src[st];
      const p = cast.columns.pressure;
      for (let i = 0; i < p.length; i++) {
        const k = want.p.findIndex((v) => Math.abs(Number(v.toFixed(1)) - p[i]!) < 1e-9);
        expect(k, `${st} p=${p[i]}`).toBeGreaterThanOrEqual(0);
        expect(Math.abs(cast.columns.temperature[i]! - Number(want.t[k].toFixed(4)))).toBeLessThan(1e-9);
        expect(Math.abs(cast.columns.SP[i]! - Number(want.SP[k].toFixed(4)))).toBeLessThan(1e-9);
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(20_000);
  }, 240_000);
});
