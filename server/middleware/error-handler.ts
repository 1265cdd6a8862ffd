import type { ErrorRequestHandler, RequestHandler } from 'express';
import { APIError } from 'better-auth/api';
import { ZodError } from 'zod';
import { AppError } from '../errors';
import { isStorageUnreachable, storageUnreachable } from '../storage/storage-errors';
import { databaseCannotWrite } from '../db/disk-full';

/** Unknown /api routes answer 404 in the common JSON shape. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ message: `There is no API route ${req.method} ${req.originalUrl.split("?")[0]}.`, code: 'route_not_found', requestId: req.id });
};

/** The last middleware: one JSON shape `{ message, code, requestId }`, logged once. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = String(req.id);
  // The one place where the object store being down becomes an answer (503, try again); before the
  // database check, whose socket codes (ECONNREFUSED…) the S3 client's errors share.
  if (isStorageUnreachable(err)) err = storageUnreachable();
  if (databaseCannotWrite(err)) {
    req.log.error({ err }, 'the database cannot write (disk full or I/O error): writes are refused until space is freed');
    res.set('Retry-After', '60');
    res.status(503).json({ message: 'Cohesia cannot save changes right now: its database disk is full. Nothing was changed and reading still works; please try again later.', code: 'database_full', requestId });
    return;
  }
  // Before the other kinds: better-auth and drizzle wrap the driver error that says the database went away.
  if (databaseUnavailable(err)) {
    req.log.error({ err }, 'database unavailable');
    res.set('Retry-After', '5');
    res.status(503).json({ message: 'The database is not reachable right now; nothing was changed. Try again in a moment.', code: 'database_unavailable', requestId });
    return;
  }
  if (err instanceof ZodError) {
    const fields: Record<string, string> = {};
    for (const issue of err.issues) fields[issue.path.join('.') || '_'] ??= issue.message;
    res.status(400).json({ message: 'Some fields need attention.', code: 'invalid_input', requestId, fields });
    return;
  }
  if (err instanceof AppError) {
    req.log.info({ code: err.code, status: err.status }, err.message);
    res.status(err.status).json({ message: err.message, code: err.code, requestId, ...(err.fields ? { fields: err.fields } : {}) });
    return;
  }
  if (err instanceof APIError) {
    const status = typeof err.statusCode === 'number' ? err.statusCode : 400;
    const body = (err.body ?? {}) as { message?: string; code?: string };
    req.log.info({ code: body.code, status }, body.message);
    res.status(status).json({ message: body.message ?? err.message, code: (body.code ?? 'auth_error').toLowerCase(), requestId });
    return;
  }
  if ((err as { type?: string }).type === 'entity.parse.failed') {
    res.status(400).json({ message: 'The request body is not valid JSON.', code: 'invalid_json', requestId });
    return;
  }
  if ((err as { type?: string }).type === 'entity.too.large') {
    res.status(413).json({ message: 'The request body is too large.', code: 'body_too_large', requestId });
    return;
  }
  req.log.error({ err }, 'unhandled error');
  res.status(500).json({ message: 'Something went wrong on our side. Quote this request id if you write to us.', code: 'internal', requestId });
};

// PostgreSQL SQLSTATEs of a server that is going away or not there yet: class 08
// (connection exception), 57P01-57P03 (shutdown, crash recovery, not accepting connections).
const UNAVAILABLE_STATES = /^(08...|57P0[123])$/;
const UNAVAILABLE_SOCKET = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT']);

/** Whether an error (or what it wraps: drizzle wraps driver errors in `cause`) means the database cannot be reached. */
export function databaseUnavailable(err: unknown): boolean {
  for (let e = err as { code?: unknown; message?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    const code = typeof e.code === 'string' ? e.code : '';
    if (UNAVAILABLE_STATES.test(code) || UNAVAILABLE_SOCKET.has(code)) return true;
    if (typeof e.message === 'string' && /Connection terminated|connection error and is not queryable|connection timeout|the database system is (starting|shutting) (up|down)/i.test(e.message)) return true;
  }
  return false;
}
