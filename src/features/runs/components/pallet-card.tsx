import { Link } from 'react-router-dom';
import type { PalletView } from '../../../../shared/schemas/run.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useSetPositionLoaded } from '../api/set-position-loaded';
import { kg } from '../lib/run-format';
import { DropSwatch } from './drop-patterns';
import { runPath } from './run-card';

const quantity = (n: number) => n.toLocaleString('en-GB', { maximumFractionDigits: 2 });

function LoadButton({ pallet, runId, index }: { pallet: PalletView; runId: number; index: number }) {
  const tick = useSetPositionLoaded(runId);
  // Shown as asked straight away; the refetched pallet then takes over.
  const loaded = tick.isPending ? tick.variables.loaded : pallet.loaded;
  return (
    <div className="space-y-3">
      {tick.isError ? (
        <Alert tone="danger" title="That was not saved">
          {errorMessage(tick.error)}
        </Alert>
      ) : null}
      {loaded ? (
        <>
          <p className="flex items-center gap-2 rounded-md border-2 border-moss-600 bg-moss-50 px-4 py-3 text-xl font-bold text-moss-800" role="status">
            <svg viewBox="0 0 24 24" className="h-7 w-7" aria-hidden="true" focusable="false">
              <path d="m5 12.5 4.5 4.5L19 7.5" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round" />
            </svg>
            Loaded
          </p>
          <Button variant="secondary" size="lg" className="w-full" busy={tick.isPending} onClick={() => tick.mutate({ index, loaded: false })}>
            Not loaded after all
          </Button>
        </>
      ) : (
        <Button size="lg" className="w-full" busy={tick.isPending} onClick={() => tick.mutate({ index, loaded: true })}>
          Mark loaded
        </Button>
      )}
    </div>
  );
}

/** One pallet as its label's QR code opens it on a phone: what it is, where it goes, and one button to tick it loaded. */
export function PalletCard({ pallet, canLoad }: { pallet: PalletView; canLoad: boolean }) {
  const onRun = pallet.run_id !== null && pallet.position_index !== null;
  return (
    <article className="space-y-5 text-lg" aria-label={`Pallet ${pallet.pallet} of ${pallet.reference}`}>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2">
        <dt className="text-ink-600">Order</dt>
        <dd className="font-semibold">{pallet.reference}</dd>
        <dt className="text-ink-600">Site</dt>
        <dd>{pallet.site_name}</dd>
        <dt className="text-ink-600">Drop</dt>
        <dd className="flex items-center gap-2 font-semibold">
          {pallet.drop !== null ? (
            <>
              <DropSwatch drop={pallet.drop} className="h-6 w-6" />
              {pallet.drop} of {pallet.drops}
            </>
          ) : (
            'not on a run yet'
          )}
        </dd>
        <dt className="text-ink-600">Pallet</dt>
        <dd className="font-semibold">
          {pallet.pallet} of {pallet.pallets}
        </dd>
        <dt className="text-ink-600">Weight</dt>
        <dd className="tabular-nums">{kg(pallet.weight_kg)}</dd>
        <dt className="text-ink-600">Roof faces</dt>
        <dd>
          {pallet.faces.length === 0 ? (
            'none: accessories'
          ) : (
            <ul>
              {pallet.faces.map((f, i) => (
                <li key={i}>
                  {f.building ? `${f.building} · ` : ''}
                  {f.face}: {f.tiles.toLocaleString('en-GB')} tiles
                </li>
              ))}
            </ul>
          )}
        </dd>
      </dl>
      {onRun ? (
        canLoad ? (
          <LoadButton pallet={pallet} runId={pallet.run_id!} index={pallet.position_index!} />
        ) : (
          <p className="font-semibold">{pallet.loaded ? 'Loaded.' : 'Not loaded yet.'}</p>
        )
      ) : (
        <Alert tone="info" title="Not on a lorry yet" live={false}>
          The order is not booked onto a run, so there is nothing to load it onto.
        </Alert>
      )}
      <section aria-label="On the pallet">
        <h2 className="mb-1 font-semibold">On the pallet</h2>
        {pallet.items.length === 0 ? (
          <p className="text-ink-700">Nothing listed.</p>
        ) : (
          <ul className="divide-y divide-mortar-200 rounded-md border border-mortar-300 bg-white">
            {pallet.items.map((item, i) => (
              <li key={i} className="flex justify-between gap-3 px-3 py-2">
                <span>{item.description}</span>
                <span className="whitespace-nowrap tabular-nums">
                  {quantity(item.quantity)} {item.unit}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      {pallet.run_id !== null ? (
        <p>
          <Link to={runPath(pallet.run_id)} className="inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2">
            Open the whole run
          </Link>
        </p>
      ) : null}
    </article>
  );
}
