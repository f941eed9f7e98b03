// Deliveries end to end: built by the job into object storage, downloaded through presigned URLs,
// numbers equal to the section engine's for the same choices, released by the PI with an e-mail.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import ExcelJS from 'exceljs';
import { NetCDFReader } from 'netcdfjs';
import { makeTestApp, createUser, addMember, agentFor, waitFor, caughtMail, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cruise, User } from '../../server/models/index';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { CF_NAMES_FROM_MEMORY } from '../unit/deliveries/cf-names';
import { FLAG_MEANING_WORDS, WOCE_FLAGS } from '../../shared/api/flags';
import { unzip } from '../support/zip';
import { DEFAULT_LINE_NAME } from '../../server/services/lines';
import { MAIL_SUBJECTS } from '../../server/services/mailer';

type PyCf = {
  globals: Record<string, unknown>;
  time?: (string | null)[];
  profile_id?: string[];
  variables: Record<string, { dimensions: string[]; dtype: string; attributes: Record<string, unknown> }>;
  checks: Record<
    string,
    {
      cells: number;
      masked: number;
      flag9: number;
      flag_fill: number;
      value_where_flag9: number;
      masked_where_flag_not9: number;
    }
  >;
};
/** Read a NetCDF with Debian's python3-netcdf4 (tests/support/cf_readback.py). */
function readCf(bytes: Buffer): PyCf {
  const f = join(mkdtempSync(join(tmpdir(), 'sl-cf-')), 'd.nc');
  writeFileSync(f, bytes);
  const py = process.env.GSW_PYTHON ?? '/usr/bin/python3';
  return JSON.parse(
    execFileSync(py, [join(process.cwd(), 'tests/support/cf_readback.py'), f], { encoding: 'utf8' }),
  ) as PyCf;
}

let t: TestApp;
let cruiseId: string;
const who: Record<string, Awaited<ReturnType<typeof agentFor>>> = {};
const sample = (f: string) => join(process.cwd(), 'fixtures/samples', f);

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const chief = await createUser('d-chief@example.test');
  const c = await Cruise.create({
    name: 'Delivery line',
    ship: 'RV Delivery',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: chief.id,
  });
  cruiseId = c.id;
  await addMember(chief.id, c.id, 'chief_scientist');
  for (const role of ['technician', 'analyst', 'pi'] as const) {
    const u = await createUser(`d-${role}@example.test`);
    await addMember(u.id, c.id, role);
    who[role] = await agentFor(t.app, u.email);
  }
  const res = await who.technician.agent
    .post(`/api/cruises/${cruiseId}/uploads`)
    .set('x-csrf-token', who.technician.csrf)
    .attach('files', sample('casts.zip'))
    .attach('files', sample('plain.csv'));
  for (const u of res.body.uploads) {
    const done = await waitFor(async () => {
      const r = await who.technician.agent.get(`/api/uploads/${u.id}`);
      return ['ready', 'failed'].includes(r.body.status) ? r.body : null;
    }, 60_000);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
  }
}, 180_000);
afterAll(async () => {
  await t?.close();
});

