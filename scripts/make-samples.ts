// Writes fixtures/samples/: one small good file of every accepted upload format, with invented
// values from a smooth made-up profile (parser behaviour only, never a science check).
// Run: npx tsx scripts/make-samples.ts
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import yazl from 'yazl';
import { netcdfSamples } from './lib/netcdfSamples';
import { acquisitionSamples } from './lib/acquisitionSamples';

const OUT = join(import.meta.dirname, '..', 'fixtures', 'samples');

/** A smooth invented profile at pressure p (dbar). */
export function sampleProfile(p: number): { t: number; s: number; o2: number; fl: number } {
  return {
    t: 4 + 16 * Math.exp(-p / 300),
    s: 34.6 + 1.0 * Math.exp(-p / 250),
    o2: 220 - 50 * Math.exp(-(((p - 600) / 200) ** 2)),
    fl: 0.05 + 0.8 * Math.exp(-(((p - 60) / 25) ** 2)),
  };
}

const META = [
  '# station: K-07',
  '# cast: 1',
  '# latitude: -34.1250',
  '# longitude: -21.5000',
  '# time: 2026-03-04T05:06:00Z',
  '# bottom_depth: 1480',
];

function levels(n: number, step = 2, start = 2): number[] {
  return Array.from({ length: n }, (_, i) => start + i * step);
}

function csvCast(sep: string, header: string[], rows: (p: number) => string[], ps: number[], meta = META): string {
  return [...meta, header.join(sep), ...ps.map((p) => rows(p).join(sep))].join('\n') + '\n';
}

const P = levels(200); // 2..400 dbar
const files: Record<string, string | Buffer> = {};

files['plain.csv'] = csvCast(
  ',',
  ['pressure [dbar]', 'temperature [ITS-90 degC]', 'salinity [PSS-78]', 'oxygen [umol/kg]'],
  (p) => {
    const v = sampleProfile(p);
    return [p.toFixed(1), v.t.toFixed(4), v.s.toFixed(4), v.o2.toFixed(1)];
  },
  P,
);

files['plain-tab.tsv'] = csvCast(
  '\t',
  ['pressure [dbar]', 'temperature [ITS-90 degC]', 'salinity [PSS-78]'],
  (p) => {
    const v = sampleProfile(p);
    return [p.toFixed(1), v.t.toFixed(4), v.s.toFixed(4)];
  },
  P,
);

files['plain-bom.csv'] = Buffer.concat([
  Buffer.from([0xef, 0xbb, 0xbf]),
  Buffer.from(files['plain-tab.tsv'].toString().replace(/\t/g, ',')),
]);

files['plain-semicolon-decimal-comma.csv'] = csvCast(
  ';',
  ['Pressure (dbar)', 'Temperature (°C ITS-90)', 'Salinity (PSU)'],
  (p) => {
    const v = sampleProfile(p);
    return [p.toFixed(1), v.t.toFixed(4), v.s.toFixed(4)].map((x) => x.replace('.', ','));
  },
  P,
);

files['plain-ipts68.csv'] = csvCast(
  ',',
  ['pressure [dbar]', 'temperature [IPTS-68 degC]', 'salinity [PSS-78]'],
  (p) => {
    const v = sampleProfile(p);
    return [p.toFixed(1), (v.t * 1.00024).toFixed(4), v.s.toFixed(4)];
  },
  P,
);

// Conductivity in S/m (values ~ 3.3–5.0) instead of salinity; pressure in kPa; temperature in K.
files['plain-conductivity-sm.csv'] = csvCast(
  ',',
  ['pressure [kPa]', 'temperature [K]', 'conductivity [S/m]'],
  (p) => {
    const v = sampleProfile(p);
    const c = 3.0 + 0.09 * v.t + 0.0 * v.s; // invented, monotone in t: parser test only
    return [(p * 10).toFixed(1), (v.t + 273.15).toFixed(4), c.toFixed(5)];
  },
  P,
);

files['plain-depth.csv'] = csvCast(
  ',',
  ['depth [m]', 'temperature [ITS-90 degC]', 'salinity [PSS-78]'],
  (p) => {
    const v = sampleProfile(p);
    return [(p * 0.9933).toFixed(2), v.t.toFixed(4), v.s.toFixed(4)];
  },
  P,
);

files['plain-whitespace.txt'] = csvCast(
  '   ',
  ['pressure [dbar]', 'temperature [ITS-90 degC]', 'salinity [PSS-78]'],
  (p) => {
    const v = sampleProfile(p);
    return [p.toFixed(1).padStart(7), v.t.toFixed(4), v.s.toFixed(4)];
  },
  P,
);

