// The delivery table: the one in-memory shape every writer (CSV, spreadsheet, NetCDF, package) takes.
import { z } from 'zod';
import { ProvenanceSchema, type Provenance } from './provenance';

export { ProvenanceSchema, type Provenance } from './provenance';

export const DeliveryColumnSchema = z.object({
  name: z
    .string()
    .min(1)
    .max(64)
    .regex(/^[A-Za-z_][A-Za-z0-9_]*$/, 'column names are letters, digits and underscores, not starting with a digit'),
  unit: z.string().nullable(),
  type: z.enum(['number', 'string']),
  long_name: z.string().optional(),
  standard_name: z.string().optional(),
});

export type DeliveryColumn = z.infer<typeof DeliveryColumnSchema>;

/** A cell: a finite number, a string, or null for "no value". */
export type DeliveryCell = number | string | null;
export type DeliveryRow = DeliveryCell[];

// Rows are checked cell by cell in the refinement below (a finite number or null in a number
// column, a string or null in a string column): one pass, fast enough for 10^6 cells.
const RowsSchema = z.custom<DeliveryRow[]>(
  (v) => Array.isArray(v) && v.every((r) => Array.isArray(r)),
  'rows must be an array of arrays',
);

export const DeliveryTableSchema = z
  .object({
    kind: z.enum(['isopycnal', 'pressure']),
    columns: z.array(DeliveryColumnSchema).min(1),
    rows: RowsSchema,
    provenance: ProvenanceSchema,
  })
  .superRefine((t, ctx) => {
    const names = new Set<string>();
    t.columns.forEach((c, i) => {
      if (names.has(c.name))
        ctx.addIssue({ code: 'custom', path: ['columns', i, 'name'], message: `duplicate column ${c.name}` });
      names.add(c.name);
    });
    const types = t.columns.map((c) => c.type);
    for (let r = 0; r < t.rows.length; r++) {
      const row = t.rows[r];
      if (row.length !== t.columns.length) {
        ctx.addIssue({
          code: 'custom',
          path: ['rows', r],
          message: `row has ${row.length} cells, expected ${t.columns.length}`,
        });
        return;
      }
      for (let c = 0; c < row.length; c++) {
        const v: unknown = row[c];
        if (v === null) continue;
        const want = types[c];
        if (typeof v !== want || (want === 'number' && !Number.isFinite(v))) {
          ctx.addIssue({
            code: 'custom',
            path: ['rows', r, c],
            message: `column ${t.columns[c].name} holds ${want === 'number' ? 'finite numbers' : 'strings'} or null, got ${typeof v === 'number' ? String(v) : typeof v}`,
          });
          return;
        }
      }
    }
  });

export interface DeliveryTable {
  kind: 'isopycnal' | 'pressure';
  columns: DeliveryColumn[];
  rows: DeliveryRow[];
  provenance: Provenance;
}

/** Parse and check an unknown value as a DeliveryTable (throws a ZodError with paths on failure). */
export function parseDeliveryTable(value: unknown): DeliveryTable {
  return DeliveryTableSchema.parse(value);
}

// ---------------------------------------------------------------------------------------------
// Column contracts

export const ISOPYCNAL_FLAGS = ['outcrop', 'below_bottom', 'multi_crossing', 'in_inversion'] as const;
export type IsopycnalFlag = (typeof ISOPYCNAL_FLAGS)[number];

/** The isopycnal table, api.md: one row per cast and target level, in this column order. */
export const ISOPYCNAL_COLUMNS: readonly DeliveryColumn[] = Object.freeze([
  { name: 'station', unit: null, type: 'string', long_name: 'Station identifier' },
  { name: 'cast', unit: null, type: 'string', long_name: 'Cast identifier' },
  { name: 'latitude', unit: 'degrees_north', type: 'number', long_name: 'Latitude of the cast' },
  { name: 'longitude', unit: 'degrees_east', type: 'number', long_name: 'Longitude of the cast' },
  { name: 'sigma_ref', unit: 'dbar', type: 'number', long_name: 'Reference pressure of the potential density' },
  { name: 'sigma_level', unit: 'kg/m3', type: 'number', long_name: 'Target potential density anomaly' },
  { name: 'pressure', unit: 'dbar', type: 'number', long_name: 'Sea pressure of the isopycnal' },
  { name: 'depth', unit: 'm', type: 'number', long_name: 'Depth of the isopycnal' },
  { name: 'CT', unit: 'degC', type: 'number', long_name: 'Conservative Temperature on the isopycnal' },
  { name: 'SA', unit: 'g/kg', type: 'number', long_name: 'Absolute Salinity on the isopycnal' },
  { name: 'thickness', unit: 'm', type: 'number', long_name: 'Thickness of the layer between adjacent target levels' },
  { name: 'crossings', unit: null, type: 'number', long_name: 'Number of times the cast crosses the target level' },
  {
    name: 'flags',
    unit: null,
    type: 'string',
    long_name: 'Level flags (outcrop; below_bottom; multi_crossing; in_inversion)',
  },
] satisfies DeliveryColumn[]);

