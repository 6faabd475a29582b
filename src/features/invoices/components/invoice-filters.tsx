import { useEffect } from 'react';
import { INVOICE_STATUSES, INVOICE_STATUS_LABELS } from '../../../../shared/schemas/invoice.schema';
import type { InvoiceStatus } from '../../../../shared/schemas/invoice.schema';
import { invoiceFilterSchema } from '../../../../shared/schemas/list-search.schema';
import { Form, SelectField } from '../../../components/form/fields';
import { useLiveFilterForm } from '../../../components/form/use-list-search-form';

const STATE_OPTIONS = [{ value: '', label: 'Every invoice' }, ...INVOICE_STATUSES.map((s) => ({ value: s, label: INVOICE_STATUS_LABELS[s] }))];

/**
 * The invoices' filter bar, loaded (with the form library) after the list: the state chosen is read
 * through its schema and handed to the list, which starts from every invoice.
 */
export function InvoiceFilters({ onStatus, onPick }: { onStatus: (status: InvoiceStatus | undefined) => void; onPick: () => void }) {
  const { form, filters } = useLiveFilterForm(invoiceFilterSchema, { status: undefined });
  const { status } = filters;
  useEffect(() => onStatus(status), [status, onStatus]);
  return (
    <Form form={form} label="Filter the invoices" role="search" className="flex flex-wrap items-end gap-3">
      <SelectField name="status" label="State" options={STATE_OPTIONS} defaultValue="" onChange={onPick} />
    </Form>
  );
}
