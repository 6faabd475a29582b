import { createContext, useContext, useEffect, useMemo } from 'react';
import { FieldMessage } from '../../../components/form/fields';
import type { SchemaForm } from '../../../components/form/use-schema-form';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { formatMoney } from '../../../lib/format';
import { lineField } from '../lib/order-form';
import type { OrderLineOption } from '../lib/order-form';

interface LineRow {
  index: number;
  option: OrderLineOption;
}

interface LinesState {
  form: SchemaForm;
  packs: Record<number, number | null>;
}

// Cells read the form and the running packs from here, so the columns stay the same objects and the
// table never remounts an input (and loses what was typed) when the subtotal changes.
const LinesContext = createContext<LinesState | null>(null);

function useLines(): LinesState {
  const state = useContext(LinesContext);
  if (!state) throw new Error('Line cells need the lines table around them');
  return state;
}

function IncludeCell({ index, option }: LineRow) {
  const { form } = useLines();
  const name = lineField(index, 'include');
  return (
    <input
      type="checkbox"
      {...form.register(name)}
      defaultChecked={!option.excluded}
      aria-label={`Order ${option.description}`}
      aria-invalid={form.fieldError(name) ? true : undefined}
      className="h-5 w-5 accent-clay-600"
    />
  );
}

function ItemCell({ index, option }: LineRow) {
  const { form } = useLines();
  const error = form.fieldError(lineField(index, 'include'));
  return (
    <span className="block min-w-52">
      <span className="font-medium">{option.description}</span>
      {option.sku ? <span className="block font-mono text-xs text-ink-600">{option.sku}</span> : null}
      {option.needed !== undefined ? (
        <span className="block text-xs text-ink-600">
          Estimate: {option.needed.toLocaleString('en-GB')} {unitWord(option.unit, option.needed)}
          {option.pack_size > 1 ? ` in packs of ${option.pack_size.toLocaleString('en-GB')}` : ''}
        </span>
      ) : null}
      {error ? <span className="block text-sm font-medium text-brick-700">{error}</span> : null}
    </span>
  );
}

function PacksCell({ index, option }: LineRow) {
  const { form } = useLines();
  const name = lineField(index, 'quantity');
  const error = form.fieldError(name);
  const id = `${form.id}-line-${index}`;
  return (
    <div className="w-28">
      <label htmlFor={id} className="sr-only">
        Packs of {option.description}
      </label>
      <input
        id={id}
        {...form.register(name)}
        type="number"
        inputMode="numeric"
        min={1}
        step={1}
        defaultValue={option.packs}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={`block min-h-tap w-full rounded-md border bg-white px-2 tabular-nums ${error ? 'border-brick-600 ring-1 ring-brick-600' : 'border-ink-300'}`}
      />
      {error ? <FieldMessage id={`${id}-error`}>{error}</FieldMessage> : null}
    </div>
  );
}

function LineTotalCell({ index, option }: LineRow) {
  const { packs } = useLines();
  const count = packs[index];
  return <span className="whitespace-nowrap tabular-nums">{count === null || count === undefined || option.unit_price === null ? '—' : formatMoney(count * option.unit_price)}</span>;
}

const lineHelper = dataTableColumns<LineRow>();
const lineColumns = lineHelper.columns([
  lineHelper.display({ id: 'include', header: 'Order', cell: (info) => <IncludeCell {...info.row.original} /> }),
  lineHelper.display({ id: 'item', header: 'Item', cell: (info) => <ItemCell {...info.row.original} /> }),
  lineHelper.display({ id: 'packs', header: 'Packs', cell: (info) => <PacksCell {...info.row.original} /> }),
  lineHelper.display({ id: 'price', header: 'Pack price', cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatMoney(info.row.original.option.unit_price)}</span> }),
  lineHelper.display({ id: 'total', header: 'Line total', cell: (info) => <LineTotalCell {...info.row.original} /> }),
]);

/**
 * The order form's lines with their packs, loaded after the form shows. `onShown` runs once its inputs
 * are in the form, so the form reads the packs (and the subtotal) again.
 */
export function OrderLinesTable({ form, lines, packs, onShown }: { form: SchemaForm; lines: readonly OrderLineOption[]; packs: Record<number, number | null>; onShown: () => void }) {
  useEffect(onShown, [onShown]);
  const rows = useMemo(() => lines.map((option, index) => ({ index, option })), [lines]);
  const state = useMemo(() => ({ form, packs }), [form, packs]);
  return (
    <LinesContext.Provider value={state}>
      <DataTable caption="Lines of the order" captionHidden columns={lineColumns} data={rows} getRowId={(row) => String(row.option.product_id)} minWidthClass="min-w-[40rem]" />
    </LinesContext.Provider>
  );
}

/** "tile" → "tiles"; metres stay "m". */
function unitWord(unit: string, quantity: number): string {
  return quantity === 1 || unit === 'm' ? unit : `${unit}s`;
}
