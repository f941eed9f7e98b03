// Benchmark: a delivery of a 60-cast cruise in every format — a 60 × 200 isopycnal table and a
// 60 × 2500 pressure table. The headline (target under 3 s) is the data package: both tables as
// CSV, spreadsheet and NetCDF, 60 raw files, README and manifest, zipped and streamed. Each writer
// is also timed on its own, for information. Synthetic, seeded tables, rounded as the real build
// writes them (server/services/deliveryTables.ts: pressure and depth 1e-3, the others 1e-6).
// Reference in the same run: the pressure table's spreadsheet through exceljs' streaming
// WorkbookWriter (styles and shared strings off), the writer the product used before.
//
// Then the path the screen takes (issue #15: 19–27 s in the browser): the demo cruise ingested
// through the intake, a package in every format asked for over HTTP as the PI, the delivery list
// polled as the screen polls it, until the build is ready; with the build's own stage times.
import { performance } from 'node:perf_hooks';
import { Readable } from 'node:stream';
import { pathToFileURL } from 'node:url';
import { buildDataPackage } from '../../server/services/deliveries/package';
import { tableToNetcdf } from '../../server/services/deliveries/cf';
import { writeCsv } from '../../server/services/deliveries/csv';
import { writeXlsx } from '../../server/services/deliveries/xlsx';
import { roundTo } from '../../server/services/deliveries/variables';
import type { DeliveryTable } from '../../server/services/deliveries/table';
import { syntheticIsopycnalTable, syntheticPressureTable } from '../unit/deliveries/synthetic';
import ExcelJS from 'exceljs';
import type { BenchResult } from './modules';

async function drain(s: Readable): Promise<number> {
  let n = 0;
  for await (const c of s) n += (c as Buffer).length;
  return n;
}

export async function bench(): Promise<BenchResult[]> {
  return [...(await syntheticBench()), ...(await screenPath())];
}

/** The writers and the package on synthetic tables (no services needed). */
export async function syntheticBench(): Promise<BenchResult[]> {
  const results: BenchResult[] = [];
  const t0 = performance.now();
  const iso = rounded(syntheticIsopycnalTable({ seed: 60, casts: 60, levels: 200, extras: true }));
  const pres = rounded(syntheticPressureTable({ seed: 61, casts: 60, bins: 2500 }));
  const tBuild = performance.now();
  results.push({
    name: 'deliveries: build tables (12k + 150k rows, validated)',
    value: Math.round(tBuild - t0),
    unit: 'ms',
  });

  const time = async (name: string, f: () => Promise<number> | number): Promise<number> => {
    const s = performance.now();
    const bytes = await f();
    const ms = performance.now() - s;
    results.push({ name: `deliveries: ${name}`, value: Math.round(ms), unit: 'ms' });
    results.push({ name: `deliveries: ${name} size`, value: Math.round(bytes / 1024), unit: 'KiB' });
    return ms;
  };
  await time('isopycnal CSV', () => Buffer.byteLength(writeCsv(iso)));
  await time('isopycnal xlsx', async () => (await writeXlsx(iso)).length);
  await time('isopycnal NetCDF', () => tableToNetcdf(iso).length);
  await time('pressure CSV', () => Buffer.byteLength(writeCsv(pres)));
  const xlsxMs = await time('pressure xlsx', async () => (await writeXlsx(pres)).length);
  const s0 = performance.now();
  await exceljsXlsx(pres);
  const refMs = performance.now() - s0;
  results.push({
    name: 'deliveries: pressure xlsx (this writer, reference exceljs streaming writer)',
    value: Math.round(xlsxMs),
    unit: 'ms',
    reference: Math.round(refMs),
  });
  await time('pressure NetCDF', () => tableToNetcdf(pres).length);
  const pkg = await time('data package zip (both tables, all formats, 60 raw files)', () =>
    drain(
      buildDataPackage({
        tables: [
          { name: 'isopycnal', table: iso },
          { name: 'pressure', table: pres },
        ],
        rawFiles: Array.from({ length: 60 }, (_, i) => ({
          key: `raw/${i}`,
          filename: `cast_${String(i + 1).padStart(3, '0')}.csv`,
          read: async () => Buffer.alloc(200_000, 48 + (i % 10)),
        })),
        formats: ['csv', 'xlsx', 'nc'],
        readme: 'Benchmark package.',
      }),
    ),
  );
  results.push({
    name: 'deliveries: 60-cast delivery in every format (data package)',
    value: Math.round(pkg),
    unit: 'ms',
    target: '< 3000 ms',
  });

  return results;
}

/** The table with its numbers rounded as the real build rounds them. */
function rounded(t: DeliveryTable): DeliveryTable {
  const decimals = t.columns.map((c) => (/^(pressure|depth|bottom_depth)$/.test(c.name) ? 3 : 6));
  return {
    ...t,
    rows: t.rows.map((row) => row.map((v, i) => (typeof v === 'number' ? roundTo(v, decimals[i]) : v))),
  };
}

