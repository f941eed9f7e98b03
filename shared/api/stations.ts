// The station plan: coordinates as a hydrographer writes them, the station table as pasted or
// imported, and the answers of the plan routes. Server (the preview and apply of a table) and client
// (the edit form) read coordinates with the same parser.
import { z } from 'zod';
import { idSchema } from './resources';

/** Most rows a pasted or imported station table may hold, and its size in characters. */
export const STATION_TABLE_MAX_ROWS = 2000;
export const STATION_TABLE_MAX_CHARS = 200_000;
export const STATION_NAME_MAX = 100;
/** Planned bottom depth bounds, m (the deepest trench is under 11 000 m). */
export const STATION_DEPTH_MAX = 12_000;

export type Axis = 'latitude' | 'longitude';
export type CoordinateResult = { ok: true; value: number } | { ok: false; message: string };

const HEMI: Record<Axis, { pos: string; neg: string; other: string }> = {
  latitude: { pos: 'N', neg: 'S', other: 'EW' },
  longitude: { pos: 'E', neg: 'W', other: 'NS' },
};

/**
 * Reads a latitude or longitude written as decimal degrees (`-54.5083`, `54.5083 S`) or as degrees
 * and decimal minutes (`54 30.5 S`, `-54 30.5`, `54°30.5'S`, `S 54° 30.5′`). South and west are
 * negative, by a minus sign or by the hemisphere letter (not both). Minutes are under 60; degrees with
 * minutes are whole. Longitudes east of 180 (0–360 convention) come back as -180…180.
 */
