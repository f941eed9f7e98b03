// Reference Salinity and Absolute Salinity from Practical Salinity.
//
// SR = (35.16504/35)·SP (Millero, Feistel, Wright & McDougall 2008, Deep-Sea Res. I 55, 50–72)
// and SA = SR·(1 + SAAR(p, lon, lat)), with the Absolute Salinity Anomaly Ratio from the global
// atlas of McDougall, Jackett, Millero, Pawlowicz & Barker (2012), "A global algorithm for
// estimating Absolute Salinity", Ocean Science 8, 1123–1134, interpolated as that paper does:
// linearly in pressure between the atlas levels (held at the deepest level of the cell below
// it), bilinearly in longitude and latitude inside a 4° cell, and where a corner of the cell has
// no value (land, or below that column's bottom) with the mean of the corners that have one at
// that level (0 where none has), as the reference library python3-gsw 3.6.16 does. The nodes at
// 0° E and 360° E are distinct columns of the atlas (the reference's differ); longitudes are
// taken modulo 360 into [0, 360), so a point just west of 0° E reads the cell 356–360° E.
// In the Baltic Sea, SA = (35.16504 − 0.087)/35·SP + 0.087 g/kg (Feistel et al. 2010, Ocean
// Science 6, 91–141). Where no corner of the cell has a value the atlas is silent: SA falls
// back to SR, and `SA_from_SP_detail` says so, so the cast's notes can.
//
// The atlas is data: shared/seawater/data/saar-atlas.json, written by
// scripts/gsw/make_saar_atlas.py from Debian's python3-gsw 3.6.16 (its header names the source).
//
// Units: SP unitless, p in dbar, lon in °E (any turn), lat in °N; SR and SA in g/kg.

import atlasFile from './data/saar-atlas.json';
import { LAT_RANGE, LON_RANGE, P_RANGE, SP_RANGE, checkRange } from './ranges';

const SSO = 35.16504;
const uPS = SSO / 35;

interface AtlasFile {
  longitudes: { first: number; step: number; count: number };
  latitudes: { first: number; step: number; count: number };
  pressures: number[];
  saar_base64: string;
  cell_deepest_level: { values: number[] };
  baltic: { rows: [number, number, number][] };
  panama: {
    line_lon: number[];
    line_lat: number[];
    cells: { lon_cell: number; lat_cell: number; above_base64: string; below_base64: string; outside_base64: string }[];
  };
}

interface Atlas {
  lon0: number;
  dlon: number;
  nx: number;
  lat0: number;
  dlat: number;
  ny: number;
  p: Float64Array;
  nz: number;
  /** SAAR at [level][lat][lon], NaN without a value. */
  saar: Float64Array;
  /** Deepest level index read in each cell, per [lat cell][lon cell], −1 for a cell without values. */
  deepest: Int32Array;
  cellsPerRow: number;
  baltic: Float64Array; // rows of [lat, west, east]
  /** Cells the Panama box touches: corner values per level (× 4) for points in the box above or
   * below the line, and outside the box. */
  panama: Map<number, { above: Float64Array; below: Float64Array; outside: Float64Array }>;
}

let atlas: Atlas | null = null;

