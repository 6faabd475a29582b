import { stockShortfallSchema } from '../../../../shared/schemas/order.schema';
import { formatCount } from '../../../lib/format';
import { Alert } from '../../../components/ui/alert';
import { isApiError } from '../../../lib/api-client';

/** Refusals the desk can act on, shown with their figures instead of a bare message. */
export const CONFLICT_CODES = ['insufficient_stock', 'slot_full', 'crane_needed', 'crane_too_small', 'slot_past', 'nothing_to_deliver', 'order_changed'] as const;

export function isDeskConflict(error: unknown): boolean {
  return isApiError(error) && error.status === 409 && (CONFLICT_CODES as readonly string[]).includes(error.code);
}

const num = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);
const kg = (value: number) => `${value.toLocaleString('en-GB', { maximumFractionDigits: 1 })} kg`;

interface ConflictDetailsProps {
  error: unknown;
  /** SKU → description, so a short line reads as the product the desk knows. */
  descriptions?: ReadonlyMap<string, string>;
}

/** A 409 from confirming or booking: which SKU is short and by how much, or what the lorry has left. */
export function ConflictDetails({ error, descriptions }: ConflictDetailsProps) {
  if (!isApiError(error)) return null;
  if (error.code === 'insufficient_stock') {
    const short = error.details.map((d) => stockShortfallSchema.safeParse(d)).flatMap((r) => (r.success ? [r.data] : []));
    return (
      <Alert tone="danger" title="Not enough stock to confirm: nothing was reserved">
        <p>{error.message}</p>
        {short.length > 0 ? (
          <table className="mt-2 w-full border-collapse text-left text-sm" aria-label="Lines short of stock">
            <thead>
              <tr>
                <th scope="col" className="py-1 pr-4 font-semibold">
                  SKU
                </th>
                <th scope="col" className="py-1 pr-4 font-semibold">
                  Item
                </th>
                <th scope="col" className="py-1 pr-4 text-right font-semibold">
                  Free now
                </th>
                <th scope="col" className="py-1 pr-4 text-right font-semibold">
                  Asked to send
                </th>
                <th scope="col" className="py-1 text-right font-semibold">
                  Short by
                </th>
              </tr>
            </thead>
            <tbody>
              {short.map((s) => (
                <tr key={`${s.sku}-${s.line_id}`} className="border-t border-brick-200">
                  <td className="py-1 pr-4 font-mono">{s.sku}</td>
                  <td className="py-1 pr-4">{descriptions?.get(s.sku) ?? '—'}</td>
                  <td className="py-1 pr-4 text-right tabular-nums">{formatCount(s.available)}</td>
                  <td className="py-1 pr-4 text-right tabular-nums">{formatCount(s.requested)}</td>
                  <td className="py-1 text-right font-semibold tabular-nums">{formatCount(s.requested - s.available)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
        <p className="mt-2 text-sm">Send fewer packs now and back-order the rest, or offer a substitute.</p>
      </Alert>
    );
  }
  if (error.code === 'slot_full') {
    const d = error.details[0] ?? { message: '' };
    const remainingKg = num(d.remaining_kg);
    const remainingPallets = num(d.remaining_pallets);
    const weight = num(d.weight_kg);
    const pallets = num(d.pallets);
    return (
      <Alert tone="danger" title="That lorry cannot take this order: it would be overbooked">
        <p>{error.message}</p>
        {remainingKg !== null && weight !== null ? (
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 text-sm" aria-label="Lorry capacity">
            <dt>Payload left</dt>
            <dd className="tabular-nums">
              {kg(remainingKg)} (this order {kg(weight)})
            </dd>
            <dt>Pallet slots left</dt>
            <dd className="tabular-nums">
              {remainingPallets ?? '—'} (this order {pallets ?? '—'})
            </dd>
          </dl>
        ) : null}
        <p className="mt-2 text-sm">Choose another slot or lorry.</p>
      </Alert>
    );
  }
  const title =
    error.code === 'crane_needed' || error.code === 'crane_too_small'
      ? 'That lorry cannot lift this order onto the roof'
      : error.code === 'order_changed'
        ? 'The order changed meanwhile: check it and try again'
        : 'That could not be done';
  return (
    <Alert tone="danger" title={title}>
      {error.message}
    </Alert>
  );
}
