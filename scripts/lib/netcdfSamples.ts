// Invented netCDF CTD samples (CF-1.8 profiles) for parser tests, written with our own netCDF-3
// writer. The values come from the same smooth made-up profile as the text samples:
//   t = 4 + 16 exp(-p/300) °C, SP = 34.6 + exp(-p/250), O2 = 220 - 50 exp(-((p-600)/200)^2) µmol/kg.
// Never a science check: the files test reading (layouts, packing, fills, flags, units).
import { writeNetcdf, type NcVariable } from '../../server/services/deliveries/netcdf';

const tAt = (p: number): number => 4 + 16 * Math.exp(-p / 300);
const sAt = (p: number): number => 34.6 + Math.exp(-p / 250);
const oAt = (p: number): number => 220 - 50 * Math.exp(-(((p - 600) / 200) ** 2));

/** Three profiles on a (profile, level) grid: 120, 100 and 80 levels, the rest fill; T and S packed. */
function cfProfiles(): Buffer {
  const NP = 3;
  const NZ = 120;
  const counts = [120, 100, 80];
  const pres: (number | null)[] = [];
  const temp: (number | null)[] = [];
  const psal: (number | null)[] = [];
  const doxy: (number | null)[] = [];
  const chla: (number | null)[] = [];
  const tqc: number[] = [];
  for (let i = 0; i < NP; i++) {
    for (let k = 0; k < NZ; k++) {
      if (k >= counts[i]) {
        for (const a of [pres, temp, psal, doxy, chla]) a.push(null);
        tqc.push(9);
        continue;
      }
      const p = 2 + 2 * k + i; // profile i starts i dbar deeper
      pres.push(p);
      // packed: value = raw * scale_factor + add_offset
      temp.push(Math.round((tAt(p) - 10) / 0.001));
      psal.push(Math.round((sAt(p) - 30) / 0.0001));
      doxy.push(k === 5 ? null : oAt(p));
      chla.push(0.1 + 0.01 * k);
      tqc.push(i === 1 && k === 10 ? 3 : 1);
    }
  }
  const variables: NcVariable[] = [
    {
      name: 'station_name',
      type: 'char',
      dimensions: ['profile', 'name_strlen'],
      attributes: { cf_role: 'profile_id', long_name: 'station' },
      data: ['T-01', 'T-02', 'T-03'],
    },
    {
      name: 'time',
      type: 'double',
      dimensions: ['profile'],
      attributes: { standard_name: 'time', units: 'days since 1950-01-01T00:00:00Z' },
      data: [27821.25, 27821.5, 27821.75],
    },
    {
      name: 'lat',
      type: 'double',
      dimensions: ['profile'],
      attributes: { standard_name: 'latitude', units: 'degrees_north' },
      data: [-40.5, -40.75, -41],
    },
    {
      name: 'lon',
      type: 'double',
      dimensions: ['profile'],
      attributes: { standard_name: 'longitude', units: 'degrees_east' },
      data: [10.25, 10.5, 10.75],
    },
    {
      name: 'PRES',
      type: 'float',
      dimensions: ['profile', 'z'],
      attributes: { standard_name: 'sea_water_pressure', units: 'dbar', _FillValue: { type: 'float', value: -9999 } },
      data: pres,
    },
    {
      name: 'TEMP',
      type: 'short',
      dimensions: ['profile', 'z'],
      attributes: {
        standard_name: 'sea_water_temperature',
        units: 'degree_Celsius',
        scale_factor: { type: 'float', value: 0.001 },
        add_offset: { type: 'float', value: 10 },
        _FillValue: { type: 'short', value: -32767 },
        ancillary_variables: 'TEMP_QC',
      },
      data: temp,
    },
    {
      name: 'TEMP_QC',
      type: 'byte',
      dimensions: ['profile', 'z'],
      attributes: {
        standard_name: 'sea_water_temperature status_flag',
        flag_values: { type: 'byte', value: [1, 2, 3, 4, 9] },
        flag_meanings: 'good probably_good questionable bad missing',
      },
      data: tqc,
    },
    {
      name: 'PSAL',
      type: 'int',
      dimensions: ['profile', 'z'],
      attributes: {
        standard_name: 'sea_water_practical_salinity',
        units: '1',
        scale_factor: 0.0001,
        add_offset: 30,
        _FillValue: { type: 'int', value: -2147483647 },
      },
      data: psal,
    },
    {
      name: 'DOXY',
      type: 'double',
      dimensions: ['profile', 'z'],
      attributes: { standard_name: 'moles_of_oxygen_per_unit_mass_in_sea_water', units: 'umol kg-1', _FillValue: -999 },
      data: doxy,
    },
    {
      name: 'CHLA',
      type: 'float',
      dimensions: ['profile', 'z'],
      attributes: { standard_name: 'mass_concentration_of_chlorophyll_a_in_sea_water', units: 'mg m-3' },
      data: chla,
    },
  ];
  return writeNetcdf({
    dimensions: [
      { name: 'profile', size: NP },
      { name: 'z', size: NZ },
      { name: 'name_strlen', size: 8 },
    ],
    globalAttributes: {
      Conventions: 'CF-1.8',
      featureType: 'profile',
      title: 'Invented profiles for parser tests (Sigmaline)',
    },
    variables,
  });
}

