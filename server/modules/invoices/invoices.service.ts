import type { z } from 'zod';
import { INVOICE_STATUS_LABELS, creditNoteNumber, invoiceNumber, type Invoice, type InvoiceStatus, type InvoiceSummary, type creditNoteBodySchema } from '../../../shared/schemas/invoice.schema';
import { orderReference } from '../../../shared/schemas/order.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { addDays } from '../../../shared/domain/business-calendar';
import type { Db } from '../../db/knex';
import { AppError } from '../../http/app-error';
import { enqueueMail } from '../../mail/outbox';
import { renderEmail } from '../../mail/templates';
import { ordersRepository, type OrderRow } from '../orders/orders.repository';
import { toPayment, type PaymentsService } from '../payments/payments.service';
import { formatMoney } from '../../../shared/domain/money';
import { invoiceHtml, invoiceXlsx } from './invoice-documents';
import { invoicesRepository, type InvoiceParty, type InvoiceRow, type NewInvoiceLine } from './invoices.repository';

type CreditBody = z.output<typeof creditNoteBodySchema>;

const partyOf = (user: AuthUser): InvoiceParty => ({ kind: user.organisation.kind, organisationId: user.organisation.id });

/** Tax of one line, rounded to the minor unit (half up) per line. */
export const lineTax = (net: number, rateBp: number) => Math.round((net * rateBp) / 10_000);

function statusOf(r: Pick<InvoiceRow, 'total' | 'credited' | 'paid'>): InvoiceStatus {
  const due = r.total - r.credited;
  if (due <= 0 && r.total > 0) return 'credited';
  if (r.paid >= due) return 'paid';
  return r.paid > 0 ? 'part_paid' : 'unpaid';
}

function summaryOf(r: InvoiceRow, today: string): InvoiceSummary {
  const status = statusOf(r);
  const balance = Math.max(0, r.total - r.credited - r.paid);
  return {
    id: r.id,
    number: invoiceNumber(r.number),
    status,
    status_label: INVOICE_STATUS_LABELS[status],
    order: { id: r.order_id, reference: orderReference(r.order_id) },
    contractor: { id: r.contractor_organisation_id, name: r.contractor_name },
    branch: { id: r.branch_id, name: r.branch_name, town: r.branch_town, merchant: { id: r.merchant_organisation_id, name: r.merchant_name } },
    currency: r.currency,
    issue_date: r.issue_date,
    due_date: r.due_date,
    pay_by: r.pay_by,
    subtotal: r.subtotal,
    tax_total: r.tax_total,
    total: r.total,
    credited: r.credited,
    paid: r.paid,
    balance,
    overdue: Boolean(r.due_date && r.due_date < today && balance > 0),
  };
}

/**
 * Invoices from what was delivered (or confirmed, before delivery), numbered per merchant without
 * gaps; credit notes for shortages, damages and returns, refunding a card payment where one covered
 * the credited amount; account terms per contractor.
 */
