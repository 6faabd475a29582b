import { useEffect, useRef } from 'react';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { formatMoney, moneySign } from '../../../lib/format';
import { useSetBranchPrice } from '../api/set-branch-price';
import { withFieldDetails } from '../lib/form-values';
import { penceText, priceFormSchema } from '../lib/price-form';

/** The branch's price for one pack of a product; stock figures are changed on their own form. */
export function PriceEditForm({ branchId, item, onDone }: { branchId: number; item: StockItem; onDone: () => void }) {
  const setPrice = useSetBranchPrice(branchId);
  const toast = useToast();
  const form = useSchemaForm({
    schema: priceFormSchema,
    onSubmit: async (body) => {
      try {
        await setPrice.mutateAsync({ productId: item.product_id, body });
        toast.show(`${item.sku} now costs ${formatMoney(body.pack_price)} a pack here.`, 'success');
        onDone();
      } catch (error) {
        throw withFieldDetails(error);
      }
    },
  });
  const field = useRef<HTMLDivElement>(null);
  useEffect(() => {
    field.current?.querySelector('input')?.focus();
  }, [item.product_id]);
  return (
    <div className="rounded-md border border-clay-600 bg-clay-50 p-4">
      <p className="mb-3 font-semibold">
        <span className="font-mono">{item.sku}</span> · {item.name}
      </p>
      <Form form={form} label={`Change the price of ${item.sku}`} className="space-y-4">
        <div ref={field} className="max-w-xs">
          <TextField
            name="pack_price"
            label={`Pack price in ${moneySign()} (${item.pack_size} ${item.unit})`}
            hint="Before tax, e.g. 12.80."
            inputMode="decimal"
            autoComplete="off"
            defaultValue={penceText(item.pack_price)}
          />
        </div>
        <div className="flex flex-wrap gap-2">
          <SubmitButton>Save the price</SubmitButton>
          <Button variant="secondary" onClick={onDone}>
            Cancel
          </Button>
        </div>
      </Form>
    </div>
  );
}
