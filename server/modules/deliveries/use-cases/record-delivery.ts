import { ORDER_TRANSITIONS, orderReference } from '../../../../shared/schemas/order.schema';
import type { AuthUser } from '../../../auth/auth-user';
import type { Db } from '../../../db/knex';
import { nowIso } from '../../../db/time';
import { AppError } from '../../../http/app-error';
import { enqueueMail } from '../../../mail/outbox';
import { renderEmail } from '../../../mail/templates';
import { lineTax } from '../../invoices/invoices.service';
import { sendOrderMail } from '../../orders/order-mail';
import { assertStage, assertTakesStep } from '../../orders/order-steps';
import type { StoredOrderLine } from '../../orders/orders.repository';
import type { DraftLine, ProofLineRow } from '../deliveries.repository';
import type { DeliveryRecord } from '../deliveries.service';
import type { ProofFile } from '../proof-files';
import { invalid, partyOf, type DeliveryContext } from './delivery-context';

/** Per line what was sent, handed over, short and damaged; every loaded line is accounted for. */
function proofLines(record: DeliveryRecord, lines: StoredOrderLine[]): ProofLineRow[] {
  const problems: { path: string; message: string }[] = [];
  const given = new Map<number, { handed_over: number; short: number | null; damaged: number }>();
  (record.lines ?? []).forEach((l, i) => {
    const line = lines.find((x) => x.id === l.line_id);
    if (!line) return problems.push({ path: `lines.${i}.line_id`, message: 'is not a line of this order' });
    if (given.has(l.line_id)) return problems.push({ path: `lines.${i}.line_id`, message: 'is given twice' });
    const sent = line.reserved_quantity;
    if (l.short === null) {
      if (l.handed_over > sent) return problems.push({ path: `lines.${i}.delivered_quantity`, message: `at most the ${sent} packs loaded` });
    } else if (l.handed_over + l.short + l.damaged !== sent) {
      return problems.push({
        path: `lines.${i}`,
        message: `${line.sku}: handed over (${l.handed_over}), short (${l.short}) and damaged (${l.damaged}) must add up to the ${sent} packs loaded`,
      });
    }
    given.set(l.line_id, l);
  });
  if (problems.length > 0) throw invalid(problems, 'Some delivered quantities are not valid');
  return lines
    .filter((l) => l.reserved_quantity > 0 || given.has(l.id))
    .map((l) => {
      const sent = l.reserved_quantity;
      const g = given.get(l.id);
      if (!g) return { order_line_id: l.id, sent, handed_over: sent, short: 0, damaged: 0 };
      return { order_line_id: l.id, sent, handed_over: g.handed_over, short: g.short ?? sent - g.handed_over - g.damaged, damaged: g.damaged };
    });
}

/** Shortages and damages at the order's prices, tax per line at the product's rate now (as an invoice would take it). */
async function draftLines(ctx: DeliveryContext, trx: Db, orgId: number, proof: ProofLineRow[], lines: StoredOrderLine[]): Promise<DraftLine[]> {
  const owed = proof.filter((p) => p.short + p.damaged > 0);
  if (owed.length === 0) return [];
  const byId = new Map(lines.map((l) => [l.id, l]));
  const rates = await ctx.repo.taxRates(
    orgId,
    owed.map((p) => byId.get(p.order_line_id)!.product_id),
    trx,
  );
  return owed.map((p) => {
    const l = byId.get(p.order_line_id)!;
    const quantity = p.short + p.damaged;
    const net = quantity * l.unit_price;
    const rate = rates.get(l.product_id) ?? 0;
    const tax = lineTax(net, rate);
    return { order_line_id: l.id, sku: l.sku, description: l.description, short: p.short, damaged: p.damaged, quantity, unit_price: l.unit_price, tax_rate_bp: rate, net, tax, total: net + tax };
  });
}

/** The outbox's name for a delivery note attached by reference. */
export const DELIVERY_NOTE_ATTACHMENT = 'delivery-note';

/**
 * Writes the delivery's e-mails to the outbox in the recording transaction: the desk's note, and the
 * contractor's with the signed delivery note attached. The PDF (with its photos) is named by
 * reference and made by the worker when it sends, from the proof this transaction records.
 */
async function mailDelivered(ctx: DeliveryContext, trx: Db, user: AuthUser, orderId: number, proof: ProofLineRow[], lines: Map<number, StoredOrderLine>, receiver: string, booked: boolean) {
  const { deps, orders } = ctx;
  const { config } = deps;
  const party = { kind: 'merchant' as const, organisationId: user.organisation.id };
  const order = (await orders.find(party, orderId, trx))!;
  const contractor = await orders.contractorEmails(order, trx);
  const desk = await orders.deskEmails(order.merchant_organisation_id, trx);
  await sendOrderMail(trx, deps, 'delivered', order, { contractor: [], desk });
  // The delivery note prints once the order is on a run; without one there is nothing to send.
  if (contractor.length === 0 || !booked) return;
  const ref = orderReference(orderId);
  const short = proof.filter((l) => l.short + l.damaged > 0);
  for (const to of contractor) {
    await enqueueMail(
      trx,
      {
        ...renderEmail({
          to,
          subject: `Order ${ref} delivered: delivery note attached`,
          heading: `Order ${ref} delivered`,
          paragraphs: [
            `The driver handed the delivery over at ${order.site_name} to ${receiver}. The signed delivery note is attached.`,
            ...(short.length > 0
              ? [`Short or damaged: ${short.map((l) => `${lines.get(l.order_line_id)?.description ?? ''} ${l.short + l.damaged} of ${l.sent}`).join('; ')}. ${order.merchant_name} will credit them.`]
              : []),
          ],
          action: { label: 'Open the order', url: `${config.appUrl}/orders/${orderId}` },
        }),
        attachments: [{ filename: `delivery-note-${ref}.pdf`, contentType: 'application/pdf', render: { kind: DELIVERY_NOTE_ATTACHMENT, organisation_id: user.organisation.id, order_id: orderId } }],
      },
      config.mailDomain,
    );
  }
}