function decodeBase64(text: string): Uint8Array {
  if (typeof Buffer !== 'undefined') {
    const b = Buffer.from(text, 'base64');
    return new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  }
  const bin = atob(text);
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

/** Decode the atlas on first use (about 2 MB of base64; nothing is read until a salinity is asked for). */
function loadAtlas(): Atlas {
  if (atlas) return atlas;
  const file = atlasFile as unknown as AtlasFile;
  const bytes = decodeBase64(file.saar_base64);
  // Copy into an aligned buffer: a Float64Array view needs an 8-byte aligned offset.
  const saar = new Float64Array(bytes.slice().buffer);
  const nx = file.longitudes.count,
    ny = file.latitudes.count,
    nz = file.pressures.length;
  if (saar.length !== nx * ny * nz) throw new Error('saar-atlas.json: grid size and data disagree');
  const deepest = Int32Array.from(file.cell_deepest_level.values);
  if (deepest.length !== (nx - 1) * (ny - 1)) throw new Error('saar-atlas.json: cell table and grid disagree');
  atlas = {
    lon0: file.longitudes.first,
    dlon: file.longitudes.step,
    nx,
    lat0: file.latitudes.first,
    dlat: file.latitudes.step,
    ny,
    p: Float64Array.from(file.pressures),
    nz,
    saar,
    deepest,
    cellsPerRow: nx - 1,
    baltic: Float64Array.from(file.baltic.rows.flat()),
    panama: new Map(
      file.panama.cells.map((c) => [
        c.lat_cell * (nx - 1) + c.lon_cell,
        {
          above: new Float64Array(decodeBase64(c.above_base64).slice().buffer),
          below: new Float64Array(decodeBase64(c.below_base64).slice().buffer),
          outside: new Float64Array(decodeBase64(c.outside_base64).slice().buffer),
        },
      ]),
    ),
  };
  return atlas;
}

/**
 * Reference Salinity SR_from_SP(SP) = (35.16504/35)·SP, g/kg (Millero et al. 2008).
 * @param SP Practical Salinity (PSS-78), unitless
 * @returns Reference Salinity, g/kg
 */
export function SR_from_SP(SP: number): number {
  return uPS * SP;
}

/**
 * The corner values of one cell at one level, as the reference library reads them: a corner
 * without a value takes the mean of the corners that have one, and where no corner at that level
 * has a value all four read 0 (McDougall et al. 2012 §3; the behaviour of python3-gsw 3.6.16).
 * Inside the Panama box, where the reference counts only the corners on the point's side of the
 * isthmus, the cell's corner values for that side come from the atlas file's Panama table.
 */
function cellAt(a: Atlas, k: number, ix: number, iy: number, corners: Float64Array, x: number, lat: number): void {
  const base = k * a.nx * a.ny + iy * a.nx + ix;
  corners[0] = a.saar[base];
  corners[1] = a.saar[base + 1];
  corners[2] = a.saar[base + a.nx + 1];
  corners[3] = a.saar[base + a.nx];
  const cell = a.panama.size ? a.panama.get(iy * a.cellsPerRow + ix) : undefined;
  if (cell) {
    const inBox =
      x >= PANAMA_LON[0] &&
      x <= PANAMA_LON[PANAMA_LON.length - 1] - 0.001 &&
      lat >= PANAMA_LAT[PANAMA_LAT.length - 1] &&
      lat <= PANAMA_LAT[0];
    const side = !inBox ? cell.outside : panamaLat(x) <= lat ? cell.above : cell.below;
    for (let c = 0; c < 4; c++) corners[c] = side[4 * k + c];
    return;
  }
  if (corners[0] === corners[0] && corners[1] === corners[1] && corners[2] === corners[2] && corners[3] === corners[3])
    return;
  let sum = 0,
    count = 0;
  for (let c = 0; c < 4; c++) {
    if (corners[c] === corners[c]) {
      sum += corners[c];
      count++;
    }
  }
  const mean = count === 0 ? 0 : sum / count;
  for (let c = 0; c < 4; c++) if (corners[c] !== corners[c]) corners[c] = mean;
}

// The Isthmus of Panama as a polyline (°E, °N): atlas corners on the other side of it from the
// point do not count, so Pacific and Caribbean water are not averaged across the land bridge
// (McDougall et al. 2012, §3).
// The nodes are the reference library's (python3-gsw 3.6.16): its values jump across exactly this
// line (last node 292° E, 3.4° N), found by bisection in scripts/gsw/make_saar_atlas.py.
const PANAMA_LON = [260.0, 272.59, 276.5, 278.65, 280.73, 292.0];
const PANAMA_LAT = [19.55, 13.97, 9.6, 8.1, 9.33, 3.4];

/** Latitude of the barrier line at lon, straight between its nodes and extended along its end
 * segments outside them (as the reference library evaluates it for cell corners beyond the ends). */
function panamaLat(lon: number): number {
  const n = PANAMA_LON.length;
  let i = 0;
  while (i < n - 2 && lon > PANAMA_LON[i + 1]) i++;
  const w = (lon - PANAMA_LON[i]) / (PANAMA_LON[i + 1] - PANAMA_LON[i]);
  return PANAMA_LAT[i] + w * (PANAMA_LAT[i + 1] - PANAMA_LAT[i]);
}

const upper = new Float64Array(4);
const lower = new Float64Array(4);

/** Result of an atlas look-up: the ratio, and whether the atlas had a value there. */
export interface SAARValue {
  value: number;
  inAtlas: boolean;
}

/** Longitude in [0, 360) °E, the atlas's own range (a point just west of 0° E reads the 360° E column). */
const wrapLon = (lon: number) => (lon >= 0 && lon < 360 ? lon : lon - 360 * Math.floor(lon / 360));

/** The atlas interpolation proper: SAAR at (p, lon in 0–360 °E, lat), NaN where the atlas is silent. */
function saarAt(a: Atlas, p: number, x: number, lat: number): number {
  if (!(lat >= a.lat0 && lat <= a.lat0 + a.dlat * (a.ny - 1))) return NaN;
  let ix = Math.floor((x - a.lon0) / a.dlon);
  let iy = Math.floor((lat - a.lat0) / a.dlat);
  if (ix >= a.nx - 1) ix = a.nx - 2;
  if (iy >= a.ny - 1) iy = a.ny - 2;
  const kMax = a.deepest[iy * (a.nx - 1) + ix];
  if (kMax < 0) return NaN;
  // Below the deepest level the cell reads, the ratio is held at its value there; above the
  // first level (0 dbar) the first pair of levels is extended, as the reference does.
  const levels = a.p;
  const pc = p > levels[kMax] ? levels[kMax] : p;
  // The level pair that brackets pc, by bisection.
  let lo = 0,
    hi = a.nz - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (pc > levels[mid]) lo = mid;
    else hi = mid;
  }
  const k = lo;
  const r = (x - (a.lon0 + ix * a.dlon)) / a.dlon;
  const s = (lat - (a.lat0 + iy * a.dlat)) / a.dlat;
  const tz = (pc - levels[k]) / (levels[k + 1] - levels[k]);
  cellAt(a, k, ix, iy, upper, x, lat);
  const vu = (1 - s) * (upper[0] + r * (upper[1] - upper[0])) + s * (upper[3] + r * (upper[2] - upper[3]));
  if (tz === 0) return vu;
  cellAt(a, k + 1, ix, iy, lower, x, lat);
  const vl = (1 - s) * (lower[0] + r * (lower[1] - lower[0])) + s * (lower[3] + r * (lower[2] - lower[3]));
  return vu + tz * (vl - vu);
}

