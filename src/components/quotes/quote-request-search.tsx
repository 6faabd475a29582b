import type { ReactNode } from 'react';
import { QUOTE_REQUEST_STATUSES } from '../../../shared/schemas/order.schema';
import { quoteRequestSearchSchema } from '../../../shared/schemas/list-search.schema';
import type { QuoteRequestSearch as QuoteRequestSearchValues } from '../../../shared/schemas/list-search.schema';
import { CheckboxField, Form, SelectField, TextField } from '../form/fields';
import { SearchButton } from '../form/search-button';
import { useListSearchForm } from '../form/use-list-search-form';

import { REQUEST_STAGE_WORDS } from './request-stage-words';

export { REQUEST_STAGE_WORDS };

const STAGE_OPTIONS = [{ value: '', label: 'Every stage' }, ...QUOTE_REQUEST_STATUSES.map((s) => ({ value: s, label: REQUEST_STAGE_WORDS[s] }))];

interface QuoteRequestSearchProps {
  status: string | undefined;
  q: string | undefined;
  /** The desk's "only those waiting for our price"; left out, the box is not offered (the contractor's list). */
  waiting?: boolean;
  /** The waiting box's words (the side that prices gives them). */
  waitingLabel?: string;
  placeholder: string;
  onSearch: (values: QuoteRequestSearchValues) => void;
  /** Put after the stage (the phone's sort picker). */
  sortPicker?: ReactNode;
  /** "Clear the filters", when some are on. */
  clear?: ReactNode;
}

/**
 * The quote-request lists' search bar, for the contractor's list and the desk's alike: the stage and
 * the desk's tick box search at once, the words on Enter or Search.
 */
export function QuoteRequestSearch({ status, q, waiting, waitingLabel = 'Only those waiting for our price', placeholder, onSearch, sortPicker, clear }: QuoteRequestSearchProps) {
  const offersWaiting = waiting !== undefined;
  const address: Record<string, string | boolean> = { status: status ?? '', q: q ?? '' };
  if (offersWaiting) address.waiting = waiting;
  const { form, searchNow } = useListSearchForm({ schema: quoteRequestSearchSchema, address, onSearch });
  return (
    <Form form={form} label="Find quote requests" role="search" className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <SelectField name="status" label="Stage" options={STAGE_OPTIONS} defaultValue={status ?? ''} onChange={searchNow} />
        {offersWaiting ? <CheckboxField name="waiting" label={waitingLabel} defaultChecked={waiting} onChange={searchNow} /> : null}
        {sortPicker}
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <TextField name="q" label="Search quote requests" type="search" maxLength={100} defaultValue={q ?? ''} placeholder={placeholder} className="min-w-56 flex-1" />
        <SearchButton clear={clear} />
      </div>
    </Form>
  );
}