export function invoicesService(deps: Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>, payments: PaymentsService) {
  const { db, config } = deps;
  const invoices = invoicesRepository(db);
  const orders = ordersRepository(db);

  async function get(user: AuthUser, id: number): Promise<Invoice> {
    const row = await invoices.find(partyOf(user), id);
    if (!row) throw AppError.notFound('Invoice');
    const [lines, notes, pays, card] = await Promise.all([
      invoices.lines(id),
      invoices.creditNotes(id),
      invoices.payments(id),
      row.pay_by === 'card' ? Promise.resolve(true) : invoices.cardAllowed(row.merchant_organisation_id, row.contractor_organisation_id),
    ]);
    return {
      ...summaryOf(row, config.calendar.today()),
      card_payment: card,
      basis: row.basis,
      site_name: row.site_name,
      po_reference: row.po_reference,
      lines: lines.map(({ credited_net: _n, credited_tax: _t, invoice_id: _i, ...l }) => l),
      credit_notes: notes.map((n) => ({
        id: n.id,
        number: creditNoteNumber(n.number),
        invoice_id: n.invoice_id,
        reason: n.reason,
        notes: n.notes,
        subtotal: n.subtotal,
        tax_total: n.tax_total,
        total: n.total,
        lines: n.lines.map((l: Record<string, unknown>) => ({
          invoice_line_id: l.invoice_line_id as number,
          sku: l.sku as string,
          description: l.description as string,
          quantity: l.quantity as number,
          unit_price: l.unit_price as number,
          tax_rate_bp: l.tax_rate_bp as number,
          net: l.net as number,
          tax: l.tax as number,
          total: l.total as number,
        })),
        refund: n.refund_status ? { status: n.refund_status, amount: n.refund_amount, last_error: n.refund_error ?? null } : null,
        created_at: n.created_at,
      })),
      payments: pays.map(toPayment),
      created_at: row.created_at,
    };
  }

  /** Writes the new invoice's e-mail to the outbox in the issuing transaction. */
  async function mailIssued(trx: Db, order: OrderRow, inv: { id: number; number: string; total: number; tax_total: number; pay_by: 'card' | 'account'; due_date: string | null }) {
    const to = await orders.contractorEmails(order, trx);
    const pay = inv.pay_by === 'account' ? `Payment is due by ${inv.due_date} on your account.` : 'Pay it by card from the invoice in Ridgeload.';
    for (const address of to) {
      await enqueueMail(
        trx,
        renderEmail({
          to: address,
          subject: `Invoice ${inv.number} from ${order.merchant_name}`,
          heading: `Invoice ${inv.number} for order ${orderReference(order.id)}`,
          paragraphs: [`${order.merchant_name} issued invoice ${inv.number}: ${formatMoney(inv.total, config.currency)} including ${formatMoney(inv.tax_total, config.currency)} tax.`, pay],
          action: { label: 'Open the invoice', url: `${config.appUrl}/invoices/${inv.id}` },
        }),
        config.mailDomain,
      );
    }
  }

  return {
    get,

    async list(user: AuthUser, f: { status?: InvoiceStatus; contractor_id?: number; page: number; page_size: number }) {
      const { rows, total } = await invoices.list(partyOf(user), f);
      return { invoices: rows.map((r) => summaryOf(r, config.calendar.today())), total, page: f.page, page_size: f.page_size };
    },

    /**
     * Issues the order's invoice: delivered packs once the delivery is recorded, the packs confirmed
     * to send before that. Each line takes its product's tax rate now; the number is the merchant's
     * next in the same transaction, so a failed issue leaves no gap.
     */
    async issue(user: AuthUser, orderId: number) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const id = await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), orderId, trx);
        if (!order) throw AppError.notFound('Order');
        const basis = order.status === 'delivered' ? 'delivered' : ['confirmed', 'on_the_road'].includes(order.status) ? 'confirmed' : null;
        if (!basis) throw AppError.conflict('not_invoiceable', `${orderReference(orderId)} is not confirmed: there is nothing to invoice yet`);
        if (await invoices.byOrder(orderId, trx)) throw AppError.conflict('already_invoiced', `${orderReference(orderId)} already has an invoice: credit it to change it`);
        const lines = await orders.lines(orderId, trx);
        const rates = new Map<number, number>(
          (
            await trx('products')
              .where('organisation_id', user.organisation.id)
              .whereIn(
                'id',
                lines.map((l) => l.product_id),
              )
              .select('id', 'tax_rate_bp')
          ).map((r) => [r.id as number, r.tax_rate_bp as number]),
        );
        const invoiceLines: NewInvoiceLine[] = lines
          .map((l) => ({ l, quantity: basis === 'delivered' ? (l.delivered_quantity ?? 0) : l.reserved_quantity }))
          .filter((x) => x.quantity > 0)
          .map(({ l, quantity }, i) => {
            const net = quantity * l.unit_price;
            const rate = rates.get(l.product_id) ?? 0;
            const tax = lineTax(net, rate);
            return {
              position: i + 1,
              order_line_id: l.id,
              sku: l.sku,
              description: l.description,
              unit: l.unit,
              pack_size: l.pack_size,
              quantity,
              unit_price: l.unit_price,
              tax_rate_bp: rate,
              net,
              tax,
              total: net + tax,
            };
          });
        if (invoiceLines.length === 0) throw AppError.conflict('nothing_to_invoice', `Nothing on ${orderReference(orderId)} was ${basis === 'delivered' ? 'delivered' : 'confirmed to send'}`);
        const terms = await invoices.terms(user.organisation.id, order.contractor_organisation_id, trx);
        const issueDate = config.calendar.today();
        const subtotal = invoiceLines.reduce((s, l) => s + l.net, 0);
        const taxTotal = invoiceLines.reduce((s, l) => s + l.tax, 0);
        const number = await invoices.nextNumber(trx, user.organisation.id, 'invoice');
        const invoiceId = await invoices.insert(
          trx,
          {
            merchant_organisation_id: user.organisation.id,
            contractor_organisation_id: order.contractor_organisation_id,
            branch_id: order.branch_id,
            order_id: orderId,
            number,
            currency: config.currency,
            basis,
            pay_by: terms === null ? 'card' : 'account',
            issue_date: issueDate,
            due_date: terms === null ? null : addDays(issueDate, terms),
            subtotal,
            tax_total: taxTotal,
            total: subtotal + taxTotal,
            issued_by: user.id,
          },
          invoiceLines,
        );
        await orders.insertEvent(trx, orderId, {
          kind: 'invoiced',
          actor: { userId: user.id, name: user.name, organisationId: user.organisation.id },
          summary: `Invoice ${invoiceNumber(number)} issued: ${formatMoney(subtotal + taxTotal, config.currency)} with tax`,
          data: { invoice_id: invoiceId },
        });
        await mailIssued(trx, order, {
          id: invoiceId,
          number: invoiceNumber(number),
          total: subtotal + taxTotal,
          tax_total: taxTotal,
          pay_by: terms === null ? 'card' : 'account',
          due_date: terms === null ? null : addDays(issueDate, terms),
        });
        return invoiceId;
      });
      return get(user, id);
    },

    /**
     * Credits packs of an invoice's lines (never more than is left to credit). Where a card payment
     * now covers more than the invoice asks, the difference is refunded to the card.
     */
    async credit(user: AuthUser, invoiceId: number, body: CreditBody) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const refundId = await db.transaction(async (trx) => {
        const inv = await invoices.find(partyOf(user), invoiceId, trx);
        if (!inv) throw AppError.notFound('Invoice');
        const lines = await invoices.lines(invoiceId, trx);
        const problems: { path: string; message: string }[] = [];
        const noteLines = body.lines.flatMap((bl, i) => {
          const il = lines.find((l) => l.id === bl.invoice_line_id);
          if (!il) {
            problems.push({ path: `lines.${i}.invoice_line_id`, message: 'is not a line of this invoice' });
            return [];
          }
          const left = il.quantity - il.credited_quantity;
          if (bl.quantity > left) {
            problems.push({ path: `lines.${i}.quantity`, message: `at most the ${left} packs not yet credited` });
            return [];
          }
          // The last packs of a line take exactly what is left of its net and tax, so rounding never leaves a penny.
          const net = bl.quantity === left ? il.net - il.credited_net : bl.quantity * il.unit_price;
          const tax = bl.quantity === left ? il.tax - il.credited_tax : lineTax(net, il.tax_rate_bp);
          return [{ invoice_line_id: il.id, quantity: bl.quantity, unit_price: il.unit_price, tax_rate_bp: il.tax_rate_bp, net, tax, total: net + tax }];
        });
        if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some lines cannot be credited like this', problems);
        const subtotal = noteLines.reduce((s, l) => s + l.net, 0);
        const taxTotal = noteLines.reduce((s, l) => s + l.tax, 0);
        const total = subtotal + taxTotal;
        if (!(await invoices.addCredited(trx, invoiceId, total))) throw AppError.conflict('over_credited', 'The invoice changed at the same moment; reload it and try again');
        const number = await invoices.nextNumber(trx, user.organisation.id, 'credit_note');
        const cnId = await invoices.insertCreditNote(
          trx,
          {
            merchant_organisation_id: user.organisation.id,
            contractor_organisation_id: inv.contractor_organisation_id,
            invoice_id: invoiceId,
            number,
            reason: body.reason,
            notes: body.notes ?? '',
            subtotal,
            tax_total: taxTotal,
            total,
            issued_by: user.id,
          },
          noteLines,
        );
        await orders.insertEvent(trx, inv.order_id, {
          kind: 'credited',
          actor: { userId: user.id, name: user.name, organisationId: user.organisation.id },
          summary: `Credit note ${creditNoteNumber(number)} (${body.reason}): ${formatMoney(total, inv.currency)}`,
          data: { credit_note_id: cnId, invoice_id: invoiceId },
        });
        const overpaid = inv.paid - (inv.total - (inv.credited + total));
        if (overpaid <= 0) return null;
        const card = (await invoices.payments(invoiceId, trx)).filter((p) => p.status === 'succeeded' && p.provider_payment_id).at(-1);
        if (!card) return null;
        return invoices.insertRefund(trx, { credit_note_id: cnId, payment_id: card.id, amount: Math.min(overpaid, total, card.amount) });
      });
      if (refundId !== null) await payments.refund(refundId);
      return get(user, invoiceId);
    },

    /** Tries a failed refund again (same idempotency key, so never twice). */
    async retryRefund(user: AuthUser, creditNoteId: number) {
      const cn = await invoices.creditNote(partyOf(user), creditNoteId);
      if (!cn) throw AppError.notFound('Credit note');
      const refund = await invoices.refundOf(creditNoteId);
      if (!refund) throw AppError.conflict('no_refund', 'This credit note has no card refund');
      await payments.refund(refund.id);
      return get(user, cn.invoice_id);
    },

    async print(user: AuthUser, id: number) {
      const inv = await get(user, id);
      const row = (await invoices.find(partyOf(user), id))!;
      return invoiceHtml(inv, { name: row.merchant_name, branch_address: row.branch_address });
    },

    async xlsx(user: AuthUser, id: number) {
      return invoiceXlsx(await get(user, id));
    },

    async accounts(user: AuthUser) {
      const rows = await invoices.accounts(user.organisation.id);
      return {
        accounts: rows.map((r) => ({
          contractor: { id: r.id, name: r.name },
          terms_days: r.terms_days ?? null,
          card_payments: r.terms_days === null || r.terms_days === undefined ? true : Boolean(r.card_payments),
          orders: Number(r.orders ?? 0),
        })),
      };
    },

    async putTerms(user: AuthUser, contractorId: number, termsDays: number | null, cardPayments?: boolean) {
      if (!(await invoices.knowsContractor(user.organisation.id, contractorId)) && (await invoices.terms(user.organisation.id, contractorId)) === null) {
        throw AppError.notFound('Contractor');
      }
      if (termsDays === null) await invoices.deleteTerms(user.organisation.id, contractorId);
      else await invoices.putTerms(user.organisation.id, contractorId, termsDays, cardPayments);
      const all = await this.accounts(user);
      return all.accounts.find((a) => a.contractor.id === contractorId)!;
    },
  };
}

export type InvoicesService = ReturnType<typeof invoicesService>;
