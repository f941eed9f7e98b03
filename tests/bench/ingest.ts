// Ingest figures for `npm run bench -- ingest` (needs the test services). Invented casts (the
// test generator castCsv, 1 dbar steps) are uploaded through the API of the real app and ingested
// by an in-process worker (its compute threads) until every upload is ready:
//   - 100 casts × 2000 levels as one zip, and as 100 one-file requests sent two at a time as the
//     Intake screen sends them (src/features/intake/api.ts PARALLEL_SENDS);
//   - one cast of 5000 levels (the technician at sea), and 60 casts × 5000 levels (file by file);
// each beside the scripting path measured in the same run: python3-gsw (Debian 3.6.16 through
// /usr/bin/python3 or $GSW_PYTHON) reading the same files with numpy and deriving SA, CT, σ0
// and N² (timed inside Python, best of 3, interpreter start-up excluded). Then where the time
// went (summed over uploads from server/jobs/ingestTimings.ts) and the read-back of a cruise.
import request from 'supertest';
import { loadavg } from 'node:os';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BenchResult } from './modules';
import { runPythonJson } from '../reference/python';

const PYTHON = String.raw`
import json, sys, time, glob
import numpy as np
import gsw
files = sorted(glob.glob(sys.argv[1] + '/*.csv'))
def run():
    out = []
    for f in files:
        with open(f) as fh:
            text = fh.read()
        lines = text.splitlines()
        meta = {}
        k = 0
        while lines[k].startswith('#'):
            key, _, value = lines[k][1:].partition(':')
            meta[key.strip()] = value.strip()
            k += 1
        a = np.loadtxt(lines[k + 1:], delimiter=',')
        p, t, SP = a[:, 0], a[:, 1], a[:, 2]
        lat, lon = float(meta['latitude']), float(meta['longitude'])
        SA = gsw.SA_from_SP(SP, p, lon, lat)
        CT = gsw.CT_from_t(SA, t, p)
        s0 = gsw.sigma0(SA, CT)
        N2, pm = gsw.Nsquared(SA, CT, p, lat)
        out.append(len(p))
    return out
times = []
for _ in range(3):
    t0 = time.perf_counter(); levels = run(); times.append(time.perf_counter() - t0)
print(json.dumps({'seconds': min(times), 'levels': int(sum(levels)), 'version': gsw.__version__}))
`;

type File = { name: string; data: Buffer };

/** Files the Intake screen sends at once (PARALLEL_SENDS in src/features/intake/api.ts). */
const PARALLEL_SENDS = 2;

