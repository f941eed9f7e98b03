// Writes fixtures/bad/: malformed upload files, each with the error kind it must produce
// (fixtures/bad/manifest.json). Deterministic: a seeded PRNG picks lines, columns and values.
// Run: npx tsx scripts/make-bad-corpus.ts
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import yazl from 'yazl';
import { mulberry32 } from './lib/prng';
import { writeNetcdf, type NcVariable } from '../server/services/deliveries/netcdf';
import { acquisitionSamples } from './lib/acquisitionSamples';

const OUT = join(import.meta.dirname, '..', 'fixtures', 'bad');

export type BadEntry = {
  file: string; // name in fixtures/bad/
  expect: string; // the FileError code that must appear
  errorFile?: string; // the file the error must name, when it is not the upload itself (zip entries)
  line?: number | null; // the line the error must name (omitted: not checked)
  column?: number | null; // the column the error must name (omitted: not checked)
  what: string;
};

const prng = mulberry32;
const rand = prng(20260304);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)];
const int = (lo: number, hi: number): number => lo + Math.floor(rand() * (hi - lo + 1));

// ---- the good bases every mutation starts from ----------------------------------------------
const N = 120;
const prof = (i: number): [string, string, string, string] => {
  const p = 2 + 2 * i;
  return [
    p.toFixed(1),
    (4 + 16 * Math.exp(-p / 300)).toFixed(4),
    (34.6 + Math.exp(-p / 250)).toFixed(4),
    (220 - 0.1 * p).toFixed(1),
  ];
};
const PLAIN_META = [
  '# station: B-01',
  '# cast: 1',
  '# latitude: -34.5000',
  '# longitude: -22.2500',
  '# time: 2026-03-06T11:20:00Z',
  '# bottom_depth: 2950',
];
const PLAIN_HEADER = 'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen [umol/kg]';
const PLAIN_FIRST_DATA_LINE = PLAIN_META.length + 2; // 1-based line of data row 0
function plainLines(): string[] {
  return [...PLAIN_META, PLAIN_HEADER, ...Array.from({ length: N }, (_, i) => prof(i).join(','))];
}
const EX_HEAD = [
  'CTD,20260306SGMLNE',
  '# invented file for the bad-input corpus',
  'NUMBER_HEADERS = 8',
  'STNNBR = 21',
  'CASTNO = 1',
  'DATE = 20260306',
  'TIME = 1120',
  'LATITUDE = -34.5000',
  'LONGITUDE = -22.2500',
  'DEPTH = 2950',
  'CTDPRS,CTDPRS_FLAG_W,CTDTMP,CTDTMP_FLAG_W,CTDSAL,CTDSAL_FLAG_W,CTDOXY,CTDOXY_FLAG_W',
  'DBAR,,ITS-90,,PSS-78,,UMOL/KG,',
];
const EX_FIRST_DATA_LINE = EX_HEAD.length + 1;
function exchangeLines(): string[] {
  const rows = Array.from({ length: N }, (_, i) => {
    const v = prof(i);
    return [v[0], '2', v[1], '2', v[2], '2', v[3], '2'].join(',');
  });
  return [...EX_HEAD, ...rows, 'END_DATA'];
}
const EX_VALUE_COLS = [0, 2, 4, 6]; // 0-based field indices of values (the others are flags)

const entries: BadEntry[] = [];
const files = new Map<string, Buffer>();
function add(name: string, data: string | Buffer, e: Omit<BadEntry, 'file'>): void {
  if (files.has(name)) throw new Error(`duplicate corpus name ${name}`);
  files.set(name, Buffer.isBuffer(data) ? data : Buffer.from(data));
  entries.push({ file: name, ...e });
}
const join_ = (ls: string[]): string => ls.join('\n') + '\n';
const pad = (n: number): string => String(n).padStart(3, '0');

// ---- truncated -----------------------------------------------------------------------------
for (let k = 0; k < 20; k++) {
  const ls = plainLines();
  const keep = int(5, N - 1);
  const rows = ls.slice(0, PLAIN_FIRST_DATA_LINE - 1 + keep);
  const last = prof(keep).slice(0, int(1, 3)).join(','); // cut before a delimiter: fewer fields
  rows.push(last);
  add(`truncated-plain-${pad(k)}.csv`, rows.join('\n'), {
    expect: 'truncated',
    line: rows.length,
    what: 'cut off mid-line; the last line has fewer fields',
  });
}
for (let k = 0; k < 20; k++) {
  const ls = exchangeLines();
  const keep = int(0, N - 1);
  const rows = ls.slice(0, EX_FIRST_DATA_LINE - 1 + keep + 1);
  add(`truncated-exchange-${pad(k)}.csv`, rows.join('\n') + (k % 2 ? '\n' : ''), {
    expect: 'exchange_missing_end',
    line: rows.length,
    what: 'exchange file cut off before END_DATA',
  });
}
// cut inside the exchange header block
for (let k = 0; k < 4; k++) {
  const rows = exchangeLines().slice(0, 4 + k);
  add(`truncated-exchange-header-${pad(k)}.csv`, join_(rows), {
    expect: 'truncated',
    what: 'exchange file cut off inside its header',
  });
}

