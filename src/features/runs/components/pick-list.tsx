import type { Run } from '../../../../shared/schemas/run.schema';
import { DropSwatch } from './drop-patterns';

const quantity = (n: number) => n.toLocaleString('en-GB', { maximumFractionDigits: 2 });

/** What the yard picks for each drop: every product with its quantity and packs, drop by drop. */
export function PickList({ run }: { run: Run }) {
  const place = new Map(run.drops.map((d) => [d.order_id, d.position]));
  const lists = [...run.pick_list].sort((a, b) => (place.get(a.order_id) ?? 0) - (place.get(b.order_id) ?? 0));
  if (lists.length === 0) return <p className="text-ink-700">Nothing to pick.</p>;
  return (
    <div className="space-y-4">
      {lists.map((list) => {
        const drop = place.get(list.order_id) ?? 0;
        if (list.lines.length === 0) {
          return (
            <p key={list.order_id} className="flex items-center gap-1.5 text-sm">
              <DropSwatch drop={drop} className="h-4 w-4" />
              <span className="font-semibold">
                Drop {drop}: {list.reference}
              </span>{' '}
              — nothing left to pick.
            </p>
          );
        }
        return (
          <div key={list.order_id} className="overflow-x-auto">
            <table className="w-full min-w-[18rem] text-sm">
              <caption className="mb-1 text-left font-semibold">
                <span className="inline-flex items-center gap-1.5">
                  <DropSwatch drop={drop} className="h-4 w-4" />
                  Drop {drop}: {list.reference}
                </span>
              </caption>
              <thead>
                <tr className="border-b border-mortar-300 text-left text-ink-600">
                  <th scope="col" className="py-1 pr-2 font-medium">
                    Product
                  </th>
                  <th scope="col" className="py-1 pr-2 text-right font-medium">
                    Quantity
                  </th>
                  <th scope="col" className="py-1 text-right font-medium">
                    Packs
                  </th>
                </tr>
              </thead>
              <tbody>
                {list.lines.map((line, i) => (
                  <tr key={`${line.sku}-${i}`} className="border-b border-mortar-200 last:border-0">
                    <td className="py-1 pr-2">
                      {line.description} <span className="font-mono text-xs text-ink-600">{line.sku}</span>
                    </td>
                    <td className="py-1 pr-2 text-right tabular-nums">
                      {quantity(line.quantity)} {line.unit}
                    </td>
                    <td className="py-1 text-right tabular-nums">{line.packs ?? '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        );
      })}
    </div>
  );
}
