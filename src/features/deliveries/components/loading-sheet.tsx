import type { AccessoryItem } from '../../../../shared/engine/delivery';
import type { LoadingSheet as LoadingSheetData } from '../../../../shared/schemas/slot.schema';
import { Alert } from '../../../components/ui/alert';
import { buttonClasses } from '../../../components/ui/button';
import { formatDate } from '../../../lib/format';
import { RecordDeliveryForm } from './record-delivery-form';

/** What each accessory on a pallet is, in the words of the yard. */
const ITEM_WORDS: Record<AccessoryItem, string> = {
  underlay_rolls: 'Underlay rolls',
  battens: 'Battens (stock lengths)',
  batten_nails: 'Batten nails',
  tile_nails: 'Tile nails',
  clips: 'Tile clips',
  ridge_tiles: 'Ridge tiles',
  hip_tiles: 'Hip tiles',
  eaves_tiles: 'Eaves tiles',
  top_tiles: 'Top tiles',
  tile_and_half: 'Tile-and-a-half',
  valley_units: 'Valley trough units',
  hip_irons: 'Hip irons',
  dry_verge_units: 'Dry verge units',
  ridge_end_caps: 'Ridge end caps',
};
const itemWords = (item: string) => (ITEM_WORDS as Record<string, string>)[item] ?? item;

type Run = LoadingSheetData['runs'][number];
type Stop = Run['stops'][number];
type Pallet = Stop['pallets'][number];

const kg = (value: number) => `${Math.round(value).toLocaleString('en-GB')} kg`;
const ordinal = (n: number) => `${n}${n % 10 === 1 && n % 100 !== 11 ? 'st' : n % 10 === 2 && n % 100 !== 12 ? 'nd' : n % 10 === 3 && n % 100 !== 13 ? 'rd' : 'th'}`;

/**
 * The usual cautions on a lorry's day (common practice for crane offloading and roof loading, not a
 * lift plan); the site's own notes, its lift plan and the tile maker's fixing specification come first.
 */
const DRIVER_CAUTIONS = [
  'Crane lifts need a lift plan by a competent person: check the ground, the outriggers and overhead lines before lifting.',
  'Land pallets on the roof only where the contractor says the structure can take them, spread across both slopes, never all on one.',
  'Keep people clear of a suspended load, and stop in high wind.',
];

function PalletCard({ pallet }: { pallet: Pallet }) {
  return (
    <li className="rounded-md border-2 border-mortar-300 bg-white p-4" data-testid="pallet">
      <p className="text-xl font-bold">
        Load {ordinal(pallet.load_position)}: pallet {pallet.n} · {pallet.kind === 'tiles' ? `${pallet.tiles.toLocaleString('en-GB')} tiles` : 'accessories'}
      </p>
      <p className="text-lg tabular-nums">{kg(pallet.weight_kg)}</p>
      {pallet.faces.length > 0 ? (
        <ul className="mt-2 space-y-1 text-lg" aria-label={`Roof faces pallet ${pallet.n} serves`}>
          {pallet.faces.map((face) => (
            <li key={`${face.building}-${face.face}`}>
              For <span className="font-semibold">{face.building === 'spare' ? 'spare (waste allowance)' : `${face.building} · ${face.face}`}</span>: {face.tiles.toLocaleString('en-GB')} tiles
            </li>
          ))}
        </ul>
      ) : null}
      {pallet.items.length > 0 ? (
        <ul className="mt-2 space-y-1 text-lg">
          {pallet.items.map((item) => (
            <li key={item.item}>
              {itemWords(item.item)}: {item.quantity.toLocaleString('en-GB')}
            </li>
          ))}
        </ul>
      ) : null}
    </li>
  );
}

