/**
 * The committed example workbook openapi/examples/workshop-welds.xlsx is exactly what
 * `npm run workbook` (src/bin/make-workbook.ts) writes, every time, and holds the formulas the
 * README's spreadsheet guide shows, in the cells it names.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { buildWorkbook, CELLS, DEFAULT_BASE_URL, fixZipTimes, FORMULAS, SHEET, TABLE_SIZES, toFileFormula, WORKBOOK_PATH } from '../../src/bin/make-workbook.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const README = readFileSync(`${ROOT}README.md`, 'utf8');

describe('the example workbook', () => {
  it('the committed file is byte for byte what npm run workbook writes (run it after changing the script)', async () => {
    const committed = readFileSync(`${ROOT}${WORKBOOK_PATH}`);
    const built = await buildWorkbook();
    expect(built.equals(committed)).toBe(true);
  });

  it('two builds give the same bytes, and another base URL changes them', async () => {
    const [a, b, c] = await Promise.all([buildWorkbook(), buildWorkbook(), buildWorkbook({ baseUrl: 'http://127.0.0.1:9' })]);
    expect(a.equals(b)).toBe(true);
    expect(a.equals(c)).toBe(false);
  });

  it('holds the service URL, the inputs as text where they are fractions, and the formulas in their cells', async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(readFileSync(`${ROOT}${WORKBOOK_PATH}`) as unknown as ArrayBuffer);
    const ws = wb.getWorksheet(SHEET)!;
    expect(ws).toBeDefined();
    expect(ws.getCell(CELLS.baseUrl).value).toBe(DEFAULT_BASE_URL);
    expect(ws.getCell('B7').value).toBe('5/16'); // text, not a date
    const formulaOf = (addr: string): string => (ws.getCell(addr).value as { formula?: string }).formula ?? '';
    for (const key of ['queryWithoutSize', 'query', 'utilization', 'status', 'governing', 'available', 'tableUrl'] as const) {
      expect(formulaOf(CELLS[key]), key).toBe(toFileFormula(FORMULAS[key]));
    }
    for (const key of ['tableUtilization', 'tableStatus', 'tableGoverning'] as const) {
      const first = CELLS[key].split(':')[0]!;
      const v = ws.getCell(first).value as { formula?: string; shareType?: string; ref?: string };
      expect(v.formula, key).toBe(toFileFormula(FORMULAS[key]));
      expect(v.shareType, key).toBe('array');
      expect(v.ref, key).toBe(CELLS[key]);
    }
    TABLE_SIZES.forEach((s, i) => expect(ws.getCell(`A${29 + i}`).value).toBe(s));
  });

  it('stores the newer functions with the file format prefix, and only those', () => {
    expect(toFileFormula('NUMBERVALUE(WEBSERVICE(A1&"x"),".")')).toBe('_xlfn.NUMBERVALUE(_xlfn.WEBSERVICE(A1&"x"),".")');
    expect(toFileFormula('FILTERXML(WEBSERVICE(B1),"//row/status")')).toBe('_xlfn.FILTERXML(_xlfn.WEBSERVICE(B1),"//row/status")');
    expect(toFileFormula('ENCODEURL(TEXTJOIN(",",TRUE,A1:A3))&SUM(A1)')).toBe('_xlfn.ENCODEURL(_xlfn.TEXTJOIN(",",TRUE,A1:A3))&SUM(A1)');
  });

  it('zip entry times are set to the fixed date in both headers', () => {
    // A stored (uncompressed) one-entry zip, built by hand: local header, data, central directory, end record.
    const name = Buffer.from('a.txt');
    const data = Buffer.from('hi');
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(0xffff, 10);
    local.writeUInt16LE(0xffff, 12);
    local.writeUInt32LE(data.length, 18);
    local.writeUInt32LE(data.length, 22);
    local.writeUInt16LE(name.length, 26);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(0xffff, 12);
    central.writeUInt16LE(0xffff, 14);
    central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(0, 42);
    const cdOffset = local.length + name.length + data.length;
    const end = Buffer.alloc(22);
    end.writeUInt32LE(0x06054b50, 0);
    end.writeUInt16LE(1, 8);
    end.writeUInt16LE(1, 10);
    end.writeUInt32LE(central.length + name.length, 12);
    end.writeUInt32LE(cdOffset, 16);
    const zip = Buffer.concat([local, name, data, central, name, end]);
    const fixed = fixZipTimes(zip, new Date(Date.UTC(2025, 0, 1, 12, 30, 10)));
    // DOS time 12:30:10 = (12 << 11) | (30 << 5) | (10 >> 1) = 25541; date 2025-01-01 = (45 << 9) | (1 << 5) | 1 = 23073
    expect(fixed.readUInt16LE(10)).toBe(25541);
    expect(fixed.readUInt16LE(12)).toBe(23073);
    expect(fixed.readUInt16LE(cdOffset + 12)).toBe(25541);
    expect(fixed.readUInt16LE(cdOffset + 14)).toBe(23073);
    expect(() => fixZipTimes(Buffer.from('not a zip at all, just text long enough'), new Date())).toThrow(/not a zip/);
  });

  it("the README's spreadsheet guide shows the workbook's formulas as typed", () => {
    const guide = README.slice(README.indexOf('<!-- spreadsheets:start -->'), README.indexOf('<!-- spreadsheets:end -->'));
    for (const key of ['query', 'utilization', 'status', 'tableUrl', 'tableUtilization', 'tableStatus'] as const) {
      expect(guide, key).toContain(`=${FORMULAS[key]}`);
    }
  });
});
