// The demo cruise goes through the same intake as any upload, and every inversion planted in it
// (fixtures/demo/planted.json; invented data, a behaviour check of the pipeline, not a science check)
// comes out as a warning of the right class at the right place, and no other.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

type Planted = { kind: 'spike' | 'overturn'; station: string; pressure?: number; pTop?: number; pBottom?: number };
let t: TestApp;
let cruiseId: string;
let tech: Awaited<ReturnType<typeof agentFor>>;
const dir = join(process.cwd(), 'fixtures/demo/casts');

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const u = await createUser('demo-tech@example.test');
  const c = await Cruise.create({
    name: 'Demo check',
    ship: 'RV Check',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'technician');
  tech = await agentFor(t.app, 'demo-tech@example.test');
}, 120_000);
afterAll(async () => {
  await t?.close();
});

describe('demo cruise through the intake', () => {
  it('ingests all 46 casts (40 on the main line) and finds exactly the planted inversions', async () => {
    let req = tech.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', tech.csrf);
    const files = readdirSync(dir).sort();
    for (const f of files) req = req.attach('files', join(dir, f));
    const res = await req;
    expect(res.status).toBe(202);
    await waitFor(
      async () => {
        const list = (await tech.agent.get(`/api/cruises/${cruiseId}/uploads`)).body as { status: string }[];
        return list.length === files.length && list.every((u) => u.status === 'ready' || u.status === 'failed');
      },
      150_000,
      500,
    );
    const failed = (
      (await tech.agent.get(`/api/cruises/${cruiseId}/uploads`)).body as {
        status: string;
        filename: string;
        errors: unknown[];
      }[]
    ).filter((u) => u.status === 'failed');
    expect(failed, JSON.stringify(failed)).toEqual([]);
    const casts = (await tech.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
      id: string;
      station: string;
      inversions: number;
    }[];
    expect(casts).toHaveLength(files.length);
    const planted = (
      JSON.parse(readFileSync(join(process.cwd(), 'fixtures/demo/planted.json'), 'utf8')) as { planted: Planted[] }
    ).planted;
    expect(
      casts
        .filter((c) => c.inversions > 0)
        .map((c) => c.station)
        .sort(),
    ).toEqual(planted.map((p) => p.station).sort());
    for (const pl of planted) {
      const cast = (await tech.agent.get(`/api/casts/${casts.find((c) => c.station === pl.station)!.id}`)).body;
      expect(cast.inversions, pl.station).toHaveLength(1);
      const inv = cast.inversions[0];
      expect(inv.class, pl.station).toBe(pl.kind);
      if (pl.kind === 'spike') {
        expect(inv.pBottom, pl.station).toBe(pl.pressure);
      } else {
        expect(inv.pTop, pl.station).toBe(pl.pTop);
        expect(inv.pBottom, pl.station).toBe(pl.pBottom);
      }
    }
  }, 200_000);
});
