import { CATEGORY_LABELS } from '../../../../shared/schemas/catalogue.schema';
import type { ProductCategory } from '../../../../shared/schemas/catalogue.schema';
import { dataTableColumns } from '../../../components/ui/data-table';

interface NamedProduct {
  sku: string;
  name: string;
  category: ProductCategory;
  pack_size: number;
  unit: string;
}

/**
 * The columns that say which product a row is, alike on the catalogue and on a branch's stock: SKU,
 * name, kind and pack. `nameClassName` sets the name column's width (a literal class, so the style
 * build sees it).
 */
export function productColumns<TRow extends NamedProduct>(nameClassName: string) {
  const h = dataTableColumns<TRow>();
  return [
    h.accessor((p) => p.sku, { id: 'sku', header: 'SKU', sortFn: 'text', cell: (info) => <span className="font-mono text-sm whitespace-nowrap">{info.getValue()}</span> }),
    h.accessor((p) => p.name, { id: 'name', header: 'Product', sortFn: 'text', cell: (info) => <span className={`block ${nameClassName} text-sm`}>{info.getValue()}</span> }),
    h.accessor((p) => p.category, { id: 'category', header: 'Kind', sortFn: 'text', cell: (info) => CATEGORY_LABELS[info.getValue()] }),
    h.accessor((p) => p.pack_size, {
      id: 'pack_size',
      header: 'Pack',
      sortFn: 'alphanumeric',
      cell: (info) => (
        <span className="whitespace-nowrap tabular-nums">
          {info.getValue()} {info.row.original.unit}
        </span>
      ),
    }),
  ];
}
