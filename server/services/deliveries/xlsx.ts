// Spreadsheet (xlsx) writer for delivery tables, with exceljs' streaming workbook writer (styles
// off: they more than double the time of a 150 000-row sheet):
// sheet 1 is the table (row 1 column names, row 2 units, both frozen; numbers as numbers, empty
// cells for no value; text cells are typed string cells, which no spreadsheet evaluates, so they are
// written as they are, with no leading quote), sheet 2
// "Provenance" holds the method (one item a row) and the caution.
import { PassThrough, type Writable } from 'node:stream';
import ExcelJS from 'exceljs';
import { DATA_CAUTION, provenanceEntries } from './provenance';
import type { DeliveryTable } from './table';

export const PROVENANCE_SHEET = 'Provenance';

/** Name of the table's sheet. */
export function tableSheetName(table: DeliveryTable): string {
  return table.kind === 'isopycnal' ? 'Isopycnal table' : 'Pressure table';
}

/** Write the workbook of one table into a writable stream; resolves when it is all written. */
export async function writeXlsxToStream(table: DeliveryTable, stream: Writable): Promise<void> {
  // zlib level 1: the sheets are large and repetitive, so fast deflate loses little size
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({
    stream,
    useStyles: false,
    useSharedStrings: false,
    zip: { zlib: { level: 1 } },
  });
  const p = table.provenance;
  wb.creator = `${p.software} ${p.version}`;
  wb.created = new Date(Number.isNaN(Date.parse(p.exportedAt)) ? Date.now() : Date.parse(p.exportedAt));

  const ws = wb.addWorksheet(tableSheetName(table), { views: [{ state: 'frozen', ySplit: 2, xSplit: 0 }] });
  ws.columns = table.columns.map((c) => ({ key: c.name, width: Math.max(10, c.name.length + 2) }));
  ws.addRow(table.columns.map((c) => c.name)).commit();
  ws.addRow(table.columns.map((c) => (c.unit ? c.unit : ''))).commit();
  const width = table.columns.length;
  for (const row of table.rows) {
    const values: (number | string | null)[] = new Array(width);
    for (let i = 0; i < width; i++) {
      const v = row[i];
      values[i] = typeof v === 'string' ? v : typeof v === 'number' && Number.isFinite(v) ? v : null;
    }
    ws.addRow(values).commit();
  }
  ws.commit();

  const ps = wb.addWorksheet(PROVENANCE_SHEET);
  ps.columns = [
    { key: 'item', width: 26 },
    { key: 'value', width: 90 },
  ];
  ps.addRow(['item', 'value']).commit();
  for (const e of provenanceEntries(p)) ps.addRow([e.label, e.value]).commit();
  ps.addRow(['Table', tableSheetName(table)]).commit();
  ps.addRow(['Rows', table.rows.length]).commit();
  ps.addRow(['Caution', DATA_CAUTION]).commit();
  ps.commit();
  await wb.commit();
}

/** The workbook of one table as bytes. */
export async function writeXlsx(table: DeliveryTable): Promise<Buffer> {
  const sink = new PassThrough();
  const chunks: Buffer[] = [];
  sink.on('data', (c: Buffer) => chunks.push(c));
  const ended = new Promise<void>((resolve, reject) => {
    sink.on('end', resolve);
    sink.on('error', reject);
  });
  await writeXlsxToStream(table, sink);
  await ended;
  return Buffer.concat(chunks);
}
