import { fireEvent, render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { DataTable, dataTableColumns } from './data-table';

interface Pallet {
  id: number;
  ref: string;
  tiles: number;
}

const helper = dataTableColumns<Pallet>();
const columns = helper.columns([
  helper.accessor('ref', { header: 'Reference', sortFn: 'text' }),
  helper.accessor('tiles', { header: 'Tiles', sortFn: 'alphanumeric' }),
  helper.display({ id: 'note', header: 'Note', cell: () => 'n/a' }),
]);
const data: Pallet[] = [
  { id: 1, ref: 'B-2', tiles: 240 },
  { id: 2, ref: 'A-9', tiles: 1200 },
  { id: 3, ref: 'C-1', tiles: 96 },
];

function firstColumn(): string[] {
  return screen
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent ?? '');
}

describe('DataTable', () => {
  it('sorts by a column when its header button is pressed and reports the order through aria-sort', () => {
    render(<DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} />);
    const header = screen.getByRole('columnheader', { name: /Reference/ });
    expect(header.getAttribute('aria-sort')).toBe('none');

    fireEvent.click(within(header).getByRole('button'));
    expect(header.getAttribute('aria-sort')).toBe('ascending');
    expect(firstColumn()).toEqual(['A-9', 'B-2', 'C-1']);

    fireEvent.click(within(header).getByRole('button'));
    expect(header.getAttribute('aria-sort')).toBe('descending');
    expect(firstColumn()).toEqual(['C-1', 'B-2', 'A-9']);
  });

  it('sorts numbers as numbers, not as text', () => {
    render(
      <DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} initialSorting={[{ id: 'tiles', desc: false }]} />,
    );
    expect(firstColumn()).toEqual(['C-1', 'B-2', 'A-9']);
  });

  it('makes sortable headers buttons a keyboard reaches, and leaves others plain', () => {
    render(<DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} />);
    const buttons = screen.getAllByRole('button');
    expect(buttons.map((button) => button.textContent)).toEqual(['Reference', 'Tiles']);
    expect(screen.getByRole('columnheader', { name: 'Note' }).getAttribute('aria-sort')).toBeNull();
    expect(screen.getByRole('table', { name: 'Pallets' })).toBeTruthy();
  });

  it('shows the empty state when there are no rows', () => {
    render(<DataTable caption="Pallets" columns={columns} data={[]} getRowId={(row) => String(row.id)} empty={<p>No pallets on this lorry</p>} />);
    expect(screen.getByText('No pallets on this lorry')).toBeTruthy();
  });
});
