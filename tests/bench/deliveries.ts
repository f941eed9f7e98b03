// Benchmark: a delivery of a 60-cast cruise in every format — a 60 × 200 isopycnal table and a
// 60 × 2500 pressure table. The headline (target under 5 s) is the data package: both tables as
// CSV, spreadsheet and NetCDF, 60 raw files, README and manifest, zipped and streamed. Each writer
// is also timed on its own, for information. Synthetic, seeded tables.
import { performance } from 'node:perf_hooks';
import { Readable } from 'node:stream';
import { pathToFileURL } from 'node:url';
import { buildDataPackage } from '../../server/services/deliveries/package';
import { tableToNetcdf } from '../../server/services/deliveries/cf';
import { writeCsv } from '../../server/services/deliveries/csv';
import { writeXlsx } from '../../server/services/deliveries/xlsx';
import { syntheticIsopycnalTable, syntheticPressureTable } from '../unit/deliveries/synthetic';

export interface BenchResult {
  name: string;
  value: number;
  unit: string;
  target?: string;
}

async function drain(s: Readable): Promise<number> {
  let n = 0;
  for await (const c of s) n += (c as Buffer).length;
  return n;
}

export async function bench(): Promise<BenchResult[]> {
  const results: BenchResult[] = [];
  const t0 = performance.now();
  const iso = syntheticIsopycnalTable({ seed: 60, casts: 60, levels: 200, extras: true });
  const pres = syntheticPressureTable({ seed: 61, casts: 60, bins: 2500 });
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
  await time('pressure xlsx', async () => (await writeXlsx(pres)).length);
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
    target: '< 5000 ms',
  });
  return results;
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
