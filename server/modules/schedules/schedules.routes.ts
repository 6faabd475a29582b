import express, { type RequestHandler } from 'express';
import { EXAMPLE_OPENINGS_CSV, EXAMPLE_OPENINGS_FILENAME } from '../../../shared/engine/example-openings';
import { EXAMPLE_SCHEDULE_CSV, EXAMPLE_SCHEDULE_FILENAME } from '../../../shared/engine/example-schedule';
import { projectParamsSchema } from '../../../shared/schemas/project.schema';
import { MAX_SCHEDULE_BYTES, SCHEDULE_CONTENT_TYPES, SCHEDULE_FILE_FIELD, currentScheduleQuerySchema, putFacesBodySchema, scheduleVersionParamsSchema } from '../../../shared/schemas/schedule-upload.schema';
import { currentUser } from '../../auth/policy';
import { AppError } from '../../http/app-error';
import { isMulterError, multipartUpload } from '../../http/multipart';
import { apiRouter } from '../../http/endpoint';
import { decodeScheduleBytes, invalidSchedule, type SchedulesService } from './schedules.service';

const rawCsv = express.raw({ type: [...SCHEDULE_CONTENT_TYPES], limit: MAX_SCHEDULE_BYTES });
const multipart = multipartUpload({ defParamCharset: 'utf8', limits: { fileSize: MAX_SCHEDULE_BYTES, files: 1, fields: 10 } }, (m) => m.single(SCHEDULE_FILE_FIELD));

/**
 * Reads the schedule upload after the access check: a multipart form with the field `file`, or the
 * CSV itself as the body. Size limits answer 413 through the central handler.
 */
const readScheduleUpload: RequestHandler = (req, res, next) => {
  if (req.is('multipart/form-data')) {
    multipart(req, res, (err: unknown) => {
      if (!err) return next();
      if (isMulterError(err) && err.code !== 'LIMIT_FILE_SIZE') {
        return next(invalidSchedule([{ message: `send one CSV file in the form field '${SCHEDULE_FILE_FIELD}' (${err.message})` }]));
      }
      next(err);
    });
    return;
  }
  if (req.is([...SCHEDULE_CONTENT_TYPES])) {
    const charset = (req.get('content-type') ?? '')
      .match(/charset=([^;]+)/i)?.[1]
      ?.trim()
      .toLowerCase()
      .replace(/"/g, '');
    if (charset && !['utf-8', 'utf8', 'us-ascii'].includes(charset)) {
      return next(new AppError(415, 'unsupported_encoding', 'Send the schedule as UTF-8 text'));
    }
    return rawCsv(req, res, next);
  }
  next(new AppError(415, 'unsupported_media_type', `Send the schedule as text/csv or as a multipart form with the field '${SCHEDULE_FILE_FIELD}'`));
};

/** The CSV bytes of an upload, from the form field or the body, and the file's name when it came in a form. */
function uploaded(req: express.Request): { bytes: Buffer; filename: string | null } {
  if (req.file) return { bytes: req.file.buffer, filename: req.file.originalname.slice(0, 200) || null };
  if (Buffer.isBuffer(req.body)) return { bytes: req.body, filename: null };
  throw invalidSchedule([{ message: `no CSV received: send it as the request body or in the form field '${SCHEDULE_FILE_FIELD}'` }]);
}

export function schedulesRoutes(schedules: SchedulesService, idempotent: RequestHandler = (_req, _res, next) => next()) {
  const r = apiRouter();

  r.get('/examples/roof-schedule.csv', { access: { public: 'the example schedule and column guide are for anyone' } }, (_req, res) => {
    res.type('text/csv; charset=utf-8');
    res.attachment(EXAMPLE_SCHEDULE_FILENAME);
    res.send(EXAMPLE_SCHEDULE_CSV);
  });

  r.get('/examples/openings.csv', { access: { public: 'the example openings file is for anyone' } }, (_req, res) => {
    res.type('text/csv; charset=utf-8');
    res.attachment(EXAMPLE_OPENINGS_FILENAME);
    res.send(EXAMPLE_OPENINGS_CSV);
  });

  r.post('/projects/:id/schedule/openings', { access: { action: 'projects:write' }, params: projectParamsSchema, before: [readScheduleUpload] }, async (req, res, { params }) => {
    const { bytes, filename } = uploaded(req);
    res.status(201).json(await schedules.importOpeningsCsv(currentUser(req), params.id, decodeScheduleBytes(bytes), filename));
  });

  r.post('/projects/:id/schedule', { access: { action: 'projects:write' }, params: projectParamsSchema, before: [readScheduleUpload, idempotent] }, async (req, res, { params }) => {
    let bytes: Buffer | undefined;
    let filename: string | null = null;
    if (req.file) {
      bytes = req.file.buffer;
      // Only the file's own name is kept: folders in it (../../x.csv, C:\\x.csv) say nothing about the roof.
      filename = req.file.originalname.split(/[\\/]/).pop()!.slice(0, 200) || null;
    } else if (Buffer.isBuffer(req.body)) {
      bytes = req.body;
    }
    if (!bytes) throw invalidSchedule([{ message: `no CSV received: send it as the request body or in the form field '${SCHEDULE_FILE_FIELD}'` }]);
    const text = decodeScheduleBytes(bytes);
    res.status(201).json(await schedules.importCsv(currentUser(req), params.id, text, filename));
  });

  r.put('/projects/:id/schedule', { access: { action: 'projects:write' }, params: projectParamsSchema, body: putFacesBodySchema }, async (req, res, { params, body }) => {
    res.status(201).json(await schedules.replaceFaces(currentUser(req), params.id, body.faces, body.openings));
  });

  // ?optional=1: a site without a schedule is an answer (200, null), so a page that only asks whether
  // there is one makes no failed request; without it the answer stays 404 no_schedule.
  r.get('/projects/:id/schedule', { access: { action: 'projects:read' }, params: projectParamsSchema, query: currentScheduleQuerySchema }, async (req, res, { params, query }) => {
    try {
      res.json(await schedules.current(currentUser(req), params.id));
    } catch (error) {
      if (query.optional && error instanceof AppError && error.code === 'no_schedule') res.json(null);
      else throw error;
    }
  });

  r.get('/projects/:id/schedules', { access: { action: 'projects:read' }, params: projectParamsSchema }, async (req, res, { params }) => {
    res.json(await schedules.history(currentUser(req), params.id));
  });

  r.get('/projects/:id/schedules/:version', { access: { action: 'projects:read' }, params: scheduleVersionParamsSchema }, async (req, res, { params }) => {
    res.json(await schedules.version(currentUser(req), params.id, params.version));
  });

  return r.router;
}
