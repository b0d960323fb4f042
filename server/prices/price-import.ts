/**
 * Reading a price-list file (CSV through papaparse, XLSX through exceljs) into rows, all or
 * nothing: the first problem names its spreadsheet row (the header is row 1) and column, and the
 * import stops with nothing written. Columns (header names, any order, case-insensitive): code,
 * description, unit, price. An empty price means "not priced yet".
 */
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { ApiError } from '../errors';

export interface ImportedRow {
  code: string;
  description: string;
  unit: string;
  price: number | null;
}

export class PriceImportError extends ApiError {
  constructor(row: number, column: string, message: string) {
    super(
      'validation',
      `Row ${row}, column "${column}": ${message}. Nothing was imported.`,
      { line: row, fields: [{ path: column, message: `row ${row}: ${message}` }] },
      { row, column },
    );
  }
}

const COLUMNS = ['code', 'description', 'unit', 'price'] as const;

/** Check a table (header first) and turn it into rows; throws PriceImportError at the first problem. */
export function rowsFromTable(table: string[][]): ImportedRow[] {
  const header = (table[0] ?? []).map((h) => h.trim().toLowerCase());
  for (const required of ['code', 'price']) {
    if (!header.includes(required)) throw new PriceImportError(1, required, `the header row has no "${required}" column (expected ${COLUMNS.join(', ')})`);
  }
  const at = (row: string[], name: string): string => {
    const i = header.indexOf(name);
    return i < 0 ? '' : (row[i] ?? '').trim();
  };
  const out: ImportedRow[] = [];
  const seen = new Map<string, number>();
  table.slice(1).forEach((cells, i) => {
    const rowNo = i + 2;
    if (cells.every((c) => c.trim() === '')) return;
    const code = at(cells, 'code');
    if (!code) throw new PriceImportError(rowNo, 'code', 'is empty');
    if (code.length > 120) throw new PriceImportError(rowNo, 'code', 'is longer than 120 characters');
    if (seen.has(code)) throw new PriceImportError(rowNo, 'code', `${code} is already on row ${seen.get(code)}`);
    seen.set(code, rowNo);
    const rawPrice = at(cells, 'price').replace(/^\$/, '').replace(/,/g, '');
    let price: number | null = null;
    if (rawPrice !== '') {
      price = Number(rawPrice);
      if (!Number.isFinite(price) || price < 0) throw new PriceImportError(rowNo, 'price', `must be a number ≥ 0 or empty (got "${at(cells, 'price')}")`);
    }
    out.push({ code, description: at(cells, 'description').slice(0, 300), unit: at(cells, 'unit').slice(0, 30) || 'each', price });
  });
  if (out.length === 0) throw new PriceImportError(2, 'code', 'the file has no price rows');
  return out;
}

export function parsePriceCsv(text: string): ImportedRow[] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const bad = parsed.errors.find((e) => e.type !== 'Delimiter');
  if (bad) throw new PriceImportError((bad.row ?? 0) + 1, 'code', `cannot read the CSV here (${bad.message})`);
  return rowsFromTable(parsed.data.filter((r, i) => i === 0 || r.length > 1 || (r[0] ?? '') !== ''));
}

function cellText(value: ExcelJS.CellValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'object') {
    if ('result' in value) return cellText((value as ExcelJS.CellFormulaValue).result as ExcelJS.CellValue);
    if ('richText' in value) return (value as ExcelJS.CellRichTextValue).richText.map((r) => r.text).join('');
    if ('text' in value) return String((value as ExcelJS.CellHyperlinkValue).text);
    if (value instanceof Date) return value.toISOString();
  }
  return String(value);
}

export async function parsePriceXlsx(bytes: Buffer): Promise<ImportedRow[]> {
  const book = new ExcelJS.Workbook();
  try {
    await book.xlsx.load(bytes as unknown as ArrayBuffer);
  } catch {
    throw new PriceImportError(1, 'code', 'the file is not a readable XLSX workbook');
  }
  const sheet = book.worksheets[0];
  if (!sheet) throw new PriceImportError(1, 'code', 'the workbook has no sheet');
  const table: string[][] = [];
  const width = Math.max(sheet.columnCount, 1);
  for (let r = 1; r <= sheet.rowCount; r++) {
    const row = sheet.getRow(r);
    const cells: string[] = [];
    for (let c = 1; c <= width; c++) cells.push(cellText(row.getCell(c).value));
    table.push(cells);
  }
  return rowsFromTable(table);
}

/** Decide by name and magic bytes: XLSX is a ZIP (PK\x03\x04). */
export async function parsePriceFile(name: string, bytes: Buffer): Promise<ImportedRow[]> {
  const zip = bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04;
  if (zip || /\.xlsx$/i.test(name)) return parsePriceXlsx(bytes);
  if (bytes.includes(0)) throw new ApiError('unsupported-type', 'A price list must be a CSV or XLSX file');
  return parsePriceCsv(bytes.toString('utf8'));
}
