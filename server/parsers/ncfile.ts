// A netCDF-3 file (classic or 64-bit offset) as plain data: dimensions, global attributes and
// variables with their shape and attributes, and a checked read of one variable. The bytes are
// decoded by netcdfjs (a maintained npm reader of the published classic format); everything it
// is asked to read is first checked against the file's length, so a header that lies about its
// sizes fails with a named error instead of reading past the end.
import { NetCDFReader } from 'netcdfjs';
import { fileError, ParseFailure } from './text';

export type NcAttr = string | number | number[];
export type NcVar = {
  name: string;
  type: string; // byte, char, short, int, float, double
  dims: string[];
  shape: number[];
  attrs: Record<string, NcAttr>;
  record: boolean;
  offset: number;
};
export type NcFile = {
  globals: Record<string, NcAttr>;
  dims: Record<string, number>;
  vars: Map<string, NcVar>;
  /** Numeric values of a variable, flattened in C order (the last dimension varies fastest). */
  numbers(v: NcVar): number[];
  /** Char variable as strings along its last dimension, NUL and trailing spaces removed. */
  strings(v: NcVar): string[];
};

/** netCDF-3 magic: "CDF" and version byte 1 (classic), 2 (64-bit offset) or 5 (64-bit data). */
export function isNetcdf3(bytes: Uint8Array): boolean {
  return (
    bytes.length >= 4 &&
    bytes[0] === 0x43 &&
    bytes[1] === 0x44 &&
    bytes[2] === 0x46 &&
    (bytes[3] === 1 || bytes[3] === 2 || bytes[3] === 5)
  );
}

/** HDF5 signature (netCDF-4 files are HDF5 files): \x89 H D F \r \n \x1a \n. */
export function isHdf5(bytes: Uint8Array): boolean {
  const sig = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];
  return bytes.length >= 8 && sig.every((b, i) => bytes[i] === b);
}

const TYPE_BYTES: Record<string, number> = { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 };

function corrupt(file: string, message: string): ParseFailure {
  return new ParseFailure([fileError(file, null, null, 'netcdf_corrupt', message)]);
}

/** Open a netCDF-3 file or throw a ParseFailure naming what is wrong with it. */
export function openNetcdf(file: string, bytes: Uint8Array): NcFile {
  if (bytes.length >= 4 && bytes[3] === 5 && isNetcdf3(bytes))
    throw new ParseFailure([
      fileError(
        file,
        null,
        null,
        'netcdf_unsupported',
        'the file is netCDF-3 with 64-bit data (CDF-5), which is not read; save it as netCDF-3 classic or netCDF-4',
      ),
    ]);
  let r: NetCDFReader;
  try {
    r = new NetCDFReader(bytes);
  } catch (e) {
    throw corrupt(file, `the netCDF header cannot be read: ${(e as Error).message}`);
  }
  const dimList = r.dimensions ?? [];
  const recLen = r.recordDimension.length;
  const recId = r.recordDimension.id;
  const dims: Record<string, number> = {};
  dimList.forEach((d, i) => (dims[d.name] = i === recId ? recLen : d.size));
  const globals: Record<string, NcAttr> = {};
  for (const a of r.globalAttributes ?? []) globals[a.name] = a.value as NcAttr;
  const vars = new Map<string, NcVar>();
  const recStep = r.recordDimension.recordStep ?? 0;
  for (const v of r.variables ?? []) {
    const ids = v.dimensions as number[];
    if (ids.some((id) => id < 0 || id >= dimList.length))
      throw corrupt(file, `variable ${v.name} names a dimension the file does not have`);
    const names = ids.map((id) => dimList[id].name);
    const shape = ids.map((id) => (id === recId ? recLen : dimList[id].size));
    const attrs: Record<string, NcAttr> = {};
    for (const a of (v.attributes ?? []) as { name: string; value: unknown }[]) attrs[a.name] = a.value as NcAttr;
    const tb = TYPE_BYTES[v.type];
    if (!tb) throw corrupt(file, `variable ${v.name} has an unknown type`);
    const count = shape.reduce((a, b) => a * b, 1);
    const offset = Number(v.offset);
    const end = v.record
      ? offset + Math.max(0, recLen - 1) * recStep + (count / Math.max(1, recLen)) * tb
      : offset + count * tb;
    if (!Number.isFinite(end) || offset < 0 || end > bytes.length)
      throw corrupt(
        file,
        `variable ${v.name} is declared to run to byte ${end} but the file has ${bytes.length} bytes: it looks truncated`,
      );
    vars.set(v.name, { name: v.name, type: v.type, dims: names, shape, attrs, record: v.record, offset });
  }
  const raw = (v: NcVar): unknown[] => {
    try {
      return r.getDataVariable(v.name) as unknown[];
    } catch (e) {
      throw corrupt(file, `variable ${v.name} cannot be read: ${(e as Error).message}`);
    }
  };
  const flat = (v: NcVar): unknown[] => {
    const count = v.shape.reduce((a, b) => a * b, 1);
    const out: unknown[] = [];
    for (const x of raw(v)) {
      if (Array.isArray(x)) for (const y of x) out.push(y);
      else if (typeof x === 'string' && v.type === 'char') for (const ch of x) out.push(ch);
      else out.push(x);
      if (out.length >= count) break;
    }
    return out.slice(0, count); // a variable's size is padded to 4 bytes: drop the padding
  };
  return {
    globals,
    dims,
    vars,
    numbers(v) {
      if (v.type === 'char') throw corrupt(file, `variable ${v.name} holds text where numbers are expected`);
      return flat(v).map((x) => (typeof x === 'number' ? x : NaN));
    },
    strings(v) {
      // Char data straight from the bytes (the reader drops NUL padding, which would run strings together).
      const count = v.shape.reduce((a, b) => a * b, 1);
      const chars = !v.record
        ? Array.from(bytes.subarray(v.offset, v.offset + count), (b) => String.fromCharCode(b))
        : flat(v).map((x) => (typeof x === 'string' ? x : typeof x === 'number' ? String.fromCharCode(x) : ''));
      const w = v.shape.length > 0 ? v.shape[v.shape.length - 1] : chars.length;
      const out: string[] = [];
      for (let i = 0; i < chars.length; i += Math.max(1, w))
        out.push(
          chars
            .slice(i, i + w)
            .join('')
            .replace(/\0.*$/s, '')
            .trim(),
        );
      return out.length ? out : [''];
    },
  };
}

/** An attribute as text (char attributes) or as its first number, or null. */
export function attrText(a: NcAttr | undefined): string | null {
  if (a === undefined) return null;
  if (typeof a === 'string') return a.replace(/\0+$/, '').trim();
  if (Array.isArray(a)) return a.length ? String(a[0]) : null;
  return String(a);
}

export function attrNumber(a: NcAttr | undefined): number | null {
  if (a === undefined) return null;
  if (typeof a === 'number') return a;
  if (Array.isArray(a)) return typeof a[0] === 'number' ? a[0] : null;
  const v = Number(a.trim());
  return a.trim() !== '' && Number.isFinite(v) ? v : null;
}

export function attrNumbers(a: NcAttr | undefined): number[] {
  if (a === undefined) return [];
  if (typeof a === 'number') return [a];
  if (Array.isArray(a)) return a;
  return a
    .split(/[\s,]+/)
    .map(Number)
    .filter(Number.isFinite);
}
