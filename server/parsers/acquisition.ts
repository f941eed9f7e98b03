// The text export of CTD acquisition software, as ships write it: a header of lines starting with
// `*` (instrument and operator lines; `** key: value` typed in by the operator; NMEA position and
// time lines from the ship's GPS) and `#` (the export's own: `# nquan`, `# nvalues`, one column
// declaration `# name N = short: long name [unit]` per column, `# start_time = Mar 04 2026
// 05:06:00 [...]`, `# bad_flag = -9.990e-29`, ...), a line `*END*`, then whitespace-separated
// columns, one scan or pressure bin per line.
//
// Columns are recognised by their long name and unit (the trade's plain words: "Pressure",
// "Temperature [ITS-90, deg C]", "Conductivity [S/m]", "Salinity, Practical [PSU]", "Oxygen [ml/l]"),
// not by the short names, which differ between set-ups. Where a ship runs two sensor pairs
// ("Temperature, 2", "Conductivity, 2"), the first (primary) pair is the cast's and the second is kept
// as extra variables (`temperature_2`, ...). Values equal to the declared bad flag are missing.
import type { CastMetadata, FileError, ParsedCast } from '../../shared/schemas/cast';
import { buildCast } from './build';
import { collectMetadata, parseLatitude, parseLongitude, parseTime, type MetaPair } from './metadata';
import { decodeText, fileError, ParseFailure, splitLines } from './text';

const DECL = /^#\s*name\s+(\d+)\s*=\s*([^:]*?)\s*:\s*(.*?)\s*$/i;

/** Content test: a `*` or `#` header with at least one column declaration `# name 0 = ...`. */
export function looksLikeAcquisitionExport(lines: string[]): boolean {
  const first = lines.find((l) => l.trim() !== '');
  if (!first || !/^\s*[*#]/.test(first)) return false;
  for (let i = 0; i < lines.length && i < 2000; i++) {
    if (DECL.test(lines[i].trim())) return true;
    if (/^\*END\*/.test(lines[i].trim())) return false;
  }
  return false;
}

type Column = { index: number; short: string; long: string; unit: string | null; line: number };
type Kind = 'pressure' | 'depth' | 'temperature' | 'conductivity' | 'salinity' | 'oxygen';

/** "Temperature, 2 [ITS-90, deg C]" → name "Temperature, 2", unit "ITS-90, deg C". */
function splitLong(text: string): { long: string; unit: string | null } {
  const m = /^(.*?)\s*\[([^\]]*)\]\s*$/.exec(text);
  return m ? { long: m[1].trim(), unit: m[2].trim() } : { long: text.trim(), unit: null };
}

const SECONDARY = /,\s*2\b|\bsecondary\b|\bsensor\s*2\b/i;

/** What a declared column measures, from its long name and unit; null for anything else. */
function kindOf(c: Column): Kind | null {
  const name = c.long.toLowerCase();
  const unit = (c.unit ?? '').toLowerCase().replace(/µ|μ/g, 'u');
  if (/^pressure\b/.test(name) && !/temperature/.test(name) && /\b(db|dbar|decibars?|psi|kpa|bar)\b/.test(unit))
    return 'pressure';
  if (/^depth\b/.test(name) && /\bm\b|\bmeters?\b|\bmetres?\b/.test(unit)) return 'depth';
  if (/^temperature\b/.test(name) && !/potential|\bdifference\b/.test(name) && /deg|°|its|ipts|\bc\b/.test(unit))
    return 'temperature';
  if (/^conductivity\b/.test(name) && !/difference/.test(name) && /s\/m|ms\/cm|mmho|us\/cm/.test(unit))
    return 'conductivity';
  if (/^salinity\b/.test(name) && !/difference|absolute/.test(name) && /psu|pss|practical|^$/.test(unit))
    return 'salinity';
  if (/^oxygen\b/.test(name) && /ml\/l|umol\/kg|umol\/l|mg\/l|micromol/.test(unit)) return 'oxygen';
  return null;
}

/** A tidy key for a column kept as an extra variable. */
function extraName(c: Column): string {
  const n = c.long.toLowerCase();
  const two = SECONDARY.test(c.long) ? '_2' : '';
  if (/fluoresc|chlorophyll/.test(n)) return `fluorescence${two}`;
  if (/transmi/.test(n)) return `transmission${two}`;
  if (/\bpar\b|irradiance/.test(n)) return `par${two}`;
  if (/turbidity/.test(n)) return `turbidity${two}`;
  const first = c.long
    .split(/[,;]/)[0]
    .trim()
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_|_$/g, '');
  return (first || c.short.toLowerCase().replace(/[^a-z0-9]+/g, '_') || `column_${c.index}`) + two;
}

