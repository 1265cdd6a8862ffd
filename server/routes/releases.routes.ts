import { z } from 'zod';
import { createHash } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { access, type Actor } from '../middleware/authorize';
import type { CitationFormat, ReleasesService } from '../services/releases.service';
import type { DownloadsService } from '../services/downloads.service';
import { withdrawInput } from '../../shared/contracts';
import { route } from './route';

const suffix = z.string().min(4).max(60);
const format = z.enum(['bibtex', 'ris', 'csl-json', 'cff']);

export function releasesRoutes(svc: ReleasesService, downloads: DownloadsService) {
  const viewer = (res: Response, req?: Request) => {
    const userId = (res.locals.actor as Actor | undefined)?.user.id ?? null;
    // COUNTER's session rule for visitors who are not signed in: address + browser, per day.
    const day = new Date().toISOString().slice(0, 10);
    const visitorKey = userId ? `user:${userId}` : `anon:${createHash('sha256').update(`${req?.ip}|${req?.headers['user-agent'] ?? ''}|${day}`).digest('hex').slice(0, 32)}`;
    return { userId, visitorKey };
  };
  return [
    route({
      method: 'get', path: '/api/releases', access: access.public, summary: 'The catalogue: published releases, newest first (cursor pagination)',
      handler: async (req, res) => {
        const q = z.object({ limit: z.coerce.number().int().min(1).max(100).default(20), cursor: z.string().max(200).optional() }).parse(req.query);
        res.json(await svc.list(q.limit, q.cursor));
      },
    }),
    route({
      method: 'get', path: '/api/releases/:suffix', access: access.public, summary: "A release's landing page: metadata, files, statistics, versions, citation",
      handler: async (req, res) => res.json(await svc.landing(suffix.parse(req.params.suffix))),
    }),
    route({
      method: 'get', path: '/api/releases/:suffix/access', access: access.public, summary: 'Whether the caller may download the files, why, and the download count',
      handler: async (req, res) => res.json(await downloads.accessBySuffix(suffix.parse(req.params.suffix), viewer(res))),
    }),
    route({
      method: 'get', path: '/api/releases/:suffix/files/:fileName/download', access: access.public, summary: 'Download one file: a short-lived presigned URL, after the access check (302)',
      handler: async (req, res) => res.redirect(302, await downloads.fileUrl(suffix.parse(req.params.suffix), z.string().min(1).max(500).parse(req.params.fileName), viewer(res, req))),
    }),
    route({
      method: 'get', path: '/api/releases/:suffix/bundle', access: access.public, summary: 'Download the BagIt bundle (ZIP) of the release (302 to a presigned URL)',
      handler: async (req, res) => res.redirect(302, await downloads.bundleUrl(suffix.parse(req.params.suffix), viewer(res, req))),
    }),
    route({
      method: 'get', path: '/api/releases/:suffix/citation/:format', access: access.public, summary: 'The citation as BibTeX, RIS, CSL-JSON or CITATION.cff',
      handler: async (req, res) => {
        const out = await svc.citation(suffix.parse(req.params.suffix), format.parse(req.params.format) as CitationFormat);
        res.type(out.type).attachment(out.fileName).send(out.body);
      },
    }),
    route({
      method: 'get', path: '/api/datasets/:suffix', access: access.public, summary: "A dataset's versions and its newest release",
      handler: async (req, res) => res.json(await svc.dataset(suffix.parse(req.params.suffix))),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/releases/:suffix/withdraw', access: access.labOrAdmin({ lab: ['update'] }),
      summary: 'Withdraw a release (lab lead or platform admin); its page becomes a tombstone that keeps the citation', body: withdrawInput,
      handler: async (req, res, body) => res.json(await svc.withdraw((res.locals.actor as Actor).user.id, res.locals.lab!, suffix.parse(req.params.suffix), body.reason)),
    }),
  ];
}

/** `/doi/<identifier>`: the portal resolves its own identifiers, in any letter case. */
export function doiResolver(svc: ReleasesService): RequestHandler {
  return async (req, res, next) => {
    // Express 5 hands the wildcard over as path segments.
    const splat = (req.params as Record<string, unknown>).splat;
    const raw = Array.isArray(splat) ? splat.join('/') : String(splat ?? '');
    const target = await svc.resolve(raw);
    if (target) return res.redirect(302, target);
    next();
  };
}
