// A station table: one row per station (and cast) giving the metadata the cast files may lack —
// station, cast, latitude, longitude, time, bottom depth. Uploaded beside the casts.
import { parse } from 'csv-parse/sync';
import type { FileError, StationRow } from '../../shared/schemas/cast';
import { StationRowSchema } from '../../shared/schemas/cast';
import { normaliseName, splitHeader } from './columns';
import { parseBottomDepth, parseLatitude, parseLongitude, parseTime } from './metadata';
import { detectDelimiter } from './plain';
import { decodeText, fileError, ParseFailure, splitLines } from './text';

type Field = 'station' | 'cast' | 'latitude' | 'longitude' | 'time' | 'date' | 'clock' | 'bottomDepth';
const FIELD_NAMES: Record<string, Field> = {
  station: 'station',
  stn: 'station',
  stnnbr: 'station',
  'station id': 'station',
  site: 'station',
  'station name': 'station',
  cast: 'cast',
  castno: 'cast',
  'cast number': 'cast',
  'cast no': 'cast',
  latitude: 'latitude',
  lat: 'latitude',
  longitude: 'longitude',
  lon: 'longitude',
  long: 'longitude',
  lng: 'longitude',
  time: 'time',
  datetime: 'time',
  'date time': 'time',
  'time utc': 'time',
  'start time': 'time',
  date: 'date',
  'time of day': 'clock',
  hhmm: 'clock',
  'utc time': 'clock',
  'bottom depth': 'bottomDepth',
  bottom: 'bottomDepth',
  'water depth': 'bottomDepth',
  depth: 'bottomDepth',
  'bottom depth m': 'bottomDepth',
};

function fieldOf(header: string): Field | null {
  return FIELD_NAMES[normaliseName(splitHeader(header).name)] ?? null;
}

/** A header row of a station table: station, latitude and longitude, and nothing like a temperature. */
export function looksLikeStationTable(headers: string[]): boolean {
  const f = new Set(headers.map(fieldOf));
  const hasData = headers.some((h) =>
    /^(temp|temperature|t|ctdtmp|sal|salinity|pressure|pres|ctdprs|cond|conductivity)$/.test(
      normaliseName(splitHeader(h).name),
    ),
  );
  return f.has('station') && f.has('latitude') && f.has('longitude') && !hasData;
}

