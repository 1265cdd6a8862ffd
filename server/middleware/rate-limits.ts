import { rateLimit, type ClientRateLimitInfo, type Options, type Store } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import type { Config } from '../config';
import type { RateLimitRepository } from '../repositories/rate-limits.repository';

type Limits = Config['security']['rateLimits'];

/**
 * Per-IP limits on the endpoints that guess passwords, send mail or notify
 * curators. One mechanism (express-rate-limit) for better-auth's routes and ours,
 * so every refusal has our error shape and a Retry-After header; better-auth's own
 * limiter is off (server/auth/create-auth.ts). With `shared` (a PostgreSQL server) the
 * counters are rows of the database, so every instance counts the same hits; otherwise they
 * live in the process's memory (the embedded database has one process).
 */
export function createRateLimits(limits: Limits, shared?: RateLimitRepository) {
  const windowMs = limits.windowSeconds * 1000;
  const make = (limit: number, what: string, name: string): RequestHandler =>
    rateLimit({
      windowMs,
      limit,
      store: shared ? new DatabaseRateLimitStore(shared, `${name}:`) : undefined,
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
    signIn: make(limits.signIn, 'sign-in attempts', 'sign-in'),
    signUp: make(limits.signUp, 'sign-ups', 'sign-up'),
    passwordReset: make(limits.passwordReset, 'password reset requests', 'password-reset'),
    accessRequests: make(limits.accessRequests, 'access requests', 'access-requests'),
  };
}

/**
 * express-rate-limit's store interface over the database's counters (one row per limiter and
 * address, fixed windows as in its memory store). Counters whose window ended more than a window
 * ago are dropped now and then by whichever instance counts a hit.
 */
export class DatabaseRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;
  private nextSweep = 0;

  constructor(
    private readonly repo: RateLimitRepository,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const now = Date.now();
    if (now >= this.nextSweep) {
      this.nextSweep = now + this.windowMs;
      // Not awaited: a failed sweep only leaves old rows for the next one.
      void this.repo.sweep(new Date(now - this.windowMs)).catch(() => {});
    }
    const r = await this.repo.hit(this.prefix + key, this.windowMs);
    return { totalHits: r.hits, resetTime: r.resetAt };
  }

  async decrement(key: string): Promise<void> {
    await this.repo.unhit(this.prefix + key);
  }

  async resetKey(key: string): Promise<void> {
    await this.repo.reset(this.prefix + key);
  }
}
