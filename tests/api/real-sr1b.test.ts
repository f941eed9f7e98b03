// The data office's zip of a real GO-SHIP section, uploaded as a hydrographer has it: 30 WOCE
// netCDF CTD casts in one go, and the section's isopycnal pressures checked against an independent
// reading of the same files (python3-netcdf4) with Debian's python3-gsw.
//
// Real data: fixtures/real/sr1b-2015 (CCHDO distribution of GO-SHIP SR1B, RRS James Clark Ross
// JR306, expocode 74JC20150110). "Data were collected and made publicly available by the
// International Global Ship-based Hydrographic Investigations Program (GO-SHIP;
// http://www.go-ship.org/) with National Capability funding from the UK Natural Environment
// Research Council to the National Oceanography Centre."
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

const ZIP = join(process.cwd(), 'fixtures/real/sr1b-2015/74JC20150110_nc_ctd.zip');
const PY = process.env.GSW_PYTHON ?? '/usr/bin/python3';

let t: TestApp;
let cruiseId: string;
let tech: Awaited<ReturnType<typeof agentFor>>;
let analyst: Awaited<ReturnType<typeof agentFor>>;
let uploadDone: { status: string; castIds: string[]; errors: unknown[]; warnings: unknown[] };

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('sr1b-chief@example.test');
  const c = await Cruise.create({
    name: 'SR1B 2015 (test)',
    ship: 'RV Test',
    startDate: '2015-01-10',
    endDate: '2015-01-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  cruiseId = c.id;
  await addMember(chief.id, c.id, 'chief_scientist');
  const u = await createUser('sr1b-tech@example.test');
  await addMember(u.id, c.id, 'technician');
  const a = await createUser('sr1b-analyst@example.test');
  await addMember(a.id, c.id, 'analyst');
  tech = await agentFor(t.app, 'sr1b-tech@example.test');
  analyst = await agentFor(t.app, 'sr1b-analyst@example.test');
  const res = await tech.agent
    .post(`/api/cruises/${cruiseId}/uploads`)
    .set('x-csrf-token', tech.csrf)
    .attach('files', ZIP);
  expect(res.status).toBe(202);
  const id = res.body.uploads[0].id as string;
  uploadDone = await waitFor(
    async () => {
      const r = await tech.agent.get(`/api/uploads/${id}`);
      return r.body.status === 'ready' || r.body.status === 'failed' ? r.body : null;
    },
    120_000,
    250,
  );
}, 180_000);
afterAll(async () => {
  await t?.close();
});

// Independent reading: python3-netcdf4 opens each member of the zip, python3-gsw derives σ0 from
// the file's SP, t, p and position, and each target σ0 takes its first crossing from the surface
// with linear interpolation in σ0 (the measured profile, inversions as recorded).
const SCRIPT = String.raw`
import sys, json, zipfile
import numpy as np, netCDF4, gsw
targets = json.loads(sys.stdin.read())
out = {}
with zipfile.ZipFile(sys.argv[1]) as z:
    for name in z.namelist():
        if not name.endswith('.nc'):
            continue
        ds = netCDF4.Dataset(name, memory=z.read(name))
        st = ds['station'][:].tobytes().decode().strip().lstrip('0') or '0'
        p = np.ma.filled(ds['pressure'][:].astype(float), np.nan)
        t = np.ma.filled(ds['temperature'][:].astype(float), np.nan)
        sp = np.ma.filled(ds['salinity'][:].astype(float), np.nan)
        good = np.isfinite(p) & np.isfinite(t) & np.isfinite(sp)
        for q in ('pressure_QC', 'temperature_QC', 'salinity_QC'):
            good &= np.isin(np.asarray(ds[q][:]), (1, 2))
        lat = float(ds['latitude'][0]); lon = float(ds['longitude'][0])
        p, t, sp = p[good], t[good], sp[good]
        sa = gsw.SA_from_SP(sp, p, lon, lat)
        s0 = gsw.sigma0(sa, gsw.CT_from_t(sa, t, p))
        res = []
        for s in targets:
            v = None
            for k in range(len(s0) - 1):
                a, b = s0[k], s0[k + 1]
                if min(a, b) <= s <= max(a, b):
                    w = (s - a) / (b - a) if b != a else 0.0
                    v = float(p[k] + w * (p[k + 1] - p[k]))
                    break
            res.append(v)
        out[st] = {'p': res, 'lat': lat, 'lon': lon}
print(json.dumps(out))
`;

