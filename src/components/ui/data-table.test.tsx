import { fireEvent, render, screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { DataTable, dataTableColumns } from './data-table';
import type { ServerSort } from './data-table';

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
    render(<DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} initialSorting={[{ id: 'tiles', desc: false }]} />);
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

  describe('with the sorting owned by the server', () => {
    type PalletSort = 'ref' | 'tiles';
    const renderServer = (sorting: ServerSort<PalletSort> | null, onSortingChange = vi.fn(), sortable: readonly PalletSort[] = ['ref', 'tiles']) =>
      render(<DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} serverSorting={{ sorting, sortable, onSortingChange }} />);

    it('shows the rows in the order given, even when that is not the order it reports', () => {
      renderServer({ id: 'ref', desc: false });
      expect(firstColumn()).toEqual(['B-2', 'A-9', 'C-1']);
      expect(screen.getByRole('columnheader', { name: /Reference/ }).getAttribute('aria-sort')).toBe('ascending');
    });

    it('asks for the other direction when the sorted header is pressed, and leaves the rows alone', () => {
      const onSortingChange = vi.fn();
      renderServer({ id: 'ref', desc: false }, onSortingChange);
      fireEvent.click(within(screen.getByRole('columnheader', { name: /Reference/ })).getByRole('button'));
      expect(onSortingChange).toHaveBeenCalledTimes(1);
      expect(onSortingChange).toHaveBeenCalledWith({ id: 'ref', desc: true });
      expect(firstColumn()).toEqual(['B-2', 'A-9', 'C-1']);
      // The table keeps no order of its own: until the caller answers, the header still says ascending.
      expect(screen.getByRole('columnheader', { name: /Reference/ }).getAttribute('aria-sort')).toBe('ascending');
    });

    it('flips a descending sort back to ascending rather than dropping it', () => {
      const onSortingChange = vi.fn();
      renderServer({ id: 'ref', desc: true }, onSortingChange);
      fireEvent.click(within(screen.getByRole('columnheader', { name: /Reference/ })).getByRole('button'));
      expect(onSortingChange).toHaveBeenCalledWith({ id: 'ref', desc: false });
    });

    it('starts a newly pressed column at its first direction: text A to Z, numbers largest first, or as the column says', () => {
      const onSortingChange = vi.fn();
      const { unmount } = renderServer({ id: 'tiles', desc: false }, onSortingChange);
      fireEvent.click(within(screen.getByRole('columnheader', { name: /Reference/ })).getByRole('button'));
      expect(onSortingChange).toHaveBeenLastCalledWith({ id: 'ref', desc: false });
      unmount();

      const { unmount: unmountAgain } = renderServer({ id: 'ref', desc: false }, onSortingChange);
      fireEvent.click(within(screen.getByRole('columnheader', { name: /Tiles/ })).getByRole('button'));
      expect(onSortingChange).toHaveBeenLastCalledWith({ id: 'tiles', desc: true });
      unmountAgain();

      const newestFirst = helper.columns([helper.accessor('ref', { header: 'Reference', sortDescFirst: true }), helper.accessor('tiles', { header: 'Tiles' })]);
      render(<DataTable caption="Pallets" columns={newestFirst} data={data} getRowId={(row) => String(row.id)} serverSorting={{ sorting: { id: 'tiles', desc: true }, sortable: ['ref', 'tiles'], onSortingChange }} />);
      fireEvent.click(within(screen.getByRole('columnheader', { name: /Reference/ })).getByRole('button'));
      expect(onSortingChange).toHaveBeenLastCalledWith({ id: 'ref', desc: true });
    });

    it('reports the order given through aria-sort, and follows it when the caller changes it', () => {
      const { rerender } = renderServer({ id: 'tiles', desc: true });
      const reference = () => screen.getByRole('columnheader', { name: /Reference/ }).getAttribute('aria-sort');
      const tiles = () => screen.getByRole('columnheader', { name: /Tiles/ }).getAttribute('aria-sort');
      expect([reference(), tiles()]).toEqual(['none', 'descending']);

      rerender(
        <DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} serverSorting={{ sorting: { id: 'ref', desc: false }, sortable: ['ref', 'tiles'], onSortingChange: vi.fn() }} />,
      );
      expect([reference(), tiles()]).toEqual(['ascending', 'none']);

      rerender(<DataTable caption="Pallets" columns={columns} data={data} getRowId={(row) => String(row.id)} serverSorting={{ sorting: null, sortable: ['ref', 'tiles'], onSortingChange: vi.fn() }} />);
      expect([reference(), tiles()]).toEqual(['none', 'none']);
    });

    it('offers a header button only on the columns the server can sort by', () => {
      const onSortingChange = vi.fn();
      renderServer({ id: 'ref', desc: false }, onSortingChange, ['ref']);
      expect(screen.getAllByRole('button').map((button) => button.textContent)).toEqual(['Reference']);
      const tiles = screen.getByRole('columnheader', { name: 'Tiles' });
      expect(tiles.getAttribute('aria-sort')).toBeNull();
      fireEvent.click(tiles);
      expect(onSortingChange).not.toHaveBeenCalled();
      expect(firstColumn()).toEqual(['B-2', 'A-9', 'C-1']);
    });
  });
});
