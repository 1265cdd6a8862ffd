import { randomUUID } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import spdxLicences from 'spdx-license-list';
import type { Logger } from 'pino';
import { AppError, notFound } from '../errors';
import type { DepositingRepository, ReleaseRow } from '../repositories/depositing.repository';
import type { LabsRepository } from '../repositories/labs.repository';
import type { MultipartUploads } from '../storage/multipart-uploads';
import type { ObjectStore } from '../storage/object-store';
import type { ReleaseReads } from './release-reads';
import type { JobHandler } from '../jobs/job-queue';
import { buildBagItBundle } from '../releases/bagit-bundle';
import { releaseReadme } from '../releases/release-readme';
import { citations, type CitableRelease } from '../releases/citation';
import { formatDoi } from '../../shared/identifiers';
import { paths } from '../../shared/paths';

export const BUNDLE_JOB = 'build-bundle';
const URL_SECONDS = 5 * 60;
const SIGNED_URL_REUSE_MS = 60_000;

type Deps = {
  grants: { hasGrant(userId: string, datasetId: string, releaseId: string): Promise<boolean> };
  repo: DepositingRepository; reads: ReleaseReads; labs: LabsRepository; uploads: MultipartUploads; store: ObjectStore; doiPrefix: string; publicBaseUrl: string; log: Logger; now?: () => Date };

type Viewer = { userId: string | null; visitorKey?: string };

/**
 * Who may take a release's bytes, and how: every byte leaves through a
 * short-lived presigned URL issued after this check; the store is never public.
 * Open releases (and embargoed ones past their date) are for everyone; other
 * releases for the lab's members and for holders of a grant that has not expired or been revoked.
 */
