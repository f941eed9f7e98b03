// Section route latency on the demo cruise (its 46 casts ingested through the intake): cold (cache
// empty, every view built from PostgreSQL; three rounds of six views, the cache emptied before
// each) and warm (cached) p95 over many requests; the same with line= (a named line of every other
// station), whose reference is the default line's figure of the same run (the machine is shared).
// The default line is the one the demo seed leaves: the cross-line's own stations left out.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { BenchResult } from './modules';

export async function bench(): Promise<BenchResult[]> {
  const { makeTestApp, createUser, addMember, agentFor, waitFor } = await import('../api/helpers');
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise, Line } = await import('../../server/models/index');
  const { configureCache } = await import('../../server/services/cruiseData');
  /** Empties the grid cache (a byte cap of 0 evicts everything), then puts the app's cap back. */
  const emptyCache = () => {
    configureCache({ maxBytes: 0 });
    configureCache({ maxBytes: t.settings.SECTION_CACHE_MAX_BYTES });
  };
  const t = await makeTestApp({ LOG_LEVEL: 'error' });
  try {
    await startWorkers(t.deps, { concurrency: 2 });
    const u = await createUser('bench-section@example.test');
    const c = await Cruise.create({
      name: 'Bench',
      ship: 'RV Bench',
      startDate: '2026-03-01',
      endDate: '2026-03-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: u.id,
    });
    await addMember(u.id, c.id, 'technician');
    const a = await agentFor(t.app, u.email);
    const dir = join(process.cwd(), 'fixtures/demo/casts');
    const files = readdirSync(dir).sort();
    let req = a.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', a.csrf);
    for (const f of files) req = req.attach('files', join(dir, f));
    await req;
    await waitFor(
      async () => {
        const l = (await a.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string }[];
        return l.length === files.length && l.every((x) => x.status === 'ready');
      },
      300_000,
      500,
    );
    // The default line as the demo seed leaves it (server/seed.ts): the cross-line's own stations out
    const { ensureDefaultLine } = await import('../../server/services/lines');
    const demo = JSON.parse(readFileSync(join(process.cwd(), 'fixtures/demo/cruise.json'), 'utf8')) as {
      lines: { stations: string[]; composite?: unknown }[];
    };
    const onMain = new Set(demo.lines.filter((l) => !l.composite).flatMap((l) => l.stations));
    await (
      await ensureDefaultLine(c.id)
    ).update({ exclude: demo.lines.flatMap((l) => (l.composite ? l.stations.filter((s) => !onMain.has(s)) : [])) });
    // The Section screen's requests: six significant digits (src/features/sections/api.ts).
    const views = (
      [
        { property: 'CT', coord: 'pressure' },
        { property: 'SA', coord: 'pressure' },
        { property: 'CT', coord: 'density' },
        { property: 'SA', coord: 'density', ref: 2000 },
        { property: 'oxygen', coord: 'pressure' },
        { property: 'CT', coord: 'density', inversions: 'raw' },
      ] as Record<string, string | number>[]
    ).map((v) => ({ ...v, digits: 6 }));
    // Timed over one listening server and plain HTTP with the session cookie, as a browser would.
    const server = t.app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
    let cookie = '';
    const csrfRes = await fetch(`${base}/api/auth/csrf`);
    cookie = (csrfRes.headers.get('set-cookie') ?? '').split(';')[0];
    const token = ((await csrfRes.json()) as { token: string }).token;
    const login = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': token },
      body: JSON.stringify({ email: u.email, password: 'correct-horse-42' }),
    });
    cookie = (login.headers.get('set-cookie') ?? cookie).split(';')[0];
    const time = async (q: Record<string, string | number>) => {
      const t0 = performance.now();
      const r = await fetch(
        `${base}/api/cruises/${c.id}/section?${new URLSearchParams(Object.entries(q).map(([k, v]) => [k, String(v)]))}`,
        { headers: { cookie, 'accept-encoding': 'gzip' } },
      );
      const body = await r.arrayBuffer();
      if (r.status !== 200) throw new Error(`section ${r.status} ${Buffer.from(body).toString().slice(0, 200)}`);
      return performance.now() - t0;
    };
    await time({ property: 'temperature', coord: 'pressure' }); // JIT warm-up of the code path, other parameters
    const coldRounds = async (vs: Record<string, string | number>[]) => {
      const out: number[] = [];
      for (let round = 0; round < 3; round++) {
        emptyCache();
        for (const v of vs) out.push(await time(v));
      }
      return out;
    };
    const cold = await coldRounds(views);
    const warm: number[] = [];
    for (let i = 0; i < 300; i++) warm.push(await time(views[i % views.length]));
    // The same views drawn from a named line of every other station (docs/lines.md).
    const names = [...new Set(files.map((f) => f.replace(/(_ct\d)?\.csv$/, '')))].filter((_, i) => i % 2 === 0);
    const line = await Line.create({
      cruiseId: c.id,
      name: 'Every other station',
      stations: names,
      polyline: null,
      corridorKm: null,
      createdBy: null,
    });
    const lineViews = views.map((v) => ({ ...v, line: line.id }));
    const coldLine = await coldRounds(lineViews);
    const warmLine: number[] = [];
    for (let i = 0; i < 300; i++) warmLine.push(await time(lineViews[i % lineViews.length]));
    const p95 = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(0.95 * (a.length - 1))];
    server.close();
    return [
      {
        name: `section cold (3 × 6 views, ${files.length} casts), p95`,
        value: p95(cold),
        unit: 'ms',
        target: '< 500 ms',
      },
      { name: 'section warm (300 reads), p95', value: p95(warm), unit: 'ms', target: '< 50 ms' },
      {
        name: `section with line= cold (3 × 6 views, ${names.length} stations), p95`,
        value: p95(coldLine),
        reference: p95(cold),
        unit: 'ms',
        target: '< 500 ms',
      },
      {
        name: 'section with line= warm (300 reads), p95',
        value: p95(warmLine),
        reference: p95(warm),
        unit: 'ms',
        target: '< 50 ms',
      },
    ];
  } finally {
    await t.close();
  }
}
