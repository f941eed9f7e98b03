// Deliveries end to end: built by the job into object storage, downloaded through presigned URLs,
// numbers equal to the section engine's for the same choices, released by the PI with an e-mail.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import ExcelJS from 'exceljs';
import { NetCDFReader } from 'netcdfjs';
import { makeTestApp, createUser, addMember, agentFor, waitFor, caughtMail, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};
const sample = (f: string) => join(process.cwd(), 'fixtures/samples', f);

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('d-chief@example.test');
  const c = await Cruise.create({ name: 'Delivery line', ship: 'RV Delivery', startDate: '2026-03-01', endDate: '2026-03-20', portStart: null, portEnd: null, region: null, description: null, createdBy: chief.id });
  cruiseId = c.id;
  await addMember(chief.id, c.id, 'chief_scientist');
  for (const role of ['technician', 'analyst', 'pi'] as const) {
    const u = await createUser(`d-${role}@example.test`);
    await addMember(u.id, c.id, role);
    who[role] = await agentFor(t.app, u.email);
  }
  const res = await who.technician.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.technician.csrf).attach('files', sample('casts.zip')).attach('files', sample('plain.csv'));
  for (const u of res.body.uploads) {
    const done = await waitFor(async () => { const r = await who.technician.agent.get(`/api/uploads/${u.id}`); return ['ready', 'failed'].includes(r.body.status) ? r.body : null; }, 60_000);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
  }
}, 180_000);
afterAll(async () => { await t?.close(); });

async function build(agent: (typeof who)[string], body: object) {
  const res = await agent.agent.post(`/api/cruises/${cruiseId}/deliveries`).set('x-csrf-token', agent.csrf).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  return waitFor(async () => { const r = await agent.agent.get(`/api/deliveries/${res.body.id}`); return ['ready', 'failed'].includes(r.body.status) ? r.body : null; }, 60_000);
}
async function download(agent: (typeof who)[string], id: string, format: string): Promise<Buffer> {
  const res = await agent.agent.get(`/api/deliveries/${id}/download?format=${format}`).redirects(0);
  expect(res.status).toBe(302);
  const r = await fetch(res.headers.location);
  expect(r.ok).toBe(true);
  return Buffer.from(await r.arrayBuffer());
}