// ---- missing or renamed columns -------------------------------------------------------------
const headerParts = PLAIN_HEADER.split(',');
const renames = ['tmp_x', 'col3', 'Temperatura', 'water', 'sensor_2', 'T_unknown', 'x', 'val'];
for (const drop of [0, 1, 2]) {
  for (let k = 0; k < 4; k++) {
    const ls = plainLines();
    const hdr = [...headerParts];
    hdr[drop] = `${pick(renames)}_${k}`;
    ls[PLAIN_FIRST_DATA_LINE - 2] = hdr.join(',');
    add(`renamed-column-${drop}-${pad(k)}.csv`, join_(ls), {
      expect: 'missing_column',
      line: PLAIN_FIRST_DATA_LINE - 1,
      what: `column ${drop + 1} renamed to an unknown name`,
    });
  }
  for (let k = 0; k < 4; k++) {
    const ls = plainLines().map((l, i) => {
      if (i < PLAIN_FIRST_DATA_LINE - 2) return l;
      const f = l.split(',');
      f.splice(drop, 1);
      return f.join(',');
    });
    add(`missing-column-${drop}-${pad(k)}.csv`, join_(k % 2 ? ls : ls.map((l) => l.replace(/,/g, '\t'))), {
      expect: 'missing_column',
      line: PLAIN_FIRST_DATA_LINE - 1,
      what: `column ${drop + 1} (${headerParts[drop]}) removed`,
    });
  }
}

// ---- text, NaN and Inf in numeric fields ---------------------------------------------------------
const texts = ['abc', '12.3.4', 'N/A', 'null', '--5', '1e', '0x1F', '18,4', '?', 'twelve', '3..1', '+-2', '#', '1 2'];
for (let k = 0; k < 44; k++) {
  const exchange = k % 3 === 2;
  const ls = exchange ? exchangeLines() : plainLines();
  const r = int(0, N - 1);
  const c = exchange ? pick(EX_VALUE_COLS) : int(0, 3);
  const li = (exchange ? EX_FIRST_DATA_LINE : PLAIN_FIRST_DATA_LINE) - 1 + r;
  const f = ls[li].split(',');
  let bad = pick(texts);
  if (bad === '18,4' || bad === '#') bad = 'x' + bad.replace(',', ';'); // keep the field count
  f[c] = bad;
  ls[li] = f.join(',');
  add(`text-in-numeric-${pad(k)}.${exchange ? 'ex.csv' : 'csv'}`, join_(ls), {
    expect: 'text_in_numeric',
    line: li + 1,
    column: c + 1,
    what: `"${bad}" in a numeric field`,
  });
}
const nans = ['NaN', 'nan', 'Inf', '-Infinity', '+inf', 'INF', 'infinity', '-nan'];
for (let k = 0; k < 26; k++) {
  const exchange = k % 2 === 1;
  const ls = exchange ? exchangeLines() : plainLines();
  const r = int(0, N - 1);
  const c = exchange ? pick(EX_VALUE_COLS) : int(0, 3);
  const li = (exchange ? EX_FIRST_DATA_LINE : PLAIN_FIRST_DATA_LINE) - 1 + r;
  const f = ls[li].split(',');
  const bad = pick(nans);
  f[c] = bad;
  ls[li] = f.join(',');
  add(`nan-inf-${pad(k)}.${exchange ? 'ex.csv' : 'csv'}`, join_(ls), {
    expect: 'nan_inf',
    line: li + 1,
    column: c + 1,
    what: `"${bad}" in a numeric field`,
  });
}

