// Ingest figures for `npm run bench` (needs the test services): a 60-cast cruise at 1 dbar to
// 5000 dbar, generated here, uploaded through the API of the real app, ingested by an in-process
// worker at concurrency 2 until every cast is ready; then the read-back time of all 60 casts'
// columns (server/services/columns.ts readColumns).
import request from 'supertest';
import { loadavg } from 'node:os';
import type { BenchResult } from './modules';

const CASTS = 60;
const MAX_P = 5000;

export async function bench(): Promise<BenchResult[]> {
  process.env.NODE_ENV ??= 'test';
  process.env.LOG_LEVEL ??= 'warn';
  const { makeTestApp, createUser, addMember, agentFor } = await import('../api/helpers');
  const { castCsv, sleep } = await import('../api/fault-helpers');
  const { Cast, Cruise, Upload } = await import('../../server/models/index');
  const { startWorkers } = await import('../../server/jobs/worker');
  const { readColumns } = await import('../../server/services/columns');

  const loadBefore = loadavg()[0];
  const t = await makeTestApp({ LOG_LEVEL: 'warn' });
  try {
    await startWorkers(t.deps, { concurrency: 2 });
    const tech = await createUser('ingest-bench@example.test');
    const c = await Cruise.create({ name: 'Ingest bench', ship: 'RV Bench', startDate: '2026-06-01', endDate: '2026-06-30', portStart: null, portEnd: null, region: null, description: null, createdBy: tech.id });
    await addMember(tech.id, c.id, 'technician');
    const a = await agentFor(t.app, 'ingest-bench@example.test');
    const files = Array.from({ length: CASTS }, (_, i) => ({ name: `deep-${String(i + 1).padStart(2, '0')}.csv`,
      data: Buffer.from(castCsv({ station: `D${i + 1}`, latitude: -40 + i * 0.25, longitude: -30 + i * 0.3, time: new Date(Date.UTC(2026, 5, 2, i * 5)).toISOString(), maxP: MAX_P, step: 1, bottomDepth: 5100, seed: 2000 + i })) }));
    const bytes = files.reduce((s, f) => s + f.data.length, 0);

    const t0 = performance.now();
    const ids: string[] = [];
    // ten files a request, three requests in flight
    const batches = Array.from({ length: CASTS / 10 }, (_, k) => files.slice(k * 10, k * 10 + 10));
    for (let k = 0; k < batches.length; k += 3) {
      const res = await Promise.all(batches.slice(k, k + 3).map((b) => {
        let req: request.Test = a.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', a.csrf);
        for (const f of b) req = req.attach('files', f.data, f.name);
        return req;
      }));
      for (const r of res) {
        if (r.status !== 202) throw new Error(`ingest bench: upload answered ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
        ids.push(...(r.body.uploads as { id: string }[]).map((u) => u.id));
      }
    }
    const uploadedMs = performance.now() - t0;
    const deadline = Date.now() + 300_000;
    for (;;) {
      const ready = await Upload.count({ where: { id: ids, status: 'ready' } });
      if (ready === CASTS) break;
      const failed = await Upload.findOne({ where: { id: ids, status: 'failed' } });
      if (failed) throw new Error(`ingest bench: ${failed.filename} failed: ${JSON.stringify(failed.errors).slice(0, 300)}`);
      if (Date.now() > deadline) throw new Error(`ingest bench: only ${ready} of ${CASTS} ready after 300 s`);
      await sleep(50);
    }
    const wallS = (performance.now() - t0) / 1000;
    const casts = await Cast.findAll({ where: { cruiseId: c.id }, attributes: ['id', 'levels'] });
    const levels = casts.reduce((s, x) => s + x.levels, 0);
    if (casts.length !== CASTS || levels !== CASTS * MAX_P) throw new Error(`ingest bench: ${casts.length} casts with ${levels} levels, expected ${CASTS} × ${MAX_P}`);

    // read-back of every column of the 60 casts: median of 5 after one warm-up
    const castIds = casts.map((x) => x.id);
    const warm = await readColumns(castIds);
    const nCols = [...warm.values()].reduce((s, x) => s + Object.keys(x.columns).length + Object.keys(x.flags).length, 0);
    const times: number[] = [];
    for (let i = 0; i < 5; i++) {
      const r0 = performance.now();
      const m = await readColumns(castIds);
      times.push(performance.now() - r0);
      if (m.size !== CASTS) throw new Error('ingest bench: read-back lost casts');
    }
    times.sort((x, y) => x - y);
    return [
      { name: 'machine load average (1 min) when this module started, 2 cores shared with other work', value: loadBefore, unit: '' },
      { name: `ingest of ${CASTS} casts × ${MAX_P} levels (${(bytes / 1048576).toFixed(1)} MB) through the API until all ready, worker concurrency 2`, value: wallS, unit: 's', target: '< 20 s (aim < 8 s)' },
      { name: 'of which the uploads themselves (202 for all files)', value: uploadedMs / 1000, unit: 's' },
      { name: 'ingest throughput', value: levels / wallS, unit: 'levels/s' },
      { name: `read-back of all ${CASTS} casts' columns (${nCols} columns, readColumns, median of 5)`, value: times[2], unit: 'ms' },
    ];
  } finally {
    await t.close();
  }
}
