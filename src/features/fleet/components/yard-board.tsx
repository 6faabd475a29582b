import { useState } from 'react';
import { Card } from '../../../components/ui/card';
import { BranchSelect } from '../../../components/ui/branch-select';
import { ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useYardBranches } from '../api/get-yard-branches';
import { LorriesTable } from './lorries-table';
import { SlotCalendar } from './slot-calendar';

/**
 * The dispatcher's board: one branch at a time, its slot calendar and its lorries.
 * `canManage` is `can(role, 'fleet:manage')`; it defaults to true because only the dispatcher's
 * home shows the board, and the server checks the action again on every change.
 */
export function YardBoard({ canManage = true }: { canManage?: boolean }) {
  const branches = useYardBranches();
  const [chosen, setChosen] = useState<number | null>(null);
  if (branches.isPending) return <SkeletonBlock label="Loading the branches" lines={3} />;
  if (branches.isError) return <ErrorAlert error={branches.error} title="The branches could not be loaded" onRetry={() => void branches.refetch()} />;
  const current = chosen ?? branches.data[0]?.id ?? null;
  if (current === null) return <p>No branches yet.</p>;
  return (
    <div className="space-y-6">
      <BranchSelect branches={branches.data} value={current} onChange={setChosen} />
      <Card title="Delivery slots">
        <SlotCalendar key={current} branchId={current} canManage={canManage} />
      </Card>
      <Card title="Lorries">
        <LorriesTable key={current} branchId={current} canManage={canManage} />
      </Card>
    </div>
  );
}
