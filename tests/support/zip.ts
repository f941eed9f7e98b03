// Reads every entry of a zip with yauzl (tests only).
import yauzl from 'yauzl';
import type { Readable } from 'node:stream';

async function collect(stream: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of stream) parts.push(Buffer.from(c as Buffer));
  return Buffer.concat(parts);
}

export function unzip(zip: Buffer): Promise<Map<string, Buffer>> {
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
