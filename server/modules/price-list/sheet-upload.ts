import express, { type Request, type RequestHandler } from 'express';
import { MAX_SHEET_BYTES, SHEET_CONTENT_TYPES, SHEET_FILE_FIELD } from '../../../shared/schemas/price-list.schema';
import { AppError } from '../../http/app-error';
import { isMulterError, multipartUpload } from '../../http/multipart';
import { invalidSheet } from './sheet-file';

const raw = express.raw({ type: [...SHEET_CONTENT_TYPES, 'application/octet-stream'], limit: MAX_SHEET_BYTES });
const multipart = multipartUpload({ defParamCharset: 'utf8', limits: { fileSize: MAX_SHEET_BYTES, files: 1, fields: 10 } }, (m) => m.single(SHEET_FILE_FIELD));

/**
 * Reads a price-list or stock file after the access check: the CSV or .xlsx as the request body, or
 * a multipart form with the field `file`. Size limits answer 413 through the central handler.
 */
export const readSheetUpload: RequestHandler = (req, res, next) => {
  if (req.is('multipart/form-data')) {
    multipart(req, res, (err: unknown) => {
      if (!err) return next();
      if (isMulterError(err) && err.code !== 'LIMIT_FILE_SIZE') {
        return next(invalidSheet([{ message: `send one file in the form field '${SHEET_FILE_FIELD}' (${err.message})` }]));
      }
      next(err);
    });
    return;
  }
  if (req.is([...SHEET_CONTENT_TYPES, 'application/octet-stream'])) return raw(req, res, next);
  next(new AppError(415, 'unsupported_media_type', `Send the file as text/csv, as .xlsx, or as a multipart form with the field '${SHEET_FILE_FIELD}'`));
};

/** The uploaded bytes, wherever they came. */
export function uploadedBytes(req: Request): Buffer {
  if (req.file) return req.file.buffer;
  if (Buffer.isBuffer(req.body) && req.body.length > 0) return req.body;
  throw invalidSheet([{ row: 1, message: `no file received: send it as the request body or in the form field '${SHEET_FILE_FIELD}'` }]);
}
