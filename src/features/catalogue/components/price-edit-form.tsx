import { useMemo } from 'react';
import { moneyEntryExample, moneyEntryText } from '../../../../shared/domain/money-entry';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { currentCurrency, formatMoney, moneySign } from '../../../lib/format';
import { useSetBranchPrice } from '../api/set-branch-price';
import { showingFieldDetails } from '../lib/form-values';
import { priceFormSchema } from '../lib/price-form';
import { ItemEditPanel } from './item-edit-panel';

/** The branch's price for one pack of a product, typed in the configured currency; stock figures are changed on their own form. */
export function PriceEditForm({ branchId, item, onDone }: { branchId: number; item: StockItem; onDone: () => void }) {
  const setPrice = useSetBranchPrice(branchId);
  const toast = useToast();
  const currency = currentCurrency();
  const schema = useMemo(() => priceFormSchema(currency), [currency]);
  const form = useSchemaForm({
    schema,
    onSubmit: showingFieldDetails(async (body) => {
      await setPrice.mutateAsync({ productId: item.product_id, body });
      toast.show(`${item.sku} now costs ${formatMoney(body.pack_price)} a pack here.`, 'success');
      onDone();
    }),
  });
  return (
    <ItemEditPanel item={item} form={form} label={`Change the price of ${item.sku}`} fieldsClassName="max-w-xs" submitLabel="Save the price" onDone={onDone}>
      <TextField
        name="pack_price"
        label={`Pack price in ${moneySign()} (${item.pack_size} ${item.unit})`}
        hint={`Before tax, e.g. ${moneyEntryExample(currency)}.`}
        inputMode="decimal"
        autoComplete="off"
        defaultValue={moneyEntryText(item.pack_price, currency)}
      />
    </ItemEditPanel>
  );
}
