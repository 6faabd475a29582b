import Papa from 'papaparse';
import { OPENING_COLUMNS, checkOpeningsAgainstFaces, normaliseOpeningKind, openingKindProblem, type Opening, type OpeningColumn, type OpeningKind } from '../schemas/openings.schema';
import { SCHEDULE_LIMITS, SCHEDULE_MESSAGES, millimetreProblem, quantityProblem, type Face } from '../schemas/schedule.schema';
import type { InputProblem } from './result';
import { detectDelimiter, papaConfig, type ChunkedParseConfig } from './schedule-parse';

export type OpeningsParse = { ok: true; openings: Opening[]; warnings: Array<{ code: 'unknown_column'; building: null; face: null; message: string }> } | { ok: false; errors: InputProblem[] };

function normaliseHeader(raw: string): string {
  return raw
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
}

function readNumber(raw: string, decimalComma: boolean): number | null {
  const s = raw.trim();
  if (s === '') return null;
  if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(s)) return Number(s);
  if (decimalComma && /^[+-]?(\d+,?\d*|,\d+)$/.test(s)) return Number(s.replace(',', '.'));
  return NaN;
}

/**
 * Reads the openings file (CSV, the schedule's rules: UTF-8 with or without a BOM, comma, semicolon or
 * tab, quoted fields, blank lines skipped). Columns: building (default "1"), face, kind (roof_window,
 * chimney, dormer, hatch), width_mm (across the slope), height_mm (up the slope), quantity (default 1).
 * With the schedule's faces, each opening must name a face of the schedule and fit in it. Every problem
 * is given with its spreadsheet row (header = 1) and column; nothing is kept when any is found.
 */
export function parseOpeningsCsv(text: string, faces?: readonly Face[]): OpeningsParse {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') return { ok: false, errors: [{ message: 'the openings file is empty: it needs a header row' }] };
  const delimiter = detectDelimiter(body);
  // Read chunk by chunk, like the schedule: a whole-file parse keeps every row of the file reachable
  // from papaparse until the next full collection.
  let reader: OpeningsReader | null = new OpeningsReader(delimiter !== ',');
  Papa.parse<string[]>(body, papaConfig(delimiter, (results) => reader?.chunk(results), body.length) as ChunkedParseConfig & Papa.ParseLocalConfig<string[], Papa.LocalFile>);
  const parsed = reader.finish(faces);
  // The callback is kept by papaparse's call site until the next full collection: cut it off from the rows.
  reader = null;
  return parsed;
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

  constructor(private readonly decimalComma: boolean) {}

  chunk(results: Papa.ParseResult<string[]>) {
    for (const e of results.errors) {
      if (e.code === 'UndetectableDelimiter') continue;
      this.fileErrors.push({ ...(e.row !== undefined && e.row !== null ? { row: this.rowsBefore + e.row + 1 } : {}), message: e.message });
    }
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
    const v = (i >= 0 ? (this.cells[i] ?? '') : '').trim();
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
    let blank = true;
    for (let i = 0; i < cells.length; i++) {
      if (cells[i].trim() !== '') {
        blank = false;
        break;
      }
    }
    if (blank) return;
    this.cells = cells;
    this.row = row;
    this.bad = false;
    const building = this.text('building', '1');
    const face = this.text('face', null);
    const rawKind = (cells[this.col.kind] ?? '').trim();
    let kind: OpeningKind | undefined;
    if (rawKind === '') this.problem('kind', SCHEDULE_MESSAGES.required);
    else {
      const k = normaliseOpeningKind(rawKind);
      const p = openingKindProblem(k);
      if (p) this.problem('kind', p.replace(`'${k}'`, `'${rawKind}'`));
      else kind = k as OpeningKind;
    }
    const width = this.number('width_mm', true);
    const height = this.number('height_mm', true);
    const quantity = this.number('quantity', false) ?? 1;
    if (this.bad || kind === undefined || width === undefined || height === undefined) return;
    this.openings.push(new OpeningRow(building, face, kind, width, height, quantity));
    this.rowOf.push(row);
  }

  finish(faces: readonly Face[] | undefined): OpeningsParse {
    this.cells = [];
    if (this.fileErrors.length > 0 || this.headerErrors.length > 0) return { ok: false, errors: [...this.fileErrors, ...this.headerErrors] };
    const errors = this.rowErrors;
    if (faces) {
      for (const p of checkOpeningsAgainstFaces(this.openings, faces)) errors.push({ row: this.rowOf[p.index], column: p.column, message: p.message });
    }
    if (errors.length > 0) {
      errors.sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
      return { ok: false, errors };
    }
    return { ok: true, openings: this.openings, warnings: this.warnings };
  }
}
