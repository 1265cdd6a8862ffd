import { rateLimit, type Options } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import type { Config } from '../config';

type Limits = Config['security']['rateLimits'];

/**
 * Per-IP limits on the endpoints that guess passwords, send mail or notify
 * curators. One mechanism (express-rate-limit) for better-auth's routes and ours,
 * so every refusal has our error shape and a Retry-After header; better-auth's own
 * limiter is off (server/auth/create-auth.ts). The counters live in each process's
 * memory: behind N instances an address gets up to N times the limit.
 */
export function createRateLimits(limits: Limits) {
  const windowMs = limits.windowSeconds * 1000;
  const make = (limit: number, what: string): RequestHandler =>
    rateLimit({
      windowMs,
      limit,
      // RateLimit-* headers of the IETF draft; the old X-RateLimit-* ones add nothing.
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      handler: ((req, res, _next, options) => {
        const reset = (req as { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime?.getTime();
        const seconds = Math.max(1, Math.ceil(((reset ?? Date.now() + options.windowMs) - Date.now()) / 1000));
        res.set('Retry-After', String(seconds));
        res.status(429).json({
          message: `Too many ${what} from your address. Try again in ${seconds < 120 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`}.`,
          code: 'rate_limited',
          requestId: String(req.id),
        });
      }) as Options['handler'],
    });
  return {
    signIn: make(limits.signIn, 'sign-in attempts'),
    signUp: make(limits.signUp, 'sign-ups'),
    passwordReset: make(limits.passwordReset, 'password reset requests'),
    accessRequests: make(limits.accessRequests, 'access requests'),
  };
}