/** The reference: the same sheet through exceljs' streaming writer (as before this writer). */
async function exceljsXlsx(table: DeliveryTable): Promise<number> {
  const { PassThrough } = await import('node:stream');
  const sink = new PassThrough();
  const done = drain(sink);
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({
    stream: sink,
    useStyles: false,
    useSharedStrings: false,
    zip: { zlib: { level: 1 } },
  });
  const ws = wb.addWorksheet('Pressure table', { views: [{ state: 'frozen', ySplit: 2, xSplit: 0 }] });
  ws.addRow(table.columns.map((c) => c.name)).commit();
  ws.addRow(table.columns.map((c) => c.unit ?? '')).commit();
  for (const row of table.rows) ws.addRow(row).commit();
  ws.commit();
  await wb.commit();
  return done;
}

/** The screen's path: HTTP request as the PI, queue, worker, list polled until ready. */
export async function screenPath(): Promise<BenchResult[]> {
  const { makeTestApp, createUser, addMember, agentFor, waitFor } = await import('../api/helpers');
  const { startWorkers } = await import('../../server/jobs/worker');
  const { buildDelivery } = await import('../../server/services/deliveryBuild');
  const { Cruise, Delivery } = await import('../../server/models/index');
  const { readdirSync } = await import('node:fs');
  const { join } = await import('node:path');
  const out: BenchResult[] = [];
  const t = await makeTestApp({ LOG_LEVEL: 'error' });
  try {
    const workers = await startWorkers(t.deps, { concurrency: 2 });
    const u = await createUser('bench-deliveries@example.test');
    const c = await Cruise.create({
      name: 'Bench deliveries',
      ship: 'RV Bench',
      startDate: '2026-03-01',
      endDate: '2026-03-20',
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: u.id,
    });
    await addMember(u.id, c.id, 'pi');
    const tech = await createUser('bench-deliveries-tech@example.test');
    await addMember(tech.id, c.id, 'technician');
    const a = await agentFor(t.app, u.email);
    const up = await agentFor(t.app, tech.email);
    const dir = join(process.cwd(), 'fixtures/demo/casts');
    const files = readdirSync(dir).sort();
    // the casts are uploaded by a technician, as on the intake screen; the PI builds
    let req = up.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', up.csrf);
    for (const f of files) req = req.attach('files', join(dir, f));
    await req;
    await waitFor(
      async () => {
        const l = (await a.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string }[];
        return l.length === files.length && l.every((x) => x.status === 'ready' || x.status === 'failed');
      },
      600_000,
      500,
    );
    const body = { kind: 'package', ref: 0, formats: ['csv', 'xlsx', 'nc', 'exchange'] };
    type Row = { id: string; status: string; error?: string | null };
    // the screen polls the list every 0.8 s while a build is in progress (src/features/deliveries/api.ts)
    const viaScreen = async (pollMs: number) => {
      const t0 = performance.now();
      const res = await a.agent.post(`/api/cruises/${c.id}/deliveries`).set('x-csrf-token', a.csrf).send(body);
      if (res.status !== 201 && res.status !== 202 && res.status !== 200)
        throw new Error(`POST deliveries ${res.status} ${JSON.stringify(res.body)}`);
      const id = (res.body as Row).id;
      let started = -1;
      for (;;) {
        const l = (await a.agent.get(`/api/cruises/${c.id}/deliveries`)).body as Row[];
        const d = l.find((x) => x.id === id);
        if (d?.status === 'building' && started < 0) started = performance.now() - t0;
        if (d?.status === 'ready') break;
        if (d?.status === 'failed') throw new Error(`build failed: ${d.error ?? ''}`);
        if (performance.now() - t0 > 120_000) throw new Error('build not ready in 120 s');
        await new Promise((r) => setTimeout(r, pollMs));
      }
      return { total: performance.now() - t0, started, id };
    };
    await viaScreen(100); // warm-up: first build loads the code paths
    const fine = await viaScreen(100);
    out.push({
      name: `deliveries: demo cruise (${files.length} files) package in every format, HTTP + queue + worker, polled every 0.1 s`,
      value: Math.round(fine.total),
      unit: 'ms',
      target: '< 3000 ms',
    });
    out.push({
      name: 'deliveries: of which until the worker took the job (seen building)',
      value: Math.round(Math.max(0, fine.started)),
      unit: 'ms',
    });
    const screen = await viaScreen(800);
    out.push({
      name: 'deliveries: the same as the screen sees it (list polled every 0.8 s)',
      value: Math.round(screen.total),
      unit: 'ms',
    });
    // the build's own stages, on a delivery row built directly (no queue)
    await workers.stop();
    const prev = await Delivery.findByPk(screen.id);
    if (!prev) throw new Error('built delivery not found');
    const d = await Delivery.create({
      cruiseId: c.id,
      kind: prev.kind,
      params: prev.params,
      formats: prev.formats,
      error: null,
      releasedAt: null,
      releasedBy: null,
      createdBy: u.id,
    });
    let stages: Record<string, number> = {};
    await buildDelivery(t.deps, d.id, { onStages: (s) => (stages = s) });
    for (const [k, v] of Object.entries(stages))
      out.push({ name: `deliveries: demo package stage ${k}`, value: Math.round(v), unit: 'ms' });
  } finally {
    await t.close();
  }
  return out;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  bench().then(
    (rs) => {
      for (const r of rs) console.log(`${r.name}: ${r.value} ${r.unit}${r.target ? ` (target ${r.target})` : ''}`);
    },
    (err: unknown) => {
      console.error(err);
      process.exitCode = 1;
    },
  );
}
