import Papa from 'papaparse';
import type { InputProblem } from './result';

/**
 * What the schedule and openings readers share: the delimiter, papaparse's settings, header names,
 * number cells and papaparse's own problems, read the same way in both files.
 */

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

/** papaparse's settings for both readers (the benchmark times the bare parse with these). */
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

/** What a reader fed by readCsvChunks does with each chunk of rows. */
export interface ChunkReader {
  chunk(results: Papa.ParseResult<string[]>): void;
}

/**
 * Feeds a file's text to `reader` chunk by chunk. papaparse's call sites keep a reference to the last
 * callback they called until the next full collection, and young-generation collections count it: the
 * callback holds the reader only through a variable cleared once the text is read, so the rows the
 * reader made die young once its caller is done with them (DEVELOPERS.md, decision 31).
 */
export function readCsvChunks(body: string, delimiter: string, reader: ChunkReader) {
  let held: ChunkReader | null = reader;
  Papa.parse<string[]>(body, papaConfig(delimiter, (results) => held?.chunk(results), body.length) as ChunkedParseConfig & Papa.ParseLocalConfig<string[], Papa.LocalFile>);
  held = null;
}

/** papaparse's own problems in a chunk, with their spreadsheet rows (header = 1), into `out`. */
export function addPapaProblems(results: Papa.ParseResult<string[]>, rowsBefore: number, out: InputProblem[]) {
  for (const e of results.errors) {
    if (e.code === 'UndetectableDelimiter') continue;
    out.push({
      ...(e.row !== undefined && e.row !== null ? { row: rowsBefore + e.row + 1 } : {}),
      message: e.message,
    });
  }
}

/** Header names are read without case, outer spaces, or the difference between "pitch deg" and pitch_deg. */
export function normaliseHeader(raw: string): string {
  return raw
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
}

/** True when a character is printable ASCII other than a space: a cell starting or ending with one needs no trim(). */
function isPlainEnd(c: number): boolean {
  return c > 32 && c < 127;
}

/** A cell without its outer spaces; trim() is called only when an end of the cell may be a space. */
export function trimCell(cell: string): string {
  const n = cell.length;
  return n === 0 || (isPlainEnd(cell.charCodeAt(0)) && isPlainEnd(cell.charCodeAt(n - 1))) ? cell : cell.trim();
}

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

/**
 * A row with values past its header's last column: `null` when those cells are blank (a spreadsheet's
 * trailing delimiters), else the problem, which names the delimiter a value must be quoted for.
 */
export function tooManyValues(cells: readonly string[], width: number, delimiter: string): string | null {
  if (cells.length <= width) return null;
  for (let i = width; i < cells.length; i++) if (cells[i].trim() !== '') return tooManyValuesMessage(cells.length, width, delimiter);
  return null;
}

function tooManyValuesMessage(values: number, width: number, delimiter: string): string {
  return `has ${values} values but the header has ${width} columns; a value with a ${DELIMITER_NAMES[delimiter]} in it needs quotes`;
}

/** True when every cell of a row is blank. */
export function isBlankRow(cells: readonly string[]): boolean {
  for (let i = 0; i < cells.length; i++) {
    const cell = cells[i];
    if (cell.length > 0 && (isPlainEnd(cell.charCodeAt(0)) || cell.trim() !== '')) return false;
  }
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
export function readNumber(raw: string, decimalComma: boolean): number | null {
  // Whole millimetres and degrees, the usual cell, are added up digit by digit (exact below 2^53),
  // before any trim().
  const n = raw.length;
  if (n === 0) return null;
  if (n <= 15) {
    let v = 0;
    let i = 0;
    for (; i < n; i++) {
      const ch = raw.charCodeAt(i);
      if (ch < 48 || ch > 57) break;
      v = v * 10 + (ch - 48);
    }
    if (i === n) return v;
  }
  const s = raw.trim();
  if (s === '') return null;
  if (s.length <= 15) {
    let v = 0;
    let i = 0;
    for (; i < s.length; i++) {
      const ch = s.charCodeAt(i);
      if (ch < 48 || ch > 57) break;
      v = v * 10 + (ch - 48);
    }
    if (i === s.length) return v;
  }
  if (isPlainDecimal(s, 46)) return Number(s);
  if (decimalComma && isPlainDecimal(s, 44)) return Number(s.replace(',', '.'));
  return NaN;
}
