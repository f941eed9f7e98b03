// Spreadsheet (xlsx) writer for delivery tables. The workbook is written directly as its parts
// (Office Open XML, ECMA-376 SpreadsheetML) zipped with yazl: no per-cell objects, no shared
// strings, no styles beyond the one default the format requires. The sheet XML is produced in
// chunks of rows while zlib (in its own threads) deflates the previous chunk. A 150 000-row sheet
// takes well under a second, where exceljs' streaming writer took seconds (see the deliveries bench,
// which times both in the same run).
//
// Sheet 1 is the table: row 1 column names, row 2 units, both frozen; numbers as numbers (the
// shortest decimal that reads back to the same float64), empty cells for no value; text cells are
// inline string cells (t="inlineStr"), which no spreadsheet evaluates, so they are written as they
// are, with no leading quote. Sheet 2 "Provenance" holds the method (one item a row) and the caution.
import { PassThrough, Readable, type Writable } from 'node:stream';
import yazl from 'yazl';
import { DATA_CAUTION, provenanceEntries } from './provenance';
import type { DeliveryCell, DeliveryTable } from './table';

export const PROVENANCE_SHEET = 'Provenance';

/** Name of the table's sheet. */
export function tableSheetName(table: DeliveryTable): string {
  return table.kind === 'isopycnal' ? 'Isopycnal table' : 'Pressure table';
}

