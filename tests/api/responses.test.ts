// Answers match the schemas their routes declare (RouteSpec.response, shared/api): every GET route of a
// cruise that declares one is called as the cruise's chief scientist and its answer parsed.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import {
  Cast,
  CastColumn,
  Cruise,
  DerivedVariable,
  LayerSet,
  SavedView,
  Station,
  Upload,
} from '../../server/models/index';
import type { RouteSpec } from '../../server/lib/routeTable';

let t: TestApp;
let cruiseId = '';
let castId = '';
let chief: Awaited<ReturnType<typeof agentFor>>;

beforeAll(async () => {
  t = await makeTestApp();
  const u = await createUser('responses-chief@example.test');
  const cruise = await Cruise.create({
    name: 'Answers',
    ship: 'RV Tessellate',
    startDate: '2026-01-01',
    endDate: '2026-01-10',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = cruise.id;
  await addMember(u.id, cruiseId, 'chief_scientist');
  await LayerSet.create({
    cruiseId,
    name: 'thermocline',
    referencePressure: 0,
    levels: '26.0:0.1:27.0',
    createdBy: u.id,
  } as never);
  await DerivedVariable.create({
    cruiseId,
    name: 'CT_minus_pt0',
    formula: 'CT - pt0',
    unit: '°C',
    description: null,
    createdBy: u.id,
  } as never);
  await Station.create({ cruiseId, name: 'R1', latitude: -40, longitude: 10, plannedDepth: 4000, order: 1 });
  const up = await Upload.create({
    cruiseId,
    filename: 'r1.csv',
    storageKey: 'k',
    sha256: 'e'.repeat(64),
    size: 1,
    createdBy: u.id,
    status: 'ready',
  });
  castId = (
    await Cast.create({
      cruiseId,
      uploadId: up.id,
      station: 'R1',
      cast: '1',
      latitude: -40,
      longitude: 10,
      time: null,
      bottomDepth: null,
      levels: 0,
      inversionCount: 0,
      inversions: [],
      sourceFile: 'r1.csv',
      sourceSha256: 'e'.repeat(64),
    })
  ).id;
  // an extra variable of the file (fluorescence), so the file-variables list has a row to check
  await CastColumn.create({ castId, name: 'x:fluorescence', unit: 'mg/m^3', kind: 'extra', values: Buffer.alloc(0) });
  await SavedView.create({
    cruiseId,
    userId: u.id,
    name: 'Upper 1000 dbar',
    query: 'property=CT&pmax=1000',
    shared: true,
  });
  chief = await agentFor(t.app, u.email);
}, 120_000);
afterAll(async () => {
  await t?.close();
});

const declared = (): RouteSpec[] =>
  t.app.routes.filter((r: RouteSpec) => r.response && r.method === 'get' && !/:(?!id\b)\w+/.test(r.path));

describe('declared response schemas', () => {
  it('at least the settings, layer-set and derived-variable lists declare one', () => {
    const paths = declared().map((r) => r.path);
    expect(paths).toEqual(
      expect.arrayContaining(['/settings', '/cruises/:id/layer-sets', '/cruises/:id/derived-variables']),
    );
  });

  it('every declared GET answers in its schema, with the seeded rows', async () => {
    for (const r of declared()) {
      const res = await chief.agent.get(
        '/api' + r.path.replace(':id', r.path.startsWith('/casts/') ? castId : cruiseId),
      );
      expect(res.status, r.path).toBe(200);
      const parsed = r.response!.safeParse(res.body);
      expect(parsed.success, `${r.path}: ${parsed.success ? '' : JSON.stringify(parsed.error.issues)}`).toBe(true);
      if (Array.isArray(res.body)) expect(res.body.length, r.path).toBeGreaterThan(0);
    }
  });
});