export function parseStationTable(file: string, bytes: Uint8Array): { stations: StationRow[]; warnings: FileError[] } {
  const { text } = decodeText(file, bytes);
  const lines = splitLines(file, text);
  let h = 0;
  while (h < lines.length && (lines[h].trim() === '' || lines[h].trimStart().startsWith('#'))) h++;
  if (h >= lines.length)
    throw new ParseFailure([fileError(file, null, null, 'no_header', 'no header row in the station table')]);
  const delim = detectDelimiter(lines[h]);
  let records: { info: { lines: number }; record: string[] }[];
  try {
    records = parse(lines.slice(h).join('\n'), {
      delimiter: delim === 'whitespace' ? ',' : delim,
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      comment: '#',
      comment_no_infix: true,
      trim: true,
      relax_quotes: true,
    }) as unknown as { info: { lines: number }; record: string[] }[];
  } catch (e) {
    throw new ParseFailure([
      fileError(file, null, null, 'field_count', `the station table cannot be read: ${(e as Error).message}`),
    ]);
  }
  const header = records[0]?.record ?? [];
  const idx = new Map<Field, number>();
  header.forEach((hd, j) => {
    const f = fieldOf(hd);
    if (f && !idx.has(f)) idx.set(f, j);
  });
  const missing = (['station', 'latitude', 'longitude'] as const).filter((f) => !idx.has(f));
  if (missing.length > 0)
    throw new ParseFailure(
      [fileError(file, h + 1, null, 'missing_column', `the station table has no ${missing.join(', ')} column`)],
      { file, headers: header.filter((hd) => fieldOf(hd) === null) },
    );
  const errors: FileError[] = [];
  const stations: StationRow[] = [];
  const seen = new Map<string, number>();
  for (let r = 1; r < records.length && errors.length < 25; r++) {
    const rec = records[r].record;
    const line = records[r].info.lines + h;
    if (rec.length !== header.length) {
      errors.push(
        fileError(
          file,
          line,
          null,
          r === records.length - 1 && rec.length < header.length ? 'truncated' : 'field_count',
          `line ${line} has ${rec.length} fields where the header has ${header.length}`,
        ),
      );
      continue;
    }
    const get = (f: Field): string | null => {
      const j = idx.get(f);
      return j === undefined ? null : rec[j];
    };
    const col = (f: Field): number | null => {
      const j = idx.get(f);
      return j === undefined ? null : j + 1;
    };
    const station = (get('station') ?? '').trim();
    if (station === '') {
      errors.push(fileError(file, line, col('station'), 'bad_metadata', `line ${line}: the station is empty`));
      continue;
    }
    if (station.toLowerCase() === normaliseName(splitHeader(header[idx.get('station') as number]).name)) {
      errors.push(fileError(file, line, 1, 'repeated_header', `line ${line} repeats the header row`));
      continue;
    }
    const lat = parseLatitude(get('latitude') ?? '');
    if (!lat.ok)
      errors.push(
        fileError(
          file,
          line,
          col('latitude'),
          lat.message.includes('outside') ? 'latitude_out_of_range' : 'bad_metadata',
          `line ${line}, column ${col('latitude')}: ${lat.message}`,
        ),
      );
    const lon = parseLongitude(get('longitude') ?? '');
    if (!lon.ok)
      errors.push(
        fileError(
          file,
          line,
          col('longitude'),
          lon.message.includes('outside') ? 'longitude_out_of_range' : 'bad_metadata',
          `line ${line}, column ${col('longitude')}: ${lon.message}`,
        ),
      );
    let time: string | null = null;
    const tText = (get('time') ?? '').trim();
    const dText = (get('date') ?? '').trim();
    const cText = (get('clock') ?? '').trim();
    const tv =
      tText !== ''
        ? tText
        : dText !== ''
          ? cText !== ''
            ? `${dText}T${cText.length === 5 ? cText + ':00' : cText}Z`
            : dText
          : '';
    if (tv !== '') {
      const t = parseTime(tv);
      if (t.ok) time = t.value;
      else
        errors.push(
          fileError(file, line, col(tText !== '' ? 'time' : 'date'), 'bad_time', `line ${line}: ${t.message}`),
        );
    }
    let bottomDepth: number | null = null;
    const bd = (get('bottomDepth') ?? '').trim();
    if (bd !== '' && !/^-999(\.0*)?$/.test(bd)) {
      const b = parseBottomDepth(bd);
      if (b.ok) bottomDepth = b.value;
      else errors.push(fileError(file, line, col('bottomDepth'), 'bad_metadata', `line ${line}: ${b.message}`));
    }
    const cast = (get('cast') ?? '').trim() || null;
    const key = `${station}\u0000${cast ?? ''}`;
    if (seen.has(key))
      errors.push(
        fileError(
          file,
          line,
          col('station'),
          'duplicate_station',
          `line ${line}: station ${station}${cast ? ' cast ' + cast : ''} is listed again (first at line ${seen.get(key)})`,
        ),
      );
    seen.set(key, line);
    if (lat.ok && lon.ok) {
      const row = StationRowSchema.safeParse({
        station,
        cast,
        latitude: lat.value,
        longitude: lon.value,
        time,
        bottomDepth,
        line,
      });
      if (row.success) stations.push(row.data);
      else
        errors.push(
          fileError(file, line, null, 'bad_metadata', `line ${line}: ${row.error.issues[0]?.message ?? 'invalid row'}`),
        );
    }
  }
  if (errors.length > 0) throw new ParseFailure(errors);
  if (stations.length === 0)
    throw new ParseFailure([fileError(file, h + 1, null, 'no_data', 'the station table has a header but no rows')]);
  return { stations, warnings: [] };
}
