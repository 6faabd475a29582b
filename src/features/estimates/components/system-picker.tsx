import { useMemo } from 'react';
import { lowestPitch } from '../../../../shared/engine/courses';
import type { RoofSystemOffer } from '../../../../shared/schemas/catalogue.schema';
import type { Face } from '../../../../shared/schemas/schedule.schema';
import { useSchemaFormContext } from '../../../components/form/fields';
import { formatMoney } from '../../../lib/format';

const STOCK_WORDS = { in_stock: 'In stock', low: 'Low stock', out_of_stock: 'Out of stock' } as const;
const STOCK_CLASSES = { in_stock: 'bg-moss-50 text-moss-800', low: 'bg-ochre-50 text-ochre-800', out_of_stock: 'bg-brick-50 text-brick-800' } as const;

interface SystemPickerProps {
  systems: readonly RoofSystemOffer[];
  faces: readonly Face[];
  chosenId: number | null;
  error?: string;
  describedBy?: string;
}

/** A merchant branch's roof system as a choice: the tile's figures, its prices and stock, and faces it cannot be laid on. */
function SystemOption({ offer, faces, checked, describedBy }: { offer: RoofSystemOffer; faces: readonly Face[]; checked: boolean; describedBy?: string }) {
  const form = useSchemaFormContext();
  const low = lowestPitch(offer.tile.headlap_mm);
  const unsuitable = faces.filter((f) => f.pitch_deg < low - 1e-9);
  const tile = offer.components.find((c) => c.role === 'tile');
  const ridge = offer.components.find((c) => c.role === 'ridge');
  return (
    <label className="flex min-h-tap cursor-pointer items-start gap-3 rounded-md border border-ink-300 bg-white p-3 has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50 has-[:checked]:ring-1 has-[:checked]:ring-clay-600">
      <input type="radio" {...form.register('system_id')} value={offer.id} defaultChecked={checked} aria-describedby={describedBy} className="mt-1 h-5 w-5 shrink-0 accent-clay-600" />
      <span className="min-w-0 flex-1 space-y-1">
        <span className="block font-semibold">
          {offer.name} <span className="font-normal text-ink-600">· {offer.branch.name}</span>
        </span>
        <span className="block text-sm text-ink-700">
          {offer.tile.kind === 'double_lap' ? 'Double lap' : 'Single lap'}, {offer.tile.length_mm} × {offer.tile.width_mm} mm, {offer.tile.weight_kg} kg, {offer.tile.per_pallet} a pallet; from {low}°
        </span>
        <span className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
          {tile ? (
            <span>
              Tile {formatMoney(tile.unit_price)}
              {tile.product.pack_size > 1 ? ` / ${tile.product.pack_size}` : ''}
            </span>
          ) : null}
          {ridge ? <span>Ridge {formatMoney(ridge.unit_price)}</span> : null}
          {tile ? <span className={`rounded px-1.5 text-xs font-semibold ${STOCK_CLASSES[tile.stock]}`}>{STOCK_WORDS[tile.stock]}</span> : null}
        </span>
        {unsuitable.length > 0 ? (
          <span className="block text-sm font-medium text-brick-700">
            Not for {unsuitable.map((f) => `${f.building} · ${f.face} (${f.pitch_deg}°)`).join(', ')}: below {low}°
          </span>
        ) : null}
      </span>
    </label>
  );
}

/** The merchants' systems, by merchant and branch. */
export function SystemPicker({ systems, faces, chosenId, error, describedBy }: SystemPickerProps) {
  const byMerchant = useMemo(() => {
    const groups = new Map<string, RoofSystemOffer[]>();
    for (const offer of systems) groups.set(offer.branch.merchant.name, [...(groups.get(offer.branch.merchant.name) ?? []), offer]);
    return [...groups].sort(([a], [b]) => a.localeCompare(b));
  }, [systems]);
  return (
    // aria-invalid belongs on the radio group, not on each radio button.
    <div role="radiogroup" aria-label="Roof systems" aria-invalid={error ? true : undefined} aria-describedby={describedBy} className="space-y-5">
      {byMerchant.map(([merchant, offers]) => (
        <fieldset key={merchant} className="space-y-2">
          <legend className="mb-1 font-semibold text-ink-800">{merchant}</legend>
          <div className="grid gap-2">
            {offers.map((offer) => (
              <SystemOption key={offer.id} offer={offer} faces={faces} checked={chosenId === offer.id} describedBy={describedBy} />
            ))}
          </div>
        </fieldset>
      ))}
    </div>
  );
}