// ---- not UTF-8, binary, empty ---------------------------------------------------------------
const badSeqs: [string, number[]][] = [
  ['lone-ff', [0xff]],
  ['lone-lead', [0xc3]],
  ['latin1-degree', [0xb0]],
  ['overlong', [0xc0, 0xaf]],
  ['surrogate', [0xed, 0xa0, 0x80]],
  ['cut-3byte', [0xe2, 0x82]],
  ['above-max', [0xf5, 0x80, 0x80, 0x80]],
];
for (let k = 0; k < 21; k++) {
  const [nm, seq] = badSeqs[k % badSeqs.length];
  const ls = plainLines();
  const li = k % 3 === 0 ? PLAIN_FIRST_DATA_LINE - 2 : PLAIN_FIRST_DATA_LINE - 1 + int(0, N - 1);
  const parts = ls.map((l) => Buffer.from(l + '\n'));
  const at = int(0, ls[li].length);
  parts[li] = Buffer.concat([Buffer.from(ls[li].slice(0, at)), Buffer.from(seq), Buffer.from(ls[li].slice(at) + '\n')]);
  add(`not-utf8-${nm}-${pad(k)}.csv`, Buffer.concat(parts), {
    expect: 'invalid_utf8',
    line: li + 1,
    what: `invalid UTF-8 (${nm}) on a line`,
  });
}
{
  // A whole file in Latin-1 with a degree sign in the header.
  const s = join_(plainLines()).replace('ITS-90 degC', 'ITS-90 °C');
  add('not-utf8-latin1-file.csv', Buffer.from(s, 'latin1'), {
    expect: 'invalid_utf8',
    line: PLAIN_FIRST_DATA_LINE - 1,
    what: 'the file is Latin-1',
  });
  const u16 = Buffer.from(join_(plainLines()), 'utf16le'); // no BOM: NUL bytes everywhere
  add('utf16-without-bom.csv', u16, { expect: 'binary', what: 'UTF-16 without a byte-order mark' });
}
const magic: [string, number[]][] = [
  ['png', [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]],
  ['gzip', [0x1f, 0x8b, 0x08, 0x00, 0, 0, 0, 0]],
  ['elf', [0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]],
  ['pdf-bin', [0x25, 0x50, 0x44, 0x46, 0x2d, 0x31, 0x0a, 0x00]],
  ['netcdf', [0x43, 0x44, 0x46, 0x01, 0, 0, 0, 0]],
];
for (let k = 0; k < 15; k++) {
  const [nm, m] = magic[k % magic.length];
  const body = Buffer.alloc(int(64, 2048));
  for (let i = 0; i < body.length; i++) body[i] = Math.floor(rand() * 256);
  body[int(0, body.length - 1)] = 0;
  // netCDF magic goes to the netCDF reader, which names the broken header
  const expect = nm === 'netcdf' ? 'netcdf_corrupt' : 'binary';
  add(`binary-${nm}-${pad(k)}.csv`, Buffer.concat([Buffer.from(m), body]), { expect, what: `binary content (${nm})` });
}
{
  const ls = plainLines();
  ls[PLAIN_FIRST_DATA_LINE + 10] = ls[PLAIN_FIRST_DATA_LINE + 10] + '\u0000';
  add('binary-nul-in-text.csv', join_(ls), {
    expect: 'binary',
    line: PLAIN_FIRST_DATA_LINE + 11,
    what: 'a NUL byte inside a text line',
  });
}
add('empty-zero-bytes.csv', Buffer.alloc(0), { expect: 'empty_file', what: 'zero bytes' });
add('empty-spaces.csv', '   \n\t \n', { expect: 'empty_file', what: 'only whitespace' });
add('empty-newlines.csv', '\n\n\n\n', { expect: 'empty_file', what: 'only newlines' });
add('empty-crlf.csv', '\r\n\r\n', { expect: 'empty_file', what: 'only CRLF line ends' });
add('empty-bom-only.csv', Buffer.from([0xef, 0xbb, 0xbf]), { expect: 'empty_file', what: 'only a byte-order mark' });
add('empty-bom-newline.csv', Buffer.from([0xef, 0xbb, 0xbf, 0x0a]), {
  expect: 'empty_file',
  what: 'a byte-order mark and a newline',
});
add('only-comments.csv', join_(PLAIN_META), { expect: 'no_header', what: 'metadata lines and nothing else' });
add('header-only.csv', join_([...PLAIN_META, PLAIN_HEADER]), {
  expect: 'no_data',
  line: PLAIN_FIRST_DATA_LINE - 1,
  what: 'a header and no data',
});
add('header-only-no-meta.csv', PLAIN_HEADER + '\n', { expect: 'no_data', line: 1, what: 'a header line only' });
add('exchange-no-data.csv', join_([...EX_HEAD, 'END_DATA']), {
  expect: 'no_data',
  what: 'an exchange file without data lines',
});

// ---- one enormous line ----------------------------------------------------------------------
for (let k = 0; k < 8; k++) {
  const ls = plainLines();
  const where = [PLAIN_FIRST_DATA_LINE - 2, PLAIN_FIRST_DATA_LINE + 5, 0, PLAIN_FIRST_DATA_LINE + 50][k % 4];
  const len = [70_000, 120_000, 200_000, 300_000][k % 4] + k;
  const filler = k % 2 ? ','.repeat(len) : '1'.repeat(len);
  ls[where] = ls[where] + filler;
  add(`enormous-line-${pad(k)}.csv`, join_(ls), {
    expect: 'line_too_long',
    line: where + 1,
    what: `a line of ${len} extra characters`,
  });
}
add('enormous-single-line.csv', '9'.repeat(400_000), {
  expect: 'line_too_long',
  line: 1,
  what: 'a 400 kB file without a line end',
});

// ---- repeated header -------------------------------------------------------------------------
for (let k = 0; k < 16; k++) {
  const exchange = k % 4 === 3;
  const ls = exchange ? exchangeLines() : plainLines();
  const first = exchange ? EX_FIRST_DATA_LINE : PLAIN_FIRST_DATA_LINE;
  const at = first - 1 + int(1, N - 2);
  ls.splice(at, 0, exchange ? EX_HEAD[EX_HEAD.length - 2] : PLAIN_HEADER);
  add(`repeated-header-${pad(k)}.${exchange ? 'ex.csv' : 'csv'}`, join_(ls), {
    expect: 'repeated_header',
    line: at + 1,
    what: 'the header row again inside the data',
  });
}

// ---- absurd pressures and depths --------------------------------------------------------------
const badP = ['-10', '-50.5', '-5.01', '12000.5', '15000', '99999', '1e6', '-1e3', '20000', '-6'];
for (let k = 0; k < 22; k++) {
  const exchange = k % 3 === 1;
  const ls = exchange ? exchangeLines() : plainLines();
  const li = (exchange ? EX_FIRST_DATA_LINE : PLAIN_FIRST_DATA_LINE) - 1 + int(0, N - 1);
  const f = ls[li].split(',');
  f[0] = badP[k % badP.length];
  ls[li] = f.join(',');
  add(`absurd-pressure-${pad(k)}.${exchange ? 'ex.csv' : 'csv'}`, join_(ls), {
    expect: 'pressure_out_of_range',
    line: li + 1,
    column: 1,
    what: `pressure ${f[0]} dbar`,
  });
}
for (let k = 0; k < 6; k++) {
  const ls = plainLines();
  ls[PLAIN_FIRST_DATA_LINE - 2] = PLAIN_HEADER.replace('pressure [dbar]', 'depth [m]');
  const li = PLAIN_FIRST_DATA_LINE - 1 + int(0, N - 1);
  const f = ls[li].split(',');
  f[0] = ['-20', '13000', '-7.5', '50000', '-100', '12500'][k];
  ls[li] = f.join(',');
  add(`absurd-depth-${pad(k)}.csv`, join_(ls), {
    expect: 'depth_out_of_range',
    line: li + 1,
    column: 1,
    what: `depth ${f[0]} m`,
  });
}

