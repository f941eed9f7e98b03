// CSV writer for delivery tables: `#` provenance comment lines, one header row, then the rows.
//
// - Numbers are written in the shortest form that parses back to the same float64
//   (ECMAScript Number-to-String is exactly that); -0 keeps its sign; null/NaN are empty fields.
// - Text cells go through one function, csvText: a cell a spreadsheet would take for a formula
//   (first non-blank character = + - @ or their full-width forms, or a leading tab/CR) gets a
//   leading single quote; a cell holding any separator a spreadsheet locale may use (, ; tab |),
//   a double quote, CR, LF, `#` or edge blanks is quoted (RFC 4180, quotes doubled), so a `;=…`
//   payload stays inside one field whatever the locale's separator. Numbers are never touched.
// - Lines end with CRLF (RFC 4180).
import { Readable } from 'node:stream';
import {
  ISOPYCNAL_COLUMNS,
  type DeliveryCell,
  type DeliveryColumn,
  type DeliveryRow,
  type DeliveryTable,
} from './table';
import { DATA_CAUTION, oneLine, provenanceEntries, type Provenance } from './provenance';

export const CSV_EOL = '\r\n';

// eslint-disable-next-line no-control-regex
const FORMULA_START = /^[\s\u0000-\u001f]*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20]|^[\t\r]/;
/** Characters that make a field quoted: every locale's separators, quotes, line breaks, comment mark. */
const NEEDS_QUOTES = /[,;\t|"\r\n#]|^\s|\s$/;

/** Prefix a string that would start a spreadsheet formula with `'`. */
export function neutraliseFormula(s: string): string {
  return FORMULA_START.test(s) ? `'${s}` : s;
}

/** The one quoting function for CSV text cells (see the file header). */
export function csvText(s: string): string {
  const v = neutraliseFormula(s);
  return NEEDS_QUOTES.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/** Shortest round-trip decimal form of a finite float64; '' for non-finite. */
export function formatNumber(n: number): string {
  if (n === 0) return Object.is(n, -0) ? '-0' : '0';
  return Number.isFinite(n) ? String(n) : '';
}

/** One CSV field. */
export function formatCell(v: DeliveryCell | undefined): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return formatNumber(v);
  return csvText(v);
}

/** One CSV record (no line ending). */
export function formatRow(row: readonly (DeliveryCell | undefined)[]): string {
  let s = '';
  for (let i = 0; i < row.length; i++) {
    if (i > 0) s += ',';
    s += formatCell(row[i]);
  }
  return s;
}

function commentValue(s: string): string {
  // A comment line is one field to a spreadsheet only until its first separator (, ; tab or |,
  // whatever the locale): neutralise each separated piece as well, so no piece can start a formula.
  return oneLine(s).replace(/([,;\t|])([^,;\t|]*)/g, (_, sep: string, piece: string) => sep + neutraliseFormula(piece));
}

/** The `#` comment lines that head every CSV delivery (without line endings). */
export function provenanceCommentLines(p: Provenance, columns: readonly DeliveryColumn[]): string[] {
  const lines = provenanceEntries(p).map((e) => `# ${e.key}: ${commentValue(e.value)}`);
  const units = columns.filter((c) => c.unit).map((c) => `${c.name}=${c.unit}`);
  if (units.length) lines.push(`# units: ${commentValue(units.join('; '))}`);
  lines.push(`# caution: ${commentValue(DATA_CAUTION)}`);
  return lines;
}

/** The header record. */
export function headerLine(columns: readonly DeliveryColumn[]): string {
  return formatRow(columns.map((c) => c.name));
}

/** The whole table as CSV text. */
export function writeCsv(table: DeliveryTable): string {
  // records joined in blocks of 1000, then the blocks once: appending 10^5 records to one string
  // (a rope the first byte count must flatten) cost more than formatting them
  const head = [...provenanceCommentLines(table.provenance, table.columns), headerLine(table.columns)];
  const blocks: string[] = [head.join(CSV_EOL) + CSV_EOL];
  let block: string[] = [];
  for (const row of table.rows) {
    block.push(formatRow(row));
    if (block.length === 1000) {
      blocks.push(block.join(CSV_EOL) + CSV_EOL);
      block = [];
    }
  }
  if (block.length) blocks.push(block.join(CSV_EOL) + CSV_EOL);
  return blocks.join('');
}

export type RowSource = AsyncIterable<DeliveryRow> | Iterable<DeliveryRow>;

function isTable(x: DeliveryTable | RowSource): x is DeliveryTable {
  return typeof x === 'object' && x !== null && 'columns' in x && 'rows' in x && 'provenance' in x;
}

export interface CsvStreamOptions {
  /** Columns of the rows when the source is an iterable of rows (default: the isopycnal columns). */
  columns?: readonly DeliveryColumn[];
  /** Rows per chunk pushed to the stream (default 500). */
  rowsPerChunk?: number;
}

/**
 * Stream a CSV delivery. The source is a whole table, or an (async) iterable of rows with the
 * provenance (and columns, by default ISOPYCNAL_COLUMNS) given beside it. The bytes are the same
 * as writeCsv's for the same table.
 */
export function csvStream(
  source: DeliveryTable | RowSource,
  provenance?: Provenance,
  options: CsvStreamOptions = {},
): Readable {
  let columns: readonly DeliveryColumn[];
  let rows: RowSource;
  let prov: Provenance;
  if (isTable(source)) {
    columns = source.columns;
    rows = source.rows;
    prov = provenance ?? source.provenance;
  } else {
    if (!provenance) throw new Error('csvStream: provenance is required with a row source');
    columns = options.columns ?? ISOPYCNAL_COLUMNS;
    rows = source;
    prov = provenance;
  }
  const perChunk = Math.max(1, options.rowsPerChunk ?? 500);
  const width = columns.length;
  async function* generate(): AsyncGenerator<string> {
    yield [...provenanceCommentLines(prov, columns), headerLine(columns)].join(CSV_EOL) + CSV_EOL;
    let buf: string[] = [];
    let n = 0;
    for await (const row of rows) {
      if (row.length !== width) throw new Error(`csvStream: row ${n} has ${row.length} cells, expected ${width}`);
      buf.push(formatRow(row));
      n++;
      if (buf.length >= perChunk) {
        yield buf.join(CSV_EOL) + CSV_EOL;
        buf = [];
      }
    }
    if (buf.length) yield buf.join(CSV_EOL) + CSV_EOL;
  }
  return Readable.from(generate(), { objectMode: false });
}
