import type Papa from 'papaparse';
import type { RoofSystem } from '../schemas/roof-system.schema';
import { SCHEDULE_COLUMNS, SCHEDULE_MESSAGES, crossCheckFace, resolveFace, type Face, type FaceCandidate, type ScheduleColumn } from '../schemas/schedule.schema';
import { lowestPitch } from './courses';
import { addPapaProblems, detectDelimiter, isBlankRow, normaliseHeader, readCsvChunks, tooManyValues } from './csv-read';
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
  const reader = new ScheduleReader(delimiter, system ? lowestPitch(system.tile.headlap_mm) : -Infinity, body.length);
  readCsvChunks(body, delimiter, reader);
  const parsed = reader.finish();
  return { parsed, index: parsed.ok ? reader.names : null };
}

// FNV-1a over the characters of a name's key.
const HASH_START = 0x811c9dc5 | 0;
const HASH_PRIME = 16777619;

function isAsciiSpace(c: number): boolean {
  return c === 32 || (c >= 9 && c <= 13);
}

/**
 * Hash h carried over a key's characters (a key made by faceKey's rule: no outer spaces, lower case).
 * Each character is hashed with its 0x20 bit set: lower-casing an ASCII letter sets that bit, so a
 * plain ASCII name hashes as its key without being lowered (characters that differ only in that bit
 * merely share a hash, and names are compared in full).
 */
function hashChars(h: number, key: string): number {
  for (let i = 0; i < key.length; i++) h = Math.imul(h ^ (key.charCodeAt(i) | 32), HASH_PRIME);
  return h;
}

/**
 * Hash h carried over the key of a name, compared as faceKey compares it (without case or outer
 * spaces). A plain ASCII name is hashed as it stands, with no key string made; any other goes
 * through trim() and toLowerCase() themselves, whose rules (Unicode spaces, letters that lower to
 * ASCII or to two characters) the hash then follows exactly.
 */
function hashName(h: number, name: string): number {
  let start = 0;
  let end = name.length;
  while (start < end && isAsciiSpace(name.charCodeAt(start))) start++;
  while (end > start && isAsciiSpace(name.charCodeAt(end - 1))) end--;
  let x = h;
  let seen = 0;
  for (let i = start; i < end; i++) {
    const c = name.charCodeAt(i);
    seen |= c;
    x = Math.imul(x ^ (c | 32), HASH_PRIME);
  }
  return seen < 128 ? x : hashChars(h, name.trim().toLowerCase());
}

/** A building's hash carried on to one of its faces. */
function faceHash(buildingHash: number, face: string): number {
  return hashName(Math.imul(buildingHash ^ 0x1f, HASH_PRIME), face);
}

function isAscii(s: string): boolean {
  for (let i = 0; i < s.length; i++) if (s.charCodeAt(i) >= 128) return false;
  return true;
}

/** True when two names have the same key (faceKey's rule), without making the keys of plain ASCII names. */
function sameName(a: string, b: string): boolean {
  if (a === b) return true;
  let as = 0;
  let ae = a.length;
  let bs = 0;
  let be = b.length;
  while (as < ae && isAsciiSpace(a.charCodeAt(as))) as++;
  while (ae > as && isAsciiSpace(a.charCodeAt(ae - 1))) ae--;
  while (bs < be && isAsciiSpace(b.charCodeAt(bs))) bs++;
  while (be > bs && isAsciiSpace(b.charCodeAt(be - 1))) be--;
  if (ae - as === be - bs) {
    let i = 0;
    for (; as + i < ae; i++) {
      let ca = a.charCodeAt(as + i);
      let cb = b.charCodeAt(bs + i);
      if (ca >= 128 || cb >= 128) break;
      if (ca >= 65 && ca <= 90) ca += 32;
      if (cb >= 65 && cb <= 90) cb += 32;
      if (ca !== cb) break;
    }
    if (as + i === ae) return true;
  }
  if (isAscii(a) && isAscii(b)) return false;
  return a.trim().toLowerCase() === b.trim().toLowerCase();
}

/**
 * The face names of a schedule by building and name, both without case or outer spaces (as faceKey
 * compares them): the reader files each name once to find duplicates, and the openings are found
 * through the same entries. An open-addressed table of hashes in typed arrays: no key string, map or
 * object per face; an entry points at its face (or, for a row that gave none, at its names kept aside).
 */
export class ScheduleFaceIndex {
  /** Entry + 1 per slot, 0 when empty; a power of two, at most half full. */
  private slots: Int32Array;
  private hashes: Int32Array;
  private rows: Int32Array;
  /** The face's index in the schedule's faces, or -1 - k for the k-th row that gave no face. */
  private refs: Int32Array;
  private count = 0;
  /** Building and face name of each filed row that gave no face. */
  private readonly otherNames: string[] = [];
  private lastBuilding: string | null = null;
  private lastHash = 0;

  constructor(
    private readonly faces: readonly Face[],
    expected: number,
  ) {
    let size = 64;
    while (size < 2 * expected) size *= 2;
    this.slots = new Int32Array(size);
    this.hashes = new Int32Array(size >> 1);
    this.rows = new Int32Array(size >> 1);
    this.refs = new Int32Array(size >> 1);
  }

