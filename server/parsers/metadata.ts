import type { CastMetadata, FileError } from '../../shared/schemas/cast';
import { fileError } from './text';
// Cast metadata values as files write them: positions (decimal degrees, or degrees and minutes with
// a hemisphere), times (ISO 8601, or date and time apart), bottom depths. Each parser returns either
// the value or a message saying what was wrong, so the caller can name the line.

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

/** Degrees from "-35.25", "35.25 S", "35 15.0 S", "35°15.0'S", "S 35 15.0". */
export function parseDegrees(text: string, positive: string, negative: string): Parsed<number> {
  const t = text
    .trim()
    .toUpperCase()
    .replace(/[°º'′"″]/g, ' ')
    .replace(/,/g, '.')
    .trim();
  if (t === '') return { ok: false, message: 'empty' };
  let sign = 1;
  let body = t;
  const hemi = /^([NSEW])\s*(.*)$|^(.*?)\s*([NSEW])$/.exec(t);
  if (hemi) {
    const h = hemi[1] ?? hemi[4];
    body = (hemi[2] ?? hemi[3]).trim();
    if (h === negative) sign = -1;
    else if (h !== positive) return { ok: false, message: `hemisphere ${h} does not fit` };
  }
  const parts = body.split(/\s+/).filter((s) => s.length > 0);
  if (parts.length === 0 || parts.length > 3) return { ok: false, message: `"${text}" is not a position` };
  const nums = parts.map(Number);
  if (nums.some((n) => !Number.isFinite(n))) return { ok: false, message: `"${text}" is not a position` };
  let v = Math.abs(nums[0]) + (nums[1] ?? 0) / 60 + (nums[2] ?? 0) / 3600;
  if ((nums[1] ?? 0) < 0 || (nums[1] ?? 0) >= 60 || (nums[2] ?? 0) < 0 || (nums[2] ?? 0) >= 60)
    return { ok: false, message: `"${text}" has minutes or seconds out of range` };
  if (nums[0] < 0 || Object.is(nums[0], -0)) {
    if (hemi) return { ok: false, message: `"${text}" has both a sign and a hemisphere` };
    sign = -1;
  }
  v *= sign;
  return { ok: true, value: v };
}

export function parseLatitude(text: string): Parsed<number> {
  const r = parseDegrees(text, 'N', 'S');
  if (!r.ok) return { ok: false, message: `latitude ${r.message === 'empty' ? 'is empty' : r.message}` };
  if (r.value < -90 || r.value > 90) return { ok: false, message: `latitude ${text.trim()} is outside -90..90` };
  return r;
}

/** Longitude normalised to -180..180; accepts -180..360 as files write it. */
export function parseLongitude(text: string): Parsed<number> {
  const r = parseDegrees(text, 'E', 'W');
  if (!r.ok) return { ok: false, message: `longitude ${r.message === 'empty' ? 'is empty' : r.message}` };
  return normaliseLongitude(r.value, text.trim());
}

export function normaliseLongitude(v: number, shown: string): Parsed<number> {
  if (!(v >= -180 && v <= 360)) return { ok: false, message: `longitude ${shown} is outside -180..360` };
  let x = v > 180 ? v - 360 : v;
  if (Object.is(x, -0)) x = 0;
  return { ok: true, value: x };
}

function iso(ms: number): string {
  return new Date(ms).toISOString().replace('.000Z', 'Z');
}

/**
 * ISO 8601 UTC from "2026-03-04T05:06:00Z", "2026-03-04 05:06", "2026-03-04T05:06:00+02:00",
 * "2026-03-04" (midnight). A time without a zone is taken as UTC, the custom at sea.
 */
export function parseTime(text: string): Parsed<string> {
  const t = text.trim();
  const m =
    /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,6}))?)?)?\s*(Z|UTC|GMT|[+-]\d{2}:?\d{2})?$/i.exec(
      t,
    );
  if (!m) return { ok: false, message: `time "${t}" is not an ISO 8601 date and time` };
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4] ?? '0', m[5] ?? '0', m[6] ?? '0'].map(Number);
  const frac = m[7] ? Number('0.' + m[7]) * 1000 : 0;
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || s > 60)
    return { ok: false, message: `time "${t}" has a field out of range` };
  let ms = Date.UTC(y, mo - 1, d, h, mi, s, frac);
  const check = new Date(Date.UTC(y, mo - 1, d));
  if (check.getUTCDate() !== d || y < 1900 || y > 2200) return { ok: false, message: `time "${t}" is not a real date` };
  const z = m[8];
  if (z && /^[+-]/.test(z)) {
    const zz = z.replace(':', '');
    const off = (Number(zz.slice(1, 3)) * 60 + Number(zz.slice(3, 5))) * (zz[0] === '-' ? -1 : 1);
    ms -= off * 60_000;
  }
  return { ok: true, value: iso(ms) };
}