/**
 * Absolute Salinity Anomaly Ratio SAAR(p, lon, lat), unitless, from the McDougall et al. (2012)
 * atlas; { value: 0, inAtlas: false } where the atlas has no value (land, south of 86° S).
 * p in dbar, lon in °E, lat in °N.
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lon longitude, degrees east (taken modulo 360)
 * @param lat latitude, degrees north
 * @returns the Absolute Salinity Anomaly Ratio (unitless) and whether the atlas holds the point
 */
export function SAAR(p: number, lon: number, lat: number): SAARValue {
  if (!(Number.isFinite(p) && Number.isFinite(lon) && Number.isFinite(lat))) return { value: NaN, inAtlas: false };
  const v = saarAt(loadAtlas(), p, wrapLon(lon), lat);
  return Number.isNaN(v) ? { value: 0, inAtlas: false } : { value: v, inAtlas: true };
}

/**
 * True inside the Baltic Sea region of Feistel et al. (2010), from the edges in the atlas file.
 * @param lon longitude, degrees east (taken modulo 360)
 * @param lat latitude, degrees north
 * @returns whether the position lies in the Baltic Sea polygon of the atlas
 */
export function inBaltic(lon: number, lat: number): boolean {
  return balticAt(loadAtlas().baltic, wrapLon(lon), lat);
}

