// The data package: one zip, streamed, holding
//   README.txt         the caller's text, the contents, each table's provenance, the caution
//   tables/<name>.csv|.xlsx|.nc   every table in every requested format
//   raw/<filename>     the raw cast files as uploaded (read lazily, one at a time)
//   MANIFEST.sha256    a SHA-256 of every other entry, in `sha256sum` format (`sha256sum -c`)
// Entry names are made safe: base names only, characters outside [A-Za-z0-9._-] replaced, no
// leading dots, duplicates numbered.
import { createHash } from 'node:crypto';
import { PassThrough, Readable, Transform, type TransformCallback } from 'node:stream';
import yazl from 'yazl';
import { tableToNetcdf, type CfOptions } from './cf';
import { csvStream } from './csv';
import { DATA_CAUTION, formatProvenanceText } from './provenance';
import type { DeliveryTable } from './table';
import { xlsxStream } from './xlsx';

export type DeliveryFormat = 'csv' | 'xlsx' | 'nc';

export interface PackageTable {
  name: string;
  table: DeliveryTable;
}

export interface PackageRawFile {
  /** Object-storage key (not written into the package). */
  key: string;
  /** Name the file had when uploaded; made safe for the package. */
  filename: string;
  read: () => Promise<Buffer> | Readable;
}

export interface PackageProgress {
  /** Path of the entry being written. */
  entry: string;
  /** 0-based index of the entry and the number of entries. */
  index: number;
  total: number;
}

export interface DataPackageInput {
  tables: PackageTable[];
  rawFiles: PackageRawFile[];
  formats: DeliveryFormat[];
  /** The caller's opening text for README.txt. */
  readme: string;
  cf?: CfOptions;
  /** Modification time stamped on every entry (default: now). */
  mtime?: Date;
  onProgress?: (p: PackageProgress) => void;
  /** Further entries at a path of their own (e.g. exchange/<file>), described in the README. */
  extraFiles?: { path: string; describe: string; read: () => Promise<Buffer> }[];
}

export const README_NAME = 'README.txt';
export const MANIFEST_NAME = 'MANIFEST.sha256';

/** A safe single path segment for a zip entry. */
export function safeName(name: string, fallback = 'file'): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  let s = base
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9._-]+/g, '_')
    .replace(/_{2,}/g, '_')
    .replace(/^[._-]+/, '');
  if (s.length > 120) {
    const dot = s.lastIndexOf('.');
    const ext = dot > 0 && s.length - dot <= 10 ? s.slice(dot) : '';
    s = s.slice(0, 120 - ext.length) + ext;
  }
  return s === '' ? fallback : s;
}

/** Give `name` a number before its extension until it is not in `taken` (case-insensitive). */
function unique(name: string, taken: Set<string>): string {
  let candidate = name;
  const dot = name.lastIndexOf('.');
  const stem = dot > 0 ? name.slice(0, dot) : name;
  const ext = dot > 0 ? name.slice(dot) : '';
  for (let k = 2; taken.has(candidate.toLowerCase()); k++) candidate = `${stem}-${k}${ext}`;
  taken.add(candidate.toLowerCase());
  return candidate;
}

type Produce = () => Promise<Readable>;

interface PlannedEntry {
  path: string;
  compress: boolean;
  produce: Produce;
}

class HashingPassThrough extends Transform {
  private readonly hash = createHash('sha256');
  digest: string | null = null;
  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback): void {
    this.hash.update(chunk);
    cb(null, chunk);
  }
  override _flush(cb: TransformCallback): void {
    this.digest = this.hash.digest('hex');
    cb();
  }
}

function readmeText(input: DataPackageInput, entries: { path: string; describe: string }[]): string {
  const lines: string[] = [];
  lines.push(input.readme.trim(), '');
  lines.push('CAUTION', DATA_CAUTION, '');
  lines.push('CONTENTS');
  const w = Math.max(MANIFEST_NAME.length, ...entries.map((e) => e.path.length));
  lines.push(`  ${README_NAME.padEnd(w)}  this file`);
  for (const e of entries) lines.push(`  ${e.path.padEnd(w)}  ${e.describe}`);
  lines.push(
    `  ${MANIFEST_NAME.padEnd(w)}  SHA-256 of every other file; check with: sha256sum -c ${MANIFEST_NAME}`,
    '',
  );
  for (const t of input.tables) {
    lines.push(`PROVENANCE: ${t.name} (${t.table.kind} table, ${t.table.rows.length} rows)`);
    lines.push(
      ...formatProvenanceText(t.table.provenance)
        .split('\n')
        .map((l) => `  ${l}`),
    );
    lines.push('  Columns:');
    for (const c of t.table.columns)
      lines.push(`    ${c.name}${c.unit ? ` [${c.unit}]` : ''}${c.long_name ? `: ${c.long_name}` : ''}`);
    if (t.table.kind === 'isopycnal') {
      lines.push('  Empty fields: the level does not exist in the cast. flags: ;-separated outcrop, below_bottom,');
      lines.push('  multi_crossing, in_inversion. In NetCDF, flags is a bit field (see flag_masks, flag_meanings).');
    }
    lines.push('');
  }
  return lines.join('\n').replace(/\n/g, '\r\n');
}

