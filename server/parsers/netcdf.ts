// netCDF CTD profiles: the data office's WOCE netCDF CTD files (one cast per file) and CF-1.x
// profile files (featureType = profile; one profile, several profiles on a (profile, level) grid,
// or a contiguous ragged array). Variables are found by their CF `standard_name`, by the WOCE
// parameter name (`WHPO_Variable_Name`), or by their own name; `_FillValue`/`missing_value`,
// `valid_min`/`valid_max`/`valid_range` and `scale_factor`/`add_offset` are applied; quality flags
// come from `ancillary_variables`, `OBS_QC_VARIABLE` or a `<name>_QC` variable.
//
// Each profile becomes a table of fields handed to the same cast builder as the text formats, so
// units, ranges, flags and the downcast are decided in one place. Problems are reported by level
// (a 1-based index along the profile) and variable, since a binary file has no lines.
import type { FileError, ParsedCast } from '../../shared/schemas/cast';
import { buildCast } from './build';
import { roleOfName, extraKey } from './columns';
import { parseLatitude, parseLongitude, parseTime } from './metadata';
import { attrNumber, attrNumbers, attrText, openNetcdf, type NcFile, type NcVar } from './ncfile';
import { fileError, ParseFailure } from './text';

type Role = 'pressure' | 'depth' | 'temperature' | 'salinity' | 'conductivity' | 'oxygen';

/** CF standard names (CF Standard Name Table) of the roles a cast needs. */
const STANDARD_ROLES: Record<string, Role> = {
  sea_water_pressure: 'pressure',
  sea_water_pressure_due_to_sea_water: 'pressure',
  depth: 'depth',
  sea_water_temperature: 'temperature',
  sea_water_practical_salinity: 'salinity',
  sea_water_salinity: 'salinity',
  sea_water_electrical_conductivity: 'conductivity',
  moles_of_oxygen_per_unit_mass_in_sea_water: 'oxygen',
  mole_concentration_of_dissolved_molecular_oxygen_in_sea_water: 'oxygen',
  volume_fraction_of_oxygen_in_sea_water: 'oxygen',
};
/** Optional variables known by standard name, kept under a tidy key. */
const STANDARD_EXTRAS: Record<string, string> = {
  mass_concentration_of_chlorophyll_in_sea_water: 'fluorescence',
  mass_concentration_of_chlorophyll_a_in_sea_water: 'fluorescence',
  sea_water_turbidity: 'turbidity',
  downwelling_photosynthetic_photon_flux_in_sea_water: 'par',
  volume_beam_attenuation_coefficient_of_radiative_flux_in_sea_water: 'beam_attenuation',
};
/** WOCE parameter names (the exchange format's) of the roles. */
const WOCE_ROLES: Record<string, Role> = {
  CTDPRS: 'pressure',
  CTDTMP: 'temperature',
  CTDSAL: 'salinity',
  CTDOXY: 'oxygen',
  CTDCOND: 'conductivity',
};

const COORD_NAMES = new Set([
  'latitude',
  'longitude',
  'lat',
  'lon',
  'time',
  'station',
  'cast',
  'woce_date',
  'woce_time',
  'profile',
  'row_size',
]);

function roleOf(v: NcVar): Role | null {
  const sn = attrText(v.attrs.standard_name);
  if (sn && STANDARD_ROLES[sn]) {
    // CF's "depth" is also used for heights; only a downward depth is a vertical coordinate here.
    if (STANDARD_ROLES[sn] === 'depth' && attrText(v.attrs.positive)?.toLowerCase() === 'up') return null;
    return STANDARD_ROLES[sn];
  }
  if (sn) return null; // a standard name that is not a role (potential temperature, say) stays an extra
  const woce = attrText(v.attrs.WHPO_Variable_Name);
  if (woce && WOCE_ROLES[woce]) return WOCE_ROLES[woce];
  const byName = roleOfName(v.name);
  return byName;
}

function isFlagVar(v: NcVar): boolean {
  const sn = attrText(v.attrs.standard_name) ?? '';
  return (
    /status_flag$|quality_flag$/.test(sn) ||
    /_qc$|_flag$|_flag_w$/i.test(v.name) ||
    attrText(v.attrs.units) === 'woce_flags' ||
    v.attrs.flag_values !== undefined
  );
}