function scriptingPath(files: File[]): { seconds: number; levels: number } {
  const dir = mkdtempSync(join(tmpdir(), 'sigmaline-ingest-ref-'));
  try {
    for (const f of files) writeFileSync(join(dir, f.name), f.data);
    return runPythonJson<{ seconds: number; levels: number }>(PYTHON, { args: [dir] });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export async function bench(): Promise<BenchResult[]> {
  process.env.NODE_ENV ??= 'test';
  process.env.LOG_LEVEL ??= 'warn';
  const { makeTestApp, createUser, addMember, agentFor } = await import('../api/helpers');
  const { castCsv, sleep, zipBuffer } = await import('../api/fault-helpers');
  const { Cast, Cruise, Upload } = await import('../../server/models/index');
  const { startWorkers } = await import('../../server/jobs/worker');
  const { readColumns } = await import('../../server/services/columns');
  const { ingestTimingsMark, ingestTimingsSince } = await import('../../server/jobs/ingestTimings');

  const loadBefore = loadavg()[0];
  const t = await makeTestApp({ LOG_LEVEL: 'warn', DB_POOL_MAX: '10' });
  const out: BenchResult[] = [
    {
      name: 'machine load average (1 min) when this module started, 2 cores shared with other work',
      value: loadBefore,
      unit: '',
    },
  ];
  try {
    const workers = await startWorkers(t.deps);
    const tech = await createUser('ingest-bench@example.test');
    const a = await agentFor(t.app, 'ingest-bench@example.test');
    let cruiseNo = 0;
    const newCruise = async () => {
      const c = await Cruise.create({
        name: `Ingest bench ${++cruiseNo}`,
        ship: 'RV Bench',
        startDate: '2026-06-01',
        endDate: '2026-06-30',
        portStart: null,
        portEnd: null,
        region: null,
        description: null,
        createdBy: tech.id,
      });
      await addMember(tech.id, c.id, 'technician');
      return c.id;
    };
    const makeFiles = (n: number, maxP: number, seed: number): File[] =>
      Array.from({ length: n }, (_, i) => ({
        name: `c${seed}-${String(i + 1).padStart(3, '0')}.csv`,
        data: Buffer.from(
          castCsv({
            station: `S${seed}-${i + 1}`,
            latitude: -40 + i * 0.05,
            longitude: -30 + i * 0.06,
            time: new Date(Date.UTC(2026, 5, 2, i)).toISOString(),
            maxP,
            step: 1,
            bottomDepth: maxP + 100,
            seed: seed + i,
          }),
        ),
      }));

    const post = (cruiseId: string, files: File[]) => {
      let req: request.Test = a.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', a.csrf);
      for (const f of files) req = req.attach('files', f.data, f.name);
      return req.then((r) => {
        if (r.status !== 202)
          throw new Error(`ingest bench: upload answered ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
        return (r.body.uploads as { id: string }[]).map((u) => u.id);
      });
    };
    /** Upload (as one zip, or one file a request with PARALLEL_SENDS in flight) and wait until all are ready. */
    const run = async (label: string, files: File[], how: 'zip' | 'files', expectCasts: number) => {
      const cruiseId = await newCruise();
      const body =
        how === 'zip'
          ? [{ name: `${label}.zip`, data: await zipBuffer(files.map((f) => ({ name: f.name, data: f.data }))) }]
          : files;
      const mark = ingestTimingsMark();
      const t0 = performance.now();
      const ids: string[] = [];
      let next = 0;
      await Promise.all(
        Array.from({ length: how === 'zip' ? 1 : PARALLEL_SENDS }, async () => {
          while (next < body.length) ids.push(...(await post(cruiseId, [body[next++]])));
        }),
      );
      const uploadedMs = performance.now() - t0;
      const deadline = Date.now() + 300_000;
      for (;;) {
        const ready = await Upload.count({ where: { id: ids, status: 'ready' } });
        if (ready === ids.length) break;
        const failed = await Upload.findOne({ where: { id: ids, status: 'failed' } });
        if (failed)
          throw new Error(`ingest bench: ${failed.filename} failed: ${JSON.stringify(failed.errors).slice(0, 300)}`);
        if (Date.now() > deadline) throw new Error(`ingest bench: only ${ready} of ${ids.length} ready after 300 s`);
        await sleep(10);
      }
      const wallS = (performance.now() - t0) / 1000;
      const casts = await Cast.findAll({ where: { cruiseId }, attributes: ['id', 'levels'] });
      const levels = casts.reduce((s, x) => s + x.levels, 0);
      if (casts.length !== expectCasts)
        throw new Error(`ingest bench: ${casts.length} casts stored, expected ${expectCasts}`);
      const tm = ingestTimingsSince(mark);
      const sum = (k: 'fetchMs' | 'parseMs' | 'deriveMs' | 'storeMs' | 'computeWaitMs') =>
        tm.reduce((s, x) => s + x[k], 0) / 1000;
      const waits = tm.map((x) => x.queueWaitMs ?? 0).sort((x, y) => x - y);
      const breakdown =
        `upload ${(uploadedMs / 1000).toFixed(2)} s wall; per upload summed: queue wait ${(waits.reduce((s, x) => s + x, 0) / 1000).toFixed(2)} s ` +
        `(median ${(waits[waits.length >> 1] ?? 0).toFixed(0)} ms), fetch ${sum('fetchMs').toFixed(2)} s, parse ${sum('parseMs').toFixed(2)} s, derive ${sum('deriveMs').toFixed(2)} s, ` +
        `waiting for a thread ${sum('computeWaitMs').toFixed(2)} s, store ${sum('storeMs').toFixed(2)} s`;
      return { cruiseId, wallS, uploadedMs, levels, casts, breakdown };
    };

    // warm-up: the threads' first casts and the database's first inserts
    await run('warm', makeFiles(4, 500, 9000), 'files', 4);

    const hundred = makeFiles(100, 2000, 1000);
    const ref100 = scriptingPath(hundred);
    const zip = await run('hundred-zip', hundred, 'zip', 100);
    const files = await run('hundred-files', makeFiles(100, 2000, 3000), 'files', 100);
    const one = makeFiles(1, 5000, 5000);
    const refOne = scriptingPath(one);
    const single = await run('one-deep', one, 'files', 1);
    const sixty = makeFiles(60, 5000, 6000);
    const ref60 = scriptingPath(sixty);
    const deep = await run('sixty-deep', sixty, 'files', 60);

    out.push(
      {
        name: 'scripting path: python3-gsw reads the 100 × 2000 files and derives SA, CT, σ0, N²',
        value: ref100.seconds,
        unit: 's',
      },
      {
        name: '100 casts × 2000 levels as one zip, upload to all ready',
        value: zip.wallS,
        reference: ref100.seconds,
        unit: 's',
        target: '< 2 s and ≤ 10× the scripting path',
      },
      { name: `  where the time went: ${zip.breakdown}`, value: zip.levels / zip.wallS, unit: 'levels/s' },
      {
        name: `100 casts × 2000 levels as 100 one-file requests (${PARALLEL_SENDS} in flight, as the Intake screen), upload to all ready`,
        value: files.wallS,
        reference: ref100.seconds,
        unit: 's',
        target: '< 2 s and ≤ 15× the scripting path',
      },
      { name: `  where the time went: ${files.breakdown}`, value: files.levels / files.wallS, unit: 'levels/s' },
      {
        name: 'one cast of 5000 levels, upload to ready',
        value: single.wallS,
        reference: refOne.seconds,
        unit: 's',
        target: '< 0.5 s',
      },
      { name: `  where the time went: ${single.breakdown}`, value: single.levels / single.wallS, unit: 'levels/s' },
      {
        name: '60 casts × 5000 levels, one file a request, upload to all ready',
        value: deep.wallS,
        reference: ref60.seconds,
        unit: 's',
        target: '< 4 s',
      },
      { name: `  where the time went: ${deep.breakdown}`, value: deep.levels / deep.wallS, unit: 'levels/s' },
    );

    // read-back of every column of the 60 deep casts: median of 5 after one warm-up
    const castIds = deep.casts.map((x) => x.id);
    const warm = await readColumns(castIds);
    const nCols = [...warm.values()].reduce(
      (s, x) => s + Object.keys(x.columns).length + Object.keys(x.flags).length,
      0,
    );
    const times: number[] = [];
    for (let i = 0; i < 5; i++) {
      const r0 = performance.now();
      const m = await readColumns(castIds);
      times.push(performance.now() - r0);
      if (m.size !== castIds.length) throw new Error('ingest bench: read-back lost casts');
    }
    times.sort((x, y) => x - y);
    out.push({
      name: `read-back of all 60 deep casts' columns (${nCols} columns, readColumns, median of 5)`,
      value: times[2],
      unit: 'ms',
    });
    await workers.stop();
    return out;
  } finally {
    await t.close();
  }
}
