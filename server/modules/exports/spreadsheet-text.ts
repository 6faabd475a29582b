/**
 * Text that a spreadsheet could read as a formula: it starts (after any spaces) with = + - @, or
 * with a tab or carriage return, including the full-width forms some locales turn into formulas.
 */
const FORMULA_START = /^(?:[\t\r]|\s*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20])/;

/** Prefixes such text with an apostrophe so a spreadsheet shows it as text and never runs it. */
export function neutraliseText(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/** Cells of an export: text is neutralised, numbers pass as numbers, missing values stay empty. */
export function safeCell(value: string | number | null | undefined): string | number | null {
  if (value === null || value === undefined) return null;
  return typeof value === 'number' ? value : neutraliseText(value);
}
