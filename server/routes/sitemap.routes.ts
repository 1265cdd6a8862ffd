import { access } from '../middleware/authorize';
import type { SitemapService } from '../services/sitemap.service';
import { route } from './route';

/** Crawler files at the site root: the sitemap and robots.txt pointing to it. */
export function sitemapRoutes(svc: SitemapService) {
  return [
    route({
      method: 'get', path: '/sitemap.xml', access: access.public,
      summary: 'sitemaps.org sitemap: home, catalogue, every release and dataset page not withdrawn, every lab page, with lastmod',
      handler: async (_req, res) => res.type('application/xml; charset=utf-8').send(await svc.sitemap()),
    }),
    route({
      method: 'get', path: '/robots.txt', access: access.public, summary: 'robots.txt, pointing crawlers to the sitemap',
      handler: async (_req, res) => res.type('text/plain; charset=utf-8').send(svc.robots()),
    }),
  ];
}
