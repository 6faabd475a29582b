import { useEffect } from 'react';
import type { ReactNode } from 'react';
import { ORDER_DATE_FIELDS, ORDER_STATUSES, ORDER_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import { ORDER_BOOK_PAGE_SIZES, orderBookSearchSchema } from '../../../../shared/schemas/list-search.schema';
import type { OrderBookSearch as OrderBookSearchValues } from '../../../../shared/schemas/list-search.schema';
import { Form, SelectField, TextField } from '../../../components/form/fields';
import { SearchButton } from '../../../components/form/search-button';
import { useListSearchForm } from '../../../components/form/use-list-search-form';

/** Stage choices of the filter: the desk's to-do first, then each stage alone. */
const STAGE_OPTIONS = [
  { value: '', label: 'Every stage' },
  { value: 'sent,agreed', label: 'Waiting for the desk' },
  { value: 'confirmed,on_the_road', label: 'Confirmed, not yet delivered' },
  ...ORDER_STATUSES.map((s) => ({ value: s, label: ORDER_STATUS_LABELS[s] })),
];
const DATE_FIELD_OPTIONS = ORDER_DATE_FIELDS.map((f) => ({ value: f, label: f === 'requested_date' ? 'Day wanted' : 'Day placed' }));
const PAGE_SIZE_OPTIONS = ORDER_BOOK_PAGE_SIZES.map((s) => ({ value: s, label: s }));

/** The order book's filters as the address holds them, as the inputs show them. */
export interface OrderBookSearchAddress {
  statuses: string;
  branch_id: string;
  page_size: string;
  q: string;
  date_field: string;
  date_from: string;
  date_to: string;
}

interface OrderBookSearchProps {
  address: OrderBookSearchAddress;
  branches: readonly { id: number; name: string }[];
  onSearch: (values: OrderBookSearchValues) => void;
  /** Put after the branch (the phone's sort picker). */
  sortPicker?: ReactNode;
  /** "Clear the filters", when some are on. */
  clear?: ReactNode;
}

/**
 * The order book's filters and search, one form: a choice (stage, branch, page size, which dates)
 * searches at once; the words and the dates on Enter or Search.
 */
export function OrderBookSearch({ address, branches, onSearch, sortPicker, clear }: OrderBookSearchProps) {
  const { form, searchNow } = useListSearchForm({ schema: orderBookSearchSchema, address: { ...address }, onSearch });
  // The address's branch can be chosen only once the branches (the select's options) have loaded.
  const { setValue } = form.methods;
  const branchId = address.branch_id;
  const branchCount = branches.length;
  useEffect(() => {
    if (branchCount > 0) setValue('branch_id', branchId);
  }, [setValue, branchId, branchCount]);
  const branchOptions = [{ value: '', label: 'Every branch' }, ...branches.map((b) => ({ value: String(b.id), label: b.name }))];
  return (
    <Form form={form} label="Filter the order book" role="search" className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <SelectField name="statuses" label="Stage" options={STAGE_OPTIONS} defaultValue={address.statuses} onChange={searchNow} />
        <SelectField name="branch_id" label="Branch" options={branchOptions} defaultValue={address.branch_id} onChange={searchNow} />
        {sortPicker}
        <SelectField name="page_size" label="Per page" options={PAGE_SIZE_OPTIONS} defaultValue={address.page_size} onChange={searchNow} />
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <TextField name="q" label="Search orders" type="search" maxLength={100} defaultValue={address.q} placeholder="RL-000123, PO, site or contractor" className="min-w-56 flex-1" />
        <SelectField name="date_field" label="Dates of" options={DATE_FIELD_OPTIONS} defaultValue={address.date_field} onChange={searchNow} />
        <TextField name="date_from" label="From" type="date" defaultValue={address.date_from} />
        <TextField name="date_to" label="To" type="date" defaultValue={address.date_to} />
        <SearchButton clear={clear} />
      </div>
    </Form>
  );
}