/** The QC variable of a data variable, if the file has one. */
function flagVarOf(nc: NcFile, v: NcVar): NcVar | null {
  const names = [
    ...(attrText(v.attrs.ancillary_variables) ?? '').split(/\s+/),
    attrText(v.attrs.OBS_QC_VARIABLE) ?? '',
    `${v.name}_QC`,
    `${v.name}_qc`,
    `${v.name}_FLAG_W`,
  ].filter((s) => s !== '');
  for (const n of names) {
    const f = nc.vars.get(n);
    if (f && isFlagVar(f) && sameShape(f, v)) return f;
  }
  return null;
}

function sameShape(a: NcVar, b: NcVar): boolean {
  return a.dims.length === b.dims.length && a.dims.every((d, i) => d === b.dims[i]);
}

/** Unit text with the signs a lossy conversion turned into "?" put back (°C, µmol). */
export function repairUnit(u: string | null): string | null {
  if (u === null) return null;
  return u
    .replace(/^\?(?=C\b|C\s|C$)/, '°')
    .replace(/\?(?=mol)/g, 'µ')
    .replace(/\?(?=M$)/, 'µ');
}

/** Numbers of a variable unpacked: fill and out-of-valid-range values NaN, then scale and offset. */
function unpacked(nc: NcFile, v: NcVar): Float64Array {
  const raw = nc.numbers(v);
  const fills = [...attrNumbers(v.attrs._FillValue), ...attrNumbers(v.attrs.missing_value)];
  const range = attrNumbers(v.attrs.valid_range);
  const vmin = attrNumber(v.attrs.valid_min) ?? (range.length === 2 ? range[0] : null);
  const vmax = attrNumber(v.attrs.valid_max) ?? (range.length === 2 ? range[1] : null);
  const scale = attrNumber(v.attrs.scale_factor) ?? 1;
  const offset = attrNumber(v.attrs.add_offset) ?? 0;
  // Without a _FillValue the classic format's default fill of the type marks unwritten values.
  const defaultFill =
    fills.length === 0
      ? (
          {
            byte: -127,
            short: -32767,
            int: -2147483647,
            float: 9.969209968386869e36,
            double: 9.969209968386869e36,
          } as Record<string, number>
        )[v.type]
      : undefined;
  const packed = scale !== 1 || offset !== 0;
  const out = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) {
    const x = raw[i];
    let bad = !Number.isFinite(x) || fills.some((f) => f === x || (v.type === 'float' && Math.fround(f) === x));
    if (defaultFill !== undefined && (x === defaultFill || (v.type === 'float' && Math.abs(x) > 9e36))) bad = true;
    if ((vmin !== null && x < vmin) || (vmax !== null && x > vmax)) bad = true;
    out[i] = bad ? NaN : packed ? x * scale + offset : x;
  }
  return out;
}

/** Quality flags as numbers; char flags ('1'..'9', ' ') as their digit, blanks 9. */
function flagValues(nc: NcFile, v: NcVar): number[] {
  if (v.type === 'char') {
    const s = nc.strings({ ...v, shape: [...v.shape, 1] }).join('');
    return Array.from(
      s.padEnd(
        v.shape.reduce((a, b) => a * b, 1),
        ' ',
      ),
      (ch) => (/[0-9]/.test(ch) ? Number(ch) : 9),
    );
  }
  const fills = attrNumbers(v.attrs._FillValue);
  return nc.numbers(v).map((x) => (!Number.isFinite(x) || fills.includes(x) ? 9 : x));
}

/** A time value with CF units ("minutes since 1980-01-01 00:00:00") to ISO 8601 UTC. */
export function cfTime(value: number, units: string | null): string | null {
  if (!Number.isFinite(value) || !units) return null;
  const m = /^\s*(seconds?|secs?|s|minutes?|mins?|hours?|hrs?|h|days?|d)\s+since\s+(.+?)\s*$/i.exec(units);
  if (!m) return null;
  const ref = parseTime(m[2].replace(/ UTC$/i, 'Z').replace(/(\d{2}:\d{2}:\d{2})\.0+/, '$1'));
  if (!ref.ok) return null;
  const u = m[1].toLowerCase();
  const perUnit = u.startsWith('s') ? 1000 : u.startsWith('m') ? 60_000 : u.startsWith('h') ? 3_600_000 : 86_400_000;
  const ms = Date.parse(ref.value) + value * perUnit;
  if (!Number.isFinite(ms)) return null;
  return new Date(Math.round(ms / 1000) * 1000).toISOString().replace('.000Z', 'Z');
}

