import multer from 'multer';
import type { RequestHandler } from 'express';
import { AppError } from '../errors';

/**
 * One uploaded file in the multipart field `file`, held in memory up to `maxBytes`. Multer's
 * own errors (too large, wrong field, too many files) become 400/413 errors naming the field.
 */
export function singleFile(maxBytes: number): RequestHandler {
  const mw = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 10, fieldSize: 10_000 } }).single('file');
  return (req, res, next) => {
    mw(req, res, (err: unknown) => {
      if (!err) return next();
      const e = err as { code?: string; field?: string };
      if (e.code === 'LIMIT_FILE_SIZE') {
        return next(new AppError(413, 'too_large', `The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB.`, { file: `must be at most ${Math.round(maxBytes / 1024 / 1024)} MB` }));
      }
      if (e.code === 'LIMIT_UNEXPECTED_FILE' || e.code === 'LIMIT_FILE_COUNT') {
        return next(AppError.badRequest('Send one file in the form field "file".', { file: 'send exactly one file in the field "file"' }));
      }
      if (e.code?.startsWith('LIMIT_')) return next(AppError.badRequest('The form is too large.', { _: String(e.code) }));
      next(AppError.badRequest('The upload could not be read. Send it as multipart/form-data with the field "file".', { file: 'could not be read' }));
    });
  };
}

/** The uploaded file, or a 400 naming the `file` field. */
export function requireFile(file: Express.Multer.File | undefined): Express.Multer.File {
  if (!file) throw AppError.badRequest('Choose a file to upload.', { file: 'is required (multipart field "file")' });
  return file;
}

/** The upload as UTF-8 text, refusing binary content (checked from the bytes, not the name). */
export function textOf(file: Express.Multer.File): string {
  const buf = file.buffer;
  const sample = buf.subarray(0, Math.min(buf.length, 8192));
  if (sample.includes(0)) throw AppError.badRequest('The file is not a text CSV file.', { file: 'is binary; upload a CSV text file' });
  const text = buf.toString('utf8');
  if (text.includes('\uFFFD')) throw AppError.badRequest('The file is not UTF-8 text.', { file: 'is not UTF-8 text; save it as CSV (UTF-8)' });
  return text;
}