async function build(agent: (typeof who)[string], body: object) {
  const res = await agent.agent.post(`/api/cruises/${cruiseId}/deliveries`).set('x-csrf-token', agent.csrf).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  return waitFor(async () => {
    const r = await agent.agent.get(`/api/deliveries/${res.body.id}`);
    return ['ready', 'failed'].includes(r.body.status) ? r.body : null;
  }, 60_000);
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
    const choices = {
      kind: 'isopycnal',
      ref: 0,
      levels: '25.0:0.25:27.5',
      inversions: 'sort',
      interpolation: 'linear',
      formats: ['csv', 'xlsx', 'nc'],
    };
    const d = await build(who.pi, choices);
    expect(d.status, d.error).toBe('ready');
    deliveryId = d.id;
    expect(d.files.map((f: { format: string }) => f.format).sort()).toEqual(['csv', 'nc', 'xlsx']);
    // CSV read back with csv-parse
    const csv = (await download(who.pi, d.id, 'csv')).toString('utf8');
    expect(csv).toMatch(/^# /m);
    expect(csv).toMatch(/inversion/i);
    const rows = parse(csv, { comment: '#', columns: true, skip_empty_lines: true }) as Record<string, string>[];
    expect(Object.keys(rows[0]).slice(0, 13)).toEqual([
      'station',
      'cast',
      'latitude',
      'longitude',
      'sigma_ref',
      'sigma_level',
      'pressure',
      'depth',
      'CT',
      'SA',
      'thickness',
      'crossings',
      'flags',
    ]);
    // the section engine for the same choices
    const sec = (
      await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({
        property: 'CT',
        coord: 'density',
        ref: 0,
        levels: '25.0:0.25:27.5',
        inversions: 'sort',
        interpolation: 'linear',
      })
    ).body;
    let compared = 0;
    for (const st of sec.stations as { station: string; x: number }[]) {
      const ix = sec.grid.x.findIndex((x: number) => Math.abs(x - st.x) < 1e-9);
      for (let iy = 0; iy < sec.grid.y.length; iy++) {
        const row = rows.find(
          (r) => r.station === st.station && Math.abs(Number(r.sigma_level) - sec.grid.y[iy]) < 1e-9,
        )!;
        const v = sec.grid.z[iy][ix];
        if (row.CT === '') {
          expect(v).toBeNull();
          continue;
        }
        // written to 1e-6 °C (the stated precision): equal to the engine within half a step
        expect(Math.abs(Number(row.CT) - v)).toBeLessThanOrEqual(5e-7 + 1e-12);
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
  it('every table carries the api.md columns first, then cruise, line, time, bottom depth, flags and every variable', async () => {
    const casts = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
      id: string;
      station: string;
      time: string | null;
      bottomDepth: number | null;
    }[];
    const details = await Promise.all(casts.map(async (c) => (await who.analyst.agent.get(`/api/casts/${c.id}`)).body));
    const measured = new Set<string>();
    for (const d of details) for (const k of Object.keys(d.columns ?? {})) measured.add(k);
    for (const d of details) for (const k of Object.keys(d.extras ?? {})) measured.add(`x:${k}`);
    const api = [
      'station',
      'cast',
      'latitude',
      'longitude',
      'sigma_ref',
      'sigma_level',
      'pressure',
      'depth',
      'CT',
      'SA',
      'thickness',
      'crossings',
      'flags',
    ];
    const d = await build(who.analyst, {
      kind: 'isopycnal',
      ref: 0,
      levels: '26.0:0.1:27.5',
      formats: ['csv'],
      extras: undefined,
    });
    expect(d.status, d.error).toBe('ready');
    for (const [label, csv] of [
      ['delivery', (await download(who.analyst, d.id, 'csv')).toString('utf8')],
      [
        'export',
        (
          await who.analyst.agent
            .get(`/api/cruises/${cruiseId}/exports/isopycnal.csv`)
            .query({ ref: 0, levels: '26.0:0.1:27.5' })
        ).text,
      ],
    ] as const) {
      const rows = parse(csv, { comment: '#', columns: true, skip_empty_lines: true }) as Record<string, string>[];
      const cols = Object.keys(rows[0]);
      expect(cols.slice(0, 19), label).toEqual([
        ...api,
        'cruise',
        'line',
        'time',
        'bottom_depth',
        'CT_flag',
        'SA_flag',
      ]);
      // every other variable the casts carry, each followed by its flag column
      const rest = cols.slice(19);
      for (let i = 0; i < rest.length; i += 2) expect(rest[i + 1]).toBe(`${rest[i]}_flag`);
      if (measured.has('temperature')) expect(rest).toContain('t');
      if (measured.has('oxygen')) expect(rest).toContain('oxygen');
      for (const k of measured)
        if (k.startsWith('x:'))
          expect(rest.some((c) => c.endsWith(k.slice(2).replace(/[^A-Za-z0-9_]/g, '_')))).toBe(true);
      expect(new Set(rows.map((r) => r.line))).toEqual(new Set([DEFAULT_LINE_NAME]));
      const withTime = casts.find((c) => c.time)!;
      const row = rows.find((r) => r.station === withTime.station)!;
      expect(row.time).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/);
      expect(Date.parse(row.time)).toBe(Date.parse(withTime.time!));
      if (withTime.bottomDepth != null) expect(Number(row.bottom_depth)).toBeCloseTo(withTime.bottomDepth, 3);
      // flags: WOCE 1–9 on every row; 9 exactly where the value is empty
      for (const r of rows)
        for (const c of cols.filter((x) => x.endsWith('_flag'))) {
          const v = r[c.slice(0, -5)];
          expect(r[c], `${c}`).toMatch(/^[1-9]$/);
          if (v === '') expect(r[c]).toBe('9');
        }
      // stated precision: no more decimals than the rule (pressure/depth 3, CT/SA/σ 6)
      const dec = (s: string) => /\.(\d+)/.exec(s)?.[1].length ?? 0;
      for (const r of rows) {
        for (const c of ['pressure', 'depth', 'thickness', 'bottom_depth']) expect(dec(r[c])).toBeLessThanOrEqual(3);
        for (const c of ['CT', 'SA', 'sigma_level', 't', 'SP'])
          if (r[c] !== undefined) expect(dec(r[c])).toBeLessThanOrEqual(6);
      }
      expect(csv).toMatch(/^# precision: .*pressure 3 decimals, depth 3 decimals, CT 6 decimals, SA 6 decimals/m);
      expect(csv).toMatch(/^# flag_rule: /m);
      expect(csv).toMatch(/^# flag_history: /m);
    }
    // the pressure table likewise, with its bin count
    const pd = await build(who.analyst, { kind: 'pressure', bin: 10, formats: ['csv'] });
    const pcsv = (await download(who.analyst, pd.id, 'csv')).toString('utf8');
    const ecsv = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/exports/pressure.csv`).query({ bin: 10 })).text;
    const prow = parse(pcsv, { comment: '#', columns: true, skip_empty_lines: true }) as Record<string, string>[];
    const erow = parse(ecsv, { comment: '#', columns: true, skip_empty_lines: true }) as Record<string, string>[];
    expect(Object.keys(prow[0]).slice(0, 20)).toEqual([
      'station',
      'cast',
      'latitude',
      'longitude',
      'pressure',
      'count',
      'CT',
      'SA',
      'sigma0',
      'depth',
      't',
      'SP',
      'cruise',
      'line',
      'time',
      'bottom_depth',
      'CT_flag',
      'SA_flag',
      't_flag',
      'SP_flag',
    ]);
    expect(Object.keys(erow[0])).toEqual(Object.keys(prow[0]));
    expect(prow.every((r) => Number(r.count) >= 1)).toBe(true);
    for (const id of [d.id, pd.id])
      await who.analyst.agent.delete(`/api/deliveries/${id}`).set('x-csrf-token', who.analyst.csrf);
  });
  it('NetCDF-CF read back with python3-netcdf4: time decoded, flags as ancillary variables, standard names, fill values masked', async () => {
    const casts = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
      station: string;
      cast: string;
      time: string | null;
      bottomDepth: number | null;
    }[];
    for (const kind of ['isopycnal', 'pressure'] as const) {
      const d = await build(who.analyst, { kind, ref: 1000, levels: '30.0:0.25:32.0', bin: 20, formats: ['nc'] });
      expect(d.status, d.error).toBe('ready');
      const bytes = await download(who.analyst, d.id, 'nc');
      const py = readCf(bytes); // Debian python3-netcdf4
      expect(py.globals.featureType).toBe('profile');
      expect(py.globals.Conventions).toBe('CF-1.10');
      for (const g of [
        'cruise',
        'line',
        'expocode',
        'software_version',
        'processing_choices',
        'precision',
        'flag_rule',
        'flag_history',
      ]) {
        expect(typeof py.globals[g], g).toBe('string');
      }
      expect(py.globals.line).toBe(DEFAULT_LINE_NAME);
      expect(py.globals.reference_pressure).toBeUndefined();
      // time: a CF time variable on the profile dimension, decoded to the casts' times
      expect(py.variables.time.dimensions).toEqual(['profile']);
      expect(new NetCDFReader(bytes).variables.map((v) => v.name)).toContain('CT_flag'); // netcdfjs reads it too
      const ids = py.profile_id!;
      ids.forEach((id, i) => {
        const c = casts.find((x) => `${x.station}_${x.cast}` === String(id).replace(/\0+$/, '').trim());
        expect(
          c,
          `profile ${JSON.stringify(id)} among ${casts.map((x) => `${x.station}_${x.cast}`).join(' ')}`,
        ).toBeDefined();
        if (!c) return;
        expect(py.time![i]).toBe(c.time ? new Date(c.time).toISOString().replace('.000Z', 'Z') : null);
      });
      expect(py.variables.bottom_depth.attributes.standard_name).toBe('sea_floor_depth_below_sea_surface');
      // each measured variable has its flag variable, linked by ancillary_variables
      for (const v of ['CT', 'SA', 't', 'SP']) {
        const anc = py.variables[v].attributes.ancillary_variables;
        expect(anc, v).toBe(`${v}_flag`);
        const fa = py.variables[`${v}_flag`].attributes;
        expect(fa.flag_values).toEqual([...WOCE_FLAGS]);
        expect(String(fa.flag_meanings).split(' ')).toEqual(WOCE_FLAGS.map((f) => FLAG_MEANING_WORDS[f]));
        expect(py.variables[`${v}_flag`].dtype).toBe('int8');
        // masked exactly where the flag says no value
        const ck = py.checks[v];
        expect(ck.value_where_flag9, v).toBe(0);
        expect(ck.masked_where_flag_not9, v).toBe(0);
        expect(ck.masked).toBeGreaterThanOrEqual(ck.flag9);
        if (kind === 'isopycnal')
          expect(ck.flag9, `${v}: levels below the bottom are empty and flagged 9`).toBeGreaterThan(0);
        expect(typeof py.variables[v].attributes._FillValue).toBe('number');
      }
      // every standard_name written is in the CF standard name table (from memory), with units that fit it
      for (const [name, v] of Object.entries(py.variables)) {
        const sn = v.attributes.standard_name as string | undefined;
        if (!sn) continue;
        const base = sn.replace(/ status_flag$/, '');
        const known = CF_NAMES_FROM_MEMORY[base];
        expect(known, `${name}: ${sn}`).toBeDefined();
        if (!sn.endsWith(' status_flag') && v.attributes.units !== undefined)
          expect(known.units, `${name} units`).toContain(v.attributes.units);
      }
      // σ: the reference pressure as CF asks (scalar coordinate reference_pressure) and said on the σ variable
      if (kind === 'isopycnal') {
        expect(py.variables.sigma_ref.attributes.standard_name).toBe('reference_pressure');
        expect(String(py.variables.sigma_level.attributes.comment)).toMatch(/referenced to 1000 dbar/);
        expect(String(py.variables.CT.attributes.coordinates)).toContain('sigma_ref');
      }
      await who.analyst.agent.delete(`/api/deliveries/${d.id}`).set('x-csrf-token', who.analyst.csrf);
    }
  });
  it('exchange format: one CTD exchange file per cast, zipped per line, read back by our intake to the same numbers', async () => {
    const d = await build(who.analyst, {
      kind: 'isopycnal',
      ref: 0,
      levels: '25.0:0.25:27.5',
      formats: ['exchange', 'csv'],
    });
    expect(d.status, d.error).toBe('ready');
    const names = d.files.map((f: { filename: string }) => f.filename);
    // <cruise>_<line>_<kind>_<ref>.<ext>, safe characters; the cruise is the files' expocode
    expect(names).toContain('99TS20260301_All-stations_isopycnal_sigma0.csv');
    expect(names).toContain('99TS20260301_All-stations_exchange_ct1.zip');
    for (const n of names) expect(n).toMatch(/^[A-Za-z0-9-]+_[A-Za-z0-9-]+_[a-z]+_[A-Za-z0-9]+\.(csv|xlsx|nc|zip)$/);
    const zip = await download(who.analyst, d.id, 'exchange');
    const entries = await unzip(zip);
    const casts = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
      id: string;
      station: string;
      cast: string;
    }[];
    expect(entries.size).toBe(casts.length);
    for (const [name, body] of entries) {
      expect(name).toMatch(/^99TS20260301_[A-Za-z0-9-]+_[A-Za-z0-9-]+_ct1\.csv$/);
      const lines = body.toString('utf8').trimEnd().split('\n');
      expect(lines[0]).toMatch(/^CTD,\d{8}[A-Z]+$/);
      const nh = lines.findIndex((l) => /^NUMBER_HEADERS = \d+$/.test(l));
      const n = Number(lines[nh].split('=')[1]);
      const header = lines.slice(nh + 1, nh + n);
      expect(header.map((l) => l.split(' = ')[0]).slice(0, 4)).toEqual(['EXPOCODE', 'SECT_ID', 'STNNBR', 'CASTNO']);
      expect(lines[nh + n]).toMatch(/^CTDPRS,CTDTMP,CTDTMP_FLAG_W,CTDSAL,CTDSAL_FLAG_W/);
      expect(lines[nh + n + 1]).toMatch(/^DBAR,ITS-90,,PSS-78,(,|$)/);
      expect(lines[lines.length - 1]).toBe('END_DATA');
    }
    // our own intake reads the zip back into a second cruise
    const b = await Cruise.create({
      name: 'Round trip',
      ship: 'RV Delivery',
      startDate: '2026-03-01',
      endDate: '2026-03-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: null,
    });
    for (const role of ['technician', 'analyst'] as const) {
      const u = await User.findOne({ where: { email: `d-${role}@example.test` } });
      await addMember(u!.id, b.id, role);
    }
    const up = await who.technician.agent
      .post(`/api/cruises/${b.id}/uploads`)
      .set('x-csrf-token', who.technician.csrf)
      .attach('files', zip, 'exchange.zip');
    expect(up.status, JSON.stringify(up.body)).toBe(202);
    for (const u of up.body.uploads) {
      const done = await waitFor(async () => {
        const r = await who.technician.agent.get(`/api/uploads/${u.id}`);
        return ['ready', 'failed'].includes(r.body.status) ? r.body : null;
      }, 60_000);
      expect(done.status, JSON.stringify(done.errors)).toBe('ready');
    }
    const back = (await who.analyst.agent.get(`/api/cruises/${b.id}/casts`)).body as {
      id: string;
      station: string;
      cast: string;
    }[];
    expect(back.map((c) => `${c.station}/${c.cast}`).sort()).toEqual(casts.map((c) => `${c.station}/${c.cast}`).sort());
    // measured columns equal at the written decimals (pressure 0.1 dbar, t and SP 1e-4); flags equal; CT within what the rounding allows
    const written: Record<string, number> = { pressure: 1, temperature: 4, SP: 4 };
    for (const c of casts) {
      const a = (await who.analyst.agent.get(`/api/casts/${c.id}`)).body;
      const bId = back.find((x) => x.station === c.station && x.cast === c.cast)!.id;
      const r = (await who.analyst.agent.get(`/api/casts/${bId}`)).body;
      for (const [k, dp] of Object.entries(written)) {
        const va = a.columns[k] as (number | null)[];
        const vb = r.columns[k] as (number | null)[];
        expect(vb.length, k).toBe(va.length);
        va.forEach((v, i) => {
          if (v === null) expect(vb[i]).toBeNull();
          else expect(Math.abs(vb[i]! - Number(v.toFixed(dp))), `${k}[${i}]`).toBeLessThan(1e-9);
        });
      }
      for (const f of Object.keys(a.flags)) if (f !== 'conductivity') expect(r.flags[f], f).toEqual(a.flags[f]);
      const cta = a.columns.CT as number[];
      const ctb = r.columns.CT as number[];
      cta.forEach((v, i) => {
        if (v !== null) expect(Math.abs(ctb[i] - v)).toBeLessThan(1.5e-4);
      });
    }
    // the section engine on both cruises: CT on the same isopycnals agrees to what 0.1 dbar and 1e-4 allow
    const q = { property: 'CT', coord: 'density', ref: 0, levels: '25.0:0.25:27.5' };
    const sa = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query(q)).body;
    const sb = (await who.analyst.agent.get(`/api/cruises/${b.id}/section`).query(q)).body;
    let compared = 0;
    for (let iy = 0; iy < sa.grid.y.length; iy++)
      for (let ix = 0; ix < sa.grid.x.length; ix++) {
        const u = sa.grid.z[iy][ix];
        const v = sb.grid.z[iy][ix];
        if (u === null || v === null) continue;
        expect(Math.abs(u - v)).toBeLessThan(2e-3);
        compared++;
      }
    expect(compared).toBeGreaterThan(10);
    await who.analyst.agent.delete(`/api/deliveries/${d.id}`).set('x-csrf-token', who.analyst.csrf);
  });
  it('one levels policy: the section, the export, geostrophy and a delivery use the same default levels', async () => {
    const layerSetOf = (csv: string) => /^# layer_set: (.*)$/m.exec(csv)?.[1]?.trim();
    for (const ref of [0, 2000]) {
      const sec = (
        await who.analyst.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'CT', coord: 'density', ref })
      ).body;
      const section = sec.choices.levels as string;
      expect(section).toMatch(/^\d+\.\d+:[\d.]+:\d+\.\d+$/);
      const exported = layerSetOf(
        (await who.analyst.agent.get(`/api/cruises/${cruiseId}/exports/isopycnal.csv`).query({ ref })).text,
      );
      const d = await build(who.analyst, { kind: 'isopycnal', ref, formats: ['csv'] });
      expect(d.status, d.error).toBe('ready');
      const delivered = layerSetOf((await download(who.analyst, d.id, 'csv')).toString('utf8'));
      expect([exported, delivered]).toEqual([section, section]);
      // the delivered rows sit on the section's density levels
      const geo = (await who.analyst.agent.get(`/api/cruises/${cruiseId}/geostrophy`).query({ ref })).body;
      const levels = new Set(sec.grid.y.map((v: number) => v.toFixed(4)));
      const boundaries = String(geo.choices.levels).split(',').map(Number);
      expect(boundaries.length).toBeGreaterThan(2);
      for (const v of boundaries)
        expect(levels.has(v.toFixed(4)), `geostrophy boundary ${v} not a section level`).toBe(true);
      await who.analyst.agent.delete(`/api/deliveries/${d.id}`).set('x-csrf-token', who.analyst.csrf);
    }
  });
  it('builds a data package zip with raw files and a manifest', async () => {
    const d = await build(who.analyst, { kind: 'package', ref: 0, formats: ['csv'] });
    expect(d.status, d.error).toBe('ready');
    const zip = await download(who.analyst, d.id, 'zip');
    expect(zip.subarray(0, 2).toString()).toBe('PK');
  });
  it('a delete is audited with the delivery as it was; a technician may not delete', async () => {
    const d = await build(who.analyst, { kind: 'pressure', bin: 50, formats: ['csv'] });
    expect(
      (await who.technician.agent.delete(`/api/deliveries/${d.id}`).set('x-csrf-token', who.technician.csrf)).status,
    ).toBe(403);
    expect(
      (await who.analyst.agent.delete(`/api/deliveries/${d.id}`).set('x-csrf-token', who.analyst.csrf)).status,
    ).toBe(204);
    const trail = (await who.pi.agent.get(`/api/cruises/${cruiseId}/audit`)).body as {
      action: string;
      entity: string;
      entityId: string;
      before: { files?: unknown[] };
    }[];
    const del = trail.find((a) => a.action === 'delete' && a.entity === 'delivery' && a.entityId === d.id);
    expect(del?.before?.files?.length).toBe(1);
  });
  it('a technician may not build a delivery (403); an analyst may not release (403)', async () => {
    expect(
      (
        await who.technician.agent
          .post(`/api/cruises/${cruiseId}/deliveries`)
          .set('x-csrf-token', who.technician.csrf)
          .send({ kind: 'pressure', formats: ['csv'] })
      ).status,
    ).toBe(403);
    expect(
      (await who.analyst.agent.post(`/api/deliveries/${deliveryId}/release`).set('x-csrf-token', who.analyst.csrf))
        .status,
    ).toBe(403);
  });
  it('the PI releases: members are e-mailed with the link, and the delivery is frozen and audited', async () => {
    who.chief_scientist ??= await agentFor(t.app, 'd-chief@example.test');
    const roles = ['technician', 'analyst', 'pi', 'chief_scientist'] as const;
    /** For each role: what the screen is told (canDownload in the list) and what the route answers. */
    const rights = async () =>
      Object.fromEntries(
        await Promise.all(
          roles.map(async (role) => {
            const list = (await who[role].agent.get(`/api/cruises/${cruiseId}/deliveries`)).body as {
              id: string;
              canDownload: boolean;
            }[];
            const screen = list.find((x) => x.id === deliveryId)!.canDownload;
            const route = (await who[role].agent.get(`/api/deliveries/${deliveryId}/download?format=csv`).redirects(0))
              .status;
            return [role, { screen, route }] as const;
          }),
        ),
      );
    const before = await rights();
    // before release: builders only, and the screen says exactly what the route does
    for (const role of roles) expect(before[role].route, role).toBe(before[role].screen ? 302 : 403);
    expect(before.technician.screen).toBe(false);
    expect(before.analyst.screen).toBe(true);
    const res = await who.pi.agent.post(`/api/deliveries/${deliveryId}/release`).set('x-csrf-token', who.pi.csrf);
    expect(res.status).toBe(200);
    expect(res.body.released).toBe(true);
    const mail = await waitFor(async () =>
      (await caughtMail()).find((m) => m.subject === MAIL_SUBJECTS.release && m.text.includes(cruiseId)),
    );
    // no user text in the subject (issue #14, item 6): the cruise's name is quoted in the body only
    expect(mail.subject).not.toContain('Delivery line');
    expect(mail.text).toMatch(/of the cruise "Delivery line[^"\n]*"/);
    const after = await rights();
    // after release: the e-mail goes to exactly those the screen and the route let download
    const emails: Record<string, string> = {
      technician: 'd-technician@example.test',
      analyst: 'd-analyst@example.test',
      pi: 'd-pi@example.test',
      chief_scientist: 'd-chief@example.test',
    };
    for (const role of roles) {
      expect(after[role].route, role).toBe(after[role].screen ? 302 : 403);
      expect(mail.to.includes(emails[role]), role).toBe(after[role].screen);
    }
    expect(mail.to.sort()).toEqual([
      'd-analyst@example.test',
      'd-chief@example.test',
      'd-pi@example.test',
      'd-technician@example.test',
    ]);
    expect(mail.text).toContain(`/cruises/${cruiseId}/deliveries`);
    expect((await who.pi.agent.delete(`/api/deliveries/${deliveryId}`).set('x-csrf-token', who.pi.csrf)).status).toBe(
      409,
    );
    expect(
      (await who.pi.agent.post(`/api/deliveries/${deliveryId}/release`).set('x-csrf-token', who.pi.csrf)).status,
    ).toBe(409);
    const trail = (await who.pi.agent.get(`/api/cruises/${cruiseId}/audit`)).body;
    expect(
      trail.some((a: { action: string; entityId: string }) => a.action === 'release' && a.entityId === deliveryId),
    ).toBe(true);
  });
});