/** The exchange format's DATE (YYYYMMDD) and TIME (HHMM, UTC). */
export function parseDateTimeCompact(date: string, time: string | null): Parsed<string> {
  const d = /^(\d{4})(\d{2})(\d{2})$/.exec(date.trim());
  if (!d) return { ok: false, message: `DATE "${date.trim()}" is not YYYYMMDD` };
  let hh = '00';
  let mm = '00';
  if (time !== null && time.trim() !== '') {
    const t = /^(\d{1,2})(\d{2})$/.exec(time.trim());
    if (!t) return { ok: false, message: `TIME "${time.trim()}" is not HHMM` };
    hh = t[1].padStart(2, '0');
    mm = t[2];
    if (Number(hh) > 23 || Number(mm) > 59)
      return { ok: false, message: `TIME "${time.trim()}" is not a time of day (HHMM)` };
  }
  return parseTime(`${d[1]}-${d[2]}-${d[3]}T${hh}:${mm}:00Z`);
}

export function parseBottomDepth(text: string): Parsed<number> {
  const t = text.trim().replace(/\s*m$/i, '');
  const v = Number(t);
  if (t === '' || !Number.isFinite(v)) return { ok: false, message: `bottom depth "${text.trim()}" is not a number` };
  if (v < 0 || v > 12000) return { ok: false, message: `bottom depth ${v} m is outside 0..12000 m` };
  return { ok: true, value: v };
}

export type MetaPair = { key: string; value: string; line: number };

const KEYS: Record<string, 'station' | 'cast' | 'latitude' | 'longitude' | 'time' | 'date' | 'bottomDepth'> = {
  station: 'station',
  stn: 'station',
  stnnbr: 'station',
  'station id': 'station',
  'station name': 'station',
  site: 'station',
  // spellings of the exchange format's STNNBR and CASTNO found in data-office files
  'stn nbr': 'station',
  stnno: 'station',
  'stn no': 'station',
  'station number': 'station',
  'station no': 'station',
  'station nbr': 'station',
  stnnum: 'station',
  statnum: 'station',
  'stat no': 'station',
  stat: 'station',
  stnid: 'station',
  'stn id': 'station',
  'station num': 'station',
  cast: 'cast',
  castno: 'cast',
  'cast number': 'cast',
  'cast no': 'cast',
  castnbr: 'cast',
  'cast nbr': 'cast',
  castnum: 'cast',
  'cast num': 'cast',
  'cast id': 'cast',
  latitude: 'latitude',
  lat: 'latitude',
  longitude: 'longitude',
  lon: 'longitude',
  long: 'longitude',
  lng: 'longitude',
  time: 'time',
  datetime: 'time',
  'date time': 'time',
  'start time': 'time',
  'time utc': 'time',
  date: 'date',
  'bottom depth': 'bottomDepth',
  bottom: 'bottomDepth',
  'water depth': 'bottomDepth',
  depth: 'bottomDepth',
  'bottom depth m': 'bottomDepth',
  btmdepth: 'bottomDepth',
  'btm depth': 'bottomDepth',
  'depth m': 'bottomDepth',
  'bottom depth meters': 'bottomDepth',
  'cor depth': 'bottomDepth',
  'uncor depth': 'bottomDepth',
};

