import { idParamsSchema } from '../../../shared/schemas/members.schema';
import { branchProductParamsSchema, sheetExportQuerySchema } from '../../../shared/schemas/price-list.schema';
import { stockListQuerySchema, updateStockBodySchema } from '../../../shared/schemas/stock.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import { sendSheet } from '../price-list/price-list.routes';
import { readSheetUpload, uploadedBytes } from '../price-list/sheet-upload';
import type { StockService } from './stock.service';

export function stockRoutes(stock: StockService) {
  const r = apiRouter();

  r.get('/branches/:id/stock', { access: { action: 'catalogue:read' }, params: idParamsSchema, query: stockListQuerySchema }, async (req, res, { params, query }) => {
    res.json(await stock.list(currentUser(req), params.id, { q: query.q, category: query.category, low: query.low === 'true' }));
  });
  r.patch('/branches/:id/stock/:productId', { access: { action: 'stock:manage' }, params: branchProductParamsSchema, body: updateStockBodySchema }, async (req, res, { params, body }) => {
    res.json(await stock.update(currentUser(req), params.id, params.productId, body));
  });
  r.get('/branches/:id/stock-counts', { access: { action: 'catalogue:read' }, params: idParamsSchema, query: sheetExportQuerySchema }, async (req, res, { params, query }) => {
    sendSheet(res, await stock.exportCounts(currentUser(req), params.id, query.format));
  });
  r.post('/branches/:id/stock-counts', { access: { action: 'stock:manage' }, params: idParamsSchema, before: [readSheetUpload] }, async (req, res, { params }) => {
    res.json(await stock.importCounts(currentUser(req), params.id, uploadedBytes(req)));
  });

  return r.router;
}
