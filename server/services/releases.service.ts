import { LRUCache } from 'lru-cache';
import spdxLicences from 'spdx-license-list';
import { AppError, notFound } from '../errors';
import type { DepositingRepository, ReleaseRow } from '../repositories/depositing.repository';
import type { LabsRepository } from '../repositories/labs.repository';
import type { LabContext } from '../middleware/authorize';
import type { ReleaseReads } from './release-reads';
import { citations, datasetJsonLd, type CitableRelease } from '../releases/citation';
import { formatDoi, parseIdentifier } from '../../shared/identifiers';
import { paths } from '../../shared/paths';

type Deps = { repo: DepositingRepository; labs: LabsRepository; reads: ReleaseReads; doiPrefix: string; publicBaseUrl: string };

type Meta = {
  title?: string;
  description?: string;
  keywords?: string[];
  creators?: CitableRelease['creators'];
  species?: Array<{ name: string; commonName?: string }>;
  [k: string]: unknown;
};

export type CitationFormat = 'bibtex' | 'ris' | 'csl-json' | 'cff';

/** Public landing pages of releases, their citations, and identifier resolution. */
export function createReleasesService({ repo, labs, reads, doiPrefix, publicBaseUrl }: Deps) {
  // What a landing page reads besides the release: its dataset, lab and versions. All of it changes only
  // with a publication, a withdrawal or a lab's new name, which bump the catalogue's generation; so it is
  // kept per generation and dataset, and a landing page costs one primary-key read.
  const around = new LRUCache<string, Awaited<ReturnType<typeof readAround>>, string>({
    max: 2000,
    fetchMethod: (_key, _stale, { context: datasetId }) => readAround(datasetId),
  });
  async function readAround(datasetId: string) {
    const dataset = (await repo.findDataset(datasetId))!;
    const [lab, versions] = await Promise.all([labs.findById(dataset.labId), repo.releasesOf(dataset.id)]);
    return { dataset, lab, versions };
  }

  /** The release with its dataset, lab and versions, as of the current generation. */
  async function load(suffix: string) {
    const generation = await reads.generation();
    const rel = await reads.release(suffix, generation);
    if (!rel) throw notFound('The release');
    return { rel, ...(await around.fetch(`${generation}|${rel.datasetId}`, { context: rel.datasetId }))! };
  }

  function citable(rel: ReleaseRow, conceptSuffix: string): CitableRelease {
    const m = rel.metadata as Meta;
    return {
      doi: rel.doi,
      conceptDoi: formatDoi(doiPrefix, conceptSuffix),
      version: rel.version,
      title: rel.title,
      description: m.description ?? '',
      publishedAt: rel.publishedAt,
      licence: rel.licence,
      url: `${publicBaseUrl}${paths.release(rel.suffix)}`,
      keywords: m.keywords ?? [],
      creators: m.creators ?? [],
      publisher: 'Cohesia',
    };
  }

  return {
    async landing(suffix: string) {
      const { rel, dataset, lab, versions: all } = await load(suffix);
      const versions = all.map((r) => ({
        version: r.version,
        suffix: r.suffix,
        doi: r.doi,
        publishedAt: r.publishedAt.toISOString(),
        withdrawn: !!r.withdrawnAt,
      }));
      const c = citable(rel, dataset.suffix);
      const withdrawn = rel.withdrawnAt ? { at: rel.withdrawnAt.toISOString(), reason: rel.withdrawnReason ?? '' } : null;
      const files = withdrawn ? [] : await reads.files(rel.id);
      const meta = rel.metadata as Meta;
      const licence = (spdxLicences as Record<string, { name: string; url: string }>)[rel.licence];
      const cites = citations(c);
      return {
        suffix: rel.suffix,
        doi: rel.doi,
        version: rel.version,
        title: rel.title,
        publishedAt: rel.publishedAt.toISOString(),
        licence: { id: rel.licence, name: licence?.name ?? rel.licence, url: licence?.url ?? null },
        accessLevel: rel.accessLevel,
        embargoUntil: rel.embargoUntil?.toISOString() ?? null,
        changelog: rel.changelog,
        dataset: { suffix: dataset.suffix, doi: c.conceptDoi, lab: lab ? { name: lab.name, slug: lab.slug, isDemo: lab.isDemo } : null },
        versions,
        latestVersion: versions.filter((v) => !v.withdrawn).at(-1)?.version ?? null,
        // A withdrawn release keeps only what a citation needs.
        metadata: withdrawn ? { title: meta.title, creators: meta.creators } : rel.metadata,
        files: files.map((f) => ({ fileName: f.fileName, role: f.role, mediaType: f.mediaType, sizeBytes: f.sizeBytes, sha256: f.sha256 })),
        results: files.filter((f) => f.result).map((f) => ({ fileName: f.fileName, result: f.result })),
        withdrawn,
        citation: { styles: cites.styles },
        jsonLd: withdrawn
          ? null
          : datasetJsonLd({ ...c, accessLevel: rel.accessLevel, files: files.map((f) => ({ fileName: f.fileName, sizeBytes: f.sizeBytes, mediaType: f.mediaType })), species: (meta.species ?? []).map((s) => s.name), catalogUrl: publicBaseUrl }),
      };
    },

    /** The catalogue for scripts and the home page: newest releases first, with a cursor for the next page. */
    async list(limit: number, cursor?: string) {
      let before: { publishedAt: Date; id: string } | undefined;
      if (cursor) {
        const [at, id] = Buffer.from(cursor, 'base64url').toString('utf8').split('|');
        if (!id || Number.isNaN(Date.parse(at))) throw new AppError('bad_cursor', 'This page cursor is not valid.', 400);
        before = { publishedAt: new Date(at), id };
      }
      const rows = await repo.listReleases({ limit: limit + 1, before });
      const page = rows.slice(0, limit);
      const labsById = new Map<string, { name: string; slug: string }>();
      for (const r of page) {
        if (labsById.has(r.labId)) continue;
        const l = await labs.findById(r.labId);
        if (l) labsById.set(r.labId, { name: l.name, slug: l.slug });
      }
      const last = page.at(-1);
      return {
        items: page.map(({ release: r, labId }) => {
          const m = r.metadata as Meta & { groupType?: string; dimension?: number; numberOfIndividuals?: number };
          return {
            suffix: r.suffix,
            doi: r.doi,
            title: r.title,
            version: r.version,
            publishedAt: r.publishedAt.toISOString(),
            accessLevel: r.accessLevel,
            lab: labsById.get(labId) ?? null,
            species: (m.species ?? []).map((x) => x.name),
            groupType: m.groupType ?? null,
            dimension: m.dimension ?? null,
            individuals: m.numberOfIndividuals ?? null,
          };
        }),
        nextCursor: rows.length > limit && last ? Buffer.from(`${last.release.publishedAt.toISOString()}|${last.release.id}`).toString('base64url') : null,
      };
    },

    async citation(suffix: string, format: CitationFormat) {
      const { rel, dataset } = await load(suffix);
      const c = citations(citable(rel, dataset.suffix));
      const name = rel.suffix.replace(/[^\w.-]/g, '_');
      switch (format) {
        case 'bibtex':
          return { body: c.bibtex, type: 'application/x-bibtex; charset=utf-8', fileName: `${name}.bib` };
        case 'ris':
          return { body: c.ris, type: 'application/x-research-info-systems; charset=utf-8', fileName: `${name}.ris` };
        case 'csl-json':
          return { body: c.cslJson, type: 'application/vnd.citationstyles.csl+json; charset=utf-8', fileName: `${name}.csl.json` };
        case 'cff':
          return { body: c.cff, type: 'application/x-yaml; charset=utf-8', fileName: 'CITATION.cff' };
      }
    },

    /** A dataset's all-versions view: its releases and the newest one not withdrawn. */
    async dataset(suffix: string) {
      const dataset = await repo.findDatasetBySuffix(suffix);
      if (!dataset) throw notFound('The dataset');
      const versions = await repo.releasesOf(dataset.id);
      if (!versions.length) throw notFound('A release of this dataset');
      const latest = versions.filter((v) => !v.withdrawnAt).at(-1) ?? versions.at(-1)!;
      return { suffix: dataset.suffix, doi: formatDoi(doiPrefix, dataset.suffix), latest: latest.suffix, versions: versions.map((v) => ({ version: v.version, suffix: v.suffix })) };
    },

    /** Where `/doi/<identifier>` leads: a release or a dataset page of this portal, or null. */
    async resolve(identifier: string): Promise<string | null> {
      const id = parseIdentifier(identifier);
      if (!id || id.prefix !== doiPrefix) return null;
      if (id.version !== null) return (await repo.findReleaseBySuffix(id.suffix)) ? paths.release(id.suffix) : null;
      return (await repo.findDatasetBySuffix(id.datasetSuffix)) ? paths.datasetLanding(id.datasetSuffix) : null;
    },

    async withdraw(actorId: string, lab: LabContext, suffix: string, reason: string) {
      const { rel, dataset } = await load(suffix);
      if (dataset.labId !== lab.id) throw notFound('The release');
      if (rel.withdrawnAt) throw new AppError('already_withdrawn', 'This release is already withdrawn.', 409);
      await repo.transaction(async (tx) => {
        await repo.withdrawRelease(rel.id, { withdrawnAt: new Date(), withdrawnReason: reason, withdrawnBy: actorId }, tx);
        await repo.audit({ actorId, action: 'release.withdrawn', subjectType: 'release', subjectId: rel.id, fromState: 'published', toState: 'withdrawn', detail: { suffix: rel.suffix, reason } }, tx);
      });
      return { withdrawn: true };
    },
  };
}

export type ReleasesService = ReturnType<typeof createReleasesService>;
