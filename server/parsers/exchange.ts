// The community hydrographic CTD exchange format (an open standard of the trade): a first line
// naming the file type and a stamp ("CTD,20260304ABCDEF"), `#` comments, a `NUMBER_HEADERS = n`
// block of `KEY = value` metadata, a parameter-name line, a units line, comma-separated data with
// `*_FLAG_W` quality columns and fill value -999, and `END_DATA`.
import type { CastMetadata, FileError, ParsedCast } from '../../shared/schemas/cast';
import { buildCast } from './build';
import { collectMetadata, type MetaPair } from './metadata';
import { decodeText, fileError, ParseFailure, splitLines } from './text';

export const EXCHANGE_FIRST_LINE = /^\s*CTD\s*,\s*([^,\s]*)[\s,]*$/i;
/** The first line of an exchange bottle file ("BOTTLE,20170123ABCDEF"). */
export const EXCHANGE_BOTTLE_FIRST_LINE = /^\s*BOTTLE\s*,\s*([^,\s]*)[\s,]*$/i;

function bad(file: string, line: number | null, message: string): ParseFailure {
  return new ParseFailure([fileError(file, line, null, 'exchange_bad_header', message)]);
}

export function parseExchange(
  file: string,
  bytes: Uint8Array,
  options: { columnMapping?: Record<string, string>; unitAnswers?: Record<string, string>; salvage?: boolean } = {},
): { cast: ParsedCast; warnings: FileError[] } {
  const { text } = decodeText(file, bytes);
  const lines = splitLines(file, text);
  let i = 0;
  while (i < lines.length && lines[i].trim() === '') i++;
  const first = i < lines.length ? EXCHANGE_FIRST_LINE.exec(lines[i]) : null;
  if (!first) throw bad(file, i + 1, `line ${i + 1}: an exchange file starts with a line like "CTD,20260304ABCDEF"`);
  const stamp = first[1];
  i++;
  const isSkippable = (l: string): boolean => l.trim() === '' || l.trimStart().startsWith('#');
  while (i < lines.length && isSkippable(lines[i])) i++;
  if (i >= lines.length)
    throw new ParseFailure([
      fileError(file, lines.length, null, 'truncated', 'the file ends before its NUMBER_HEADERS line'),
    ]);
  const nh = /^\s*NUMBER_HEADERS\s*=\s*(\d+)[\s,]*$/i.exec(lines[i]);
  if (!nh)
    throw bad(
      file,
      i + 1,
      `line ${i + 1}: expected "NUMBER_HEADERS = n", found ${JSON.stringify(lines[i].slice(0, 60))}`,
    );
  const count = Number(nh[1]);
  if (count < 1 || count > 200)
    throw bad(file, i + 1, `line ${i + 1}: NUMBER_HEADERS = ${count} is not a sensible count (1..200)`);
  i++;
  const pairs: MetaPair[] = [];
  while (pairs.length < count - 1) {
    if (i >= lines.length)
      throw new ParseFailure([
        fileError(
          file,
          lines.length,
          null,
          'truncated',
          `the file ends inside its header block (${pairs.length + 1} of ${count} header lines)`,
        ),
      ]);
    const l = lines[i];
    if (!isSkippable(l)) {
      // Spreadsheet-saved files pad every line with commas: "STNNBR = 5,,,,".
      const m = /^\s*([A-Za-z][A-Za-z0-9_]*)\s*=\s*(.*?)[\s,]*$/.exec(l);
      if (!m)
        throw bad(
          file,
          i + 1,
          `line ${i + 1}: expected header line ${pairs.length + 2} of ${count} ("KEY = value"), found ${JSON.stringify(l.slice(0, 60))}`,
        );
      pairs.push({ key: m[1], value: m[2], line: i + 1 });
    }
    i++;
  }
  while (i < lines.length && isSkippable(lines[i])) i++;
  if (i + 1 >= lines.length)
    throw new ParseFailure([
      fileError(file, lines.length, null, 'truncated', 'the file ends before its parameter and units lines'),
    ]);
  const paramLine = i + 1;
  const params = lines[i].split(',').map((s) => s.trim());
  while (params.length > 1 && params[params.length - 1] === '') params.pop(); // comma padding
  if (params.some((p) => p === '') || params.some((p) => /=/.test(p)))
    throw bad(file, paramLine, `line ${paramLine}: the parameter-name line has an empty or malformed name`);
  const unitsRaw = lines[i + 1].split(',').map((s) => s.trim());
  const unitLine = i + 2;
  while (unitsRaw.length > params.length && unitsRaw[unitsRaw.length - 1] === '') unitsRaw.pop();
  if (unitsRaw.length > params.length || unitsRaw.length < params.length - 1)
    throw bad(
      file,
      unitLine,
      `line ${unitLine}: the units line has ${unitsRaw.length} fields where the parameter line has ${params.length}`,
    );
  while (unitsRaw.length < params.length) unitsRaw.push('');
  i += 2;

  const rows: string[][] = [];
  const rowLines: number[] = [];
  let ended = false;
  for (; i < lines.length; i++) {
    const l = lines[i];
    const tl = l.trim();
    if (tl === '' || tl.startsWith('#')) continue;
    if (/^END_DATA[\s,]*$/i.test(tl)) {
      ended = true;
      break;
    }
    const f = l.split(',');
    while (f.length > params.length && f[f.length - 1].trim() === '') f.pop(); // comma padding
    rows.push(f);
    rowLines.push(i + 1);
  }
  if (!ended)
    throw new ParseFailure([
      fileError(
        file,
        lines.length,
        null,
        'exchange_missing_end',
        `the file ends at line ${lines.length} without END_DATA: it looks truncated`,
      ),
    ]);
  const warnings: FileError[] = [];
  for (let k = i + 1; k < lines.length; k++) {
    if (lines[k].trim() !== '') {
      warnings.push(fileError(file, k + 1, null, 'after_end_data', `text after END_DATA (from line ${k + 1}) ignored`));
      break;
    }
  }
  const md = collectMetadata(file, pairs, true);
  if (md.errors.length > 0) throw new ParseFailure(md.errors);
  if (stamp) md.metadata.extra['file_stamp'] = stamp;
  const notes = exchangeHeaderGaps(file, pairs, md.metadata, warnings);
  return buildCast({
    file,
    format: 'exchange',
    headers: params,
    names: params,
    unitTexts: unitsRaw.map((u) => (u === '' ? null : u)),
    headerLine: paramLine,
    unitLine,
    rows,
    rowLines,
    metadata: md.metadata,
    notes,
    warnings,
    mapping: options.columnMapping,
    unitAnswers: options.unitAnswers,
    salvage: options.salvage,
  });
}

