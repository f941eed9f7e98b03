import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parse } from 'csv-parse/sync';
import { csvStream, writeCsv } from '../../../server/services/deliveries/csv';
import {
  ISOPYCNAL_COLUMNS,
  type DeliveryColumn,
  type DeliveryRow,
  type DeliveryTable,
} from '../../../server/services/deliveries/table';
import { provenance, syntheticIsopycnalTable } from './synthetic';

// The rule restated independently of the writer: string cells whose first non-blank character is
// = + - @ (or the full-width forms), or that start with tab or CR, get a leading '.
// eslint-disable-next-line no-control-regex
const neutralised = (s: string): string => (/^[\s\u0000-\u001f]*[=+\-@＝＋－＠]|^[\t\r]/.test(s) ? `'${s}` : s);

/** Read back with csv-parse: `#` lines are comments, the first record is the header. */
function readBack(text: string): { header: string[]; records: string[][]; comments: string[] } {
  const comments = text.split('\r\n').filter((l) => l.startsWith('#'));
  const all = parse(text, { comment: '#', relax_column_count: false, skip_empty_lines: false }) as string[][];
  return { header: all[0], records: all.slice(1), comments };
}

/** Compare a read-back record with the table row: numbers exactly, strings after neutralising. */
function expectRowEqual(columns: readonly DeliveryColumn[], row: DeliveryRow, rec: string[]): void {
  expect(rec.length).toBe(columns.length);
  columns.forEach((c, i) => {
    const v = row[i];
    const f = rec[i];
    if (v === null || v === '') {
      expect(f).toBe('');
    } else if (c.type === 'number') {
      expect(typeof v).toBe('number');
      expect(f).not.toBe('');
      expect(Object.is(Number(f), v)).toBe(true);
    } else {
      expect(f).toBe(neutralised(v as string));
    }
  });
}

async function collect(stream: NodeJS.ReadableStream): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(Buffer.isBuffer(c) ? c : Buffer.from(c as string));
  return Buffer.concat(chunks).toString('utf8');
}

