// The zip reader's limits, tried with small archives made here and small limits.
import { describe, expect, it } from 'vitest';
import yazl from 'yazl';
import { parseUpload } from '../../../server/parsers/index';
import { readZip, unsafePathReason } from '../../../server/parsers/zip';
import { ParseFailure } from '../../../server/parsers/text';

function zipOf(list: { name: string; data: Buffer }[]): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const z = new yazl.ZipFile();
    for (const e of list) z.addBuffer(e.data, e.name);
    z.end();
    const chunks: Buffer[] = [];
    z.outputStream.on('data', (c: Buffer) => chunks.push(c));
    z.outputStream.on('end', () => resolve(Buffer.concat(chunks)));
    z.outputStream.on('error', reject);
  });
}
const cast = Buffer.from(
  '# station: Z1\npressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]\n2,18,35.5\n4,17.9,35.5\n',
);

async function codeOf(p: Promise<unknown>): Promise<string> {
  try {
    await p;
    return 'none';
  } catch (e) {
    return e instanceof ParseFailure ? (e.errors[0]?.code ?? '?') : 'other';
  }
}

describe('zip', () => {
  it('unsafe paths', () => {
    expect(unsafePathReason('casts/a.csv')).toBeNull();
    expect(unsafePathReason('a..b.csv')).toBeNull();
    for (const p of ['../a.csv', 'x/../../a.csv', '/abs.csv', 'C:/a.csv', '..\\a.csv'])
      expect(unsafePathReason(p), p).not.toBeNull();
  });
  it('limits on entry count, total size and ratio', async () => {
    const z = await zipOf([
      { name: 'a.csv', data: cast },
      { name: 'b.csv', data: cast },
      { name: 'c.csv', data: cast },
    ]);
    const base = { maxEntries: 100, maxEntryBytes: 1e6, maxTotalBytes: 1e6, maxRatio: 100, ratioFloorBytes: 1e6 };
    expect(await codeOf(readZip('z.zip', z, { ...base, maxEntries: 2 }))).toBe('zip_too_many_entries');
    expect(await codeOf(readZip('z.zip', z, { ...base, maxTotalBytes: cast.length * 2 }))).toBe('zip_too_large');
    expect(await codeOf(readZip('z.zip', z, { ...base, maxEntryBytes: cast.length - 1 }))).toBe('zip_too_large');
    const zeros = await zipOf([{ name: 'z.csv', data: Buffer.alloc(200_000, 0x30) }]);
    expect(await codeOf(readZip('z.zip', zeros, { ...base, ratioFloorBytes: 1000 }))).toBe('zip_ratio');
    expect(await codeOf(readZip('z.zip', z, base))).toBe('none');
  });
  it('all-or-nothing: one bad entry fails the upload and names the entry', async () => {
    const bad = Buffer.from('pressure,temperature,salinity\n2,18,35.5\n4,hot,35.5\n');
    const z = await zipOf([
      { name: 'ok.csv', data: cast },
      { name: 'd/bad.csv', data: bad },
    ]);
    const r = await parseUpload('up.zip', z);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatchObject({ file: 'd/bad.csv', line: 3, column: 2, code: 'text_in_numeric' });
  });
  it('hidden and system entries are skipped with a warning', async () => {
    const z = await zipOf([
      { name: 'ok.csv', data: cast },
      { name: '__MACOSX/._ok.csv', data: Buffer.from([0, 1, 2]) },
      { name: 'README.txt', data: Buffer.from('notes') },
    ]);
    const r = await parseUpload('up.zip', z);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.casts).toHaveLength(1);
      expect(r.warnings.filter((w) => w.code === 'skipped')).toHaveLength(2);
    }
  });
});
