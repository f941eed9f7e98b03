import { describe, expect, it } from 'vitest';
import { NetCDFReader } from 'netcdfjs';
import { tableToNetcdf } from '../../../server/services/deliveries/cf';
import { NC_FILL } from '../../../server/services/deliveries/netcdf';
import {
  ISOPYCNAL_FLAGS,
  columnIndex,
  parseFlags,
  type DeliveryTable,
} from '../../../server/services/deliveries/table';
import { readWithPythonNetcdf4, type PyDataset } from './pyread';
import { syntheticIsopycnalTable, syntheticPressureTable } from './synthetic';

function attr(py: PyDataset, variable: string | null, name: string): unknown {
  const attrs = variable === null ? py.attributes : py.variables[variable].attributes;
  return (attrs[name] as { value: unknown } | undefined)?.value;
}

/** Profile index and level index of every row, found from the file's own coordinates. */
function locate(table: DeliveryTable, py: PyDataset, levelVar: string, refVar: string | null): [number, number][] {
  const ids = py.variables.profile_id.data as string[];
  const levels = py.variables[levelVar].data as number[];
  const refData = refVar ? py.variables[refVar].data : null;
  const iS = columnIndex(table, 'station');
  const iC = columnIndex(table, 'cast');
  const iL = columnIndex(table, table.kind === 'isopycnal' ? 'sigma_level' : 'pressure');
  const iR = columnIndex(table, 'sigma_ref');
  return table.rows.map((row) => {
    const p = ids.indexOf(`${row[iS]}_${row[iC]}`);
    const l = levels.findIndex(
      (lv, k) => lv === row[iL] && (refData === null || (Array.isArray(refData) ? refData[k] : refData) === row[iR]),
    );
    expect(p).toBeGreaterThanOrEqual(0);
    expect(l).toBeGreaterThanOrEqual(0);
    return [p, l];
  });
}

function expectClose(got: unknown, want: number | null): void {
  if (want === null) expect(got).toBeNull();
  else {
    expect(typeof got).toBe('number');
    expect(Math.abs((got as number) - want)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(want)));
  }
}

