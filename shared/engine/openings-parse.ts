import type Papa from 'papaparse';
import {
  OPENING_COLUMNS,
  checkOpeningInFace,
  checkOpeningsAgainstFaces,
  normaliseOpeningKind,
  openingKindProblem,
  type Opening,
  type OpeningColumn,
  type OpeningKind,
  type OpeningProblem,
} from '../schemas/openings.schema';
import { SCHEDULE_LIMITS, SCHEDULE_MESSAGES, millimetreProblem, quantityProblem, type Face } from '../schemas/schedule.schema';
import { addPapaProblems, detectDelimiter, isBlankRow, normaliseHeader, readCsvChunks, readNumber, tooManyValues, trimCell } from './csv-read';
import type { InputProblem } from './result';
import type { ScheduleFaceIndex } from './schedule-parse';

export type OpeningsParse = { ok: true; openings: Opening[]; warnings: Array<{ code: 'unknown_column'; building: null; face: null; message: string }> } | { ok: false; errors: InputProblem[] };

/**
 * Reads the openings file (CSV, the schedule's rules: UTF-8 with or without a BOM, comma, semicolon or
 * tab, quoted fields, blank lines skipped). Columns: building (default "1"), face, kind (roof_window,
 * chimney, dormer, hatch), width_mm (across the slope), height_mm (up the slope), quantity (default 1).
 * With the schedule's faces, each opening must name a face of the schedule and fit in it. Every problem
 * is given with its spreadsheet row (header = 1) and column; nothing is kept when any is found.
 */
export function parseOpeningsCsv(text: string, faces?: readonly Face[]): OpeningsParse {
  return readOpeningsCsv(text, faces, null).parsed;
}

/** An openings file read, and the index of the face each opening sits in (when read against an indexed schedule). */
export interface OpeningsRead {
  parsed: OpeningsParse;
  faceOf: readonly number[] | null;
}

/**
 * parseOpeningsCsv; with the schedule reader's index of its faces, each opening's face is found through
 * it (no second lookup of the faces by name) and given back by its index.
 */
export function readOpeningsCsv(text: string, faces: readonly Face[] | undefined, index: ScheduleFaceIndex | null): OpeningsRead {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') return { parsed: { ok: false, errors: [{ message: 'the openings file is empty: it needs a header row' }] }, faceOf: null };
  const delimiter = detectDelimiter(body);
  // Read chunk by chunk, like the schedule: a whole-file parse keeps every row of the file reachable
  // from papaparse until the next full collection.
  const reader = new OpeningsReader(delimiter);
  readCsvChunks(body, delimiter, reader);
  return reader.finish(faces, index);
}

/** An opening read from the file, built by a constructor rather than an object literal (see ResolvedFace in schedule.schema.ts). */
class OpeningRow implements Opening {
  declare building: string;
  declare face: string;
  declare kind: OpeningKind;
  declare width_mm: number;
  declare height_mm: number;
  declare quantity: number;
  constructor(building: string, face: string, kind: OpeningKind, widthMm: number, heightMm: number, quantity: number) {
    this.building = building;
    this.face = face;
    this.kind = kind;
    this.width_mm = widthMm;
    this.height_mm = heightMm;
    this.quantity = quantity;
  }
}

/** A kind written as the file's own word (no regex needed), or undefined. */
function knownKind(cell: string): OpeningKind | undefined {
  switch (cell) {
    case 'roof_window':
      return 'roof_window';
    case 'chimney':
      return 'chimney';
    case 'dormer':
      return 'dormer';
    case 'hatch':
      return 'hatch';
    default:
      return undefined;
  }
}

type OpeningsWarning = { code: 'unknown_column'; building: null; face: null; message: string };

/** The state of one openings file being read, fed by papaparse a chunk of rows at a time. */
class OpeningsReader {
  /** papaparse's own problems, then the header's; either stops the file before its rows are checked. */
  private readonly fileErrors: InputProblem[] = [];
  private readonly headerErrors: InputProblem[] = [];
  private readonly rowErrors: InputProblem[] = [];
  private readonly warnings: OpeningsWarning[] = [];
  private readonly openings: Opening[] = [];
  private readonly rowOf: number[] = [];
  private readonly col = { building: -1, face: -1, kind: -1, width_mm: -1, height_mm: -1, quantity: -1 } as Record<OpeningColumn, number>;
  private rowsBefore = 0;
  private headerDone = false;
  private cells: readonly string[] = [];
  private row = 0;
  private bad = false;
  private lastBuilding = '';
  /** Columns of the header row: a row with values past them is refused. */
  private width = 0;
  private readonly decimalComma: boolean;

  constructor(private readonly delimiter: string) {
    this.decimalComma = delimiter !== ',';
  }

  chunk(results: Papa.ParseResult<string[]>) {
    addPapaProblems(results, this.rowsBefore, this.fileErrors);
    const rows = results.data;
    let start = 0;
    if (!this.headerDone) {
      this.readHeader(rows[0] ?? []);
      start = 1;
    }
    if (this.headerErrors.length === 0) {
      for (let r = start; r < rows.length; r++) this.readRow(rows[r], this.rowsBefore + r + 1);
    }
    this.rowsBefore += rows.length;
  }

