import type { Response } from 'express';
import { idParamsSchema } from '../../../shared/schemas/members.schema';
import {
  branchPriceBodySchema,
  branchProductParamsSchema,
  createProductBodySchema,
  productListQuerySchema,
  roofSystemBodySchema,
  roofSystemListQuerySchema,
  sheetExportQuerySchema,
  updateProductBodySchema,
  updateRoofSystemBodySchema,
} from '../../../shared/schemas/price-list.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { PriceListService } from './price-list.service';
import { readSheetUpload, uploadedBytes } from './sheet-upload';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Sends a sheet export as an attachment, CSV as UTF-8 text. */
export function sendSheet(res: Response, file: { filename: string; body: string | Buffer }) {
  res.type(typeof file.body === 'string' ? 'text/csv; charset=utf-8' : XLSX_TYPE);
  res.attachment(file.filename);
  res.send(file.body);
}

export function priceListRoutes(priceList: PriceListService) {
  const r = apiRouter();

  r.get('/products', { access: { action: 'catalogue:read' }, query: productListQuerySchema }, async (req, res, { query }) => {
    res.json({ products: await priceList.listProducts(currentUser(req), query) });
  });
  r.post('/products', { access: { action: 'catalogue:manage' }, body: createProductBodySchema }, async (req, res, { body }) => {
    res.status(201).json(await priceList.createProduct(currentUser(req), body));
  });
  r.get('/products/:id', { access: { action: 'catalogue:read' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await priceList.getProduct(currentUser(req), params.id));
  });
  r.patch('/products/:id', { access: { action: 'catalogue:manage' }, params: idParamsSchema, body: updateProductBodySchema }, async (req, res, { params, body }) => {
    res.json(await priceList.updateProduct(currentUser(req), params.id, body));
  });
  r.delete('/products/:id', { access: { action: 'catalogue:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await priceList.archiveProduct(currentUser(req), params.id, true));
  });
  r.post('/products/:id/restore', { access: { action: 'catalogue:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await priceList.archiveProduct(currentUser(req), params.id, false));
  });
  r.put('/branches/:id/products/:productId', { access: { action: 'catalogue:manage' }, params: branchProductParamsSchema, body: branchPriceBodySchema }, async (req, res, { params, body }) => {
    res.json(await priceList.setBranchPrice(currentUser(req), params.id, params.productId, body.pack_price));
  });

  r.get('/roof-systems', { access: { action: 'catalogue:read' }, query: roofSystemListQuerySchema }, async (req, res, { query }) => {
    res.json(await priceList.listSystems(currentUser(req), query.branch_id));
  });
  r.post('/roof-systems', { access: { action: 'catalogue:manage' }, body: roofSystemBodySchema }, async (req, res, { body }) => {
    res.status(201).json(await priceList.createSystem(currentUser(req), body));
  });
  r.get('/roof-systems/:id', { access: { action: 'catalogue:read' }, params: idParamsSchema }, async (req, res, { params }) => {
    res.json(await priceList.getSystem(currentUser(req), params.id));
  });
  r.patch('/roof-systems/:id', { access: { action: 'catalogue:manage' }, params: idParamsSchema, body: updateRoofSystemBodySchema }, async (req, res, { params, body }) => {
    res.json(await priceList.updateSystem(currentUser(req), params.id, body));
  });
  r.delete('/roof-systems/:id', { access: { action: 'catalogue:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    await priceList.archiveSystem(currentUser(req), params.id);
    res.status(204).end();
  });

  r.get('/branches/:id/price-list', { access: { action: 'catalogue:read' }, params: idParamsSchema, query: sheetExportQuerySchema }, async (req, res, { params, query }) => {
    sendSheet(res, await priceList.exportPriceList(currentUser(req), params.id, query.format));
  });
  r.post('/branches/:id/price-list', { access: { action: 'catalogue:manage' }, params: idParamsSchema, before: [readSheetUpload] }, async (req, res, { params }) => {
    res.json(await priceList.importPriceList(currentUser(req), params.id, uploadedBytes(req)));
  });

  return r.router;
}