// ---- positions out of range, unparsable times, bad metadata --------------------------------------
const badLat = ['91', '-90.5', '123.4', '-180', '95 10.0 S', '90.0001'];
const badLon = ['361', '-181', '720', '-360.5', '400 0.0 E', '360.01'];
for (let k = 0; k < 12; k++) {
  const ls = plainLines();
  const lat = k % 2 === 0;
  const li = lat ? 2 : 3;
  const v = (lat ? badLat : badLon)[Math.floor(k / 2)];
  ls[li] = lat ? `# latitude: ${v}` : `# longitude: ${v}`;
  add(`position-${lat ? 'lat' : 'lon'}-plain-${pad(k)}.csv`, join_(ls), {
    expect: lat ? 'latitude_out_of_range' : 'longitude_out_of_range',
    line: li + 1,
    what: `${lat ? 'latitude' : 'longitude'} ${v}`,
  });
}
for (let k = 0; k < 8; k++) {
  const ls = exchangeLines();
  const lat = k % 2 === 0;
  const li = lat ? 7 : 8;
  const v = (lat ? ['91.0', '-92', '180', '-90.01'] : ['361', '-181.5', '999', '-200'])[Math.floor(k / 2)];
  ls[li] = lat ? `LATITUDE = ${v}` : `LONGITUDE = ${v}`;
  add(`position-${lat ? 'lat' : 'lon'}-exchange-${pad(k)}.csv`, join_(ls), {
    expect: lat ? 'latitude_out_of_range' : 'longitude_out_of_range',
    line: li + 1,
    what: `${lat ? 'LATITUDE' : 'LONGITUDE'} = ${v}`,
  });
}
const STN_HEADER = 'station,cast,latitude,longitude,time,bottom_depth';
const stnRows = (): string[] => [
  STN_HEADER,
  'A-01,1,-34.00,-22.00,2026-03-06T01:00:00Z,3000',
  'A-02,1,-34.10,-21.50,2026-03-06T05:00:00Z,3100',
  'A-03,1,-34.20,-21.00,2026-03-06T09:00:00Z,3200',
];
for (let k = 0; k < 8; k++) {
  const rows = stnRows();
  const r = 1 + (k % 3);
  const f = rows[r].split(',');
  const lat = k % 2 === 0;
  f[lat ? 2 : 3] = lat ? ['95', '-91', '100', '-99'][k >> 1] : ['400', '-190', '361', '-181'][k >> 1];
  rows[r] = f.join(',');
  add(`position-station-table-${pad(k)}.csv`, join_(rows), {
    expect: lat ? 'latitude_out_of_range' : 'longitude_out_of_range',
    line: r + 1,
    column: lat ? 3 : 4,
    what: 'station table position out of range',
  });
}
const badTimes = [
  '2026-13-04T05:06:00Z',
  'yesterday',
  '2026-02-30T00:00:00Z',
  '05:06',
  '2026-03-04T25:00:00Z',
  '04/03/2026 05:06',
  '2026-03-04T05:61:00Z',
  'T05:06Z',
  '20260304',
  '1776-07-04T00:00:00Z',
];
for (let k = 0; k < 10; k++) {
  const ls = plainLines();
  ls[4] = `# time: ${badTimes[k]}`;
  add(`bad-time-plain-${pad(k)}.csv`, join_(ls), { expect: 'bad_time', line: 5, what: `time "${badTimes[k]}"` });
}
for (let k = 0; k < 8; k++) {
  const ls = exchangeLines();
  const dateBad = k < 4;
  if (dateBad) ls[5] = `DATE = ${['2026034', '20261304', '2026-03-06', '20260231'][k]}`;
  else ls[6] = `TIME = ${['2561', '12:30', '1275', 'noon'][k - 4]}`;
  add(`bad-time-exchange-${pad(k)}.csv`, join_(ls), {
    expect: 'bad_time',
    line: dateBad ? 6 : 7,
    what: dateBad ? ls[5] : ls[6],
  });
}
for (let k = 0; k < 3; k++) {
  const rows = stnRows();
  const f = rows[k + 1].split(',');
  f[4] = ['2026-03-32T00:00:00Z', 'soon', '2026-03-06 29:00'][k];
  rows[k + 1] = f.join(',');
  add(`bad-time-station-table-${pad(k)}.csv`, join_(rows), {
    expect: 'bad_time',
    line: k + 2,
    column: 5,
    what: `station table time "${f[4]}"`,
  });
}
for (const [k, [key, v]] of (
  [
    ['bottom_depth', 'deep'],
    ['bottom_depth', '-300'],
    ['latitude', 'north-ish'],
    ['longitude', '12 E W'],
    ['latitude', '34 75.0 S'],
    ['bottom_depth', '15000'],
  ] as const
).entries()) {
  const ls = plainLines();
  const li = { latitude: 2, longitude: 3, bottom_depth: 5 }[key];
  ls[li] = `# ${key}: ${v}`;
  add(`bad-metadata-${pad(k)}.csv`, join_(ls), { expect: 'bad_metadata', line: li + 1, what: `${key} "${v}"` });
}

