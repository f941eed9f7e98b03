// Delivery tables as NetCDF with CF-1.10 metadata.
//
// Layout: a CF discrete-sampling-geometry collection of profiles in the orthogonal
// multidimensional representation (CF-1.10 chapter 9): every cast is a `profile`, every target
// level of the table a level shared by all profiles.
//
//   isopycnal table, one reference pressure: dims (profile, sigma_level); coordinate variable
//     sigma_level(sigma_level) [sea_water_sigma_theta] and a scalar coordinate sigma_ref
//     [reference_pressure], as the CF definition of sea_water_sigma_theta asks.
//   isopycnal table, several reference pressures (e.g. σ0 above 1000 dbar, σ2 below): dims
//     (profile, level); sigma_level(level) and sigma_ref(level) as auxiliary coordinates.
//   pressure table: dims (profile, pressure); coordinate variable pressure(pressure).
//
// Per profile: profile_id (cf_role = profile_id), station, cast, latitude, longitude and, when the
// table has a `time` column (ISO 8601 text), time in seconds since 1970-01-01. Every other column
// becomes a variable (profile, level) with units, long_name, standard_name where CF has one and
// _FillValue for levels without a value. `flags` becomes a byte bit field with flag_masks /
// flag_meanings. Sea pressure (absolute pressure minus one standard atmosphere, the TEOS-10 `p`)
// is `sea_water_pressure_due_to_sea_water`: CF's `sea_water_pressure` includes the atmosphere.
import {
  NC_FILL,
  maxStringBytes,
  writeNetcdf,
  type NcAttributes,
  type NcDataset,
  type NcDimension,
  type NcVariable,
} from './netcdf';
import { ISOPYCNAL_FLAGS, columnIndex, parseFlags, type DeliveryColumn, type DeliveryTable } from './table';
import { DATA_CAUTION, provenanceAttributes } from './provenance';
import { FLAG_MEANING_WORDS, WOCE_FLAGS } from '../../../shared/api/flags';
import { VARIABLES } from '../../../shared/api/variables';

export const CF_CONVENTIONS = 'CF-1.10';

/**
 * CF standard names for the columns we write, checked against the CF standard name table from
 * memory (tests/unit/deliveries/cf-names.test.ts lists them with their canonical units).
 */
export const CF_STANDARD_NAMES: Readonly<Record<string, string>> = Object.freeze({
  ...Object.fromEntries(VARIABLES.filter((v) => v.standardName).map((v) => [v.name, v.standardName as string])),
  latitude: 'latitude',
  longitude: 'longitude',
  time: 'time',
  pressure: 'sea_water_pressure_due_to_sea_water',
  depth: 'depth',
  CT: 'sea_water_conservative_temperature',
  SA: 'sea_water_absolute_salinity',
  SP: 'sea_water_practical_salinity',
  t: 'sea_water_temperature',
  oxygen: 'moles_of_oxygen_per_unit_mass_in_sea_water',
  conductivity: 'sea_water_electrical_conductivity',
  bottom_depth: 'sea_floor_depth_below_sea_surface',
  pt0: 'sea_water_potential_temperature',
  rho: 'sea_water_density',
  thickness: 'cell_thickness',
  sigma_level: 'sea_water_sigma_theta',
  sigma_ref: 'reference_pressure',
  sigma0: 'sea_water_sigma_theta',
  sigma1: 'sea_water_sigma_theta',
  sigma2: 'sea_water_sigma_theta',
  sigma3: 'sea_water_sigma_theta',
  sigma4: 'sea_water_sigma_theta',
});

/** Our unit spellings to UDUNITS strings, as CF asks. */
export function cfUnits(unit: string | null): string | null {
  if (unit === null) return null;
  const u = unit.trim();
  if (/^(deg ?C|°C|degC|ITS-90 degC|degree_?C(elsius)?|degrees_?C(elsius)?)$/i.test(u)) return 'degree_Celsius';
  if (/^g ?\/ ?kg$|^g kg-1$/i.test(u)) return 'g kg-1';
  if (/^kg ?\/ ?m(3|\^3|³)$|^kg m-3$/i.test(u)) return 'kg m-3';
  if (/^(PSS-78|psu)$/i.test(u)) return '1';
  if (/^(umol|µmol|μmol) ?\/ ?kg$/i.test(u)) return 'umol kg-1';
  if (/^mS ?\/ ?cm$/i.test(u)) return 'mS cm-1';
  if (/^S ?\/ ?m$/i.test(u)) return 'S m-1';
  if (/^ISO 8601/.test(u)) return null;
  return u;
}

