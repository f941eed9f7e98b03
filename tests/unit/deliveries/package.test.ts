import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import yauzl from 'yauzl';
import { parse } from 'csv-parse/sync';
import { NetCDFReader } from 'netcdfjs';
import ExcelJS from 'exceljs';
import {
  buildDataPackage,
  safeName,
  type DataPackageInput,
  type PackageProgress,
} from '../../../server/services/deliveries/package';
import { writeCsv } from '../../../server/services/deliveries/csv';
import { rng, syntheticIsopycnalTable, syntheticPressureTable } from './synthetic';

async function collect(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

/** Read every entry of a zip with yauzl. */
function unzip(zip: Buffer): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(zip, { lazyEntries: true, strictFileNames: true, validateEntrySizes: true }, (err, zf) => {
      if (err || !zf) return reject(err ?? new Error('no zip'));
      const out = new Map<string, Buffer>();
      zf.on('entry', (entry: yauzl.Entry) => {
        zf.openReadStream(entry, (e2, rs) => {
          if (e2 || !rs) return reject(e2 ?? new Error('no stream'));
          collect(rs).then((b) => {
            out.set(entry.fileName, b);
            zf.readEntry();
          }, reject);
        });
      });
      zf.on('end', () => resolve(out));
      zf.on('error', reject);
      zf.readEntry();
    });
  });
}

function randomBytes(seed: number, n: number): Buffer {
  const r = rng(seed);
  return Buffer.from(Array.from({ length: n }, () => Math.floor(r() * 256)));
}

function input(overrides: Partial<DataPackageInput> = {}): DataPackageInput {
  const raw1 = randomBytes(1, 70_000);
  const raw2 = Buffer.from('pressure [dbar],temperature [ITS-90 degC]\r\n2.0,18.4\r\n', 'utf8');
  return {
    tables: [
      { name: 'isopycnal', table: syntheticIsopycnalTable({ seed: 41, casts: 5, levels: 20, extras: true }) },
      { name: 'pressure', table: syntheticPressureTable({ seed: 42, casts: 5, bins: 30 }) },
    ],
    rawFiles: [
      { key: 'cruises/c1/raw/abc', filename: 'st001.cnv', read: async () => raw1 },
      { key: 'cruises/c1/raw/def', filename: '../../etc/passwd', read: () => Readable.from([raw2]) },
      { key: 'cruises/c1/raw/ghi', filename: 'st001.cnv', read: async () => raw2 },
    ],
    formats: ['csv', 'xlsx', 'nc'],
    readme: 'Data package for the synthetic cruise.',
    mtime: new Date('2026-03-04T05:06:07Z'),
    ...overrides,
  };
}

describe('data package', () => {
  it('zips tables in every format, raw files, README and a manifest whose checksums match (read back with yauzl)', async () => {
    const progress: PackageProgress[] = [];
    const inp = input({ onProgress: (p) => progress.push(p) });
    const entries = await unzip(await collect(buildDataPackage(inp))); // read back with yauzl
    const names = [...entries.keys()];
    expect(names).toEqual([
      'README.txt',
      'tables/isopycnal.csv',
      'tables/isopycnal.xlsx',
      'tables/isopycnal.nc',
      'tables/pressure.csv',
      'tables/pressure.xlsx',
      'tables/pressure.nc',
      'raw/st001.cnv',
      'raw/passwd',
      'raw/st001-2.cnv',
      'MANIFEST.sha256',
    ]);
    expect(progress.map((p) => p.entry)).toEqual(names);
    expect(progress.every((p) => p.total === names.length)).toBe(true);

    // manifest: sha256sum format, one line per other entry, each digest matching the entry
    const manifest = (entries.get('MANIFEST.sha256') as Buffer).toString('utf8');
    const lines = manifest.trimEnd().split('\n');
    expect(lines.length).toBe(names.length - 1);
    for (const line of lines) {
      const m = /^([0-9a-f]{64}) {2}(.+)$/.exec(line);
      expect(m).not.toBeNull();
      const [, digest, path] = m as RegExpExecArray;
      const bytes = entries.get(path);
      expect(bytes).toBeDefined();
      expect(
        createHash('sha256')
          .update(bytes as Buffer)
          .digest('hex'),
      ).toBe(digest);
    }

    // raw files byte for byte
    const [r1, r2, r3] = await Promise.all(
      inp.rawFiles.map(async (f) => {
        const got = f.read();
        return got instanceof Readable ? collect(got) : got;
      }),
    );
    expect((entries.get('raw/st001.cnv') as Buffer).equals(r1)).toBe(true);
    expect((entries.get('raw/passwd') as Buffer).equals(r2)).toBe(true);
    expect((entries.get('raw/st001-2.cnv') as Buffer).equals(r3)).toBe(true);

    // the tables inside are the writers' output, readable by their readers
    const iso = inp.tables[0].table;
    expect((entries.get('tables/isopycnal.csv') as Buffer).toString('utf8')).toBe(writeCsv(iso));
    const recs = parse(entries.get('tables/pressure.csv') as Buffer, { comment: '#' }) as string[][]; // read back with csv-parse
    expect(recs.length).toBe(inp.tables[1].table.rows.length + 1);
    const nc = new NetCDFReader(entries.get('tables/isopycnal.nc') as Buffer); // read back with netcdfjs
    expect(nc.getAttribute('Conventions')).toBe('CF-1.10');
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(entries.get('tables/pressure.xlsx') as unknown as ArrayBuffer); // read back with exceljs
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Pressure table', 'Provenance']);

    // README: the caller's text, provenance, the caution
    const readme = (entries.get('README.txt') as Buffer).toString('utf8');
    expect(readme).toContain('Data package for the synthetic cruise.');
    expect(readme).toContain('Provisional research data; not for navigation or safety-of-life use');
    expect(readme).toContain('Equation of state:');
    expect(readme).toContain(iso.provenance.saarSource);
    expect(readme).toContain('sha256sum -c MANIFEST.sha256');
  });

  it('writes only the formats asked for', async () => {
    const entries = await unzip(await collect(buildDataPackage(input({ formats: ['nc'], rawFiles: [] })))); // read back with yauzl
    expect([...entries.keys()]).toEqual(['README.txt', 'tables/isopycnal.nc', 'tables/pressure.nc', 'MANIFEST.sha256']);
  });

  it('makes entry names safe', () => {
    expect(safeName('../../etc/passwd')).toBe('passwd');
    expect(safeName('..\\..\\win.ini')).toBe('win.ini');
    expect(safeName('..')).toBe('file');
    expect(safeName('.hidden')).toBe('hidden');
    expect(safeName('St 12 (ä).cnv')).toBe('St_12_a_.cnv');
    expect(safeName('a/b/')).toBe('file');
    for (const n of ['../x', '/abs', 'c:\\x', 'a/../b']) expect(safeName(n)).not.toMatch(/[\\/]|^\./);
  });

  it('fails the stream when a raw file cannot be read', async () => {
    const bad = input({
      rawFiles: [{ key: 'k', filename: 'x.cnv', read: async () => Promise.reject(new Error('storage down')) }],
    });
    await expect(collect(buildDataPackage(bad))).rejects.toThrow(/storage down/);
  });
});
