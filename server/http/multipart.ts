import type { RequestHandler } from 'express';
import type multerModule from 'multer';
import type { Multer, MulterError, Options } from 'multer';

let loading: Promise<typeof multerModule> | undefined;

/** multer (with busboy) is loaded by the first upload, not at start: most servers rarely take one. */
const loadMulter = () => (loading ??= import('multer').then((m) => m.default));

/**
 * A multipart reader kept in memory, made from multer on the first request that needs it:
 * `multipartUpload({ limits }, (m) => m.single('file'))`.
 */
export function multipartUpload(options: Omit<Options, 'storage'>, pick: (upload: Multer) => RequestHandler): RequestHandler {
  let handler: Promise<RequestHandler> | undefined;
  return (req, res, next) => {
    handler ??= loadMulter().then((multer) => pick(multer({ storage: multer.memoryStorage(), ...options })));
    handler.then((h) => h(req, res, next), next);
  };
}

/** multer's own refusal (a limit passed, an unexpected field), told apart without loading multer. */
export const isMulterError = (err: unknown): err is MulterError => err instanceof Error && err.name === 'MulterError';
