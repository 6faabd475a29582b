import * as z from 'zod/mini';
import { moneyEntryExample } from '../../../../shared/domain/money-entry';
import { MAX_SHEET_BYTES } from '../../../../shared/schemas/price-list.schema';
import { FieldMessage, Form, describedBy, fieldIds } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { isApiError } from '../../../lib/api-client';
import { currentCurrency, moneySign } from '../../../lib/format';
import { useImportSheet } from '../api/import-sheet';
import type { SheetKind } from '../api/keys';

const LABELS: Record<SheetKind, { title: string; columns: () => string }> = {
  'price-list': { title: 'Import a price list', columns: () => `Columns read: sku, price (one pack in ${moneySign()}, e.g. ${moneyEntryExample(currentCurrency())}), tax_rate (percent, optional).` },
  'stock-counts': { title: 'Import stock counts', columns: () => 'Columns read: sku, on_hand (whole packs), reorder_level (optional).' },
};

/** One upload form for a branch's price list or stock counts; a refused file shows each problem by row and column. */
/** The chosen file, at most MAX_SHEET_BYTES; the server reads and checks its cells. */
const sheetFormSchema = z.object({
  file: z
    .pipe(
      z.array(z.instanceof(Blob), { error: 'Choose a CSV or .xlsx file first' }).check(z.minLength(1, { error: 'Choose a CSV or .xlsx file first' })),
      z.transform((files) => files[0]!),
    )
    .check(z.refine((file) => file.size <= MAX_SHEET_BYTES, { error: 'The file is too large: a sheet may be at most 5 MiB.' })),
});

/** One upload form for a branch's price list or stock counts; a refused file shows each problem by row and column. */
export function SheetImport({ branchId, kind }: { branchId: number; kind: SheetKind }) {
  const upload = useImportSheet(branchId, kind);
  const form = useSchemaForm({ schema: sheetFormSchema, onSubmit: ({ file }) => upload.mutate(file as File) });
  const ids = fieldIds(form, 'file');
  const error = form.fieldError('file');
  const rejected = isApiError(upload.error) && upload.error.code === 'invalid_sheet' ? upload.error : null;
  return (
    <Form form={form} label={LABELS[kind].title} className="space-y-3">
      <div>
        <label htmlFor={ids.input} className="mb-1.5 block font-medium">
          {LABELS[kind].title} (CSV or .xlsx)
        </label>
        <p id={ids.hint} className="mb-1.5 text-sm text-ink-600">
          {LABELS[kind].columns()} The whole file is applied, or none of it.
        </p>
        <input
          id={ids.input}
          type="file"
          accept=".csv,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(ids, true, error)}
          className="block min-h-tap"
          {...form.register('file')}
        />
        {error ? <FieldMessage id={ids.error}>{error}</FieldMessage> : null}
      </div>
      <Button type="submit" variant="secondary" busy={upload.isPending}>
        Upload
      </Button>
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
                <th scope="col" className="py-1 pr-4">
                  Row
                </th>
                <th scope="col" className="py-1 pr-4">
                  Column
                </th>
                <th scope="col" className="py-1">
                  Problem
                </th>
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
        <Alert tone="danger" title="The file could not be imported">
          {errorMessage(upload.error)}
        </Alert>
      ) : null}
    </Form>
  );
}