describe('CSV writer', () => {
  it('reads back with csv-parse equal to the table (numbers exactly), api.md column order', () => {
    const table = syntheticIsopycnalTable({ seed: 11, casts: 15, levels: 30, tricky: true, extras: true });
    const { header, records, comments } = readBack(writeCsv(table)); // read back with csv-parse
    expect(header).toEqual([...ISOPYCNAL_COLUMNS.map((c) => c.name), 'time', 'oxygen', 'note']);
    expect(header.slice(0, 13).join(',')).toBe(
      'station,cast,latitude,longitude,sigma_ref,sigma_level,pressure,depth,CT,SA,thickness,crossings,flags',
    );
    expect(records.length).toBe(table.rows.length);
    table.rows.forEach((row, r) => expectRowEqual(table.columns, row, records[r]));
    // the flags column holds ;-separated words from the contract, empty when there are none
    const fi = header.indexOf('flags');
    const words = new Set(records.flatMap((rec) => (rec[fi] ? rec[fi].split(';') : [])));
    expect([...words].every((w) => ['outcrop', 'below_bottom', 'multi_crossing', 'in_inversion'].includes(w))).toBe(
      true,
    );
    expect(words.size).toBeGreaterThan(1);
    expect(comments.length).toBeGreaterThan(5);
  });

  it('round-trips arbitrary float64 values and strings (fast-check; read back with csv-parse)', () => {
    const columns: DeliveryColumn[] = [
      { name: 'a', unit: 'm', type: 'number' },
      { name: 's', unit: null, type: 'string' },
      { name: 'b', unit: null, type: 'number' },
    ];
    const cell = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.constant(null));
    const str = fc.oneof(
      fc.string({ unit: 'grapheme', maxLength: 12 }),
      fc.constantFrom('=A1', '-2', '+x', '@y', '\tz', '\rq', 'a,b', '"', '#x', 'x\r\ny'),
      fc.constant(null),
    );
    fc.assert(
      fc.property(fc.array(fc.tuple(cell, str, cell), { minLength: 1, maxLength: 40 }), (rows) => {
        const table: DeliveryTable = {
          kind: 'pressure',
          columns,
          rows: rows.map((r) => [...r]),
          provenance: provenance(),
        };
        const { records } = readBack(writeCsv(table));
        expect(records.length).toBe(rows.length);
        table.rows.forEach((row, i) => expectRowEqual(columns, row, records[i]));
      }),
      { seed: 20260304, numRuns: 200 },
    );
  });

  it('neutralises formula starts in strings but never touches numbers', () => {
    const columns: DeliveryColumn[] = [
      { name: 'station', unit: null, type: 'string' },
      { name: 'x', unit: null, type: 'number' },
    ];
    const rows: DeliveryRow[] = [
      ['=HYPERLINK("http://example.invalid","x")', -1.5],
      ['+1', -0],
      ['-1', -1e-300],
      ['@SUM(A1)', 5e-324],
      ['\tx', 1.7976931348623157e308],
      ['\rx', -123],
      ['ok', 0.1],
    ];
    const text = writeCsv({ kind: 'pressure', columns, rows, provenance: provenance() });
    const lines = text.split('\r\n').filter((l) => l && !l.startsWith('#'));
    expect(lines[1]).toBe(`"'=HYPERLINK(""http://example.invalid"",""x"")",-1.5`);
    expect(lines[2]).toBe(`'+1,-0`);
    expect(lines[3]).toBe(`'-1,-1e-300`);
    expect(lines[4]).toBe(`'@SUM(A1),5e-324`);
    expect(lines[5]).toBe(`"'\tx",1.7976931348623157e+308`); // quoted: a tab is a separator somewhere
    expect(lines[7]).toBe('ok,0.1');
    const { records } = readBack(text); // read back with csv-parse
    expect(records.map((r) => r[0])).toEqual(rows.map((r) => neutralised(r[0] as string)));
    expect(records.map((r) => Number(r[1]))).toEqual(rows.map((r) => r[1]));
    // no data line starts a formula, and no field read back starts one
    for (const rec of records) expect(/^[=+\-@\t\r]/.test(rec[0])).toBe(false);
  });

  it('quotes any locale separator so no `;=` payload becomes a formula in a `;` or tab locale (#14 item 9)', () => {
    const columns: DeliveryColumn[] = [
      { name: 's', unit: null, type: 'string' },
      { name: 'n', unit: null, type: 'number' },
    ];
    const values = ['a;=1+1', 'K-07;@SUM(A1)', 'x\t=cmd', 'p|+1', ' =1', '＝1+1', 'semi;colon', 'plain'];
    const text = writeCsv({ kind: 'pressure', columns, rows: values.map((v) => [v, 1]), provenance: provenance() });
    const data = text
      .split('\r\n')
      .filter((l) => l && !l.startsWith('#'))
      .slice(1);
    // read as a spreadsheet in each locale would: split on its separator, honouring RFC 4180 quotes
    for (const delimiter of [',', ';', '\t', '|']) {
      const recs = parse(data.join('\r\n'), { delimiter, relax_column_count: true, relax_quotes: true }) as string[][];
      for (const rec of recs)
        for (const field of rec) expect(/^\s*[=+\-@＝＋－＠]/.test(field), `${delimiter}: ${field}`).toBe(false);
    }
    expect(data[0]).toBe('"a;=1+1",1');
    expect(data[4]).toBe("' =1,1");
    expect(data[5]).toBe("'＝1+1,1");
    const { records } = readBack(text);
    expect(records.map((r) => r[0])).toEqual(values.map(neutralised));
  });

  it('quotes commas, quotes and newlines (read back with csv-parse)', () => {
    const columns: DeliveryColumn[] = [{ name: 's', unit: null, type: 'string' }];
    const values = ['a,b', 'say "hi"', 'two\nlines', 'cr\rhere', 'crlf\r\nhere', '#not a comment', 'plain'];
    const text = writeCsv({ kind: 'pressure', columns, rows: values.map((v) => [v]), provenance: provenance() });
    expect(text).toContain('"a,b"');
    expect(text).toContain('"say ""hi"""');
    const { records } = readBack(text);
    expect(records.map((r) => r[0])).toEqual(values);
  });

  it('writes the provenance as # comment lines above the header', () => {
    const prov = provenance({ exportedBy: 'Dr. P. I., =cmd', referencePressure: 2000, inversionHandling: 'drop' });
    const table = syntheticIsopycnalTable({ seed: 3, casts: 2, levels: 3 }, prov);
    const text = writeCsv(table);
    const lines = text.split('\r\n');
    const headerAt = lines.findIndex((l) => l.startsWith('station,'));
    expect(lines.slice(0, headerAt).every((l) => l.startsWith('# '))).toBe(true);
    const head = lines.slice(0, headerAt).join('\n');
    for (const want of [
      '# software: Sigmaline 0.1.0-test',
      `# equation_of_state: ${prov.equationOfState}`,
      '# reference_pressure: 2000 dbar',
      `# layer_set: ${prov.layerSet}`,
      '# inversion_handling: drop',
      `# saar_source: ${prov.saarSource}`,
      `# exported_at: ${prov.exportedAt}`,
      "# exported_by: Dr. P. I.,' =cmd",
      '# caution: Provisional research data; not for navigation or safety-of-life use',
      '# units: latitude=degrees_north; longitude=degrees_east; sigma_ref=dbar',
    ]) {
      expect(head).toContain(want);
    }
  });

  it('streams the same bytes as writeCsv, from a table or from an async iterable of rows', async () => {
    const table = syntheticIsopycnalTable({ seed: 5, casts: 7, levels: 90, tricky: true });
    const whole = writeCsv(table);
    expect(await collect(csvStream(table))).toBe(whole);
    async function* rows(): AsyncGenerator<DeliveryRow> {
      for (const r of table.rows) yield r;
    }
    expect(await collect(csvStream(rows(), table.provenance, { columns: table.columns, rowsPerChunk: 7 }))).toBe(whole);
  });

  it('refuses rows of the wrong width in a stream', async () => {
    async function* rows(): AsyncGenerator<DeliveryRow> {
      yield ['a', 'b'];
    }
    await expect(collect(csvStream(rows(), provenance()))).rejects.toThrow(/expected 13/);
  });
});