function findVar(nc: NcFile, standard: string[], names: string[]): NcVar | null {
  for (const v of nc.vars.values()) if (standard.includes(attrText(v.attrs.standard_name) ?? '')) return v;
  for (const n of names) for (const v of nc.vars.values()) if (v.name.toLowerCase() === n) return v;
  return null;
}

type Layout = { profiles: number; levelsOf: (p: number) => number[] /* flat indices of profile p's levels */ };

/** How profiles and levels are laid out, from the vertical variable's dimensions. */
function layoutOf(
  nc: NcFile,
  vert: NcVar,
  file: string,
): { layout: Layout; profileDim: string | null; levelDim: string } {
  if (vert.dims.length === 1) {
    const levelDim = vert.dims[0];
    const rowSize = [...nc.vars.values()].find((v) => attrText(v.attrs.sample_dimension) === levelDim);
    if (rowSize) {
      // CF contiguous ragged array: row_size(profile) levels each, one after another.
      const counts = nc.numbers(rowSize);
      const starts: number[] = [];
      let s = 0;
      for (const c of counts) {
        starts.push(s);
        s += Math.max(0, c | 0);
      }
      if (s > vert.shape[0])
        throw new ParseFailure([
          fileError(
            file,
            null,
            null,
            'netcdf_bad_structure',
            `${rowSize.name} adds up to ${s} levels but ${levelDim} has ${vert.shape[0]}`,
          ),
        ]);
      return {
        layout: {
          profiles: counts.length,
          levelsOf: (p) => Array.from({ length: Math.max(0, counts[p] | 0) }, (_, k) => starts[p] + k),
        },
        profileDim: rowSize.dims[0] ?? null,
        levelDim,
      };
    }
    // One profile, or an orthogonal grid (profile, level) sharing this vertical coordinate.
    const grid = [...nc.vars.values()].find(
      (v) => v.dims.length === 2 && v.dims[1] === levelDim && roleOf(v) !== null && v !== vert,
    );
    if (grid) {
      const np = grid.shape[0];
      const nl = vert.shape[0];
      return {
        layout: { profiles: np, levelsOf: (p) => Array.from({ length: nl }, (_, k) => p * nl + k) },
        profileDim: grid.dims[0],
        levelDim,
      };
    }
    return {
      layout: { profiles: 1, levelsOf: () => Array.from({ length: vert.shape[0] }, (_, k) => k) },
      profileDim: null,
      levelDim,
    };
  }
  if (vert.dims.length === 2) {
    const [np, nl] = vert.shape;
    return {
      layout: { profiles: np, levelsOf: (p) => Array.from({ length: nl }, (_, k) => p * nl + k) },
      profileDim: vert.dims[0],
      levelDim: vert.dims[1],
    };
  }
  throw new ParseFailure([
    fileError(
      file,
      null,
      null,
      'netcdf_bad_structure',
      `the vertical variable ${vert.name} has ${vert.dims.length} dimensions; expected (level) or (profile, level)`,
    ),
  ]);
}

/** The value of a per-profile variable for profile p (a scalar, or one per profile). */
function perProfile(nc: NcFile, v: NcVar | null, p: number, profileDim: string | null): number | null {
  if (!v) return null;
  const vals = unpacked(nc, v);
  if (vals.length === 0) return null;
  const i = profileDim && v.dims[0] === profileDim ? p : 0;
  const x = vals[i];
  return Number.isFinite(x) ? x : null;
}

function perProfileText(nc: NcFile, v: NcVar | null, p: number, profileDim: string | null): string | null {
  if (!v) return null;
  const s: string[] =
    v.type === 'char' ? nc.strings(v) : Array.from(unpacked(nc, v), (x) => (Number.isFinite(x) ? String(x) : ''));
  const i = profileDim && v.dims[0] === profileDim ? p : 0;
  const t = (s[i] ?? '').trim();
  return t === '' ? null : t;
}

function fmtNumber(x: number): string {
  return Number.isFinite(x) ? (Object.is(x, -0) ? '-0' : String(x)) : '';
}

