// Cast columns are stored one row per cast and variable, the whole profile as raw float64 bytes
// (bytea). Reading a 6000-level column back is a memcpy, not 6000 text-to-number conversions as
// with float8[] or a row per level; DEVELOPERS.md gives the benchmark.
import { CastColumn } from '../models/index';
import { QueryTypes, type Transaction } from 'sequelize';

const LE = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

export function encodeF64(a: Float64Array): Buffer {
  if (!LE) throw new Error('big-endian hosts are not supported for column storage');
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
}
export function decodeF64(b: Buffer): Float64Array {
  const out = new Float64Array(b.byteLength / 8);
  new Uint8Array(out.buffer).set(b);
  return out;
}
export const encodeU8 = (a: Uint8Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

export type StoredColumn = {
  name: string;
  unit: string | null;
  kind: 'measured' | 'derived' | 'flag' | 'extra';
  values: Float64Array | Uint8Array;
};

export async function writeColumns(castId: string, cols: StoredColumn[], transaction: Transaction) {
  await writeColumnsOfCasts([{ castId, columns: cols }], transaction);
}

/** Rows and bytes of one INSERT at most (PostgreSQL takes 65 535 parameters a statement; 5 a
 * row). The byte bound keeps each message small enough that building it never holds up the
 * event loop for long (a raw 24 Hz zip holds ~100 MB of columns). */
const ROWS_PER_INSERT = 2000;
const BYTES_PER_INSERT = 4 * 1024 * 1024;

/**
 * The columns of several casts in as few statements as possible. The bytes go as binary query
 * parameters (node-postgres sends a Buffer parameter as binary), not as hex text in the SQL as
 * bulkCreate would write them: half the bytes on the wire and no escaping.
 */
export async function writeColumnsOfCasts(
  casts: { castId: string; columns: StoredColumn[] }[],
  transaction: Transaction,
) {
  const sequelize = CastColumn.sequelize!;
  const rows = casts.flatMap((c) =>
    c.columns.map(
      (col) =>
        [
          c.castId,
          col.name,
          col.unit,
          col.kind,
          col.values instanceof Float64Array ? encodeF64(col.values) : encodeU8(col.values),
        ] as const,
    ),
  );
  for (let start = 0; start < rows.length;) {
    let end = start,
      bytes = 0;
    while (
      end < rows.length &&
      end - start < ROWS_PER_INSERT &&
      (end === start || bytes + rows[end][4].length <= BYTES_PER_INSERT)
    )
      bytes += rows[end++][4].length;
    const chunk = rows.slice(start, end);
    start = end;
    const bind: unknown[] = [];
    const tuples = chunk.map((r) => {
      const b = bind.length;
      bind.push(...r);
      return `($${b + 1}::uuid, $${b + 2}, $${b + 3}, $${b + 4}, $${b + 5}::bytea)`;
    });
    await sequelize.query(
      `INSERT INTO cast_columns (cast_id, name, unit, kind, "values") VALUES ${tuples.join(', ')}`,
      { bind, transaction, type: QueryTypes.INSERT },
    );
  }
}

export type LoadedCast = {
  columns: Record<string, Float64Array>;
  flags: Record<string, Uint8Array>;
  units: Record<string, string | null>;
  kinds: Record<string, string>;
};

export async function readColumns(castIds: string[], names?: string[]): Promise<Map<string, LoadedCast>> {
  const where: Record<string, unknown> = { castId: castIds };
  if (names) where.name = names;
  const rows = await CastColumn.findAll({ where, attributes: ['castId', 'name', 'unit', 'kind', 'values'], raw: true });
  const out = new Map<string, LoadedCast>();
  for (const id of castIds) out.set(id, { columns: {}, flags: {}, units: {}, kinds: {} });
  for (const r of rows as unknown as {
    castId: string;
    name: string;
    unit: string | null;
    kind: string;
    values: Buffer;
  }[]) {
    const c = out.get(r.castId)!;
    if (r.kind === 'flag') c.flags[r.name] = new Uint8Array(r.values);
    else c.columns[r.name] = decodeF64(r.values);
    c.units[r.name] = r.unit;
    c.kinds[r.name] = r.kind;
  }
  return out;
}
