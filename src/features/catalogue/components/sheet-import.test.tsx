import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { MAX_SHEET_BYTES } from '../../../../shared/schemas/price-list.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { SheetImport } from './sheet-import';

describe('SheetImport', () => {
  it('asks for a file, and refuses one over 5 MiB at the file input, sending nothing', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<SheetImport branchId={3} kind="stock-counts" />);
    const input = screen.getByLabelText('Import stock counts (CSV or .xlsx)');
    fireEvent.click(screen.getByRole('button', { name: 'Upload' }));
    expect(await screen.findByText('Choose a CSV or .xlsx file first')).toBeTruthy();
    const big = new File([new Uint8Array(MAX_SHEET_BYTES + 1)], 'counts.csv', { type: 'text/csv' });
    fireEvent.change(input, { target: { files: [big] } });
    fireEvent.click(screen.getByRole('button', { name: 'Upload' }));
    expect(await screen.findByText('The file is too large: a sheet may be at most 5 MiB.')).toBeTruthy();
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('uploads the file as multipart and shows each refused cell by row and column, saying nothing was applied', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/branches/3/price-list': {
        status: 422,
        body: {
          error: {
            code: 'invalid_sheet',
            message: 'The price list has 2 problems; nothing was changed',
            details: [
              { row: 4, column: 'price', message: 'is not a number (write it like 12.80)' },
              { row: 7, column: 'sku', message: 'TRS-XX-1 is not one of your products' },
            ],
          },
        },
      },
    });
    renderWithProviders(<SheetImport branchId={3} kind="price-list" />);
    const file = new File(['sku,price\r\nTRS-FL420-SG,twelve\r\n'], 'prices.csv', { type: 'text/csv' });
    fireEvent.change(screen.getByLabelText('Import a price list (CSV or .xlsx)'), { target: { files: [file] } });
    fireEvent.click(screen.getByRole('button', { name: 'Upload' }));
    const table = await screen.findByRole('table', { name: 'Problems in the file' });
    const rows = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((r) =>
        within(r)
          .getAllByRole('cell')
          .map((c) => c.textContent),
      );
    expect(rows).toEqual([
      ['4', 'price', 'is not a number (write it like 12.80)'],
      ['7', 'sku', 'TRS-XX-1 is not one of your products'],
    ]);
    expect(screen.getByText('Nothing was imported: fix these cells and upload again')).toBeTruthy();
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/price-list'));
      expect(call?.[1]?.body).toBeInstanceOf(FormData);
      expect((call?.[1]?.body as FormData).get('file')).toBeInstanceOf(File);
    });
  });
});