/**
 * Records the hand-over: who took it, when and where, the signature and photos, and per line the
 * packs handed over, short and damaged. The order's hold on stock ends; what left the lorry
 * (handed over or damaged) leaves the branch's on-hand count, short packs stay in it. Shortages
 * and damages raise a draft credit note for the desk. One transaction: nothing is half-written.
 */
export async function recordDelivery(ctx: DeliveryContext, user: AuthUser, orderId: number, record: DeliveryRecord, files: ProofFile[]) {
  const { db, deps, repo, orders, slots, stock } = ctx;
  const { config } = deps;
  assertTakesStep(user, 'deliver');
  const t = ORDER_TRANSITIONS.deliver;
  await db.transaction(async (trx) => {
    const order = await orders.find(partyOf(user), orderId, trx);
    if (!order) throw AppError.notFound('Order');
    const booking = await slots.booking(orderId, trx);
    const slot = booking ? await slots.find(user.organisation.id, booking.slot_id, trx) : undefined;
    if (user.role === 'driver' && slot?.driver_user_id !== user.id) throw AppError.forbidden('Only the driver of this run records its delivery');
    assertStage(order, 'deliver');
    const lines = await orders.lines(orderId, trx);
    const proof = proofLines(record, lines);
    const byId = new Map(lines.map((l) => [l.id, l]));
    for (const p of proof) {
      const line = byId.get(p.order_line_id)!;
      const left = p.handed_over + p.damaged;
      if (!(await stock.consume(trx, order.branch_id, line.product_id, line.reserved_quantity, left))) {
        throw AppError.conflict('stock_changed', `The stock of ${line.sku} at ${order.branch_name} no longer covers this delivery; count it and try again`);
      }
      await orders.setDelivered(trx, line.id, left);
    }
    const at = record.delivered_at ?? nowIso();
    if (booking) await slots.recordDelivery(trx, orderId, { delivered_at: at, received_by: record.receiver_name, delivery_notes: record.note, recorded_by: user.id });
    if (!(await orders.updateIf(trx, orderId, { statuses: t.from }, { status: t.to }, false))) throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
    const proofId = await repo.insertProof(
      trx,
      {
        order_id: orderId,
        merchant_organisation_id: user.organisation.id,
        receiver_name: record.receiver_name,
        delivered_at: at,
        recorded_by: user.id,
        recorded_by_name: user.name,
        lat: record.position?.lat ?? null,
        lng: record.position?.lng ?? null,
        accuracy_m: record.position?.accuracy_m ?? null,
        note: record.note,
      },
      proof,
      files,
    );
    const owed = await draftLines(ctx, trx, user.organisation.id, proof, lines);
    let draftId: number | null = null;
    if (owed.length > 0) {
      const subtotal = owed.reduce((s, l) => s + l.net, 0);
      const taxTotal = owed.reduce((s, l) => s + l.tax, 0);
      draftId = await repo.insertDraft(trx, {
        merchant_organisation_id: order.merchant_organisation_id,
        contractor_organisation_id: order.contractor_organisation_id,
        order_id: orderId,
        proof_id: proofId,
        currency: config.currency,
        subtotal,
        tax_total: taxTotal,
        total: subtotal + taxTotal,
        lines: owed,
        notes: `Delivery of ${orderReference(orderId)} received by ${record.receiver_name}${record.note ? `: ${record.note}` : ''}`,
      });
    }
    const short = proof.filter((p) => p.short > 0).map((p) => `${byId.get(p.order_line_id)!.sku} ${p.short} of ${p.sent}`);
    const damaged = proof.filter((p) => p.damaged > 0).map((p) => `${byId.get(p.order_line_id)!.sku} ${p.damaged}`);
    await orders.insertEvent(trx, orderId, {
      kind: 'delivered',
      actor: { userId: user.id, name: user.name, organisationId: user.organisation.id },
      summary: `Delivered, received by ${record.receiver_name}${short.length > 0 ? `; short: ${short.join(', ')}` : ''}${damaged.length > 0 ? `; damaged: ${damaged.join(', ')}` : ''}${files.length > 0 ? `; ${files.filter((f) => f.kind === 'photo').length} photos` : ''}`,
      data: { received_by: record.receiver_name, delivered_at: at, short, damaged, proof_id: proofId, credit_note_draft_id: draftId, ...(record.note ? { notes: record.note } : {}) },
    });
    await mailDelivered(ctx, trx, user, orderId, proof, byId, record.receiver_name, !!booking);
  });
  // The order as the desk sees it (as this route always answered), with the proof beside it.
  const detail = await ctx.orderDetails.get(user, orderId);
  return { ...detail, proof: (await ctx.proofOf((await orders.find(partyOf(user), orderId))!))! };
}
