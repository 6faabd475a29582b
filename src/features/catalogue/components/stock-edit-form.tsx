import { useEffect, useMemo, useRef } from 'react';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useUpdateStock } from '../api/update-stock';
import { withFieldDetails } from '../lib/form-values';
import { stockFormSchema } from '../lib/stock-form';

/** A new count or reorder level for one product at the branch, typed in whole packs. */
export function StockEditForm({ branchId, item, onDone }: { branchId: number; item: StockItem; onDone: () => void }) {
  const update = useUpdateStock(branchId);
  const toast = useToast();
  const schema = useMemo(() => stockFormSchema(item), [item]);
  const form = useSchemaForm({
    schema,
    onSubmit: async (body) => {
      try {
        const saved = await update.mutateAsync({ productId: item.product_id, body });
        toast.show(`${saved.sku}: ${saved.on_hand.toLocaleString('en-GB')} on hand, reorder at ${saved.reorder_level.toLocaleString('en-GB')}.`, 'success');
        onDone();
      } catch (error) {
        throw withFieldDetails(error);
      }
    },
  });
  const firstField = useRef<HTMLDivElement>(null);
  useEffect(() => {
    // The form opens above a wide table; moving focus into it tells keyboard and screen-reader users where it went.
    firstField.current?.querySelector('input')?.focus();
  }, [item.product_id]);
  return (
    <div className="rounded-md border border-clay-600 bg-clay-50 p-4">
      <p className="mb-3 font-semibold">
        <span className="font-mono">{item.sku}</span> · {item.name}
      </p>
      <Form form={form} label={`Change the stock of ${item.sku}`} className="space-y-4">
        <div ref={firstField} className="grid gap-4 sm:grid-cols-2">
          <TextField
            name="on_hand"
            label={`On hand (packs of ${item.pack_size} ${item.unit})`}
            hint={`${item.reserved.toLocaleString('en-GB')} reserved for confirmed orders: on hand cannot be less.`}
            inputMode="numeric"
            autoComplete="off"
            defaultValue={String(item.on_hand)}
          />
          <TextField name="reorder_level" label="Reorder level (packs)" hint="Shown as low stock at or below this." inputMode="numeric" autoComplete="off" defaultValue={String(item.reorder_level)} />
        </div>
        <div className="flex flex-wrap gap-2">
          <SubmitButton>Save</SubmitButton>
          <Button variant="secondary" onClick={onDone}>
            Cancel
          </Button>
        </div>
      </Form>
    </div>
  );
}
