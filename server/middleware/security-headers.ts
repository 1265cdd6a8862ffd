import helmet from 'helmet';
import type { RequestHandler } from 'express';
import type { Config } from '../config';

/**
 * The Content-Security-Policy directives of the app. Built from configuration
 * because the browser uploads straight to the object store (presigned URLs).
 */
export function contentSecurityPolicy(config: Pick<Config, 'publicBaseUrl' | 's3'>, opts: { dev?: boolean } = {}) {
  const objectStore = new URL(config.s3.endpoint).origin;
  const https = config.publicBaseUrl.startsWith('https://');
  const directives: Record<string, string[]> = {
    'default-src': ["'self'"],
    // Only the built bundles; the build emits no inline script (checked by the CSP browser test).
    'script-src': opts.dev ? ["'self'", "'unsafe-inline'"] : ["'self'"],
    // Stylesheets only from the build; Vite's dev server injects <style> tags, so dev allows inline.
    'style-src': opts.dev ? ["'self'", "'unsafe-inline'"] : ["'self'"],
    'style-src-elem': opts.dev ? ["'self'", "'unsafe-inline'"] : ["'self'"],
    // Charts and the uploader set style attributes; attributes cannot run code, <style> elements stay refused.
    'style-src-attr': ["'unsafe-inline'"],
    'img-src': ["'self'", 'data:', 'blob:'],
    'font-src': ["'self'"],
    // Direct multipart uploads PUT to the store; Vite's HMR needs its web socket in dev.
    'connect-src': opts.dev ? ["'self'", objectStore, 'ws:', 'wss:'] : ["'self'", objectStore],
    // three.js and the uploader may start workers from blob URLs.
    'worker-src': ["'self'", 'blob:'],
    'frame-ancestors': ["'none'"],
    'object-src': ["'none'"],
    'base-uri': ["'self'"],
    // No form posts anywhere else: checkout is reached by navigation to the URL the API returns.
    'form-action': ["'self'"],
  };
  // Only meaningful behind https; on plain http it would break every request.
  if (https) directives['upgrade-insecure-requests'] = [];
  return directives;
}

/** helmet with our CSP; HSTS only when the public address is https (it is ignored on http anyway). */
export function securityHeaders(config: Pick<Config, 'publicBaseUrl' | 's3'>, opts: { dev?: boolean } = {}): RequestHandler {
  const https = config.publicBaseUrl.startsWith('https://');
  return helmet({
    contentSecurityPolicy: { useDefaults: false, directives: contentSecurityPolicy(config, opts) },
    strictTransportSecurity: https ? { maxAge: 180 * 24 * 3600, includeSubDomains: true } : false,
    referrerPolicy: { policy: 'strict-origin-when-cross-origin' },
  });
}