describe('deliveries', () => {
  let deliveryId: string;
  it('builds an isopycnal delivery in CSV, spreadsheet and NetCDF whose numbers equal the section engine', async () => {
    const choices = { kind: 'isopycnal', ref: 0, levels: '25.0:0.25:27.5', inversions: 'sort', interpolation: 'linear', formats: ['csv', 'xlsx', 'nc'] };
    const d = await build(who.pi, choices);
    expect(d.status, d.error).toBe('ready');
    deliveryId = d.id;
    expect(d.files.map((f: { format: string }) => f.format).sort()).toEqual(['csv', 'nc', 'xlsx']);
    // CSV read back with csv-parse
    const csv = (await download(who.pi, d.id, 'csv')).toString('utf8');
    expect(csv).toMatch(/^# /m);
    expect(csv).toMatch(/inversion/i);
    const rows = parse(csv, { comment: '#', columns: true, skip_empty_lines: true }) as Record<string, string>[];
    expect(Object.keys(rows[0]).slice(0, 13)).toEqual(['station', 'cast', 'latitude', 'longitude', 'sigma_ref', 'sigma_level', 'pressure', 'depth', 'CT', 'SA', 'thickness', 'crossings', 'flags']);
    // the section engine for the same choices
    const sec = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'CT', coord: 'density', ref: 0, levels: '25.0:0.25:27.5', inversions: 'sort', interpolation: 'linear' })).body;
    let compared = 0;
    for (const st of sec.stations as { station: string; x: number }[]) {
      const ix = sec.grid.x.findIndex((x: number) => Math.abs(x - st.x) < 1e-9);
      for (let iy = 0; iy < sec.grid.y.length; iy++) {
        const row = rows.find((r) => r.station === st.station && Math.abs(Number(r.sigma_level) - sec.grid.y[iy]) < 1e-9)!;
        const v = sec.grid.z[iy][ix];
        if (row.CT === '') { expect(v).toBeNull(); continue; }
        expect(Math.abs(Number(row.CT) - v)).toBeLessThan(1e-12);
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(10);
    // spreadsheet read back with exceljs
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load((await download(who.pi, d.id, 'xlsx')) as unknown as Parameters<typeof wb.xlsx.load>[0]);
    expect(wb.worksheets.map((w) => w.name)).toContain('Provenance');
    // NetCDF read back with netcdfjs
    const nc = new NetCDFReader(await download(who.pi, d.id, 'nc'));
    expect(String(nc.getAttribute('Conventions'))).toBe('CF-1.10');
  });
  it('one levels policy: the section, the export, geostrophy and a delivery use the same default levels', async () => {
    const layerSetOf = (csv: string) => /^# layer_set: (.*)$/m.exec(csv)?.[1]?.trim();
    for (const ref of [0, 2000]) {
      const sec = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'CT', coord: 'density', ref })).body;
      const section = sec.choices.levels as string;
      expect(section).toMatch(/^\d+\.\d+:[\d.]+:\d+\.\d+$/);
      const exported = layerSetOf((await who.analyst.agent.get(`/api/cruises/${cruiseId}/exports/isopycnal.csv`).query({ ref })).text);
      const d = await build(who.analyst, { kind: 'isopycnal', ref, formats: ['csv'] });
      expect(d.status, d.error).toBe('ready');
      const delivered = layerSetOf((await download(who.analyst, d.id, 'csv')).toString('utf8'));
      expect([exported, delivered]).toEqual([section, section]);
      // the delivered rows sit on the section's density levels
      const geo = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/geostrophy`).query({ ref })).body;
      const levels = new Set(sec.grid.y.map((v: number) => v.toFixed(4)));
      const boundaries = String(geo.choices.levels).split(',').map(Number);
      expect(boundaries.length).toBeGreaterThan(2);
      for (const v of boundaries) expect(levels.has(v.toFixed(4)), `geostrophy boundary ${v} not a section level`).toBe(true);
      await who.analyst.agent.delete(`/api/deliveries/${d.id}`).set('x-csrf-token', who.analyst.csrf);
    }
  });
  it('builds a data package zip with raw files and a manifest', async () => {
    const d = await build(who.analyst, { kind: 'package', ref: 0, formats: ['csv'] });
    expect(d.status, d.error).toBe('ready');
    const zip = await download(who.analyst, d.id, 'zip');
    expect(zip.subarray(0, 2).toString()).toBe('PK');
  });
  it('a technician may not build a delivery (403); an analyst may not release (403)', async () => {
    expect((await who.technician.agent.post(`/api/cruises/${cruiseId}/deliveries`).set('x-csrf-token', who.technician.csrf).send({ kind: 'pressure', formats: ['csv'] })).status).toBe(403);
    expect((await who.analyst.agent.post(`/api/deliveries/${deliveryId}/release`).set('x-csrf-token', who.analyst.csrf)).status).toBe(403);
  });
  it('the PI releases: members are e-mailed with the link, and the delivery is frozen and audited', async () => {
    const res = await who.pi.agent.post(`/api/deliveries/${deliveryId}/release`).set('x-csrf-token', who.pi.csrf);
    expect(res.status).toBe(200);
    expect(res.body.released).toBe(true);
    const mail = await waitFor(async () => (await caughtMail()).find((m) => m.subject.includes('Delivery line') && m.text.includes(cruiseId)));
    expect(mail.to.sort()).toEqual(['d-analyst@example.test', 'd-chief@example.test', 'd-pi@example.test', 'd-technician@example.test']);
    expect(mail.text).toContain(`/cruises/${cruiseId}/deliveries`);
    expect((await who.pi.agent.delete(`/api/deliveries/${deliveryId}`).set('x-csrf-token', who.pi.csrf)).status).toBe(409);
    expect((await who.pi.agent.post(`/api/deliveries/${deliveryId}/release`).set('x-csrf-token', who.pi.csrf)).status).toBe(409);
    const trail = (await who.pi.agent.get(`/api/cruises/${cruiseId}/audit`)).body;
    expect(trail.some((a: { action: string; entityId: string }) => a.action === 'release' && a.entityId === deliveryId)).toBe(true);
  });
});
