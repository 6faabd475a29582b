import {
  amendOrderBodySchema,
  answerProposalBodySchema,
  bookSlotBodySchema,
  cancelOrderBodySchema,
  commentBodySchema,
  confirmOrderBodySchema,
  followUpBodySchema,
  orderBookQuerySchema,
  orderLineParamsSchema,
  orderParamsSchema,
  placeOrderBodySchema,
  proposalBodySchema,
  proposalParamsSchema,
  turnDownBodySchema,
} from '../../../shared/schemas/order.schema';
import type { RequestHandler } from 'express';
import { currentUser } from '../../auth/policy';
import { bookVersionReadWith } from '../../auth/signed-in';
import { apiRouter } from '../../http/endpoint';
import type { OrdersService } from './orders.service';

const JSON_TYPE = 'application/json; charset=utf-8';

/**
 * `idempotent`: the shared Idempotency-Key middleware, on the writes a client may send twice (place, confirm).
 * `businessDay`: today from the business calendar (query-cache.ts businessDay), under which the order
 * book's parsed queries are kept; without it every list query is parsed anew.
 */
export function ordersRoutes(orders: OrdersService, idempotent: RequestHandler = (_req, _res, next) => next(), businessDay?: () => string) {
  const r = apiRouter();

  r.post('/orders', { access: { action: 'orders:place' }, body: placeOrderBodySchema, before: [idempotent] }, async (req, res, { body }) => {
    res.status(201).json(await orders.place(currentUser(req), body));
  });

  r.get('/orders', { access: { action: 'orders:read' }, query: orderBookQuerySchema, cacheQueryFor: businessDay }, async (req, res, { query }) => {
    const page = await orders.listPage(currentUser(req), query, bookVersionReadWith(req));
    res.setHeader('Content-Type', JSON_TYPE);
    // An empty page has no ETag: Express tags it as it tags any body.
    if (!page.etag) return void res.send(page.body);
    // A kept page carries its ETag and goes out as its bytes, without res.send's work on every read.
    res.setHeader('ETag', page.etag);
    if (req.headers['if-none-match'] !== undefined && req.fresh) {
      res.removeHeader('Content-Type');
      res.statusCode = 304;
      return void res.end();
    }
    res.setHeader('Content-Length', page.length ?? String(page.body.length));
    res.end(page.body);
  });

  r.get('/orders/:id', { access: { action: 'orders:read' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.json(await orders.get(currentUser(req), params.id));
  });

  r.patch('/orders/:id', { access: { action: 'orders:place' }, params: orderParamsSchema, body: amendOrderBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.amend(currentUser(req), params.id, body));
  });

  r.post('/orders/:id/cancel', { access: { action: 'orders:place' }, params: orderParamsSchema, body: cancelOrderBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.cancel(currentUser(req), params.id, body.reason));
  });

  r.post('/orders/:id/proposals', { access: { action: 'orders:confirm' }, params: orderParamsSchema, body: proposalBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await orders.offerChanges(currentUser(req), params.id, body));
  });

  r.post('/orders/:id/proposals/:proposalId/accept', { access: { action: 'orders:respond' }, params: proposalParamsSchema, body: answerProposalBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.acceptChanges(currentUser(req), params.id, params.proposalId, body.note));
  });

  r.post('/orders/:id/proposals/:proposalId/decline', { access: { action: 'orders:respond' }, params: proposalParamsSchema, body: answerProposalBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.declineChanges(currentUser(req), params.id, params.proposalId, body.note));
  });

  r.get('/orders/:id/lines/:lineId/substitutes', { access: { action: 'orders:confirm' }, params: orderLineParamsSchema }, async (req, res, { params }) => {
    res.json(await orders.substitutes(currentUser(req), params.id, params.lineId));
  });

  r.post('/orders/:id/confirm', { access: { action: 'orders:confirm' }, params: orderParamsSchema, body: confirmOrderBodySchema, before: [idempotent] }, async (req, res, { params, body }) => {
    res.json(await orders.confirm(currentUser(req), params.id, body));
  });

  r.post('/orders/:id/turn-down', { access: { action: 'orders:confirm' }, params: orderParamsSchema, body: turnDownBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.turnDown(currentUser(req), params.id, body.reason));
  });

  r.put('/orders/:id/slot', { access: { action: 'slots:book' }, params: orderParamsSchema, body: bookSlotBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.bookSlot(currentUser(req), params.id, body.slot_id));
  });

  r.delete('/orders/:id/slot', { access: { action: 'slots:book' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.json(await orders.unbookSlot(currentUser(req), params.id));
  });

  r.post('/orders/:id/dispatch', { access: { action: 'slots:book' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.json(await orders.dispatch(currentUser(req), params.id));
  });

  r.post('/orders/:id/follow-up', { access: { action: 'orders:confirm' }, params: orderParamsSchema, body: followUpBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await orders.startFollowUp(currentUser(req), params.id, body));
  });

  r.get('/orders/:id/comments', { access: { action: 'orders:comment' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.json(await orders.comments(currentUser(req), params.id));
  });

  r.post('/orders/:id/comments', { access: { action: 'orders:comment' }, params: orderParamsSchema, body: commentBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await orders.comment(currentUser(req), params.id, body.body));
  });

  return r.router;
}
