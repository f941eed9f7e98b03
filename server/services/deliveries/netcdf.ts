// A small, general NetCDF-3 writer: the classic format (CDF-1) and the 64-bit offset format (CDF-2),
// written from the published NetCDF classic format specification (its BNF grammar and notes):
//
//   netcdf_file = header data
//   header      = magic numrecs dim_list gatt_list var_list
//   magic       = 'C' 'D' 'F' VERSION            VERSION = \x01 (classic) | \x02 (64-bit offset)
//   dim_list    = ABSENT | NC_DIMENSION nelems [dim ...]      (NC_DIMENSION = 0x0A)
//   att_list    = ABSENT | NC_ATTRIBUTE nelems [attr ...]     (NC_ATTRIBUTE = 0x0C)
//   var_list    = ABSENT | NC_VARIABLE  nelems [var ...]      (NC_VARIABLE  = 0x0B)
//   ABSENT      = ZERO ZERO (8 zero bytes)
//   name        = nelems namestring, padded with \x00 to a 4-byte boundary
//   dim         = name dim_length                              (0 = the record dimension)
//   attr        = name nc_type nelems [values ...], values padded to 4 bytes
//   var         = name nelems [dimid ...] vatt_list nc_type vsize begin
//   begin       = 32-bit offset (CDF-1) | 64-bit offset (CDF-2)
//   data        = non_recs recs; non-record variables one after another, each padded to 4 bytes;
//                 then each record holds one slab of every record variable in header order.
//
// Everything is big-endian. nc_type: BYTE=1 CHAR=2 SHORT=3 INT=4 FLOAT=5 DOUBLE=6. vsize is the
// variable's size (per record for record variables) rounded up to a multiple of 4. When there is
// exactly one record variable the records are not padded. Header padding is zero bytes; padding in
// the data part is the variable's fill value. The default fill values are those of the
// specification (byte -127, char \0, short -32767, int -2147483647, float and double
// 9.9692099683868690e+36).
//
// Conventions of this writer: numeric `null`, `undefined` and NaN data values are written as the
// variable's fill value (its `_FillValue` attribute when given, else the default), so readers
// mask them. Char data is a string (the whole variable) or an array of strings, one per element of
// all dimensions but the last, each at most that many UTF-8 bytes, padded with \0.

export type NcType = 'byte' | 'char' | 'short' | 'int' | 'float' | 'double';

const TYPE_CODE: Record<NcType, number> = { byte: 1, char: 2, short: 3, int: 4, float: 5, double: 6 };
const TYPE_SIZE: Record<NcType, number> = { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 };

/** Default fill values of the classic format. */
export const NC_FILL: Readonly<Record<Exclude<NcType, 'char'>, number>> = Object.freeze({
  byte: -127,
  short: -32767,
  int: -2147483647,
  float: 9.969209968386869e36,
  double: 9.969209968386869e36,
});

export interface NcTypedAttribute {
  type: NcType;
  value: string | number | readonly number[];
}

/** A string is a char attribute; a number or number array a double one unless typed. */
export type NcAttributeValue = string | number | readonly number[] | NcTypedAttribute;
export type NcAttributes = Record<string, NcAttributeValue>;

export interface NcDimension {
  name: string;
  size: number | 'unlimited';
}

export type NcNumericData = ArrayLike<number | null | undefined>;
export type NcData = NcNumericData | string | readonly (string | null)[];

export interface NcVariable {
  name: string;
  type: NcType;
  dimensions: readonly string[];
  attributes?: NcAttributes;
  /** Omitted or null: every value is the fill value. */
  data?: NcData | null;
}

export interface NcDataset {
  dimensions: readonly NcDimension[];
  globalAttributes?: NcAttributes;
  variables: readonly NcVariable[];
  /** 'auto' (default) writes CDF-1 when every offset fits in 31 bits, else CDF-2. */
  format?: 'classic' | '64bit-offset' | 'auto';
}

export class NetcdfWriteError extends Error {
  override name = 'NetcdfWriteError';
}

