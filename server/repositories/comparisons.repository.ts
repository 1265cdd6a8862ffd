import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { comparison, dataset, organization, release, releaseFile, user } from '../db/schema';

/** A release with what the comparison needs: its lab and the results of its trajectory files. */
export type ComparableRelease = {
  id: string;
  suffix: string;
  doi: string;
  title: string;
  version: number;
  accessLevel: 'open' | 'restricted' | 'embargoed';
  withdrawn: boolean;
  metadata: Record<string, unknown>;
  lab: { name: string; slug: string } | null;
  files: { fileName: string; result: unknown }[];
};

export function createComparisonsRepository(db: Db) {
  const releaseColumns = {
    id: release.id,
    suffix: release.suffix,
    doi: release.doi,
    title: release.title,
    version: release.version,
    accessLevel: release.accessLevel,
    withdrawnAt: release.withdrawnAt,
    metadata: release.metadata,
    labName: organization.name,
    labSlug: organization.slug,
  };

  /** Attaches the trajectory files' results; `light` keeps only parameters and summary (no plot series). */
  async function withFiles(rows: { id: string; suffix: string; doi: string; title: string; version: number; accessLevel: ComparableRelease['accessLevel']; withdrawnAt: Date | null; metadata: Record<string, unknown>; labName: string | null; labSlug: string | null }[], light: boolean): Promise<ComparableRelease[]> {
    if (!rows.length) return [];
    const result = light
      ? sql<unknown>`jsonb_build_object('parameters', ${releaseFile.result}->'parameters', 'summary', ${releaseFile.result}->'summary')`
      : sql<unknown>`${releaseFile.result} - 'quickLook' - 'pairs'`;
    const files = await db
      .select({ releaseId: releaseFile.releaseId, fileName: releaseFile.fileName, result })
      .from(releaseFile)
      .where(and(inArray(releaseFile.releaseId, rows.map((r) => r.id)), eq(releaseFile.role, 'trajectories'), sql`${releaseFile.result} is not null`));
    return rows.map((r) => ({
      id: r.id,
      suffix: r.suffix,
      doi: r.doi,
      title: r.title,
      version: r.version,
      accessLevel: r.accessLevel,
      withdrawn: r.withdrawnAt !== null,
      metadata: r.metadata,
      lab: r.labName && r.labSlug ? { name: r.labName, slug: r.labSlug } : null,
      files: files.filter((f) => f.releaseId === r.id).map((f) => ({ fileName: f.fileName, result: f.result })),
    }));
  }

  return {
    /** The releases with these suffixes (in no particular order), with their full results. */
    async releasesBySuffix(suffixes: string[]) {
      if (!suffixes.length) return [];
      const rows = await db
        .select(releaseColumns)
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .leftJoin(organization, eq(organization.id, dataset.labId))
        .where(inArray(release.suffix, suffixes));
      return withFiles(rows, false);
    },

    /** The newest non-withdrawn release of every dataset, with parameters and summaries only. */
    async newestReleases() {
      const newest = sql`${release.version} = (select max(r2.version) from ${release} r2 where r2.dataset_id = ${release.datasetId} and r2.withdrawn_at is null)`;
      const rows = await db
        .select(releaseColumns)
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .leftJoin(organization, eq(organization.id, dataset.labId))
        .where(and(sql`${release.withdrawnAt} is null`, newest))
        .orderBy(desc(release.publishedAt));
      return withFiles(rows, true);
    },

    async insert(values: { id: string; ownerId: string; title: string; releaseSuffixes: string[] }) {
      const [row] = await db.insert(comparison).values(values).returning();
      return row;
    },
    async update(id: string, values: { title: string; releaseSuffixes: string[] }) {
      const [row] = await db.update(comparison).set(values).where(eq(comparison.id, id)).returning();
      return row;
    },
    async remove(id: string) {
      await db.delete(comparison).where(eq(comparison.id, id));
    },
    async find(id: string) {
      const [row] = await db
        .select({ comparison, ownerName: user.name })
        .from(comparison)
        .innerJoin(user, eq(user.id, comparison.ownerId))
        .where(eq(comparison.id, id));
      return row;
    },
    async listOf(ownerId: string) {
      return db.select().from(comparison).where(eq(comparison.ownerId, ownerId)).orderBy(desc(comparison.updatedAt));
    },
  };
}

export type ComparisonsRepository = ReturnType<typeof createComparisonsRepository>;
