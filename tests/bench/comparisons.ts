// Comparison of two 60-cast lines (5000 levels a cast) through POST /api/comparisons: cold (cache
// empty — each request asks for a pairing distance not asked before, so both lines are read from
// PostgreSQL and compared anew) and warm (cached), over plain HTTP with the session cookie.
// The casts are written straight into the column store (the ingest has its own bench).
import type { BenchResult } from './modules';
import { benchOccupations } from './comparisons-data';

export async function bench(): Promise<BenchResult[]> {
  const { makeTestApp, createUser, addMember } = await import('../api/helpers');
  const { Cast, Cruise, Upload } = await import('../../server/models/index');
  const { writeColumns } = await import('../../server/services/columns');
  const t = await makeTestApp({ LOG_LEVEL: 'error' });
  try {
    const u = await createUser('bench-compare@example.test');
    const { a, b } = benchOccupations(60, 5000);
    const lineIds: string[] = [];
    for (const [name, occ, start] of [
      ['Bench A', a, '2016-03-01'],
      ['Bench B', b, '2026-03-01'],
    ] as const) {
      const c = await Cruise.create({
        name,
        ship: 'RV Bench',
        startDate: start,
        endDate: start,
        portStart: null,
        portEnd: null,
        region: null,
        description: null,
        createdBy: u.id,
      });
      await addMember(u.id, c.id, 'analyst');
      const up = await Upload.create({
        cruiseId: c.id,
        filename: 'bench.csv',
        storageKey: 'k',
        sha256: 'b'.repeat(64),
        size: 1,
        createdBy: u.id,
        status: 'ready',
      });
      await t.deps.db.sequelize.transaction(async (transaction) => {
        for (const k of occ) {
          const row = await Cast.create(
            {
              cruiseId: c.id,
              uploadId: up.id,
              station: k.station,
              cast: k.cast,
              latitude: k.lat,
              longitude: k.lon,
              time: new Date(k.time!),
              bottomDepth: 5200,
              levels: k.p.length,
              inversionCount: 0,
              inversions: [],
              sourceFile: `${k.station}.csv`,
              sourceSha256: 'b'.repeat(64),
            },
            { transaction },
          );
          const z = Float64Array.from(k.p, (p) => -p * 0.99);
          await writeColumns(
            row.id,
            [
              { name: 'pressure', unit: 'dbar', kind: 'measured', values: k.p },
              { name: 'SA', unit: 'g/kg', kind: 'derived', values: k.SA },
              { name: 'CT', unit: 'degC', kind: 'derived', values: k.CT },
              { name: 'z', unit: 'm', kind: 'derived', values: z },
            ],
            transaction,
          );
        }
      });
      lineIds.push(c.id);
    }
    const server = t.app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
    const csrfRes = await fetch(`${base}/api/auth/csrf`);
    let cookie = (csrfRes.headers.get('set-cookie') ?? '').split(';')[0];
    let token = ((await csrfRes.json()) as { token: string }).token;
    const login = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': token },
      body: JSON.stringify({ email: u.email, password: 'correct-horse-42' }),
    });
    cookie = (login.headers.get('set-cookie') ?? cookie).split(';')[0];
    // signing in issues a new session, and with it a new CSRF token
    token = ((await (await fetch(`${base}/api/auth/csrf`, { headers: { cookie } })).json()) as { token: string }).token;
    const defaultLine = async (cruiseId: string) =>
      (
        (await (await fetch(`${base}/api/cruises/${cruiseId}/lines`, { headers: { cookie } })).json()) as {
          id: string;
          isDefault: boolean;
        }[]
      ).find((l) => l.isDefault)!.id;
    const [lineA, lineB] = [await defaultLine(lineIds[0]), await defaultLine(lineIds[1])];
    const time = async (pair: number) => {
      const t0 = performance.now();
      const r = await fetch(`${base}/api/comparisons`, {
        method: 'POST',
        headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': token },
        body: JSON.stringify({ lineA, lineB, property: 'CT', pairDistanceKm: pair, digits: 6 }),
      });
      const body = await r.text();
      if (r.status !== 200) throw new Error(`comparison ${r.status} ${body.slice(0, 200)}`);
      return performance.now() - t0;
    };
    await time(50); // JIT warm-up of the code path
    const cold: number[] = [];
    for (let i = 0; i < 8; i++) cold.push(await time(20 + i));
    const warm: number[] = [];
    for (let i = 0; i < 100; i++) warm.push(await time(20 + (i % 8)));
    server.close();
    const sorted = (v: number[]) => [...v].sort((x, y) => x - y);
    const p = (v: number[], q: number) => sorted(v)[Math.floor(q * (v.length - 1))];
    console.log(
      `comparison cold ms: ${sorted(cold)
        .map((v) => v.toFixed(0))
        .join(' ')}; warm p50 ${p(warm, 0.5).toFixed(1)} p95 ${p(warm, 0.95).toFixed(1)}`,
    );
    return [
      {
        name: 'comparison cold (two 60-cast lines, 5000 levels), median of 8',
        value: p(cold, 0.5),
        unit: 'ms',
        target: '< 300 ms',
      },
      { name: 'comparison cold, slowest of 8', value: p(cold, 1), unit: 'ms', target: '< 300 ms' },
      { name: 'comparison warm (100 reads), p95', value: p(warm, 0.95), unit: 'ms', target: '< 50 ms' },
    ];
  } finally {
    await t.close();
  }
}
