import { useState } from 'react';
import type { Lorry } from '../../../../shared/schemas/fleet.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { BranchSelect } from '../../../components/ui/branch-select';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useLorries } from '../api/get-lorries';
import { useYardBranches } from '../api/get-yard-branches';
import { LorryForm } from './lorry-form';
import { CreateSlotForm, GenerateSlotsForm } from './slot-forms';

function LorryRow({ branchId, lorry }: { branchId: number; lorry: Lorry }) {
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
        <Button variant="secondary" onClick={() => setEditing((v) => !v)} aria-expanded={editing}>
          {editing ? 'Close' : `Change ${lorry.registration}`}
        </Button>
      </div>
      {editing ? (
        <div className="mt-4">
          <LorryForm branchId={branchId} lorry={lorry} onDone={() => setEditing(false)} />
        </div>
      ) : null}
    </li>
  );
}

function BranchFleet({ branchId }: { branchId: number }) {
  const lorries = useLorries(branchId);
  if (lorries.isPending) return <SkeletonBlock label="Loading the lorries" lines={3} />;
  if (lorries.isError) return <ErrorAlert error={lorries.error} title="The lorries could not be loaded" onRetry={() => void lorries.refetch()} />;
  const active = lorries.data.lorries.filter((l) => l.archived_at === null);
  return (
    <div className="space-y-6">
      <Card title="Lorries">
        {active.length === 0 ? (
          <EmptyState title="No lorries yet">Add the branch&rsquo;s first lorry below; slots need a lorry.</EmptyState>
        ) : (
          <ul className="divide-y divide-mortar-200">
            {active.map((l) => (
              <LorryRow key={l.id} branchId={branchId} lorry={l} />
            ))}
          </ul>
        )}
      </Card>
      <Card title="Add a lorry">
        <LorryForm branchId={branchId} />
      </Card>
      {active.length ? (
        <>
          <Card title="Make slots for a run of days">
            <GenerateSlotsForm branchId={branchId} lorries={active} />
          </Card>
          <Card title="Add one slot">
            <CreateSlotForm branchId={branchId} lorries={active} />
          </Card>
        </>
      ) : null}
    </div>
  );
}

/** The dispatcher's fleet page: one branch at a time, its lorries and the slots they offer. */
export function FleetManager() {
  const branches = useYardBranches();
  const [chosen, setChosen] = useState<number | null>(null);
  if (branches.isPending) return <SkeletonBlock label="Loading the branches" lines={3} />;
  if (branches.isError) return <ErrorAlert error={branches.error} title="The branches could not be loaded" onRetry={() => void branches.refetch()} />;
  const current = chosen ?? branches.data[0]?.id ?? null;
  if (current === null) return <EmptyState title="No branches yet">Add a branch first; lorries belong to a branch.</EmptyState>;
  return (
    <div className="space-y-6">
      <BranchSelect branches={branches.data} value={current} onChange={setChosen} />
      <BranchFleet key={current} branchId={current} />
    </div>
  );
}
