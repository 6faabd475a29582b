import { lazy, Suspense } from 'react';
import type { Run } from '../../../../shared/schemas/run.schema';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { kg } from '../lib/run-format';
import { DeckPanel } from './deck-panel';
import { LoadBars } from './load-bars';
import { PickList } from './pick-list';
import { PrintLinks } from './print-links';
import { RunStatusBadge } from './run-status';
import { SendOutPanel } from './send-out-panel';

/** The drops with their drag-and-drop reordering: the drag library loads after the run's figures show. */
const DropOrder = lazy(() => import('./drop-order').then((m) => ({ default: m.DropOrder })));

export interface RunAbilities {
  /** Change the drop order. */
  plan: boolean;
  /** Tick pallets loaded. */
  load: boolean;
  sendOut: boolean;
  /** Send out before the day or not fully ticked, with a reason. */
  override: boolean;
}

interface RunDetailProps {
  run: Run;
  can: RunAbilities;
  orderHref: (orderId: number) => string;
}

/** One run as the yard builds it: the drops in order, the deck pallet by pallet, the paperwork and sending it out. */
export function RunDetail({ run, can, orderHref }: RunDetailProps) {
  return (
    <div className="space-y-6">
      <Card>
        <div className="flex flex-wrap items-center justify-between gap-3">
          <div className="flex flex-wrap items-center gap-3">
            <RunStatusBadge status={run.status} />
            <span className="text-ink-700">
              {run.lorry.name}
              {run.lorry.has_crane ? `, crane to ${kg(run.lorry.crane_max_kg ?? 0)}` : ''} · driver {run.driver?.name ?? 'not assigned yet'}
            </span>
          </div>
          <PrintLinks runId={run.id} hasDrops={run.drops.length > 0} />
        </div>
        <div className="mt-4">
          <LoadBars run={run} />
        </div>
        <div className="mt-4 border-t border-mortar-200 pt-4">
          <SendOutPanel run={run} canSendOut={can.sendOut} canOverride={can.override} />
        </div>
      </Card>
      {/* On a phone: drops, deck, pick list; on a desk the deck stands beside the other two. */}
      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)] lg:grid-rows-[auto_1fr]">
        <Card title="Drops in order">
          <Suspense fallback={<SkeletonBlock label="Loading the drops" lines={Math.max(1, run.drops.length)} />}>
            <DropOrder run={run} canReorder={can.plan} orderHref={orderHref} />
          </Suspense>
        </Card>
        <Card title="Deck" className="lg:col-start-2 lg:row-span-2 lg:row-start-1">
          {run.drops.length > 0 ? <DeckPanel run={run} canBuild={can.load} /> : <p className="text-ink-700">No pallets to place yet.</p>}
        </Card>
        <Card title="Pick list">
          <PickList run={run} />
        </Card>
      </div>
    </div>
  );
}
