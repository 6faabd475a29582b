import { createContext, useContext, useMemo, useState } from 'react';
import type { Dispatch, SetStateAction } from 'react';
import { Link } from 'react-router-dom';
import type { z } from 'zod';
import type { estimateSummarySchema } from '../../../../shared/schemas/estimate.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDateTime } from '../../../lib/format';
import { useProjectEstimates } from '../api/get-project-estimates';
import { formatMoney } from '../../../lib/format';

type EstimateSummary = z.infer<typeof estimateSummarySchema>;

interface ProjectEstimatesProps {
  projectId: number;
  /** Whether a new estimate can be made (a schedule exists, the site is open). */
  canEstimate: boolean;
}

/** The estimates of a site, with two of the same schedule version picked to compare. */
interface PickState {
  picked: number[];
  setPicked: Dispatch<SetStateAction<number[]>>;
  estimates: readonly EstimateSummary[];
}

// The tick boxes read the picks from here, so the columns stay put and a tick keeps its focus.
const PickContext = createContext<PickState | null>(null);

function PickCell({ row }: { row: EstimateSummary }) {
  const state = useContext(PickContext);
  if (!state) throw new Error('The pick cell needs the estimates table around it');
  const { picked, setPicked, estimates } = state;
  const first = estimates.find((e) => e.id === picked[0]);
  const checked = picked.includes(row.id);
  const disabled = !checked && (picked.length >= 2 || (first !== undefined && first.schedule.id !== row.schedule.id));
  return (
    <input
      type="checkbox"
      aria-label={`Compare estimate ${row.id}`}
      checked={checked}
      disabled={disabled}
      onChange={(event) => setPicked((list) => (event.target.checked ? [...list, row.id] : list.filter((id) => id !== row.id)))}
      className="h-5 w-5 accent-clay-600"
    />
  );
}

const helper = dataTableColumns<EstimateSummary>();
const columns = helper.columns([
  helper.display({
    id: 'compare',
    header: () => <span className="sr-only">Pick to compare</span>,
    cell: (info) => <PickCell row={info.row.original} />,
  }),
  helper.accessor('id', {
    header: 'Estimate',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <Link to={`/estimates/${info.getValue()}`} className="font-semibold whitespace-nowrap text-clay-700 underline underline-offset-2">
        Estimate {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor((row) => row.system.name, {
    id: 'system',
    header: 'Roof system',
    sortFn: 'text',
    cell: (info) => (
      <span className="block min-w-48">
        {info.getValue()}
        <span className="block text-sm text-ink-600">{info.row.original.system.branch ? `${info.row.original.system.branch.merchant.name}, ${info.row.original.system.branch.name}` : 'Generic, typed in'}</span>
      </span>
    ),
  }),
  helper.accessor((row) => row.schedule.version, { id: 'schedule', header: 'Schedule', sortFn: 'alphanumeric', cell: (info) => `v${info.getValue()}` }),
  helper.accessor((row) => row.totals.subtotal ?? -1, {
    id: 'subtotal',
    header: 'Subtotal',
    sortFn: 'alphanumeric',
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatMoney(info.row.original.totals.subtotal)}</span>,
  }),
  helper.accessor((row) => row.totals.weight_kg, {
    id: 'weight',
    header: 'Weight',
    sortFn: 'alphanumeric',
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{(info.getValue() / 1000).toLocaleString('en-GB', { maximumFractionDigits: 1 })} t</span>,
  }),
  helper.accessor((row) => row.totals.pallets, { id: 'pallets', header: 'Pallets', sortFn: 'alphanumeric' }),
  helper.accessor('created_at', { header: 'Made', sortFn: 'text', cell: (info) => <span className="whitespace-nowrap">{formatDateTime(info.getValue())}</span> }),
]);

export function ProjectEstimates({ projectId, canEstimate }: ProjectEstimatesProps) {
  const estimates = useProjectEstimates(projectId);
  const [picked, setPicked] = useState<number[]>([]);
  const pickState = useMemo(() => ({ picked, setPicked, estimates: estimates.data ?? [] }), [picked, estimates.data]);

  return (
    <Card
      title="Estimates"
      actions={
        canEstimate ? (
          <Link to={`/sites/${projectId}/estimates/new`} className={buttonClasses('primary')}>
            New estimate
          </Link>
        ) : null
      }
    >
      {estimates.isPending ? (
        <SkeletonBlock label="Loading the estimates" lines={3} />
      ) : estimates.isError ? (
        <ErrorAlert error={estimates.error} title="The estimates could not be loaded" onRetry={() => void estimates.refetch()} />
      ) : estimates.data.length === 0 ? (
        <EmptyState title="No estimates yet">{canEstimate ? 'Make one from a merchant’s roof system or a generic one.' : 'Import the roof schedule first.'}</EmptyState>
      ) : (
        <div className="space-y-3">
          <PickContext.Provider value={pickState}>
            <DataTable
              caption="Estimates of this site"
              captionHidden
              columns={columns}
              data={estimates.data}
              getRowId={(row) => String(row.id)}
              initialSorting={[{ id: 'id', desc: true }]}
              minWidthClass="min-w-[48rem]"
            />
          </PickContext.Provider>
          <div className="flex flex-wrap items-center gap-3">
            {picked.length === 2 ? (
              <Link to={`/estimates/compare?a=${picked[0]}&b=${picked[1]}`} className={buttonClasses('secondary')}>
                Compare estimates {picked[0]} and {picked[1]}
              </Link>
            ) : (
              <p className="text-sm text-ink-600">Tick two estimates of the same schedule version to compare them side by side.</p>
            )}
          </div>
        </div>
      )}
    </Card>
  );
}
