// From a table of text fields (header, units, rows with their original line numbers) to a
// ParsedCast: column roles, unit conversion, fill values, range checks, flags, and the downcast.
// Shared by the plain and the exchange readers; everything here is all-or-nothing.
import type { CastFormat, CastMetadata, ColumnRole, FileError, ParsedCast } from '../../shared/schemas/cast';
import { ParsedCastSchema } from '../../shared/schemas/cast';
import { assignColumns, validMappingValue, type ColumnAssignment } from './columns';
import { resolveUnit, type UnitConversion } from './units';
import { classifyNumber, fileError, isFill, MAX_COLUMNS, ParseFailure } from './text';
import { ASKED_UNIT_ROLES, unitAnswerKey, type AskedUnitRole } from '../../shared/api/intakeAnswers';

const ASKED = new Set<string>(ASKED_UNIT_ROLES);

export type RawTable = {
  file: string;
  format: CastFormat;
  headers: string[]; // raw header text
  names: string[]; // header names without unit
  unitTexts: (string | null)[];
  headerLine: number; // 1-based line of the header (parameter-name) row
  unitLine: number; // line where units were given (the header line for plain files)
  rows: string[][];
  rowLines: number[];
  metadata: CastMetadata;
  notes: string[];
  warnings: FileError[];
  mapping?: Record<string, string>;
  /** Units given at intake for columns whose header states none, by `unitAnswerKey(column name)`. */
  unitAnswers?: Record<string, string>;
  /** Drop the lines that cannot be read (and list them) instead of refusing the file, if they are few. */
  salvage?: boolean;
};

/** At most this share of the data lines may be dropped by salvage (and never more than MAX_DROPPED). */
export const SALVAGE_MAX_SHARE = 0.1;
export const MAX_DROPPED = 100;

const MAX_ERRORS = 25;

/** Physical limits used to refuse absurd values (docs/science.md §1 quantities). */
const LIMITS: Partial<Record<ColumnRole, { min: number; max: number; code: string; what: string }>> = {
  pressure: { min: -5, max: 12000, code: 'pressure_out_of_range', what: 'pressure (dbar) must lie in -5..12000' },
  depth: { min: -5, max: 12000, code: 'depth_out_of_range', what: 'depth (m) must lie in -5..12000' },
  salinity: {
    min: 2,
    max: 42,
    code: 'salinity_out_of_range',
    what: 'Practical Salinity must lie in 2..42 (the range of PSS-78)',
  },
  temperature: { min: -3, max: 45, code: 'temperature_out_of_range', what: 'temperature (°C) must lie in -3..45' },
  conductivity: {
    min: 0,
    max: 100,
    code: 'conductivity_out_of_range',
    what: 'conductivity (mS/cm) must lie in 0..100',
  },
};

class Collector {
  readonly list: FileError[] = [];
  constructor(private readonly file: string) {}
  add(line: number | null, column: number | null, code: string, message: string): void {
    if (this.list.length < MAX_ERRORS) this.list.push(fileError(this.file, line, column, code, message));
  }
  get full(): boolean {
    return this.list.length >= MAX_ERRORS;
  }
  throwIfAny(unmapped?: { file: string; headers: string[] }): void {
    if (this.list.length > 0) throw new ParseFailure(this.list, unmapped);
  }
}

function colLabel(t: RawTable, j: number): string {
  const h = t.headers[j].trim();
  return h.length > 0 ? `"${h.length > 60 ? h.slice(0, 60) + '…' : h}"` : `#${j + 1}`;
}

function shown(s: string): string {
  return JSON.stringify(s.length > 40 ? s.slice(0, 40) + '…' : s);
}

