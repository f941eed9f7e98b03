// Load figures for `npm run bench` (needs the test services, see DEVELOPERS.md): the real app as
// deployed — one web process and one worker process, children of this one, on loopback — with a
// cruise of a few real casts; autocannon, in this process, drives
// 50 concurrent section reads (signed in) and, at the same time, 5 concurrent uploads of distinct cast
// files into a second cruise, for 30 s (BENCH_LOAD_SECONDS), each stream also capped in count.
// Latencies are every response's own time, from autocannon's `response` event.
import autocannon from 'autocannon';
import { loadavg } from 'node:os';
import type { BenchResult } from './modules';

const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 30);
const READERS = 50;
const UPLOADERS = Number(process.env.BENCH_LOAD_UPLOADERS ?? 5); // 0: reads alone, to compare
const RAW_UPLOADERS = Number(process.env.BENCH_LOAD_RAW_UPLOADERS ?? 2); // each sends raw 24 Hz casts

function pct(sorted: number[], p: number) {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

export async function bench(): Promise<BenchResult[]> {
  process.env.NODE_ENV ??= 'test';
  process.env.LOG_LEVEL ??= 'warn';
  const { makeTestApp, createUser, addMember, PASSWORD } = await import('../api/helpers');
  const { castCsv, freePort, multipart, rawCastCsv, Session, sleep, spawnChild, serviceEnv, waitHttp } =
    await import('../api/fault-helpers');
  const { Cruise, Upload } = await import('../../server/models/index');

  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const loadBefore = loadavg()[0];
  const t = await makeTestApp({ PUBLIC_URL: base, LOG_LEVEL: 'warn', DB_POOL_MAX: '20' });
  let web: Awaited<ReturnType<typeof spawnChild>> | null = null;
  // The ingest worker runs in its own process, as deployed (README: web processes and workers
  // apart), so parsing and deriving casts do not hold up the web process's event loop.
  const worker = spawnChild(
    'load-worker',
    'server/jobs/worker.ts',
    serviceEnv(t.settings, { WORKER_CONCURRENCY: '1', LOG_LEVEL: 'info' }),
  );
  try {
    await worker.waitForLog(/workers started/, 60_000);
    const chief = await createUser('load-chief@example.test');
    const mk = (name: string) =>
      Cruise.create({
        name,
        ship: 'RV Load',
        startDate: '2026-05-01',
        endDate: '2026-05-20',
        portStart: null,
        portEnd: null,
        region: null,
        description: null,
        createdBy: chief.id,
      });
    const section = await mk('Load section');
    const intake = await mk('Load intake');
    for (const c of [section, intake]) await addMember(chief.id, c.id, 'chief_scientist');
    const analyst = await createUser('load-analyst@example.test');
    await addMember(analyst.id, section.id, 'analyst');
    // The web process is its own process too: this one only generates the load.
    web = spawnChild(
      'load-web',
      'server/index.ts',
      serviceEnv(t.settings, {
        PORT: String(port),
        HOST: '127.0.0.1',
        PUBLIC_URL: base,
        LOG_LEVEL: 'warn',
        DB_POOL_MAX: '20',
      }),
    );
    await waitHttp(`${base}/api/health`, 60_000, web);

    // the section cruise: 8 casts along a line, 2 dbar to 3000 dbar, through the real intake
    const chiefS = new Session(base);
    await chiefS.signIn('load-chief@example.test', PASSWORD);
    const files = Array.from({ length: 8 }, (_, i) => ({
      filename: `line-${i}.csv`,
      data: castCsv({
        station: `L${i + 1}`,
        latitude: -34 - i * 0.5,
        longitude: -20 + i * 0.4,
        time: new Date(Date.UTC(2026, 4, 2, i * 4)).toISOString(),
        maxP: 3000,
        step: 2,
        seed: 70 + i,
      }),
    }));
    const up = await chiefS.upload(section.id, files);
    if (up.status !== 202) throw new Error(`load bench: seeding upload answered ${up.status}`);
    const ids = (up.body.uploads as { id: string }[]).map((u) => u.id);
    const end = Date.now() + 120_000;
    while ((await Upload.count({ where: { id: ids, status: 'ready' } })) < ids.length) {
      if (Date.now() > end || (await Upload.count({ where: { id: ids, status: 'failed' } })) > 0)
        throw new Error('load bench: the seed casts did not all become ready');
      await sleep(200);
    }
    const reader = new Session(base);
    await reader.signIn('load-analyst@example.test', PASSWORD);
    const path = `/api/cruises/${section.id}/section?property=CT&coord=pressure&digits=6`; // as the Section screen asks
    const warm = await reader.req('GET', path);
    if (warm.status !== 200)
      throw new Error(`load bench: section answered ${warm.status} ${JSON.stringify(warm.body).slice(0, 200)}`);

    // distinct small casts for the uploads, made as autocannon asks for them
    const BOUNDARY = '----sigmalineLoadBench';
    const boundary = `multipart/form-data; boundary=${BOUNDARY}`;
    let n = 0;
    const nextBody = () => {
      n++;
      return multipart(
        [
          {
            filename: `load-${n}.csv`,
            data: castCsv({
              station: `U${n}`,
              latitude: -30 - (n % 50) * 0.1,
              longitude: -15 - (n % 37) * 0.1,
              maxP: 400,
              step: 2,
              seed: 10_000 + n,
            }),
          },
        ],
        'files',
        BOUNDARY,
      ).body;
    };

    // raw 24 Hz casts (100 000 scans, ~3 MB each) for the raw uploaders: one body made once, each
    // request a distinct file (its station line differs)
    const rawLines = rawCastCsv(0).split('\n');
    let nRaw = 0;
    const nextRawBody = () => {
      nRaw++;
      return multipart(
        [{ filename: `raw-${nRaw}.csv`, data: [`# station: RAWLOAD${nRaw}`, ...rawLines.slice(1)].join('\n') }],
        'files',
        BOUNDARY,
      ).body;
    };
    const rawLat: number[] = [];
    const rawStatus = new Map<number, number>();

    const readLat: number[] = [];
    const upLat: number[] = [];
    const readStatus = new Map<number, number>();
    const upStatus = new Map<number, number>();
    const run = (opts: autocannon.Options, onResponse: (status: number, ms: number) => void) =>
      new Promise<autocannon.Result>((resolve, reject) => {
        const inst = autocannon(opts, (err, res) => (err ? reject(err) : resolve(res)));
        inst.on('response', (_c: unknown, status: number, _b: number, ms: number) => onResponse(status, ms));
      });
    const count = (m: Map<number, number>, s: number) => m.set(s, (m.get(s) ?? 0) + 1);
    const reads = run(
      {
        url: base + path,
        connections: READERS,
        duration: SECONDS,
        maxOverallRequests: 2_000_000,
        timeout: 10,
        headers: { cookie: reader.cookie!, 'accept-encoding': 'gzip' }, // as a browser asks
      },
      (status, ms) => {
        readLat.push(ms);
        count(readStatus, status);
      },
    );
    const uploads =
      UPLOADERS === 0
        ? Promise.resolve({ errors: 0, timeouts: 0 } as autocannon.Result)
        : run(
            {
              url: base,
              connections: UPLOADERS,
              duration: SECONDS,
              maxOverallRequests: 20_000,
              timeout: 30,
              requests: [
                {
                  method: 'POST',
                  path: `/api/cruises/${intake.id}/uploads`,
                  headers: { cookie: chiefS.cookie!, 'x-csrf-token': chiefS.csrf!, 'content-type': boundary },
                  setupRequest: ((req: autocannon.Request) => ({ ...req, body: nextBody() })) as never,
                },
              ],
            },
            (status, ms) => {
              upLat.push(ms);
              count(upStatus, status);
            },
          );
    const raws =
      RAW_UPLOADERS === 0
        ? Promise.resolve({ errors: 0, timeouts: 0 } as autocannon.Result)
        : run(
            {
              url: base,
              connections: RAW_UPLOADERS,
              duration: SECONDS,
              maxOverallRequests: 20_000,
              timeout: 30,
              requests: [
                {
                  method: 'POST',
                  path: `/api/cruises/${intake.id}/uploads`,
                  headers: { cookie: chiefS.cookie!, 'x-csrf-token': chiefS.csrf!, 'content-type': boundary },
                  setupRequest: ((req: autocannon.Request) => ({ ...req, body: nextRawBody() })) as never,
                },
              ],
            },
            (status, ms) => {
              rawLat.push(ms);
              count(rawStatus, status);
            },
          );
    const [r, u, w] = await Promise.all([reads, uploads, raws]);
    const sectionBytes = JSON.stringify(warm.body).length;
    readLat.sort((a, b) => a - b);
    upLat.sort((a, b) => a - b);
    const non2xx = (m: Map<number, number>) =>
      [...m].filter(([s]) => s < 200 || s >= 300).reduce((a, [, c]) => a + c, 0);
    const readErrors = r.errors + r.timeouts + non2xx(readStatus);
    const upErrors = u.errors + u.timeouts + non2xx(upStatus);
    const ingested = await Upload.count({ where: { cruiseId: intake.id, status: 'ready' } });
    const rawErrors = w.errors + w.timeouts + non2xx(rawStatus);
    const label = `${READERS} readers + ${UPLOADERS} uploaders + ${RAW_UPLOADERS} raw 24 Hz uploaders, ${SECONDS} s`;
    if (readErrors + upErrors > 0)
      console.log(
        `[load] statuses: reads ${JSON.stringify([...readStatus])}, uploads ${JSON.stringify([...upStatus])}, socket errors ${r.errors}/${u.errors}, timeouts ${r.timeouts}/${u.timeouts}`,
      );
    return [
      {
        name: 'machine load average (1 min) when this module started, 2 cores shared with other work',
        value: loadBefore,
        unit: '',
      },
      { name: `section reads per second (${label})`, value: readLat.length / r.duration, unit: 'req/s' },
      { name: 'section response size', value: sectionBytes / 1024, unit: 'KiB' },
      { name: 'section read latency p50', value: pct(readLat, 50), unit: 'ms' },
      { name: 'section read latency p95', value: pct(readLat, 95), unit: 'ms', target: '< 100 ms' },
      { name: 'section read latency p99', value: pct(readLat, 99), unit: 'ms' },
      {
        name: 'section read errors (socket, timeout, non-2xx)',
        value: readErrors,
        unit: 'errors',
        target: 'zero errors',
      },
      { name: 'uploads accepted (202) during the run', value: upStatus.get(202) ?? 0, unit: 'uploads' },
      { name: 'upload latency p50', value: pct(upLat, 50), unit: 'ms' },
      { name: 'upload latency p95', value: pct(upLat, 95), unit: 'ms' },
      { name: 'upload latency p99', value: pct(upLat, 99), unit: 'ms' },
      { name: 'upload errors (socket, timeout, non-2xx)', value: upErrors, unit: 'errors', target: 'zero errors' },
      {
        name: 'raw 24 Hz casts (100 000 scans) accepted (202) during the run',
        value: rawStatus.get(202) ?? 0,
        unit: 'uploads',
      },
      { name: 'raw upload errors (socket, timeout, non-2xx)', value: rawErrors, unit: 'errors', target: 'zero errors' },
      {
        name: 'uploads already ingested when the run ended (one worker process, concurrency 1)',
        value: ingested,
        unit: 'uploads',
      },
    ];
  } finally {
    await web?.stop();
    await worker.stop();
    await t.close();
  }
}
