import type { Lorry } from '../../../../shared/schemas/fleet.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useLorries } from '../api/get-lorries';
import { ArchiveLorry } from './archive-lorry';
import { ArchivedLorries } from './archived-lorries';

const h = dataTableColumns<Lorry>();
const columns = h.columns([
  h.accessor('registration', { header: 'Registration', sortFn: 'text', cell: (info) => <span className="font-mono font-semibold">{info.getValue()}</span> }),
  h.accessor('name', { header: 'Lorry', sortFn: 'text' }),
  h.accessor('payload_kg', { header: 'Payload', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue().toLocaleString('en-GB')} kg</span> }),
  h.accessor('pallet_slots', { header: 'Pallet slots', sortFn: 'alphanumeric', cell: (info) => <span className="tabular-nums">{info.getValue()}</span> }),
  h.accessor((row) => row.crane_max_kg ?? 0, {
    id: 'crane',
    header: 'Crane',
    sortFn: 'alphanumeric',
    cell: (info) => (info.row.original.has_crane ? <span className="tabular-nums">lifts {info.getValue().toLocaleString('en-GB')} kg</span> : 'none'),
  }),
]);
const managedColumns = h.columns([...columns, h.display({ id: 'actions', header: 'Actions', cell: (info) => <ArchiveLorry lorry={info.row.original} /> })]);

/** A branch's lorries in service; with `canManage` (fleet:manage) each can be archived from its row. */
export function LorriesTable({ branchId, canManage }: { branchId: number; canManage: boolean }) {
  const lorries = useLorries(branchId);
  if (lorries.isPending) return <SkeletonBlock label="Loading the lorries" lines={3} />;
  if (lorries.isError) return <ErrorAlert error={lorries.error} title="The lorries could not be loaded" onRetry={() => void lorries.refetch()} />;
  return (
    <div className="space-y-4">
      <DataTable
        caption="Lorries"
        captionHidden
        columns={canManage ? managedColumns : columns}
        data={lorries.data.lorries.filter((l) => l.archived_at === null)}
        getRowId={(l) => String(l.id)}
        minWidthClass={canManage ? 'min-w-[44rem]' : 'min-w-[36rem]'}
      />
      <ArchivedLorries branchId={branchId} canManage={canManage} />
    </div>
  );
}