// ---- salinity outside PSS-78 ----------------------------------------------------------------------
const badS = ['1.5', '45', '0', '99', '-1', '42.5', '1.99', '60'];
for (let k = 0; k < 16; k++) {
  const exchange = k % 4 === 1;
  const ls = exchange ? exchangeLines() : plainLines();
  const li = (exchange ? EX_FIRST_DATA_LINE : PLAIN_FIRST_DATA_LINE) - 1 + int(0, N - 1);
  const f = ls[li].split(',');
  const c = exchange ? 4 : 2;
  f[c] = badS[k % badS.length];
  ls[li] = f.join(',');
  add(`salinity-range-${pad(k)}.${exchange ? 'ex.csv' : 'csv'}`, join_(ls), {
    expect: 'salinity_out_of_range',
    line: li + 1,
    column: c + 1,
    what: `SP ${f[c]}`,
  });
}

// ---- units that cannot be converted ---------------------------------------------------------------
const badUnits: [number, string, string][] = [
  [0, 'pressure [m]', 'pressure in metres'],
  [0, 'pressure [degC]', 'pressure in °C'],
  [0, 'pressure [zorks]', 'unknown pressure unit'],
  [1, 'temperature [furlong]', 'temperature as a length'],
  [1, 'temperature [ITS-90 IPTS-68]', 'two temperature scales'],
  [1, 'temperature [wibble]', 'unknown temperature unit'],
  [2, 'salinity [g/kg]', 'Absolute Salinity where Practical is expected'],
  [2, 'salinity [mol/L]', 'salinity in mol/L'],
  [2, 'salinity [‰]', 'salinity in per mille'],
  [2, 'conductivity [dbar]', 'conductivity in dbar'],
  [2, 'conductivity [mS]', 'conductivity without length'],
];
for (const [k, [c, h, what]] of badUnits.entries()) {
  const ls = plainLines();
  const hdr = [...headerParts];
  hdr[c] = h;
  ls[PLAIN_FIRST_DATA_LINE - 2] = hdr.join(',');
  const code = h.includes('ITS-90 IPTS-68') ? 'unit_unknown' : 'unit_unconvertible';
  add(`unit-${pad(k)}.csv`, join_(ls), { expect: code, line: PLAIN_FIRST_DATA_LINE - 1, column: c + 1, what });
}

// ---- wrong field counts -------------------------------------------------------------------------
for (let k = 0; k < 12; k++) {
  const ls = plainLines();
  const li = PLAIN_FIRST_DATA_LINE - 1 + int(0, N - 3);
  const f = ls[li].split(',');
  if (k % 2) f.push('1.0');
  else f.pop();
  ls[li] = f.join(',');
  add(`field-count-${pad(k)}.csv`, join_(ls), {
    expect: 'field_count',
    line: li + 1,
    what: k % 2 ? 'a line with an extra field' : 'a line with a missing field in the middle of the file',
  });
}

// ---- exchange header and flags ---------------------------------------------------------------------
{
  const base = exchangeLines();
  add('exchange-no-type-line.csv', join_(base.slice(1)), {
    expect: 'exchange_bad_header',
    line: 1,
    what: 'no "CTD,stamp" first line',
  });
  add('exchange-wrong-type-line.csv', join_(['BOTTLE,20260306SGMLNE', ...base.slice(1)]), {
    expect: 'exchange_bottle',
    line: 1,
    what: 'a bottle-file type line: refused as bottle data, not read yet',
  });
  for (const [k, n] of [12, 30, 3].entries()) {
    const ls = exchangeLines();
    ls[2] = `NUMBER_HEADERS = ${n}`;
    add(`exchange-header-count-${pad(k)}.csv`, join_(ls), {
      expect: n > 8 ? 'exchange_bad_header' : 'exchange_bad_header',
      what: `NUMBER_HEADERS = ${n} where there are 8`,
    });
  }
  const ls2 = exchangeLines();
  ls2[2] = 'NUMBER_HEADERS = many';
  add('exchange-header-count-text.csv', join_(ls2), {
    expect: 'exchange_bad_header',
    line: 3,
    what: 'NUMBER_HEADERS is not a number',
  });
  const ls3 = exchangeLines();
  ls3[4] = 'CASTNO: 1';
  add('exchange-header-colon.csv', join_(ls3), {
    expect: 'exchange_bad_header',
    line: 5,
    what: 'a header line without "="',
  });
  const ls4 = exchangeLines();
  ls4[EX_HEAD.length - 1] = 'DBAR,,ITS-90,,PSS-78';
  add('exchange-units-short.csv', join_(ls4), {
    expect: 'exchange_bad_header',
    line: EX_HEAD.length,
    what: 'the units line has too few fields',
  });
  const ls5 = exchangeLines();
  ls5[EX_HEAD.length - 1] = 'DBAR,,ITS-90,,PSS-78,,UMOL/KG,,EXTRA,MORE';
  add('exchange-units-long.csv', join_(ls5), {
    expect: 'exchange_bad_header',
    line: EX_HEAD.length,
    what: 'the units line has too many fields',
  });
  const ls6 = exchangeLines();
  ls6[EX_HEAD.length - 2] = 'CTDPRS,,CTDTMP,CTDTMP_FLAG_W,CTDSAL,CTDSAL_FLAG_W,CTDOXY,CTDOXY_FLAG_W';
  add('exchange-empty-parameter.csv', join_(ls6), {
    expect: 'exchange_bad_header',
    line: EX_HEAD.length - 1,
    what: 'an empty parameter name',
  });
  const ls7 = exchangeLines();
  ls7[EX_HEAD.length - 1] = 'DBAR,,DEG F?,,PSS-78,,UMOL/KG,';
  add('exchange-unit-unknown.csv', join_(ls7), {
    expect: 'unit_unconvertible',
    line: EX_HEAD.length,
    column: 3,
    what: 'an unknown temperature unit',
  });
  for (let k = 0; k < 10; k++) {
    const ls = exchangeLines();
    const li = EX_FIRST_DATA_LINE - 1 + int(0, N - 1);
    const f = ls[li].split(',');
    const c = pick([1, 3, 5, 7]);
    f[c] = ['12', 'x', '2.5', '-3', '10', 'NaN', 'ok', '99', '1e1', '3a'][k];
    ls[li] = f.join(',');
    add(`exchange-bad-flag-${pad(k)}.csv`, join_(ls), {
      expect: 'bad_flag',
      line: li + 1,
      column: c + 1,
      what: `flag "${f[c]}"`,
    });
  }
}