function balticAt(b: Float64Array, x: number, lat: number): boolean {
  const rows = b.length / 3;
  const first = b[0],
    last = b[3 * (rows - 1)],
    step = b[3] - b[0];
  // The edges are straight between the tabulated latitudes, and half a step beyond the ends.
  if (!(lat > first - step && lat < last + step)) return false;
  const i = Math.min(Math.max(Math.floor((lat - first) / step), 0), rows - 2);
  const w = (lat - b[3 * i]) / step;
  const west = b[3 * i + 1] + w * (b[3 * (i + 1) + 1] - b[3 * i + 1]);
  const east = b[3 * i + 2] + w * (b[3 * (i + 1) + 2] - b[3 * i + 2]);
  return x >= west && x <= east;
}

/**
 * Absolute Salinity in the Baltic Sea, SA = (35.16504 − 0.087)/35·SP + 0.087 g/kg (Feistel et al. 2010).
 * @param SP Practical Salinity (PSS-78), unitless
 * @returns Absolute Salinity by the Baltic relation, g/kg (the caller decides that the position is in the Baltic)
 */
export function SA_from_SP_Baltic(SP: number): number {
  return ((SSO - 0.087) / 35) * SP + 0.087;
}

/** How an Absolute Salinity was obtained. */
export type SASource = 'atlas' | 'baltic' | 'reference_salinity_fallback';

export interface SADetail {
  SA: number;
  source: SASource;
  /** Why the value is NaN or fell back to SR, in words for the cast's notes; null otherwise. */
  note: string | null;
}

/**
 * Absolute Salinity with its provenance: SA from the atlas, the Baltic formula, or SR where the
 * atlas has no value (with a note). SP unitless, p dbar, lon °E, lat °N → SA g/kg.
 * Reference: Millero et al. (2008), Deep-Sea Res. I 55; McDougall et al. (2012), Ocean Science 8, 1123–1134.
 * @param SP Practical Salinity (PSS-78), unitless
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lon longitude, degrees east (taken modulo 360)
 * @param lat latitude, degrees north
 * @returns Absolute Salinity (g/kg) and where its anomaly came from
 */
export function SA_from_SP_detail(SP: number, p: number, lon: number, lat: number): SADetail {
  const reason = checkRange({ SP, p, lon, lat });
  if (reason) return { SA: NaN, source: 'atlas', note: reason };
  if (inBaltic(lon, lat)) return { SA: SA_from_SP_Baltic(SP), source: 'baltic', note: null };
  const ratio = SAAR(p, lon, lat);
  if (!ratio.inAtlas) {
    return {
      SA: SR_from_SP(SP),
      source: 'reference_salinity_fallback',
      note: `no Absolute Salinity Anomaly Ratio in the atlas at ${lat}°N ${lon}°E: SA = SR (Reference Salinity) used`,
    };
  }
  return { SA: SR_from_SP(SP) * (1 + ratio.value), source: 'atlas', note: null };
}

/**
 * Absolute Salinity SA_from_SP(SP, p, lon, lat), g/kg: SR·(1 + SAAR), Baltic formula, or SR fallback.
 * Reference: Millero et al. (2008), Deep-Sea Res. I 55; McDougall et al. (2012), Ocean Science 8, 1123–1134.
 * @param SP Practical Salinity (PSS-78), unitless
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lon longitude, degrees east (taken modulo 360)
 * @param lat latitude, degrees north
 * @returns Absolute Salinity, g/kg
 */
