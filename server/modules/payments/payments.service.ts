import { lockRow } from '../../db/dialect';
import type Stripe from 'stripe';
import type { StripeClient } from '../../payments/stripe-client';
import { invoiceNumber, type Payment } from '../../../shared/schemas/invoice.schema';
import { orderReference } from '../../../shared/schemas/order.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import { AppError } from '../../http/app-error';
import { enqueueMail } from '../../mail/outbox';
import { renderEmail } from '../../mail/templates';
import { formatMoney } from '../../../shared/domain/money';
import { invoicesRepository, type InvoiceParty, type PaymentRow } from '../invoices/invoices.repository';
import { ordersRepository } from '../orders/orders.repository';

export function toPayment(p: PaymentRow): Payment {
  return {
    id: p.id,
    method: 'card',
    status: p.status,
    amount: p.amount,
    currency: p.currency,
    checkout_url: p.status === 'open' ? p.checkout_url : null,
    last_error: p.last_error,
    paid_at: p.paid_at,
    created_at: p.created_at,
  };
}

const partyOf = (user: AuthUser): InvoiceParty => ({ kind: user.organisation.kind, organisationId: user.organisation.id });
const balanceOf = (inv: { total: number; credited: number; paid: number }) => Math.max(0, inv.total - inv.credited - inv.paid);

const unavailable = () => new AppError(503, 'payments_unavailable', 'Card payments are not set up on this server');

/** A provider failure, told in the app's own error shape without the provider's internals. */
function providerError(err: unknown): AppError {
  const message = err instanceof Error ? err.message : 'unknown error';
  return new AppError(502, 'payment_provider_error', `The card payment service did not accept the request: ${message}`);
}

/**
 * Card payments through the provider's hosted checkout. The browser is sent to the provider's page
 * (the card is typed there, never here); the provider's signed event records the payment. Every call
 * carries an idempotency key, and an invoice has at most one open payment, so pressing "Pay" twice
 * makes one checkout and one charge.
 */
