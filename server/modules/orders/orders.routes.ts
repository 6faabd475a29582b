import {
  amendOrderBodySchema,
  answerProposalBodySchema,
  cancelOrderBodySchema,
  orderListQuerySchema,
  orderParamsSchema,
  placeOrderBodySchema,
  proposalBodySchema,
  proposalParamsSchema,
} from '../../../shared/schemas/order.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { OrdersService } from './orders.service';

export function ordersRoutes(orders: OrdersService) {
  const r = apiRouter();

  r.post('/orders', { access: { action: 'orders:place' }, body: placeOrderBodySchema }, async (req, res, { body }) => {
    res.status(201).json(await orders.place(currentUser(req), body));
  });

  r.get('/orders', { access: { action: 'orders:read' }, query: orderListQuerySchema }, async (req, res, { query }) => {
    res.json(await orders.list(currentUser(req), query));
  });

  r.get('/orders/:id', { access: { action: 'orders:read' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.json(await orders.get(currentUser(req), params.id));
  });

  r.patch('/orders/:id', { access: { action: 'orders:place' }, params: orderParamsSchema, body: amendOrderBodySchema }, async (req, res, { params, body }) => {
    res.json(await orders.amend(currentUser(req), params.id, body));
  });

  r.post(
    '/orders/:id/cancel',
    { access: { action: 'orders:place' }, params: orderParamsSchema, body: cancelOrderBodySchema },
    async (req, res, { params, body }) => {
      res.json(await orders.cancel(currentUser(req), params.id, body.reason));
    },
  );

  r.post(
    '/orders/:id/proposals',
    { access: { action: 'orders:confirm' }, params: orderParamsSchema, body: proposalBodySchema },
    async (req, res, { params, body }) => {
      res.status(201).json(await orders.offerChanges(currentUser(req), params.id, body));
    },
  );

  r.post(
    '/orders/:id/proposals/:proposalId/accept',
    { access: { action: 'orders:respond' }, params: proposalParamsSchema, body: answerProposalBodySchema },
    async (req, res, { params, body }) => {
      res.json(await orders.acceptChanges(currentUser(req), params.id, params.proposalId, body.note));
    },
  );

  r.post(
    '/orders/:id/proposals/:proposalId/decline',
    { access: { action: 'orders:respond' }, params: proposalParamsSchema, body: answerProposalBodySchema },
    async (req, res, { params, body }) => {
      res.json(await orders.declineChanges(currentUser(req), params.id, params.proposalId, body.note));
    },
  );

  return r.router;
}
