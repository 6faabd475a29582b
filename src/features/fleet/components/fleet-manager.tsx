import { lazy, Suspense, useState } from 'react';
import type { Lorry } from '../../../../shared/schemas/fleet.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { BranchSelect } from '../../../components/ui/branch-select';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useLorries } from '../api/get-lorries';
import { useYardBranches } from '../api/get-yard-branches';
import { ArchiveLorry } from './archive-lorry';
import { ArchivedLorries } from './archived-lorries';
import { SlotCalendar } from './slot-calendar';

// The forms (with the form library) load after the lorries and the calendar show (DEVELOPERS.md, decision 37).
const LorryForm = lazy(() => import('./lorry-form').then((m) => ({ default: m.LorryForm })));
const CreateSlotForm = lazy(() => import('./slot-forms').then((m) => ({ default: m.CreateSlotForm })));
const GenerateSlotsForm = lazy(() => import('./slot-forms').then((m) => ({ default: m.GenerateSlotsForm })));

const formLoading = <SkeletonBlock label="Loading the form" lines={3} />;

function LorryRow({ branchId, lorry, canManage }: { branchId: number; lorry: Lorry; canManage: boolean }) {
  const [editing, setEditing] = useState(false);
  return (
    <li className="py-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <span>
          <span className="font-mono font-semibold">{lorry.registration}</span>
          {lorry.name ? ` · ${lorry.name}` : ''}
          <span className="block text-sm text-ink-600 tabular-nums">
            {lorry.payload_kg.toLocaleString('en-GB')} kg · {lorry.pallet_slots} pallet slots · {lorry.has_crane ? `crane lifts ${(lorry.crane_max_kg ?? 0).toLocaleString('en-GB')} kg` : 'no crane'}
          </span>
        </span>
        {canManage ? (
          <div className="flex flex-wrap items-start gap-2">
            <Button variant="secondary" onClick={() => setEditing((v) => !v)} aria-expanded={editing}>
              {editing ? 'Close' : `Change ${lorry.registration}`}
            </Button>
            {editing ? null : <ArchiveLorry lorry={lorry} />}
          </div>
        ) : null}
      </div>
      {editing && canManage ? (
        <div className="mt-4">
          <Suspense fallback={formLoading}>
            <LorryForm branchId={branchId} lorry={lorry} onDone={() => setEditing(false)} />
          </Suspense>
        </div>
      ) : null}
    </li>
  );
}

function BranchFleet({ branchId, canManage }: { branchId: number; canManage: boolean }) {
  const lorries = useLorries(branchId);
  if (lorries.isPending) return <SkeletonBlock label="Loading the lorries" lines={3} />;
  if (lorries.isError) return <ErrorAlert error={lorries.error} title="The lorries could not be loaded" onRetry={() => void lorries.refetch()} />;
  const active = lorries.data.lorries.filter((l) => l.archived_at === null);
  return (
    <div className="space-y-6">
      <Card title="Lorries">
        {active.length === 0 ? (
          <EmptyState title="No lorries yet">{canManage ? 'Add the branch’s first lorry below; slots need a lorry.' : 'The branch has no lorries in service.'}</EmptyState>
        ) : (
          <ul className="divide-y divide-mortar-200">
            {active.map((l) => (
              <LorryRow key={l.id} branchId={branchId} lorry={l} canManage={canManage} />
            ))}
          </ul>
        )}
        <div className="mt-4 border-t border-mortar-200 pt-3">
          <ArchivedLorries branchId={branchId} canManage={canManage} />
        </div>
      </Card>
      <Card title="Slot calendar">
        <SlotCalendar branchId={branchId} canManage={canManage} />
      </Card>
      {canManage ? (
        <Card title="Add a lorry">
          <Suspense fallback={formLoading}>
            <LorryForm branchId={branchId} />
          </Suspense>
        </Card>
      ) : null}
      {canManage && active.length ? (
        <>
          <Card title="Make slots for a run of days">
            <Suspense fallback={formLoading}>
              <GenerateSlotsForm branchId={branchId} lorries={active} />
            </Suspense>
          </Card>
          <Card title="Add one slot">
            <Suspense fallback={formLoading}>
              <CreateSlotForm branchId={branchId} lorries={active} />
            </Suspense>
          </Card>
        </>
      ) : null}
    </div>
  );
}

/**
 * The dispatcher's fleet page: one branch at a time, its lorries and the slots they offer.
 * `canManage` is `can(role, 'fleet:manage')`; it defaults to true because the page's route is
 * guarded by that action, and the server checks it again on every change.
 */
export function FleetManager({ canManage = true }: { canManage?: boolean }) {
  const branches = useYardBranches();
  const [chosen, setChosen] = useState<number | null>(null);
  if (branches.isPending) return <SkeletonBlock label="Loading the branches" lines={3} />;
  if (branches.isError) return <ErrorAlert error={branches.error} title="The branches could not be loaded" onRetry={() => void branches.refetch()} />;
  const current = chosen ?? branches.data[0]?.id ?? null;
  if (current === null) return <EmptyState title="No branches yet">Add a branch first; lorries belong to a branch.</EmptyState>;
  return (
    <div className="space-y-6">
      <BranchSelect branches={branches.data} value={current} onChange={setChosen} />
      <BranchFleet key={current} branchId={current} canManage={canManage} />
    </div>
  );
}
