import type { SubstituteFigures as Figures } from '../../../shared/schemas/order.schema';
import { formatCount, formatMoney } from '../../lib/format';

type Item = Figures['rows'][number]['before'];

const cell = (item: Item) =>
  item ? (
    <>
      <span className="block">{item.description}</span>
      <span className="block text-xs text-ink-600 tabular-nums">
        {formatCount(item.quantity)} {item.unit} · {formatCount(item.packs)} packs · {formatMoney(item.total)}
      </span>
    </>
  ) : (
    <span className="text-ink-600">not needed</span>
  );

/**
 * A substitute tile worked out on the order's own roof by the engine: the bill as ordered and with the
 * substitute side by side, the faces the tile may not be laid on, and what the bill costs more or less.
 */
export function SubstituteFigures({ figures, caption }: { figures: Figures; caption: string }) {
  const difference = figures.price_difference_minor;
  return (
    <div className="space-y-2">
      {figures.refused_faces.length > 0 ? (
        <div role="alert" className="rounded-md border border-brick-600 bg-brick-50 p-3 text-sm">
          <p className="font-semibold">
            {figures.tile.sku} may not be laid on every face of this roof (lowest pitch {formatCount(figures.tile.lowest_pitch_deg)}°):
          </p>
          <ul className="list-disc pl-5">
            {figures.refused_faces.map((f) => (
              <li key={`${f.building}-${f.face}`}>{f.message}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <div className="overflow-x-auto rounded-md border border-mortar-300 bg-white" role="region" aria-label={caption} tabIndex={0}>
        <table className="w-full min-w-[36rem] border-collapse text-left text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-mortar-100">
            <tr>
              <th scope="col" className="px-3 py-2">
                Item
              </th>
              <th scope="col" className="px-3 py-2">
                As ordered
              </th>
              <th scope="col" className="px-3 py-2">
                With {figures.tile.sku}
              </th>
            </tr>
          </thead>
          <tbody>
            {figures.rows.map((r) => (
              <tr key={r.role} className={`border-t border-mortar-200 align-top ${r.changes ? 'bg-ochre-50' : ''}`}>
                <th scope="row" className="px-3 py-2 font-medium">
                  {r.label}
                  {r.changes ? <span className="block text-xs font-normal text-ochre-800">changes</span> : null}
                </th>
                <td className="px-3 py-2">{cell(r.before)}</td>
                <td className="px-3 py-2">{cell(r.after)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr className="border-t-2 border-mortar-300 font-semibold">
              <th scope="row" className="px-3 py-2">
                Bill
              </th>
              <td className="px-3 py-2 tabular-nums">{formatMoney(figures.before_total)}</td>
              <td className="px-3 py-2 tabular-nums">
                {formatMoney(figures.after_total)}{' '}
                <span data-testid="price-difference">
                  ({difference >= 0 ? '+' : '−'}
                  {formatMoney(Math.abs(difference))})
                </span>
              </td>
            </tr>
          </tfoot>
        </table>
      </div>
      {figures.not_counted.length > 0 ? (
        <ul className="text-sm text-ink-700">
          {figures.not_counted.map((n) => (
            <li key={n}>Not counted: {n}</li>
          ))}
        </ul>
      ) : null}
      <p className="text-xs text-ink-600">Worked out by the engine ({figures.engine_version}) from the order's own roof schedule; follow the tile maker's fixing specification.</p>
    </div>
  );
}
