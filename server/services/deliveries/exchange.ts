// The CTD exchange format as a delivery: one file per cast (the trade's interchange format, what a
// data office ingests) and a zip of them per line. Each file: a first line `CTD,<date><stamp>`, `#`
// comment lines with the provenance and the caution, `NUMBER_HEADERS = n` and the `KEY = value`
// block (EXPOCODE, SECT_ID, STNNBR, CASTNO, DATE, TIME, LATITUDE, LONGITUDE, DEPTH), the parameter
// line, the units line, comma-separated data with `*_FLAG_W` WOCE flags and fill -999, `END_DATA`.
// Decimals are the trade's usual ones: pressure 1, temperature and salinity 4, oxygen 1 (common practice).
import yazl from 'yazl';
import { DATA_CAUTION, oneLine, provenanceEntries, type Provenance } from './provenance';
import { KNOWN_VARIABLES, columnName, worseFlag } from './variables';

export const EXCHANGE_FILL = -999;
/** Our stamp after the date on the first line (a division/institution code in the trade's files). */
export const EXCHANGE_STAMP = 'SGLNDLV';

export interface ExchangeCast {
  station: string;
  cast: string;
  latitude: number;
  longitude: number;
  time: Date | null;
  bottomDepth: number | null;
  /** Store columns: pressure, temperature, SP, oxygen, x:<extra> … */
  columns: Record<string, Float64Array>;
  /** Store flags: flag:temperature, flag:salinity, … */
  flags: Record<string, Uint8Array>;
  units: Record<string, string | null>;
}

export interface ExchangeOptions {
  expocode: string;
  line: string;
  provenance: Provenance;
  /** Date written on the first line (default: the provenance's export time). */
  stamped?: Date;
}

interface Param {
  name: string;
  unit: string;
  decimals: number | null;
  values: Float64Array;
  flags: Uint8Array | null;
}

/** A header value with no commas, `=` or line breaks. */
const headerValue = (s: string): string => oneLine(s).replace(/[,=]/g, ' ').trim();

function fmt(v: number, decimals: number | null): string {
  if (!Number.isFinite(v)) return String(EXCHANGE_FILL);
  if (decimals === null) return String(Number(v.toPrecision(7)));
  const s = v.toFixed(decimals);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

function flagsOf(c: ExchangeCast, from: readonly string[], n: number): Uint8Array | null {
  let out: Uint8Array | null = null;
  for (const k of from) {
    const f = c.flags[`flag:${k}`];
    if (!f || f.length !== n) continue;
    out ??= new Uint8Array(n);
    for (let i = 0; i < n; i++) out[i] = worseFlag(out[i], f[i]);
  }
  return out;
}

/** The parameters a cast's file carries, in the file's column order. */
function params(c: ExchangeCast): Param[] {
  const n = c.columns.pressure.length;
  const out: Param[] = [{ name: 'CTDPRS', unit: 'DBAR', decimals: 1, values: c.columns.pressure, flags: null }];
  for (const v of KNOWN_VARIABLES) {
    if (!v.exchange || !c.columns[v.key]) continue;
    out.push({
      name: v.exchange.name,
      unit: v.exchange.unit,
      decimals: v.exchange.decimals,
      values: c.columns[v.key],
      flags: flagsOf(c, v.flagsFrom, n),
    });
  }
  for (const key of Object.keys(c.columns)
    .filter((k) => k.startsWith('x:'))
    .sort()) {
    const bare = key.slice(2);
    out.push({
      name: columnName(key).toUpperCase(),
      unit: headerValue(c.units[key] ?? '').toUpperCase(),
      decimals: null,
      values: c.columns[key],
      flags: flagsOf(c, [bare], n),
    });
  }
  return out;
}

/** The exchange file name of a cast: `<expocode>_<station>_<cast>_ct1.csv` in safe characters. */
export function exchangeFileName(expocode: string, station: string, cast: string): string {
  const safe = (s: string) =>
    s
      .replace(/[^A-Za-z0-9-]/g, '_')
      .replace(/_+/g, '_')
      .replace(/^_|_$/g, '') || 'x';
  return `${safe(expocode)}_${safe(station)}_${safe(cast)}_ct1.csv`;
}

/** One cast as CTD exchange text. */
export function writeExchangeCast(c: ExchangeCast, o: ExchangeOptions): string {
  const stamped = o.stamped ?? new Date(Date.parse(o.provenance.exportedAt) || Date.now());
  const day = (d: Date) => d.toISOString().slice(0, 10).replace(/-/g, '');
  const lines: string[] = [`CTD,${day(stamped)}${EXCHANGE_STAMP}`];
  for (const e of provenanceEntries(o.provenance)) lines.push(`# ${e.key}: ${oneLine(e.value)}`);
  lines.push(`# caution: ${DATA_CAUTION}`);
  const header: [string, string][] = [
    ['EXPOCODE', headerValue(o.expocode)],
    ['SECT_ID', headerValue(o.line)],
    ['STNNBR', headerValue(c.station)],
    ['CASTNO', headerValue(c.cast)],
  ];
  if (c.time) header.push(['DATE', day(c.time)], ['TIME', c.time.toISOString().slice(11, 16).replace(':', '')]);
  header.push(['LATITUDE', c.latitude.toFixed(4)], ['LONGITUDE', c.longitude.toFixed(4)]);
  if (c.bottomDepth !== null && Number.isFinite(c.bottomDepth))
    header.push(['DEPTH', String(Math.round(c.bottomDepth))]);
  lines.push(`NUMBER_HEADERS = ${header.length + 1}`);
  for (const [k, v] of header) lines.push(`${k} = ${v}`);
  const ps = params(c);
  const names: string[] = [];
  const units: string[] = [];
  for (const p of ps) {
    names.push(p.name);
    units.push(p.unit);
    if (p.flags) {
      names.push(`${p.name}_FLAG_W`);
      units.push('');
    }
  }
  lines.push(names.join(','), units.join(','));
  const n = c.columns.pressure.length;
  for (let i = 0; i < n; i++) {
    const cells: string[] = [];
    for (const p of ps) {
      const v = p.values[i];
      cells.push(fmt(v, p.decimals).padStart(9));
      if (p.flags) cells.push(String(Number.isFinite(v) ? p.flags[i] || 2 : 9).padStart(2));
    }
    lines.push(cells.join(','));
  }
  lines.push('END_DATA');
  return lines.join('\n') + '\n';
}

/** The line's casts as exchange files in one zip; entry names `<expocode>_<station>_<cast>_ct1.csv`. */
export async function writeExchangeZip(
  casts: readonly ExchangeCast[],
  o: ExchangeOptions,
  folder?: string,
): Promise<Buffer> {
  const zip = new yazl.ZipFile();
  const seen = new Set<string>();
  const mtime = new Date(Date.parse(o.provenance.exportedAt) || Date.now());
  for (const c of casts) {
    let name = exchangeFileName(o.expocode, c.station, c.cast);
    for (let k = 2; seen.has(name); k++) name = name.replace(/(_\d+)?_ct1\.csv$/, `_${k}_ct1.csv`);
    seen.add(name);
    zip.addBuffer(Buffer.from(writeExchangeCast(c, o)), folder ? `${folder}/${name}` : name, { mtime });
  }
  zip.end();
  const parts: Buffer[] = [];
  for await (const chunk of zip.outputStream) parts.push(Buffer.from(chunk as Buffer));
  return Buffer.concat(parts);
}
