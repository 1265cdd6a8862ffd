import type { RequestHandler } from 'express';
import { AppError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
// better-auth's session cookie, with or without the __Secure- prefix.
const SESSION_COOKIE = /(^|;\s*)(__Secure-)?[\w.-]*session_token=/;

/** The origin of an Origin or Referer header value, or null when it has none. */
function originOf(value: string | undefined): string | null {
  if (!value || value === 'null') return null;
  try {
    return new URL(value).origin;
  } catch {
    return null;
  }
}

/**
 * CSRF defence for our own /api routes (better-auth checks its /api/auth routes itself):
 * a state-changing request that carries a session cookie must come from one of our
 * origins, by its Origin header or, when a browser left that out, its Referer.
 * Requests with an API token (Authorization: Bearer) carry no ambient credentials and are exempt.
 */
export function sameOriginWrites(trustedOrigins: string[]): RequestHandler {
  const trusted = new Set(trustedOrigins.map((o) => new URL(o).origin));
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    if (/^Bearer\s/i.test(req.headers.authorization ?? '')) return next();
    if (!SESSION_COOKIE.test(req.headers.cookie ?? '')) return next();
    const origin = originOf(req.headers.origin) ?? originOf(req.headers.referer);
    if (origin && trusted.has(origin)) return next();
    throw new AppError(
      'cross_site_request',
      origin ? `Requests from ${origin} may not change data here.` : 'This request did not say which site sent it (no Origin header), so it was refused.',
      403,
    );
  };
}
