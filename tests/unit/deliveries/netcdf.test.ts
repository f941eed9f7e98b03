import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { NetCDFReader } from 'netcdfjs';
import { NC_FILL, NetcdfWriteError, writeNetcdf, type NcDataset } from '../../../server/services/deliveries/netcdf';
import { readWithPythonNetcdf4 } from './pyread';
import { rng } from './synthetic';

function general(seed: number): { ds: NcDataset; d: Float64Array; rec: number[] } {
  const r = rng(seed);
  const d = Float64Array.from({ length: 12 }, () => (r() - 0.5) * 10 ** Math.floor(r() * 20 - 10));
  const rec = Array.from({ length: 4 * 3 }, () => Math.round((r() - 0.5) * 60000));
  const ds: NcDataset = {
    dimensions: [
      { name: 'time', size: 'unlimited' },
      { name: 'x', size: 3 },
      { name: 'y', size: 4 },
      { name: 'strlen', size: 6 },
    ],
    globalAttributes: {
      title: 'general writer check — ünïcode',
      version: 3,
      doubles: [1.5, -2.25, 1e300],
      bytes: { type: 'byte', value: [1, -2, 127] },
      shorts: { type: 'short', value: [-32768, 32767] },
      ints: { type: 'int', value: [-2147483648, 2147483647] },
      floats: { type: 'float', value: [0.5, -1.25] },
    },
    variables: [
      {
        name: 'd',
        type: 'double',
        dimensions: ['x', 'y'],
        attributes: { units: 'm', _FillValue: -9999 },
        data: Array.from(d, (v, i) => (i === 5 ? null : v)),
      },
      { name: 'f', type: 'float', dimensions: ['x'], attributes: {}, data: [0.5, NaN, -3.75] },
      { name: 'i', type: 'int', dimensions: ['y'], attributes: { valid_min: -5 }, data: [1, -2, null, 2147483647] },
      { name: 's', type: 'short', dimensions: ['x'], data: [1, -32768, 7] }, // odd count: padded
      { name: 'b', type: 'byte', dimensions: ['x'], data: [-128, 0, 127] }, // padded by one byte
      { name: 'name', type: 'char', dimensions: ['y', 'strlen'], data: ['K-07', '12A', null, 'Ünï'] },
      { name: 'scalar', type: 'double', dimensions: [], attributes: { long_name: 'a scalar' }, data: [Math.PI] },
      { name: 'rec_s', type: 'short', dimensions: ['time', 'x'], data: rec },
      { name: 'rec_d', type: 'double', dimensions: ['time'], data: [1, 2, 3, 4] },
      { name: 'filled', type: 'double', dimensions: ['y'] },
    ],
  };
  return { ds, d, rec };
}

