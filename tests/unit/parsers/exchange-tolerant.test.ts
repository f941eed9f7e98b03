// The exchange-format CTD reader takes files the way data offices and spreadsheets write them:
// header keys in other spellings and cases, `#` lines padded with commas, UTF-8 in comments,
// -999 fills anywhere, flags per value, no SECT_ID/DEPTH/TIME (warnings), the station and cast
// from the standard file name; bottle files are refused by name of what they are.
// The files are written here (invented values); what is checked is reading behaviour.
import { describe, expect, it } from 'vitest';
import { parseUpload } from '../../../server/parsers/index';
import { stationCastFromFileName } from '../../../server/parsers/exchange';
import type { ParsedCast } from '../../../shared/schemas/cast';

const tAt = (p: number): number => 4 + 16 * Math.exp(-p / 300);
const sAt = (p: number): number => 34.6 + Math.exp(-p / 250);

type Opts = { header: string[]; pad?: boolean; fills?: Record<number, 'T' | 'S'>; comments?: string[] };
function exchange(o: Opts): Buffer {
  const padTo = (l: string) => (o.pad ? l + ',,,,,,' : l);
  const rows: string[] = [];
  for (let k = 0; k < 60; k++) {
    const p = 2 + 4 * k;
    const t = o.fills?.[k] === 'T' ? '-999.0000' : tAt(p).toFixed(4);
    const s = o.fills?.[k] === 'S' ? '-9.990e+02' : sAt(p).toFixed(4);
    rows.push(
      padTo(
        [
          p.toFixed(1),
          '2',
          t,
          o.fills?.[k] === 'T' ? '9' : k === 7 ? '3' : '2',
          s,
          o.fills?.[k] === 'S' ? '9' : '2',
        ].join(','),
      ),
    );
  }
  return Buffer.from(
    [
      padTo('CTD,20260301SIGMAL'),
      ...(o.comments ?? ['# Invented for a reader test']).map(padTo),
      padTo(`NUMBER_HEADERS = ${o.header.length + 1}`),
      ...o.header.map(padTo),
      padTo('CTDPRS,CTDPRS_FLAG_W,CTDTMP,CTDTMP_FLAG_W,CTDSAL,CTDSAL_FLAG_W'),
      padTo('DBAR,,ITS-90,,PSS-78,'),
      ...rows,
      padTo('END_DATA'),
    ].join('\n') + '\n',
  );
}

async function one(
  name: string,
  bytes: Buffer,
): Promise<{ cast: ParsedCast; warnings: { code: string; message: string }[] }> {
  const r = await parseUpload(name, bytes);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  expect(r.casts).toHaveLength(1);
  return { cast: r.casts[0], warnings: r.warnings };
}

const POSITION = ['LATITUDE = -34.5', 'LONGITUDE = 12.25'];

