import type Papa from 'papaparse';
import type { RoofSystem } from '../schemas/roof-system.schema';
import { SCHEDULE_COLUMNS, SCHEDULE_MESSAGES, crossCheckFace, resolveFace, type Face, type FaceCandidate, type ScheduleColumn } from '../schemas/schedule.schema';
import { lowestPitch } from './courses';
import { addPapaProblems, detectDelimiter, isBlankRow, normaliseHeader, readCsvChunks } from './csv-read';
import type { InputProblem } from './result';
import { CHECK_MM, CHECK_MM_OR_ZERO, CHECK_PITCH, CHECK_QUANTITY, RowReader, type ColumnIndex } from './schedule-row';

// The browser's file reader and the benchmark take the CSV settings from here.
export { CSV_CHUNK_CHARS, detectDelimiter, papaConfig, type ChunkedParseConfig } from './csv-read';

export interface ScheduleWarning {
  code: 'unknown_column' | 'ridge_grouping_guessed';
  building: null;
  face: null;
  message: string;
}

export type ScheduleParse = { ok: true; faces: Face[]; warnings: ScheduleWarning[]; delimiter: string } | { ok: false; errors: InputProblem[]; warnings: ScheduleWarning[] };

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

/**
 * Reads a roof schedule from CSV text as spreadsheets export it: UTF-8 with or without a BOM, comma,
 * semicolon or tab delimited (decimal comma with a semicolon), quoted fields, CRLF, blank lines. The
 * header names the columns in any order (case ignored); unknown columns give a warning. Every problem
 * is listed with its spreadsheet row (header = 1) and column. With a system, a pitch below the tile's
 * lowest band is a problem too.
 */
export function parseScheduleCsv(text: string, system?: RoofSystem): ScheduleParse {
  return readScheduleCsv(text, system).parsed;
}

/** A schedule read from CSV, and its faces found by building and name when it was accepted. */
export interface ScheduleRead {
  parsed: ScheduleParse;
  index: ScheduleFaceIndex | null;
}

/** parseScheduleCsv, with the index of the faces the reader filed by name (the openings are checked through it). */
export function readScheduleCsv(text: string, system?: RoofSystem): ScheduleRead {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') {
    return {
      parsed: {
        ok: false,
        errors: [{ message: 'the schedule is empty: it needs a header row and at least one face' }],
        warnings: [],
      },
      index: null,
    };
  }
  const delimiter = detectDelimiter(body);
  const reader = new ScheduleReader(delimiter, system ? lowestPitch(system.tile.headlap_mm) : -Infinity);
  readCsvChunks(body, delimiter, reader);
  const parsed = reader.finish();
  return { parsed, index: parsed.ok ? new ScheduleFaceIndex(reader.seen, reader.rowOfFace) : null };
}

/**
 * The faces of an accepted schedule by building and face name, both without case or outer spaces (as
 * faceKey compares them): the names the reader filed to find duplicates, so nothing is filed twice.
 */
export class ScheduleFaceIndex {
  private lastBuilding: string | null = null;
  private lastFaces: Map<string, number> | undefined;
  constructor(
    private readonly seen: ReadonlyMap<string, Map<string, number>>,
    private readonly rowOfFace: readonly number[],
  ) {}

  /** The face's index in the schedule's faces, or -1 when the schedule has no such face. */
  find(building: string, face: string): number {
    if (building !== this.lastBuilding) {
      this.lastBuilding = building;
      this.lastFaces = this.seen.get(building.trim().toLowerCase());
    }
    const row = this.lastFaces?.get(face.trim().toLowerCase());
    if (row === undefined) return -1;
    // Faces are kept in row order: the face of a row is found by halving.
    const rows = this.rowOfFace;
    let lo = 0;
    let hi = rows.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (rows[mid] < row) lo = mid + 1;
      else hi = mid;
    }
    return lo < rows.length && rows[lo] === row ? lo : -1;
  }
}

/** The state of one schedule being read, fed by papaparse a chunk of rows at a time. */
class ScheduleReader {
  readonly errors: InputProblem[] = [];
  readonly warnings: ScheduleWarning[] = [];
  readonly faces: Face[] = [];
  private readonly col = Object.fromEntries(SCHEDULE_COLUMNS.map((c) => [c, -1])) as ColumnIndex;
  private readonly cells: RowReader;
  // Face names by building, both without case, to the row that first gave them.
  readonly seen = new Map<string, Map<string, number>>();
  /** The row each face was read from. */
  readonly rowOfFace: number[] = [];
  private lastBuilding = '';
  private lastNames: Map<string, number> | null = null;
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
    addPapaProblems(results, this.rowsBefore, this.errors);
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

    let building = reader.text('building', col.building, '1');
    // The faces of a building share one copy of its name.
    if (building === this.lastBuilding) building = this.lastBuilding;
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
      // Faces of one building usually follow each other: its names are looked up once for them all.
      let names = this.lastNames;
      if (names === null || building !== this.lastBuilding) {
        const bKey = building.toLowerCase();
        names = this.seen.get(bKey) ?? null;
        if (names === null) {
          names = new Map();
          this.seen.set(bKey, names);
        }
        this.lastBuilding = building;
        this.lastNames = names;
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
    this.rowOfFace.push(row);
  }

  finish(): ScheduleParse {
    const { errors, warnings } = this;
    if (this.headerOk && this.dataRows === 0) errors.push({ message: 'the schedule has a header but no faces' });
    if (errors.length > 0) return { ok: false, errors, warnings };
    return { ok: true, faces: this.faces, warnings, delimiter: this.delimiter };
  }
}