/**
 * The pressure-binned table (our choice of columns): one row per cast and pressure bin.
 * `pressure` is the bin centre, `count` the number of samples averaged into the bin, `CT`, `SA`,
 * `sigma0` bin means; `depth` from pressure and latitude; `t` in-situ temperature (ITS-90) and `SP`
 * Practical Salinity as bin means of the measured values. Extra variables follow.
 */
export const PRESSURE_COLUMNS: readonly DeliveryColumn[] = Object.freeze([
  { name: 'station', unit: null, type: 'string', long_name: 'Station identifier' },
  { name: 'cast', unit: null, type: 'string', long_name: 'Cast identifier' },
  { name: 'latitude', unit: 'degrees_north', type: 'number', long_name: 'Latitude of the cast' },
  { name: 'longitude', unit: 'degrees_east', type: 'number', long_name: 'Longitude of the cast' },
  { name: 'pressure', unit: 'dbar', type: 'number', long_name: 'Sea pressure at the bin centre' },
  { name: 'count', unit: null, type: 'number', long_name: 'Number of samples in the bin' },
  { name: 'CT', unit: 'degC', type: 'number', long_name: 'Conservative Temperature, bin mean' },
  { name: 'SA', unit: 'g/kg', type: 'number', long_name: 'Absolute Salinity, bin mean' },
  {
    name: 'sigma0',
    unit: 'kg/m3',
    type: 'number',
    long_name: 'Potential density anomaly referenced to 0 dbar, bin mean',
  },
  { name: 'depth', unit: 'm', type: 'number', long_name: 'Depth of the bin centre' },
  { name: 't', unit: 'degC', type: 'number', long_name: 'In-situ temperature (ITS-90), bin mean' },
  { name: 'SP', unit: null, type: 'number', long_name: 'Practical Salinity (PSS-78), bin mean' },
] satisfies DeliveryColumn[]);

/** Join flags into the `;`-separated cell; an empty list is null (an empty field). */
export function formatFlags(flags: readonly IsopycnalFlag[]): string | null {
  if (flags.length === 0) return null;
  const set = new Set(flags);
  return ISOPYCNAL_FLAGS.filter((f) => set.has(f)).join(';');
}

/** Split a flags cell back into its flags (unknown words are an error). */
export function parseFlags(cell: string | null | undefined): IsopycnalFlag[] {
  if (cell === null || cell === undefined || cell.trim() === '') return [];
  return cell.split(';').map((w) => {
    const f = w.trim();
    if (!(ISOPYCNAL_FLAGS as readonly string[]).includes(f)) throw new Error(`unknown flag "${f}"`);
    return f as IsopycnalFlag;
  });
}

export type ExtraValues = Record<string, number | string | null | undefined>;

export interface IsopycnalRow {
  station: string;
  cast: string;
  latitude: number;
  longitude: number;
  sigma_ref: number;
  sigma_level: number;
  pressure: number | null;
  depth: number | null;
  CT: number | null;
  SA: number | null;
  thickness: number | null;
  crossings: number | null;
  flags: readonly IsopycnalFlag[];
  /** Extra variables (oxygen, derived variables, a cast `time` as ISO 8601 text...). */
  extras?: ExtraValues;
}

export interface PressureRow {
  station: string;
  cast: string;
  latitude: number;
  longitude: number;
  pressure: number;
  count: number;
  CT: number | null;
  SA: number | null;
  sigma0: number | null;
  depth?: number | null;
  t?: number | null;
  SP?: number | null;
  extras?: ExtraValues;
}