  /** The face's index in the schedule's faces, or -1 when the schedule has no such face. */
  find(building: string, face: string): number {
    if (building !== this.lastBuilding) {
      this.lastBuilding = building;
      this.lastHash = hashName(HASH_START, building);
    }
    const e = this.entry(faceHash(this.lastHash, face), building, face);
    // An index is given only for a schedule whose every filed row gave a face.
    return e < 0 || this.refs[e] < 0 ? -1 : this.refs[e];
  }

  /** The entry filed under this building and face name (hash from faceHash), or -1. */
  entry(hash: number, building: string, face: string): number {
    const slots = this.slots;
    const mask = slots.length - 1;
    for (let s = hash & mask; ; s = (s + 1) & mask) {
      const e = slots[s] - 1;
      if (e < 0) return -1;
      if (this.hashes[e] === hash && sameName(this.buildingOf(e), building) && sameName(this.faceOf(e), face)) return e;
    }
  }

  /** The spreadsheet row an entry was first given at. */
  rowOf(e: number): number {
    return this.rows[e];
  }

  /** Files a name not filed before: its face's index, or -1 when its row gave no face. */
  file(hash: number, row: number, building: string, face: string, faceIndex: number) {
    if (2 * (this.count + 1) > this.slots.length) this.grow();
    const e = this.count++;
    if (e === this.rows.length) {
      this.hashes = larger(this.hashes);
      this.rows = larger(this.rows);
      this.refs = larger(this.refs);
    }
    this.hashes[e] = hash;
    this.rows[e] = row;
    if (faceIndex >= 0) this.refs[e] = faceIndex;
    else {
      this.refs[e] = -1 - (this.otherNames.length >> 1);
      this.otherNames.push(building, face);
    }
    this.place(e, hash);
  }

  private buildingOf(e: number): string {
    const ref = this.refs[e];
    return ref >= 0 ? this.faces[ref].building : this.otherNames[2 * (-1 - ref)];
  }

  private faceOf(e: number): string {
    const ref = this.refs[e];
    return ref >= 0 ? this.faces[ref].face : this.otherNames[2 * (-1 - ref) + 1];
  }

  private place(e: number, hash: number) {
    const slots = this.slots;
    const mask = slots.length - 1;
    let s = hash & mask;
    while (slots[s] !== 0) s = (s + 1) & mask;
    slots[s] = e + 1;
  }

  private grow() {
    this.slots = new Int32Array(this.slots.length * 2);
    for (let e = 0; e < this.count; e++) this.place(e, this.hashes[e]);
  }
}

function larger(a: Int32Array): Int32Array {
  const b = new Int32Array(a.length * 2);
  b.set(a);
  return b;
}

/** The state of one schedule being read, fed by papaparse a chunk of rows at a time. */
class ScheduleReader {
  readonly errors: InputProblem[] = [];
  readonly warnings: ScheduleWarning[] = [];
  readonly faces: Face[] = [];
  private readonly col = Object.fromEntries(SCHEDULE_COLUMNS.map((c) => [c, -1])) as ColumnIndex;
  private readonly cells: RowReader;
  /** Face names by building, both without case, to the row that first gave them. */
  readonly names: ScheduleFaceIndex;
  private lastBuilding = '';
  private lastBuildingHash = 0;
  private lastRidge = '';
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
    textLength: number,
  ) {
    this.cells = new RowReader(this.col, delimiter !== ',', this.errors);
    // A schedule's row takes some 30 to 80 characters: the table grows when the guess is short.
    this.names = new ScheduleFaceIndex(this.faces, textLength >> 6);
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
    const extra = tooManyValues(cells, this.width, this.delimiter);
    if (extra !== null) {
      errors.push({ row, message: extra });
      reader.rowBad = true;
    }

    let building = reader.text('building', col.building, '1');
    // The faces of a building share one copy of its name, and its name is hashed once for them all.
    if (building === this.lastBuilding) building = this.lastBuilding;
    else {
      this.lastBuilding = building;
      this.lastBuildingHash = hashName(HASH_START, building);
    }
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
    let ridgeName = col.ridge >= 0 ? reader.text('ridge', col.ridge, '') : '';
    // Faces meeting one ridge usually follow each other: they share one copy of its name.
    if (ridgeName === this.lastRidge) ridgeName = this.lastRidge;
    else this.lastRidge = ridgeName;

    // A face name given for the first time is filed at the end of its row, with the face it gave.
    let hash = 0;
    let fileName = false;
    if (faceName !== '') {
      hash = faceHash(this.lastBuildingHash, faceName);
      const first = this.names.entry(hash, building, faceName);
      if (first >= 0) reader.bad('face', `duplicate face '${faceName}' in building '${building}' (first at row ${this.names.rowOf(first)})`);
      else fileName = true;
    }

    let faceIndex = -1;
    if (!reader.rowBad && pitch !== undefined && eaves !== undefined && faceName !== '') {
      if (rafter === undefined && run === undefined) {
        if (reader.present('rafter_mm') || reader.present('run_mm')) reader.bad('rafter_mm', SCHEDULE_MESSAGES.rafterOrRun);
      } else {
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
        } else {
          faceIndex = this.faces.length;
          this.faces.push(resolveFace(candidate));
        }
      }
    }
    if (fileName) this.names.file(hash, row, building, faceName, faceIndex);
  }

  finish(): ScheduleParse {
    const { errors, warnings } = this;
    if (this.headerOk && this.dataRows === 0) errors.push({ message: 'the schedule has a header but no faces' });
    if (errors.length > 0) return { ok: false, errors, warnings };
    return { ok: true, faces: this.faces, warnings, delimiter: this.delimiter };
  }
}