/** Build the data package as a zip stream (entries are produced one after another). */
export function buildDataPackage(input: DataPackageInput): Readable {
  const formats = [...new Set(input.formats)];
  const taken = new Set<string>([README_NAME.toLowerCase(), MANIFEST_NAME.toLowerCase()]);
  const planned: PlannedEntry[] = [];
  const described: { path: string; describe: string }[] = [];

  for (const t of input.tables) {
    const stem = safeName(t.name, 'table').replace(/\.(csv|xlsx|nc)$/i, '');
    for (const f of formats.filter((x): x is DeliveryFormat => ['csv', 'xlsx', 'nc'].includes(x))) {
      const path = unique(`tables/${stem}.${f}`, taken);
      const table = t.table;
      if (f === 'csv') {
        planned.push({ path, compress: true, produce: async () => csvStream(table) });
        described.push({ path, describe: `${t.name}: CSV, # provenance lines above the header` });
      } else if (f === 'xlsx') {
        planned.push({ path, compress: false, produce: async () => xlsxStream(table) });
        described.push({ path, describe: `${t.name}: spreadsheet with a Provenance sheet` });
      } else {
        planned.push({ path, compress: true, produce: async () => Readable.from([tableToNetcdf(table, input.cf)]) });
        described.push({ path, describe: `${t.name}: NetCDF-3 classic, CF-1.10` });
      }
    }
  }
  for (const x of input.extraFiles ?? []) {
    const path = unique(
      x.path
        .split('/')
        .map((seg) => safeName(seg))
        .join('/'),
      taken,
    );
    planned.push({ path, compress: true, produce: async () => Readable.from([await x.read()]) });
    described.push({ path, describe: x.describe });
  }
  for (const r of input.rawFiles) {
    const path = unique(`raw/${safeName(r.filename, 'raw-file')}`, taken);
    planned.push({
      path,
      compress: true,
      produce: async () => {
        const got = r.read();
        return got instanceof Readable ? got : Readable.from([await got]);
      },
    });
    described.push({ path, describe: 'raw cast file as uploaded' });
  }
  const readme = Buffer.from(readmeText(input, described), 'utf8');
  planned.unshift({ path: README_NAME, compress: true, produce: async () => Readable.from([readme]) });

  const out = new PassThrough();
  const zip = new yazl.ZipFile();
  const mtime = input.mtime ?? new Date();
  const digests: { path: string; hasher: HashingPassThrough }[] = [];
  const total = planned.length + 1;
  const fail = (err: unknown) => out.destroy(err instanceof Error ? err : new Error(String(err)));
  zip.on('error', fail);

  planned.forEach((entry, index) => {
    // fast deflate (level 1): tens of MB of tables and raw casts, where level 6 costs seconds for a
    // few per cent of size
    zip.addReadStreamLazy(
      entry.path,
      { mtime, ...(entry.compress ? { compressionLevel: 1 } : { compress: false }) },
      (cb) => {
        input.onProgress?.({ entry: entry.path, index, total });
        entry
          .produce()
          .then((source) => {
            const hasher = new HashingPassThrough();
            digests.push({ path: entry.path, hasher });
            source.on('error', fail);
            cb(null, source.pipe(hasher));
          })
          .catch((err: unknown) => cb(err instanceof Error ? err : new Error(String(err)), new PassThrough()));
      },
    );
  });
  zip.addReadStreamLazy(MANIFEST_NAME, { mtime, compress: true }, (cb) => {
    input.onProgress?.({ entry: MANIFEST_NAME, index: total - 1, total });
    try {
      const lines = digests.map(({ path, hasher }) => {
        if (hasher.digest === null) throw new Error(`internal: ${path} was not fully read before the manifest`);
        return `${hasher.digest}  ${path}\n`;
      });
      cb(null, Readable.from([Buffer.from(lines.join(''), 'utf8')]));
    } catch (err) {
      cb(err instanceof Error ? err : new Error(String(err)), new PassThrough());
    }
  });
  zip.end();
  zip.outputStream.pipe(out);
  return out;
}
