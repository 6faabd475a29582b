import Papa from 'papaparse';
import type { RoofSystem } from '../schemas/roof-system.schema';
import {
  SCHEDULE_COLUMNS,
  SCHEDULE_LIMITS,
  SCHEDULE_MESSAGES,
  crossCheckFace,
  edgeProblem,
  millimetreProblem,
  normaliseEdgeWord,
  pitchProblem,
  quantityProblem,
  resolveFace,
  topProblem,
  type EdgeKind,
  type Face,
  type FaceCandidate,
  type ScheduleColumn,
  type TopKind,
} from '../schemas/schedule.schema';
import { lowestPitch } from './courses';
import type { InputProblem } from './result';

export interface ScheduleWarning {
  code: 'unknown_column' | 'ridge_grouping_guessed';
  building: null;
  face: null;
  message: string;
}

export type ScheduleParse = { ok: true; faces: Face[]; warnings: ScheduleWarning[]; delimiter: string } | { ok: false; errors: InputProblem[]; warnings: ScheduleWarning[] };

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

/**
 * The delimiter a spreadsheet used, from the header line: the most frequent of comma, semicolon and
 * tab outside quotes (comma when none).
 */
export function detectDelimiter(text: string): string {
  let commas = 0;
  let semis = 0;
  let tabs = 0;
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text.charCodeAt(i);
    if (ch === 34) quoted = !quoted;
    else if (!quoted) {
      if (ch === 10 || ch === 13) break;
      if (ch === 44) commas++;
      else if (ch === 59) semis++;
      else if (ch === 9) tabs++;
    }
  }
  if (semis > commas && semis >= tabs) return ';';
  if (tabs > commas && tabs > semis) return '\t';
  return ',';
}

/**
 * Characters handed to papaparse at a time: rows are checked chunk by chunk, so the raw cells of a big
 * file are never all held at once (small chunks keep the peak memory of a 10,000-face file down).
 */
export const CSV_CHUNK_CHARS = 16 * 1024;

/** papaparse reads a string chunk after chunk by recursion: at most this many chunks keeps the stack safe. */
const MAX_CHUNKS = 1_000;

export type ChunkedParseConfig = Papa.ParseConfig<string[]> & {
  chunkSize: number;
  chunk: (results: Papa.ParseResult<string[]>) => void;
  complete: () => void;
  download?: false;
  worker?: false;
};

/** The papaparse settings the schedule reader uses (the benchmark times the bare parse with these). */
export function papaConfig(delimiter: string, chunk: (results: Papa.ParseResult<string[]>) => void, textLength = 0): ChunkedParseConfig {
  // A string is read synchronously, chunk by chunk, before Papa.parse returns.
  return {
    delimiter,
    header: false,
    skipEmptyLines: false,
    chunkSize: Math.max(CSV_CHUNK_CHARS, Math.ceil(textLength / MAX_CHUNKS)),
    chunk,
    complete: noop,
  };
}

function noop() {}

/** Header names are read without case, outer spaces, or the difference between "pitch deg" and pitch_deg. */
function normaliseHeader(raw: string): string {
  return raw
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
}

function isBlankRow(cells: readonly string[]): boolean {
  for (const c of cells) if (c.trim() !== '') return false;
  return true;
}

/** True when s is a plain decimal: an optional sign, digits, at most one point, at least one digit. */
function isPlainDecimal(s: string, point: number): boolean {
  let digits = 0;
  let points = 0;
  for (let i = 0; i < s.length; i++) {
    const ch = s.charCodeAt(i);
    if (ch >= 48 && ch <= 57) digits++;
    else if (ch === point) {
      if (++points > 1) return false;
    } else if ((ch === 43 || ch === 45) && i === 0) continue;
    else return false;
  }
  return digits > 0;
}

/**
 * Reads a number cell: null when blank, NaN when it is not a plain number. A decimal comma is read
 * only when the delimiter is not a comma (a semicolon-delimited export from a comma-decimal locale).
 */
function readNumber(raw: string, decimalComma: boolean): number | null {
  const s = raw.trim();
  if (s === '') return null;
  if (isPlainDecimal(s, 46)) return Number(s);
  if (decimalComma && isPlainDecimal(s, 44)) return Number(s.replace(',', '.'));
  return NaN;
}

const CHECK_QUANTITY = 0;
const CHECK_PITCH = 1;
const CHECK_MM = 2;
const CHECK_MM_OR_ZERO = 3;
type Check = typeof CHECK_QUANTITY | typeof CHECK_PITCH | typeof CHECK_MM | typeof CHECK_MM_OR_ZERO;

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
type ColumnIndex = Record<ScheduleColumn, number>;