function StopCard({ stop, position }: { stop: Stop; position: number }) {
  const pallets = [...stop.pallets].sort((a, b) => a.load_position - b.load_position);
  const phone = stop.site.contact_phone.replace(/[^\d+]/g, '');
  return (
    <article className="space-y-4 rounded-lg border-2 border-ink-300 bg-white p-4 sm:p-6" aria-labelledby={`stop-${stop.order_id}`}>
      <header>
        <p className="text-lg text-ink-700">Stop {position}</p>
        <h3 id={`stop-${stop.order_id}`} className="text-2xl font-bold">
          {stop.site.name}
        </h3>
        <p className="text-xl">
          {stop.site.site_address}
          {stop.site.site_postcode ? `, ${stop.site.site_postcode}` : ''}
        </p>
        <p className="text-lg text-ink-700">
          {stop.reference} · {stop.contractor.name} · {kg(stop.weight_kg)} on {stop.pallets.length} pallets · {stop.delivery_method === 'roof' ? 'crane onto the roof' : 'set down at ground level'}
        </p>
      </header>
      {stop.site.contact_name || phone ? (
        <a href={phone ? `tel:${phone}` : undefined} className={buttonClasses('secondary', 'lg', 'w-full')}>
          Call {stop.site.contact_name || 'the site'} {stop.site.contact_phone}
        </a>
      ) : null}
      {stop.notes.length > 0 ? (
        <section aria-label="Set-down and site notes">
          <h4 className="text-xl font-semibold">Set-down and site notes</h4>
          <ul className="mt-1 list-disc space-y-1 pl-6 text-lg">
            {stop.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </section>
      ) : null}
      {stop.cautions.length > 0 ? (
        <Alert tone="caution" title="Cautions for this drop" live={false}>
          <ul className="list-disc space-y-1 pl-5 text-lg">
            {stop.cautions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
      <section aria-label={`Pallets for ${stop.reference}, in loading order`}>
        <h4 className="text-xl font-semibold">Pallets, in loading order</h4>
        <ol className="mt-2 space-y-3">
          {pallets.map((p) => (
            <PalletCard key={p.n} pallet={p} />
          ))}
        </ol>
      </section>
      {stop.status === 'on_the_road' ? (
        <details className="rounded-md border-2 border-clay-600 p-4">
          <summary className="min-h-tap-lg cursor-pointer content-center text-xl font-semibold">Record the delivery</summary>
          <div className="mt-4">
            <RecordDeliveryForm stop={stop} />
          </div>
        </details>
      ) : stop.status === 'delivered' ? (
        <p className="text-xl font-semibold text-moss-800">Delivered</p>
      ) : (
        <p className="text-lg text-ink-700">Not sent out yet: the yard marks it on the road when the lorry leaves.</p>
      )}
    </article>
  );
}

function RunCard({ run }: { run: Run }) {
  return (
    <section className="space-y-4" aria-label={`Run ${run.time_window} on ${run.lorry.registration}`}>
      <header className="rounded-lg bg-ink-900 p-4 text-white">
        <h2 className="text-2xl font-bold">
          {run.time_window} · {run.lorry.registration}
        </h2>
        <p className="text-lg">
          {kg(run.weight_kg)} on {run.pallets} pallets · {run.lorry.has_crane ? `crane lifts up to ${kg(run.lorry.crane_max_kg ?? 0)}` : 'no crane'}
        </p>
        <p className="mt-1 text-lg">Load the last stop first, so the first stop&rsquo;s pallets come off first.</p>
      </header>
      {run.stops.map((stop, i) => (
        <StopCard key={stop.order_id} stop={stop} position={i + 1} />
      ))}
    </section>
  );
}

/** The driver's day on a phone: each run, its stops in delivery order, each stop's pallets in loading order. */
export function LoadingSheet({ sheet }: { sheet: LoadingSheetData }) {
  // Slots with nothing booked are the driver's too, but there is nothing to load for them.
  const loaded = sheet.runs.filter((run) => run.stops.length > 0);
  const empty = sheet.runs.length - loaded.length;
  return (
    <div className="space-y-8 text-lg">
      <Alert tone="caution" title="Before you load and lift" live={false}>
        <ul className="list-disc space-y-1 pl-5">
          {DRIVER_CAUTIONS.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
        <p className="mt-2">The tile maker&rsquo;s fixing specification, local codes and the site&rsquo;s lift plan take precedence.</p>
      </Alert>
      {loaded.length === 0 ? (
        <p className="text-xl">No loads for you on {formatDate(sheet.date)}.</p>
      ) : (
        loaded.map((run) => <RunCard key={run.slot_id} run={run} />)
      )}
      {empty > 0 ? <p className="text-ink-700">{empty === 1 ? 'One more slot of yours has' : `${empty} more slots of yours have`} nothing booked.</p> : null}
    </div>
  );
}