function normKey(k: string): string {
  return k
    .trim()
    .toLowerCase()
    .replace(/[_\-.]+/g, ' ')
    .replace(/\s+/g, ' ');
}

/**
 * Cast metadata from key/value pairs (plain `# key: value` lines or the exchange header block).
 * `compactDate` reads DATE as YYYYMMDD and TIME as HHMM (the exchange format's convention).
 */
export function collectMetadata(
  file: string,
  pairs: MetaPair[],
  compactDate: boolean,
): { metadata: CastMetadata; errors: FileError[] } {
  const md: CastMetadata = {
    station: null,
    cast: null,
    latitude: null,
    longitude: null,
    time: null,
    bottomDepth: null,
    extra: {},
  };
  const errors: FileError[] = [];
  let date: MetaPair | null = null;
  let time: MetaPair | null = null;
  for (const p of pairs) {
    const role = KEYS[normKey(p.key)];
    const v = p.value.trim();
    if (!role) {
      md.extra[p.key.trim()] = v;
      continue;
    }
    if (v === '' || (compactDate && /^-999(\.0*)?$/.test(v))) continue;
    switch (role) {
      case 'station':
        md.station = v;
        break;
      case 'cast':
        md.cast = v;
        break;
      case 'latitude': {
        const r = parseLatitude(v);
        if (r.ok) md.latitude = r.value;
        else
          errors.push(
            fileError(
              file,
              p.line,
              null,
              r.message.includes('outside') ? 'latitude_out_of_range' : 'bad_metadata',
              `line ${p.line}: ${r.message}`,
            ),
          );
        break;
      }
      case 'longitude': {
        const r = parseLongitude(v);
        if (r.ok) md.longitude = r.value;
        else
          errors.push(
            fileError(
              file,
              p.line,
              null,
              r.message.includes('outside') ? 'longitude_out_of_range' : 'bad_metadata',
              `line ${p.line}: ${r.message}`,
            ),
          );
        break;
      }
      case 'time':
        time = p;
        break;
      case 'date':
        date = p;
        break;
      case 'bottomDepth': {
        const r = parseBottomDepth(v);
        if (r.ok) md.bottomDepth = r.value;
        else errors.push(fileError(file, p.line, null, 'bad_metadata', `line ${p.line}: ${r.message}`));
        break;
      }
    }
  }
  if (compactDate) {
    if (date) {
      const r = parseDateTimeCompact(date.value, time ? time.value : null);
      const at =
        time && /^\d{8}$/.test(date.value.trim()) && r.ok === false && r.message.startsWith('TIME') ? time : date;
      if (r.ok) md.time = r.value;
      else errors.push(fileError(file, at.line, null, 'bad_time', `line ${at.line}: ${r.message}`));
    } else if (time)
      errors.push(fileError(file, time.line, null, 'bad_time', `line ${time.line}: TIME given without DATE`));
  } else {
    const tv = time ? time.value.trim() : null;
    if (date && tv && /^\d{1,2}:\d{2}(:\d{2})?\s*(Z|UTC)?$/i.test(tv)) {
      const r = parseTime(
        `${date.value.trim()}T${tv.replace(/\s*(Z|UTC)$/i, '')}${tv.split(':').length === 2 ? ':00' : ''}Z`,
      );
      if (r.ok) md.time = r.value;
      else errors.push(fileError(file, time!.line, null, 'bad_time', `line ${time!.line}: ${r.message}`));
    } else if (time) {
      const r = parseTime(time.value);
      if (r.ok) md.time = r.value;
      else errors.push(fileError(file, time.line, null, 'bad_time', `line ${time.line}: ${r.message}`));
    } else if (date) {
      const r = parseTime(date.value);
      if (r.ok) md.time = r.value;
      else errors.push(fileError(file, date.line, null, 'bad_time', `line ${date.line}: ${r.message}`));
    }
  }
  return { metadata: md, errors };
}
