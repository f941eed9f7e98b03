// Comparison of two 60-cast lines (5000 levels a cast) through POST /api/comparisons, over plain
// HTTP with the session cookie, gzip accepted as a browser does. Three kinds of cold read:
// - a new pairing distance: the comparison is built anew from the per-cast grids already held (the
//   issue's "cold": pairing, interpolation, decomposition, transport, JSON and gzip);
// - a new pressure-level spacing: the casts are in memory but every cast is gridded and remapped anew;
// - a new set of kept flags: nothing is held, both lines are read from PostgreSQL and remapped.
// The body asks for 5 significant digits, as the screen does. Warm: a comparison already built.
// References measured in the same run: for warm, the p95 of a
// signed-in GET /api/auth/me (the floor of any request here); for cold, a section of line A built
// anew (GET …/section, density frame, the same 60 casts). Stage times are those of the last build.
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
    const { lastBuildStages } = await import('../../server/services/comparisons');
    let bytes = { plain: 0, gz: 0 };
    const time = async (choices: Record<string, unknown>) => {
      const t0 = performance.now();
      const r = await fetch(`${base}/api/comparisons`, {
        method: 'POST',
        headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': token, 'accept-encoding': 'gzip' },
        body: JSON.stringify({ lineA, lineB, property: 'CT', pairDistanceKm: 20, digits: 5, ...choices }),
      });
      const body = await r.text();
      if (r.status !== 200) throw new Error(`comparison ${r.status} ${body.slice(0, 200)}`);
      bytes = { plain: Buffer.byteLength(body), gz: Number(r.headers.get('content-length') ?? 0) };
      return performance.now() - t0;
    };
    const stagesOf = () =>
      Object.entries(lastBuildStages)
        .map(([k, v]) => `${k} ${v.toFixed(1)}`)
        .join(', ');
    await time({ pairDistanceKm: 50, bin: 9 }); // JIT warm-up of the code path
    const nothing: number[] = [];
    for (let i = 0; i < 4; i++) nothing.push(await time({ flags: [1, 2, 3 + i] }));
    const stagesNothing = stagesOf();
    const regrid: number[] = [];
    for (let i = 0; i < 4; i++) regrid.push(await time({ bin: 11 + i }));
    const stagesRegrid = stagesOf();
    const cold: number[] = [];
    for (let i = 0; i < 8; i++) cold.push(await time({ pairDistanceKm: 20 + i }));
    const stagesCold = stagesOf();
    const warm: number[] = [];
    for (let i = 0; i < 100; i++) warm.push(await time({ pairDistanceKm: 20 + (i % 8) }));
    // references, same run
    const floor: number[] = [];
    for (let i = 0; i < 100; i++) {
      const t0 = performance.now();
      await (await fetch(`${base}/api/auth/me`, { headers: { cookie } })).text();
      floor.push(performance.now() - t0);
    }
    const section: number[] = [];
    for (let i = 0; i < 4; i++) {
      const t0 = performance.now();
      const r = await fetch(
        `${base}/api/cruises/${lineIds[0]}/section?property=CT&coord=density&digits=6&line=${lineA}&gapFactor=${2 + i}`,
        { headers: { cookie, 'accept-encoding': 'gzip' } },
      );
      await r.arrayBuffer();
      if (r.status !== 200) throw new Error(`section ${r.status}`);
      section.push(performance.now() - t0);
    }
    server.close();
    const sorted = (v: number[]) => [...v].sort((x, y) => x - y);
    const p = (v: number[], q: number) => sorted(v)[Math.floor(q * (v.length - 1))];
    const ms = (v: number[]) =>
      sorted(v)
        .map((x) => x.toFixed(0))
        .join(' ');
    console.log(`comparison, nothing held, ms: ${ms(nothing)}; stages of the last: ${stagesNothing}`);
    console.log(`comparison, casts held, regridded, ms: ${ms(regrid)}; stages of the last: ${stagesRegrid}`);
    console.log(`comparison cold (new pairing) ms: ${ms(cold)}; stages of the last: ${stagesCold}`);
    console.log(
      `comparison warm p50 ${p(warm, 0.5).toFixed(1)} p95 ${p(warm, 0.95).toFixed(1)}; /auth/me p50 ${p(floor, 0.5).toFixed(1)} p95 ${p(floor, 0.95).toFixed(1)}; section cold ms: ${ms(section)}`,
    );
    console.log(`answer ${(bytes.plain / 1e6).toFixed(2)} MB of JSON, ${(bytes.gz / 1e6).toFixed(2)} MB gzipped`);
    return [
      {
        name: 'comparison cold (new pairing; two 60-cast lines, 5000 levels), median of 8',
        value: p(cold, 0.5),
        reference: p(section, 0.5),
        unit: 'ms',
        target: '< 300 ms',
      },
      { name: 'comparison cold (new pairing), slowest of 8', value: p(cold, 1), unit: 'ms', target: '< 300 ms' },
      {
        name: 'comparison, casts held but regridded, median of 4',
        value: p(regrid, 0.5),
        reference: p(section, 0.5),
        unit: 'ms',
      },
      {
        name: 'comparison, nothing held (read from PostgreSQL), median of 4',
        value: p(nothing, 0.5),
        reference: p(section, 0.5),
        unit: 'ms',
      },
      {
        name: 'comparison warm (100 reads), p95',
        value: p(warm, 0.95),
        reference: p(floor, 0.95),
        unit: 'ms',
        target: '< 50 ms',
      },
    ];
  } finally {
    await t.close();
  }
}