/** Reads the cells of one row at a time and records their problems (one instance for the whole file). */
class RowReader {
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
    const v = this.at(i).trim();
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

/** An edge word as written, in the schedule's spelling; plain lower-case words skip the regex. */
function readWord(raw: string): string {
  if (raw === 'verge' || raw === 'hip' || raw === 'ridge' || raw === 'valley') return raw;
  return raw.trim() === '' ? '' : normaliseEdgeWord(raw);
}

/**
 * Reads a roof schedule from CSV text as spreadsheets export it: UTF-8 with or without a BOM, comma,
 * semicolon or tab delimited (decimal comma with a semicolon), quoted fields, CRLF, blank lines. The
 * header names the columns in any order (case ignored); unknown columns give a warning. Every problem
 * is listed with its spreadsheet row (header = 1) and column. With a system, a pitch below the tile's
 * lowest band is a problem too.
 */
export function parseScheduleCsv(text: string, system?: RoofSystem): ScheduleParse {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') {
    return {
      ok: false,
      errors: [{ message: 'the schedule is empty: it needs a header row and at least one face' }],
      warnings: [],
    };
  }
  const delimiter = detectDelimiter(body);
  let reader: ScheduleReader | null = new ScheduleReader(delimiter, system ? lowestPitch(system.tile.headlap_mm) : -Infinity);
  Papa.parse<string[]>(body, papaConfig(delimiter, (results) => reader?.chunk(results), body.length) as ChunkedParseConfig & Papa.ParseLocalConfig<string[], Papa.LocalFile>);
  const parsed = reader.finish();
  // papaparse's call sites keep a reference to the last callback they called until the next full
  // collection, and young-generation collections count it: cut the callback off from the faces, so
  // they die young once the caller is done with them.
  reader = null;
  return parsed;
}

/** The state of one schedule being read, fed by papaparse a chunk of rows at a time. */
class ScheduleReader {
  readonly errors: InputProblem[] = [];
  readonly warnings: ScheduleWarning[] = [];
  readonly faces: Face[] = [];
  private readonly col = Object.fromEntries(SCHEDULE_COLUMNS.map((c) => [c, -1])) as ColumnIndex;
  private readonly cells: RowReader;
  // Face names by building, both without case, to the row that first gave them.
  private readonly seen = new Map<string, Map<string, number>>();
  private readonly candidate: FaceCandidate = {
    building: '',
    face: '',
    quantity: 1,
    pitch_deg: 0,
    rafter_mm: undefined,
    run_mm: undefined,
    eaves_mm: 0,
    top_mm: undefined,
    left: 'verge',
    right: 'verge',
    top: 'ridge',
    ridge: undefined,
  };
  /** Rows of the file consumed so far (the header included). */
  private rowsBefore = 0;
  private headerDone = false;
  private headerOk = false;
  private width = 0;
  private dataRows = 0;

  constructor(
    private readonly delimiter: string,
    private readonly lowestPitch: number,
  ) {
    this.cells = new RowReader(this.col, delimiter !== ',', this.errors);
  }

  chunk(results: Papa.ParseResult<string[]>) {
    for (const e of results.errors) {
      if (e.code === 'UndetectableDelimiter') continue;
      this.errors.push({
        ...(e.row !== undefined && e.row !== null ? { row: this.rowsBefore + e.row + 1 } : {}),
        message: e.message,
      });
    }
    const data = results.data;
    let start = 0;
    if (!this.headerDone && data.length > 0) {
      this.readHeader(data[0]);
      start = 1;
    }
    if (this.headerOk) {
      for (let r = start; r < data.length; r++) this.readRow(data[r], this.rowsBefore + r + 1);
    }
    this.rowsBefore += data.length;
  }