export interface CfOptions {
  title?: string;
  institution?: string;
  /** Earlier history lines (newest last); this export's line is appended. */
  history?: string;
  references?: string;
  comment?: string;
  /** Extra global attributes (override the defaults). */
  globalAttributes?: NcAttributes;
}

const PROFILE_COLUMNS = new Set(['station', 'cast', 'latitude', 'longitude', 'time', 'cruise', 'line', 'bottom_depth']);
/** WOCE CTD flag values and meanings (flag_values / flag_meanings of every *_flag variable), shared/api/flags.ts. */
export const WOCE_FLAG_VALUES: readonly number[] = WOCE_FLAGS;
export const WOCE_FLAG_MEANINGS = WOCE_FLAGS.map((f) => FLAG_MEANING_WORDS[f]).join(' ');
const FLAG_FILL = -127;
const INTEGER_COLUMNS = new Set(['crossings', 'count']);
const SIGMA_REF_COLUMN = /^sigma([0-4])$/;

function requireColumn(table: DeliveryTable, name: string): number {
  const i = columnIndex(table, name);
  if (i < 0) throw new Error(`tableToNetcdf: the ${table.kind} table has no "${name}" column`);
  return i;
}

function num(v: unknown): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

function parseTime(v: unknown, unit: string | null): number | null {
  if (v === null || v === undefined || v === '') return null;
  if (typeof v === 'number') {
    if (unit && /since 1970-01-01/.test(unit) && /^seconds?/.test(unit)) return v;
    throw new Error('tableToNetcdf: a numeric time column needs the unit "seconds since 1970-01-01T00:00:00Z"');
  }
  const ms = Date.parse(String(v));
  if (Number.isNaN(ms)) throw new Error(`tableToNetcdf: cannot read time "${String(v)}"`);
  return ms / 1000;
}

function variableAttributes(col: DeliveryColumn): NcAttributes {
  const attrs: NcAttributes = {};
  attrs.long_name = col.long_name ?? col.name;
  const sn = col.standard_name ?? CF_STANDARD_NAMES[col.name];
  if (sn) attrs.standard_name = sn;
  const u = cfUnits(col.unit);
  if (u) attrs.units = u;
  else if (col.type === 'number' && (sn === 'sea_water_practical_salinity' || INTEGER_COLUMNS.has(col.name)))
    attrs.units = '1';
  return attrs;
}