// ---- station tables ------------------------------------------------------------------------------
add('station-table-no-latitude.csv', join_(['station,cast,longitude,time', 'A-01,1,-22.0,2026-03-06T01:00:00Z']), {
  expect: 'missing_column',
  what: 'a station table without latitude (read as a cast table: no columns recognised)',
});
add('station-table-duplicate.csv', join_([...stnRows(), 'A-02,1,-34.10,-21.50,2026-03-06T05:00:00Z,3100']), {
  expect: 'duplicate_station',
  line: 5,
  what: 'a station listed twice',
});
add('station-table-short-row.csv', join_([...stnRows().slice(0, 3), 'A-03,1,-34.20']), {
  expect: 'truncated',
  line: 4,
  what: 'a station table cut off',
});
add('station-table-no-rows.csv', join_([STN_HEADER]), { expect: 'no_data', what: 'a station table header only' });
add('station-table-empty-station.csv', join_([...stnRows(), ',1,-34.30,-20.50,2026-03-06T13:00:00Z,3300']), {
  expect: 'bad_metadata',
  line: 5,
  column: 1,
  what: 'a row without a station',
});

// ---- missing vertical values and the rest ------------------------------------------------------------
{
  const ls = plainLines().map((l, i) =>
    i >= PLAIN_FIRST_DATA_LINE - 1 ? '-999,' + l.split(',').slice(1).join(',') : l,
  );
  add('all-pressures-missing.csv', join_(ls), { expect: 'no_data', what: 'every pressure is the fill value' });
  const ls2 = plainLines();
  ls2[PLAIN_FIRST_DATA_LINE - 2] = Array.from({ length: 600 }, (_, i) => (i < 4 ? headerParts[i] : `v${i}`)).join(',');
  add('too-many-columns.csv', join_(ls2), {
    expect: 'too_many_columns',
    line: PLAIN_FIRST_DATA_LINE - 1,
    what: 'a header of 600 columns',
  });
}

// ---- zips -------------------------------------------------------------------------------------------
function zipOf(list: { name: string; data: Buffer; compress?: boolean }[]): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const z = new yazl.ZipFile();
    for (const e of list)
      z.addBuffer(e.data, e.name, { mtime: new Date('2026-03-06T00:00:00Z'), compress: e.compress ?? true });
    z.end();
    const chunks: Buffer[] = [];
    z.outputStream.on('data', (c: Buffer) => chunks.push(c));
    z.outputStream.on('end', () => resolve(Buffer.concat(chunks)));
    z.outputStream.on('error', reject);
  });
}
/** yazl refuses unsafe names, as it should; write a same-length stand-in and patch it in. */
function patchName(zip: Buffer, standIn: string, evil: string): Buffer {
  const a = Buffer.from(standIn);
  const b = Buffer.from(evil);
  if (a.length !== b.length) throw new Error('stand-in name must have the same length');
  const out = Buffer.from(zip);
  let i = out.indexOf(a);
  let n = 0;
  while (i >= 0) {
    b.copy(out, i);
    n++;
    i = out.indexOf(a, i + 1);
  }
  if (n < 2) throw new Error('name not found in both headers');
  return out;
}

