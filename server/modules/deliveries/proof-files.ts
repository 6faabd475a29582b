import type { RequestHandler } from 'express';
import { AppError } from '../../http/app-error';
import { isMulterError, multipartUpload } from '../../http/multipart';

/** At most six photos a delivery, each at most 8 MB; one signature. */
export const MAX_PHOTOS = 6;
export const MAX_FILE_BYTES = 8 * 1024 * 1024;
const THUMBNAIL_PX = 320;

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

export interface ProofFile {
  kind: 'signature' | 'photo';
  position: number;
  content_type: string;
  data: Buffer;
  thumbnail: Buffer | null;
}

const upload = multipartUpload({ limits: { fileSize: MAX_FILE_BYTES, files: MAX_PHOTOS + 1, fields: 20, fieldSize: 64 * 1024 } }, (m) =>
  m.fields([
    { name: 'signature', maxCount: 1 },
    { name: 'photos', maxCount: MAX_PHOTOS },
  ]),
);

/**
 * Reads a multipart delivery record into memory (files as buffers, text fields as strings); a JSON
 * body passes through untouched. Size and count limits become errors naming the field.
 */
export const proofUpload: RequestHandler = (req, res, next) => {
  if (!req.is('multipart/form-data')) return next();
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (isMulterError(err)) {
      const field = err.field ?? 'photos';
      if (err.code === 'LIMIT_FILE_SIZE') {
        return next(new AppError(413, 'file_too_large', `${field === 'signature' ? 'The signature' : 'A photo'} is larger than 8 MB: take it again at a smaller size`, [{ path: field, message: 'must be at most 8 MB' }]));
      }
      if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') {
        const message = field === 'photos' || err.code === 'LIMIT_FILE_COUNT' ? `at most ${MAX_PHOTOS} photos and one signature` : 'is not a file this form takes (signature, photos)';
        return next(AppError.unprocessable('too_many_files', `The delivery record takes at most ${MAX_PHOTOS} photos and one signature`, [{ path: field, message }]));
      }
      return next(AppError.badRequest('upload_invalid', `The upload could not be read: ${err.message}`, [{ path: field, message: err.message }]));
    }
    next(err);
  });
};

/** The multipart text fields as the JSON body would carry them (lines and position are JSON text). */
export function formFields(fields: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const problems: { path: string; message: string }[] = [];
  for (const [k, v] of Object.entries(fields)) {
    if (v === '' || v === undefined) continue;
    if (k === 'data') {
      // The phone sends every field as one JSON object named `data` beside the files.
      let parsed: unknown;
      try {
        parsed = JSON.parse(String(v));
      } catch {
        parsed = undefined;
      }
      if (parsed && typeof parsed === 'object' && !Array.isArray(parsed)) Object.assign(out, parsed);
      else problems.push({ path: 'data', message: 'must be JSON: an object of the delivery fields (receiver_name, note, delivered_at, position, lines)' });
    } else if (k === 'lines' || k === 'position') {
      try {
        out[k] = JSON.parse(String(v));
      } catch {
        problems.push({ path: k, message: k === 'lines' ? 'must be JSON: a list of {line_id, handed_over, short, damaged}' : 'must be JSON: {lat, lng, accuracy_m}' });
      }
    } else if (k === 'lat' || k === 'lng' || k === 'accuracy_m') {
      const n = Number(v);
      if (!Number.isFinite(n)) problems.push({ path: k, message: 'must be a number' });
      else out.position = { ...((out.position as object) ?? {}), [k]: n };
    } else {
      out[k] = v;
    }
  }
  if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'Some fields are not valid', problems);
  return out;
}

/** A photo's thumbnail: WebP, at most 320 px a side, stood the right way up by the phone's orientation tag. */
export async function makeThumbnail(photo: Buffer): Promise<Buffer> {
  const { default: sharp } = await import('sharp');
  return sharp(photo).rotate().resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 72 }).toBuffer();
}

/**
 * Checks every uploaded file by its bytes (never its name or declared type): the signature must be a
 * PNG, photos JPEG, PNG or WebP that decode as images. Photos get a thumbnail (WebP, at most 320 px);
 * the phone's orientation tag is applied so the thumbnail stands the right way up.
 */
export async function checkProofFiles(files: { signature?: Express.Multer.File[]; photos?: Express.Multer.File[] } | undefined): Promise<ProofFile[]> {
  if (!files) return [];
  const { fileTypeFromBuffer } = await import('file-type');
  const { default: sharp } = await import('sharp');
  const out: ProofFile[] = [];
  const problems: { path: string; message: string }[] = [];
  const signature = files.signature?.[0];
  if (signature) {
    const type = await fileTypeFromBuffer(signature.buffer);
    if (type?.mime !== 'image/png') problems.push({ path: 'signature', message: `must be a PNG image; this file is ${type ? type.mime : 'not an image'}` });
    else {
      try {
        await sharp(signature.buffer).metadata();
        out.push({ kind: 'signature', position: 0, content_type: 'image/png', data: signature.buffer, thumbnail: null });
      } catch {
        problems.push({ path: 'signature', message: 'is not a readable PNG image' });
      }
    }
  }
  for (const [i, photo] of (files.photos ?? []).entries()) {
    const name = photo.originalname ? ` (${photo.originalname})` : '';
    const type = await fileTypeFromBuffer(photo.buffer);
    if (!type || !(PHOTO_TYPES as readonly string[]).includes(type.mime)) {
      problems.push({ path: `photos.${i}`, message: `must be a JPEG, PNG or WebP photo${name}; its content is ${type ? type.mime : 'not an image'}` });
      continue;
    }
    try {
      const thumbnail = await makeThumbnail(photo.buffer);
      out.push({ kind: 'photo', position: i + 1, content_type: type.mime, data: photo.buffer, thumbnail });
    } catch {
      problems.push({ path: `photos.${i}`, message: `is not a readable image${name}` });
    }
  }
  if (problems.length > 0) throw AppError.unprocessable('file_type_refused', 'Some files are not the images the delivery record takes', problems);
  return out;
}
