import { useEffect } from 'react';
import { stockFilterSchema } from '../../../../shared/schemas/list-search.schema';
import { CheckboxField, Form } from '../../../components/form/fields';
import { useLiveFilterForm } from '../../../components/form/use-list-search-form';

/**
 * The stock table's filter, loaded (with the form library) after the table: the choice is read through
 * its schema and handed to the table, which starts from every product.
 */
export function StockFilter({ low, onLowOnly }: { low: number; onLowOnly: (lowOnly: boolean) => void }) {
  const { form, filters } = useLiveFilterForm(stockFilterSchema, { low_only: false });
  const lowOnly = filters.low_only;
  useEffect(() => onLowOnly(lowOnly), [lowOnly, onLowOnly]);
  return (
    <Form form={form} label="Filter the stock" role="search" className="">
      <CheckboxField name="low_only" label={`Only what is at or below its reorder level (${low})`} />
    </Form>
  );
}
