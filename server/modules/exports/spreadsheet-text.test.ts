import { describe, expect, it } from 'vitest';
import { neutraliseText, safeCell } from './spreadsheet-text';

// The characters that start a formula or a command in a spreadsheet cell (OWASP "CSV Injection").
describe('neutraliseText', () => {
  it.each(['=1+1', '+cmd', '-2+3', '@SUM(A1)', '\tindent', '\rreturn', '  =padded', '＝FULLWIDTH()'])('puts an apostrophe before %j', (value) => {
    expect(neutraliseText(value)).toBe(`'${value}`);
  });

  it.each(['Front', 'Plot 1 = house', '2 + 2', 'e-mail', ''])('leaves %j as it is', (value) => {
    expect(neutraliseText(value)).toBe(value);
  });

  it('passes numbers (negative ones too) and empty values through untouched', () => {
    expect(safeCell(-12.5)).toBe(-12.5);
    expect(safeCell(null)).toBeNull();
    expect(safeCell(undefined)).toBeNull();
  });
});
