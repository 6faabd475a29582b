import { formatMoney } from '../../../shared/domain/money';
import { DELIVERY_METHOD_LABELS, orderReference } from '../../../shared/schemas/order.schema';
import type { AppDeps } from '../../app-deps';
import type { Db } from '../../db/knex';
import { enqueueMail } from '../../mail/outbox';
import { renderEmail } from '../../mail/templates';
import type { OrderRow } from './orders.repository';

export type OrderMailEvent =
  'placed' | 'amended' | 'cancelled' | 'changes_offered' | 'changes_accepted' | 'changes_declined' | 'confirmed' | 'turned_down' | 'slot_booked' | 'dispatched' | 'delivered' | 'follow_up_started' | 'commented';

/** The booked delivery, for the e-mails that name it. */
export interface MailSlot {
  date: string;
  time_window: string;
  registration: string;
}

interface Letter {
  subject: string;
  heading: string;
  paragraphs: string[];
}

/** A comment quoted in the letter, cut short if long (the whole of it is on the order). */
const quote = (text = '') => `“${text.length > 600 ? `${text.slice(0, 597)}…` : text}”`;
const when = (o: OrderRow) => `${o.requested_date}${o.time_window ? `, ${o.time_window}` : ''}`;

/** What each side is told at each step; the desk hears of what the contractor does and the other way round. */
function letters(event: OrderMailEvent, o: OrderRow, currency: string, note?: string, slot?: MailSlot, actor?: 'contractor' | 'merchant'): { contractor?: Letter; desk?: Letter } {
  const money = (minor: number) => formatMoney(minor, currency);
  const ref = orderReference(o.id);
  const place = `${o.branch_name} (${o.merchant_name})`;
  const delivery = `${DELIVERY_METHOD_LABELS[o.delivery_method]} at ${o.site_name} on ${when(o)}.`;
  const noted = note ? [`Note: ${note}`] : [];
  const booked = slot ? `Delivery booked for ${slot.date}, ${slot.time_window}, on lorry ${slot.registration}.` : 'The delivery slot will follow; you will hear when it is booked.';
  switch (event) {
    case 'placed':
      return {
        contractor: {
          subject: `Order ${ref} sent to ${o.branch_name}`,
          heading: `Order ${ref} is with ${o.branch_name}`,
          paragraphs: [`Your order of ${o.line_count} lines (${money(o.subtotal)} before tax) went to ${place}.`, delivery, 'You will hear from us when the merchant confirms it or offers changes.'],
        },
        desk: {
          subject: `New order ${ref} from ${o.contractor_name}`,
          heading: `New order for ${o.branch_name}`,
          paragraphs: [`${o.contractor_name} sent order ${ref}: ${o.line_count} lines, ${money(o.subtotal)} before tax.`, delivery, ...(o.po_reference ? [`Their reference: ${o.po_reference}.`] : [])],
        },
      };
    case 'amended':
      return {
        contractor: { subject: `Order ${ref} changed`, heading: `Order ${ref} changed`, paragraphs: [`Your changes went to ${place}.`, delivery] },
        desk: { subject: `Order ${ref} changed by ${o.contractor_name}`, heading: `Order ${ref} changed`, paragraphs: [`${o.contractor_name} changed order ${ref}; check it again before confirming.`, delivery] },
      };
    case 'cancelled':
      return {
        contractor: { subject: `Order ${ref} cancelled`, heading: `Order ${ref} cancelled`, paragraphs: [`The order to ${place} is cancelled.`, ...noted] },
        desk: { subject: `Order ${ref} cancelled by ${o.contractor_name}`, heading: `Order ${ref} cancelled`, paragraphs: [`${o.contractor_name} cancelled order ${ref}.`, ...noted] },
      };
    case 'changes_offered':
      return {
        contractor: {
          subject: `${o.branch_name} offers changes to order ${ref}`,
          heading: `Changes offered on order ${ref}`,
          paragraphs: [`${place} answered your order with changes (quantities, substitutes or the delivery day). Accept or decline them in Ridgeload.`, ...noted],
        },
      };
    case 'changes_accepted':
      return {
        contractor: { subject: `You accepted the changes to order ${ref}`, heading: `Changes accepted on order ${ref}`, paragraphs: [`${place} will now confirm the order.`, delivery] },
        desk: { subject: `${o.contractor_name} accepted your changes to order ${ref}`, heading: `Changes accepted on order ${ref}`, paragraphs: ['The order is ready to confirm.', delivery] },
      };
    case 'changes_declined':
      return {
        contractor: { subject: `You declined the changes to order ${ref}`, heading: `Changes declined on order ${ref}`, paragraphs: [`${place} has been told and will answer again.`, ...noted] },
        desk: { subject: `${o.contractor_name} declined your changes to order ${ref}`, heading: `Changes declined on order ${ref}`, paragraphs: ['The order stands as it was sent.', ...noted] },
      };
    case 'confirmed':
      return {
        contractor: {
          subject: `Order ${ref} confirmed by ${o.branch_name}`,
          heading: `Order ${ref} is confirmed`,
          paragraphs: [`${place} confirmed your order and holds the stock for it (${money(o.subtotal)} before tax). Any back-ordered packs are listed on the order.`, booked],
        },
      };
    case 'turned_down':
      return {
        contractor: {
          subject: `${o.branch_name} cannot supply order ${ref}`,
          heading: `Order ${ref} turned down`,
          paragraphs: [`${place} cannot supply this order.`, ...noted, 'You can send the estimate to another branch or ask for quotes.'],
        },
      };
    case 'slot_booked':
      return { contractor: { subject: `Delivery booked for order ${ref}`, heading: `Delivery booked for order ${ref}`, paragraphs: [booked, delivery] } };
    case 'dispatched':
      return {
        contractor: {
          subject: `Order ${ref} is out for delivery`,
          heading: `Order ${ref} is on its way`,
          paragraphs: [`The lorry has left ${o.branch_name}. ${booked}`, `Have someone at ${o.site_name} to take the delivery and keep the set-down place clear.`],
        },
      };
    case 'follow_up_started':
      return {
        contractor: {
          subject: `Back-ordered packs follow as order ${ref}`,
          heading: `Your back-ordered packs are on their way to being sent`,
          paragraphs: [
            `${place} has started the delivery of the packs it back-ordered${o.follows_order_id ? ` on order ${orderReference(o.follows_order_id)}` : ''}: order ${ref}, ${o.line_count} lines (${money(o.subtotal)} before tax, at the prices already agreed).`,
            delivery,
            ...noted,
            'You will hear again when it is confirmed against stock and booked onto a lorry.',
          ],
        },
      };
    case 'commented':
      return {
        ...(actor === 'merchant'
          ? { contractor: { subject: `${o.branch_name} commented on order ${ref}`, heading: `A comment on order ${ref}`, paragraphs: [`${place} wrote:`, quote(note)] } }
          : { desk: { subject: `${o.contractor_name} commented on order ${ref}`, heading: `A comment on order ${ref}`, paragraphs: [`${o.contractor_name} wrote:`, quote(note)] } }),
      };
    case 'delivered':
      return {
        contractor: { subject: `Order ${ref} delivered`, heading: `Order ${ref} delivered`, paragraphs: [`The driver recorded the delivery at ${o.site_name}. Any shortage is shown on the order.`] },
        desk: { subject: `Order ${ref} delivered to ${o.contractor_name}`, heading: `Order ${ref} delivered`, paragraphs: ['The delivery is recorded: the order can be invoiced.'] },
      };
  }
}

/**
 * Writes an order's e-mails to the outbox in `trx`, the transaction of the change they report, so they
 * are sent exactly when the change is committed (the outbox's worker sends them).
 */
export async function sendOrderMail(
  trx: Db,
  { config }: Pick<AppDeps, 'config'>,
  event: OrderMailEvent,
  order: OrderRow,
  to: { contractor: string[]; desk: string[] },
  note?: string,
  slot?: MailSlot,
  /** Who took the step, where the letter depends on it (a comment goes to the other side). */
  actor?: 'contractor' | 'merchant',
): Promise<void> {
  const content = letters(event, order, config.currency, note, slot, actor);
  const url = `${config.appUrl}/orders/${order.id}`;
  for (const [side, letter] of [
    ['contractor', content.contractor],
    ['desk', content.desk],
  ] as const) {
    if (!letter) continue;
    for (const address of to[side]) {
      await enqueueMail(
        trx,
        renderEmail({ to: address, ...letter, action: { label: 'Open the order', url }, footnote: 'Figures are estimates; check them against the tile maker’s fixing specification.' }),
        config.mailDomain,
      );
    }
  }
}
