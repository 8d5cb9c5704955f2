/**
 * make-workbook: writes openapi/examples/workshop-welds.xlsx, a workbook whose cells call a
 * running Throatline service with web-query formulas, for connection WS-B12 of the demo workshop:
 *
 *   - input cells for a fillet weld (size, length, lines, force, plates, steels, method, electrode);
 *   - cell formulas: WEBSERVICE(service URL & "/v1/fillet/check?" & query & "&format=value&field=...")
 *     for the utilization, the status, the governing check and its design strength;
 *   - a size table filled by one array formula per column:
 *     FILTERXML(WEBSERVICE(range URL with vary=welds.0.size ... &format=xml), "//row/utilization").
 *
 *   npm run workbook                    # rewrites openapi/examples/workshop-welds.xlsx
 *   npm run workbook -- --out x.xlsx --url http://host:3000
 *
 * The output is byte-for-byte the same on every run (fixed document dates and zip entry times),
 * so the committed file changes only when this script does.
 */
import { writeFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import { isMain } from './is-main.js';

export const DEFAULT_BASE_URL = 'http://127.0.0.1:3000';
export const WORKBOOK_PATH = 'openapi/examples/workshop-welds.xlsx';
/** Document dates and zip entry times: fixed, so the file is reproducible. */
const FIXED_DATE = new Date(Date.UTC(2025, 0, 1, 0, 0, 0));

/** The sheet's name and the cells the guide and the tests refer to. */
export const SHEET = 'WS-B12 fillet';
export const CELLS = {
  baseUrl: 'B2',
  queryWithoutSize: 'B17',
  query: 'B18',
  utilization: 'B21',
  status: 'B22',
  governing: 'B23',
  available: 'B24',
  tableUrl: 'B27',
  tableSizes: 'A29:A34',
  tableUtilization: 'B29:B34',
  tableStatus: 'C29:C34',
  tableGoverning: 'D29:D34',
} as const;

export const TABLE_SIZES = ['1/8', '3/16', '1/4', '5/16', '3/8', '7/16'] as const;

/**
 * The formulas as a person types them into a cell (without the leading =). The file format
 * stores functions newer than its first edition with an _xlfn. prefix; see toFileFormula.
 */
export const FORMULAS = {
  queryWithoutSize:
    '"method="&ENCODEURL(B5)&"&electrode="&ENCODEURL(B6)&"&welds.0.length="&B8&"&welds.0.count="&B9&"&load.force="&B10' +
    '&"&parts.0.thickness="&ENCODEURL(B11)&"&parts.0.steel="&ENCODEURL(B12)&"&parts.0.faces="&B13' +
    '&"&parts.1.thickness="&ENCODEURL(B14)&"&parts.1.steel="&ENCODEURL(B15)',
  query: 'B17&"&welds.0.size="&ENCODEURL(B7)',
  utilization: 'NUMBERVALUE(WEBSERVICE($B$2&"/v1/fillet/check?"&B18&"&format=value&field=utilization"),".")',
  status: 'WEBSERVICE($B$2&"/v1/fillet/check?"&B18&"&format=value&field=status")',
  governing: 'WEBSERVICE($B$2&"/v1/fillet/check?"&B18&"&format=value&field=governing.code")',
  available: 'NUMBERVALUE(WEBSERVICE($B$2&"/v1/fillet/check?"&B18&"&format=value&field=governing.available"),".")',
  tableUrl: '$B$2&"/v1/fillet/check?"&B17&"&vary=welds.0.size&values="&ENCODEURL(TEXTJOIN(",",TRUE,A29:A34))&"&columns=utilization,status,governing.code&format=xml"',
  tableUtilization: 'NUMBERVALUE(FILTERXML(WEBSERVICE($B$27),"//row/utilization"),".")',
  tableStatus: 'FILTERXML(WEBSERVICE($B$27),"//row/status")',
  tableGoverning: 'FILTERXML(WEBSERVICE($B$27),"//row/governing.code")',
} as const;

/** Functions the file format stores with the _xlfn. prefix (added after its first edition). */
const NEWER_FUNCTIONS = ['WEBSERVICE', 'FILTERXML', 'ENCODEURL', 'NUMBERVALUE', 'TEXTJOIN'];

export function toFileFormula(f: string): string {
  return f.replace(new RegExp(`\\b(${NEWER_FUNCTIONS.join('|')})\\(`, 'g'), '_xlfn.$1(');
}

const CAUTION =
  "Caution: these are checks of the strength and detailing limits the service lists, not a complete connection design; " +
  'results are for review by a licensed engineer under the governing local building code.';

/** Builds the workbook; the same options give the same bytes. */
export async function buildWorkbook(opts: { baseUrl?: string } = {}): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Throatline make-workbook';
  wb.lastModifiedBy = 'Throatline make-workbook';
  wb.title = 'Throatline: fillet weld WS-B12 of the demo workshop';
  wb.created = FIXED_DATE;
  wb.modified = FIXED_DATE;
  wb.calcProperties.fullCalcOnLoad = true;

  const ws = wb.addWorksheet(SHEET);
  ws.columns = [{ width: 30 }, { width: 24 }, { width: 26 }, { width: 26 }];
  const bold = (addr: string, text: string): void => {
    ws.getCell(addr).value = text;
    ws.getCell(addr).font = { bold: true };
  };
  const row = (r: number, label: string, value: string | number, note = ''): void => {
    ws.getCell(`A${r}`).value = label;
    ws.getCell(`B${r}`).value = value;
    if (note) ws.getCell(`C${r}`).value = note;
  };
  const formula = (addr: string, f: string): void => {
    ws.getCell(addr).value = { formula: toFileFormula(f) };
  };
  // A formula entered as an array over a range: the range shows the formula's values, one per cell.
  const arrayFormula = (range: string, f: string): void => {
    const first = range.split(':')[0]!;
    ws.getCell(first).value = { formula: toFileFormula(f), shareType: 'array', ref: range } as unknown as ExcelJS.CellFormulaValue;
  };

  bold('A1', 'Throatline: fillet weld WS-B12 of the demo workshop (gusset to column flange)');
  row(2, 'Service URL', opts.baseUrl ?? DEFAULT_BASE_URL, 'where Throatline runs; every formula below calls it');

  bold('A4', 'Inputs');
  row(5, 'Method', 'LRFD', 'LRFD or ASD');
  row(6, 'Electrode', 'E70');
  row(7, 'Fillet size', '5/16', 'in, typed as text');
  row(8, 'Length of each line', 10, 'in');
  row(9, 'Number of lines', 2, 'one on each face of the gusset');
  row(10, 'Required strength', 120, 'kip (factored for LRFD)');
  row(11, 'Gusset thickness', '1/2', 'in, typed as text');
  row(12, 'Gusset steel', 'A572-50');
  row(13, 'Gusset faces welded', 2, 'both faces: one shear plane');
  row(14, 'Column flange thickness', '3/4', 'in, typed as text');
  row(15, 'Column flange steel', 'A992');
  ws.getCell('B5').dataValidation = { type: 'list', allowBlank: false, formulae: ['"LRFD,ASD"'] };

  row(17, 'Query without the size', '');
  formula(CELLS.queryWithoutSize, FORMULAS.queryWithoutSize);
  row(18, 'Query', '');
  formula(CELLS.query, FORMULAS.query);

  bold('A20', 'Check (one cell formula each)');
  row(21, 'Utilization', '');
  formula(CELLS.utilization, FORMULAS.utilization);
  row(22, 'Status', '');
  formula(CELLS.status, FORMULAS.status);
  row(23, 'Governing check', '');
  formula(CELLS.governing, FORMULAS.governing);
  row(24, 'Its design strength, kip', '');
  formula(CELLS.available, FORMULAS.available);

  bold('A26', 'Size table (one array formula per column)');
  row(27, 'Table URL', '');
  formula(CELLS.tableUrl, FORMULAS.tableUrl);
  bold('A28', 'Fillet size, in');
  bold('B28', 'Utilization');
  bold('C28', 'Status');
  bold('D28', 'Governing check');
  TABLE_SIZES.forEach((s, i) => {
    ws.getCell(`A${29 + i}`).value = s;
  });
  arrayFormula(CELLS.tableUtilization, FORMULAS.tableUtilization);
  arrayFormula(CELLS.tableStatus, FORMULAS.tableStatus);
  arrayFormula(CELLS.tableGoverning, FORMULAS.tableGoverning);
  for (const c of ['B21', 'B24', 'B29', 'B30', 'B31', 'B32', 'B33', 'B34']) ws.getCell(c).numFmt = '0.000';

  ws.getCell('A36').value = CAUTION;

  const written = Buffer.from(await wb.xlsx.writeBuffer());
  return fixZipTimes(written, FIXED_DATE);
}