// Attributes that CF and the NetCDF user guide require to have the variable's own type.
const SAME_TYPE_ATTRIBUTES = new Set([
  '_FillValue',
  'missing_value',
  'valid_min',
  'valid_max',
  'valid_range',
  'actual_range',
  'flag_values',
  'flag_masks',
]);

const NAME_RE = /^[A-Za-z_][A-Za-z0-9_.@+-]*$/;
const MAX_NAME_BYTES = 256;

function checkName(kind: string, name: string): void {
  if (!NAME_RE.test(name) || Buffer.byteLength(name, 'utf8') > MAX_NAME_BYTES) {
    throw new NetcdfWriteError(`invalid ${kind} name "${name}"`);
  }
}

const pad4 = (n: number): number => Math.ceil(n / 4) * 4;

const INT_RANGE: Partial<Record<NcType, [number, number]>> = {
  byte: [-128, 127],
  short: [-32768, 32767],
  int: [-2147483648, 2147483647],
};

interface EncodedAttribute {
  name: Buffer;
  type: NcType;
  nelems: number;
  values: Buffer; // unpadded
}

function encodeNumbers(type: Exclude<NcType, 'char'>, values: readonly number[], what: string): Buffer {
  const buf = Buffer.alloc(values.length * TYPE_SIZE[type]);
  const range = INT_RANGE[type];
  values.forEach((v, i) => {
    if (typeof v !== 'number' || (range !== undefined && Number.isNaN(v)))
      throw new NetcdfWriteError(`${what}: ${String(v)} is not a ${type}`);
    if (range && (!Number.isInteger(v) || v < range[0] || v > range[1])) {
      throw new NetcdfWriteError(`${what}: ${v} does not fit a ${type}`);
    }
    switch (type) {
      case 'byte':
        buf.writeInt8(v, i);
        break;
      case 'short':
        buf.writeInt16BE(v, i * 2);
        break;
      case 'int':
        buf.writeInt32BE(v, i * 4);
        break;
      case 'float':
        buf.writeFloatBE(v, i * 4);
        break;
      case 'double':
        buf.writeDoubleBE(v, i * 8);
        break;
    }
  });
  return buf;
}

function encodeAttribute(name: string, value: NcAttributeValue, owner: NcVariable | null): EncodedAttribute {
  checkName('attribute', name);
  const what = owner ? `attribute ${owner.name}:${name}` : `global attribute ${name}`;
  let type: NcType;
  let v: string | number | readonly number[];
  if (typeof value === 'object' && value !== null && !Array.isArray(value) && 'type' in value) {
    const typed = value as NcTypedAttribute;
    type = typed.type;
    v = typed.value;
  } else {
    v = value as string | number | readonly number[];
    type =
      typeof v === 'string'
        ? 'char'
        : owner && owner.type !== 'char' && SAME_TYPE_ATTRIBUTES.has(name)
          ? owner.type
          : 'double';
  }
  if (owner && name === '_FillValue' && type !== owner.type) {
    throw new NetcdfWriteError(`${what}: _FillValue must have the variable's type ${owner.type}, not ${type}`);
  }
  if (type === 'char') {
    if (typeof v !== 'string') throw new NetcdfWriteError(`${what}: a char attribute needs a string`);
    const values = Buffer.from(v, 'utf8');
    return { name: Buffer.from(name, 'utf8'), type, nelems: values.length, values };
  }
  if (typeof v === 'string') throw new NetcdfWriteError(`${what}: a ${type} attribute needs numbers`);
  const nums = typeof v === 'number' ? [v] : Array.from(v);
  if (nums.length === 0) throw new NetcdfWriteError(`${what}: an attribute needs at least one value`);
  return { name: Buffer.from(name, 'utf8'), type, nelems: nums.length, values: encodeNumbers(type, nums, what) };
}

function encodeAttributes(attrs: NcAttributes | undefined, owner: NcVariable | null): EncodedAttribute[] {
  if (!attrs) return [];
  return Object.entries(attrs).map(([k, v]) => encodeAttribute(k, v, owner));
}

const nameSize = (b: Buffer): number => 4 + pad4(b.length);
const attListSize = (list: EncodedAttribute[]): number =>
  list.length === 0 ? 8 : 8 + list.reduce((s, a) => s + nameSize(a.name) + 8 + pad4(a.values.length), 0);

