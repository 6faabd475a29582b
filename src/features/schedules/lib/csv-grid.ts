import Papa from 'papaparse';
import { detectDelimiter, parseScheduleCsv } from '../../../../shared/engine/schedule-parse';
import { SCHEDULE_COLUMNS, normaliseEdgeWord } from '../../../../shared/schemas/schedule.schema';
import type { Face } from '../../../../shared/schemas/schedule.schema';

/**
 * A schedule file as the spreadsheet holds it: rows of text cells, the header first. The preview
 * edits this grid and checks it by writing it back out as CSV for the shared schedule reader, so
 * the browser and the server judge exactly the same text.
 */
export interface CsvGrid {
  delimiter: string;
  /** rows[0] is the header (spreadsheet row 1); rows[i] is spreadsheet row i + 1. */
  rows: string[][];
}

/** A problem where a spreadsheet would show it: row from 1 (header = 1), column index from 0. */
export interface LocatedProblem {
  row: number | null;
  column: number | null;
  /** The schedule column the reader named, when it named one. */
  columnName: string | null;
  message: string;
}

export interface GridCheck {
  ok: boolean;
  /** The faces read, in file order; empty while any problem remains. */
  faces: Face[];
  /** Spreadsheet row of each face, so an answer about entry n can point back at its row. */
  faceRows: number[];
  problems: LocatedProblem[];
  /** Columns the reader ignored, and similar notes that do not stop an import. */
  warnings: string[];
}

/** Spreadsheet letters for a column index: 0 → A, 25 → Z, 26 → AA. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let out = '';
  while (n > 0) {
    const rem = (n - 1) % 26;
    out = String.fromCharCode(65 + rem) + out;
    n = Math.floor((n - 1) / 26);
  }
  return out;
}

function isBlank(row: readonly string[]): boolean {
  return row.every((cell) => cell.trim() === '');
}

/** Drops the empty rows a spreadsheet leaves at the end of a file; rows in between keep their numbers. */
export function trimTrailingBlankRows(rows: string[][]): string[][] {
  let end = rows.length;
  while (end > 1 && isBlank(rows[end - 1])) end--;
  return end === rows.length ? rows : rows.slice(0, end);
}

export function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Reads CSV text into a grid with the delimiter the schedule reader would pick. */
export function gridFromText(text: string): CsvGrid {
  const body = stripBom(text);
  const delimiter = detectDelimiter(body);
  const parsed = Papa.parse<string[]>(body, { delimiter, header: false, skipEmptyLines: false });
  return { delimiter, rows: trimTrailingBlankRows(parsed.data.map((row) => row.map(String))) };
}

export function gridToCsv(grid: CsvGrid): string {
  return Papa.unparse(grid.rows, { delimiter: grid.delimiter, newline: '\r\n' });
}

/** Header names as the schedule reader reads them: no case, outer spaces, or difference between "pitch deg" and pitch_deg. */
export function normaliseHeaderCell(raw: string): string {
  return normaliseEdgeWord(stripBom(raw));
}

const KNOWN = new Set<string>(SCHEDULE_COLUMNS);

/** Where each schedule column sits in the grid's header (the first time it appears). */
export function headerIndex(header: readonly string[]): Map<string, number> {
  const index = new Map<string, number>();
  header.forEach((cell, i) => {
    const name = normaliseHeaderCell(cell);
    if (KNOWN.has(name) && !index.has(name)) index.set(name, i);
  });
  return index;
}

/** Where a column given twice appears the second time: that is the cell to fix. */
function duplicateIndex(header: readonly string[], name: string): number | undefined {
  const first = header.findIndex((cell) => normaliseHeaderCell(cell) === name);
  const second = header.findIndex((cell, i) => i > first && normaliseHeaderCell(cell) === name);
  return second >= 0 ? second : first >= 0 ? first : undefined;
}

/**
 * Checks the grid with the shared schedule reader and places every problem on its cell. Problems
 * about a column missing from the header stay on the row with no cell, since there is none to mark.
 */
export function checkGrid(grid: CsvGrid): GridCheck {
  const header = grid.rows[0] ?? [];
  const index = headerIndex(header);
  const result = parseScheduleCsv(gridToCsv(grid));
  const warnings = result.warnings.map((w) => w.message);
  if (result.ok) {
    const faceRows: number[] = [];
    grid.rows.forEach((row, i) => {
      if (i > 0 && !isBlank(row)) faceRows.push(i + 1);
    });
    return { ok: true, faces: result.faces, faceRows, problems: [], warnings };
  }
  const problems = result.errors.map((p): LocatedProblem => {
    let column: number | null = null;
    if (p.column !== undefined) {
      column = (p.row === 1 && p.message.includes('twice') ? duplicateIndex(header, p.column) : index.get(p.column)) ?? null;
    }
    return { row: p.row ?? null, column, columnName: p.column ?? null, message: p.message };
  });
  return { ok: false, faces: [], faceRows: [], problems, warnings };
}

/** "row 4, column G (eaves_mm)": how the preview and its messages name a place in the file. */
export function describePlace(problem: Pick<LocatedProblem, 'row' | 'column' | 'columnName'>): string {
  const parts: string[] = [];
  if (problem.row !== null) parts.push(`Row ${problem.row}`);
  if (problem.column !== null) parts.push(`column ${columnLetter(problem.column)}${problem.columnName ? ` (${problem.columnName})` : ''}`);
  else if (problem.columnName) parts.push(`column ${problem.columnName}`);
  return parts.join(', ');
}

export function cellKey(row: number, column: number): string {
  return `${row}:${column}`;
}

/** Problems by cell ("row:column") and by row, for marking the preview. */
export function indexProblems(problems: readonly LocatedProblem[]) {
  const byCell = new Map<string, string[]>();
  const byRow = new Map<number, string[]>();
  const unplaced: LocatedProblem[] = [];
  for (const p of problems) {
    if (p.row !== null && p.column !== null) {
      const key = cellKey(p.row, p.column);
      byCell.set(key, [...(byCell.get(key) ?? []), p.message]);
    } else if (p.row !== null && p.row > 1) {
      byRow.set(p.row, [...(byRow.get(p.row) ?? []), p.columnName ? `${p.columnName}: ${p.message}` : p.message]);
    } else {
      unplaced.push(p);
    }
  }
  return { byCell, byRow, unplaced };
}
