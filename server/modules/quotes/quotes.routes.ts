import { answerQuoteBodySchema, createQuoteRequestBodySchema, declineQuoteBodySchema, quoteParamsSchema, quoteRequestListQuerySchema } from '../../../shared/schemas/order.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { QuotesService } from './quotes.service';

export function quotesRoutes(quotes: QuotesService) {
  const r = apiRouter();

  r.post('/quote-requests', { access: { action: 'orders:place' }, body: createQuoteRequestBodySchema }, async (req, res, { body }) => {
    res.status(201).json(await quotes.create(currentUser(req), body));
  });

  r.get('/quote-requests', { access: { action: 'orders:read' }, query: quoteRequestListQuerySchema }, async (req, res, { query }) => {
    res.json(await quotes.list(currentUser(req), query));
  });

  r.get('/quote-requests/:id', { access: { action: 'orders:read' }, params: quoteParamsSchema }, async (req, res, { params }) => {
    res.json(await quotes.get(currentUser(req), params.id));
  });

  r.post('/quote-requests/:id/withdraw', { access: { action: 'orders:place' }, params: quoteParamsSchema }, async (req, res, { params }) => {
    res.json(await quotes.withdraw(currentUser(req), params.id));
  });

  r.post('/quotes/:id/answer', { access: { action: 'orders:confirm' }, params: quoteParamsSchema, body: answerQuoteBodySchema }, async (req, res, { params, body }) => {
    res.json(await quotes.answer(currentUser(req), params.id, body));
  });

  r.post('/quotes/:id/decline', { access: { action: 'orders:confirm' }, params: quoteParamsSchema, body: declineQuoteBodySchema }, async (req, res, { params, body }) => {
    res.json(await quotes.decline(currentUser(req), params.id, body.message));
  });

  r.post('/quotes/:id/accept', { access: { action: 'orders:place' }, params: quoteParamsSchema }, async (req, res, { params }) => {
    res.status(201).json(await quotes.accept(currentUser(req), params.id));
  });

  return r.router;
}
