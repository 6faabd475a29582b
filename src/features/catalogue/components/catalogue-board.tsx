import { useState } from 'react';
import { ErrorAlert } from '../../../components/ui/alert';
import { BranchSelect } from '../../../components/ui/branch-select';
import { buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useCatalogueBranches } from '../api/get-catalogue-branches';
import { sheetExportUrl } from '../api/keys';
import { SheetImport } from './sheet-import';
import { StockTable } from './stock-table';

/** Prices and stock per branch, with the sheets to export and import them. */
export function CatalogueBoard({ canImportPrices, canImportStock }: { canImportPrices: boolean; canImportStock: boolean }) {
  const branches = useCatalogueBranches();
  const [chosen, setChosen] = useState<number | null>(null);
  if (branches.isPending) return <SkeletonBlock label="Loading the branches" lines={3} />;
  if (branches.isError) return <ErrorAlert error={branches.error} title="The branches could not be loaded" onRetry={() => void branches.refetch()} />;
  const branchId = chosen ?? branches.data[0]?.id ?? null;
  if (branchId === null) return <p>No branches yet.</p>;
  return (
    <div className="space-y-6">
      <BranchSelect branches={branches.data} value={branchId} onChange={setChosen} />
      <Card title="Products, prices and stock">
        <StockTable key={branchId} branchId={branchId} />
      </Card>
      <Card title="Sheets">
        <div className="flex flex-wrap gap-2">
          <a href={sheetExportUrl(branchId, 'price-list', 'csv')} download className={buttonClasses('secondary')}>Price list .csv</a>
          <a href={sheetExportUrl(branchId, 'price-list', 'xlsx')} download className={buttonClasses('secondary')}>Price list .xlsx</a>
          <a href={sheetExportUrl(branchId, 'stock-counts', 'csv')} download className={buttonClasses('secondary')}>Stock counts .csv</a>
          <a href={sheetExportUrl(branchId, 'stock-counts', 'xlsx')} download className={buttonClasses('secondary')}>Stock counts .xlsx</a>
        </div>
        <div className="mt-6 grid gap-6 lg:grid-cols-2">
          {canImportPrices ? <SheetImport key={`p${branchId}`} branchId={branchId} kind="price-list" /> : null}
          {canImportStock ? <SheetImport key={`s${branchId}`} branchId={branchId} kind="stock-counts" /> : null}
        </div>
      </Card>
    </div>
  );
}