export function paymentsService(deps: Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>, stripe: StripeClient | null) {
  const { db, config, logger } = deps;
  const invoices = invoicesRepository(db);
  const orders = ordersRepository(db);

  /** Writes the payment's e-mails (to the payer's side and the desk) to the outbox in the transaction that records it. */
  async function mailPaid(trx: Db, invoiceId: number, amount: number) {
    const inv = await trx('invoices').where({ id: invoiceId }).first();
    if (!inv) return;
    const order = await orders.find({ kind: 'merchant', organisationId: inv.merchant_organisation_id }, inv.order_id, trx);
    if (!order) return;
    const contractor = await orders.contractorEmails(order, trx);
    const desk = await orders.deskEmails(order.merchant_organisation_id, trx);
    const paid = formatMoney(amount, inv.currency);
    const number = invoiceNumber(inv.number);
    const url = `${config.appUrl}/invoices/${invoiceId}`;
    const jobs = [
      ...contractor.map((to) => ({
        to,
        subject: `Payment received for invoice ${number}`,
        heading: 'Thank you: payment received',
        paragraphs: [`${order.merchant_name} received ${paid} by card for invoice ${number} (order ${orderReference(order.id)}).`],
      })),
      ...desk.map((to) => ({ to, subject: `${order.contractor_name} paid invoice ${number}`, heading: `Invoice ${number} paid`, paragraphs: [`${paid} was paid by card for order ${orderReference(order.id)}.`] })),
    ];
    for (const j of jobs) await enqueueMail(trx, renderEmail({ ...j, action: { label: 'Open the invoice', url } }), config.mailDomain);
  }

  /** Marks an open payment paid, once, and adds it to the invoice. Returns whether this call recorded it. */
  async function recordPaid(trx: Db, payment: PaymentRow, amount: number, providerPaymentId: string | null): Promise<boolean> {
    const changed = await invoices.updatePayment(trx, payment.id, { status: 'succeeded', amount, provider_payment_id: providerPaymentId, paid_at: nowIso(), last_error: null, open_for_invoice: null }, true);
    if (changed) await invoices.addPaid(trx, payment.invoice_id, amount);
    return changed;
  }

  async function sessionOf(payment: PaymentRow, invoiceId: number, number: string, orderId: number, base: string) {
    if (!stripe) throw unavailable();
    const back = `${base}/invoices/${invoiceId}`;
    try {
      return await (
        await stripe.get()
      ).checkout.sessions.create(
        {
          mode: 'payment',
          line_items: [{ quantity: 1, price_data: { currency: payment.currency.toLowerCase(), unit_amount: payment.amount, product_data: { name: `Invoice ${number} (order ${orderReference(orderId)})` } } }],
          success_url: `${back}?payment=done&session_id={CHECKOUT_SESSION_ID}`,
          cancel_url: `${back}?payment=cancelled`,
          client_reference_id: String(payment.id),
          metadata: { invoice_id: String(invoiceId), payment_id: String(payment.id) },
          payment_intent_data: { metadata: { invoice_id: String(invoiceId), payment_id: String(payment.id) } },
        },
        // The same key for the same payment: a second press, or a retry after a timeout, returns the same session.
        { idempotencyKey: `ridgeload-payment-${payment.id}` },
      );
    } catch (err) {
      throw providerError(err);
    }
  }

  return {
    /**
     * Starts (or resumes) the card payment of an invoice's balance; the answer carries the provider's
     * checkout URL. The payer comes back to `returnBase` (an allowed address of the app), APP_URL by default.
     */
    async start(user: AuthUser, invoiceId: number, returnBase: string = config.appUrl): Promise<{ created: boolean; payment: PaymentRow }> {
      const inv = await invoices.find(partyOf(user), invoiceId);
      if (!inv) throw AppError.notFound('Invoice');
      if (!stripe) throw unavailable();
      if (inv.pay_by === 'account' && !(await invoices.cardAllowed(inv.merchant_organisation_id, inv.contractor_organisation_id))) {
        throw AppError.conflict('card_payment_off', `${inv.merchant_name} takes payment of invoice ${invoiceNumber(inv.number)} on account, by the due date; card payment is turned off for your account`);
      }
      const balance = balanceOf(inv);
      if (balance <= 0) throw AppError.conflict('nothing_to_pay', `Invoice ${invoiceNumber(inv.number)} has nothing left to pay`);
      let superseded: PaymentRow | undefined;
      const { payment, created } = await db.transaction(async (trx) => {
        await lockRow(trx, 'invoices', invoiceId);
        const open = await invoices.openPayment(invoiceId, trx);
        if (open && open.amount === balance) return { payment: open, created: false };
        if (open) {
          // The balance changed (a credit note, a part payment): the old checkout no longer fits.
          await invoices.updatePayment(trx, open.id, { status: 'failed', last_error: 'the invoice balance changed; a new checkout replaced this one', open_for_invoice: null }, true);
          superseded = open;
        }
        const id = await invoices.insertPayment(trx, { invoice_id: invoiceId, amount: balance, currency: inv.currency, created_by: user.id });
        return { payment: (await invoices.payment(id, trx))!, created: true };
      });
      if (superseded?.provider_session_id) {
        await (await stripe.get()).checkout.sessions.expire(superseded.provider_session_id).catch((err: unknown) => logger.warn({ err, payment: superseded?.id }, 'could not expire a replaced checkout'));
      }
      if (payment.provider_session_id && payment.checkout_url) return { created, payment };
      const session = await sessionOf(payment, invoiceId, invoiceNumber(inv.number), inv.order_id, returnBase);
      await db.transaction((trx) => invoices.updatePayment(trx, payment.id, { provider_session_id: session.id, checkout_url: session.url }));
      return { created, payment: (await invoices.payment(payment.id))! };
    },

    /**
     * A provider event, already verified. Each event id is handled once (a replay changes nothing);
     * a completed checkout records its payment once however many events or refreshes report it.
     */
    async handleEvent(event: Stripe.Event): Promise<{ duplicate: boolean }> {
      const duplicate = await db.transaction(async (trx) => {
        let payment: PaymentRow | undefined;
        if (event.type === 'checkout.session.completed' || event.type === 'checkout.session.async_payment_succeeded') {
          payment = await invoices.paymentBySession(event.data.object.id, trx);
        } else if (event.type === 'payment_intent.payment_failed') {
          const pid = Number(event.data.object.metadata?.payment_id);
          payment = Number.isInteger(pid) ? await invoices.payment(pid, trx) : undefined;
        }
        if (!(await invoices.firstSight(trx, event.id, event.type, payment?.id ?? null))) return true;
        if (!payment) return false;
        if (event.type === 'checkout.session.completed' || event.type === 'checkout.session.async_payment_succeeded') {
          const s = event.data.object;
          if (s.payment_status === 'paid' && (await recordPaid(trx, payment, s.amount_total ?? payment.amount, typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null)))) {
            await mailPaid(trx, payment.invoice_id, s.amount_total ?? payment.amount);
          }
        } else if (event.type === 'payment_intent.payment_failed') {
          await invoices.updatePayment(trx, payment.id, { last_error: event.data.object.last_payment_error?.message ?? 'The card was declined' }, true);
        }
        return false;
      });
      return { duplicate };
    },

    /** Asks the provider how an open payment stands, for when its event is late; records it if paid. */
    async refresh(user: AuthUser, paymentId: number): Promise<PaymentRow> {
      const payment = await invoices.payment(paymentId);
      if (!payment || !(await invoices.find(partyOf(user), payment.invoice_id))) throw AppError.notFound('Payment');
      if (payment.status !== 'open' || !payment.provider_session_id) return payment;
      if (!stripe) throw unavailable();
      let session: Stripe.Checkout.Session;
      try {
        session = await (await stripe.get()).checkout.sessions.retrieve(payment.provider_session_id);
      } catch (err) {
        throw providerError(err);
      }
      if (session.payment_status === 'paid') {
        await db.transaction(async (trx) => {
          if (await recordPaid(trx, payment, session.amount_total ?? payment.amount, typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null))) {
            await mailPaid(trx, payment.invoice_id, session.amount_total ?? payment.amount);
          }
        });
      } else if (session.status === 'expired') {
        await db.transaction((trx) => invoices.updatePayment(trx, payment.id, { status: 'failed', last_error: 'the checkout expired', open_for_invoice: null }, true));
      }
      return (await invoices.payment(paymentId))!;
    },

    /**
     * Refunds a credit note's share of a card payment through the provider. The idempotency key is the
     * refund's own, so a retry after a failure or timeout never refunds twice.
     */
    async refund(refundId: number): Promise<void> {
      const refund = await db('refunds as r').join('payments as p', 'p.id', 'r.payment_id').where('r.id', refundId).select('r.*', 'p.provider_payment_id', 'p.invoice_id').first();
      if (!refund || refund.status === 'succeeded') return;
      if (!stripe || !refund.provider_payment_id) {
        await db.transaction((trx) => invoices.updateRefund(trx, refundId, { status: 'failed', last_error: stripe ? 'the card payment has no provider reference' : 'card payments are not set up on this server' }));
        return;
      }
      try {
        const r = await (
          await stripe.get()
        ).refunds.create({ payment_intent: refund.provider_payment_id, amount: refund.amount, metadata: { credit_note_id: String(refund.credit_note_id) } }, { idempotencyKey: `ridgeload-refund-${refundId}` });
        await db.transaction(async (trx) => {
          if (await invoices.updateRefund(trx, refundId, { status: r.status === 'succeeded' ? 'succeeded' : 'pending', provider_refund_id: r.id, last_error: null })) {
            if (r.status === 'succeeded') await invoices.addPaid(trx, refund.invoice_id, -refund.amount);
          }
        });
      } catch (err) {
        logger.warn({ err, refundId }, 'refund failed');
        await db.transaction((trx) => invoices.updateRefund(trx, refundId, { status: 'failed', last_error: err instanceof Error ? err.message.slice(0, 480) : 'refund failed' }));
      }
    },

    /** The SDK's signature check: a tampered, unsigned or stale event is refused. */
    async verify(payload: Buffer, signature: string | undefined): Promise<Stripe.Event> {
      if (!stripe || !config.stripe.webhookSecret) throw unavailable();
      if (!signature) throw AppError.badRequest('bad_signature', 'The payment event is not signed');
      const sdk = await stripe.get();
      try {
        return sdk.webhooks.constructEvent(payload, signature, config.stripe.webhookSecret);
      } catch {
        throw AppError.badRequest('bad_signature', 'The payment event signature does not match');
      }
    },
  };
}

export type PaymentsService = ReturnType<typeof paymentsService>;
