import { create } from 'xmlbuilder2';
import type { HarvestingRepository } from '../repositories/harvesting.repository';
import { paths } from '../../shared/paths';

const SITEMAP_NS = 'http://www.sitemaps.org/schemas/sitemap/0.9';

const day = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString().slice(0, 10) : undefined);

/** sitemap.xml (sitemaps.org protocol 0.9) and robots.txt for crawlers. */
export function createSitemapService({ repo, publicBaseUrl }: { repo: HarvestingRepository; publicBaseUrl: string }) {
  return {
    async sitemap(): Promise<string> {
      const { releases, labs } = await repo.sitemapEntries();
      const newest = releases[0]?.publishedAt;
      const doc = create({ version: '1.0', encoding: 'UTF-8', invalidCharReplacement: '' });
      const set = doc.ele(SITEMAP_NS, 'urlset');
      const url = (path: string, lastmod?: string) => {
        const u = set.ele('url');
        u.ele('loc').txt(`${publicBaseUrl}${path}`);
        if (lastmod) u.ele('lastmod').txt(lastmod);
      };
      url(paths.home, day(newest));
      url(paths.catalogue, day(newest));
      const datasets = new Map<string, Date>();
      for (const r of releases) {
        url(paths.release(r.suffix), day(r.publishedAt));
        // Releases come newest first, so the first seen is the dataset's newest.
        if (!datasets.has(r.datasetSuffix)) datasets.set(r.datasetSuffix, r.publishedAt);
      }
      for (const [suffix, at] of datasets) url(paths.datasetLanding(suffix), day(at));
      for (const lab of labs) url(paths.labProfile(lab.slug), day(lab.newest ?? lab.createdAt));
      return doc.end({ prettyPrint: true });
    },

    robots(): string {
      return ['User-agent: *', 'Disallow: /api/', 'Disallow: /account', 'Disallow: /admin/', 'Disallow: /dev/', 'Allow: /', '', `Sitemap: ${publicBaseUrl}/sitemap.xml`, ''].join('\n');
    },
  };
}

export type SitemapService = ReturnType<typeof createSitemapService>;
