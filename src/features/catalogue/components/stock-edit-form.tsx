import { useMemo } from 'react';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { useUpdateStock } from '../api/update-stock';
import { showingFieldDetails } from '../lib/form-values';
import { stockFormSchema } from '../lib/stock-form';
import { ItemEditPanel } from './item-edit-panel';

/** A new count or reorder level for one product at the branch, typed in whole packs. */
export function StockEditForm({ branchId, item, onDone }: { branchId: number; item: StockItem; onDone: () => void }) {
  const update = useUpdateStock(branchId);
  const toast = useToast();
  const schema = useMemo(() => stockFormSchema(item), [item]);
  const form = useSchemaForm({
    schema,
    onSubmit: showingFieldDetails(async (body) => {
      const saved = await update.mutateAsync({ productId: item.product_id, body });
      toast.show(`${saved.sku}: ${saved.on_hand.toLocaleString('en-GB')} on hand, reorder at ${saved.reorder_level.toLocaleString('en-GB')}.`, 'success');
      onDone();
    }),
  });
  return (
    <ItemEditPanel item={item} form={form} label={`Change the stock of ${item.sku}`} fieldsClassName="grid gap-4 sm:grid-cols-2" submitLabel="Save" onDone={onDone}>
      <TextField
        name="on_hand"
        label={`On hand (packs of ${item.pack_size} ${item.unit})`}
        hint={`${item.reserved.toLocaleString('en-GB')} reserved for confirmed orders: on hand cannot be less.`}
        inputMode="numeric"
        autoComplete="off"
        defaultValue={String(item.on_hand)}
      />
      <TextField name="reorder_level" label="Reorder level (packs)" hint="Shown as low stock at or below this." inputMode="numeric" autoComplete="off" defaultValue={String(item.reorder_level)} />
    </ItemEditPanel>
  );
}
