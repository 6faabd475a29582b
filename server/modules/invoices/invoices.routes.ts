import { accountParamsSchema, creditNoteBodySchema, invoiceListQuerySchema, invoiceParamsSchema, putAccountBodySchema } from '../../../shared/schemas/invoice.schema';
import { orderParamsSchema } from '../../../shared/schemas/order.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { InvoicesService } from './invoices.service';

export function invoicesRoutes(invoices: InvoicesService) {
  const r = apiRouter();

  r.post('/orders/:id/invoice', { access: { action: 'invoices:issue' }, params: orderParamsSchema }, async (req, res, { params }) => {
    res.status(201).json(await invoices.issue(currentUser(req), params.id));
  });
  r.get('/invoices', { access: { action: 'invoices:read' }, query: invoiceListQuerySchema }, async (req, res, { query }) => {
    res.json(await invoices.list(currentUser(req), query));
  });
  r.get('/invoices/:id', { access: { action: 'invoices:read' }, params: invoiceParamsSchema }, async (req, res, { params }) => {
    res.json(await invoices.get(currentUser(req), params.id));
  });
  r.get('/invoices/:id/print', { access: { action: 'invoices:read' }, params: invoiceParamsSchema }, async (req, res, { params }) => {
    res.type('text/html; charset=utf-8').send(await invoices.print(currentUser(req), params.id));
  });
  r.get('/invoices/:id/export.xlsx', { access: { action: 'invoices:read' }, params: invoiceParamsSchema }, async (req, res, { params }) => {
    const body = await invoices.xlsx(currentUser(req), params.id);
    res.type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    res.attachment(`invoice-${params.id}.xlsx`);
    res.send(body);
  });
  r.post('/invoices/:id/credit-notes', { access: { action: 'invoices:issue' }, params: invoiceParamsSchema, body: creditNoteBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await invoices.credit(currentUser(req), params.id, body));
  });
  r.post('/credit-notes/:id/refund', { access: { action: 'invoices:issue' }, params: invoiceParamsSchema }, async (req, res, { params }) => {
    res.json(await invoices.retryRefund(currentUser(req), params.id));
  });

  r.get('/accounts', { access: { action: 'accounts:manage' } }, async (req, res) => {
    res.json(await invoices.accounts(currentUser(req)));
  });
  r.put('/accounts/:contractorId', { access: { action: 'accounts:manage' }, params: accountParamsSchema, body: putAccountBodySchema }, async (req, res, { params, body }) => {
    res.json(await invoices.putTerms(currentUser(req), params.contractorId, body.terms_days, body.card_payments));
  });
  r.delete('/accounts/:contractorId', { access: { action: 'accounts:manage' }, params: accountParamsSchema }, async (req, res, { params }) => {
    res.json(await invoices.putTerms(currentUser(req), params.contractorId, null));
  });

  return r.router;
}
