import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { Logger } from './logger';
import { issueFields } from './contracts/common';

export interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}

/**
 * The one error type of the app. `operational` errors are expected outcomes (bad input, not
 * found, conflict) and their message is shown to the user; anything else is a bug and its
 * details stay in the log.
 */
export class AppError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly fields?: Record<string, string>,
    public readonly operational = true,
  ) {
    super(message);
    this.name = 'AppError';
  }

  static badRequest(message: string, fields?: Record<string, string>) {
    return new AppError(400, 'invalid_input', message, fields);
  }
  static unauthorized(message = 'Sign in to continue.') {
    return new AppError(401, 'not_signed_in', message);
  }
  static forbidden(message = 'Your role does not give access to this.') {
    return new AppError(403, 'forbidden', message);
  }
  static notFound(what: string) {
    return new AppError(404, 'not_found', `${what} was not found.`);
  }
  static conflict(message: string, fields?: Record<string, string>) {
    return new AppError(409, 'conflict', message, fields);
  }
}

/** Turns zod issues into `{ field: message }`, using dotted paths (`axles.0.sprungMassKg`). */
export const zodFields = (err: ZodError) => issueFields(err);

export function toAppError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  if (err instanceof ZodError) {
    return AppError.badRequest('Some values are not valid.', zodFields(err));
  }
  const e = err as { name?: string; errors?: { path?: string; message?: string }[]; type?: string; status?: number };
  if (e?.name === 'SequelizeUniqueConstraintError') {
    const fields: Record<string, string> = {};
    for (const item of e.errors ?? []) if (item.path) fields[item.path] = 'is already in use';
    return AppError.conflict('A record with the same value already exists.', fields);
  }
  if (e?.name === 'SequelizeForeignKeyConstraintError') {
    return AppError.conflict('This refers to a record that does not exist, or is still referred to by others.');
  }
  if (e?.type === 'entity.parse.failed') return AppError.badRequest('The request body is not valid JSON.');
  if (e?.type === 'entity.too.large') return new AppError(413, 'too_large', 'The request body is too large.');
  if (e?.type === 'encoding.unsupported') {
    return new AppError(415, 'unsupported_encoding', 'The request body\'s Content-Encoding is not supported; send it uncompressed, or as gzip, deflate or br.');
  }
  // the router's URIError for a malformed %-escape in the address (e.g. /api/vehicles/%E0%A4%A)
  if (err instanceof URIError) return AppError.badRequest('The address has a malformed %-escape.', { address: 'is not valid percent-encoding' });
  // any other client error raised by Express or body-parser, with its own status
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
    return new AppError(e.status, 'bad_request', (err as { expose?: boolean }).expose ? (err as Error).message : 'The request could not be read.');
  }
  return new AppError(500, 'internal', 'Something went wrong on our side. The error has been logged.', undefined, false);
}

export function errorHandler(log: Logger, production: boolean): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const appErr = toAppError(err);
    if (!appErr.operational) {
      log.error(`${req.method} ${req.originalUrl} failed`, err);
    }
    // A streamed answer (a CSV download) that failed part-way: its status is sent, so cut it short.
    if (res.headersSent) {
      res.destroy();
      return;
    }
    const body: ErrorBody = { error: { code: appErr.code, message: appErr.message } };
    if (appErr.fields) body.error.fields = appErr.fields;
    if (!production && !appErr.operational && err instanceof Error) {
      body.error.message += ` (${err.message})`;
    }
    res.status(appErr.status).json(body);
  };
}