export function buildCast(t: RawTable): { cast: ParsedCast; warnings: FileError[] } {
  const err = new Collector(t.file);
  const warnings = [...t.warnings];
  const ncol = t.headers.length;
  if (ncol > MAX_COLUMNS)
    throw new ParseFailure([
      fileError(
        t.file,
        t.headerLine,
        null,
        'too_many_columns',
        `the header has ${ncol} columns (the limit is ${MAX_COLUMNS})`,
      ),
    ]);

  if (t.mapping) {
    for (const [k, v] of Object.entries(t.mapping)) {
      if (!validMappingValue(v))
        err.add(null, null, 'bad_mapping', `column mapping for "${k}" names an unknown role "${v}"`);
    }
    err.throwIfAny();
  }
  const { assignments, duplicates } = assignColumns(t.headers, t.names, t.mapping);
  for (const d of duplicates)
    warnings.push(
      fileError(
        t.file,
        t.headerLine,
        d.index + 1,
        'duplicate_column',
        `column ${colLabel(t, d.index)} is a second ${d.role} column; kept as an extra variable`,
      ),
    );

  const roleCol = new Map<ColumnRole, number>();
  assignments.forEach((a, j) => {
    if (a.kind === 'role') roleCol.set(a.role, j);
  });
  const missing: string[] = [];
  if (!roleCol.has('pressure') && !roleCol.has('depth')) missing.push('pressure or depth');
  if (!roleCol.has('temperature')) missing.push('temperature');
  if (!roleCol.has('salinity') && !roleCol.has('conductivity')) missing.push('salinity or conductivity');
  if (missing.length > 0) {
    const unmapped = t.headers.filter((_, j) => assignments[j].kind !== 'role').map((h) => h.trim());
    err.add(
      t.headerLine,
      null,
      'missing_column',
      `no ${missing.join(', no ')} column recognised among the headers (${t.headers.map((h) => JSON.stringify(h.trim())).join(', ')}); map the columns to read this file`,
    );
    err.throwIfAny(unmapped.length > 0 ? { file: t.file, headers: unmapped } : undefined);
  }

  // Units of every role column; extras keep the unit text as given.
  const conv: (UnitConversion | null)[] = new Array(ncol).fill(null);
  const notes = [...t.notes];
  const unitsNeeded: { column: string; role: AskedUnitRole }[] = [];
  for (let j = 0; j < ncol; j++) {
    const a = assignments[j];
    if (a.kind === 'role' || a.kind === 'extra') {
      let unitText = t.unitTexts[j];
      // A column whose unit is asked for at intake (oxygen): the answer given for the cruise, or a need.
      if (a.kind === 'role' && ASKED.has(a.role) && (unitText ?? '').trim() === '') {
        const column = (t.names[j] ?? t.headers[j]).trim() || `#${j + 1}`;
        const answer = t.unitAnswers?.[unitAnswerKey(column)];
        if (answer) {
          unitText = answer;
          notes.push(`${colLabel(t, j)}: no unit in the file; ${answer} as answered at intake for this cruise`);
        } else unitsNeeded.push({ column, role: a.role as AskedUnitRole });
      }
      const r = resolveUnit(a.kind === 'role' ? a.role : 'extra', unitText, colLabel(t, j));
      if (!r.ok) err.add(t.unitLine, j + 1, r.code, r.message);
      else {
        conv[j] = r.conv;
        if (r.conv.note && !r.conv.guessConductivity) notes.push(r.conv.note);
      }
    }
  }
  err.throwIfAny();

  let n = t.rows.length;
  if (n === 0)
    throw new ParseFailure([
      fileError(t.file, t.headerLine, null, 'no_data', 'the file has a header but no data lines'),
    ]);

  // Extras whose first value is text are text columns (sample labels, comments): not kept.
  const textColumn: boolean[] = new Array(ncol).fill(false);
  for (let j = 0; j < ncol; j++) {
    if (assignments[j].kind !== 'extra') continue;
    for (let r = 0; r < n && r < 50; r++) {
      const s = (t.rows[r][j] ?? '').trim();
      if (s === '') continue;
      const k = classifyNumber(s).kind;
      if (k === 'text') {
        textColumn[j] = true;
        warnings.push(
          fileError(t.file, t.headerLine, j + 1, 'text_column', `column ${colLabel(t, j)} holds text; it is not kept`),
        );
      }
      break;
    }
  }

  const values: (Float64Array | null)[] = assignments.map((a, j) =>
    (a.kind === 'role' || a.kind === 'extra') && !textColumn[j] ? new Float64Array(n) : null,
  );
  const flagVals: (Uint8Array | null)[] = assignments.map((a) => (a.kind === 'flag' ? new Uint8Array(n) : null));
  const limits = assignments.map((a) => (a.kind === 'role' ? LIMITS[a.role] : undefined));
  const firstHeader = t.headers[0].trim().toLowerCase();
  const salvage = t.salvage === true;
  const dropped: FileError[] = [];
  const badRows = new Set<number>();
  /** A problem on one data line: in salvage mode the line is dropped and listed (true: go to the next line). */
  const rowBad = (r: number, line: number, column: number | null, code: string, message: string): boolean => {
    if (!salvage) {
      err.add(line, column, code, message);
      return false;
    }
    if (!badRows.has(r)) dropped.push(fileError(t.file, line, column, code, message));
    badRows.add(r);
    return true;
  };

  rows: for (let r = 0; r < n; r++) {
    const row = t.rows[r];
    const line = t.rowLines[r];
    if (
      row.length > 0 &&
      row[0].trim().toLowerCase() === firstHeader &&
      classifyNumber(row[0].trim()).kind === 'text'
    ) {
      if (rowBad(r, line, 1, 'repeated_header', `line ${line} repeats the header row inside the data`)) continue;
      if (err.full) break;
      continue;
    }
    if (row.length !== ncol) {
      const cut = r === n - 1 && row.length < ncol;
      if (
        cut &&
        rowBad(
          r,
          line,
          row.length + 1,
          'truncated',
          `the last line (${line}) has ${row.length} fields where the header has ${ncol}: the file looks truncated`,
        )
      )
        continue;
      if (
        !cut &&
        rowBad(
          r,
          line,
          Math.min(row.length, ncol) + 1,
          'field_count',
          `line ${line} has ${row.length} fields where the header has ${ncol}`,
        )
      )
        continue;
      if (err.full) break;
      continue;
    }
    for (let j = 0; j < ncol; j++) {
      const a = assignments[j];
      if (a.kind === 'ignore') continue;
      const raw = row[j];
      const s = raw.length > 0 && (raw.charCodeAt(0) <= 32 || raw.charCodeAt(raw.length - 1) <= 32) ? raw.trim() : raw;
      if (a.kind === 'flag') {
        const fv = flagVals[j] as Uint8Array;
        if (s === '') {
          fv[r] = 9;
          continue;
        }
        const c = classifyNumber(s);
        if (c.kind === 'num' && isFill(c.value)) fv[r] = 9;
        else if (c.kind === 'num' && Number.isInteger(c.value) && c.value >= 0 && c.value <= 9)
          fv[r] = c.value === 0 ? 9 : c.value;
        else {
          if (
            rowBad(
              r,
              line,
              j + 1,
              'bad_flag',
              `line ${line}, column ${j + 1} (${colLabel(t, j)}): quality flag ${shown(s)} is not one of 1–9`,
            )
          )
            continue rows;
          if (err.full) break rows;
        }
        continue;
      }
      const out = values[j];
      if (!out) continue; // a text extra
      const c = classifyNumber(s);
      if (c.kind === 'num') {
        if (isFill(c.value)) {
          out[r] = NaN;
          continue;
        }
        const cv = conv[j] as UnitConversion;
        let v = cv.identity ? c.value : c.value * cv.factor + cv.offset;
        if (cv.ipts68) v = v / 1.00024;
        const lim = limits[j];
        if (lim && !cv.guessConductivity && (v < lim.min || v > lim.max)) {
          if (
            rowBad(
              r,
              line,
              j + 1,
              lim.code,
              `line ${line}, column ${j + 1} (${colLabel(t, j)}): ${shown(s)} is out of range; ${lim.what}`,
            )
          )
            continue rows;
          if (err.full) break rows;
        }
        out[r] = v;
      } else if (c.kind === 'empty') {
        out[r] = NaN;
      } else if (a.kind === 'extra' && (c.kind === 'nan' || c.kind === 'inf')) {
        out[r] = NaN;
      } else if (c.kind === 'nan' || c.kind === 'inf') {
        if (
          rowBad(
            r,
            line,
            j + 1,
            'nan_inf',
            `line ${line}, column ${j + 1} (${colLabel(t, j)}): ${shown(s)} is not a finite number; write missing values as -999 or leave the field empty`,
          )
        )
          continue rows;
        if (err.full) break rows;
      } else {
        if (
          rowBad(
            r,
            line,
            j + 1,
            'text_in_numeric',
            `line ${line}, column ${j + 1} (${colLabel(t, j)}): ${shown(s)} is not a number`,
          )
        )
          continue rows;
        if (err.full) break rows;
      }
    }
  }
  err.throwIfAny();
  let rowLines = t.rowLines;
  if (badRows.size > 0) {
    // Salvage: a few bad lines are dropped and listed; too many and the file is refused as before.
    const limit = Math.min(MAX_DROPPED, Math.floor(n * SALVAGE_MAX_SHARE));
    if (badRows.size > limit) {
      const more =
        badRows.size > 25 ? ` (the first 25 of ${badRows.size} bad lines; at most ${limit} can be left out)` : '';
      throw new ParseFailure(
        dropped.slice(0, 25).map((e, k) => (k === 0 && more ? { ...e, message: e.message + more } : e)),
      );
    }
    const good: number[] = [];
    for (let r = 0; r < n; r++) if (!badRows.has(r)) good.push(r);
    for (let j = 0; j < ncol; j++) {
      const v = values[j];
      if (v) values[j] = Float64Array.from(good, (r) => v[r]);
      const f = flagVals[j];
      if (f) flagVals[j] = Uint8Array.from(good, (r) => f[r]);
    }
    rowLines = good.map((r) => t.rowLines[r]);
    n = good.length;
    notes.push(
      `partly read: ${dropped.length} line${dropped.length > 1 ? 's' : ''} that could not be read left out (${dropped.map((e) => e.line).join(', ')})`,
    );
  }

  // Conductivity without a unit: seawater is 20–70 mS/cm, i.e. 2–7 S/m.
  const cj = roleCol.get('conductivity');
  if (cj !== undefined && conv[cj]?.guessConductivity) {
    const col = values[cj] as Float64Array;
    const finite = Array.from(col)
      .filter(Number.isFinite)
      .sort((a, b) => a - b);
    const med = finite.length ? finite[finite.length >> 1] : NaN;
    if (med < 10) {
      for (let i = 0; i < n; i++) col[i] *= 10;
      notes.push(
        `${colLabel(t, cj)}: no unit given; values read as S/m (median ${med.toFixed(3)}) and converted to mS/cm`,
      );
    } else notes.push(`${colLabel(t, cj)}: no unit given; values read as mS/cm`);
    for (let i = 0; i < n; i++) {
      const v = col[i];
      if (v < 0 || v > 100)
        err.add(
          rowLines[i],
          cj + 1,
          'conductivity_out_of_range',
          `line ${rowLines[i]}, column ${cj + 1} (${colLabel(t, cj)}): conductivity out of range 0..100 mS/cm`,
        );
      if (err.full) break;
    }
    err.throwIfAny();
  }

  // The vertical coordinate, the levels kept (the downcast) and what was dropped.
  const vertical: 'pressure' | 'depth' = roleCol.has('pressure') ? 'pressure' : 'depth';
  const vj = roleCol.get(vertical) as number;
  const vert = values[vj] as Float64Array;
  let deepest = -1;
  let vmax = -Infinity;
  let noVertical = 0;
  for (let i = 0; i < n; i++) {
    const v = vert[i];
    if (Number.isNaN(v)) noVertical++;
    else if (v > vmax) {
      vmax = v;
      deepest = i;
    }
  }
  if (deepest < 0)
    throw new ParseFailure([fileError(t.file, t.headerLine, vj + 1, 'no_data', `no level has a ${vertical} value`)]);
  const keep: number[] = [];
  for (let i = 0; i <= deepest; i++) if (!Number.isNaN(vert[i])) keep.push(i);
  let trailing = 0;
  let trailingMin = Infinity;
  for (let i = deepest + 1; i < n; i++) {
    if (Number.isNaN(vert[i])) continue;
    trailing++;
    if (vert[i] < trailingMin) trailingMin = vert[i];
  }
  const hasUpcast = trailing >= 2 && vmax - trailingMin >= 5;
  if (hasUpcast)
    notes.push(
      `upcast of ${trailing} levels dropped (from ${fmt(vmax)} back to ${fmt(trailingMin)} ${vertical === 'pressure' ? 'dbar' : 'm'})`,
    );
  else if (trailing > 0) notes.push(`${trailing} level${trailing > 1 ? 's' : ''} after the deepest sample dropped`);
  const droppedNoVert = keep.length + trailing < n - 0 ? noVertical : 0;
  if (droppedNoVert > 0)
    notes.push(`${droppedNoVert} level${droppedNoVert > 1 ? 's' : ''} without a ${vertical} value dropped`);
  let reversals = 0;
  let falling = false;
  for (let k = 1; k < keep.length; k++) {
    const d = vert[keep[k]] - vert[keep[k - 1]];
    if (d < 0 && !falling) reversals++;
    falling = d < 0;
  }
  if (reversals > 0)
    notes.push(
      `${reversals} ${vertical} reversal${reversals > 1 ? 's' : ''} within the downcast (levels kept in the order recorded)`,
    );

  const m = keep.length;
  const pick = (a: Float64Array): Float64Array => {
    const o = new Float64Array(m);
    for (let k = 0; k < m; k++) o[k] = a[keep[k]];
    return o;
  };
  const pickU8 = (a: Uint8Array): Uint8Array => {
    const o = new Uint8Array(m);
    for (let k = 0; k < m; k++) o[k] = a[keep[k]];
    return o;
  };

  const columns: Partial<Record<ColumnRole, Float64Array>> = {};
  const units: Record<string, string> = {};
  const extras: ParsedCast['extras'] = {};
  const colKey: (string | null)[] = new Array(ncol).fill(null);
  for (let j = 0; j < ncol; j++) {
    const a: ColumnAssignment = assignments[j];
    const v = values[j];
    if (!v) continue;
    if (a.kind === 'role') {
      columns[a.role] = pick(v);
      units[a.role] = a.role === 'oxygen' ? conv[j]?.unit || 'unknown' : (conv[j] as UnitConversion).unit;
      colKey[j] = a.role;
    } else if (a.kind === 'extra') {
      let key = a.key;
      for (let s = 2; extras[key] || (columns as Record<string, unknown>)[key]; s++) key = `${a.key}_${s}`;
      extras[key] = { unit: conv[j]?.unit ?? '', values: pick(v) };
      units[key] = conv[j]?.unit ?? '';
      colKey[j] = key;
    }
  }

  // Flags by role (or extra key): the file's flag column where there is one, else 2 where a value
  // exists; a missing value is always 9.
  const flags: Record<string, Uint8Array> = {};
  const flagSource = new Map<string, number>();
  assignments.forEach((a, j) => {
    if (a.kind !== 'flag') return;
    const target = a.of;
    if (colKey.includes(target)) flagSource.set(target, j);
    else
      warnings.push(
        fileError(
          t.file,
          t.headerLine,
          j + 1,
          'flag_without_column',
          `flag column ${colLabel(t, j)} belongs to no column of this file; not kept`,
        ),
      );
  });
  const unflagged: string[] = [];
  for (let j = 0; j < ncol; j++) {
    const key = colKey[j];
    if (!key) continue;
    const a = assignments[j];
    const src = flagSource.get(key);
    if (a.kind === 'extra' && src === undefined) continue;
    const vals = a.kind === 'role' ? (columns[a.role] as Float64Array) : extras[key].values;
    const f = src !== undefined ? pickU8(flagVals[src] as Uint8Array) : new Uint8Array(m).fill(2);
    if (src === undefined) unflagged.push(key);
    for (let k = 0; k < m; k++) if (Number.isNaN(vals[k])) f[k] = 9;
    flags[key] = f;
  }
  if (unflagged.length > 0 && flagSource.size > 0)
    notes.push(`no quality flags in the file for ${unflagged.join(', ')}; levels with values marked 2`);
  else if (flagSource.size === 0)
    notes.push('no quality-flag columns in the file; levels with values marked 2, missing values 9');

  const cast = {
    file: t.file,
    format: t.format,
    metadata: t.metadata,
    vertical,
    columns: columns as ParsedCast['columns'],
    units,
    extras,
    flags,
    profile: { levels: m, downcastEnd: deepest, hasUpcast, reversals },
    notes,
    ...(dropped.length > 0 ? { dropped } : {}),
    ...(unitsNeeded.length > 0 ? { unitsNeeded } : {}),
  };
  const checked = ParsedCastSchema.safeParse(cast);
  if (!checked.success)
    throw new ParseFailure([
      fileError(
        t.file,
        null,
        null,
        'internal_error',
        `the parsed cast failed validation: ${checked.error.issues.map((i) => i.message).join('; ')}`,
      ),
    ]);
  return { cast: checked.data, warnings };
}

function fmt(v: number): string {
  return Number.isInteger(v) ? String(v) : v.toFixed(1);
}