interface PlannedVariable {
  v: NcVariable;
  name: Buffer;
  dimIds: number[];
  attrs: EncodedAttribute[];
  isRecord: boolean;
  /** Elements per record (record variables) or in total (others). */
  elems: number;
  /** Unpadded byte size of `elems` elements. */
  bytes: number;
  vsize: number;
  begin: number;
  fill: number;
  nrecs: number; // records of data supplied (record variables)
  /** For char variables: the length of the last dimension (string length). */
  strlen: number;
}

function fillValueOf(v: NcVariable): number {
  if (v.type === 'char') return 0;
  const a = v.attributes?._FillValue;
  if (a === undefined) return NC_FILL[v.type];
  const val = typeof a === 'object' && !Array.isArray(a) && 'type' in a ? (a as NcTypedAttribute).value : a;
  const n = typeof val === 'number' ? val : typeof val === 'string' ? NaN : (val as readonly number[])[0];
  if (typeof n !== 'number' || Number.isNaN(n))
    throw new NetcdfWriteError(`variable ${v.name}: _FillValue must be a number`);
  return n;
}

/** Write a dataset as NetCDF-3 bytes (CDF-1, or CDF-2 when asked or needed). */
export function writeNetcdf(ds: NcDataset): Buffer {
  // --- dimensions
  const dimIndex = new Map<string, number>();
  let recordDim = -1;
  ds.dimensions.forEach((d, i) => {
    checkName('dimension', d.name);
    if (dimIndex.has(d.name)) throw new NetcdfWriteError(`duplicate dimension ${d.name}`);
    if (d.size === 'unlimited') {
      if (recordDim >= 0) throw new NetcdfWriteError('at most one unlimited dimension');
      recordDim = i;
    } else if (!Number.isInteger(d.size) || d.size < 1 || d.size > 0x7fffffff) {
      throw new NetcdfWriteError(`dimension ${d.name}: size must be a positive integer (or 'unlimited')`);
    }
    dimIndex.set(d.name, i);
  });
  const dimNames = ds.dimensions.map((d) => Buffer.from(d.name, 'utf8'));

  const gatts = encodeAttributes(ds.globalAttributes, null);
  checkUnique('global attribute', Object.keys(ds.globalAttributes ?? {}));
  checkUnique(
    'variable',
    ds.variables.map((v) => v.name),
  );

  // --- variables
  const planned: PlannedVariable[] = ds.variables.map((v) => {
    checkName('variable', v.name);
    if (!(v.type in TYPE_CODE)) throw new NetcdfWriteError(`variable ${v.name}: unknown type ${String(v.type)}`);
    const dimIds = v.dimensions.map((name, k) => {
      const id = dimIndex.get(name);
      if (id === undefined) throw new NetcdfWriteError(`variable ${v.name}: unknown dimension ${name}`);
      if (id === recordDim && k !== 0)
        throw new NetcdfWriteError(`variable ${v.name}: the unlimited dimension must come first`);
      return id;
    });
    const isRecord = dimIds.length > 0 && dimIds[0] === recordDim;
    let elems = 1;
    for (const id of isRecord ? dimIds.slice(1) : dimIds) elems *= ds.dimensions[id].size as number;
    const strlen =
      v.type === 'char' && dimIds.length > 0 && dimIds[dimIds.length - 1] !== recordDim
        ? (ds.dimensions[dimIds[dimIds.length - 1]].size as number)
        : 1;
    const bytes = elems * TYPE_SIZE[v.type];
    const attrs = encodeAttributes(v.attributes, v);
    const fill = fillValueOf(v);
    let nrecs = 0;
    if (v.data !== null && v.data !== undefined) {
      // How many data units were given, and how many make one record (or the whole variable).
      let units: number;
      let perRecord: number;
      let exact = true;
      if (v.type === 'char' && typeof v.data === 'string') {
        units = Buffer.byteLength(v.data, 'utf8');
        perRecord = elems;
        exact = false;
      } else if (v.type === 'char') {
        units = (v.data as readonly (string | null)[]).length;
        perRecord = elems / strlen;
      } else {
        if (typeof v.data === 'string')
          throw new NetcdfWriteError(`variable ${v.name}: numeric variables take numbers, not a string`);
        units = (v.data as NcNumericData).length;
        perRecord = elems;
      }
      if (isRecord) {
        if (exact && units % perRecord !== 0) {
          throw new NetcdfWriteError(
            `variable ${v.name}: ${units} values are not a whole number of records of ${perRecord}`,
          );
        }
        nrecs = Math.ceil(units / perRecord);
      } else if (units > perRecord) {
        throw new NetcdfWriteError(`variable ${v.name}: ${units} values for ${perRecord} elements`);
      }
    }
    return {
      v,
      name: Buffer.from(v.name, 'utf8'),
      dimIds,
      attrs,
      isRecord,
      elems,
      bytes,
      vsize: pad4(bytes),
      begin: 0,
      fill,
      nrecs,
      strlen,
    };
  });

  const recordVars = planned.filter((p) => p.isRecord);
  const numrecs = recordVars.reduce((m, p) => Math.max(m, p.nrecs), 0);
  const singleRecordVar = recordVars.length === 1;

  // --- layout; the header size depends on the width of `begin`
  const layout = (offsetBytes: 4 | 8) => {
    let size = 8; // magic + numrecs
    size += ds.dimensions.length === 0 ? 8 : 8 + dimNames.reduce((s, b) => s + nameSize(b) + 4, 0);
    size += attListSize(gatts);
    size +=
      planned.length === 0
        ? 8
        : 8 +
          planned.reduce(
            (s, p) => s + nameSize(p.name) + 4 + 4 * p.dimIds.length + attListSize(p.attrs) + 8 + offsetBytes,
            0,
          );
    const headerSize = size;
    let offset = headerSize;
    const begins: number[] = new Array(planned.length).fill(0);
    planned.forEach((p, i) => {
      if (!p.isRecord) {
        begins[i] = offset;
        offset += p.vsize;
      }
    });
    const recStart = offset;
    let recSize = 0;
    planned.forEach((p, i) => {
      if (p.isRecord) {
        begins[i] = recStart + recSize;
        recSize += singleRecordVar ? p.bytes : p.vsize;
      }
    });
    const total = recStart + recSize * numrecs;
    const maxBegin = begins.reduce((m, b) => Math.max(m, b), 0);
    return { headerSize, begins, recStart, recSize, total, maxBegin };
  };

  let version: 1 | 2;
  let lay = layout(4);
  if (ds.format === '64bit-offset') version = 2;
  else if (lay.maxBegin <= 0x7fffffff) version = 1;
  else if (ds.format === 'classic')
    throw new NetcdfWriteError('data too large for the classic format; use 64bit-offset');
  else version = 2;
  if (version === 2) lay = layout(8);
  planned.forEach((p, i) => (p.begin = lay.begins[i]));

  const out = Buffer.alloc(lay.total);
  let pos = 0;
  const u32 = (n: number) => {
    out.writeUInt32BE(n >>> 0, pos);
    pos += 4;
  };
  const putName = (b: Buffer) => {
    u32(b.length);
    b.copy(out, pos);
    pos += pad4(b.length); // zero padding (buffer is zero-filled)
  };
  const putAttList = (list: EncodedAttribute[]) => {
    if (list.length === 0) {
      u32(0);
      u32(0);
      return;
    }
    u32(0x0c);
    u32(list.length);
    for (const a of list) {
      putName(a.name);
      u32(TYPE_CODE[a.type]);
      u32(a.nelems);
      a.values.copy(out, pos);
      pos += pad4(a.values.length);
    }
  };

  // --- header
  out.write('CDF', 0, 'latin1');
  out.writeUInt8(version, 3);
  pos = 4;
  u32(numrecs);
  if (ds.dimensions.length === 0) {
    u32(0);
    u32(0);
  } else {
    u32(0x0a);
    u32(ds.dimensions.length);
    ds.dimensions.forEach((d, i) => {
      putName(dimNames[i]);
      u32(d.size === 'unlimited' ? 0 : d.size);
    });
  }
  putAttList(gatts);
  if (planned.length === 0) {
    u32(0);
    u32(0);
  } else {
    u32(0x0b);
    u32(planned.length);
    for (const p of planned) {
      putName(p.name);
      u32(p.dimIds.length);
      for (const id of p.dimIds) u32(id);
      putAttList(p.attrs);
      u32(TYPE_CODE[p.v.type]);
      u32(p.vsize > 0xfffffffc ? 0xffffffff : p.vsize);
      if (version === 1) u32(p.begin);
      else {
        out.writeBigUInt64BE(BigInt(p.begin), pos);
        pos += 8;
      }
    }
  }
  if (pos !== lay.headerSize) throw new NetcdfWriteError(`internal: header size ${pos} != ${lay.headerSize}`);

  // --- data
  for (const p of planned) {
    if (!p.isRecord) {
      writeSlab(out, p, p.begin, 0, p.elems, p.vsize);
    } else {
      for (let r = 0; r < numrecs; r++) {
        const at = p.begin + r * lay.recSize;
        writeSlab(out, p, at, r * p.elems, p.elems, singleRecordVar ? p.bytes : p.vsize);
      }
    }
  }
  return out;
}

