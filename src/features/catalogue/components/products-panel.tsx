import { useEffect, useMemo, useRef, useState } from 'react';
import { CATEGORY_LABELS, PRODUCT_CATEGORIES } from '../../../../shared/schemas/catalogue.schema';
import { productFilterSchema } from '../../../../shared/schemas/list-search.schema';
import type { Product } from '../../../../shared/schemas/price-list.schema';
import { Form, SelectField } from '../../../components/form/fields';
import { useLiveFilterForm } from '../../../components/form/use-list-search-form';
import { ErrorAlert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useToast } from '../../../components/ui/toast';
import { useArchiveProduct } from '../api/archive-product';
import { useProducts } from '../api/get-products';
import { useRestoreProduct } from '../api/restore-product';
import type { ProductFilters } from '../api/keys';
import { productColumns } from './product-columns';
import { ProductForm } from './product-form';

type Shown = NonNullable<ProductFilters['archived']>;
const SHOWN_WORDS: Record<Shown, string> = { false: 'In the catalogue', true: 'Archived', all: 'All' };

const h = dataTableColumns<Product>();
const figureColumns = [
  ...productColumns<Product>('min-w-48'),
  h.accessor('pack_weight_kg', { header: 'Pack weight', sortFn: 'alphanumeric', cell: (info) => <span className="whitespace-nowrap tabular-nums">{info.getValue().toLocaleString('en-GB')} kg</span> }),
  h.accessor('tax_rate_bp', { header: 'Tax', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue() / 100} %</span> }),
  h.accessor((p) => p.branches.length, { id: 'branches', header: 'Sold at', sortFn: 'alphanumeric', cell: (info) => `${info.getValue()} ${info.getValue() === 1 ? 'branch' : 'branches'}` }),
  h.accessor((p) => (p.archived_at ? 'Archived' : 'In the catalogue'), { id: 'status', header: 'Status', sortFn: 'text' }),
];

function ProductActions({ product, onEdit }: { product: Product; onEdit: (p: Product) => void }) {
  const archive = useArchiveProduct();
  const restore = useRestoreProduct();
  const toast = useToast();
  const onArchive = () =>
    archive.mutate(product.id, {
      onSuccess: () => toast.show(`${product.sku} is archived; restore it from the archived list.`, 'success'),
      onError: (error) => toast.show(`${product.sku} could not be archived: ${errorMessage(error)}`, 'danger'),
    });
  const onRestore = () =>
    restore.mutate(product.id, {
      onSuccess: () => toast.show(`${product.sku} is back in the catalogue.`, 'success'),
      onError: (error) => toast.show(`${product.sku} could not be restored: ${errorMessage(error)}`, 'danger'),
    });
  return (
    <div className="flex gap-2">
      <Button variant="secondary" onClick={() => onEdit(product)} aria-label={`Edit ${product.sku}`}>
        Edit
      </Button>
      {product.archived_at ? (
        <Button variant="secondary" busy={restore.isPending} onClick={onRestore} aria-label={`Restore ${product.sku}`}>
          Restore
        </Button>
      ) : (
        <Button variant="ghost" busy={archive.isPending} onClick={onArchive} aria-label={`Archive ${product.sku}`}>
          Archive
        </Button>
      )}
    </div>
  );
}

const SHOWN_OPTIONS = (Object.keys(SHOWN_WORDS) as Shown[]).map((s) => ({ value: s, label: SHOWN_WORDS[s] }));
const CATEGORY_OPTIONS = [{ value: '', label: 'Every category' }, ...PRODUCT_CATEGORIES.map((c) => ({ value: c, label: CATEGORY_LABELS[c] }))];

/** The merchant's products, shared by every branch: filter, add, change, archive and restore. */
export function ProductsPanel({ canManage }: { canManage: boolean }) {
  const { form: filterForm, filters } = useLiveFilterForm(productFilterSchema, { archived: 'false', category: undefined });
  const { archived, category } = filters;
  const [editing, setEditing] = useState<Product | null>(null);
  const [adding, setAdding] = useState(false);
  const products = useProducts({ archived, ...(category ? { category } : {}) });
  const formArea = useRef<HTMLDivElement>(null);
  const openId = editing ? editing.id : adding ? 'new' : null;
  useEffect(() => {
    // The form opens above the table, often out of view of the row pressed: move focus (and the view) to it.
    if (openId !== null) formArea.current?.querySelector('input')?.focus();
  }, [openId]);
  const columns = useMemo(
    () =>
      canManage
        ? h.columns([
            h.display({
              id: 'actions',
              header: () => <span className="sr-only">Change</span>,
              cell: (info) => (
                <ProductActions
                  product={info.row.original}
                  onEdit={(p) => {
                    setAdding(false);
                    setEditing(p);
                  }}
                />
              ),
            }),
            ...figureColumns,
          ])
        : h.columns(figureColumns),
    [canManage],
  );
  return (
    <div className="space-y-6">
      <div ref={formArea} className="empty:hidden">
        {editing ? (
          <Card title={`Change ${editing.sku}`}>
            <ProductForm key={editing.id} product={editing} onDone={() => setEditing(null)} />
          </Card>
        ) : null}
        {adding && !editing ? (
          <Card title="Add a product">
            <ProductForm onDone={() => setAdding(false)} />
          </Card>
        ) : null}
      </div>
      <Card title="Products" actions={canManage && !adding && !editing ? <Button onClick={() => setAdding(true)}>Add a product</Button> : null}>
        <Form form={filterForm} label="Filter the products" role="search" className="mb-4 flex flex-wrap gap-4">
          <SelectField name="archived" label="Show" options={SHOWN_OPTIONS} defaultValue="false" />
          <SelectField name="category" label="Category" options={CATEGORY_OPTIONS} defaultValue="" />
        </Form>
        {products.isPending ? (
          <SkeletonBlock label="Loading the products" lines={6} />
        ) : products.isError ? (
          <ErrorAlert error={products.error} title="The products could not be loaded" onRetry={() => void products.refetch()} />
        ) : products.data.length === 0 ? (
          <EmptyState title={archived === 'true' ? 'Nothing is archived' : 'No products here yet'}>{canManage && archived !== 'true' ? 'Add one with “Add a product”.' : null}</EmptyState>
        ) : (
          <DataTable caption="Products" captionHidden columns={columns} data={products.data} getRowId={(p) => String(p.id)} minWidthClass="min-w-[64rem]" initialSorting={[{ id: 'sku', desc: false }]} />
        )}
      </Card>
    </div>
  );
}