describe('NetCDF-3 classic writer', () => {
  it('writes a file that Debian python3-netcdf4 reads back: types, attributes, fill values, records', () => {
    const { ds, d, rec } = general(1);
    const py = readWithPythonNetcdf4(writeNetcdf(ds)); // read back with Debian python3-netcdf4
    expect(py.file_format).toBe('NETCDF3_CLASSIC');
    expect(py.dimensions).toEqual({
      time: { size: 4, unlimited: true },
      x: { size: 3, unlimited: false },
      y: { size: 4, unlimited: false },
      strlen: { size: 6, unlimited: false },
    });
    expect(py.attributes.title).toEqual({ dtype: 'str', value: 'general writer check — ünïcode' });
    expect(py.attributes.version).toEqual({ dtype: 'float64', value: 3 });
    expect(py.attributes.doubles).toEqual({ dtype: 'float64', value: [1.5, -2.25, 1e300] });
    expect(py.attributes.bytes).toEqual({ dtype: 'int8', value: [1, -2, 127] });
    expect(py.attributes.shorts).toEqual({ dtype: 'int16', value: [-32768, 32767] });
    expect(py.attributes.ints).toEqual({ dtype: 'int32', value: [-2147483648, 2147483647] });
    expect(py.attributes.floats).toEqual({ dtype: 'float32', value: [0.5, -1.25] });
    const v = py.variables;
    expect(v.d.dtype).toBe('float64');
    expect(v.d.attributes._FillValue).toEqual({ dtype: 'float64', value: -9999 });
    const expectedD = Array.from(d, (x, i) => (i === 5 ? null : x));
    expect((v.d.data as (number | null)[][]).flat()).toEqual(expectedD);
    expect(v.f).toMatchObject({ dtype: 'float32', data: [0.5, null, -3.75] }); // NaN written as the default fill: masked
    expect(v.i).toMatchObject({ dtype: 'int32', data: [1, -2, null, 2147483647] });
    expect(v.i.attributes.valid_min).toEqual({ dtype: 'int32', value: -5 }); // takes the variable's type
    expect(v.s).toMatchObject({ dtype: 'int16', data: [1, -32768, 7] });
    expect(v.b).toMatchObject({ dtype: 'int8', data: [-128, 0, 127] });
    expect(v.name.data).toEqual(['K-07', '12A', '', 'Ünï']);
    expect(v.scalar.data).toBe(Math.PI);
    expect((v.rec_s.data as number[][]).flat()).toEqual(rec);
    expect(v.rec_d.data).toEqual([1, 2, 3, 4]);
    expect(v.filled.data).toEqual([null, null, null, null]);
  });

  it('writes a file that netcdfjs reads back with the same values and attributes', () => {
    const { ds: ds0, d, rec } = general(2);
    // netcdfjs decodes char attributes byte by byte (Latin-1), so this check keeps to ASCII
    const ds = { ...ds0, globalAttributes: { ...ds0.globalAttributes, title: 'general writer check' } };
    const nc = new NetCDFReader(writeNetcdf(ds)); // read back with netcdfjs
    expect(nc.version).toBe('classic format');
    expect(nc.recordDimension.length).toBe(4);
    expect(nc.getAttribute('title')).toBe('general writer check');
    expect(nc.getDataVariable('d')).toEqual(Array.from(d, (x, i) => (i === 5 ? -9999 : x)));
    expect(nc.getDataVariable('rec_d')).toEqual([1, 2, 3, 4]);
    // netcdfjs returns one array per record, read by vsize: 3 shorts and the padding element,
    // which the specification has us fill with the variable's fill value
    const records = nc.getDataVariable('rec_s') as number[][];
    expect(records.flatMap((r) => r.slice(0, 3))).toEqual(rec);
    expect(records.map((r) => r[3])).toEqual([NC_FILL.short, NC_FILL.short, NC_FILL.short, NC_FILL.short]);
    expect(nc.getDataVariable('i')).toEqual([1, -2, NC_FILL.int, 2147483647]);
    const dv = nc.variables.find((x) => x.name === 'd');
    expect(
      (dv?.attributes as { name: string; value: unknown }[] | undefined)?.find((a) => a.name === 'units')?.value,
    ).toBe('m');
  });

  it('follows the specification special case: one record variable, records not padded', () => {
    const data = [1, -2, 3, -4, 5];
    const bytes = writeNetcdf({
      dimensions: [{ name: 't', size: 'unlimited' }],
      variables: [{ name: 'v', type: 'short', dimensions: ['t'], data }],
    });
    // header: magic 4 + numrecs 4; dim_list tag 4 + nelems 4 + name (4 + 4) + length 4 = 20;
    // gatt_list ABSENT 8; var_list tag 4 + nelems 4 + name 8 + ndims 4 + dimid 4 + ABSENT 8 +
    // nc_type 4 + vsize 4 + begin 4 = 44; total 80. Data: 5 shorts, 2 bytes each, no padding.
    expect(bytes.length).toBe(80 + 10);
    expect(readWithPythonNetcdf4(bytes).variables.v.data).toEqual(data); // read back with Debian python3-netcdf4
  });

  it('an empty dataset is magic, numrecs and three ABSENT lists (32 bytes)', () => {
    const bytes = writeNetcdf({ dimensions: [], variables: [] });
    expect(bytes.length).toBe(32);
    expect(bytes.subarray(0, 4).toString('latin1')).toBe('CDF\x01');
    expect(bytes.subarray(4).every((b) => b === 0)).toBe(true);
    expect(readWithPythonNetcdf4(bytes).variables).toEqual({}); // read back with Debian python3-netcdf4
  });

  it('writes the 64-bit offset format (CDF-2) when asked', () => {
    const { ds, d } = general(3);
    const bytes = writeNetcdf({ ...ds, format: '64bit-offset' });
    expect(bytes[3]).toBe(2);
    const py = readWithPythonNetcdf4(bytes); // read back with Debian python3-netcdf4
    expect(py.file_format).toBe('NETCDF3_64BIT_OFFSET');
    expect((py.variables.d.data as (number | null)[][]).flat()).toEqual(Array.from(d, (x, i) => (i === 5 ? null : x)));
    const nc = new NetCDFReader(bytes); // read back with netcdfjs
    expect(nc.version).toBe('64-bit offset format');
    expect(nc.getDataVariable('rec_d')).toEqual([1, 2, 3, 4]);
  });

  it('round-trips any float64 exactly (fast-check; read back with netcdfjs)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: true }), { minLength: 1, maxLength: 50 }), (values) => {
        const bytes = writeNetcdf({
          dimensions: [{ name: 'n', size: values.length }],
          variables: [{ name: 'v', type: 'double', dimensions: ['n'], data: values }],
        });
        const back = new NetCDFReader(bytes).getDataVariable('v') as number[];
        expect(back.length).toBe(values.length);
        back.forEach((b, i) => expect(Object.is(b, values[i])).toBe(true));
      }),
      { seed: 7, numRuns: 150 },
    );
  });

  it('refuses what the format cannot hold', () => {
    const ok = { name: 'x', size: 2 } as const;
    expect(() => writeNetcdf({ dimensions: [{ name: '1bad', size: 2 }], variables: [] })).toThrow(NetcdfWriteError);
    expect(() => writeNetcdf({ dimensions: [{ name: 'a/b', size: 2 }], variables: [] })).toThrow(
      /invalid dimension name/,
    );
    expect(() => writeNetcdf({ dimensions: [ok, { ...ok }], variables: [] })).toThrow(/duplicate dimension/);
    expect(() =>
      writeNetcdf({
        dimensions: [
          { name: 'a', size: 'unlimited' },
          { name: 'b', size: 'unlimited' },
        ],
        variables: [],
      }),
    ).toThrow(/one unlimited/);
    expect(() =>
      writeNetcdf({
        dimensions: [ok, { name: 't', size: 'unlimited' }],
        variables: [{ name: 'v', type: 'double', dimensions: ['x', 't'] }],
      }),
    ).toThrow(/must come first/);
    expect(() =>
      writeNetcdf({ dimensions: [ok], variables: [{ name: 'v', type: 'short', dimensions: ['x'], data: [1, 40000] }] }),
    ).toThrow(/does not fit/);
    expect(() =>
      writeNetcdf({ dimensions: [ok], variables: [{ name: 'v', type: 'int', dimensions: ['x'], data: [1.5, 2] }] }),
    ).toThrow(/does not fit/);
    expect(() =>
      writeNetcdf({ dimensions: [ok], variables: [{ name: 'v', type: 'double', dimensions: ['x'], data: [1, 2, 3] }] }),
    ).toThrow(/3 values for 2/);
    expect(() =>
      writeNetcdf({ dimensions: [ok], variables: [{ name: 'v', type: 'double', dimensions: ['y'] }] }),
    ).toThrow(/unknown dimension/);
    expect(() =>
      writeNetcdf({
        dimensions: [ok],
        variables: [
          { name: 'v', type: 'int', dimensions: ['x'], attributes: { _FillValue: { type: 'double', value: 1 } } },
        ],
      }),
    ).toThrow(/_FillValue/);
    expect(() =>
      writeNetcdf({ dimensions: [ok], variables: [{ name: 'v', type: 'char', dimensions: ['x'], data: ['abc'] }] }),
    ).toThrow(/longer than/);
  });
});
