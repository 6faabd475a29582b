import { fireEvent, render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { CsvGrid, GridCheck } from '../lib/csv-grid';
import { SchedulePreview, columnWidths, stickyColumns } from './schedule-preview';

const header = ['building', 'face', 'quantity', 'pitch_deg', 'rafter_mm', 'run_mm', 'eaves_mm', 'top_mm', 'left', 'right', 'top'];
const grid: CsvGrid = {
  delimiter: ',',
  rows: [header, ['Birch', 'Front', '8', '40', '5000', '', '8000', '', 'verge', 'verge', 'ridge'], ['Birch', 'Back', '8', '40', '5000', '', '8000', '', 'verge', 'verge', 'rdge']],
};
// A mistake in the last column (K), which a narrow screen would otherwise leave off to the right.
const check: GridCheck = { ok: false, faces: [], faceRows: [], warnings: [], problems: [{ row: 3, column: 10, columnName: 'top', message: 'must be ridge, mono_ridge or abutment' }] };

describe('SchedulePreview', () => {
  it('fits each column to its longest value instead of a wide fixed width', () => {
    expect(columnWidths(grid.rows, header.length)).toEqual(header.map((h, c) => Math.min(40, Math.max(5, h.length, ...grid.rows.slice(1).map((r) => r[c].length))) + 3));
    render(<SchedulePreview grid={grid} check={check} checking={false} onCellChange={vi.fn()} />);
    const quantity = screen.getByLabelText('Row 2, column C (quantity)').parentElement!;
    expect(quantity.style.width).toBe(`${'quantity'.length + 3}ch`);
    expect(quantity.className).not.toContain('min-w-24');
  });

  it('keeps the row number, building and face columns in view while scrolling sideways', () => {
    expect(stickyColumns(header)).toEqual([0, 1]);
    expect(stickyColumns(['pitch_deg', 'building'])).toEqual([]);
    render(<SchedulePreview grid={grid} check={check} checking={false} onCellChange={vi.fn()} />);
    const cellOf = (label: string) => screen.getByLabelText(label).closest('td')!;
    expect(cellOf('Row 2, column A (building)').className).toContain('sticky');
    expect(cellOf('Row 2, column B (face)').className).toContain('sticky');
    expect(cellOf('Row 2, column C (quantity)').className).not.toContain('sticky');
    expect(screen.getByText('2').closest('td')!.className).toContain('sticky');
  });

  it('scrolls a chosen problem’s cell into view sideways as well as down', () => {
    const scroll = vi.fn();
    Element.prototype.scrollIntoView = scroll;
    render(<SchedulePreview grid={grid} check={check} checking={false} onCellChange={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: /must be ridge, mono_ridge or abutment/ }));
    expect(document.activeElement).toBe(screen.getByLabelText('Row 3, column K (top)'));
    expect(scroll).toHaveBeenCalledWith({ block: 'center', inline: 'center' });
  });
});
