// Safe reading of a zip of cast files. Everything is decided from the central directory before a
// byte is inflated: entry count, declared sizes and compression ratios (so a zip bomb fails fast),
// and every path (no "..", no absolute paths, no drive letters). Inflation is then capped as it
// runs, in case a header lies about its size.
import yauzl from 'yauzl';
import type { Entry, ZipFile } from 'yauzl';
import { fileError, ParseFailure } from './text';

export type ZipLimits = {
  maxEntries: number;
  maxEntryBytes: number; // uncompressed bytes of one entry
  maxTotalBytes: number; // uncompressed bytes of all entries together
  maxRatio: number; // uncompressed / compressed, checked for entries above ratioFloorBytes
  ratioFloorBytes: number;
};
export const DEFAULT_ZIP_LIMITS: ZipLimits = {
  maxEntries: 2000,
  maxEntryBytes: 50 * 1024 * 1024,
  maxTotalBytes: 250 * 1024 * 1024,
  maxRatio: 100,
  ratioFloorBytes: 1024 * 1024,
};

export type ZipEntryFile = { path: string; bytes: Buffer };

export function isZip(bytes: Uint8Array): boolean {
  return (
    bytes.length >= 4 &&
    bytes[0] === 0x50 &&
    bytes[1] === 0x4b &&
    (bytes[2] === 3 || bytes[2] === 5) &&
    (bytes[3] === 4 || bytes[3] === 6)
  );
}

/** Why a stored path is unsafe to use, or null if it is a plain relative path. */
export function unsafePathReason(name: string): string | null {
  if (name.includes('\u0000')) return 'it contains a NUL character';
  const p = name.replace(/\\/g, '/');
  if (p.startsWith('/')) return 'it is an absolute path';
  if (/^[A-Za-z]:/.test(p)) return 'it names a drive';
  if (p.split('/').some((seg) => seg === '..')) return 'it climbs out of the archive with ".."';
  return null;
}

function open(zipBytes: Buffer): Promise<ZipFile> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(zipBytes, { lazyEntries: true, decodeStrings: false, validateEntrySizes: true }, (err, zf) => {
      if (err || !zf) reject(err ?? new Error('no zip file'));
      else resolve(zf);
    });
  });
}

function listEntries(zf: ZipFile): Promise<Entry[]> {
  return new Promise((resolve, reject) => {
    const out: Entry[] = [];
    zf.on('entry', (e: Entry) => {
      out.push(e);
      zf.readEntry();
    });
    zf.on('end', () => resolve(out));
    zf.on('error', reject);
    zf.readEntry();
  });
}

function inflate(zf: ZipFile, e: Entry, cap: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    zf.openReadStream(e, (err, stream) => {
      if (err || !stream) return reject(err ?? new Error('no stream'));
      const chunks: Buffer[] = [];
      let n = 0;
      stream.on('data', (c: Buffer) => {
        n += c.length;
        if (n > cap) {
          stream.destroy(new Error(`entry inflates beyond ${cap} bytes`));
          return;
        }
        chunks.push(c);
      });
      stream.on('error', reject);
      stream.on('end', () => resolve(Buffer.concat(chunks)));
    });
  });
}

function nameOf(e: Entry): string {
  const raw = e.fileName as unknown as Buffer | string;
  if (typeof raw === 'string') return raw;
  // Bit 11 says UTF-8; otherwise the name is in the old DOS code page, read here as Latin-1.
  return (e.generalPurposeBitFlag & 0x800) !== 0 ? raw.toString('utf8') : raw.toString('latin1');
}

/** The files of a zip, or a ParseFailure naming the zip (and the entry) when it is unsafe. */
export async function readZip(
  file: string,
  bytes: Buffer,
  limits: ZipLimits = DEFAULT_ZIP_LIMITS,
): Promise<{ files: ZipEntryFile[]; skipped: string[] }> {
  const fail = (code: string, message: string): never => {
    throw new ParseFailure([fileError(file, null, null, code, message)]);
  };
  let zf: ZipFile;
  try {
    zf = await open(bytes);
  } catch (e) {
    return fail('zip_corrupt', `the zip cannot be read: ${(e as Error).message}`);
  }
  try {
    if (zf.entryCount > limits.maxEntries)
      fail('zip_too_many_entries', `the zip has ${zf.entryCount} entries (the limit is ${limits.maxEntries})`);
    let entries: Entry[];
    try {
      entries = await listEntries(zf);
    } catch (e) {
      return fail('zip_corrupt', `the zip cannot be read: ${(e as Error).message}`);
    }
    let total = 0;
    const wanted: { e: Entry; path: string }[] = [];
    const skipped: string[] = [];
    for (const e of entries) {
      const path = nameOf(e);
      const why = unsafePathReason(path);
      if (why) fail('zip_unsafe_path', `zip entry ${JSON.stringify(path)} is refused: ${why}`);
      if (path.endsWith('/')) continue; // a directory
      const base = path.split('/').pop() ?? path;
      if (path.startsWith('__MACOSX/') || base.startsWith('.')) {
        skipped.push(path);
        continue;
      }
      if ((e.generalPurposeBitFlag & 1) !== 0) fail('zip_encrypted', `zip entry ${JSON.stringify(path)} is encrypted`);
      if (/\.(zip|jar|7z|gz|tgz|bz2|xz|rar)$/i.test(base))
        fail('zip_nested', `zip entry ${JSON.stringify(path)} is itself an archive; unpack it first`);
      if (e.uncompressedSize > limits.maxEntryBytes)
        fail(
          'zip_too_large',
          `zip entry ${JSON.stringify(path)} would inflate to ${e.uncompressedSize} bytes (the limit is ${limits.maxEntryBytes})`,
        );
      const ratio = e.uncompressedSize / Math.max(1, e.compressedSize);
      if (e.uncompressedSize > limits.ratioFloorBytes && ratio > limits.maxRatio)
        fail(
          'zip_ratio',
          `zip entry ${JSON.stringify(path)} is compressed ${ratio.toFixed(0)}:1 (the limit is ${limits.maxRatio}:1): refused as a possible zip bomb`,
        );
      total += e.uncompressedSize;
      if (total > limits.maxTotalBytes)
        fail('zip_too_large', `the zip would inflate to more than ${limits.maxTotalBytes} bytes`);
      wanted.push({ e, path });
    }
    if (wanted.length === 0) fail('zip_empty', 'the zip holds no files');
    const files: ZipEntryFile[] = [];
    for (const { e, path } of wanted) {
      let data: Buffer;
      try {
        data = await inflate(zf, e, Math.min(limits.maxEntryBytes, e.uncompressedSize));
      } catch (err) {
        return fail('zip_corrupt', `zip entry ${JSON.stringify(path)} cannot be read: ${(err as Error).message}`);
      }
      if (isZip(data)) fail('zip_nested', `zip entry ${JSON.stringify(path)} is itself a zip; unpack it first`);
      files.push({ path, bytes: data });
    }
    return { files, skipped };
  } finally {
    zf.close();
  }
}
