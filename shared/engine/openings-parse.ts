import Papa from 'papaparse';
import { OPENING_COLUMNS, checkOpeningsAgainstFaces, normaliseOpeningKind, openingKindProblem, type Opening, type OpeningColumn, type OpeningKind } from '../schemas/openings.schema';
import { SCHEDULE_LIMITS, SCHEDULE_MESSAGES, millimetreProblem, quantityProblem, type Face } from '../schemas/schedule.schema';
import type { InputProblem } from './result';
import { detectDelimiter } from './schedule-parse';

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
  const parsed = Papa.parse<string[]>(body, { delimiter, header: false, skipEmptyLines: false });
  const errors: InputProblem[] = [];
  const warnings: Array<{ code: 'unknown_column'; building: null; face: null; message: string }> = [];
  for (const e of parsed.errors) {
    if (e.code === 'UndetectableDelimiter') continue;
    errors.push({ ...(e.row !== undefined && e.row !== null ? { row: e.row + 1 } : {}), message: e.message });
  }
  const rows = parsed.data;
  const col = Object.fromEntries(OPENING_COLUMNS.map((c) => [c, -1])) as Record<OpeningColumn, number>;
  const header = (rows[0] ?? []).map(normaliseHeader);
  header.forEach((name, i) => {
    if (name === '') return;
    if (!(OPENING_COLUMNS as readonly string[]).includes(name)) {
      warnings.push({ code: 'unknown_column', building: null, face: null, message: `column '${rows[0][i].trim()}' is not an openings column and was ignored` });
      return;
    }
    const c = name as OpeningColumn;
    if (col[c] >= 0) errors.push({ row: 1, column: c, message: 'the column is given twice' });
    else col[c] = i;
  });
  for (const required of ['face', 'kind', 'width_mm', 'height_mm'] as const) {
    if (col[required] < 0) errors.push({ row: 1, column: required, message: 'this required column is missing' });
  }
  if (errors.length > 0) return { ok: false, errors };

  const decimalComma = delimiter !== ',';
  const openings: Opening[] = [];
  const rowOf: number[] = [];
  for (let r = 1; r < rows.length; r++) {
    const cells = rows[r];
    if (cells.every((c) => c.trim() === '')) continue;
    const row = r + 1;
    let bad = false;
    const problem = (column: OpeningColumn, message: string) => {
      errors.push({ row, column, message });
      bad = true;
    };
    const text = (c: 'building' | 'face', fallback: string | null): string => {
      const v = (col[c] >= 0 ? (cells[col[c]] ?? '') : '').trim();
      if (v === '') {
        if (fallback === null) problem(c, SCHEDULE_MESSAGES.required);
        return fallback ?? '';
      }
      if (v.length > SCHEDULE_LIMITS.maxTextLength) problem(c, SCHEDULE_MESSAGES.textTooLong);
      return v;
    };
    const number = (c: 'width_mm' | 'height_mm' | 'quantity', required: boolean): number | undefined => {
      const raw = col[c] >= 0 ? (cells[col[c]] ?? '') : '';
      const v = readNumber(raw, decimalComma);
      if (v === null) {
        if (required) problem(c, SCHEDULE_MESSAGES.required);
        return undefined;
      }
      if (Number.isNaN(v)) {
        problem(c, `must be a number, not '${raw.trim()}'`);
        return undefined;
      }
      const p = c === 'quantity' ? quantityProblem(v) : millimetreProblem(v, false);
      if (p) {
        problem(c, p);
        return undefined;
      }
      return v;
    };
    const building = text('building', '1');
    const face = text('face', null);
    const rawKind = (cells[col.kind] ?? '').trim();
    let kind: OpeningKind | undefined;
    if (rawKind === '') problem('kind', SCHEDULE_MESSAGES.required);
    else {
      const k = normaliseOpeningKind(rawKind);
      const p = openingKindProblem(k);
      if (p) problem('kind', p.replace(`'${k}'`, `'${rawKind}'`));
      else kind = k as OpeningKind;
    }
    const width = number('width_mm', true);
    const height = number('height_mm', true);
    const quantity = number('quantity', false) ?? 1;
    if (bad || kind === undefined || width === undefined || height === undefined) continue;
    openings.push({ building, face, kind, width_mm: width, height_mm: height, quantity });
    rowOf.push(row);
  }
  if (faces) {
    for (const p of checkOpeningsAgainstFaces(openings, faces)) errors.push({ row: rowOf[p.index], column: p.column, message: p.message });
  }
  if (errors.length > 0) {
    errors.sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
    return { ok: false, errors };
  }
  return { ok: true, openings, warnings };
}
