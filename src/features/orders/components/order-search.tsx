import type { ReactNode } from 'react';
import { ORDER_STATUSES, ORDER_STATUS_LABELS } from '../../../../shared/schemas/order.schema';
import { orderSearchSchema } from '../../../../shared/schemas/list-search.schema';
import type { OrderSearch as OrderSearchValues } from '../../../../shared/schemas/list-search.schema';
import { Form, SelectField, TextField } from '../../../components/form/fields';
import { SearchButton } from '../../../components/form/search-button';
import { useListSearchForm } from '../../../components/form/use-list-search-form';

const STAGE_OPTIONS = [{ value: '', label: 'Every stage' }, ...ORDER_STATUSES.map((s) => ({ value: s, label: ORDER_STATUS_LABELS[s] }))];

interface OrderSearchProps {
  status: string | undefined;
  q: string | undefined;
  onSearch: (values: OrderSearchValues) => void;
  /** Put after the stage (the phone's sort picker). */
  children?: ReactNode;
}

/** The firm's orders' search bar: the stage searches at once, the words on Enter or Search. */
export function OrderSearch({ status, q, onSearch, children }: OrderSearchProps) {
  const { form, searchNow } = useListSearchForm({ schema: orderSearchSchema, address: { status: status ?? '', q: q ?? '' }, onSearch });
  return (
    <Form form={form} label="Find orders" role="search" className="flex flex-wrap items-end gap-4">
      <SelectField name="status" label="Stage" options={STAGE_OPTIONS} defaultValue={status ?? ''} onChange={searchNow} />
      {children}
      <TextField name="q" label="Search orders" type="search" maxLength={100} defaultValue={q ?? ''} placeholder="RL-000123, PO, site or merchant" className="min-w-56 flex-1" />
      <SearchButton />
    </Form>
  );
}