describe('the SR1B zip (real WOCE netCDF CTD files)', () => {
  it('uploads in one go and gives 30 casts with stations, positions, times, bottom depths and oxygen', async () => {
    expect(uploadDone.status, JSON.stringify(uploadDone.errors).slice(0, 500)).toBe('ready');
    expect(uploadDone.castIds).toHaveLength(30);
    const casts = (await analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
      id: string;
      station: string;
      cast: string;
      latitude: number;
      longitude: number;
      time: string;
      bottomDepth: number | null;
    }[];
    expect(casts).toHaveLength(30);
    // SOURCE.md: 30 stations, one cast each, occupied 13–18 January 2015 across Drake Passage.
    expect(new Set(casts.map((c) => c.station))).toEqual(new Set(Array.from({ length: 30 }, (_, i) => String(i + 1))));
    for (const c of casts) {
      expect(c.cast).toBe('1');
      expect(c.latitude).toBeGreaterThan(-62);
      expect(c.latitude).toBeLessThan(-54);
      expect(c.longitude).toBeGreaterThan(-66);
      expect(c.longitude).toBeLessThan(-54);
      expect(Date.parse(c.time)).toBeGreaterThanOrEqual(Date.parse('2015-01-13T00:00:00Z'));
      expect(Date.parse(c.time)).toBeLessThan(Date.parse('2015-01-19T00:00:00Z'));
      expect(c.bottomDepth).toBeGreaterThan(100);
    }
    const one = (await analyst.agent.get(`/api/casts/${casts[0].id}`)).body;
    expect(one.units.oxygen).toBe('µmol/kg');
    expect(one.columns.oxygen.filter((v: number | null) => v !== null).length).toBeGreaterThan(10);
    // SOURCE.md: oxygen and the optical sensors carry flag 1 (not calibrated), T and S flag 2.
    expect(new Set(one.flags.oxygen)).toEqual(new Set([1]));
    expect(new Set(one.flags.temperature)).toEqual(new Set([2]));
    expect(Object.keys(one.extras).sort()).toEqual(['fluorescence', 'transmission']);
  });

  it('gives isopycnal pressures equal to an independent python3-gsw reading to 1e-6 dbar', async () => {
    const res = await analyst.agent
      .get(`/api/cruises/${cruiseId}/section`)
      .query({ property: 'CT', coord: 'pressure', inversions: 'raw', levels: '26.9:0.05:27.8', bin: 10 });
    expect(res.status).toBe(200);
    const s = res.body as { stations: { station: string }[]; isopycnals: { sigma: number; p: (number | null)[] }[] };
    expect(s.stations).toHaveLength(30);
    const targets = s.isopycnals.map((l) => l.sigma);
    expect(targets.length).toBeGreaterThan(10);
    const py = spawnSync(PY, ['-c', SCRIPT, ZIP], {
      input: JSON.stringify(targets),
      encoding: 'utf8',
      maxBuffer: 1 << 26,
    });
    expect(py.status, py.stderr).toBe(0);
    const ref = JSON.parse(py.stdout) as Record<string, { p: (number | null)[] }>;
    let compared = 0;
    let worst = 0;
    s.stations.forEach((st, i) => {
      const r = ref[st.station];
      expect(r, `station ${st.station} in the python reading`).toBeTruthy();
      targets.forEach((_, j) => {
        const ours = s.isopycnals[j].p[i];
        const theirs = r.p[j];
        expect(ours === null, `station ${st.station}, σ0 ${targets[j]}: one side has no crossing`).toBe(
          theirs === null,
        );
        if (ours !== null && theirs !== null) {
          worst = Math.max(worst, Math.abs(ours - theirs));
          compared++;
        }
      });
    });
    expect(compared).toBeGreaterThan(200);
    expect(worst).toBeLessThanOrEqual(1e-6);
  });
});
