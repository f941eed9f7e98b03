// Property tests: parseUpload never throws, and what it returns is always well formed — either
// errors naming file and message, or casts whose columns have equal length and finite pressures.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ParseResult } from '../../../shared/schemas/cast';
import { ParseResultSchema } from '../../../shared/schemas/cast';
import { parseUpload } from '../../../server/parsers/index';

const DIR = join(import.meta.dirname, '..', '..', '..', 'fixtures', 'samples');
const TEXT_SAMPLES = readdirSync(DIR)
  .filter((f) => !f.endsWith('.zip'))
  .map((f) => ({ name: f, bytes: readFileSync(join(DIR, f)) }));

function wellFormed(r: ParseResult, file: string): void {
  expect(ParseResultSchema.safeParse(r).success).toBe(true);
  if (!r.ok) {
    expect(r.errors.length).toBeGreaterThan(0);
    for (const e of r.errors) {
      expect(e.file.length).toBeGreaterThan(0);
      expect(e.message.length).toBeGreaterThan(0);
      expect(e.line === null || (Number.isInteger(e.line) && e.line >= 1)).toBe(true);
    }
    return;
  }
  for (const c of r.casts) {
    // a file of several profiles (netCDF) names each cast "<file> [profile n]"
    expect(c.file === file || c.file.startsWith(`${file} [profile `)).toBe(true);
    const n = c.profile.levels;
    expect(n).toBeGreaterThan(0);
    for (const col of Object.values(c.columns)) if (col) expect(col.length).toBe(n);
    for (const x of Object.values(c.extras)) expect(x.values.length).toBe(n);
    for (const f of Object.values(c.flags)) expect(f.length).toBe(n);
    const v = (c.vertical === 'pressure' ? c.columns.pressure : c.columns.depth) as Float64Array;
    for (let i = 0; i < n; i++) expect(Number.isFinite(v[i])).toBe(true);
    for (let i = 0; i < n; i++) expect(v[i] >= -5 && v[i] <= 12000).toBe(true);
  }
}

type Mutation =
  | { kind: 'truncate'; at: number }
  | { kind: 'dupLine'; line: number }
  | { kind: 'dropLine'; line: number }
  | { kind: 'flip'; at: number; byte: number }
  | { kind: 'insert'; at: number; text: string };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('truncate' as const), at: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({ kind: fc.constant('dupLine' as const), line: fc.nat(400) }),
  fc.record({ kind: fc.constant('dropLine' as const), line: fc.nat(400) }),
  fc.record({
    kind: fc.constant('flip' as const),
    at: fc.double({ min: 0, max: 1, noNaN: true }),
    byte: fc.integer({ min: 0, max: 255 }),
  }),
  fc.record({
    kind: fc.constant('insert' as const),
    at: fc.double({ min: 0, max: 1, noNaN: true }),
    text: fc.constantFrom(
      ',',
      '\t',
      ';',
      '\n',
      '"',
      '#',
      ' ',
      'NaN',
      '-999',
      'END_DATA\n',
      '1e400',
      '\r',
      'pressure,temperature',
      '=',
      '..',
    ),
  }),
);

function apply(bytes: Buffer, m: Mutation): Buffer {
  const pos = (x: number): number => Math.min(bytes.length, Math.floor(x * bytes.length));
  switch (m.kind) {
    case 'truncate':
      return bytes.subarray(0, pos(m.at));
    case 'flip': {
      const b = Buffer.from(bytes);
      if (b.length > 0) b[Math.min(b.length - 1, pos(m.at))] = m.byte;
      return b;
    }
    case 'insert': {
      const p = pos(m.at);
      return Buffer.concat([bytes.subarray(0, p), Buffer.from(m.text), bytes.subarray(p)]);
    }
    case 'dupLine':
    case 'dropLine': {
      const ls = bytes.toString('latin1').split('\n');
      const i = m.line % Math.max(1, ls.length);
      if (m.kind === 'dupLine') ls.splice(i, 0, ls[i]);
      else ls.splice(i, 1);
      return Buffer.from(ls.join('\n'), 'latin1');
    }
  }
}

describe('fuzzing parseUpload', () => {
  it('random bytes', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.uint8Array({ maxLength: 2000 }),
        fc.constantFrom('x.csv', 'x.zip', 'x.txt'),
        async (arr, name) => {
          const r = await parseUpload(name, Buffer.from(arr));
          wellFormed(r, name);
        },
      ),
      { numRuns: 300, seed: 4 },
    );
  });

  it('random printable text', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.string({
          maxLength: 600,
          unit: fc.constantFrom(...'0123456789.,;-\t\n #:=eE+NaICTDPRS_FLAGWpressuretmp[]'.split('')),
        }),
        async (s) => {
          const r = await parseUpload('t.csv', Buffer.from(s));
          wellFormed(r, 't.csv');
        },
      ),
      { numRuns: 300, seed: 5 },
    );
  });

  it('mutations of the good samples', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...TEXT_SAMPLES),
        fc.array(mutation, { minLength: 1, maxLength: 4 }),
        async (sample, ms) => {
          const bytes = ms.reduce(apply, sample.bytes);
          const r = await parseUpload(sample.name, bytes);
          wellFormed(r, sample.name);
        },
      ),
      { numRuns: 400, seed: 6 },
    );
  });

  it('mutations of the sample zip', async () => {
    const zip = readFileSync(join(DIR, 'casts.zip'));
    await fc.assert(
      fc.asyncProperty(fc.array(mutation, { minLength: 1, maxLength: 3 }), async (ms) => {
        const r = await parseUpload('casts.zip', ms.reduce(apply, zip));
        expect(ParseResultSchema.safeParse(r).success).toBe(true);
        if (!r.ok) for (const e of r.errors) expect(e.file.length * e.message.length).toBeGreaterThan(0);
      }),
      { numRuns: 150, seed: 7 },
    );
  });
});
