import { describe, expect, it } from 'vitest';
import {
  ISOPYCNAL_COLUMNS,
  PRESSURE_COLUMNS,
  buildIsopycnalTable,
  formatFlags,
  parseDeliveryTable,
  parseFlags,
  type IsopycnalRow,
} from '../../../server/services/deliveries/table';
import { provenance } from './synthetic';

const row = (over: Partial<IsopycnalRow> = {}): IsopycnalRow => ({
  station: 'K-07',
  cast: '1',
  latitude: -35.25,
  longitude: -20.5,
  sigma_ref: 0,
  sigma_level: 26.5,
  pressure: 412.5,
  depth: 409.1,
  CT: 8.25,
  SA: 34.9,
  thickness: 33.3,
  crossings: 1,
  flags: [],
  ...over,
});

describe('delivery table contract', () => {
  it('has the api.md isopycnal column order and the documented pressure columns', () => {
    expect(ISOPYCNAL_COLUMNS.map((c) => c.name).join(',')).toBe(
      'station,cast,latitude,longitude,sigma_ref,sigma_level,pressure,depth,CT,SA,thickness,crossings,flags',
    );
    expect(
      PRESSURE_COLUMNS.map((c) => c.name)
        .slice(0, 9)
        .join(','),
    ).toBe('station,cast,latitude,longitude,pressure,count,CT,SA,sigma0');
  });

  it('builds rows in column order, empty cells as null, extras after the contract columns', () => {
    const t = buildIsopycnalTable(
      [
        row({ extras: { oxygen: 251.5, time: '2026-03-04T05:06:00Z' } }),
        row({
          sigma_level: 27.9,
          pressure: null,
          depth: null,
          CT: NaN,
          SA: null,
          thickness: null,
          crossings: null,
          flags: ['below_bottom'],
          extras: { oxygen: null },
        }),
      ],
      provenance(),
    );
    expect(t.columns.map((c) => c.name).slice(13)).toEqual(['oxygen', 'time']);
    expect(t.columns[13].type).toBe('number');
    expect(t.columns[14].type).toBe('string');
    expect(t.rows[0]).toEqual([
      'K-07',
      '1',
      -35.25,
      -20.5,
      0,
      26.5,
      412.5,
      409.1,
      8.25,
      34.9,
      33.3,
      1,
      null,
      251.5,
      '2026-03-04T05:06:00Z',
    ]);
    expect(t.rows[1].slice(6)).toEqual([null, null, null, null, null, null, 'below_bottom', null, null]);
  });

  it('joins and splits flags in the contract order', () => {
    expect(formatFlags(['in_inversion', 'outcrop', 'multi_crossing'])).toBe('outcrop;multi_crossing;in_inversion');
    expect(formatFlags([])).toBeNull();
    expect(parseFlags('outcrop;in_inversion')).toEqual(['outcrop', 'in_inversion']);
    expect(parseFlags('')).toEqual([]);
    expect(() => parseFlags('outcrop;sideways')).toThrow(/unknown flag/);
  });

  it('the schema refuses rows that do not fit the columns', () => {
    const good = buildIsopycnalTable([row()], provenance());
    expect(() => parseDeliveryTable(good)).not.toThrow();
    expect(() => parseDeliveryTable({ ...good, rows: [good.rows[0].slice(1)] })).toThrow(/expected 13/);
    expect(() => parseDeliveryTable({ ...good, rows: [good.rows[0].map((v, i) => (i === 2 ? '12' : v))] })).toThrow(
      /latitude/,
    );
    expect(() => parseDeliveryTable({ ...good, rows: [good.rows[0].map((v, i) => (i === 6 ? Infinity : v))] })).toThrow(
      /finite/,
    );
    expect(() => parseDeliveryTable({ ...good, rows: [good.rows[0].map((v, i) => (i === 0 ? 12 : v))] })).toThrow(
      /station/,
    );
    expect(() =>
      parseDeliveryTable({ ...good, columns: [...good.columns.slice(0, 12), { ...good.columns[0] }] }),
    ).toThrow(/duplicate column/);
    expect(() => parseDeliveryTable({ ...good, provenance: { ...good.provenance, software: '' } })).toThrow();
  });

  it('refuses an extra variable that collides with a contract column', () => {
    expect(() => buildIsopycnalTable([row({ extras: { CT: 1 } })], provenance())).toThrow(/collides/);
  });
});
