import {
  SCHEDULE_LIMITS,
  SCHEDULE_MESSAGES,
  edgeProblem,
  millimetreProblem,
  normaliseEdgeWord,
  pitchProblem,
  quantityProblem,
  topProblem,
  type EdgeKind,
  type ScheduleColumn,
  type TopKind,
} from '../schemas/schedule.schema';
import { readNumber, trimCell } from './csv-read';
import type { InputProblem } from './result';

/** The cells of one schedule row, read and checked one by one (each problem named by row and column). */

export const CHECK_QUANTITY = 0;
export const CHECK_PITCH = 1;
export const CHECK_MM = 2;
export const CHECK_MM_OR_ZERO = 3;
export type Check = typeof CHECK_QUANTITY | typeof CHECK_PITCH | typeof CHECK_MM | typeof CHECK_MM_OR_ZERO;

function runCheck(check: Check, v: number): string | null {
  switch (check) {
    case CHECK_QUANTITY:
      return quantityProblem(v);
    case CHECK_PITCH:
      return pitchProblem(v);
    case CHECK_MM:
      return millimetreProblem(v, false);
    default:
      return millimetreProblem(v, true);
  }
}

/** Column positions in the file, -1 when a column is absent. */
export type ColumnIndex = Record<ScheduleColumn, number>;

/** Reads the cells of one row at a time and records their problems (one instance for the whole file). */
export class RowReader {
  row = 0;
  cells: readonly string[] = [];
  rowBad = false;
  constructor(
    private readonly col: ColumnIndex,
    private readonly decimalComma: boolean,
    private readonly errors: InputProblem[],
  ) {}

  start(row: number, cells: readonly string[]) {
    this.row = row;
    this.cells = cells;
    this.rowBad = false;
  }

  bad(column: ScheduleColumn, message: string) {
    this.errors.push({ row: this.row, column, message });
    this.rowBad = true;
  }

  present(c: ScheduleColumn): boolean {
    return this.col[c] >= 0;
  }

  at(i: number): string {
    return i < 0 ? '' : (this.cells[i] ?? '');
  }

  text(c: 'face' | 'building' | 'ridge', i: number, fallback: string | null): string {
    const v = trimCell(this.at(i));
    if (v === '') {
      if (fallback === null && i >= 0) this.bad(c, SCHEDULE_MESSAGES.required);
      return fallback ?? '';
    }
    if (v.length > SCHEDULE_LIMITS.maxTextLength) this.bad(c, SCHEDULE_MESSAGES.textTooLong);
    return v;
  }

  number(c: ScheduleColumn, i: number, required: boolean, check: Check): number | undefined {
    const raw = this.at(i);
    const v = readNumber(raw, this.decimalComma);
    if (v === null) {
      if (required && i >= 0) this.bad(c, SCHEDULE_MESSAGES.required);
      return undefined;
    }
    if (Number.isNaN(v)) {
      const hint = !this.decimalComma && raw.indexOf(',') >= 0 ? '; with a comma delimiter, write decimals with a point' : '';
      this.bad(c, `must be a number, not '${raw.trim()}'${hint}`);
      return undefined;
    }
    const problem = runCheck(check, v);
    if (problem) {
      this.bad(c, problem);
      return undefined;
    }
    return v;
  }

  edge(c: 'left' | 'right', i: number): EdgeKind {
    const raw = this.at(i);
    const w = readWord(raw);
    if (w === '') return 'verge';
    if (w === 'verge' || w === 'hip' || w === 'valley' || w === 'abutment') return w;
    this.bad(c, (edgeProblem(w) as string).replace(`'${w}'`, `'${raw.trim()}'`));
    return 'verge';
  }

  topEdge(i: number): TopKind {
    const raw = this.at(i);
    const w = readWord(raw);
    if (w === '') return 'ridge';
    if (w === 'ridge' || w === 'mono_ridge' || w === 'abutment') return w;
    this.bad('top', (topProblem(w) as string).replace(`'${w}'`, `'${raw.trim()}'`));
    return 'ridge';
  }
}

/**
 * An edge word as written, in the schedule's spelling; plain lower-case words skip the regex. A known
 * word is given back as the program's own string, not the cell's copy: a face keeps three of them, and
 * ten thousand copies of "verge" would otherwise live as long as the faces.
 */
function readWord(raw: string): string {
  switch (raw) {
    case 'verge':
      return 'verge';
    case 'hip':
      return 'hip';
    case 'valley':
      return 'valley';
    case 'abutment':
      return 'abutment';
    case 'ridge':
      return 'ridge';
    case 'mono_ridge':
      return 'mono_ridge';
    default:
      return raw.trim() === '' ? '' : normaliseEdgeWord(raw);
  }
}
