import type { ErrorRequestHandler, RequestHandler } from 'express';
import { APIError } from 'better-auth/api';
import { ZodError } from 'zod';
import { AppError } from '../errors';

/** Unknown /api routes answer 404 in the common JSON shape. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ message: `There is no API route ${req.method} ${req.originalUrl.split("?")[0]}.`, code: 'route_not_found', requestId: req.id });
};

/** The last middleware: one JSON shape `{ message, code, requestId }`, logged once. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = String(req.id);
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
