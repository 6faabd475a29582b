import { lazy, Suspense, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ErrorAlert } from '../../../components/ui/alert';
import { BranchSelect } from '../../../components/ui/branch-select';
import { buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useCatalogueBranches } from '../api/get-catalogue-branches';
import { sheetExportUrl } from '../api/keys';
import { StockTable } from './stock-table';

// The stock section shows first; the other sections and the sheet imports (forms, with the form library)
// load when they are shown (DEVELOPERS.md, decision 37).
const ProductsPanel = lazy(() => import('./products-panel').then((m) => ({ default: m.ProductsPanel })));
const RoofSystemsPanel = lazy(() => import('./roof-systems-panel').then((m) => ({ default: m.RoofSystemsPanel })));
const SheetImport = lazy(() => import('./sheet-import').then((m) => ({ default: m.SheetImport })));

const SECTIONS = [
  { id: 'stock', label: 'Stock and prices' },
  { id: 'products', label: 'Products' },
  { id: 'roof-systems', label: 'Roof systems' },
] as const;
type Section = (typeof SECTIONS)[number]['id'];

function sectionOf(value: string | null): Section {
  return SECTIONS.find((s) => s.id === value)?.id ?? 'stock';
}

/** The section is in the address (?section=products) so it survives a reload and can be shared. */
function SectionNav({ current }: { current: Section }) {
  return (
    <nav aria-label="Catalogue sections" className="flex flex-wrap gap-2 border-b border-mortar-300 pb-3">
      {SECTIONS.map((s) => (
        <Link key={s.id} to={{ search: s.id === 'stock' ? '' : `?section=${s.id}` }} aria-current={s.id === current ? 'page' : undefined} className={buttonClasses(s.id === current ? 'primary' : 'ghost')}>
          {s.label}
        </Link>
      ))}
    </nav>
  );
}

/**
 * Prices and stock per branch with the sheets to export and import them, the merchant's products,
 * and each branch's roof systems. `canImportPrices` is the catalogue:manage permission (products,
 * roof systems, price lists); `canImportStock` is stock:manage (counts and reorder levels).
 */
export function CatalogueBoard({ canImportPrices, canImportStock }: { canImportPrices: boolean; canImportStock: boolean }) {
  const branches = useCatalogueBranches();
  const [search] = useSearchParams();
  const section = sectionOf(search.get('section'));
  const [chosen, setChosen] = useState<number | null>(null);
  if (branches.isPending) return <SkeletonBlock label="Loading the branches" lines={3} />;
  if (branches.isError) return <ErrorAlert error={branches.error} title="The branches could not be loaded" onRetry={() => void branches.refetch()} />;
  const branchId = chosen ?? branches.data[0]?.id ?? null;
  if (branchId === null) return <p>No branches yet.</p>;
  return (
    <div className="space-y-6">
      <SectionNav current={section} />
      {section === 'products' ? (
        <Suspense fallback={<SkeletonBlock label="Loading the products" lines={6} />}>
          <ProductsPanel canManage={canImportPrices} />
        </Suspense>
      ) : (
        <>
          <BranchSelect branches={branches.data} value={branchId} onChange={setChosen} />
          {section === 'roof-systems' ? (
            <Suspense fallback={<SkeletonBlock label="Loading the roof systems" lines={4} />}>
              <RoofSystemsPanel key={branchId} branchId={branchId} canManage={canImportPrices} />
            </Suspense>
          ) : (
            <>
              <Card title="Products, prices and stock">
                <StockTable key={branchId} branchId={branchId} canEdit={canImportStock} canEditPrice={canImportPrices} />
              </Card>
              <Card title="Sheets">
                <div className="flex flex-wrap gap-2">
                  <a href={sheetExportUrl(branchId, 'price-list', 'csv')} download className={buttonClasses('secondary')}>
                    Price list .csv
                  </a>
                  <a href={sheetExportUrl(branchId, 'price-list', 'xlsx')} download className={buttonClasses('secondary')}>
                    Price list .xlsx
                  </a>
                  <a href={sheetExportUrl(branchId, 'stock-counts', 'csv')} download className={buttonClasses('secondary')}>
                    Stock counts .csv
                  </a>
                  <a href={sheetExportUrl(branchId, 'stock-counts', 'xlsx')} download className={buttonClasses('secondary')}>
                    Stock counts .xlsx
                  </a>
                </div>
                <Suspense fallback={<SkeletonBlock label="Loading the sheet imports" lines={2} className="mt-6" />}>
                  <div className="mt-6 grid gap-6 lg:grid-cols-2">
                    {canImportPrices ? <SheetImport key={`p${branchId}`} branchId={branchId} kind="price-list" /> : null}
                    {canImportStock ? <SheetImport key={`s${branchId}`} branchId={branchId} kind="stock-counts" /> : null}
                  </div>
                </Suspense>
              </Card>
            </>
          )}
        </>
      )}
    </div>
  );
}
