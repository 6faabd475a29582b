import { useId, useState } from 'react';
import type { FormEvent } from 'react';
import { MAX_SHEET_BYTES } from '../../../../shared/schemas/price-list.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { isApiError } from '../../../lib/api-client';
import { useImportSheet } from '../api/import-sheet';
import type { SheetKind } from '../api/keys';

const LABELS: Record<SheetKind, { title: string; columns: string }> = {
  'price-list': { title: 'Import a price list', columns: 'Columns read: sku, price (one pack, e.g. 12.80), tax_rate (percent, optional).' },
  'stock-counts': { title: 'Import stock counts', columns: 'Columns read: sku, on_hand (whole packs), reorder_level (optional).' },
};

/** One upload form for a branch's price list or stock counts; a refused file shows each problem by row and column. */
export function SheetImport({ branchId, kind }: { branchId: number; kind: SheetKind }) {
  const upload = useImportSheet(branchId, kind);
  const inputId = useId();
  const [tooBig, setTooBig] = useState(false);
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const file = (event.currentTarget.elements.namedItem('file') as HTMLInputElement).files?.[0];
    if (!file) return;
    if (file.size > MAX_SHEET_BYTES) {
      setTooBig(true);
      return;
    }
    setTooBig(false);
    upload.mutate(file);
  };
  const rejected = isApiError(upload.error) && upload.error.code === 'invalid_sheet' ? upload.error : null;
  return (
    <form onSubmit={onSubmit} aria-label={LABELS[kind].title} className="space-y-3" noValidate>
      <div>
        <label htmlFor={inputId} className="mb-1.5 block font-medium">
          {LABELS[kind].title} (CSV or .xlsx)
        </label>
        <p className="mb-1.5 text-sm text-ink-600">{LABELS[kind].columns} The whole file is applied, or none of it.</p>
        <input id={inputId} name="file" type="file" accept=".csv,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" className="block min-h-tap" />
      </div>
      <Button type="submit" variant="secondary" busy={upload.isPending}>
        Upload
      </Button>
      {tooBig ? <Alert tone="danger" title="The file is too large">A sheet may be at most 5 MiB.</Alert> : null}
      {upload.isSuccess ? (
        <Alert tone="success" title="Imported">
          {upload.data.rows} rows: {upload.data.updated} changed, {upload.data.added} added, {upload.data.unchanged} unchanged.
          {upload.data.warnings.map((w) => (
            <span key={w.message} className="block text-sm">
              {w.message}
            </span>
          ))}
        </Alert>
      ) : null}
      {rejected ? (
        <Alert tone="danger" title="Nothing was imported: fix these cells and upload again">
          <p>{rejected.message}</p>
          <table className="mt-2 w-full border-collapse text-left text-sm" aria-label="Problems in the file">
            <thead>
              <tr>
                <th scope="col" className="py-1 pr-4">Row</th>
                <th scope="col" className="py-1 pr-4">Column</th>
                <th scope="col" className="py-1">Problem</th>
              </tr>
            </thead>
            <tbody>
              {rejected.details.map((d, i) => (
                <tr key={`${d.row ?? ''}-${d.column ?? ''}-${i}`} className="border-t border-brick-200">
                  <td className="py-1 pr-4 tabular-nums">{d.row ?? '—'}</td>
                  <td className="py-1 pr-4 font-mono">{d.column ?? '—'}</td>
                  <td className="py-1">{d.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </Alert>
      ) : upload.isError ? (
        <Alert tone="danger" title="The file could not be imported">{errorMessage(upload.error)}</Alert>
      ) : null}
    </form>
  );
}
