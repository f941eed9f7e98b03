// Every file of fixtures/bad (made by scripts/make-bad-corpus.ts) is refused with the error kind
// its manifest names, naming the file and, where the problem is on a line, the line and column.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { parseUpload } from '../../../server/parsers/index';
import { ParseResultSchema } from '../../../shared/schemas/cast';

const DIR = join(import.meta.dirname, '..', '..', '..', 'fixtures', 'bad');
const Manifest = z.object({
  count: z.number(),
  files: z.array(
    z.object({
      file: z.string(),
      expect: z.string(),
      errorFile: z.string().optional(),
      line: z.number().nullable().optional(),
      column: z.number().nullable().optional(),
      what: z.string(),
    }),
  ),
});
const manifest = Manifest.parse(JSON.parse(readFileSync(join(DIR, 'manifest.json'), 'utf8')));

describe('bad-file corpus', () => {
  it('has at least 300 files, each listed once in the manifest', () => {
    const onDisk = readdirSync(DIR)
      .filter((f) => f !== 'manifest.json')
      .sort();
    expect(onDisk.length).toBeGreaterThanOrEqual(300);
    expect(manifest.files.map((e) => e.file).sort()).toEqual(onDisk);
    expect(manifest.count).toBe(onDisk.length);
  });

  it('covers every kind of bad input the brief names', () => {
    const kinds = new Set(manifest.files.map((e) => e.expect));
    for (const k of [
      'truncated',
      'exchange_missing_end',
      'missing_column',
      'text_in_numeric',
      'nan_inf',
      'invalid_utf8',
      'binary',
      'empty_file',
      'line_too_long',
      'repeated_header',
      'pressure_out_of_range',
      'latitude_out_of_range',
      'longitude_out_of_range',
      'bad_time',
      'salinity_out_of_range',
      'zip_ratio',
      'zip_too_large',
      'zip_unsafe_path',
      'unit_unconvertible',
    ])
      expect(kinds.has(k), k).toBe(true);
  });

  it.each(manifest.files.map((e) => [e.file, e] as const))('%s', async (_name, e) => {
    const bytes = readFileSync(join(DIR, e.file));
    const r = await parseUpload(e.file, bytes);
    expect(ParseResultSchema.safeParse(r).success).toBe(true);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    for (const err of r.errors) {
      expect(err.file.length).toBeGreaterThan(0);
      expect(err.message.length).toBeGreaterThan(0);
    }
    const want = {
      code: e.expect,
      file: e.errorFile ?? e.file,
      ...(e.line !== undefined ? { line: e.line } : {}),
      ...(e.column !== undefined ? { column: e.column } : {}),
    };
    expect(r.errors).toContainEqual(expect.objectContaining(want));
  });

  it('a zip bomb fails fast, without inflating', async () => {
    const bytes = readFileSync(join(DIR, 'zip-bomb-one-big-entry.zip'));
    const before = process.memoryUsage().arrayBuffers;
    const r = await parseUpload('bomb.zip', bytes);
    // refused from the central directory: no inflated bytes were held (memory, not time, is the check)
    expect(process.memoryUsage().arrayBuffers - before).toBeLessThan(20 * 1024 * 1024);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors.map((e) => e.code)).toEqual(
        expect.arrayContaining([expect.stringMatching(/^zip_(ratio|too_large)$/)]),
      );
  });
});