export function parseNetcdf(
  file: string,
  bytes: Uint8Array,
  options: { columnMapping?: Record<string, string>; unitAnswers?: Record<string, string> } = {},
): { casts: ParsedCast[]; warnings: FileError[] } {
  const nc = openNetcdf(file, bytes);
  const g = (k: string) => attrText(nc.globals[k]);
  const featureType = (g('featureType') ?? '').toLowerCase();
  const isWoce = /woce/i.test(g('Conventions') ?? '') || /woce/i.test(g('DATA_TYPE') ?? '') || nc.vars.has('woce_date');
  const isCf = /cf-\d/i.test(g('Conventions') ?? '') || featureType !== '';
  if (featureType !== '' && featureType !== 'profile')
    throw new ParseFailure([
      fileError(
        file,
        null,
        null,
        'netcdf_not_profile',
        `the file's featureType is "${featureType}"; only profiles (featureType = profile) are read as casts`,
      ),
    ]);

  const all = [...nc.vars.values()];
  const roles = new Map<Role, NcVar>();
  const dupes: NcVar[] = [];
  for (const v of all) {
    if (v.type === 'char' || isFlagVar(v)) continue;
    const r = roleOf(v);
    if (!r) continue;
    if (!roles.has(r)) roles.set(r, v);
    else dupes.push(v);
  }
  const vert = roles.get('pressure') ?? roles.get('depth');
  if (!vert || !roles.has('temperature') || (!roles.has('salinity') && !roles.has('conductivity'))) {
    const missing = [
      !vert && 'pressure or depth',
      !roles.has('temperature') && 'temperature',
      !roles.has('salinity') && !roles.has('conductivity') && 'salinity or conductivity',
    ].filter(Boolean);
    const names = all.filter((v) => v.type !== 'char' && !isFlagVar(v)).map((v) => v.name);
    throw new ParseFailure(
      [
        fileError(
          file,
          null,
          null,
          'missing_column',
          `no ${missing.join(', no ')} variable recognised among the file's variables (${names.join(', ') || 'none'})${isCf || isWoce ? '' : '; the file states neither CF nor WOCE conventions'}`,
        ),
      ],
      names.length ? { file, headers: names } : undefined,
    );
  }
  const { layout, profileDim, levelDim } = layoutOf(nc, vert, file);
  if (layout.profiles === 0)
    throw new ParseFailure([fileError(file, null, null, 'no_data', 'the file holds no profiles')]);
  if (layout.profiles > 5000)
    throw new ParseFailure([
      fileError(
        file,
        null,
        null,
        'netcdf_bad_structure',
        `the file declares ${layout.profiles} profiles (the limit is 5000)`,
      ),
    ]);

  // The data variables of a level: on the level dimension (alone, or after the profile dimension).
  const onLevels = (v: NcVar) =>
    v.dims[v.dims.length - 1] === levelDim &&
    (v.dims.length === 1 || (v.dims.length === 2 && v.dims[0] === profileDim));
  const columns: { v: NcVar; role: Role | 'extra'; key: string }[] = [];
  for (const [r, v] of roles) if (onLevels(v) || v === vert) columns.push({ v, role: r, key: r });
  const usedNames = new Set(columns.map((c) => c.v.name));
  for (const v of [...dupes, ...all]) {
    if (
      usedNames.has(v.name) ||
      v.type === 'char' ||
      isFlagVar(v) ||
      !onLevels(v) ||
      COORD_NAMES.has(v.name.toLowerCase())
    )
      continue;
    if (attrText(v.attrs.sample_dimension)) continue;
    const sn = attrText(v.attrs.standard_name);
    const key = (sn && STANDARD_EXTRAS[sn]) || extraKey(v.name);
    columns.push({ v, role: 'extra', key: key.replace(/[^A-Za-z0-9_]/g, '_') });
    usedNames.add(v.name);
  }
  // Unique extra keys (two fluorescence sensors, say).
  const seen = new Set<string>();
  for (const c of columns) {
    let k = c.key;
    for (let s = 2; seen.has(k); s++) k = `${c.key}_${s}`;
    c.key = k;
    seen.add(k);
  }

  const values = new Map<string, Float64Array>(columns.map((c) => [c.v.name, unpacked(nc, c.v)]));
  const flagVars = new Map<string, NcVar>();
  for (const c of columns) {
    const f = flagVarOf(nc, c.v);
    if (f) flagVars.set(c.v.name, f);
  }
  const flags = new Map<string, number[]>([...flagVars].map(([n, f]) => [n, flagValues(nc, f)]));

  const latV = findVar(nc, ['latitude'], ['latitude', 'lat']);
  const lonV = findVar(nc, ['longitude'], ['longitude', 'lon', 'long']);
  const timeV = findVar(nc, ['time'], ['time', 'juld']);
  const stationV =
    [...nc.vars.values()].find((v) => attrText(v.attrs.cf_role) === 'profile_id') ??
    findVar(nc, [], ['station', 'station_name', 'station_id', 'stn']);
  const castV = findVar(nc, [], ['cast', 'cast_number']);
  const bottomV = findVar(
    nc,
    ['sea_floor_depth_below_sea_surface', 'sea_floor_depth'],
    ['bottom_depth', 'water_depth'],
  );
  const wdate = nc.vars.get('woce_date') ?? null;
  const wtime = nc.vars.get('woce_time') ?? null;

  const casts: ParsedCast[] = [];
  const warnings: FileError[] = [];
  const multi = layout.profiles > 1;
  for (let p = 0; p < layout.profiles; p++) {
    const idx = layout.levelsOf(p);
    // Orthogonal grids: a 1-D vertical shared by every profile is indexed by level alone.
    const levelIndex = (v: NcVar, k: number) =>
      v.dims.length === 1 && multi && !profileDimIsRagged(nc, levelDim) ? k : idx[k];
    const name = multi ? `${file} [profile ${p + 1}]` : file;
    const headers: string[] = [];
    const units: (string | null)[] = [];
    const mapping: Record<string, string> = {};
    for (const c of columns) {
      headers.push(c.role === 'extra' ? c.key : c.v.name);
      units.push(repairUnit(attrText(c.v.attrs.units)));
      mapping[c.role === 'extra' ? c.key : c.v.name] = c.role === 'extra' ? 'extra' : c.role;
    }
    for (const c of columns) {
      const f = flagVars.get(c.v.name);
      if (!f) continue;
      headers.push(f.name);
      units.push(null);
      mapping[f.name] = `flag:${c.role === 'extra' ? extraKey(c.key) : c.role}`;
    }
    // A user's remembered mapping wins for the variables it names.
    for (const [k, v] of Object.entries(options.columnMapping ?? {})) if (headers.includes(k)) mapping[k] = v;
    const rows: string[][] = [];
    const rowLines: number[] = [];
    for (let k = 0; k < idx.length; k++) {
      const row: string[] = [];
      for (const c of columns) row.push(fmtNumber((values.get(c.v.name) as Float64Array)[levelIndex(c.v, k)]));
      for (const c of columns) {
        const f = flags.get(c.v.name);
        if (!f) continue;
        const fv = f[levelIndex(flagVars.get(c.v.name) as NcVar, k)];
        row.push(fv === undefined || !Number.isFinite(fv) ? '' : String(fv));
      }
      // A level with no vertical value and nothing else is padding of a (profile, level) grid.
      if (row.every((s, j) => s === '' || j >= columns.length)) continue;
      rows.push(row);
      rowLines.push(k + 1);
    }
    if (rows.length === 0) {
      warnings.push(fileError(file, null, null, 'no_data', `profile ${p + 1} holds no levels; skipped`));
      continue;
    }

    // Metadata of the profile.
    const md: ParsedCast['metadata'] = {
      station: null,
      cast: null,
      latitude: null,
      longitude: null,
      time: null,
      bottomDepth: null,
      extra: {},
    };
    const notes: string[] = [];
    const lat = perProfile(nc, latV, p, profileDim);
    const lon = perProfile(nc, lonV, p, profileDim);
    if (lat !== null) {
      const r = parseLatitude(String(lat));
      if (r.ok) md.latitude = r.value;
      else throw new ParseFailure([fileError(file, null, null, 'latitude_out_of_range', `${name}: ${r.message}`)]);
    }
    if (lon !== null) {
      const r = parseLongitude(String(lon));
      if (r.ok) md.longitude = r.value;
      else throw new ParseFailure([fileError(file, null, null, 'longitude_out_of_range', `${name}: ${r.message}`)]);
    }
    const tv = perProfile(nc, timeV, p, profileDim);
    md.time = tv !== null && timeV ? cfTime(tv, attrText(timeV.attrs.units)) : null;
    if (!md.time && wdate) {
      const d = perProfile(nc, wdate, p, profileDim);
      const t = perProfile(nc, wtime, p, profileDim) ?? 0;
      if (d !== null) {
        const ds = String(Math.round(d)).padStart(8, '0');
        const ts = String(Math.round(t)).padStart(4, '0');
        const r = parseTime(
          `${ds.slice(0, 4)}-${ds.slice(4, 6)}-${ds.slice(6, 8)}T${ts.slice(0, 2)}:${ts.slice(2, 4)}:00Z`,
        );
        if (r.ok) md.time = r.value;
      }
    }
    md.station = perProfileText(nc, stationV, p, profileDim) ?? (multi ? null : g('STATION_NUMBER'));
    md.cast = perProfileText(nc, castV, p, profileDim) ?? (multi ? null : g('CAST_NUMBER'));
    if (md.station) md.station = md.station.replace(/^0+(?=\d)/, '');
    if (md.cast) md.cast = md.cast.replace(/^0+(?=\d)/, '');
    const bd = perProfile(nc, bottomV, p, profileDim) ?? (multi ? null : attrNumber(nc.globals.BOTTOM_DEPTH_METERS));
    if (bd !== null && bd > 0 && bd <= 12000) md.bottomDepth = bd;
    else if (bd !== null && bd !== -999)
      warnings.push(
        fileError(file, null, null, 'bad_metadata', `${name}: bottom depth ${bd} m is not used (outside 0..12000 m)`),
      );
    for (const k of [
      'EXPOCODE',
      'WOCE_ID',
      'SECTION_ID',
      'Conventions',
      'title',
      'institution',
      'platform_code',
      'cruise_id',
    ]) {
      const v = g(k);
      if (v) md.extra[k === 'WOCE_ID' ? 'SECT_ID' : k] = v.slice(0, 200);
    }
    md.extra.source_format = isWoce ? 'WOCE netCDF CTD' : 'CF profile netCDF';
    notes.push(
      `read from ${isWoce ? 'a WOCE netCDF CTD file' : 'a CF netCDF profile file'}${multi ? ` (profile ${p + 1} of ${layout.profiles})` : ''}`,
    );
    const packed = columns
      .filter((c) => c.v.attrs.scale_factor !== undefined || c.v.attrs.add_offset !== undefined)
      .map((c) => c.v.name);
    if (packed.length) notes.push(`packed values unpacked with scale_factor/add_offset: ${packed.join(', ')}`);
    const fixed = columns
      .filter((c) => attrText(c.v.attrs.units)?.includes('?'))
      .map((c) => `${c.v.name} "${attrText(c.v.attrs.units)}"`);
    if (fixed.length) notes.push(`unit strings with a lost sign read as °/µ: ${fixed.join(', ')}`);
    if (!md.station && multi)
      warnings.push(fileError(file, null, null, 'bad_metadata', `${name}: no station name in the file`));

    try {
      const r = buildCast({
        file: name,
        format: 'netcdf',
        headers,
        names: headers,
        unitTexts: units,
        headerLine: 1,
        unitLine: 1,
        rows,
        rowLines,
        metadata: md,
        notes,
        warnings: [],
        mapping,
        unitAnswers: options.unitAnswers,
      });
      casts.push(r.cast);
      warnings.push(...r.warnings.map(levelWording));
    } catch (e) {
      if (e instanceof ParseFailure) throw new ParseFailure(e.errors.map(levelWording), e.unmappedHeaders);
      throw e;
    }
  }
  if (casts.length === 0)
    throw new ParseFailure([fileError(file, null, null, 'no_data', 'no profile of the file holds any levels')]);
  return { casts, warnings };
}

function profileDimIsRagged(nc: NcFile, levelDim: string): boolean {
  return [...nc.vars.values()].some((v) => attrText(v.attrs.sample_dimension) === levelDim);
}

/** A binary file has no lines: say "level n" and name the variable, and give no line or column. */
function levelWording(e: FileError): FileError {
  return {
    ...e,
    line: null,
    column: null,
    message: e.message.replace(/\blines? (\d+)/g, 'level $1').replace(/, column \d+ \(/g, ' ('),
  };
}