// A full cast with a pressure reversal (ship heave) on the way down and an upcast to 10 dbar,
// plus a fluorescence extra with its own flag column and a temperature flag column.
{
  const down = levels(150); // 2..300
  const ps: number[] = [];
  for (const p of down) {
    ps.push(p);
    if (p === 100) ps.push(99, 98); // heave: pressure goes back 2 dbar
  }
  for (let p = 296; p >= 10; p -= 4) ps.push(p);
  files['plain-upcast.csv'] = csvCast(
    ',',
    [
      'pressure [dbar]',
      'temperature [ITS-90 degC]',
      'temperature_flag',
      'salinity [PSS-78]',
      'fluorescence [mg/m^3]',
      'fluorescence_flag',
    ],
    (p) => {
      const v = sampleProfile(p);
      return [p.toFixed(1), v.t.toFixed(4), p === 50 ? '3' : '2', v.s.toFixed(4), v.fl.toFixed(3), '2'];
    },
    ps,
  );
}

// The exchange format with flags and fill values.
{
  const rows = P.map((p, i) => {
    const v = sampleProfile(p);
    const oxyMissing = i % 50 === 7;
    return [
      p.toFixed(1),
      '2',
      v.t.toFixed(4),
      '2',
      v.s.toFixed(4),
      i === 20 ? '3' : '2',
      oxyMissing ? '-999.0' : v.o2.toFixed(1),
      oxyMissing ? '9' : '2',
    ]
      .map((x) => x.padStart(8))
      .join(',');
  });
  files['exchange_ct1.csv'] =
    [
      'CTD,20260304SGMLNE',
      '# Invented sample for parser tests',
      '# Sigmaline fixtures',
      'NUMBER_HEADERS = 10',
      'EXPOCODE = 99TS20260301',
      'SECT_ID = CRW',
      'STNNBR = 12',
      'CASTNO = 1',
      'DATE = 20260304',
      'TIME = 0506',
      'LATITUDE = -34.2500',
      'LONGITUDE = 339.5000',
      'DEPTH = 1480',
      'CTDPRS,CTDPRS_FLAG_W,CTDTMP,CTDTMP_FLAG_W,CTDSAL,CTDSAL_FLAG_W,CTDOXY,CTDOXY_FLAG_W',
      'DBAR,,ITS-90,,PSS-78,,UMOL/KG,',
      ...rows,
      'END_DATA',
    ].join('\n') + '\n';
}

files['stations.csv'] =
  [
    'station,cast,latitude,longitude,time,bottom_depth',
    'K-07,1,-34.1250,-21.5000,2026-03-04T05:06:00Z,1480',
    'K-08,1,-34.2000,-21.0000,2026-03-04T09:40:00Z,2210',
    'K-09,1,35 15.0 S,20 30.0 W,2026-03-04T14:12:00Z,3050',
  ].join('\n') + '\n';

function zipOf(entries: Record<string, string | Buffer>): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const z = new yazl.ZipFile();
    for (const [name, data] of Object.entries(entries))
      z.addBuffer(Buffer.isBuffer(data) ? data : Buffer.from(data), name, { mtime: new Date('2026-03-05T00:00:00Z') });
    z.end();
    const chunks: Buffer[] = [];
    z.outputStream.on('data', (c: Buffer) => chunks.push(c));
    z.outputStream.on('end', () => resolve(Buffer.concat(chunks)));
    z.outputStream.on('error', reject);
  });
}

async function main(): Promise<void> {
  mkdirSync(OUT, { recursive: true });
  // Casts in the zip carry only the station; the station table in the zip supplies the rest.
  const bare = (station: string, from: string): string =>
    [`# station: ${station}`, `# cast: 1`, ...from.split('\n').filter((l) => !l.startsWith('#'))].join('\n');
  files['casts.zip'] = await zipOf({
    'casts/K-08.csv': bare('K-08', files['plain.csv'] as string),
    'casts/K-09.tsv': bare('K-09', files['plain-tab.tsv'] as string),
    'casts/stations.csv': files['stations.csv'],
    'casts/exchange_ct1.csv': files['exchange_ct1.csv'],
  });
  Object.assign(files, netcdfSamples(), acquisitionSamples());
  for (const [name, data] of Object.entries(files)) writeFileSync(join(OUT, name), data);
  console.log(`wrote ${Object.keys(files).length} samples to ${OUT}`);
}

await main();
