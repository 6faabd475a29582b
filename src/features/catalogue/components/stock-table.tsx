import { lazy, Suspense, useMemo, useState } from 'react';
import { SearchBarLoading } from '../../../components/form/search-bar-loading';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatMoney } from '../../../lib/format';
import { useStock } from '../api/get-stock';
import { productColumns } from './product-columns';

// The filter and the two edit forms (with the form library) load after the table (DEVELOPERS.md, decision 37).
const StockFilter = lazy(() => import('./stock-filter').then((m) => ({ default: m.StockFilter })));
const StockEditForm = lazy(() => import('./stock-edit-form').then((m) => ({ default: m.StockEditForm })));
const PriceEditForm = lazy(() => import('./price-edit-form').then((m) => ({ default: m.PriceEditForm })));

const STATE_WORDS: Record<StockItem['state'], string> = { in_stock: 'In stock', low: 'At or below reorder level', out_of_stock: 'None free' };

const h = dataTableColumns<StockItem>();
const figureColumns = [
  ...productColumns<StockItem>('min-w-56'),
  h.accessor('pack_price', { header: 'Pack price', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue())}</span> }),
  h.accessor('on_hand', { header: 'On hand', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue().toLocaleString('en-GB')}</span> }),
  h.accessor('reserved', { header: 'Reserved', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue().toLocaleString('en-GB')}</span> }),
  h.accessor('available', { header: 'Available', sortFn: 'alphanumeric', cell: (info) => <span className="font-semibold tabular-nums">{info.getValue().toLocaleString('en-GB')}</span> }),
  h.accessor('reorder_level', { header: 'Reorder at', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue().toLocaleString('en-GB')}</span> }),
  h.accessor('state', {
    header: 'State',
    sortFn: 'text',
    cell: (info) => (
      <span
        className={`rounded px-2 py-0.5 text-sm whitespace-nowrap ${info.getValue() === 'in_stock' ? '' : info.getValue() === 'low' ? 'bg-ochre-100 font-semibold text-ochre-800' : 'bg-brick-50 font-semibold text-brick-800'}`}
      >
        {STATE_WORDS[info.getValue()]}
      </span>
    ),
  }),
];

type EditKind = 'stock' | 'price';
interface Editing {
  productId: number;
  kind: EditKind;
}

/** The change buttons come first so they are in reach on a phone without scrolling the wide table sideways. */
function stockColumns(kinds: readonly EditKind[], onEdit: (item: StockItem, kind: EditKind) => void) {
  if (kinds.length === 0) return h.columns(figureColumns);
  return h.columns([
    h.display({
      id: 'edit',
      header: () => <span className="sr-only">Change</span>,
      cell: (info) => (
        <div className="flex gap-2">
          {kinds.includes('stock') ? (
            <Button variant="secondary" onClick={() => onEdit(info.row.original, 'stock')} aria-label={`Edit stock of ${info.row.original.sku}`}>
              Edit
            </Button>
          ) : null}
          {kinds.includes('price') ? (
            <Button variant="ghost" onClick={() => onEdit(info.row.original, 'price')} aria-label={`Change the price of ${info.row.original.sku}`}>
              Price
            </Button>
          ) : null}
        </div>
      ),
    }),
    ...figureColumns,
  ]);
}

/**
 * A branch's products with price and stock; those at or below their reorder level stand out.
 * `canEdit` (stock:manage) offers the count and reorder level, `canEditPrice` (catalogue:manage) the pack price.
 */
export function StockTable({ branchId, canEdit = false, canEditPrice = false }: { branchId: number; canEdit?: boolean; canEditPrice?: boolean }) {
  const stock = useStock(branchId);
  const [lowOnly, setLowOnly] = useState(false);
  const [editing, setEditing] = useState<Editing | null>(null);
  const columns = useMemo(() => {
    const kinds: EditKind[] = [...(canEdit ? (['stock'] as const) : []), ...(canEditPrice ? (['price'] as const) : [])];
    return stockColumns(kinds, (item, kind) => setEditing({ productId: item.product_id, kind }));
  }, [canEdit, canEditPrice]);
  if (stock.isPending) return <SkeletonBlock label="Loading the stock" lines={6} />;
  if (stock.isError) return <ErrorAlert error={stock.error} title="The stock could not be loaded" onRetry={() => void stock.refetch()} />;
  const items = lowOnly ? stock.data.items.filter((i) => i.state !== 'in_stock') : stock.data.items;
  const low = stock.data.items.filter((i) => i.state !== 'in_stock').length;
  const item = editing ? stock.data.items.find((i) => i.product_id === editing.productId) : undefined;
  const close = () => setEditing(null);
  return (
    <div className="space-y-3">
      {item && editing ? (
        <Suspense fallback={<SkeletonBlock label="Opening the form" lines={2} />}>
          {editing.kind === 'stock' ? (
            <StockEditForm key={`s${item.product_id}`} branchId={branchId} item={item} onDone={close} />
          ) : (
            <PriceEditForm key={`p${item.product_id}`} branchId={branchId} item={item} onDone={close} />
          )}
        </Suspense>
      ) : null}
      <Suspense fallback={<SearchBarLoading label="Loading the filter…" />}>
        <StockFilter low={low} onLowOnly={setLowOnly} />
      </Suspense>
      <DataTable
        caption={`Stock at ${stock.data.branch.name}`}
        captionHidden
        columns={columns}
        data={items}
        getRowId={(i) => String(i.product_id)}
        minWidthClass="min-w-[72rem]"
        initialSorting={[{ id: 'sku', desc: false }]}
      />
    </div>
  );
}