describe('CF-1.10 NetCDF of delivery tables', () => {
  it('isopycnal table, one reference pressure: read back with Debian python3-netcdf4', () => {
    const table = syntheticIsopycnalTable({ seed: 21, casts: 9, levels: 25, tricky: true, extras: true });
    const py = readWithPythonNetcdf4(tableToNetcdf(table, { institution: 'Test institute' })); // read back with Debian python3-netcdf4
    expect(py.file_format).toBe('NETCDF3_CLASSIC');
    expect(attr(py, null, 'Conventions')).toBe('CF-1.10');
    expect(attr(py, null, 'featureType')).toBe('profile');
    expect(attr(py, null, 'institution')).toBe('Test institute');
    for (const g of [
      'title',
      'source',
      'history',
      'comment',
      'equation_of_state',
      'saar_source',
      'inversion_handling',
      'layer_set',
      'exported_by',
      'exported_at',
      'software_version',
    ]) {
      expect(typeof attr(py, null, g)).toBe('string');
    }
    // no global attribute named like the CF standard name; the choices are one documented text
    expect(attr(py, null, 'reference_pressure_dbar')).toBeUndefined();
    expect(attr(py, null, 'processing_choices')).toMatch(/reference pressure 0 dbar/);
    expect(attr(py, null, 'comment')).toMatch(/not for navigation or safety-of-life use/);
    expect(py.dimensions.profile.size).toBe(9);
    expect(py.dimensions.sigma_level.size).toBe(25);

    // coordinates and standard names
    expect(attr(py, 'profile_id', 'cf_role')).toBe('profile_id');
    expect(attr(py, 'latitude', 'standard_name')).toBe('latitude');
    expect(attr(py, 'latitude', 'units')).toBe('degrees_north');
    expect(attr(py, 'longitude', 'units')).toBe('degrees_east');
    expect(attr(py, 'time', 'units')).toBe('seconds since 1970-01-01T00:00:00Z');
    expect(attr(py, 'sigma_level', 'standard_name')).toBe('sea_water_sigma_theta');
    expect(attr(py, 'sigma_level', 'units')).toBe('kg m-3');
    expect(attr(py, 'sigma_level', 'positive')).toBe('down');
    expect(py.variables.sigma_level.dimensions).toEqual(['sigma_level']);
    expect(py.variables.sigma_ref.dimensions).toEqual([]); // scalar coordinate
    expect(attr(py, 'sigma_ref', 'standard_name')).toBe('reference_pressure');
    expect(py.variables.sigma_ref.data).toBe(0);
    expect(attr(py, 'pressure', 'standard_name')).toBe('sea_water_pressure_due_to_sea_water');
    expect(attr(py, 'pressure', 'units')).toBe('dbar');
    expect(attr(py, 'depth', 'standard_name')).toBe('depth');
    expect(attr(py, 'CT', 'standard_name')).toBe('sea_water_conservative_temperature');
    expect(attr(py, 'CT', 'units')).toBe('degree_Celsius');
    expect(attr(py, 'SA', 'standard_name')).toBe('sea_water_absolute_salinity');
    expect(attr(py, 'SA', 'units')).toBe('g kg-1');
    expect(attr(py, 'thickness', 'standard_name')).toBe('cell_thickness');
    expect(attr(py, 'CT', '_FillValue')).toBe(NC_FILL.double);
    expect(attr(py, 'CT', 'coordinates')).toBe('time latitude longitude sigma_ref');
    expect(py.variables.crossings.dtype).toBe('int32');
    expect(attr(py, 'flags', 'flag_meanings')).toBe('outcrop below_bottom multi_crossing in_inversion');
    expect(attr(py, 'flags', 'flag_masks')).toEqual([1, 2, 4, 8]);

    // values: equal to the table to 1e-12, empty cells masked
    const at = locate(table, py, 'sigma_level', 'sigma_ref');
    const v = py.variables;
    table.rows.forEach((row, r) => {
      const [p, l] = at[r];
      for (const name of ['pressure', 'depth', 'CT', 'SA', 'thickness', 'crossings', 'oxygen']) {
        expectClose((v[name].data as unknown[][])[p][l], row[columnIndex(table, name)] as number | null);
      }
      const bits = (v.flags.data as number[][])[p][l];
      const want = parseFlags(row[columnIndex(table, 'flags')] as string | null).reduce(
        (b, f) => b | (1 << ISOPYCNAL_FLAGS.indexOf(f)),
        0,
      );
      expect(bits).toBe(want);
      expect((v.note.data as string[][])[p][l]).toBe((row[columnIndex(table, 'note')] as string | null) ?? '');
      expectClose((v.latitude.data as number[])[p], row[columnIndex(table, 'latitude')] as number);
      expectClose((v.longitude.data as number[])[p], row[columnIndex(table, 'longitude')] as number);
      expectClose((v.time.data as number[])[p], Date.parse(row[columnIndex(table, 'time')] as string) / 1000);
      expect((v.station.data as string[])[p]).toBe(row[columnIndex(table, 'station')]);
      expect((v.cast.data as string[])[p]).toBe(row[columnIndex(table, 'cast')]);
    });
    // some cells really are empty, and they are masked
    expect((v.pressure.data as (number | null)[][]).flat().some((x) => x === null)).toBe(true);
  });

  it('isopycnal table with two reference pressures: sigma_ref along the level dimension', () => {
    const table = syntheticIsopycnalTable({ seed: 22, casts: 4, levels: 12, twoRefs: true });
    const py = readWithPythonNetcdf4(tableToNetcdf(table)); // read back with Debian python3-netcdf4
    expect(py.dimensions.level.size).toBe(12);
    expect(py.variables.sigma_ref.dimensions).toEqual(['level']);
    expect(new Set(py.variables.sigma_ref.data as number[])).toEqual(new Set([0, 2000]));
    expect(attr(py, 'CT', 'coordinates')).toBe('latitude longitude sigma_level sigma_ref');
    const at = locate(table, py, 'sigma_level', 'sigma_ref');
    table.rows.forEach((row, r) => {
      const [p, l] = at[r];
      expectClose((py.variables.SA.data as unknown[][])[p][l], row[columnIndex(table, 'SA')] as number | null);
    });
  });

  it('pressure table: (profile, pressure), sigma0 with its reference pressure', () => {
    const table = syntheticPressureTable({ seed: 23, casts: 5, bins: 40 });
    const py = readWithPythonNetcdf4(tableToNetcdf(table)); // read back with Debian python3-netcdf4
    expect(py.dimensions.pressure.size).toBe(40);
    expect(attr(py, 'pressure', 'axis')).toBe('Z');
    expect(attr(py, 'sigma0', 'standard_name')).toBe('sea_water_sigma_theta');
    expect(attr(py, 'sigma0', 'coordinates')).toBe('latitude longitude reference_pressure_0');
    expect(attr(py, 'reference_pressure_0', 'standard_name')).toBe('reference_pressure');
    expect(attr(py, 'SP', 'standard_name')).toBe('sea_water_practical_salinity');
    expect(attr(py, 't', 'standard_name')).toBe('sea_water_temperature');
    expect(py.variables.count.dtype).toBe('int32');
    const at = locate(table, py, 'pressure', null);
    table.rows.forEach((row, r) => {
      const [p, l] = at[r];
      for (const name of ['count', 'CT', 'SA', 'sigma0', 'depth', 't', 'SP']) {
        expectClose((py.variables[name].data as unknown[][])[p][l], row[columnIndex(table, name)] as number | null);
      }
    });
  });

  it('isopycnal table: read back with netcdfjs, fill values where the table is empty', () => {
    const table = syntheticIsopycnalTable({ seed: 24, casts: 6, levels: 20 });
    const nc = new NetCDFReader(tableToNetcdf(table)); // read back with netcdfjs
    expect(nc.getAttribute('Conventions')).toBe('CF-1.10');
    expect(nc.getAttribute('featureType')).toBe('profile');
    const levels = nc.getDataVariable('sigma_level') as number[];
    const lats = nc.getDataVariable('latitude') as number[];
    const ct = nc.getDataVariable('CT') as number[];
    const fill = (
      nc.variables.find((x) => x.name === 'CT')?.attributes as { name: string; value: unknown }[] | undefined
    )?.find((a) => a.name === '_FillValue')?.value;
    expect(fill).toBe(NC_FILL.double);
    const iLat = columnIndex(table, 'latitude');
    const iLev = columnIndex(table, 'sigma_level');
    const iCT = columnIndex(table, 'CT');
    // profiles are in order of first appearance, each cast's rows are consecutive in the synthetic table
    const nL = levels.length;
    table.rows.forEach((row, r) => {
      const p = Math.floor(r / nL);
      const l = levels.indexOf(row[iLev] as number);
      expect(lats[p]).toBe(row[iLat]);
      const want = row[iCT];
      expect(Math.abs(ct[p * nL + l] - (want === null ? NC_FILL.double : (want as number)))).toBeLessThanOrEqual(1e-12);
    });
  });

  it('refuses a table whose cast has two positions or a repeated level', () => {
    const table = syntheticIsopycnalTable({ seed: 25, casts: 2, levels: 3 });
    const moved = {
      ...table,
      rows: table.rows.map((r, i) => (i === 1 ? r.map((v, c) => (c === 2 ? (v as number) + 1 : v)) : r)),
    };
    expect(() => tableToNetcdf(moved)).toThrow(/more than one position/);
    const doubled = { ...table, rows: [...table.rows, table.rows[0]] };
    expect(() => tableToNetcdf(doubled)).toThrow(/twice/);
  });
});