  private readHeader(raw: readonly string[]) {
    this.headerDone = true;
    const header = raw.map(normaliseHeader);
    this.width = header.length;
    const known = new Set<string>(SCHEDULE_COLUMNS);
    let knownColumns = 0;
    header.forEach((name, i) => {
      if (name === '') return;
      if (!known.has(name)) {
        this.warnings.push({
          code: 'unknown_column',
          building: null,
          face: null,
          message: `column '${raw[i]?.trim() ?? name}' is not a schedule column and was ignored`,
        });
        return;
      }
      const c = name as ScheduleColumn;
      if (this.col[c] >= 0) this.errors.push({ row: 1, column: c, message: 'the column is given twice' });
      else {
        this.col[c] = i;
        knownColumns++;
      }
    });
    if (knownColumns === 0) {
      this.errors.push({
        row: 1,
        message: `the first row must be a header naming the columns (${SCHEDULE_COLUMNS.join(', ')})`,
      });
      return;
    }
    this.headerOk = true;
    for (const required of ['face', 'pitch_deg', 'eaves_mm'] as const) {
      if (this.col[required] < 0) this.errors.push({ row: 1, column: required, message: 'this required column is missing' });
    }
    if (this.col.rafter_mm < 0 && this.col.run_mm < 0) {
      this.errors.push({ row: 1, column: 'rafter_mm', message: 'the header needs rafter_mm or run_mm (or both)' });
    }
  }

  private readRow(cells: readonly string[], row: number) {
    if (isBlankRow(cells)) return;
    this.dataRows++;
    const col = this.col;
    const reader = this.cells;
    const errors = this.errors;
    reader.start(row, cells);
    if (cells.length > this.width) {
      let extra = false;
      for (let i = this.width; i < cells.length; i++) if (cells[i].trim() !== '') extra = true;
      if (extra) {
        errors.push({
          row,
          message: `has ${cells.length} values but the header has ${this.width} columns; a value with a ${DELIMITER_NAMES[this.delimiter]} in it needs quotes`,
        });
        reader.rowBad = true;
      }
    }

    const building = reader.text('building', col.building, '1');
    const faceName = reader.text('face', col.face, null);
    const quantity = reader.number('quantity', col.quantity, false, CHECK_QUANTITY) ?? 1;
    let pitch = reader.number('pitch_deg', col.pitch_deg, true, CHECK_PITCH);
    if (pitch !== undefined && pitch < this.lowestPitch - 1e-9) {
      reader.bad('pitch_deg', `${pitch}° is below the lowest pitch this tile may be laid at (${this.lowestPitch}°)`);
      pitch = undefined;
    }
    const rafter = reader.number('rafter_mm', col.rafter_mm, false, CHECK_MM);
    const run = reader.number('run_mm', col.run_mm, false, CHECK_MM);
    const eaves = reader.number('eaves_mm', col.eaves_mm, true, CHECK_MM);
    const top = reader.number('top_mm', col.top_mm, false, CHECK_MM_OR_ZERO);
    const left = reader.edge('left', col.left);
    const right = reader.edge('right', col.right);
    const topKind = reader.topEdge(col.top);
    const ridgeName = col.ridge >= 0 ? reader.text('ridge', col.ridge, '') : '';

    if (faceName !== '') {
      const bKey = building.toLowerCase();
      let names = this.seen.get(bKey);
      if (!names) {
        names = new Map();
        this.seen.set(bKey, names);
      }
      const fKey = faceName.toLowerCase();
      const first = names.get(fKey);
      if (first !== undefined) {
        reader.bad('face', `duplicate face '${faceName}' in building '${building}' (first at row ${first})`);
      } else names.set(fKey, row);
    }

    if (reader.rowBad || pitch === undefined || eaves === undefined || faceName === '') return;
    if (rafter === undefined && run === undefined) {
      if (reader.present('rafter_mm') || reader.present('run_mm')) reader.bad('rafter_mm', SCHEDULE_MESSAGES.rafterOrRun);
      return;
    }
    // One candidate object for the whole file: only the resolved face is kept.
    const candidate = this.candidate;
    candidate.building = building;
    candidate.face = faceName;
    candidate.quantity = quantity;
    candidate.pitch_deg = pitch;
    candidate.rafter_mm = rafter;
    candidate.run_mm = run;
    candidate.eaves_mm = eaves;
    candidate.top_mm = top;
    candidate.left = left;
    candidate.right = right;
    candidate.top = topKind;
    candidate.ridge = ridgeName === '' ? undefined : ridgeName;
    const cross = crossCheckFace(candidate);
    if (cross.length > 0) {
      for (const p of cross) errors.push({ row, column: p.column, message: p.message });
      return;
    }
    this.faces.push(resolveFace(candidate));
  }

  finish(): ScheduleParse {
    const { errors, warnings } = this;
    if (this.headerOk && this.dataRows === 0) errors.push({ message: 'the schedule has a header but no faces' });
    if (errors.length > 0) return { ok: false, errors, warnings };
    return { ok: true, faces: this.faces, warnings, delimiter: this.delimiter };
  }
}
