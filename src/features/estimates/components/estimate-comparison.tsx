import { Link } from 'react-router-dom';
import type { EstimateComparison as Comparison } from '../../../../shared/schemas/estimate.schema';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { formatQuantity } from '../lib/bill';
import { formatMoney } from '../../../lib/format';

type Row = Comparison['rows'][number];
type Side = NonNullable<Row['a']>;

function SideCell({ side }: { side: Side | null }) {
  if (!side) return <span className="text-ink-500">Not in this estimate</span>;
  return (
    <span className="block min-w-48">
      <span className="block">{side.description}</span>
      <span className="block text-sm tabular-nums text-ink-700">
        {formatQuantity(side.quantity, side.unit)} · {side.packs.toLocaleString('en-GB')} packs · <span className="font-semibold">{formatMoney(side.total)}</span>
      </span>
    </span>
  );
}

function signedMoney(minor: number | null): string {
  if (minor === null) return '—';
  return `${minor > 0 ? '+' : minor < 0 ? '−' : '±'}${formatMoney(Math.abs(minor))}`;
}

const helper = dataTableColumns<Row>();
const columns = helper.columns([
  helper.accessor('label', { header: 'Category', sortFn: 'text', cell: (info) => <span className="font-semibold">{info.getValue()}</span> }),
  helper.display({ id: 'a', header: 'Estimate A', cell: (info) => <SideCell side={info.row.original.a} /> }),
  helper.display({ id: 'b', header: 'Estimate B', cell: (info) => <SideCell side={info.row.original.b} /> }),
  helper.accessor((row) => (row.a?.total !== null && row.a?.total !== undefined && row.b?.total !== null && row.b?.total !== undefined ? row.b.total - row.a.total : null), {
    id: 'difference',
    header: 'B − A',
    sortFn: 'alphanumeric',
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{signedMoney(info.getValue())}</span>,
  }),
]);

function Headline({ label, estimate }: { label: string; estimate: Comparison['estimates'][number] }) {
  return (
    <div className="rounded-md border border-mortar-300 bg-white p-4">
      <p className="text-sm font-semibold text-ink-600">{label}</p>
      <Link to={`/estimates/${estimate.id}`} className="text-lg font-semibold text-clay-700 underline underline-offset-2">
        Estimate {estimate.id}
      </Link>
      <p>{estimate.system.name}</p>
      <p className="text-sm text-ink-600">{estimate.system.branch ? `${estimate.system.branch.merchant.name}, ${estimate.system.branch.name}` : 'Generic system'}</p>
      <dl className="mt-3 grid grid-cols-3 gap-2 text-sm">
        <div>
          <dt className="text-ink-600">Subtotal</dt>
          <dd className="font-bold tabular-nums">{formatMoney(estimate.totals.subtotal)}</dd>
        </div>
        <div>
          <dt className="text-ink-600">Weight</dt>
          <dd className="font-bold tabular-nums">{(estimate.totals.weight_kg / 1000).toLocaleString('en-GB', { maximumFractionDigits: 1 })} t</dd>
        </div>
        <div>
          <dt className="text-ink-600">Pallets</dt>
          <dd className="font-bold tabular-nums">{estimate.totals.pallets}</dd>
        </div>
      </dl>
    </div>
  );
}

/** Two estimates of one schedule version side by side: what each needs, what it weighs and costs. */
export function EstimateComparison({ comparison }: { comparison: Comparison }) {
  const [a, b] = comparison.estimates;
  const d = comparison.difference;
  return (
    <div className="space-y-6">
      <div className="grid gap-4 md:grid-cols-2">
        <Headline label="A" estimate={a} />
        <Headline label="B" estimate={b} />
      </div>
      <Card title={`Difference, B − A (schedule version ${comparison.schedule.version})`}>
        <dl className="grid grid-cols-3 gap-3">
          <div>
            <dt className="text-sm text-ink-600">Price</dt>
            <dd className="text-xl font-bold tabular-nums">{signedMoney(d.subtotal)}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-600">Weight</dt>
            <dd className="text-xl font-bold tabular-nums">
              {d.weight_kg > 0 ? '+' : d.weight_kg < 0 ? '−' : '±'}
              {Math.abs(d.weight_kg).toLocaleString('en-GB', { maximumFractionDigits: 1 })} kg
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-600">Pallets</dt>
            <dd className="text-xl font-bold tabular-nums">
              {d.pallets > 0 ? '+' : d.pallets < 0 ? '−' : '±'}
              {Math.abs(d.pallets)}
            </dd>
          </div>
        </dl>
      </Card>
      <DataTable caption="The two bills by category" columns={columns} data={comparison.rows} getRowId={(row) => row.category} minWidthClass="min-w-[52rem]" />
    </div>
  );
}
