import { LRUCache } from 'lru-cache';
import type { DepositingRepository, ReleaseFileRow, ReleaseRow } from '../repositories/depositing.repository';

/**
 * Reads of published releases, kept in memory. A release and its files never
 * change (a database trigger refuses it) except for a withdrawal and the
 * bundle key set once, and both bump the catalogue's generation; so a release is kept per
 * generation (one primary-key read tells whether it is still current, on every
 * instance) and its files are kept for good. Both are bounded: the least
 * recently used go first. Kept objects are shared: callers must not change them.
 */
export function createReleaseReads(repo: DepositingRepository) {
  const files = new LRUCache<string, ReleaseFileRow[]>({ max: 1000, fetchMethod: (releaseId) => repo.releaseFiles(releaseId) });
  const releases = new LRUCache<string, ReleaseRow, string>({
    max: 2000,
    // lru-cache runs one read for many concurrent asks of the same key; undefined (no such release) is not kept.
    fetchMethod: (_key, _stale, { context: suffix }) => repo.findReleaseBySuffix(suffix),
  });
  return {
    generation: () => repo.catalogueGeneration(),
    /** The release with this suffix as of `generation`, or undefined. */
    release: (suffix: string, generation: string) => releases.fetch(`${generation}|${suffix}`, { context: suffix }),
    /** A release's files with their result documents, ordered by name. */
    files: async (releaseId: string) => (await files.fetch(releaseId)) ?? [],
  };
}

export type ReleaseReads = ReturnType<typeof createReleaseReads>;