export function createDownloadsService(d: Deps) {
  const now = d.now ?? (() => new Date());
  // Signing a URL costs more than the rest of a download request (the SDK's middleware stack and HMACs),
  // and a presigned URL only says "this object, until then". So one URL per object and file name is
  // handed to everyone who passes the access check during a minute: each link still lives at least
  // URL_SECONDS − 60 s (4 minutes) when it is handed out.
  const signed = new LRUCache<string, string, { objectKey: string; fileName: string }>({
    max: 5000,
    ttl: SIGNED_URL_REUSE_MS,
    fetchMethod: (_key, _stale, { context }) => d.uploads.signDownload(context.objectKey, context.fileName, URL_SECONDS),
  });
  const signDownload = async (objectKey: string, fileName: string) => (await signed.fetch(`${objectKey}\n${fileName}`, { context: { objectKey, fileName } }))!;

  async function access(rel: ReleaseRow, viewer: Viewer): Promise<{ allowed: boolean; reason: string }> {
    if (rel.withdrawnAt) return { allowed: false, reason: 'This release was withdrawn; its files are no longer available.' };
    if (rel.accessLevel === 'open') return { allowed: true, reason: 'open' };
    if (rel.accessLevel === 'embargoed' && rel.embargoUntil && rel.embargoUntil <= now()) return { allowed: true, reason: 'embargo over' };
    const dataset = (await d.repo.findDataset(rel.datasetId))!;
    if (viewer.userId && (await d.labs.roleOf(dataset.labId, viewer.userId))) return { allowed: true, reason: 'lab member' };
    if (viewer.userId && (await d.grants.hasGrant(viewer.userId, dataset.id, rel.id))) return { allowed: true, reason: 'granted' };
    return {
      allowed: false,
      reason:
        rel.accessLevel === 'restricted'
          ? 'The files of this release are shared on request by the depositing lab.'
          : `The files of this release are under embargo until ${rel.embargoUntil?.toISOString().slice(0, 10)}.`,
    };
  }

  async function releaseOr404(suffix: string) {
    const rel = await d.reads.release(suffix, await d.reads.generation());
    if (!rel) throw notFound('The release');
    return rel;
  }

  return {
    access,

    async accessBySuffix(suffix: string, viewer: Viewer) {
      const rel = await releaseOr404(suffix);
      const verdict = await access(rel, viewer);
      const all = await d.repo.releasesOf(rel.datasetId);
      return { ...verdict, bundleReady: !!rel.bundleKey, downloads: await d.repo.downloadCounts(all.map((r) => r.id)) };
    },

    async fileUrl(suffix: string, fileName: string, viewer: Viewer) {
      const rel = await releaseOr404(suffix);
      const verdict = await access(rel, viewer);
      if (!verdict.allowed) throw new AppError('no_access', verdict.reason, viewer.userId ? 403 : 401);
      const file = (await d.reads.files(rel.id)).find((f) => f.fileName === fileName);
      if (!file) throw notFound('The file');
      await d.repo.recordDownload({ id: randomUUID(), releaseId: rel.id, fileName, userId: viewer.userId, visitorKey: viewer.visitorKey ?? viewer.userId });
      return signDownload(file.objectKey, file.fileName);
    },

    async bundleUrl(suffix: string, viewer: Viewer) {
      const rel = await releaseOr404(suffix);
      const verdict = await access(rel, viewer);
      if (!verdict.allowed) throw new AppError('no_access', verdict.reason, viewer.userId ? 403 : 401);
      if (!rel.bundleKey) throw new AppError('bundle_pending', 'The bundle of this release is still being put together; try again in a minute.', 409);
      await d.repo.recordDownload({ id: randomUUID(), releaseId: rel.id, fileName: null, userId: viewer.userId, visitorKey: viewer.visitorKey ?? viewer.userId });
      return signDownload(rel.bundleKey, `${rel.suffix}.zip`);
    },

    /** The bundle job: builds the BagIt ZIP once; a retry after a crash starts it again from scratch. */
    bundleJob: (async (row) => {
      const rel = await d.repo.findRelease(String(row.payload.releaseId));
      if (!rel || rel.bundleKey) return;
      const dataset = (await d.repo.findDataset(rel.datasetId))!;
      const lab = await d.labs.findById(dataset.labId);
      const files = await d.repo.releaseFiles(rel.id);
      const meta = rel.metadata as Record<string, any>;
      const licence = (spdxLicences as Record<string, { name: string; url: string }>)[rel.licence];
      const landingUrl = `${d.publicBaseUrl}${paths.release(rel.suffix)}`;
      const citable: CitableRelease = {
        doi: rel.doi,
        conceptDoi: formatDoi(d.doiPrefix, dataset.suffix),
        version: rel.version,
        title: rel.title,
        description: meta.description ?? '',
        publishedAt: rel.publishedAt,
        licence: rel.licence,
        url: landingUrl,
        keywords: meta.keywords ?? [],
        creators: meta.creators ?? [],
        publisher: 'Cohesia',
      };
      const cites = citations(citable);
      const payload = files.map((f) => ({
        path: `data/${f.role}/${f.fileName}`,
        objectKey: f.objectKey,
        sizeBytes: f.sizeBytes,
        compressed: /gzip|zip|x-xz|x-bzip2/.test(f.mediaType) || /\.(gz|zip|xz|bz2)$/i.test(f.fileName),
      }));
      const statistics = Object.fromEntries(files.map((f) => [f.fileName, f.result ? { ...f.result, quickLook: undefined } : null]));
      const key = `releases/${rel.id}/bundle/${rel.suffix}.zip`;
      const built = await buildBagItBundle(d.store, {
        bagName: rel.suffix,
        objectKey: key,
        payloadFiles: payload,
        metadataFiles: [
          { path: 'data/metadata/metadata.json', content: JSON.stringify(rel.metadata, null, 2) + '\n' },
          { path: 'data/metadata/statistics.json', content: JSON.stringify(statistics, null, 2) + '\n' },
          { path: 'data/metadata/CITATION.cff', content: cites.cff },
          {
            path: 'data/metadata/README.txt',
            content: releaseReadme({
              title: rel.title,
              doi: rel.doi,
              conceptDoi: citable.conceptDoi,
              version: rel.version,
              publishedAt: rel.publishedAt,
              licence: { id: rel.licence, name: licence?.name ?? rel.licence, url: licence?.url ?? null },
              metadata: meta,
              files: files.map((f, i) => ({ path: payload[i].path, sizeBytes: f.sizeBytes, sha256: f.sha256 })),
              citation: cites.styles.apa,
              landingUrl,
            }),
          },
        ],
        bagInfo: {
          'Source-Organization': lab?.name ?? 'Cohesia',
          'Organization-Address': lab?.institution ?? '',
          'External-Identifier': rel.doi,
          'External-Description': rel.title,
          'Bagging-Date': now().toISOString().slice(0, 10),
          'Bag-Group-Identifier': citable.conceptDoi,
          'Bag-Software-Agent': 'Cohesia',
        },
      });
      await d.repo.setBundleKey(rel.id, key);
      d.log.info({ releaseId: rel.id, bytes: built.sizeBytes }, 'bundle built');
    }) as JobHandler,
  };
}

export type DownloadsService = ReturnType<typeof createDownloadsService>;
