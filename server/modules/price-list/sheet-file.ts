import type ExcelJS from 'exceljs';
import { loadExcel } from '../../documents/excel';
import Papa from 'papaparse';
import { MAX_SHEET_ROWS } from '../../../shared/schemas/price-list.schema';
import type { ScheduleProblem } from '../../../shared/schemas/schedule-upload.schema';
import { AppError } from '../../http/app-error';
import { CONTROL_CHARACTER_MESSAGE, linesWithControlCharacters } from '../../http/control-text';
import { safeCell } from '../exports/spreadsheet-text';

/** One data row of an uploaded sheet: its spreadsheet row number (header = 1) and its cells by column name. */
export interface SheetRow {
  row: number;
  cells: Record<string, string | number | null>;
  /** Columns whose cell held a spreadsheet formula (xlsx) rather than a value. */
  formulas: Set<string>;
}

export interface Sheet {
  columns: string[];
  rows: SheetRow[];
}

export type SheetProblem = ScheduleProblem;

/** The one error a rejected price list or stock file gives: every problem at once, nothing applied. */
export function invalidSheet(problems: SheetProblem[]): AppError {
  const n = problems.length;
  return AppError.unprocessable('invalid_sheet', `Nothing was changed: ${n} ${n === 1 ? 'problem' : 'problems'} to fix in the file`, problems);
}

const normaliseHeader = (h: string) =>
  h
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');

/** An xlsx is a zip: it starts with PK\x03\x04. */
export const isXlsx = (bytes: Buffer) => bytes.length > 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04;

function fromGrid(grid: (string | number | null)[][], formulaCells: Set<string>): Sheet {
  const [header = [], ...body] = grid;
  const columns = header.map((h) => normaliseHeader(String(h ?? '')));
  const rows: SheetRow[] = [];
  body.forEach((cells, i) => {
    if (cells.every((c) => c === null || String(c).trim() === '')) return;
    const row: SheetRow = { row: i + 2, cells: {}, formulas: new Set() };
    columns.forEach((col, j) => {
      if (!col) return;
      const v = cells[j];
      row.cells[col] = v === undefined || v === null || (typeof v === 'string' && v.trim() === '') ? null : v;
      if (formulaCells.has(`${i + 2}:${j}`)) row.formulas.add(col);
    });
    rows.push(row);
  });
  return { columns: columns.filter(Boolean), rows };
}

function cellValue(cell: ExcelJS.Cell): string | number | null {
  const v = cell.value;
  if (v === null || v === undefined) return null;
  if (typeof v === 'number' || typeof v === 'string') return v;
  if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
  if (v instanceof Date) return v.toISOString().slice(0, 10);
  if (typeof v === 'object') {
    if ('formula' in v || 'sharedFormula' in v) return `=${(v as { formula?: string }).formula ?? ''}`;
    if ('richText' in v) return (v as ExcelJS.CellRichTextValue).richText.map((t) => t.text).join('');
    if ('text' in v) return String((v as { text: unknown }).text);
    if ('error' in v) return String((v as { error: unknown }).error);
  }
  return String(v);
}

/**
 * Reads a CSV (UTF-8, comma, semicolon or tab) or the first worksheet of an .xlsx into rows by
 * header. A file that is neither, or holds more than MAX_SHEET_ROWS rows, is refused with row 1.
 */
export async function readSheet(bytes: Buffer): Promise<Sheet> {
  if (isXlsx(bytes)) {
    const excel = await loadExcel();
    const wb = new excel.Workbook();
    try {
      await wb.xlsx.load(bytes as unknown as ArrayBuffer);
    } catch {
      throw invalidSheet([{ row: 1, message: 'the file could not be read as an .xlsx workbook: save it again from the spreadsheet, or send a CSV' }]);
    }
    const ws = wb.worksheets[0];
    if (!ws) throw invalidSheet([{ row: 1, message: 'the workbook has no worksheet' }]);
    if (ws.rowCount > MAX_SHEET_ROWS + 1) throw invalidSheet([{ row: MAX_SHEET_ROWS + 2, message: `a file holds at most ${MAX_SHEET_ROWS} rows; split it` }]);
    const grid: (string | number | null)[][] = [];
    const formulas = new Set<string>();
    const width = ws.columnCount;
    for (let r = 1; r <= ws.rowCount; r++) {
      const row = ws.getRow(r);
      const cells: (string | number | null)[] = [];
      for (let c = 1; c <= width; c++) {
        const cell = row.getCell(c);
        if (cell.type === excel.ValueType.Formula) formulas.add(`${r}:${c - 1}`);
        cells.push(cellValue(cell));
      }
      grid.push(cells);
    }
    return fromGrid(grid, formulas);
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw invalidSheet([{ row: 1, message: 'the file is not UTF-8 text or an .xlsx workbook: save it as "CSV UTF-8" or .xlsx and send it again' }]);
  }
  const controlLines = linesWithControlCharacters(text);
  if (controlLines.length > 0) throw invalidSheet(controlLines.map((row) => ({ row, message: `row ${row} ${CONTROL_CHARACTER_MESSAGE}` })));
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t'] });
  if (parsed.data.length > MAX_SHEET_ROWS + 1) throw invalidSheet([{ row: MAX_SHEET_ROWS + 2, message: `a file holds at most ${MAX_SHEET_ROWS} rows; split it` }]);
  const quoteProblem = parsed.errors.find((e) => e.type === 'Quotes');
  if (quoteProblem) throw invalidSheet([{ row: (quoteProblem.row ?? 0) + 1, message: 'a quoted field is not closed' }]);
  return fromGrid(parsed.data, new Set());
}

