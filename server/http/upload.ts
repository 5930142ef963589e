/**
 * File uploads: multer with memory storage (the bytes go to PostgreSQL, never to disk), one file
 * per request under a size limit; its type is read from its first bytes, never from its name or
 * the declared Content-Type; its name is made safe before anyone stores or sends it.
 */
import multer from 'multer';
import type { RequestHandler } from 'express';
import { AppError } from './errors';
import { UPLOAD_FIELD, type ATTACHMENT_TYPES } from '../../src/shared/api/fieldChanges';

export type DetectedType = (typeof ATTACHMENT_TYPES)[number];

/**
 * File signatures ("magic numbers"):
 *   PDF  "%PDF-" at offset 0 — ISO 32000-1:2008 §7.5.2 (file header);
 *   JPEG FF D8 FF — the SOI marker FF D8 (ITU-T T.81 | ISO/IEC 10918-1, Annex B) followed by the next marker's FF;
 *   PNG  89 50 4E 47 0D 0A 1A 0A — the PNG signature, ISO/IEC 15948:2004 §5.2 (W3C PNG 2nd ed. §5.2).
 */
const SIGNATURES: { type: DetectedType; bytes: number[]; extensions: string[] }[] = [
  { type: 'application/pdf', bytes: [0x25, 0x50, 0x44, 0x46, 0x2d], extensions: ['pdf'] },
  { type: 'image/jpeg', bytes: [0xff, 0xd8, 0xff], extensions: ['jpg', 'jpeg'] },
  { type: 'image/png', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], extensions: ['png'] },
];

/** The type the content says it is, or null when it is none of the accepted ones. */
export function detectType(content: Buffer): DetectedType | null {
  for (const s of SIGNATURES) if (content.length >= s.bytes.length && s.bytes.every((b, i) => content[i] === b)) return s.type;
  return null;
}

/** The longest stored file name in characters, extension included (a choice; well under every file system's 255). */
export const MAX_FILE_NAME_LENGTH = 120;
// Windows device names, refused as a base name on that system (Microsoft, "Naming Files, Paths, and Namespaces")
const RESERVED_BASE = /^(con|prn|aux|nul|com[0-9]|lpt[0-9])$/i;

/**
 * A file name safe to store, show and send in Content-Disposition: the last path segment only,
 * without control, bidirectional-override or reserved characters (< > : " / \ | ? * and ;), no
 * leading dots, not a device name, at most MAX_FILE_NAME_LENGTH characters, and an extension that
 * matches the detected type (the original one when it already does).
 */
export function sanitizeFileName(original: string, type: DetectedType): string {
  const signature = SIGNATURES.find((s) => s.type === type)!;
  let name = original.normalize('NFC');
  name = name.split(/[/\\]/).pop() ?? '';
  name = name
    // C0 and C1 control characters, DEL, and the bidirectional overrides and isolates that can disguise an extension
    .replace(/[\u0000-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, '')
    .replace(/[<>:"|?*;]/g, '_')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/^[.\s]+/, '')
    .replace(/[.\s]+$/, '');
  const dot = name.lastIndexOf('.');
  const ext = dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
  let base = dot > 0 ? name.slice(0, dot) : name;
  const keptExt = signature.extensions.includes(ext) ? ext : signature.extensions[0];
  base = base.replace(/[.\s]+$/, '');
  if (!base || RESERVED_BASE.test(base.split('.')[0])) base = `attachment${base ? `-${base}` : ''}`;
  const room = MAX_FILE_NAME_LENGTH - keptExt.length - 1;
  base = [...base].slice(0, room).join('').replace(/[.\s]+$/, '') || 'attachment';
  return `${base}.${keptExt}`;
}

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
    if (!req.is('multipart/form-data')) return next(new AppError(400, 'VALIDATION_FAILED', `Send the file as multipart/form-data in the field "${UPLOAD_FIELD}".`, { [UPLOAD_FIELD]: 'No file' }));
    upload(req, res, (err: unknown) => {
      if (!err) {
        if (!req.file) return next(new AppError(400, 'VALIDATION_FAILED', `Attach one file in the field "${UPLOAD_FIELD}".`, { [UPLOAD_FIELD]: 'No file' }));
        return next();
      }
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'VALIDATION_FAILED', `The file is larger than the ${megabytes(maxBytes)} limit; nothing was stored.`, { [UPLOAD_FIELD]: `Over ${megabytes(maxBytes)}` }));
        return next(new AppError(400, 'VALIDATION_FAILED', `Attach exactly one file in the field "${UPLOAD_FIELD}" (${err.message}); nothing was stored.`, { [err.field ?? UPLOAD_FIELD]: err.message }));
      }
      return next(new AppError(400, 'VALIDATION_FAILED', 'The upload could not be read; nothing was stored.', { [UPLOAD_FIELD]: 'Unreadable upload' }));
    });
  };
}