/** Two profiles as a contiguous ragged array; conductivity in S m-1 and oxygen in ml l-1. */
function cfRagged(): Buffer {
  const counts = [60, 40];
  const p: number[] = [];
  const t: number[] = [];
  const c: number[] = [];
  const o: number[] = [];
  counts.forEach((n) => {
    for (let k = 0; k < n; k++) {
      const pp = 4 + 5 * k;
      p.push(pp);
      t.push(tAt(pp));
      c.push(3.0 + 0.09 * tAt(pp)); // invented S/m, monotone in t: parser test only
      o.push(oAt(pp) / 44.661); // ml/l
    }
  });
  return writeNetcdf({
    dimensions: [
      { name: 'profile', size: 2 },
      { name: 'obs', size: p.length },
      { name: 'strlen', size: 6 },
    ],
    globalAttributes: { Conventions: 'CF-1.8', featureType: 'profile' },
    variables: [
      {
        name: 'profile',
        type: 'char',
        dimensions: ['profile', 'strlen'],
        attributes: { cf_role: 'profile_id' },
        data: ['R-1', 'R-2'],
      },
      { name: 'row_size', type: 'int', dimensions: ['profile'], attributes: { sample_dimension: 'obs' }, data: counts },
      {
        name: 'time',
        type: 'double',
        dimensions: ['profile'],
        attributes: { standard_name: 'time', units: 'seconds since 2026-03-01 00:00:00' },
        data: [3600, 7200],
      },
      {
        name: 'latitude',
        type: 'float',
        dimensions: ['profile'],
        attributes: { standard_name: 'latitude', units: 'degrees_north' },
        data: [12.5, 12.75],
      },
      {
        name: 'longitude',
        type: 'float',
        dimensions: ['profile'],
        attributes: { standard_name: 'longitude', units: 'degrees_east' },
        data: [300, 300.5],
      },
      {
        name: 'pressure',
        type: 'double',
        dimensions: ['obs'],
        attributes: { standard_name: 'sea_water_pressure', units: 'decibar' },
        data: p,
      },
      {
        name: 'temperature',
        type: 'double',
        dimensions: ['obs'],
        attributes: { standard_name: 'sea_water_temperature', units: 'degrees_C' },
        data: t,
      },
      {
        name: 'conductivity',
        type: 'double',
        dimensions: ['obs'],
        attributes: { standard_name: 'sea_water_electrical_conductivity', units: 'S m-1' },
        data: c,
      },
      {
        name: 'oxygen',
        type: 'double',
        dimensions: ['obs'],
        attributes: { standard_name: 'volume_fraction_of_oxygen_in_sea_water', units: 'ml l-1' },
        data: o,
      },
    ],
  });
}

/** One profile on depth (positive down), scalar position and time. */
function cfSingleDepth(): Buffer {
  const d = Array.from({ length: 50 }, (_, k) => 1 + 2 * k);
  return writeNetcdf({
    dimensions: [{ name: 'depth', size: d.length }],
    globalAttributes: { Conventions: 'CF-1.6', featureType: 'profile', station: 'D-5' },
    variables: [
      { name: 'station', type: 'int', dimensions: [], data: [5] },
      {
        name: 'time',
        type: 'int',
        dimensions: [],
        attributes: { standard_name: 'time', units: 'hours since 2026-03-02T00:00:00Z' },
        data: [30],
      },
      {
        name: 'latitude',
        type: 'double',
        dimensions: [],
        attributes: { standard_name: 'latitude', units: 'degrees_north' },
        data: [55.5],
      },
      {
        name: 'longitude',
        type: 'double',
        dimensions: [],
        attributes: { standard_name: 'longitude', units: 'degrees_east' },
        data: [-12.25],
      },
      {
        name: 'depth',
        type: 'double',
        dimensions: ['depth'],
        attributes: { standard_name: 'depth', positive: 'down', units: 'm' },
        data: d,
      },
      {
        name: 't',
        type: 'double',
        dimensions: ['depth'],
        attributes: { standard_name: 'sea_water_temperature', units: 'degree_Celsius' },
        data: d.map(tAt),
      },
      {
        name: 's',
        type: 'double',
        dimensions: ['depth'],
        attributes: { standard_name: 'sea_water_practical_salinity', units: '1' },
        data: d.map(sAt),
      },
    ],
  });
}

export function netcdfSamples(): Record<string, Buffer> {
  return { 'cf-profiles.nc': cfProfiles(), 'cf-ragged.nc': cfRagged(), 'cf-single-depth.nc': cfSingleDepth() };
}