/** Columns the file must have; every missing one is reported at row 1. */
export function requireColumns(sheet: Sheet, required: readonly string[]): SheetProblem[] {
  return required.filter((c) => !sheet.columns.includes(c)).map((c) => ({ row: 1, column: c, message: `the column "${c}" is missing from the header row` }));
}

const FORMULA_LIKE = /^\s*[=+@\uFF1D\uFF0B\uFF20]/;

/** A text cell: a formula (or text a spreadsheet would run as one) is refused rather than stored. */
export function textCell(r: SheetRow, column: string, problems: SheetProblem[], required = true): string | null {
  const v = r.cells[column];
  if (r.formulas.has(column)) {
    problems.push({ row: r.row, column, message: 'holds a spreadsheet formula: paste the value itself' });
    return null;
  }
  if (v === null || v === undefined) {
    if (required) problems.push({ row: r.row, column, message: 'is empty' });
    return null;
  }
  const s = String(v).trim();
  if (FORMULA_LIKE.test(s) || /^\s*-\D/.test(s)) {
    problems.push({ row: r.row, column, message: `"${s.slice(0, 40)}" looks like a spreadsheet formula, not a value` });
    return null;
  }
  return s;
}

/**
 * A number cell with at most `decimals` decimal places, never negative: numbers as spreadsheets
 * write them (12.8, "12.80", "1,234.50"). Text, formulas and negative values are refused by name.
 */
export function numberCell(
  r: SheetRow,
  column: string,
  problems: SheetProblem[],
  opts: { decimals: number; required?: boolean; max?: number; /** How the number is written, for the message when it is not one. */ example?: string },
): number | null {
  const v = r.cells[column];
  if (r.formulas.has(column)) {
    problems.push({ row: r.row, column, message: 'holds a spreadsheet formula: paste the value itself' });
    return null;
  }
  if (v === null || v === undefined) {
    if (opts.required ?? true) problems.push({ row: r.row, column, message: 'is empty: give a number' });
    return null;
  }
  let n: number;
  if (typeof v === 'number') {
    n = v;
  } else {
    const s = v.trim();
    if (!/^-?(\d+|\d{1,3}(,\d{3})+)(\.\d+)?$/.test(s)) {
      const what = FORMULA_LIKE.test(s) ? 'is a formula, not a number' : 'is not a number';
      problems.push({ row: r.row, column, message: `"${s.slice(0, 40)}" ${what}${opts.example ? ` (write it like ${opts.example})` : opts.decimals === 2 ? ' (write it like 12.80)' : ''}` });
      return null;
    }
    n = Number(s.replace(/,/g, ''));
  }
  if (!Number.isFinite(n)) {
    problems.push({ row: r.row, column, message: 'is not a number' });
    return null;
  }
  if (n < 0) {
    problems.push({ row: r.row, column, message: `must not be negative (${n})` });
    return null;
  }
  const scaled = n * 10 ** opts.decimals;
  if (Math.abs(scaled - Math.round(scaled)) > 1e-6) {
    problems.push({ row: r.row, column, message: opts.decimals === 0 ? `must be a whole number (${n})` : `has more than ${opts.decimals} decimal places (${n})` });
    return null;
  }
  if (opts.max !== undefined && n > opts.max) {
    problems.push({ row: r.row, column, message: `must be at most ${opts.max.toLocaleString('en-GB')} (${n})` });
    return null;
  }
  return n;
}

export interface SheetColumn<T> {
  header: string;
  width: number;
  numFmt?: string;
  value: (row: T) => string | number | null;
}

/** CSV with a BOM and CRLF, text neutralised against formula injection. */
export function toCsv<T>(columns: SheetColumn<T>[], rows: T[]): string {
  const data = [columns.map((c) => c.header), ...rows.map((r) => columns.map((c) => safeCell(c.value(r)) ?? ''))];
  return '\uFEFF' + Papa.unparse(data, { newline: '\r\n' });
}

/** One worksheet with a frozen, filtered header row; text neutralised against formula injection. */
export async function toXlsx<T>(sheetName: string, columns: SheetColumn<T>[], rows: T[]): Promise<Buffer> {
  const { Workbook } = await loadExcel();
  const wb = new Workbook();
  wb.creator = 'Ridgeload';
  const ws = wb.addWorksheet(sheetName, { views: [{ state: 'frozen', ySplit: 1 }] });
  ws.columns = columns.map((c) => ({ header: c.header, width: c.width }));
  ws.getRow(1).font = { bold: true };
  for (const row of rows) {
    const added = ws.addRow(columns.map((c) => safeCell(c.value(row))));
    columns.forEach((c, i) => {
      if (c.numFmt) added.getCell(i + 1).numFmt = c.numFmt;
    });
  }
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } };
  return Buffer.from(await wb.xlsx.writeBuffer());
}