export function SA_from_SP(SP: number, p: number, lon: number, lat: number): number {
  // The range test of `checkRange`, written out: this runs once per level of every cast.
  if (!(
    SP >= SP_RANGE[0] &&
    SP <= SP_RANGE[1] &&
    p >= P_RANGE[0] &&
    p <= P_RANGE[1] &&
    lon >= LON_RANGE[0] &&
    lon <= LON_RANGE[1] &&
    lat >= LAT_RANGE[0] &&
    lat <= LAT_RANGE[1]
  ))
    return NaN;
  const a = atlas ?? loadAtlas();
  const x = wrapLon(lon);
  if (balticAt(a.baltic, x, lat)) return SA_from_SP_Baltic(SP);
  const ratio = saarAt(a, p, x, lat);
  return uPS * SP * (Number.isNaN(ratio) ? 1 : 1 + ratio);
}

/**
 * SA_from_SP over a cast's columns at one position, and where the atlas is silent there
 * (`silent[i] = 1`: SA = SR used), with one atlas look-up a level. SP unitless, p dbar → SA g/kg.
 * Reference: Millero et al. (2008), Deep-Sea Res. I 55; McDougall et al. (2012), Ocean Science 8, 1123–1134.
 * @param SP Practical Salinity (PSS-78), unitless
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lon longitude, degrees east (taken modulo 360)
 * @param lat latitude, degrees north
 * @param SA Absolute Salinity, g/kg
 * @param silent optional output: set to 1 where the atlas is silent at a level (SAAR taken as 0)
 * @returns nothing: Absolute Salinity (g/kg) is written into out
 */
export function SA_from_SP_cast(
  SP: Float64Array,
  p: Float64Array,
  lon: number,
  lat: number,
  SA: Float64Array,
  silent: Uint8Array,
): void {
  const a = atlas ?? loadAtlas();
  const x = wrapLon(lon);
  const baltic = balticAt(a.baltic, x, lat);
  const posOk = lon >= LON_RANGE[0] && lon <= LON_RANGE[1] && lat >= LAT_RANGE[0] && lat <= LAT_RANGE[1];
  for (let i = 0; i < SP.length; i++) {
    const s = SP[i],
      pi = p[i];
    silent[i] = 0;
    if (!(posOk && s >= SP_RANGE[0] && s <= SP_RANGE[1] && pi >= P_RANGE[0] && pi <= P_RANGE[1])) {
      SA[i] = NaN;
      continue;
    }
    if (baltic) {
      SA[i] = SA_from_SP_Baltic(s);
      continue;
    }
    const ratio = saarAt(a, pi, x, lat);
    if (ratio !== ratio) {
      silent[i] = 1;
      SA[i] = uPS * s;
    } else SA[i] = uPS * s * (1 + ratio);
  }
}

/**
 * SA_from_SP over a cast's columns (SP, p) at one or many positions (lon, lat as numbers or
 * columns) → SA g/kg. Allocates only the output.
 * Reference: Millero et al. (2008), Deep-Sea Res. I 55; McDougall et al. (2012), Ocean Science 8, 1123–1134.
 * @param SP Practical Salinity (PSS-78), unitless
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @param lon longitude, degrees east (taken modulo 360)
 * @param lat latitude, degrees north
 * @param out optional output column of the same length (allocated when absent)
 * @returns Absolute Salinity for each level, g/kg
 */
export function SA_from_SP_batch(
  SP: Float64Array,
  p: Float64Array,
  lon: number | Float64Array,
  lat: number | Float64Array,
  out?: Float64Array,
): Float64Array {
  const n = SP.length;
  if (p.length !== n) throw new RangeError('SA_from_SP_batch: SP and p differ in length');
  const o = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) {
    o[i] = SA_from_SP(SP[i], p[i], typeof lon === 'number' ? lon : lon[i], typeof lat === 'number' ? lat : lat[i]);
  }
  return o;
}
