// Reads the SR1B 2015 CTD files straight from the data office's zip (fixtures/real/sr1b-2015) with netcdfjs, as
// ParsedCasts, for checks only. "Data were collected and made publicly available by the International Global
// Ship-based Hydrographic Investigations Program (GO-SHIP; http://www.go-ship.org/) with National Capability
// funding from the UK Natural Environment Research Council to the National Oceanography Centre."
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import yauzl from 'yauzl';
import { NetCDFReader } from 'netcdfjs';
import type { ParsedCast } from '../../../shared/schemas/cast';

const ZIP = join(process.cwd(), 'fixtures/real/sr1b-2015/74JC20150110_nc_ctd.zip');

function entries(buf: Buffer): Promise<{ name: string; bytes: Buffer }[]> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      const out: { name: string; bytes: Buffer }[] = [];
      zip.on('entry', (e: yauzl.Entry) => {
        zip.openReadStream(e, (err2, s) => {
          if (err2 || !s) return reject(err2);
          const chunks: Buffer[] = [];
          s.on('data', (c: Buffer) => chunks.push(c));
          s.on('end', () => {
            out.push({ name: e.fileName, bytes: Buffer.concat(chunks) });
            zip.readEntry();
          });
        });
      });
      zip.on('end', () => resolve(out));
      zip.readEntry();
    });
  });
}

export async function readSr1b(): Promise<ParsedCast[]> {
  const files = (await entries(readFileSync(ZIP)))
    .filter((e) => e.name.endsWith('.nc'))
    .sort((a, b) => a.name.localeCompare(b.name));
  return files.map(({ name, bytes }) => {
    const nc = new NetCDFReader(bytes);
    const col = (v: string) => Float64Array.from(nc.getDataVariable(v) as number[], (x) => (x < -900 ? NaN : x));
    const p = col('pressure');
    const n = p.length;
    const station = String(nc.getAttribute('STATION_NUMBER')).trim();
    const lat = (nc.getDataVariable('latitude') as number[])[0];
    const lon = (nc.getDataVariable('longitude') as number[])[0];
    return {
      file: name,
      format: 'exchange',
      vertical: 'pressure',
      metadata: { station, cast: '1', latitude: lat, longitude: lon, time: null, bottomDepth: null, extra: {} },
      columns: { pressure: p, temperature: col('temperature'), salinity: col('salinity'), oxygen: col('oxygen') },
      units: { oxygen: 'umol/kg' },
      extras: {},
      flags: {},
      profile: { levels: n, downcastEnd: n - 1, hasUpcast: false, reversals: 0 },
      notes: [],
    } satisfies ParsedCast;
  });
}
