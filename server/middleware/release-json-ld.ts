import type { RequestHandler } from 'express';
import type { ReleasesService } from '../services/releases.service';

const suffixForm = /^[\w.-]{4,60}$/;

/** The JSON-LD as a script element; `<` is escaped so no text in it can close the element (`</script>`). */
export const jsonLdScript = (doc: unknown) => `<script type="application/ld+json" data-from="server">${JSON.stringify(doc).replace(/</g, '\\u003c')}</script>`;

/**
 * Release pages are rendered in the browser, so crawlers that run no
 * JavaScript would miss their schema.org Dataset description: this puts it
 * into the app shell's <head> for `/releases/:suffix`. It buffers only that
 * one small HTML answer (the shell, from the built files or Vite) and leaves
 * every other answer untouched.
 */
export function releaseJsonLd(releases: Pick<ReleasesService, 'landing'>): RequestHandler {
  return async (req, res, next) => {
    const suffix = String(req.params.suffix ?? '');
    if (!suffixForm.test(suffix) || !req.accepts('html')) return next();
    let doc: unknown = null;
    try {
      doc = (await releases.landing(suffix)).jsonLd;
    } catch {
      // An unknown release: the client shows its own "not found".
    }
    if (!doc) return next();
    // The shell's validators (ETag, Last-Modified) describe the file without the JSON-LD: never answer 304 for it.
    delete req.headers['if-none-match'];
    delete req.headers['if-modified-since'];
    const chunks: Buffer[] = [];
    const end = res.end.bind(res) as (body?: unknown) => typeof res;
    const keep = (chunk: unknown) => {
      if (chunk && typeof chunk !== 'function') chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(String(chunk)));
    };
    res.write = ((chunk: unknown) => {
      keep(chunk);
      return true;
    }) as typeof res.write;
    res.end = ((chunk?: unknown) => {
      keep(chunk);
      let body = Buffer.concat(chunks);
      if (String(res.getHeader('content-type') ?? '').startsWith('text/html') && res.statusCode === 200) {
        body = Buffer.from(body.toString('utf8').replace('</head>', `${jsonLdScript(doc)}</head>`));
        res.removeHeader('etag');
        res.setHeader('content-length', body.length);
      }
      return end(body);
    }) as typeof res.end;
    next();
  };
}
