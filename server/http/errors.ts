import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ApiErrorBody } from '../../src/contract/errors';

/** An error whose message is safe to show the client. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: ApiErrorBody['details'],
  ) {
    super(message);
  }
}

export const badRequest = (message: string, code = 'bad_request', details?: ApiErrorBody['details']) =>
  new HttpError(400, code, message, details);
export const notFound = (message = 'Not found.') => new HttpError(404, 'not_found', message);
export const conflict = (message: string, code = 'conflict') => new HttpError(409, code, message);

export function zodDetails(error: ZodError): NonNullable<ApiErrorBody['details']> {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(body)',
    message: issue.message,
  }));
}

interface BodyParserError {
  type?: string;
  status?: number;
  code?: string;
}

/** SQLite's "database is locked" after the busy timeout, as node-sqlite3 or Sequelize reports it. */
export function isDatabaseBusy(error: unknown): boolean {
  const e = error as { code?: unknown; parent?: { code?: unknown }; original?: { code?: unknown } } | null;
  return e?.code === 'SQLITE_BUSY' || e?.parent?.code === 'SQLITE_BUSY' || e?.original?.code === 'SQLITE_BUSY';
}

/** SQLite's "database or disk is full" (the disk, or the file's size limit), as node-sqlite3 or Sequelize reports it. */
export function isDatabaseFull(error: unknown): boolean {
  const e = error as { code?: unknown; parent?: { code?: unknown }; original?: { code?: unknown } } | null;
  return e?.code === 'SQLITE_FULL' || e?.parent?.code === 'SQLITE_FULL' || e?.original?.code === 'SQLITE_FULL';
}

/** The answer for a write the database could not take for now: busy or full. Nothing was stored either way. */
export function storageRefusal(error: unknown): HttpError | null {
  if (isDatabaseBusy(error)) return new HttpError(503, 'busy', 'The server is busy and saved nothing. Try again in a moment.');
  if (isDatabaseFull(error)) return new HttpError(503, 'storage_full', 'The server’s disk is full and it saved nothing. Tell the administrator; try again once space is freed.');
  return null;
}

export function createErrorHandler(log: (error: unknown) => void): ErrorRequestHandler {
  return (error, _req, res, _next) => {
    let status = 500;
    let body: ApiErrorBody = { error: 'Something went wrong on the server. Nothing you sent was saved.', code: 'internal' };
    const parserError = error as BodyParserError;
    if (error instanceof HttpError) {
      status = error.status;
      body = { error: error.message, code: error.code, ...(error.details ? { details: error.details } : {}) };
    } else if (error instanceof ZodError) {
      status = 400;
      body = { error: 'Some fields are not valid.', code: 'validation_failed', details: zodDetails(error) };
    } else if (parserError?.code === 'EBADCSRFTOKEN') {
      status = 403;
      body = { error: 'This form has expired. Reload the page and try again.', code: 'csrf_invalid' };
    } else if (parserError?.type === 'entity.parse.failed') {
      status = 400;
      body = { error: 'The request body is not valid JSON.', code: 'bad_json' };
    } else if (parserError?.type === 'entity.too.large') {
      status = 413;
      body = { error: 'The request body is too large.', code: 'too_large' };
    } else if (parserError?.type === 'encoding.unsupported' || parserError?.type === 'charset.unsupported') {
      status = 415;
      body = { error: 'Send the body as UTF-8 JSON.', code: 'unsupported_encoding' };
    } else if (typeof parserError?.status === 'number' && parserError.status >= 400 && parserError.status < 500) {
      status = parserError.status;
      body = { error: 'The request could not be read.', code: 'bad_request' };
    } else if (storageRefusal(error)) {
      // Busy: other writers held the database for longer than the busy timeout. Full: the disk (or the file's
      // limit) left no room. Nothing was written either way, and the same request can work later. Logged, since
      // it means the server is overloaded or out of space.
      log(error);
      const refusal = storageRefusal(error)!;
      status = 503;
      if (refusal.code === 'busy') res.setHeader('Retry-After', '2');
      body = { error: refusal.message, code: refusal.code };
    } else {
      log(error);
    }
    if (res.headersSent) return;
    res.status(status).json(body);
  };
}
