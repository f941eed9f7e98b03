import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { PROVENANCE_SHEET, tableSheetName, writeXlsx } from '../../../server/services/deliveries/xlsx';
import type { DeliveryTable } from '../../../server/services/deliveries/table';
import { provenance, syntheticIsopycnalTable, syntheticPressureTable } from './synthetic';

async function load(bytes: Buffer): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(bytes as unknown as ArrayBuffer); // read back with exceljs
  return wb;
}

function cellValue(ws: ExcelJS.Worksheet, r: number, c: number): unknown {
  const v = ws.getRow(r).getCell(c).value;
  return v === undefined ? null : v;
}

async function expectTableSheet(table: DeliveryTable): Promise<ExcelJS.Workbook> {
  const wb = await load(await writeXlsx(table));
  const ws = wb.getWorksheet(tableSheetName(table));
  expect(ws).toBeDefined();
  if (!ws) throw new Error('no sheet');
  // header row and unit row, both frozen
  expect(table.columns.map((_, c) => cellValue(ws, 1, c + 1))).toEqual(table.columns.map((c) => c.name));
  expect(table.columns.map((_, c) => cellValue(ws, 2, c + 1))).toEqual(table.columns.map((c) => c.unit ?? null));
  expect(ws.views[0]).toMatchObject({ state: 'frozen', ySplit: 2 });
  expect(ws.rowCount).toBe(table.rows.length + 2);
  table.rows.forEach((row, r) => {
    row.forEach((v, c) => {
      const got = cellValue(ws, r + 3, c + 1);
      if (v === null) expect(got).toBeNull();
      else if (typeof v === 'number')
        expect(Object.is(got, v) || (v === 0 && got === 0)).toBe(true); // numbers as numbers
      else expect(got).toBe(v); // typed string cells, written as they are (no leading ')
    });
  });
  return wb;
}

describe('spreadsheet writer', () => {
  it('isopycnal table: read back with exceljs equal to the table, strings neutralised', async () => {
    const table = syntheticIsopycnalTable({ seed: 31, casts: 12, levels: 20, tricky: true, extras: true });
    const wb = await expectTableSheet(table);
    // the tricky station names include formula starts: typed string cells, no formula, no leading ' (#14 item 9)
    const ws = wb.getWorksheet(tableSheetName(table));
    const stations = new Set<unknown>();
    ws?.getColumn(1).eachCell((cell, r) => {
      if (r > 2) {
        stations.add(cell.value);
        expect(cell.type).toBe(ExcelJS.ValueType.String);
        expect(cell.formula).toBeFalsy();
      }
    });
    expect(stations.has('=1+2')).toBe(true);
    expect(stations.has('-3')).toBe(true);
    for (const s of stations) expect(typeof s).toBe('string');
  });

  it('pressure table: read back with exceljs', async () => {
    await expectTableSheet(syntheticPressureTable({ seed: 32, casts: 3, bins: 50 }));
  });

  it('has a Provenance sheet with the method and the caution (read back with exceljs)', async () => {
    const prov = provenance({ exportedBy: '=evil()', referencePressure: 1000, inversionHandling: 'raw' });
    const wb = await load(await writeXlsx(syntheticIsopycnalTable({ seed: 33, casts: 2, levels: 2 }, prov)));
    const ps = wb.getWorksheet(PROVENANCE_SHEET);
    expect(ps).toBeDefined();
    const items = new Map<string, unknown>();
    ps?.eachRow((row, r) => {
      if (r > 1) items.set(String(row.getCell(1).value), row.getCell(2).value);
    });
    expect(items.get('Software')).toBe('Sigmaline 0.1.0-test');
    expect(items.get('Equation of state')).toBe(prov.equationOfState);
    expect(items.get('Reference pressure')).toBe('1000 dbar');
    expect(items.get('Inversion handling')).toBe('raw');
    expect(items.get('SAAR source')).toBe(prov.saarSource);
    expect(items.get('Layer set')).toBe(prov.layerSet);
    expect(items.get('Quality flags included')).toBe('2, 3');
    expect(items.get('Exported by')).toBe('=evil()');
    expect(items.get('Exported at')).toBe(prov.exportedAt);
    expect(items.get('Rows')).toBe(4);
    expect(String(items.get('Caution'))).toMatch(/not for navigation or safety-of-life use/);
  });
});
