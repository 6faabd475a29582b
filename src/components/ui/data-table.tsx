import { useId } from 'react';
import type { ReactNode } from 'react';
import { createColumnHelper, createSortedRowModel, rowSortingFeature, sortFn_alphanumeric, sortFn_datetime, sortFn_text, tableFeatures, useTable } from '@tanstack/react-table';
import type { Column, ColumnDef, RowData, SortDirection, SortingState } from '@tanstack/react-table';

/** The features every Ridgeload table has: click-to-sort headers, sorted in the browser. */
export const dataTableFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, datetime: sortFn_datetime },
});

export type DataTableFeatures = typeof dataTableFeatures;
export type DataTableColumn<TRow extends RowData> = ColumnDef<DataTableFeatures, TRow, unknown>;

/** Column helper bound to the table's features; define columns at module scope with it. */
export function dataTableColumns<TRow extends RowData>() {
  return createColumnHelper<DataTableFeatures, TRow>();
}

/** One column the rows are ordered by, as a server reports and accepts it. */
export interface ServerSort<TSortId extends string = string> {
  id: TSortId;
  desc: boolean;
}

/**
 * Sorting owned by the caller (usually the server, over every matching row rather than one page):
 * the table shows the rows in the order given and only reports which header was pressed.
 */
export interface ServerSorting<TSortId extends string = string> {
  /** The order the rows arrived in; null when it matches no column. */
  sorting: ServerSort<TSortId> | null;
  /** Column ids the server can sort by; every other header stays plain text. */
  sortable: readonly TSortId[];
  /** Called with the order asked for: the pressed column, flipped if it was already the sort. */
  onSortingChange: (next: ServerSort<TSortId>) => void;
}

interface DataTableProps<TRow extends RowData, TSortId extends string = string> {
  /** Narrower screens scroll sideways below this width instead of squeezing words apart. */
  minWidthClass?: string;
  /** Visible caption naming the table (screen readers announce it on entry). */
  caption: string;
  captionHidden?: boolean;
  columns: readonly DataTableColumn<TRow>[];
  data: readonly TRow[];
  getRowId: (row: TRow) => string;
  /** Client-side mode only: the order the rows start in. */
  initialSorting?: SortingState;
  /** Server-driven mode: the table never reorders rows itself (see ServerSorting). */
  serverSorting?: ServerSorting<TSortId>;
  empty?: ReactNode;
  /** Extra classes for a column's header and cells (e.g. sticky columns, tighter padding), by column id. */
  columnClassName?: (columnId: string) => string | undefined;
  /** Padding of every cell; the default suits reading, a grid of inputs wants less. */
  cellPaddingClass?: string;
}

function SortIcon({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <svg viewBox="0 0 12 16" className="h-4 w-3 shrink-0" aria-hidden="true" focusable="false">
      <path d="M6 1 10 6H2Z" fill="currentColor" opacity={direction === 'asc' ? 1 : 0.3} />
      <path d="M6 15 2 10h8Z" fill="currentColor" opacity={direction === 'desc' ? 1 : 0.3} />
    </svg>
  );
}

const ariaSort = { asc: 'ascending', desc: 'descending' } as const;

/**
 * The one table of the app. Sorting headers are real buttons (Tab to reach, Enter or Space to
 * sort) and each sortable column reports its order through aria-sort. Without `serverSorting` the
 * rows are sorted in the browser; with it they are shown as given and a header press asks the
 * caller for another order.
 */
export function DataTable<TRow extends RowData, TSortId extends string = string>({
  caption,
  captionHidden = false,
  columns,
  data,
  getRowId,
  initialSorting = [],
  serverSorting,
  empty,
  minWidthClass = 'min-w-[36rem]',
  columnClassName,
  cellPaddingClass = 'px-4',
}: DataTableProps<TRow, TSortId>) {
  const captionId = useId();
  const table = useTable({
    features: dataTableFeatures,
    columns: columns as DataTableColumn<TRow>[],
    data: data as TRow[],
    getRowId: (row: TRow) => getRowId(row),
    initialState: { sorting: initialSorting },
    // The server has already ordered (and paged) the rows; sorting one page here would mislead.
    ...(serverSorting ? { manualSorting: true, enableMultiSort: false, state: { sorting: serverSorting.sorting ? [serverSorting.sorting] : [] } } : {}),
  });

  // Server mode reads the caller's sort straight from the props, so a header never shows an older copy.
  const headerSort = (column: Column<DataTableFeatures, TRow, unknown>): { canSort: boolean; sorted: false | SortDirection; onClick?: (event: unknown) => void } => {
    if (!serverSorting) {
      return { canSort: column.getCanSort(), sorted: column.getIsSorted(), onClick: column.getToggleSortingHandler() };
    }
    const id = column.id as TSortId;
    if (!serverSorting.sortable.includes(id)) return { canSort: false, sorted: false };
    const current = serverSorting.sorting;
    const sorted = current?.id === id ? (current.desc ? 'desc' : 'asc') : false;
    // A second press flips the order; a first press starts where the column says (numbers largest first).
    const firstDesc = column.columnDef.sortDescFirst ?? column.getAutoSortDir() === 'desc';
    const desc = sorted ? sorted === 'asc' : firstDesc;
    return { canSort: true, sorted, onClick: () => serverSorting.onSortingChange({ id, desc }) };
  };

  const rows = table.getRowModel().rows;

  return (
    <div
      className="overflow-x-auto rounded-md border border-mortar-300 bg-white"
      role="region"
      aria-labelledby={captionId}
      // A scrolling region must be reachable by keyboard when it overflows on a phone.
      tabIndex={0}
    >
      <table className={`w-full border-collapse text-left text-sm sm:text-base ${minWidthClass}`}>
        <caption id={captionId} className={captionHidden ? 'sr-only' : 'px-4 pt-3 text-left font-semibold text-ink-800'}>
          {caption}
        </caption>
        <thead className="bg-mortar-100 text-ink-700">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const { canSort, sorted, onClick } = headerSort(header.column);
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={canSort ? (sorted ? ariaSort[sorted] : 'none') : undefined}
                    className={`border-b border-mortar-300 ${cellPaddingClass} py-2 font-semibold whitespace-nowrap ${columnClassName?.(header.column.id) ?? ''}`}
                  >
                    {header.isPlaceholder ? null : canSort ? (
                      <button type="button" onClick={onClick} className="-mx-2 inline-flex min-h-tap items-center gap-1.5 rounded px-2 hover:bg-mortar-200">
                        <table.FlexRender header={header} />
                        <SortIcon direction={sorted} />
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={columns.length} className="px-4 py-6">
                {empty ?? <p className="text-center text-ink-600">Nothing to show yet.</p>}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} className="border-b border-mortar-200 last:border-b-0 hover:bg-mortar-50">
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className={`${cellPaddingClass} py-2 align-middle ${columnClassName?.(cell.column.id) ?? ''}`}>
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