async function zips(): Promise<void> {
  const good = Buffer.from(join_(plainLines()));
  const evil = [
    '../evil.csv',
    'a/../../b.csv',
    '/etc/evil.csv',
    'C:/evil.csv',
    '..\\evil.csv',
    'casts/../../../x.csv',
    'C:\\temp\\x.csv',
  ];
  for (const [k, name] of evil.entries()) {
    const standIn = 'Q'.repeat(name.length);
    const z = await zipOf([
      { name: 'casts/ok.csv', data: good },
      { name: standIn, data: good },
    ]);
    add(`zip-unsafe-path-${pad(k)}.zip`, patchName(z, standIn, name), {
      expect: 'zip_unsafe_path',
      what: `a zip entry named ${name}`,
    });
  }
  // Zip bombs: refused from the central directory, before anything is inflated.
  add('zip-bomb-one-big-entry.zip', await zipOf([{ name: 'zeros.csv', data: Buffer.alloc(80 * 1024 * 1024, 0x30) }]), {
    expect: 'zip_too_large',
    what: 'one entry of 80 MB of "0" (about 1000:1)',
  });
  add('zip-bomb-ratio.zip', await zipOf([{ name: 'zeros.csv', data: Buffer.alloc(12 * 1024 * 1024, 0x30) }]), {
    expect: 'zip_ratio',
    what: 'an entry of 12 MB compressed about 1000:1',
  });
  add(
    'zip-bomb-many-entries.zip',
    await zipOf(
      Array.from({ length: 2500 }, (_, i) => ({ name: `c/${i}.csv`, data: Buffer.from('p,t,s\n'), compress: false })),
    ),
    { expect: 'zip_too_many_entries', what: '2500 entries' },
  );
  add(
    'zip-bomb-many-big.zip',
    await zipOf(
      Array.from({ length: 7 }, (_, i) => ({ name: `c/${i}.csv`, data: Buffer.alloc(45 * 1024 * 1024, 0x31 + i) })),
    ),
    { expect: 'zip_ratio', what: 'seven entries of 45 MB each (315 MB in all), each about 1000:1' },
  );
  const inner = await zipOf([{ name: 'a.csv', data: good }]);
  add('zip-nested.zip', await zipOf([{ name: 'inner.zip', data: inner }]), {
    expect: 'zip_nested',
    what: 'a zip inside a zip',
  });
  add('zip-nested-renamed.zip', await zipOf([{ name: 'inner.csv', data: inner }]), {
    expect: 'zip_nested',
    what: 'a zip inside a zip, named .csv',
  });
  add('zip-empty.zip', await zipOf([]), { expect: 'zip_empty', what: 'a zip with no entries' });
  const whole = await zipOf([
    { name: 'a.csv', data: good },
    { name: 'b.csv', data: good },
  ]);
  for (let k = 0; k < 5; k++) {
    const cut = whole.subarray(0, Math.floor(whole.length * (0.2 + 0.15 * k)));
    add(`zip-corrupt-${pad(k)}.zip`, cut, { expect: 'zip_corrupt', what: `a zip cut to ${(20 + 15 * k).toString()}%` });
  }
  add('zip-not-a-zip.zip', 'this is not a zip\n', { expect: 'zip_corrupt', what: 'text named .zip' });
  // A zip whose one bad entry fails the whole upload, naming the entry.
  const ls = plainLines();
  const li = PLAIN_FIRST_DATA_LINE + 20;
  const f = ls[li].split(',');
  f[1] = 'warm';
  ls[li] = f.join(',');
  add(
    'zip-one-bad-entry.zip',
    await zipOf([
      { name: 'casts/good.csv', data: good },
      { name: 'casts/bad.csv', data: Buffer.from(join_(ls)) },
    ]),
    {
      expect: 'text_in_numeric',
      errorFile: 'casts/bad.csv',
      line: li + 1,
      column: 2,
      what: 'a zip with one cast holding text in a number',
    },
  );
}

