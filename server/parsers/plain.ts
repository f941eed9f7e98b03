// The plain cast table: delimited text (comma, tab, semicolon, pipe or whitespace), BOM or not,
// `# key: value` metadata lines above a header row whose names carry units in brackets
// (api.md, "The plain cast CSV").
import { parse } from 'csv-parse/sync';
import type { FileError, ParsedCast } from '../../shared/schemas/cast';
import { buildCast } from './build';
import { splitHeader } from './columns';
import { collectMetadata, type MetaPair } from './metadata';
import { decodeText, fileError, ParseFailure, splitLines } from './text';

export type Delimiter = ',' | '\t' | ';' | '|' | 'whitespace';

/** Pick the delimiter of a header line: the most frequent of tab, semicolon, comma, pipe outside quotes. */
export function detectDelimiter(header: string): Delimiter {
  const counts: Record<string, number> = { '\t': 0, ';': 0, ',': 0, '|': 0 };
  let inQ = false;
  for (let i = 0; i < header.length; i++) {
    const ch = header[i];
    if (ch === '"') inQ = !inQ;
    else if (!inQ && ch in counts) counts[ch]++;
  }
  let best: Delimiter = 'whitespace';
  let n = 0;
  for (const d of ['\t', ';', ',', '|'] as const) {
    if (counts[d] > n) {
      n = counts[d];
      best = d;
    }
  }
  return best;
}

/** Whitespace-separated header fields, keeping "name [unit]" together. */
function splitWhitespaceHeader(line: string): string[] {
  const tokens = line.trim().split(/\s+/);
  const out: string[] = [];
  for (const tok of tokens) {
    const prev = out.length > 0 ? out[out.length - 1] : null;
    const prevOpen = prev !== null && /[[({][^\])}]*$/.test(prev); // "temperature [ITS-90" waits for "degC]"
    if (prev !== null && (prevOpen || /^[[({]/.test(tok))) out[out.length - 1] = prev + ' ' + tok;
    else out.push(tok);
  }
  return out;
}

/** A field with a decimal comma (in a file delimited by something else) read as a decimal point. */
function decimalComma(s: string): string {
  const i = s.indexOf(',');
  if (i < 0 || s.indexOf(',', i + 1) >= 0 || s.includes('.')) return s;
  return s.slice(0, i) + '.' + s.slice(i + 1);
}

export function parsePlain(
  file: string,
  bytes: Uint8Array,
  options: { columnMapping?: Record<string, string>; unitAnswers?: Record<string, string>; salvage?: boolean } = {},
): { cast: ParsedCast; warnings: FileError[] } {
  const { text, encoding } = decodeText(file, bytes);
  const lines = splitLines(file, text);
  const pairs: MetaPair[] = [];
  let h = 0;
  for (; h < lines.length; h++) {
    const l = lines[h].trim();
    if (l === '') continue;
    if (l.startsWith('#')) {
      const m = /^#+\s*([^:=]+?)\s*[:=]\s*(.*)$/.exec(l);
      if (m) pairs.push({ key: m[1], value: m[2], line: h + 1 });
      continue;
    }
    break;
  }
  if (h >= lines.length)
    throw new ParseFailure([
      fileError(file, null, null, 'no_header', 'no header row: the file has only comment or blank lines'),
    ]);

  const md = collectMetadata(file, pairs, false);
  if (md.errors.length > 0) throw new ParseFailure(md.errors);

  const headerText = lines[h];
  const delim = detectDelimiter(headerText);
  let headers: string[];
  const rows: string[][] = [];
  const rowLines: number[] = [];
  const body = lines.slice(h + 1);
  const hasQuotes = headerText.includes('"') || body.some((l) => l.includes('"'));

  if (delim === 'whitespace') {
    headers = splitWhitespaceHeader(headerText);
    for (let i = 0; i < body.length; i++) {
      const l = body[i].trim();
      if (l === '' || l.startsWith('#')) continue;
      rows.push(l.split(/\s+/));
      rowLines.push(h + 2 + i);
    }
  } else if (!hasQuotes) {
    // No quoting anywhere: a split is exactly what a CSV reader would do, and many times faster.
    headers = headerText.split(delim);
    const fixComma = delim !== ',';
    for (let i = 0; i < body.length; i++) {
      const l = body[i];
      if (l.length === 0 || l.trim() === '' || l.trimStart().startsWith('#')) continue;
      const f = l.split(delim);
      if (fixComma) for (let k = 0; k < f.length; k++) f[k] = decimalComma(f[k]);
      rows.push(f);
      rowLines.push(h + 2 + i);
    }
  } else {
    let records: { info: { lines: number }; record: string[] }[];
    try {
      records = parse(lines.slice(h).join('\n'), {
        delimiter: delim,
        info: true,
        relax_column_count: true,
        skip_empty_lines: true,
        comment: '#',
        comment_no_infix: true,
        trim: true,
        relax_quotes: true,
        max_record_size: 1 << 20,
      }) as unknown as { info: { lines: number }; record: string[] }[];
    } catch (e) {
      const lineNo = typeof (e as { lines?: unknown }).lines === 'number' ? (e as { lines: number }).lines + h : null;
      throw new ParseFailure([
        fileError(file, lineNo, null, 'field_count', `the delimited text cannot be read: ${(e as Error).message}`),
      ]);
    }
    if (records.length === 0) throw new ParseFailure([fileError(file, h + 1, null, 'no_header', 'no header row')]);
    headers = records[0].record;
    for (let r = 1; r < records.length; r++) {
      const rec = records[r].record;
      let inner = 0;
      for (const f of rec) for (let k = 0; k < f.length; k++) if (f.charCodeAt(k) === 10) inner++;
      rows.push(delim !== ',' ? rec.map(decimalComma) : rec);
      rowLines.push(records[r].info.lines - inner + h);
    }
  }
  const split = headers.map((x) => splitHeader(x.replace(/^"|"$/g, '')));
  const notes: string[] = [];
  if (encoding === 'utf-8-bom') notes.push('byte-order mark removed');
  if (encoding === 'utf-16le' || encoding === 'utf-16be') notes.push(`file read as ${encoding.toUpperCase()}`);
  return buildCast({
    file,
    format: 'plain',
    headers: headers.map((x) => x.trim()),
    names: split.map((s) => s.name),
    unitTexts: split.map((s) => s.unit),
    headerLine: h + 1,
    unitLine: h + 1,
    rows,
    rowLines,
    metadata: md.metadata,
    notes,
    warnings: [],
    mapping: options.columnMapping,
    unitAnswers: options.unitAnswers,
    salvage: options.salvage,
  });
}
