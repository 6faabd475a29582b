import { useEffect, useRef } from 'react';
import type { ReactNode } from 'react';
import type { StockItem } from '../../../../shared/schemas/stock.schema';
import { Form } from '../../../components/form/fields';
import type { SchemaForm } from '../../../components/form/use-schema-form';
import { SaveOrCancel } from './save-or-cancel';

/**
 * The frame of a form that changes one row of the branch's stock table: the product it is about, its
 * fields, save and cancel. It opens above a wide table, so focus moves into its first field on opening
 * (and again for another product): that tells keyboard and screen-reader users where it went.
 */
export function ItemEditPanel({
  item,
  form,
  label,
  fieldsClassName,
  submitLabel,
  onDone,
  children,
}: {
  item: StockItem;
  form: SchemaForm;
  label: string;
  fieldsClassName: string;
  submitLabel: string;
  onDone: () => void;
  children: ReactNode;
}) {
  const fields = useRef<HTMLDivElement>(null);
  useEffect(() => {
    fields.current?.querySelector('input')?.focus();
  }, [item.product_id]);
  return (
    <div className="rounded-md border border-clay-600 bg-clay-50 p-4">
      <p className="mb-3 font-semibold">
        <span className="font-mono">{item.sku}</span> · {item.name}
      </p>
      <Form form={form} label={label} className="space-y-4">
        <div ref={fields} className={fieldsClassName}>
          {children}
        </div>
        <SaveOrCancel submitLabel={submitLabel} onCancel={onDone} />
      </Form>
    </div>
  );
}