// ---- malformed netCDF (no random numbers here, so the files above stay as they were) ---------
{
  const T = (p: number): number => 4 + 16 * Math.exp(-p / 300);
  const S = (p: number): number => 34.6 + Math.exp(-p / 250);
  const ps = Array.from({ length: 40 }, (_, k) => 2 + 2 * k);
  const cf = (
    o: {
      globals?: Record<string, string>;
      lat?: number;
      temp?: number[] | null;
      drop?: string[];
      rowSize?: number[];
    } = {},
  ): Buffer => {
    const vars: NcVariable[] = [
      {
        name: 'latitude',
        type: 'double',
        dimensions: [],
        attributes: { standard_name: 'latitude', units: 'degrees_north' },
        data: [o.lat ?? -40],
      },
      {
        name: 'longitude',
        type: 'double',
        dimensions: [],
        attributes: { standard_name: 'longitude', units: 'degrees_east' },
        data: [12],
      },
      {
        name: 'time',
        type: 'double',
        dimensions: [],
        attributes: { standard_name: 'time', units: 'days since 2026-01-01' },
        data: [3],
      },
      {
        name: 'pres',
        type: 'double',
        dimensions: ['z'],
        attributes: { standard_name: 'sea_water_pressure', units: 'dbar' },
        data: ps,
      },
      {
        name: 'temp',
        type: 'double',
        dimensions: ['z'],
        attributes: { standard_name: 'sea_water_temperature', units: 'degree_Celsius' },
        data: o.temp ?? ps.map(T),
      },
      {
        name: 'psal',
        type: 'double',
        dimensions: ['z'],
        attributes: { standard_name: 'sea_water_practical_salinity', units: '1' },
        data: ps.map(S),
      },
    ];
    if (o.rowSize)
      vars.push({
        name: 'row_size',
        type: 'int',
        dimensions: ['profile'],
        attributes: { sample_dimension: 'z' },
        data: o.rowSize,
      });
    return writeNetcdf({
      dimensions: [{ name: 'z', size: ps.length }, ...(o.rowSize ? [{ name: 'profile', size: o.rowSize.length }] : [])],
      globalAttributes: { Conventions: 'CF-1.8', featureType: 'profile', station: 'N-1', ...o.globals },
      variables: vars.filter((v) => !(o.drop ?? []).includes(v.name)),
    });
  };
  const good = cf();
  for (const [k, frac] of [0.3, 0.6, 0.9].entries())
    add(`netcdf-truncated-${pad(k)}.nc`, good.subarray(0, Math.floor(good.length * frac)), {
      expect: 'netcdf_corrupt',
      what: `a netCDF file cut to ${frac * 100}%`,
    });
  const garbled = Buffer.from(good);
  garbled.fill(0xee, 8, 40);
  add('netcdf-garbled-header.nc', garbled, { expect: 'netcdf_corrupt', what: 'netCDF magic, then a garbled header' });
  add('netcdf-cdf5.nc', Buffer.concat([Buffer.from('CDF\x05'), good.subarray(4)]), {
    expect: 'netcdf_unsupported',
    what: 'netCDF-3 with 64-bit data (CDF-5)',
  });
  add(
    'netcdf-hdf5.nc',
    Buffer.concat([Buffer.from([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(200, 1)]),
    { expect: 'netcdf_unsupported', what: 'a netCDF-4 (HDF5) file' },
  );
  add('netcdf-timeseries.nc', cf({ globals: { featureType: 'timeSeries' } }), {
    expect: 'netcdf_not_profile',
    what: 'a CF time series, not a profile',
  });
  add('netcdf-no-temperature.nc', cf({ drop: ['temp'] }), {
    expect: 'missing_column',
    what: 'no temperature variable',
  });
  add('netcdf-hot-water.nc', cf({ temp: ps.map(() => 80) }), {
    expect: 'temperature_out_of_range',
    what: 'temperature 80 °C at every level',
  });
  add('netcdf-latitude.nc', cf({ lat: 95 }), { expect: 'latitude_out_of_range', what: 'latitude 95°' });
  add('netcdf-ragged-overrun.nc', cf({ rowSize: [30, 30] }), {
    expect: 'netcdf_bad_structure',
    what: 'row_size adds up to more levels than the file has',
  });
}

// ---- malformed acquisition text exports (no random numbers here either) -----------------------
{
  const good = acquisitionSamples()['acquisition-two-pairs.txt'].split('\n');
  if (good[good.length - 1] === '') good.pop();
  const endAt = good.indexOf('*END*'); // 0-based
  const firstData = endAt + 1;
  const mod = (f: (ls: string[]) => void): string => {
    const ls = [...good];
    f(ls);
    return join_(ls);
  };
  add(
    'acquisition-no-end.txt',
    mod((ls) => ls.splice(endAt, 1)),
    { expect: 'acquisition_missing_end', line: endAt + 1, what: 'no *END* line: data inside the header' },
  );
  add('acquisition-header-only.txt', join_(good.slice(0, endAt)), {
    expect: 'acquisition_missing_end',
    what: 'a header that never ends',
  });
  add(
    'acquisition-declaration-gap.txt',
    mod((ls) => {
      const i = ls.findIndex((l) => l.startsWith('# name 3 ='));
      ls.splice(i, 1);
    }),
    {
      expect: 'acquisition_bad_header',
      what: 'column declarations 0, 1, 2, 4, … (3 missing)',
    },
  );
  add(
    'acquisition-bad-flag-text.txt',
    mod((ls) => {
      const i = ls.findIndex((l) => l.startsWith('# bad_flag'));
      ls[i] = '# bad_flag = none';
    }),
    {
      expect: 'acquisition_bad_header',
      line: good.findIndex((l) => l.startsWith('# bad_flag')) + 1,
      what: 'a bad_flag that is not a number',
    },
  );
  add(
    'acquisition-no-temperature.txt',
    mod((ls) => {
      for (const n of [1, 2]) {
        const i = ls.findIndex((l) => l.startsWith(`# name ${n} =`));
        ls[i] = ls[i].replace(/Temperature(, 2)? \[ITS-90, deg C\]/, 'Sensor $1 [V]');
      }
    }),
    { expect: 'missing_column', what: 'no column declared as a temperature' },
  );
  add(
    'acquisition-field-count.txt',
    mod((ls) => {
      ls[firstData + 30] = ls[firstData + 30].trim().split(/\s+/).slice(0, 7).join('  ');
    }),
    {
      expect: 'field_count',
      line: firstData + 31,
      what: 'a data line with 7 of 11 fields',
    },
  );
  add(
    'acquisition-text-in-data.txt',
    mod((ls) => {
      const f = ls[firstData + 5].trim().split(/\s+/);
      f[1] = 'warm';
      ls[firstData + 5] = f.join('  ');
    }),
    {
      expect: 'text_in_numeric',
      line: firstData + 6,
      column: 2,
      what: 'text in the temperature column',
    },
  );
  add(
    'acquisition-nmea-latitude.txt',
    mod((ls) => {
      const i = ls.findIndex((l) => l.startsWith('* NMEA Latitude'));
      ls[i] = '* NMEA Latitude = 95 00.00 N';
    }),
    {
      expect: 'latitude_out_of_range',
      line: good.findIndex((l) => l.startsWith('* NMEA Latitude')) + 1,
      what: 'an NMEA latitude of 95°',
    },
  );
  const whole = join_(good);
  add('acquisition-truncated.txt', whole.slice(0, whole.length - 30), {
    expect: 'truncated',
    line: good.length,
    what: 'cut off in the last data line',
  });
}

async function main(): Promise<void> {
  await zips();
  mkdirSync(OUT, { recursive: true });
  for (const f of readdirSync(OUT)) rmSync(join(OUT, f));
  for (const [name, data] of files) writeFileSync(join(OUT, name), data);
  writeFileSync(
    join(OUT, 'manifest.json'),
    JSON.stringify({ generatedBy: 'scripts/make-bad-corpus.ts', count: entries.length, files: entries }, null, 1) +
      '\n',
  );
  console.log(`wrote ${entries.length} malformed files to ${OUT}`);
}

await main();