/** Spreadsheet column letters of a 0-based column index (0 → A, 26 → AA). */
export function columnLetters(index: number): string {
  let s = '';
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

// Characters XML 1.0 does not allow even as references (C0 controls but tab, LF, CR; U+FFFE/FFFF)
// are replaced by U+FFFD; CR is written as a reference so a reader's line-end handling keeps it.
// eslint-disable-next-line no-control-regex
const XML_SPECIAL = /[&<>"\r\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/;
// eslint-disable-next-line no-control-regex
const XML_SPECIAL_G = /[&<>"\r\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g;
const ENTITY: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\r': '&#13;' };

/** Text escaped for XML content or a double-quoted attribute. */
export function xmlEscape(s: string): string {
  if (!XML_SPECIAL.test(s)) return s;
  return s.replace(XML_SPECIAL_G, (ch) => ENTITY[ch] ?? '\ufffd');
}

const KEEP_SPACE = /^\s|\s$|[\t\n\r]/;

function stringCell(ref: string, s: string): string {
  const space = KEEP_SPACE.test(s) ? ' xml:space="preserve"' : '';
  return `<c r="${ref}" t="inlineStr"><is><t${space}>${xmlEscape(s)}</t></is></c>`;
}

function cellXml(ref: string, v: DeliveryCell | undefined): string {
  if (typeof v === 'number') return Number.isFinite(v) ? `<c r="${ref}"><v>${v === 0 ? 0 : String(v)}</v></c>` : '';
  if (typeof v === 'string') return stringCell(ref, v);
  return '';
}

function rowXml(r: number, letters: readonly string[], cells: readonly (DeliveryCell | undefined)[]): string {
  let s = `<row r="${r}">`;
  for (let i = 0; i < letters.length; i++) {
    const v = cells[i];
    if (v === null || v === undefined) continue;
    s += cellXml(letters[i] + r, v);
  }
  return s + '</row>';
}

const XML_HEAD = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';
const NS_MAIN = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const NS_REL = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const NS_PKG_REL = 'http://schemas.openxmlformats.org/package/2006/relationships';
const ROWS_PER_CHUNK = 1000;

interface SheetSpec {
  widths: number[];
  /** Frozen rows at the top. */
  frozenRows: number;
  rowCount: number;
  rows: () => Iterable<readonly (DeliveryCell | undefined)[]>;
}

function* sheetXml(spec: SheetSpec): Generator<string> {
  const width = spec.widths.length;
  const letters = Array.from({ length: width }, (_, i) => columnLetters(i));
  const last = `${columnLetters(Math.max(0, width - 1))}${Math.max(1, spec.rowCount)}`;
  const pane =
    spec.frozenRows > 0
      ? `<pane ySplit="${spec.frozenRows}" topLeftCell="A${spec.frozenRows + 1}" activePane="bottomLeft" state="frozen"/>` +
        `<selection pane="bottomLeft" activeCell="A${spec.frozenRows + 1}" sqref="A${spec.frozenRows + 1}"/>`
      : '';
  let head =
    `${XML_HEAD}<worksheet xmlns="${NS_MAIN}" xmlns:r="${NS_REL}"><dimension ref="A1:${last}"/>` +
    `<sheetViews><sheetView workbookViewId="0">${pane}</sheetView></sheetViews>` +
    '<sheetFormatPr defaultRowHeight="15"/><cols>';
  spec.widths.forEach((w, i) => {
    head += `<col min="${i + 1}" max="${i + 1}" width="${w}" customWidth="1"/>`;
  });
  yield head + '</cols><sheetData>';
  let buf = '';
  let n = 0;
  let r = 1;
  for (const row of spec.rows()) {
    buf += rowXml(r++, letters, row);
    if (++n >= ROWS_PER_CHUNK) {
      yield buf;
      buf = '';
      n = 0;
    }
  }
  yield buf + '</sheetData></worksheet>';
}

function workbookParts(sheetNames: string[], creator: string, created: Date): Record<string, string> {
  const sheets = sheetNames.map(
    (name, i) => `<sheet name="${xmlEscape(name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`,
  );
  const rels = sheetNames.map(
    (_, i) => `<Relationship Id="rId${i + 1}" Type="${NS_REL}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`,
  );
  const n = sheetNames.length;
  const when = created.toISOString().replace(/\.\d{3}Z$/, 'Z');
  return {
    '[Content_Types].xml':
      `${XML_HEAD}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
      '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>' +
      '<Default Extension="xml" ContentType="application/xml"/>' +
      '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
      sheetNames
        .map(
          (_, i) =>
            `<Override PartName="/xl/worksheets/sheet${i + 1}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`,
        )
        .join('') +
      '<Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>' +
      '<Override PartName="/docProps/core.xml" ContentType="application/vnd.openxmlformats-package.core-properties+xml"/>' +
      '<Override PartName="/docProps/app.xml" ContentType="application/vnd.openxmlformats-officedocument.extended-properties+xml"/>' +
      '</Types>',
    '_rels/.rels':
      `${XML_HEAD}<Relationships xmlns="${NS_PKG_REL}">` +
      `<Relationship Id="rId1" Type="${NS_REL}/officeDocument" Target="xl/workbook.xml"/>` +
      '<Relationship Id="rId2" Type="http://schemas.openxmlformats.org/package/2006/relationships/metadata/core-properties" Target="docProps/core.xml"/>' +
      `<Relationship Id="rId3" Type="${NS_REL}/extended-properties" Target="docProps/app.xml"/>` +
      '</Relationships>',
    'docProps/app.xml':
      `${XML_HEAD}<Properties xmlns="http://schemas.openxmlformats.org/officeDocument/2006/extended-properties">` +
      `<Application>${xmlEscape(creator)}</Application></Properties>`,
    'docProps/core.xml':
      `${XML_HEAD}<cp:coreProperties xmlns:cp="http://schemas.openxmlformats.org/package/2006/metadata/core-properties" ` +
      'xmlns:dc="http://purl.org/dc/elements/1.1/" xmlns:dcterms="http://purl.org/dc/terms/" ' +
      'xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">' +
      `<dc:creator>${xmlEscape(creator)}</dc:creator>` +
      `<dcterms:created xsi:type="dcterms:W3CDTF">${when}</dcterms:created>` +
      `<dcterms:modified xsi:type="dcterms:W3CDTF">${when}</dcterms:modified></cp:coreProperties>`,
    'xl/_rels/workbook.xml.rels':
      `${XML_HEAD}<Relationships xmlns="${NS_PKG_REL}">${rels.join('')}` +
      `<Relationship Id="rId${n + 1}" Type="${NS_REL}/styles" Target="styles.xml"/></Relationships>`,
    'xl/workbook.xml':
      `${XML_HEAD}<workbook xmlns="${NS_MAIN}" xmlns:r="${NS_REL}">` +
      '<bookViews><workbookView activeTab="0"/></bookViews>' +
      `<sheets>${sheets.join('')}</sheets></workbook>`,
    // the one default style every cell uses (a workbook must have at least one cell format)
    'xl/styles.xml':
      `${XML_HEAD}<styleSheet xmlns="${NS_MAIN}">` +
      '<fonts count="1"><font><sz val="11"/><name val="Calibri"/><family val="2"/></font></fonts>' +
      '<fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills>' +
      '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>' +
      '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
      '<cellXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/></cellXfs>' +
      '<cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles>' +
      '</styleSheet>',
  };
}

/** The workbook of one table as a readable stream of xlsx bytes. */
export function xlsxStream(table: DeliveryTable): Readable {
  const p = table.provenance;
  const creator = `${p.software} ${p.version}`;
  const created = new Date(Number.isNaN(Date.parse(p.exportedAt)) ? Date.now() : Date.parse(p.exportedAt));
  const names = [tableSheetName(table), PROVENANCE_SHEET];
  const zip = new yazl.ZipFile();
  const opts = { mtime: created, compressionLevel: 1 };
  // zlib level 1: the sheets are large and repetitive, so fast deflate loses little size
  for (const [path, text] of Object.entries(workbookParts(names, creator, created)))
    zip.addBuffer(Buffer.from(text, 'utf8'), path, opts);

  const header = table.columns.map((c) => c.name);
  const units = table.columns.map((c) => c.unit ?? null);
  const tableSheet: SheetSpec = {
    widths: table.columns.map((c) => Math.max(10, c.name.length + 2)),
    frozenRows: 2,
    rowCount: table.rows.length + 2,
    rows: function* () {
      yield header;
      yield units;
      yield* table.rows;
    },
  };
  const prov: (string | number)[][] = [
    ['item', 'value'],
    ...provenanceEntries(p).map((e) => [e.label, e.value]),
    ['Table', tableSheetName(table)],
    ['Rows', table.rows.length],
    ['Caution', DATA_CAUTION],
  ];
  const provSheet: SheetSpec = { widths: [26, 90], frozenRows: 0, rowCount: prov.length, rows: () => prov };
  zip.addReadStream(Readable.from(sheetXml(tableSheet), { objectMode: false }), 'xl/worksheets/sheet1.xml', opts);
  zip.addReadStream(Readable.from(sheetXml(provSheet), { objectMode: false }), 'xl/worksheets/sheet2.xml', opts);
  zip.end();
  const out = new PassThrough();
  zip.outputStream.on('error', (err: Error) => out.destroy(err));
  return zip.outputStream.pipe(out);
}

/** Write the workbook of one table into a writable stream; resolves when it is all written. */
export async function writeXlsxToStream(table: DeliveryTable, stream: Writable): Promise<void> {
  const source = xlsxStream(table);
  await new Promise<void>((resolve, reject) => {
    source.on('error', reject);
    stream.on('error', reject);
    stream.on('finish', resolve);
    source.pipe(stream);
  });
}

/** The workbook of one table as bytes. */
export async function writeXlsx(table: DeliveryTable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of xlsxStream(table)) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}
