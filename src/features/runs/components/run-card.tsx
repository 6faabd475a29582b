import { Link } from 'react-router-dom';
import type { Run } from '../../../../shared/schemas/run.schema';
import { buttonClasses } from '../../../components/ui/button';
import { kg, plural } from '../lib/run-format';
import { DeckDrawing } from './deck-drawing';
import { DeckWarnings } from './deck-panel';
import { DropSwatch } from './drop-patterns';
import { LoadBars } from './load-bars';
import { PickList } from './pick-list';
import { RunStatusBadge } from './run-status';

export const runPath = (runId: number) => `/yard/runs/${runId}`;

/** One lorry's run on the day plan: who drives it, its drops in order, its deck, its bars and what to pick. */
export function RunCard({ run }: { run: Run }) {
  const title = `${run.time_window} · ${run.lorry.registration}`;
  return (
    <li className="rounded-lg border border-mortar-300 bg-white p-3 shadow-card sm:p-4" aria-label={title}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-lg font-semibold">
          <Link to={runPath(run.id)} className="text-clay-700 underline underline-offset-2 hover:text-clay-800">
            {title}
          </Link>{' '}
          <span className="text-base font-normal text-ink-700">
            {run.lorry.name}
            {run.lorry.has_crane ? `, crane to ${kg(run.lorry.crane_max_kg ?? 0)}` : ''}
          </span>
        </h3>
        <RunStatusBadge status={run.status} />
      </div>
      <p className="text-sm text-ink-700">Driver: {run.driver?.name ?? 'none yet'}</p>
      <div className="mt-3">
        <LoadBars run={run} />
      </div>
      {run.drops.length === 0 ? (
        <p className="mt-3 text-sm text-ink-600">Nothing booked.</p>
      ) : (
        <>
          <div className="mt-3 grid grid-cols-[minmax(0,1fr)] items-start gap-4 sm:grid-cols-[9rem_minmax(0,1fr)]">
            <DeckDrawing run={run} className="mx-auto block w-32 sm:w-full" />
            <div className="min-w-0 space-y-3">
              <ol className="space-y-1" aria-label={`Drops of ${title}, the first off first`}>
                {run.drops.map((d) => (
                  <li key={d.order_id} className="flex items-start gap-2">
                    <DropSwatch drop={d.position} className="mt-0.5 h-5 w-5" />
                    <span className="min-w-0">
                      <span className="font-semibold tabular-nums">{d.position}.</span> <span className="font-semibold">{d.reference}</span> · {d.contractor.name}
                      <span className="block text-sm text-ink-700">
                        {d.site_name}
                        {d.site_postcode ? `, ${d.site_postcode}` : ''} · {plural(d.pallets, 'pallet')}, {kg(d.weight_kg)}
                        {d.delivery_method === 'roof' ? ' · crane onto the roof' : ''}
                        {d.short ? ' · a face will be short' : ''}
                      </span>
                    </span>
                  </li>
                ))}
              </ol>
              <DeckWarnings run={run} />
              <details className="rounded-md border border-mortar-300 px-3 py-1">
                <summary className="min-h-tap cursor-pointer py-2.5 font-medium">Pick list</summary>
                <div className="pb-3">
                  <PickList run={run} />
                </div>
              </details>
            </div>
          </div>
        </>
      )}
      <div className="mt-3">
        <Link to={runPath(run.id)} className={buttonClasses('secondary')} aria-label={`Open the run ${title}`}>
          Open the run
        </Link>
      </div>
    </li>
  );
}
