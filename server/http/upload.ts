/**
 * File uploads: multer with memory storage (the bytes go to PostgreSQL, never to disk), one file
 * per request under a size limit; its type is read from its first bytes, never from its name or
 * the declared Content-Type (server/services/fileTypes.ts); its name is made safe before anyone
 * stores or sends it.
 */
import multer from 'multer';
import type { RequestHandler } from 'express';
import { AppError } from './errors';
import { UPLOAD_FIELD } from '../../src/shared/api/fieldChanges';

export { MAX_FILE_NAME_LENGTH, type DetectedType } from '../services/fileTypes';

/** An ASCII-only fallback of a safe name for the plain `filename=` parameter (RFC 6266 §4.3). */
export const asciiFallback = (name: string) => name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\%]/g, '_');

/** A value for `filename*=UTF-8''…` (RFC 5987 §3.2.1): every byte outside attr-char percent-encoded. */
export const rfc5987 = (name: string) => encodeURIComponent(name).replace(/['()*!]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);

const megabytes = (bytes: number) => `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;

/**
 * One file in the form field "file", held in memory, at most `maxBytes`. Multer's refusals become
 * the API's errors: over the limit → 413, anything but one file in "file" → 400.
 */
export function singleFileUpload(maxBytes: number): RequestHandler {
  const options: multer.Options & { defParamCharset?: string } = {
    storage: multer.memoryStorage(),
    // names in UTF-8, as browsers send them (multer 2.x option; @types/multer 2.0.0 lacks it)
    defParamCharset: 'utf8',
    // a few small text fields at most (a choice)
    limits: { fileSize: maxBytes, files: 1, fields: 4, fieldSize: 1024, parts: 6, headerPairs: 50 },
  };
  const upload = multer(options).single(UPLOAD_FIELD);
  return (req, res, next) => {
    if (!req.is('multipart/form-data'))
      return next(
        new AppError(400, 'VALIDATION_FAILED', `Send the file as multipart/form-data in the field "${UPLOAD_FIELD}".`, { [UPLOAD_FIELD]: 'No file' }),
      );
    upload(req, res, (err: unknown) => {
      if (!err) {
        if (!req.file) return next(new AppError(400, 'VALIDATION_FAILED', `Attach one file in the field "${UPLOAD_FIELD}".`, { [UPLOAD_FIELD]: 'No file' }));
        return next();
      }
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE')
          return next(
            new AppError(413, 'VALIDATION_FAILED', `The file is larger than the ${megabytes(maxBytes)} limit; nothing was stored.`, {
              [UPLOAD_FIELD]: `Over ${megabytes(maxBytes)}`,
            }),
          );
        return next(
          new AppError(400, 'VALIDATION_FAILED', `Attach exactly one file in the field "${UPLOAD_FIELD}" (${err.message}); nothing was stored.`, {
            [err.field ?? UPLOAD_FIELD]: err.message,
          }),
        );
      }
      return next(new AppError(400, 'VALIDATION_FAILED', 'The upload could not be read; nothing was stored.', { [UPLOAD_FIELD]: 'Unreadable upload' }));
    });
  };
}