export interface BuildOptions {
  /**
   * Extra columns, in order, appended after the contract columns. When omitted they are inferred
   * from the rows' `extras` keys in order of first appearance (type from the values, no unit).
   */
  extraColumns?: DeliveryColumn[];
}

function finiteOrNull(v: number | null | undefined): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

function inferExtraColumns(
  rows: readonly { extras?: ExtraValues }[],
  reserved: readonly DeliveryColumn[],
): DeliveryColumn[] {
  const seen = new Map<string, 'number' | 'string' | null>();
  for (const r of rows) {
    if (!r.extras) continue;
    for (const [k, v] of Object.entries(r.extras)) {
      const t = typeof v === 'number' ? 'number' : typeof v === 'string' ? 'string' : null;
      const prev = seen.get(k);
      if (prev === undefined) seen.set(k, t);
      else if (prev === null) seen.set(k, t);
      else if (t !== null && t !== prev) seen.set(k, 'string');
    }
  }
  const taken = new Set(reserved.map((c) => c.name));
  const cols: DeliveryColumn[] = [];
  for (const [name, t] of seen) {
    if (taken.has(name)) throw new Error(`extra variable "${name}" collides with a table column`);
    cols.push({ name, unit: name === 'time' ? 'ISO 8601 UTC' : null, type: t ?? 'number' });
  }
  return cols;
}

function extraCells(extras: ExtraValues | undefined, cols: readonly DeliveryColumn[]): DeliveryCell[] {
  return cols.map((c) => {
    const v = extras?.[c.name];
    if (v === undefined || v === null) return null;
    if (c.type === 'number') {
      if (typeof v !== 'number') throw new Error(`extra variable ${c.name} must be a number, got ${typeof v}`);
      return finiteOrNull(v);
    }
    return String(v);
  });
}

function checkTable(t: DeliveryTable): DeliveryTable {
  return parseDeliveryTable(t);
}

/** Build an isopycnal DeliveryTable (api.md column order, then extras) from row objects. */
export function buildIsopycnalTable(
  rows: readonly IsopycnalRow[],
  provenance: Provenance,
  options: BuildOptions = {},
): DeliveryTable {
  const extras = options.extraColumns ?? inferExtraColumns(rows, ISOPYCNAL_COLUMNS);
  const columns = [...ISOPYCNAL_COLUMNS.map((c) => ({ ...c })), ...extras];
  const out: DeliveryRow[] = rows.map((r) => [
    r.station,
    r.cast,
    r.latitude,
    r.longitude,
    r.sigma_ref,
    r.sigma_level,
    finiteOrNull(r.pressure),
    finiteOrNull(r.depth),
    finiteOrNull(r.CT),
    finiteOrNull(r.SA),
    finiteOrNull(r.thickness),
    finiteOrNull(r.crossings),
    formatFlags(r.flags),
    ...extraCells(r.extras, extras),
  ]);
  return checkTable({ kind: 'isopycnal', columns, rows: out, provenance });
}

/** Build a pressure-binned DeliveryTable (PRESSURE_COLUMNS, then extras) from row objects. */
export function buildPressureTable(
  rows: readonly PressureRow[],
  provenance: Provenance,
  options: BuildOptions = {},
): DeliveryTable {
  const extras = options.extraColumns ?? inferExtraColumns(rows, PRESSURE_COLUMNS);
  const columns = [...PRESSURE_COLUMNS.map((c) => ({ ...c })), ...extras];
  const out: DeliveryRow[] = rows.map((r) => [
    r.station,
    r.cast,
    r.latitude,
    r.longitude,
    r.pressure,
    r.count,
    finiteOrNull(r.CT),
    finiteOrNull(r.SA),
    finiteOrNull(r.sigma0),
    finiteOrNull(r.depth),
    finiteOrNull(r.t),
    finiteOrNull(r.SP),
    ...extraCells(r.extras, extras),
  ]);
  return checkTable({ kind: 'pressure', columns, rows: out, provenance });
}

/** Index of a column by name, or -1. */
export function columnIndex(table: Pick<DeliveryTable, 'columns'>, name: string): number {
  return table.columns.findIndex((c) => c.name === name);
}