/** Station and cast from the data office's file name EXPOCODE_STATION_CAST_ct1.csv (zero-padded). */
export function stationCastFromFileName(file: string): { station: string; cast: string } | null {
  const base = file.split('/').pop() ?? file;
  const m = /^[^_]+_0*([A-Za-z0-9]+)_0*(\d+)_ct1\.csv$/i.exec(base);
  if (!m) return null;
  return { station: m[1] === '' ? '0' : m[1], cast: m[2] === '' ? '0' : m[2] };
}

/**
 * What the header lacks: station and cast from the standard file name (said in the notes), and a
 * warning, not a failure, for a missing SECT_ID, DEPTH or TIME.
 */
function exchangeHeaderGaps(file: string, pairs: MetaPair[], md: CastMetadata, warnings: FileError[]): string[] {
  const notes: string[] = [];
  const has = (re: RegExp) =>
    pairs.some((p) => re.test(p.key) && p.value.trim() !== '' && !/^-999(\.0*)?$/.test(p.value.trim()));
  if (md.station === null || md.cast === null) {
    const fromName = stationCastFromFileName(file);
    if (fromName) {
      const took: string[] = [];
      if (md.station === null) {
        md.station = fromName.station;
        took.push(`station ${fromName.station}`);
      }
      if (md.cast === null) {
        md.cast = fromName.cast;
        took.push(`cast ${fromName.cast}`);
      }
      notes.push(
        `${took.join(' and ')} taken from the file name (EXPOCODE_STATION_CAST_ct1.csv); the header does not give ${took.length > 1 ? 'them' : 'it'}`,
      );
    }
  }
  if (!has(/^SECT(ION)?_?ID$/i))
    warnings.push(
      fileError(
        file,
        null,
        null,
        'missing_header',
        'the header has no SECT_ID (the line or section); the cast is read without it',
      ),
    );
  if (md.bottomDepth === null)
    warnings.push(
      fileError(
        file,
        null,
        null,
        'missing_header',
        'the header has no DEPTH (bottom depth); the cast is read without it',
      ),
    );
  if (!has(/^TIME$/i)) {
    if (md.time !== null) {
      warnings.push(
        fileError(
          file,
          null,
          null,
          'missing_header',
          'the header has no TIME; the cast is dated at 00:00 UTC of its DATE',
        ),
      );
      notes.push('no TIME in the header: time of day taken as 00:00 UTC');
    } else
      warnings.push(
        fileError(file, null, null, 'missing_header', 'the header has no DATE or TIME; the cast has no time'),
      );
  }
  return notes;
}