describe('tolerant exchange-format CTD files', () => {
  it.each([
    ['STNNBR', 'CASTNO'],
    ['stnnbr', 'castno'],
    ['STN_NBR', 'CAST_NO'],
    ['Station_Number', 'Cast_Number'],
    ['STNNO', 'CASTNBR'],
    ['STATION', 'CAST'],
    ['station_no', 'cast_num'],
  ])('station key %s and cast key %s', async (sk, ck) => {
    const { cast } = await one(
      'x.csv',
      exchange({ header: [`${sk} = 17`, `${ck} = 2`, ...POSITION, 'DATE = 20260302', 'TIME = 1415'] }),
    );
    expect(cast.metadata).toMatchObject({
      station: '17',
      cast: '2',
      latitude: -34.5,
      longitude: 12.25,
      time: '2026-03-02T14:15:00Z',
    });
  });

  it('comment and header lines padded with commas, UTF-8 in comments, -999 fills in any column, flags per value', async () => {
    const bytes = exchange({
      header: [
        'EXPOCODE = 99XX20260301',
        'SECT_ID = T1',
        'STNNBR = 4',
        'CASTNO = 1',
        ...POSITION,
        'DATE = 20260302',
        'TIME = 0930',
        'DEPTH = 2500',
      ],
      pad: true,
      comments: ['# Température (°C) and µmol/kg – ≥ 2 dbar; “quoted”', '#  another comment'],
      fills: { 3: 'T', 11: 'S' },
    });
    const { cast, warnings } = await one('x.csv', bytes);
    expect(cast.profile.levels).toBe(60);
    expect(cast.metadata.bottomDepth).toBe(2500);
    expect(Number.isNaN(cast.columns.temperature[3])).toBe(true);
    expect(cast.flags.temperature[3]).toBe(9);
    expect(Number.isNaN(cast.columns.salinity![11])).toBe(true);
    expect(cast.flags.salinity[11]).toBe(9);
    expect(cast.flags.temperature[7]).toBe(3);
    expect(cast.columns.temperature[8]).toBeCloseTo(tAt(34), 4);
    expect(warnings.filter((w) => w.code === 'missing_header')).toEqual([]);
  });

  it('no SECT_ID, DEPTH or TIME: read, with a warning for each', async () => {
    const { cast, warnings } = await one(
      'x.csv',
      exchange({ header: ['STNNBR = 5', 'CASTNO = 1', ...POSITION, 'DATE = 20260302'] }),
    );
    expect(cast.metadata.time).toBe('2026-03-02T00:00:00Z');
    expect(cast.metadata.bottomDepth).toBeNull();
    const msgs = warnings
      .filter((w) => w.code === 'missing_header')
      .map((w) => w.message)
      .join(' | ');
    expect(msgs).toMatch(/SECT_ID/);
    expect(msgs).toMatch(/DEPTH/);
    expect(msgs).toMatch(/TIME/);
    expect(cast.notes.join(' ')).toMatch(/00:00 UTC/);
  });

  it('station and cast from the standard file name EXPOCODE_STATION_CAST_ct1.csv, said in the notes', async () => {
    const { cast } = await one(
      'cruise/33XX20260301_00012_00003_ct1.csv',
      exchange({ header: [...POSITION, 'DATE = 20260302', 'TIME = 0100'] }),
    );
    expect(cast.metadata.station).toBe('12');
    expect(cast.metadata.cast).toBe('3');
    expect(cast.notes.join(' ')).toMatch(/station 12 and cast 3 taken from the file name/);
    // the header wins where it has the value
    const { cast: c2 } = await one(
      '33XX20260301_00012_00003_ct1.csv',
      exchange({ header: ['STNNBR = 99', ...POSITION, 'DATE = 20260302'] }),
    );
    expect(c2.metadata.station).toBe('99');
    expect(c2.metadata.cast).toBe('3');
  });

  it('file-name pattern', () => {
    expect(stationCastFromFileName('74JC20150110_00001_00001_ct1.csv')).toEqual({ station: '1', cast: '1' });
    expect(stationCastFromFileName('a/b/320620140320_A23_00002_ct1.csv')).toEqual({ station: 'A23', cast: '2' });
    expect(stationCastFromFileName('station_12.csv')).toBeNull();
  });

  it('a bottle file is refused as bottle data, not with a parse error', async () => {
    const bottle = Buffer.from(
      'BOTTLE,20260301SIGMAL\n# invented\nEXPOCODE,SECT_ID,STNNBR,CASTNO,SAMPNO,CTDPRS,SALNTY,SALNTY_FLAG_W\n,,,,,DBAR,PSS-78,\n99XX,T1,1,1,24,5.0,34.5,2\nEND_DATA\n',
    );
    for (const name of ['99XX20260301_hy1.csv', 'bottles.csv']) {
      const r = await parseUpload(name, bottle);
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.errors[0].code).toBe('exchange_bottle');
        expect(r.errors[0].message).toMatch(/bottle data are not read yet/);
      }
    }
    // no type line, but the data office's bottle file name and a bottle header
    const r = await parseUpload('99XX20260301_hy1.csv', Buffer.from(bottle.toString().split('\n').slice(1).join('\n')));
    expect(!r.ok && r.errors[0].code).toBe('exchange_bottle');
  });
});