/** Map a delivery table to a CF-1.10 NetCDF dataset description (see the file header). */
export function tableToNetcdfDataset(table: DeliveryTable, options: CfOptions = {}): NcDataset {
  const iStation = requireColumn(table, 'station');
  const iCast = requireColumn(table, 'cast');
  const iLat = requireColumn(table, 'latitude');
  const iLon = requireColumn(table, 'longitude');
  const iTime = columnIndex(table, 'time');
  const isopycnal = table.kind === 'isopycnal';
  const iRef = isopycnal ? requireColumn(table, 'sigma_ref') : -1;
  const iLevel = isopycnal ? requireColumn(table, 'sigma_level') : requireColumn(table, 'pressure');

  // --- profiles in order of first appearance
  const profileIndex = new Map<string, number>();
  const iBottom = columnIndex(table, 'bottom_depth');
  const profiles: {
    station: string;
    cast: string;
    lat: number;
    lon: number;
    time: number | null;
    bottom: number | null;
  }[] = [];
  const rowProfile = new Int32Array(table.rows.length);
  table.rows.forEach((row, r) => {
    const station = String(row[iStation] ?? '');
    const cast = String(row[iCast] ?? '');
    const key = `${station}\u0000${cast}`;
    let p = profileIndex.get(key);
    const lat = num(row[iLat]);
    const lon = num(row[iLon]);
    if (lat === null || lon === null)
      throw new Error(`tableToNetcdf: row ${r} (station ${station}, cast ${cast}) has no position`);
    const time = iTime >= 0 ? parseTime(row[iTime], table.columns[iTime].unit) : null;
    if (p === undefined) {
      p = profiles.length;
      profileIndex.set(key, p);
      profiles.push({ station, cast, lat, lon, time, bottom: iBottom >= 0 ? num(row[iBottom]) : null });
    } else {
      const q = profiles[p];
      if (q.lat !== lat || q.lon !== lon)
        throw new Error(`tableToNetcdf: station ${station} cast ${cast} has more than one position`);
      if (q.time === null) q.time = time;
      else if (time !== null && time !== q.time)
        throw new Error(`tableToNetcdf: station ${station} cast ${cast} has more than one time`);
    }
    rowProfile[r] = p;
  });
  if (profiles.length === 0) throw new Error('tableToNetcdf: the table has no rows');

  // --- levels, sorted (reference pressure, then level)
  const levelKeys = new Map<string, { ref: number | null; level: number }>();
  const rowLevelKey: string[] = new Array(table.rows.length);
  table.rows.forEach((row, r) => {
    const level = num(row[iLevel]);
    const ref = isopycnal ? num(row[iRef]) : null;
    if (level === null || (isopycnal && ref === null)) throw new Error(`tableToNetcdf: row ${r} has no target level`);
    const key = `${ref}|${level}`;
    if (!levelKeys.has(key)) levelKeys.set(key, { ref, level });
    rowLevelKey[r] = key;
  });
  const levels = [...levelKeys.entries()].sort((a, b) => (a[1].ref ?? 0) - (b[1].ref ?? 0) || a[1].level - b[1].level);
  const levelIndex = new Map(levels.map(([k], i) => [k, i]));
  const refs = new Set(levels.map(([, l]) => l.ref));
  const singleRef = isopycnal && refs.size === 1;
  const nP = profiles.length;
  const nL = levels.length;

  // --- cell index of every row; each (profile, level) at most once
  const cellOfRow = new Int32Array(table.rows.length);
  const taken = new Uint8Array(nP * nL);
  table.rows.forEach((_, r) => {
    const cell = rowProfile[r] * nL + (levelIndex.get(rowLevelKey[r]) as number);
    if (taken[cell]) {
      const p = profiles[rowProfile[r]];
      throw new Error(`tableToNetcdf: station ${p.station} cast ${p.cast} has the level ${rowLevelKey[r]} twice`);
    }
    taken[cell] = 1;
    cellOfRow[r] = cell;
  });

  const levelDim = isopycnal ? (singleRef ? 'sigma_level' : 'level') : 'pressure';
  const dims: NcDimension[] = [
    { name: 'profile', size: nP },
    { name: levelDim, size: nL },
  ];
  const vars: NcVariable[] = [];
  const dimNames = new Set(dims.map((d) => d.name));
  const addStrlen = (name: string, n: number): string => {
    const d = `${name}_strlen`;
    if (!dimNames.has(d)) {
      dims.push({ name: d, size: n });
      dimNames.add(d);
    }
    return d;
  };

  // --- profile variables
  const idStrings = profiles.map((p) => `${p.station}_${p.cast}`);
  vars.push({
    name: 'profile_id',
    type: 'char',
    dimensions: ['profile', addStrlen('profile_id', maxStringBytes(idStrings))],
    attributes: { long_name: 'Cast identifier (station_cast)', cf_role: 'profile_id' },
    data: idStrings,
  });
  for (const key of ['station', 'cast'] as const) {
    const values = profiles.map((p) => p[key]);
    vars.push({
      name: key,
      type: 'char',
      dimensions: ['profile', addStrlen(key, maxStringBytes(values))],
      attributes: { long_name: key === 'station' ? 'Station identifier' : 'Cast identifier' },
      data: values,
    });
  }
  const auxProfile: string[] = [];
  if (iTime >= 0) {
    vars.push({
      name: 'time',
      type: 'double',
      dimensions: ['profile'],
      attributes: {
        standard_name: 'time',
        long_name: 'Time of the cast',
        units: 'seconds since 1970-01-01T00:00:00Z',
        calendar: 'standard',
        axis: 'T',
        _FillValue: NC_FILL.double,
      },
      data: profiles.map((p) => p.time),
    });
    auxProfile.push('time');
  }
  vars.push({
    name: 'latitude',
    type: 'double',
    dimensions: ['profile'],
    attributes: { standard_name: 'latitude', long_name: 'Latitude of the cast', units: 'degrees_north', axis: 'Y' },
    data: profiles.map((p) => p.lat),
  });
  vars.push({
    name: 'longitude',
    type: 'double',
    dimensions: ['profile'],
    attributes: { standard_name: 'longitude', long_name: 'Longitude of the cast', units: 'degrees_east', axis: 'X' },
    data: profiles.map((p) => p.lon),
  });
  auxProfile.push('latitude', 'longitude');
  if (iBottom >= 0) {
    vars.push({
      name: 'bottom_depth',
      type: 'double',
      dimensions: ['profile'],
      attributes: {
        standard_name: 'sea_floor_depth_below_sea_surface',
        long_name: 'Depth of the sea floor at the cast',
        units: 'm',
        positive: 'down',
        _FillValue: NC_FILL.double,
      },
      data: profiles.map((p) => p.bottom),
    });
  }

  // --- vertical coordinate(s)
  const auxLevel: string[] = [];
  if (isopycnal) {
    const col = table.columns[iLevel];
    vars.push({
      name: 'sigma_level',
      type: 'double',
      dimensions: [levelDim],
      attributes: {
        ...variableAttributes(col),
        standard_name: 'sea_water_sigma_theta',
        units: 'kg m-3',
        axis: 'Z',
        positive: 'down',
        comment: singleRef
          ? `Potential density anomaly (TEOS-10, from SA and CT) referenced to ${levels[0][1].ref} dbar; the reference pressure is the ` +
            'scalar coordinate sigma_ref (standard_name reference_pressure), as the CF definition of sea_water_sigma_theta asks.'
          : 'Potential density anomaly (TEOS-10, from SA and CT); the reference pressure of each level is sigma_ref(level) ' +
            '(standard_name reference_pressure).',
      },
      data: levels.map(([, l]) => l.level),
    });
    const refCol = table.columns[iRef];
    vars.push({
      name: 'sigma_ref',
      type: 'double',
      dimensions: singleRef ? [] : [levelDim],
      attributes: { ...variableAttributes(refCol), standard_name: 'reference_pressure', units: 'dbar' },
      data: singleRef ? [levels[0][1].ref as number] : levels.map(([, l]) => l.ref as number),
    });
    if (!singleRef) auxLevel.push('sigma_level');
    auxLevel.push('sigma_ref');
  } else {
    const col = table.columns[iLevel];
    vars.push({
      name: 'pressure',
      type: 'double',
      dimensions: [levelDim],
      attributes: { ...variableAttributes(col), units: 'dbar', axis: 'Z', positive: 'down' },
      data: levels.map(([, l]) => l.level),
    });
  }

  // --- data variables
  const skip = new Set<number>([iStation, iCast, iLat, iLon, iLevel]);
  if (iTime >= 0) skip.add(iTime);
  if (iRef >= 0) skip.add(iRef);
  const scalarRefs = new Map<number, string>();
  const names = new Set(table.columns.map((c) => c.name));
  const flagOf = (name: string): string | null =>
    name.endsWith('_flag') && names.has(name.slice(0, -5)) ? name.slice(0, -5) : null;
  table.columns.forEach((col, c) => {
    if (skip.has(c) || PROFILE_COLUMNS.has(col.name)) return;
    const of = flagOf(col.name);
    if (of) {
      const data = new Int8Array(nP * nL).fill(FLAG_FILL);
      table.rows.forEach((row, r) => {
        const v = num(row[c]);
        if (v !== null) data[cellOfRow[r]] = v;
      });
      const ofCol = table.columns[columnIndex(table, of)];
      const sn = ofCol.standard_name ?? CF_STANDARD_NAMES[of];
      vars.push({
        name: col.name,
        type: 'byte',
        dimensions: ['profile', levelDim],
        attributes: {
          long_name: `WOCE quality flag of ${of}`,
          ...(sn ? { standard_name: `${sn} status_flag` } : {}),
          _FillValue: { type: 'byte', value: [FLAG_FILL] },
          valid_range: { type: 'byte', value: [1, 9] },
          flag_values: { type: 'byte', value: [...WOCE_FLAG_VALUES] },
          flag_meanings: WOCE_FLAG_MEANINGS,
          coordinates: [...auxProfile, ...auxLevel].join(' '),
        },
        data,
      });
      return;
    }
    const attrs = variableAttributes(col);
    const coordinates = [...auxProfile, ...auxLevel];
    if (col.name === 'flags') {
      const data = new Int8Array(nP * nL);
      table.rows.forEach((row, r) => {
        const cell = row[c];
        let bits = 0;
        for (const f of parseFlags(typeof cell === 'string' ? cell : null)) bits |= 1 << ISOPYCNAL_FLAGS.indexOf(f);
        data[cellOfRow[r]] = bits;
      });
      vars.push({
        name: 'flags',
        type: 'byte',
        dimensions: ['profile', levelDim],
        attributes: {
          long_name: 'Level flags',
          flag_masks: { type: 'byte', value: ISOPYCNAL_FLAGS.map((_, i) => 1 << i) },
          flag_meanings: ISOPYCNAL_FLAGS.join(' '),
          coordinates: coordinates.join(' '),
        },
        data,
      });
      return;
    }
    if (col.type === 'string') {
      const values: (string | null)[] = new Array(nP * nL).fill(null);
      table.rows.forEach((row, r) => {
        const v = row[c];
        values[cellOfRow[r]] = v === null ? null : String(v);
      });
      vars.push({
        name: col.name,
        type: 'char',
        dimensions: ['profile', levelDim, addStrlen(col.name, maxStringBytes(values))],
        attributes: { ...attrs, coordinates: coordinates.join(' ') },
        data: values,
      });
      return;
    }
    const m = SIGMA_REF_COLUMN.exec(col.name);
    if (m) {
      const pr = Number(m[1]) * 1000;
      let refName = scalarRefs.get(pr);
      if (!refName) {
        refName = `reference_pressure_${pr}`;
        scalarRefs.set(pr, refName);
        vars.push({
          name: refName,
          type: 'double',
          dimensions: [],
          attributes: {
            standard_name: 'reference_pressure',
            long_name: `Reference pressure of ${col.name}`,
            units: 'dbar',
          },
          data: [pr],
        });
      }
      coordinates.push(refName);
    }
    const values = new Float64Array(nP * nL).fill(NaN);
    let allInt = INTEGER_COLUMNS.has(col.name);
    table.rows.forEach((row, r) => {
      const v = num(row[c]);
      if (v !== null) {
        values[cellOfRow[r]] = v;
        if (allInt && !(Number.isInteger(v) && Math.abs(v) < 2147483647)) allInt = false;
      }
    });
    vars.push({
      name: col.name,
      type: allInt ? 'int' : 'double',
      dimensions: ['profile', levelDim],
      attributes: {
        ...attrs,
        _FillValue: allInt ? NC_FILL.int : NC_FILL.double,
        coordinates: coordinates.join(' '),
        ...(names.has(`${col.name}_flag`) ? { ancillary_variables: `${col.name}_flag` } : {}),
      },
      data: values,
    });
  });

  // --- global attributes
  const p = table.provenance;
  const what = isopycnal ? 'properties on target isopycnals' : 'pressure-binned profiles';
  const historyLine = `${p.exportedAt} ${p.software} ${p.version}: ${table.kind} table exported by ${p.exportedBy}`;
  const globals: NcAttributes = {
    Conventions: CF_CONVENTIONS,
    featureType: 'profile',
    title: options.title ?? `${p.cruise.name}: ${what}`,
    institution: options.institution ?? 'not stated',
    source: `CTD casts, ${p.cruise.ship}; processed with ${p.software} ${p.version} (${p.equationOfState})`,
    history: options.history ? `${options.history}\n${historyLine}` : historyLine,
    comment: options.comment ? `${options.comment}\n${DATA_CAUTION}` : DATA_CAUTION,
    ...(options.references ? { references: options.references } : {}),
    table_kind: table.kind,
    cruise: p.expocode ?? p.cruise.name,
    ...(p.line ? { line: p.line } : {}),
    ...(p.expocode ? { expocode: p.expocode } : {}),
    ...provenanceAttributes(p),
    ...(options.globalAttributes ?? {}),
  };
  return { dimensions: dims, globalAttributes: globals, variables: vars };
}

/** A delivery table as NetCDF-3 classic bytes with CF-1.10 metadata. */
export function tableToNetcdf(table: DeliveryTable, options: CfOptions = {}): Buffer {
  return writeNetcdf(tableToNetcdfDataset(table, options));
}