function checkUnique(kind: string, names: string[]): void {
  const seen = new Set<string>();
  for (const n of names) {
    if (seen.has(n)) throw new NetcdfWriteError(`duplicate ${kind} ${n}`);
    seen.add(n);
  }
}

/**
 * Write `count` elements of variable `p`, starting at element `first` of its data, at byte
 * `at`; then fill up to `span` bytes with the fill value.
 */
function writeSlab(out: Buffer, p: PlannedVariable, at: number, first: number, count: number, span: number): void {
  const { v } = p;
  const size = TYPE_SIZE[v.type];
  if (v.type === 'char') {
    writeChars(out, p, at, first, count);
    return; // char fill and padding are \0, already there
  }
  const data = v.data as NcNumericData | null | undefined;
  const fill = p.fill;
  const range = INT_RANGE[v.type];
  const n = span / size; // elements including padding (span is a whole number of elements)
  let o = at;
  for (let i = 0; i < n; i++, o += size) {
    let x: number | null | undefined = i < count && data && first + i < data.length ? data[first + i] : fill;
    if (x === null || x === undefined || Number.isNaN(x)) x = fill;
    if (range && (!Number.isInteger(x) || x < range[0] || x > range[1])) {
      throw new NetcdfWriteError(`variable ${v.name}: ${x} does not fit a ${v.type}`);
    }
    switch (v.type) {
      case 'double':
        out.writeDoubleBE(x, o);
        break;
      case 'float':
        out.writeFloatBE(x, o);
        break;
      case 'int':
        out.writeInt32BE(x, o);
        break;
      case 'short':
        out.writeInt16BE(x, o);
        break;
      case 'byte':
        out.writeInt8(x, o);
        break;
    }
  }
}

function writeChars(out: Buffer, p: PlannedVariable, at: number, firstElem: number, count: number): void {
  const d = p.v.data;
  if (d === null || d === undefined) return;
  if (typeof d === 'string') {
    const bytes = Buffer.from(d, 'utf8');
    const start = firstElem;
    const end = Math.min(bytes.length, firstElem + count);
    if (start < end) bytes.copy(out, at, start, end);
    return;
  }
  const strings = d as readonly (string | null)[];
  const strlen = p.strlen;
  const firstString = firstElem / strlen;
  const nStrings = count / strlen;
  for (let i = 0; i < nStrings; i++) {
    const s = strings[firstString + i];
    if (s === null || s === undefined) continue;
    const b = Buffer.from(s, 'utf8');
    if (b.length > strlen) throw new NetcdfWriteError(`variable ${p.v.name}: "${s}" is longer than ${strlen} bytes`);
    b.copy(out, at + i * strlen);
  }
}

/** Length in bytes of the longest string (at least 1), for sizing a char dimension. */
export function maxStringBytes(values: Iterable<string | null | undefined>): number {
  let m = 1;
  for (const s of values) if (s) m = Math.max(m, Buffer.byteLength(s, 'utf8'));
  return m;
}