  private readHeader(raw: readonly string[]) {
    this.headerDone = true;
    this.width = raw.length;
    const col = this.col;
    for (let i = 0; i < raw.length; i++) {
      const name = normaliseHeader(raw[i]);
      if (name === '') continue;
      if (!(OPENING_COLUMNS as readonly string[]).includes(name)) {
        this.warnings.push({ code: 'unknown_column', building: null, face: null, message: `column '${raw[i].trim()}' is not an openings column and was ignored` });
        continue;
      }
      const c = name as OpeningColumn;
      if (col[c] >= 0) this.headerErrors.push({ row: 1, column: c, message: 'the column is given twice' });
      else col[c] = i;
    }
    for (const required of ['face', 'kind', 'width_mm', 'height_mm'] as const) {
      if (col[required] < 0) this.headerErrors.push({ row: 1, column: required, message: 'this required column is missing' });
    }
  }

  private problem(column: OpeningColumn, message: string) {
    this.rowErrors.push({ row: this.row, column, message });
    this.bad = true;
  }

  private text(c: 'building' | 'face', fallback: string | null): string {
    const i = this.col[c];
    const v = trimCell(i >= 0 ? (this.cells[i] ?? '') : '');
    if (v === '') {
      if (fallback === null) this.problem(c, SCHEDULE_MESSAGES.required);
      return fallback ?? '';
    }
    if (v.length > SCHEDULE_LIMITS.maxTextLength) this.problem(c, SCHEDULE_MESSAGES.textTooLong);
    return v;
  }

  private number(c: 'width_mm' | 'height_mm' | 'quantity', required: boolean): number | undefined {
    const i = this.col[c];
    const raw = i >= 0 ? (this.cells[i] ?? '') : '';
    const v = readNumber(raw, this.decimalComma);
    if (v === null) {
      if (required) this.problem(c, SCHEDULE_MESSAGES.required);
      return undefined;
    }
    if (Number.isNaN(v)) {
      this.problem(c, `must be a number, not '${raw.trim()}'`);
      return undefined;
    }
    const p = c === 'quantity' ? quantityProblem(v) : millimetreProblem(v, false);
    if (p) {
      this.problem(c, p);
      return undefined;
    }
    return v;
  }

  private readRow(cells: readonly string[], row: number) {
    if (isBlankRow(cells)) return;
    this.cells = cells;
    this.row = row;
    this.bad = false;
    const extra = tooManyValues(cells, this.width, this.delimiter);
    if (extra !== null) {
      this.rowErrors.push({ row, message: extra });
      this.bad = true;
    }
    let building = this.text('building', '1');
    // The openings of a building share one copy of its name.
    if (building === this.lastBuilding) building = this.lastBuilding;
    else this.lastBuilding = building;
    const face = this.text('face', null);
    const rawKind = trimCell(cells[this.col.kind] ?? '');
    // The usual spelling is read without a regex, and the opening keeps the program's own word.
    let kind = knownKind(rawKind);
    if (kind === undefined) {
      if (rawKind === '') this.problem('kind', SCHEDULE_MESSAGES.required);
      else {
        const k = normaliseOpeningKind(rawKind);
        const p = openingKindProblem(k);
        if (p) this.problem('kind', p.replace(`'${k}'`, `'${rawKind}'`));
        else kind = k as OpeningKind;
      }
    }
    const width = this.number('width_mm', true);
    const height = this.number('height_mm', true);
    const quantity = this.number('quantity', false) ?? 1;
    if (this.bad || kind === undefined || width === undefined || height === undefined) return;
    this.openings.push(new OpeningRow(building, face, kind, width, height, quantity));
    this.rowOf.push(row);
  }

  finish(faces: readonly Face[] | undefined, index: ScheduleFaceIndex | null): OpeningsRead {
    this.cells = [];
    if (this.fileErrors.length > 0 || this.headerErrors.length > 0) return { parsed: { ok: false, errors: [...this.fileErrors, ...this.headerErrors] }, faceOf: null };
    const errors = this.rowErrors;
    let faceOf: number[] | null = null;
    if (faces) {
      let problems: OpeningProblem[];
      if (index) {
        problems = [];
        faceOf = new Array<number>(this.openings.length);
        for (let k = 0; k < this.openings.length; k++) {
          const o = this.openings[k];
          const at = index.find(o.building, o.face);
          faceOf[k] = at;
          const face = at < 0 ? undefined : faces[at];
          // An opening named as its face is keeps the face's copies of the names, not the cells'.
          if (face !== undefined) {
            if (o.face === face.face) o.face = face.face;
            if (o.building === face.building) o.building = face.building;
          }
          checkOpeningInFace(o, k, face, problems);
        }
      } else problems = checkOpeningsAgainstFaces(this.openings, faces);
      for (const p of problems) errors.push({ row: this.rowOf[p.index], column: p.column, message: p.message });
    }
    if (errors.length > 0) {
      errors.sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
      return { parsed: { ok: false, errors }, faceOf: null };
    }
    return { parsed: { ok: true, openings: this.openings, warnings: this.warnings }, faceOf };
  }
}
