import { Link } from 'react-router-dom';
import { DELIVERY_METHOD_LABELS } from '../../../../shared/schemas/order.schema';
import type { ORDER_SORTS, OrderSummary } from '../../../../shared/schemas/order.schema';
import type { ReactNode } from 'react';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import type { ServerSorting } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/format';
import { formatMoney } from '../../../lib/format';
import { OrderStatusBadge } from './order-status';

export type OrderSort = (typeof ORDER_SORTS)[number];

/**
 * Server sorts that have a column in this table, so a header can show them. The ids of those
 * columns are the server's sort names.
 */
export const ORDERS_TABLE_SORTS = ['requested_date', 'status', 'subtotal', 'placed_at'] as const satisfies readonly OrderSort[];

const helper = dataTableColumns<OrderSummary>();
const columns = helper.columns([
  helper.accessor('reference', {
    header: 'Order',
    sortFn: 'text',
    cell: (info) => (
      <span className="block whitespace-nowrap">
        <Link to={`/orders/${info.row.original.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
          {info.getValue()}
        </Link>
        {info.row.original.po_reference ? <span className="block text-sm text-ink-600">PO {info.row.original.po_reference}</span> : null}
      </span>
    ),
  }),
  helper.accessor((row) => row.project.name, {
    id: 'site',
    header: 'Site',
    sortFn: 'text',
    cell: (info) => (
      <Link to={`/sites/${info.row.original.project.id}`} className="block min-w-36 text-ink-800 underline underline-offset-2">
        {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor((row) => `${row.branch.merchant.name} ${row.branch.name}`, {
    id: 'branch',
    header: 'Merchant',
    sortFn: 'text',
    cell: (info) => (
      <span className="block min-w-36">
        {info.row.original.branch.merchant.name}
        <span className="block text-sm text-ink-600">{info.row.original.branch.name}</span>
      </span>
    ),
  }),
  helper.accessor((row) => `${row.requested_date} ${row.time_window ?? ''}`, {
    id: 'requested_date',
    header: 'Wanted',
    sortFn: 'text',
    cell: (info) => (
      <span className="block whitespace-nowrap">
        {formatDate(info.row.original.requested_date)}
        <span className="block text-sm text-ink-600">{info.row.original.time_window ?? 'any time'}</span>
      </span>
    ),
  }),
  helper.accessor('delivery_method', { header: 'Unloading', sortFn: 'text', cell: (info) => <span className="block min-w-32 text-sm">{DELIVERY_METHOD_LABELS[info.getValue()]}</span> }),
  helper.accessor('status', { header: 'Stage', sortFn: 'text', cell: (info) => <OrderStatusBadge status={info.getValue()} /> }),
  helper.accessor('subtotal', { header: 'Subtotal', sortFn: 'alphanumeric', cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatMoney(info.getValue())}</span> }),
  helper.accessor('placed_at', { header: 'Placed', sortFn: 'text', sortDescFirst: true, cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span> }),
]);

interface OrdersTableProps {
  orders: readonly OrderSummary[];
  caption?: string;
  empty?: ReactNode;
  /** When the orders are one page of many, the server orders them and the headers only ask it to. */
  serverSorting?: ServerSorting<OrderSort>;
}

export function OrdersTable({ orders, caption = 'Orders', empty, serverSorting }: OrdersTableProps) {
  return <DataTable caption={caption} captionHidden columns={columns} data={orders} getRowId={(row) => String(row.id)} serverSorting={serverSorting} minWidthClass="min-w-[60rem]" empty={empty} />;
}