/** "Mar 04 2026 05:06:00" (the export's dates) to ISO 8601 UTC. */
export function parseMonthDate(text: string): string | null {
  const months = ['jan', 'feb', 'mar', 'apr', 'may', 'jun', 'jul', 'aug', 'sep', 'oct', 'nov', 'dec'];
  const m = /^\s*([A-Za-z]{3})\w*\s+(\d{1,2})\s+(\d{4})\s+(\d{1,2}):(\d{2})(?::(\d{2}))?/.exec(text);
  if (!m) return null;
  const mo = months.indexOf(m[1].toLowerCase());
  if (mo < 0) return null;
  const r = parseTime(
    `${m[3]}-${String(mo + 1).padStart(2, '0')}-${m[2].padStart(2, '0')}T${m[4].padStart(2, '0')}:${m[5]}:${m[6] ?? '00'}Z`,
  );
  return r.ok ? r.value : null;
}

function bad(file: string, line: number | null, message: string): ParseFailure {
  return new ParseFailure([fileError(file, line, null, 'acquisition_bad_header', message)]);
}

export function parseAcquisition(
  file: string,
  bytes: Uint8Array,
  options: { columnMapping?: Record<string, string>; unitAnswers?: Record<string, string>; salvage?: boolean } = {},
): { cast: ParsedCast; warnings: FileError[] } {
  const { text } = decodeText(file, bytes);
  const lines = splitLines(file, text);
  const cols: Column[] = [];
  const pairs: MetaPair[] = [];
  const warnings: FileError[] = [];
  let badFlag: number | null = null;
  let startTime: string | null = null;
  let nmeaTime: string | null = null;
  let nmeaLat: { v: string; line: number } | null = null;
  let nmeaLon: { v: string; line: number } | null = null;
  let end = -1;
  for (let i = 0; i < lines.length; i++) {
    const l = lines[i].trim();
    if (l === '') continue;
    if (/^\*END\*/.test(l)) {
      end = i;
      break;
    }
    if (!l.startsWith('*') && !l.startsWith('#'))
      throw new ParseFailure([
        fileError(
          file,
          i + 1,
          null,
          'acquisition_missing_end',
          `line ${i + 1} is data before the header's *END* line: the header is not closed`,
        ),
      ]);
    const d = DECL.exec(l);
    if (d) {
      const { long, unit } = splitLong(d[3]);
      cols.push({ index: Number(d[1]), short: d[2], long, unit, line: i + 1 });
      continue;
    }
    let m = /^#\s*bad_flag\s*=\s*(\S+)/i.exec(l);
    if (m) {
      const v = Number(m[1]);
      if (!Number.isFinite(v)) throw bad(file, i + 1, `line ${i + 1}: the bad_flag value "${m[1]}" is not a number`);
      badFlag = v;
      continue;
    }
    m = /^#\s*start_time\s*=\s*(.*)$/i.exec(l);
    if (m) {
      startTime = parseMonthDate(m[1]);
      if (!startTime)
        warnings.push(
          fileError(
            file,
            i + 1,
            null,
            'bad_time',
            `line ${i + 1}: start_time "${m[1].slice(0, 40)}" is not a date; not used`,
          ),
        );
      continue;
    }
    m = /^\*\s*NMEA\s+(Latitude|Longitude|UTC\s*\(Time\))\s*=\s*(.*)$/i.exec(l);
    if (m) {
      const what = m[1].toLowerCase();
      if (what.startsWith('lat')) nmeaLat = { v: m[2], line: i + 1 };
      else if (what.startsWith('lon')) nmeaLon = { v: m[2], line: i + 1 };
      else nmeaTime = parseMonthDate(m[2]);
      continue;
    }
    // Operator lines "** Station: 12" (and "** Latitude: ..." when there is no GPS feed).
    m = /^\*\*\s*([^:=]+?)\s*[:=]\s*(.*)$/.exec(l);
    if (m) pairs.push({ key: m[1], value: m[2], line: i + 1 });
  }
  if (end < 0)
    throw new ParseFailure([
      fileError(
        file,
        lines.length,
        null,
        'acquisition_missing_end',
        'the header never ends: no *END* line; the file looks truncated or is not an acquisition export',
      ),
    ]);
  if (cols.length === 0)
    throw bad(file, end + 1, 'the header declares no columns ("# name 0 = short: long name [unit]")');
  cols.sort((a, b) => a.index - b.index);
  cols.forEach((c, k) => {
    if (c.index !== k)
      throw bad(
        file,
        c.line,
        `line ${c.line}: column ${c.index} is declared where column ${k} was expected (the declarations must run 0, 1, 2, …)`,
      );
  });

  const md = collectMetadata(file, pairs, false);
  if (md.errors.length > 0) throw new ParseFailure(md.errors);
  const meta: CastMetadata = md.metadata;
  const notes: string[] = ['read from an acquisition text export'];
  if (nmeaLat && meta.latitude === null) {
    const r = parseLatitude(nmeaLat.v);
    if (!r.ok)
      throw new ParseFailure([
        fileError(
          file,
          nmeaLat.line,
          null,
          r.message.includes('outside') ? 'latitude_out_of_range' : 'bad_metadata',
          `line ${nmeaLat.line}: NMEA ${r.message}`,
        ),
      ]);
    meta.latitude = r.value;
  }
  if (nmeaLon && meta.longitude === null) {
    const r = parseLongitude(nmeaLon.v);
    if (!r.ok)
      throw new ParseFailure([
        fileError(
          file,
          nmeaLon.line,
          null,
          r.message.includes('outside') ? 'longitude_out_of_range' : 'bad_metadata',
          `line ${nmeaLon.line}: NMEA ${r.message}`,
        ),
      ]);
    meta.longitude = r.value;
  }
  if (meta.time === null) {
    meta.time = nmeaTime ?? startTime;
    if (meta.time) notes.push(`time from the header's ${nmeaTime ? 'NMEA UTC line' : 'start_time'}`);
  }

  // Roles: the first column of each kind that is not marked secondary; the rest are extras.
  const mapping: Record<string, string> = {};
  const taken = new Set<Kind>();
  const headers = cols.map((c) => c.short || `column_${c.index}`);
  const used = new Set<string>();
  const names: string[] = [];
  const chosen: string[] = [];
  const kept: string[] = [];
  const order = [...cols].sort(
    (a, b) => Number(SECONDARY.test(a.long)) - Number(SECONDARY.test(b.long)) || a.index - b.index,
  );
  const role = new Map<number, Kind>();
  for (const c of order) {
    const k = kindOf(c);
    if (k && !taken.has(k)) {
      taken.add(k);
      role.set(c.index, k);
    }
  }
  cols.forEach((c, j) => {
    const h = headers[j];
    const k = role.get(c.index);
    if (/^flag$/i.test(c.short)) {
      mapping[h] = 'ignore';
      names.push(h);
      return;
    }
    if (k) {
      mapping[h] = k;
      names.push(h);
      chosen.push(`${k}: "${c.long}"`);
      return;
    }
    const base = kindOf(c) ?? extraName(c);
    let key = kindOf(c) ? `${base}_2` : base;
    for (let s = 3; used.has(key); s++) key = `${base}_${s}`;
    used.add(key);
    mapping[h] = 'extra';
    names.push(key);
    if (kindOf(c)) kept.push(`"${c.long}" as ${key}`);
  });
  if (kept.length)
    notes.push(
      `several sensors: primary ${chosen.filter((s) => /^(temperature|conductivity|salinity|oxygen)/.test(s)).join(', ')}; secondary kept as extra variables (${kept.join(', ')})`,
    );
  for (const [k, v] of Object.entries(options.columnMapping ?? {})) if (headers.includes(k)) mapping[k] = v;

  const rows: string[][] = [];
  const rowLines: number[] = [];
  let flagged = 0;
  for (let i = end + 1; i < lines.length; i++) {
    const l = lines[i].trim();
    if (l === '') continue;
    const f = l.split(/\s+/);
    if (badFlag !== null) {
      for (let k = 0; k < f.length; k++) {
        if (Number(f[k]) === badFlag) {
          f[k] = '';
          flagged++;
        }
      }
    }
    rows.push(f);
    rowLines.push(i + 1);
  }
  if (badFlag !== null && flagged > 0)
    notes.push(`${flagged} value${flagged > 1 ? 's' : ''} equal to the bad flag ${badFlag} read as missing`);

  const unitOf = (c: Column): string | null => {
    if (c.unit === null) return null;
    const k = role.get(c.index) ?? kindOf(c);
    // "salt water, m" and "fresh water, m" are how depth columns state their unit
    if (k === 'depth') return c.unit.split(',').pop()!.trim();
    if (k === 'pressure') return c.unit.replace(/^db$/i, 'dbar');
    if (k === 'salinity' && /^psu$/i.test(c.unit)) return 'PSU';
    return c.unit;
  };
  // The cast builder matches headers by name: give it the tidy names, with the mapping keyed the same.
  const byName: Record<string, string> = {};
  headers.forEach((h, j) => (byName[names[j]] = mapping[h]));
  return buildCast({
    file,
    format: 'acquisition',
    headers: names,
    names,
    unitTexts: cols.map(unitOf),
    headerLine: cols[0].line,
    unitLine: cols[0].line,
    rows,
    rowLines,
    metadata: meta,
    notes,
    warnings,
    mapping: byName,
    unitAnswers: options.unitAnswers,
    salvage: options.salvage,
  });
}
