import express, { type RequestHandler } from 'express';
import { invoiceParamsSchema } from '../../../shared/schemas/invoice.schema';
import { paymentParamsSchema, startPaymentBodySchema } from '../../../shared/schemas/payment.schema';
import { currentUser } from '../../auth/policy';
import type { Config } from '../../config/env';
import { apiRouter } from '../../http/endpoint';
import { returnBase } from '../../http/return-origin';
import { toPayment, type PaymentsService } from './payments.service';

/** Starting and checking card payments, for the signed-in contractor. */
export function paymentsRoutes(payments: PaymentsService, config: Pick<Config, 'appUrl' | 'allowedOrigins' | 'isProduction'>, idempotent: RequestHandler = (_req, _res, next) => next()) {
  const r = apiRouter();

  r.post('/invoices/:id/payments', { access: { action: 'payments:make' }, params: invoiceParamsSchema, body: startPaymentBodySchema, before: [idempotent] }, async (req, res, { params }) => {
    const { created, payment } = await payments.start(currentUser(req), params.id, returnBase(req, config));
    const p = toPayment(payment);
    res.status(created ? 201 : 200).json({ status: p.status, checkout_url: p.checkout_url, payment: p });
  });
  r.post('/payments/:id/refresh', { access: { action: 'invoices:read' }, params: paymentParamsSchema }, async (req, res, { params }) => {
    res.json(toPayment(await payments.refresh(currentUser(req), params.id)));
  });

  return r.router;
}

/**
 * The provider's event webhook: mounted before the JSON parser, the session and CSRF, since it needs
 * the raw bytes for the signature and comes from the provider, not a browser. The signature is its
 * access control.
 */
export function paymentWebhookRoutes(payments: PaymentsService) {
  const r = apiRouter();
  r.post('/payments/webhook', { access: { public: 'the payment provider posts signed events; the signature is checked' }, before: [express.raw({ type: '*/*', limit: '1mb' })] }, async (req, res) => {
    const event = await payments.verify(Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0), req.get('stripe-signature'));
    const { duplicate } = await payments.handleEvent(event);
    res.json({ received: true, duplicate });
  });
  return r.router;
}