export function parseCoordinate(text: string, axis: Axis): CoordinateResult {
  const h = HEMI[axis];
  const limit = axis === 'latitude' ? 90 : 180;
  let s = text.trim().toUpperCase();
  if (s === '') return { ok: false, message: `no ${axis}` };
  let hemi: string | null = null;
  const lead = /^([NSEW])\s*/.exec(s);
  if (lead) {
    hemi = lead[1];
    s = s.slice(lead[0].length);
  }
  const trail = /\s*([NSEW])$/.exec(s);
  if (trail) {
    if (hemi) return { ok: false, message: `two hemisphere letters in "${text.trim()}"` };
    hemi = trail[1];
    s = s.slice(0, s.length - trail[0].length);
  }
  if (hemi && h.other.includes(hemi))
    return {
      ok: false,
      message: `"${hemi}" is not a hemisphere of a ${axis} (use ${h.pos} or ${h.neg})`,
    };
  let sign = 1;
  const minus = /^[-\u2212]\s*/.exec(s);
  if (minus) {
    sign = -1;
    s = s.slice(minus[0].length);
  } else if (s.startsWith('+')) s = s.slice(1).trimStart();
  if (minus && hemi)
    return { ok: false, message: `both a minus sign and the hemisphere ${hemi} in "${text.trim()}": write one` };
  if (hemi === h.neg) sign = -1;
  // degrees, then optionally minutes: separated by a degree sign and/or spaces, minutes ending in ' or ′
  const minuteMark = /['′’]\s*$/.test(s);
  const parts = s
    .replace(/['′’]\s*$/, '')
    .replace(/[°º˚]/g, ' ')
    .trim()
    .split(/\s+/);
  const numeric = parts.every((x) => /^\d+(?:\.\d+)?$/.test(x));
  if (!numeric || parts.length > 2 || (minuteMark && parts.length === 1))
    return {
      ok: false,
      message:
        numeric && parts.length === 3
          ? `"${text.trim()}" looks like degrees, minutes and seconds: write degrees and decimal minutes (54 30.25 ${h.neg}) or decimal degrees`
          : `"${text.trim()}" is not a ${axis} (decimal degrees such as -54.5083, or degrees and decimal minutes such as 54 30.5 ${h.neg})`,
    };
  const deg = Number(parts[0]);
  let value = deg;
  if (parts.length === 2) {
    if (!Number.isInteger(deg))
      return { ok: false, message: `degrees with minutes are whole degrees ("${text.trim()}")` };
    const min = Number(parts[1]);
    if (!(min < 60)) return { ok: false, message: `minutes are under 60 ("${text.trim()}")` };
    value = deg + min / 60;
  }
  const max = axis === 'longitude' && !hemi && sign > 0 ? 360 : limit;
  if (!Number.isFinite(value) || value > max)
    return {
      ok: false,
      message: `a ${axis} is at most ${limit}° ${axis === 'latitude' ? 'north or south' : 'east or west'} ("${text.trim()}")`,
    };
  let v = sign * value;
  if (axis === 'longitude' && v > 180) v -= 360;
  return { ok: true, value: v === 0 ? 0 : v };
}

/** A planned bottom depth in metres (`4520`, `4520 m`); blank is none. */
export function parseDepth(text: string): { ok: true; value: number | null } | { ok: false; message: string } {
  const s = text.trim().replace(/\s*m$/i, '');
  if (s === '' || s === '-' || s === '—') return { ok: true, value: null };
  if (!/^\d+(?:\.\d+)?$/.test(s))
    return { ok: false, message: `"${text.trim()}" is not a depth in metres (a positive number such as 4520)` };
  const v = Number(s);
  if (v <= 0 || v > STATION_DEPTH_MAX)
    return { ok: false, message: `a planned depth is between 0 and ${STATION_DEPTH_MAX} m ("${text.trim()}")` };
  return { ok: true, value: v };
}

export type TableRow = {
  line: number;
  name: string;
  latitude: number;
  longitude: number;
  plannedDepth: number | null;
};
export type TableProblem = { line: number; column: number | null; field: string | null; message: string };
export type TableResult = { ok: true; rows: TableRow[]; header: boolean } | { ok: false; problems: TableProblem[] };

type Field = 'name' | 'latitude' | 'longitude' | 'plannedDepth';
const FIELD_LABEL: Record<Field, string> = {
  name: 'name',
  latitude: 'latitude',
  longitude: 'longitude',
  plannedDepth: 'bottom depth',
};
const HEADER_WORDS: [Field, RegExp][] = [
  ['name', /^(station|stn|name|station name|st)\b/],
  ['latitude', /^(lat|latitude)\b/],
  ['longitude', /^(lon|long|lng|longitude)\b/],
  ['plannedDepth', /^(depth|bottom|bottom depth|planned depth|water depth|z)\b/],
];

/** Splits a line on the table's separator (tab, semicolon or comma; double quotes allowed around a cell). */
function splitCells(line: string, sep: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"' && cur.trim() === '') {
      quoted = true;
      cur = '';
    } else if (ch === sep) {
      out.push(cur);
      cur = '';
    } else cur += ch;
  }
  out.push(cur);
  return out.map((c) => c.trim());
}

/**
 * Reads a station table: one station a line, columns name, latitude, longitude and (optionally)
 * bottom depth, separated by tabs (a spreadsheet paste), semicolons or commas. A first line naming
 * the columns (station, lat, lon, depth, in any order) is read as a header. Blank lines and lines
 * starting with `#` are skipped. Every problem names its line and column (both from 1).
 */
export function parseStationTable(text: string): TableResult {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const content = lines
    .map((l, i) => ({ n: i + 1, l }))
    .filter((x) => x.l.trim() !== '' && !x.l.trim().startsWith('#'));
  if (content.length === 0)
    return { ok: false, problems: [{ line: 1, column: null, field: null, message: 'the table is empty' }] };
  const first = content[0].l;
  const sep = first.includes('\t') ? '\t' : first.includes(';') ? ';' : first.includes(',') ? ',' : null;
  if (sep === null)
    return {
      ok: false,
      problems: [
        {
          line: content[0].n,
          column: null,
          field: null,
          message:
            'no column separator: separate name, latitude, longitude and depth with tabs (as a spreadsheet pastes), semicolons or commas',
        },
      ],
    };
  let cols: Record<Field, number> = { name: 0, latitude: 1, longitude: 2, plannedDepth: 3 };
  let header = false;
  const headCells = splitCells(first, sep).map((c) => c.toLowerCase());
  const named = headCells.map((c) => HEADER_WORDS.find(([, re]) => re.test(c))?.[0] ?? null);
  if (named.includes('latitude') || named.includes('longitude') || named.includes('name')) {
    const problems: TableProblem[] = [];
    const found: Partial<Record<Field, number>> = {};
    named.forEach((f, i) => {
      if (f && found[f] === undefined) found[f] = i;
    });
    for (const f of ['name', 'latitude', 'longitude'] as const)
      if (found[f] === undefined)
        problems.push({
          line: content[0].n,
          column: null,
          field: f,
          message: `the header names no ${FIELD_LABEL[f]} column`,
        });
    if (problems.length) return { ok: false, problems };
    cols = {
      name: found.name!,
      latitude: found.latitude!,
      longitude: found.longitude!,
      plannedDepth: found.plannedDepth ?? -1,
    };
    header = true;
  }
  const body = header ? content.slice(1) : content;
  if (body.length === 0)
    return {
      ok: false,
      problems: [{ line: content[0].n, column: null, field: null, message: 'the table has a header and no station' }],
    };
  if (body.length > STATION_TABLE_MAX_ROWS)
    return {
      ok: false,
      problems: [
        {
          line: body[STATION_TABLE_MAX_ROWS].n,
          column: null,
          field: null,
          message: `a station table holds at most ${STATION_TABLE_MAX_ROWS} stations`,
        },
      ],
    };
  const rows: TableRow[] = [];
  const problems: TableProblem[] = [];
  const seen = new Map<string, number>();
  const need = Math.max(cols.name, cols.latitude, cols.longitude) + 1;
  for (const { n, l } of body) {
    const cells = splitCells(l, sep);
    const bad = (f: Field, message: string) =>
      problems.push({ line: n, column: cols[f] + 1, field: f, message: `${FIELD_LABEL[f]}: ${message}` });
    if (cells.length < need) {
      problems.push({
        line: n,
        column: cells.length + 1,
        field: null,
        message: `${cells.length} column${cells.length === 1 ? '' : 's'}; a station needs a name, a latitude and a longitude`,
      });
      continue;
    }
    const name = cells[cols.name];
    let ok = true;
    if (name === '') {
      bad('name', 'empty');
      ok = false;
    } else if (name.length > STATION_NAME_MAX) {
      bad('name', `at most ${STATION_NAME_MAX} characters`);
      ok = false;
    } else if (seen.has(name)) {
      bad('name', `station ${name} is already on line ${seen.get(name)}`);
      ok = false;
    }
    const lat = parseCoordinate(cells[cols.latitude], 'latitude');
    if (!lat.ok) {
      bad('latitude', lat.message);
      ok = false;
    }
    const lon = parseCoordinate(cells[cols.longitude], 'longitude');
    if (!lon.ok) {
      bad('longitude', lon.message);
      ok = false;
    }
    const depth =
      cols.plannedDepth >= 0 ? parseDepth(cells[cols.plannedDepth] ?? '') : { ok: true as const, value: null };
    if (!depth.ok) {
      bad('plannedDepth', depth.message);
      ok = false;
    }
    if (name !== '' && !seen.has(name)) seen.set(name, n);
    if (ok && lat.ok && lon.ok && depth.ok)
      rows.push({ line: n, name, latitude: lat.value, longitude: lon.value, plannedDepth: depth.value });
  }
  if (problems.length) return { ok: false, problems };
  return { ok: true, rows, header };
}

// ---- answers and bodies of the station plan routes ----

export const stationResponseSchema = z.object({
  id: idSchema,
  name: z.string(),
  latitude: z.number(),
  longitude: z.number(),
  plannedDepth: z.number().nullable(),
  order: z.number(),
  occupied: z.boolean(),
  /** live casts at the station */
  casts: z.number().int().nonnegative().optional(),
});
export type StationResponse = z.output<typeof stationResponseSchema>;
export const stationListResponseSchema = z.array(stationResponseSchema);

const stationName = z.string().trim().min(1, 'required').max(STATION_NAME_MAX);
export const stationPatchSchema = z
  .object({
    name: stationName.optional(),
    latitude: z.number().min(-90).max(90).optional(),
    longitude: z.number().min(-180).max(360).optional(),
    plannedDepth: z.number().gt(0).max(STATION_DEPTH_MAX).nullable().optional(),
  })
  .strict()
  .refine((b) => Object.keys(b).length > 0, 'change at least one field');
export type StationPatch = z.output<typeof stationPatchSchema>;

export const stationOrderSchema = z.object({
  /** every station id of the plan, once each, in the new order */
  ids: z.array(z.string().uuid()).min(1).max(STATION_TABLE_MAX_ROWS),
});

export const IMPORT_MODES = ['merge', 'replace'] as const;
export const stationTableSchema = z.object({
  text: z.string().max(STATION_TABLE_MAX_CHARS, `a station table is at most ${STATION_TABLE_MAX_CHARS} characters`),
  /** merge: stations the table does not name are left alone; replace: the table is the whole plan
   * (stations it does not name are removed, except those with casts, and the plan takes its order) */
  mode: z.enum(IMPORT_MODES).default('merge'),
});
export const stationTableApplySchema = stationTableSchema.extend({
  /** the token of the preview being confirmed */
  token: z.string().regex(/^[0-9a-f]{64}$/, 'the token of a preview'),
});

const planValues = z.object({ latitude: z.number(), longitude: z.number(), plannedDepth: z.number().nullable() });
export const planChangeSchema = z.object({
  mode: z.enum(IMPORT_MODES),
  rows: z.number().int().nonnegative(),
  added: z.array(planValues.extend({ name: z.string(), line: z.number().int() })),
  changed: z.array(
    z.object({
      id: idSchema,
      name: z.string(),
      line: z.number().int(),
      before: planValues,
      after: planValues,
      fields: z.array(z.enum(['latitude', 'longitude', 'plannedDepth'])),
    }),
  ),
  removed: z.array(planValues.extend({ id: idSchema, name: z.string() })),
  /** the table leaves these as they are: named with the same values, or (merge) not named */
  unchanged: z.array(z.object({ id: idSchema, name: z.string(), named: z.boolean() })),
  /** replace mode: stations the table does not name that stay because they have casts */
  keptOccupied: z.array(z.object({ id: idSchema, name: z.string(), casts: z.number().int() })),
  /** the plan's order after the change (station names) and whether it differs from today's */
  order: z.array(z.string()),
  orderChanged: z.boolean(),
  /** nothing would change */
  empty: z.boolean(),
  /** the confirm call sends this back; it stands for this plan and this change */
  token: z.string(),
});
export type PlanChange = z.output<typeof planChangeSchema>;
export const planApplyResponseSchema = z.object({
  applied: planChangeSchema,
  stations: stationListResponseSchema,
});
