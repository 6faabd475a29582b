import type { Response } from 'express';
import { idParamsSchema } from '../../../shared/schemas/members.schema';
import { palletParamsSchema, runDayQuerySchema, runParamsSchema, runPositionParamsSchema, runWeekQuerySchema, sendOutBodySchema, setDropOrderBodySchema } from '../../../shared/schemas/run.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import { labelsPdf, loadingSheetPdf } from './run-documents';
import type { RunsService } from './runs.service';

/** `appUrl` is read on each request: the address the app is reached at may be set after start-up. */
export function runsRoutes(runs: RunsService, appUrl: () => string) {
  const r = apiRouter();

  r.get('/branches/:id/runs', { access: { action: 'runs:read' }, params: idParamsSchema, query: runDayQuerySchema }, async (req, res, { params, query }) => {
    res.json(await runs.day(currentUser(req), params.id, query.date));
  });
  r.get('/branches/:id/run-week', { access: { action: 'runs:read' }, params: idParamsSchema, query: runWeekQuerySchema }, async (req, res, { params, query }) => {
    res.json(await runs.week(currentUser(req), params.id, query.from));
  });
  r.get('/runs/:id', { access: { action: 'runs:read' }, params: runParamsSchema }, async (req, res, { params }) => {
    res.json(await runs.get(currentUser(req), params.id));
  });
  r.put('/runs/:id/drops', { access: { action: 'runs:plan' }, params: runParamsSchema, body: setDropOrderBodySchema }, async (req, res, { params, body }) => {
    res.json(await runs.setDrops(currentUser(req), params.id, body.order_ids));
  });
  r.post('/runs/:id/positions/:index/loaded', { access: { action: 'runs:load' }, params: runPositionParamsSchema }, async (req, res, { params }) => {
    res.json(await runs.setLoaded(currentUser(req), params.id, params.index, true));
  });
  r.delete('/runs/:id/positions/:index/loaded', { access: { action: 'runs:load' }, params: runPositionParamsSchema }, async (req, res, { params }) => {
    res.json(await runs.setLoaded(currentUser(req), params.id, params.index, false));
  });
  r.post('/runs/:id/send-out', { access: { action: 'runs:send_out' }, params: runParamsSchema, body: sendOutBodySchema }, async (req, res, { params, body }) => {
    res.json(await runs.sendOut(currentUser(req), params.id, body));
  });
  r.get('/runs/:id/loading-sheet.pdf', { access: { action: 'runs:read' }, params: runParamsSchema }, async (req, res, { params }) => {
    const d = await runs.detail(currentUser(req), params.id);
    sendPdf(res, await loadingSheetPdf(d), `loading-sheet-${d.row.registration.replace(/\s+/g, '')}-${d.row.date}.pdf`);
  });
  r.get('/runs/:id/labels.pdf', { access: { action: 'runs:read' }, params: runParamsSchema }, async (req, res, { params }) => {
    const d = await runs.detail(currentUser(req), params.id);
    sendPdf(res, await labelsPdf(d, appUrl()), `pallet-labels-${d.row.registration.replace(/\s+/g, '')}-${d.row.date}.pdf`);
  });
  r.get('/orders/:id/pallets/:pallet', { access: { action: 'runs:read' }, params: palletParamsSchema }, async (req, res, { params }) => {
    res.json(await runs.pallet(currentUser(req), params.id, params.pallet));
  });

  return r.router;
}

function sendPdf(res: Response, data: Buffer, filename: string) {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `inline; filename="${filename}"`);
  res.setHeader('Cache-Control', 'private, no-store');
  res.end(data);
}