/**
 * Sets every entry's modification time in a zip file (local headers and central directory) to
 * one date, since the zip writer stamps entries with the current time.
 */
export function fixZipTimes(zip: Buffer, date: Date): Buffer {
  const out = Buffer.from(zip);
  const dosTime = (date.getUTCHours() << 11) | (date.getUTCMinutes() << 5) | (date.getUTCSeconds() >> 1);
  const dosDate = ((date.getUTCFullYear() - 1980) << 9) | ((date.getUTCMonth() + 1) << 5) | date.getUTCDate();
  // End of central directory: signature 0x06054b50, at most 65,535 + 22 bytes from the end.
  let eocd = -1;
  for (let i = out.length - 22; i >= Math.max(0, out.length - 65557); i--) {
    if (out.readUInt32LE(i) === 0x06054b50) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw new Error('not a zip file: no end of central directory');
  const entries = out.readUInt16LE(eocd + 10);
  let p = out.readUInt32LE(eocd + 16);
  for (let n = 0; n < entries; n++) {
    if (out.readUInt32LE(p) !== 0x02014b50) throw new Error('zip central directory is not where its end record says');
    out.writeUInt16LE(dosTime, p + 12);
    out.writeUInt16LE(dosDate, p + 14);
    const local = out.readUInt32LE(p + 42);
    if (out.readUInt32LE(local) !== 0x04034b50) throw new Error('zip local header is not where the central directory says');
    out.writeUInt16LE(dosTime, local + 10);
    out.writeUInt16LE(dosDate, local + 12);
    p += 46 + out.readUInt16LE(p + 28) + out.readUInt16LE(p + 30) + out.readUInt16LE(p + 32);
  }
  return out;
}

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  const get = (name: string): string | undefined => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  const out = get('--out') ?? WORKBOOK_PATH;
  const baseUrl = get('--url');
  writeFileSync(out, await buildWorkbook(baseUrl ? { baseUrl } : {}));
  process.stdout.write(`wrote ${out}\n`);
}

if (isMain(import.meta.url)) void main();
