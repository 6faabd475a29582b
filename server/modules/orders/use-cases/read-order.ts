import { can } from '../../../../shared/domain/policy';
import { lineAmounts, orderAmounts } from '../../../../shared/domain/order-amounts';
import { ORDER_STATUS_LABELS, allowedOrderActions, orderReference, stepAllowed, type Order, type OrderDetail, type OrderStatus, type OrderSummary } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { orderCautions } from '../../estimates/cautions';
import type { OrderRow } from '../orders.repository';
import { partyOf, type OrderContext } from './order-context';

/** An order as one row of the book. */
export function orderSummary(o: OrderRow): OrderSummary {
  return {
    id: o.id,
    reference: orderReference(o.id),
    status: o.status,
    status_label: ORDER_STATUS_LABELS[o.status],
    revision: o.revision,
    contractor: { id: o.contractor_organisation_id, name: o.contractor_name },
    branch: { id: o.branch_id, name: o.branch_name, town: o.branch_town, merchant: { id: o.merchant_organisation_id, name: o.merchant_name } },
    project: { id: o.project_id, name: o.site_name },
    requested_date: o.requested_date,
    time_window: o.time_window,
    delivery_method: o.delivery_method,
    po_reference: o.po_reference,
    subtotal: o.subtotal,
    line_count: o.line_count,
    placed_at: o.placed_at,
    updated_at: o.updated_at,
  };
}

/** An order as the caller's side sees it, with the steps the caller may take on it now. */
export async function readOrder(ctx: OrderContext, user: AuthUser, id: number): Promise<OrderDetail> {
  const { orders, slots } = ctx;
  const party = partyOf(user);
  const order = await orders.find(party, id);
  if (!order) throw AppError.notFound('Order');
  const [lines, proposals, timeline, comments, booking, invoice, followUp, follows] = await Promise.all([
    orders.lines(id),
    orders.proposals(id),
    orders.events(id),
    orders.comments(id),
    slots.booking(id),
    orders.invoiceOf(id),
    orders.followUpOf(id),
    order.follows_order_id ? orders.find(party, order.follows_order_id) : Promise.resolve(undefined),
  ]);
  const backOrdered = lines.reduce((sum, l) => sum + l.back_order_quantity, 0);
  const pricedLines = lines.map((l) => ({ ...l, ...lineAmounts(l, order.status) }));
  const slot = booking ? await slots.slot(order.merchant_organisation_id, booking.slot_id) : undefined;
  const detail: Order = {
    ...orderSummary(order),
    estimate_id: party.kind === 'contractor' ? order.estimate_id : null,
    quote_id: order.quote_id,
    notes: order.notes,
    site: order.site,
    lines,
    proposals,
    timeline,
    allowed_actions: allowedOrderActions(order.status, party.kind, user.role),
    cautions: orderCautions(order.delivery_method, order.site),
    confirmed_at: order.confirmed_at,
    cancelled_at: order.cancelled_at,
  };
  // Steps beyond the stage changes: booking the lorry once confirmed, invoicing once goods are promised.
  if (party.kind === 'merchant') {
    if (stepAllowed('book_slot', order.status, party.kind, user.role)) detail.allowed_actions.push('book_slot');
    if (['confirmed', 'on_the_road', 'delivered'].includes(order.status) && !invoice && can(user.role, 'invoices:issue')) detail.allowed_actions.push('issue_invoice');
    if (stepAllowed('start_follow_up', order.status, party.kind, user.role) && backOrdered > 0 && !followUp) detail.allowed_actions.push('start_follow_up');
  }
  const link = (o: { id: number; status: OrderStatus }) => ({ id: o.id, reference: orderReference(o.id), status: o.status, status_label: ORDER_STATUS_LABELS[o.status] });
  return {
    ...detail,
    lines: pricedLines,
    amounts: orderAmounts(pricedLines),
    slot:
      booking && slot
        ? {
            slot_id: slot.id,
            date: slot.date,
            time_window: slot.time_window,
            lorry: { id: slot.lorry_id, registration: slot.registration, has_crane: slot.has_crane },
            driver: slot.driver_user_id ? { id: slot.driver_user_id, name: slot.driver_name ?? '' } : null,
            weight_kg: booking.weight_kg,
            pallets: booking.pallets,
            booked_at: booking.booked_at,
          }
        : null,
    delivery: booking?.delivered_at
      ? {
          delivered_at: booking.delivered_at,
          received_by: booking.received_by ?? '',
          notes: booking.delivery_notes ?? '',
          recorded_by: booking.recorded_by ? { id: booking.recorded_by, name: booking.recorded_by_name ?? '' } : null,
        }
      : null,
    comments: comments.map(({ organisationKind: _kind, ...c }) => c),
    invoice,
    follows: follows ? link(follows) : null,
    followed_by: followUp ? link(followUp) : null,
    back_ordered_packs: backOrdered,
  };
}
