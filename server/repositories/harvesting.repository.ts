import { and, asc, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../db/client';
import { dataset, organization, release, releaseFile } from '../db/schema';

/**
 * A release's datestamp for harvesters: when it was published, or withdrawn
 * (a withdrawal changes the record to a deleted one), to the second, in UTC.
 */
const changedAt = sql`greatest(${release.publishedAt}, coalesce(${release.withdrawnAt}, ${release.publishedAt}))`;
const stamp = sql`date_trunc('second', ${changedAt})`;
const stampText = sql<string>`to_char(${stamp} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"')`;
// Lists are ordered by the exact time (microseconds), so records of one second keep their real order.
const positionText = sql<string>`to_char(${changedAt} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

export type HarvestFilter = { from?: Date; until?: Date; labSlug?: string };

const itemColumns = {
  id: release.id,
  suffix: release.suffix,
  doi: release.doi,
  version: release.version,
  title: release.title,
  metadata: release.metadata,
  licence: release.licence,
  accessLevel: release.accessLevel,
  embargoUntil: release.embargoUntil,
  publishedAt: release.publishedAt,
  withdrawnAt: release.withdrawnAt,
  datasetId: release.datasetId,
  datasetSuffix: dataset.suffix,
  labSlug: organization.slug,
  labName: organization.name,
  datestamp: stampText,
  position: positionText,
};

export type HarvestItem = {
  id: string;
  suffix: string;
  doi: string;
  version: number;
  title: string;
  metadata: Record<string, unknown>;
  licence: string;
  accessLevel: 'open' | 'restricted' | 'embargoed';
  embargoUntil: Date | null;
  publishedAt: Date;
  withdrawnAt: Date | null;
  datasetId: string;
  datasetSuffix: string;
  labSlug: string;
  labName: string;
  datestamp: string;
  // Where the record sits in list order (exact change time); resumption tokens carry it.
  position: string;
};

const iso = (d: Date) => d.toISOString();

/** Read-only views of releases for harvesters and crawlers (OAI-PMH, sitemap). */
export function createHarvestingRepository(db: Db) {
  const where = (f: HarvestFilter, after?: { position: string; id: string }) => {
    const parts: SQL[] = [];
    if (f.from) parts.push(sql`${stamp} >= ${iso(f.from)}::timestamptz`);
    if (f.until) parts.push(sql`${stamp} <= ${iso(f.until)}::timestamptz`);
    if (f.labSlug) parts.push(eq(organization.slug, f.labSlug));
    if (after) parts.push(sql`(${changedAt}, ${release.id}) > (${after.position}::timestamptz, ${after.id})`);
    return parts.length ? and(...parts) : undefined;
  };
  const base = () =>
    db.select(itemColumns).from(release).innerJoin(dataset, eq(release.datasetId, dataset.id)).innerJoin(organization, eq(dataset.labId, organization.id));

  return {
    async earliestDatestamp(): Promise<string | null> {
      const [row] = await db.select({ d: sql<string | null>`to_char(min(${stamp}) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"')` }).from(release);
      return row?.d ?? null;
    },

    /** Releases in the order they changed (then id), after a keyset position. */
    async items(f: HarvestFilter, limit: number, after?: { position: string; id: string }): Promise<HarvestItem[]> {
      return (await base()
        .where(where(f, after))
        .orderBy(asc(changedAt), asc(release.id))
        .limit(limit)) as HarvestItem[];
    },

    async countItems(f: HarvestFilter): Promise<number> {
      const [row] = await db
        .select({ n: sql<number>`count(*)::int` })
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .innerJoin(organization, eq(dataset.labId, organization.id))
        .where(where(f));
      return Number(row?.n ?? 0);
    },

    async findItem(suffix: string): Promise<HarvestItem | undefined> {
      const [row] = await base().where(eq(release.suffix, suffix));
      return row as HarvestItem | undefined;
    },

    /** Every release of the given datasets (for version relations), oldest first. */
    async versionsOf(datasetIds: string[]) {
      const out = new Map<string, Array<{ suffix: string; doi: string; version: number; withdrawn: boolean }>>();
      if (!datasetIds.length) return out;
      const rows = await db
        .select({ datasetId: release.datasetId, suffix: release.suffix, doi: release.doi, version: release.version, withdrawnAt: release.withdrawnAt })
        .from(release)
        .where(inArray(release.datasetId, datasetIds))
        .orderBy(asc(release.version));
      for (const r of rows) out.set(r.datasetId, [...(out.get(r.datasetId) ?? []), { suffix: r.suffix, doi: r.doi, version: r.version, withdrawn: !!r.withdrawnAt }]);
      return out;
    },

    /** Media types of the files of the given releases. */
    async mediaTypes(releaseIds: string[]) {
      const out = new Map<string, string[]>();
      if (!releaseIds.length) return out;
      const rows = await db.selectDistinct({ releaseId: releaseFile.releaseId, mediaType: releaseFile.mediaType }).from(releaseFile).where(inArray(releaseFile.releaseId, releaseIds));
      for (const r of rows) out.set(r.releaseId, [...(out.get(r.releaseId) ?? []), r.mediaType].sort());
      return out;
    },

    /** Labs with at least one release, by slug: the OAI-PMH sets. */
    async labsWithReleases() {
      return db
        .selectDistinct({ slug: organization.slug, name: organization.name, description: organization.description })
        .from(organization)
        .innerJoin(dataset, eq(dataset.labId, organization.id))
        .innerJoin(release, eq(release.datasetId, dataset.id))
        .orderBy(asc(organization.slug));
    },

    async labExists(slug: string) {
      const [row] = await db.select({ id: organization.id }).from(organization).where(eq(organization.slug, slug));
      return !!row;
    },

    /** What the sitemap lists: releases that are not withdrawn, and every lab with its newest release date. */
    async sitemapEntries() {
      const releases = await db
        .select({ suffix: release.suffix, datasetSuffix: dataset.suffix, publishedAt: release.publishedAt })
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .where(isNull(release.withdrawnAt))
        .orderBy(desc(release.publishedAt), asc(release.id));
      const labs = await db
        .select({
          slug: organization.slug,
          createdAt: organization.createdAt,
          newest: sql<string | null>`max(${release.publishedAt}) filter (where ${release.withdrawnAt} is null)`,
        })
        .from(organization)
        .leftJoin(dataset, eq(dataset.labId, organization.id))
        .leftJoin(release, eq(release.datasetId, dataset.id))
        .groupBy(organization.id)
        .orderBy(asc(organization.slug));
      return { releases, labs };
    },
  };
}

export type HarvestingRepository = ReturnType<typeof createHarvestingRepository>;
