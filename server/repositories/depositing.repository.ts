import { and, asc, desc, eq, inArray, max, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { readCatalogueGeneration } from './catalogue-generation';
import { auditEvent, dataset, downloadEvent, draft, draftComment, draftFile, job, release, releaseFile, user, type DraftState } from '../db/schema';

export type DatasetRow = typeof dataset.$inferSelect;
export type DraftRow = typeof draft.$inferSelect;
export type DraftFileRow = typeof draftFile.$inferSelect;
export type ReleaseRow = typeof release.$inferSelect;
export type ReleaseFileRow = typeof releaseFile.$inferSelect;

const OPEN: DraftState[] = ['editing', 'submitted', 'returned'];

/** Datasets, drafts, files and releases. Only this module writes those tables. */
export function createDepositingRepository(db: Db) {
  return {
    transaction: <T>(fn: (tx: Db) => Promise<T>) => db.transaction((tx) => fn(tx as unknown as Db)),

    /** One line of the audit trail (who did what to which release or draft), in the caller's transaction. */
    async audit(values: Omit<typeof auditEvent.$inferInsert, 'id'>, tx: Db = db) {
      await tx.insert(auditEvent).values({ id: crypto.randomUUID(), ...values });
    },

    async insertDataset(values: typeof dataset.$inferInsert, tx: Db = db) {
      await tx.insert(dataset).values(values);
    },
    async insertDraft(values: typeof draft.$inferInsert, tx: Db = db) {
      await tx.insert(draft).values(values);
    },

    async datasetsOfLab(labId: string) {
      const rows = await db.select().from(dataset).where(eq(dataset.labId, labId)).orderBy(desc(dataset.updatedAt));
      if (!rows.length) return [];
      const ids = rows.map((r) => r.id);
      const drafts = await db.select({ id: draft.id, datasetId: draft.datasetId, state: draft.state }).from(draft).where(and(inArray(draft.datasetId, ids), inArray(draft.state, OPEN)));
      const versions = await db
        .select({ datasetId: release.datasetId, latest: max(release.version) })
        .from(release)
        .where(inArray(release.datasetId, ids))
        .groupBy(release.datasetId);
      return rows.map((d) => ({
        ...d,
        openDraft: drafts.find((x) => x.datasetId === d.id) ?? null,
        latestVersion: versions.find((v) => v.datasetId === d.id)?.latest ?? null,
      }));
    },

    async findDataset(id: string) {
      const [row] = await db.select().from(dataset).where(eq(dataset.id, id));
      return row;
    },
    async findDatasetBySuffix(suffix: string) {
      const [row] = await db.select().from(dataset).where(eq(dataset.suffix, suffix));
      return row;
    },

    async findDraft(id: string) {
      const [row] = await db
        .select({ draft, dataset })
        .from(draft)
        .innerJoin(dataset, eq(draft.datasetId, dataset.id))
        .where(eq(draft.id, id));
      return row;
    },
    async openDraftOf(datasetId: string) {
      const [row] = await db.select().from(draft).where(and(eq(draft.datasetId, datasetId), inArray(draft.state, OPEN)));
      return row;
    },
    async draftsInState(labId: string, state: DraftState) {
      return db
        .select({ draft, dataset })
        .from(draft)
        .innerJoin(dataset, eq(draft.datasetId, dataset.id))
        .where(and(eq(dataset.labId, labId), eq(draft.state, state)))
        .orderBy(asc(draft.submittedAt));
    },

    async updateDraft(id: string, values: Partial<typeof draft.$inferInsert>, tx: Db = db) {
      await tx.update(draft).set(values).where(eq(draft.id, id));
    },
    /** Moves a draft between states only if it is in one of `from`; returns whether it moved. */
    async transitionDraft(id: string, from: DraftState[], to: DraftState, extra: Partial<typeof draft.$inferInsert> = {}, tx: Db = db) {
      const moved = await tx
        .update(draft)
        .set({ state: to, ...extra })
        .where(and(eq(draft.id, id), inArray(draft.state, from)))
        .returning({ id: draft.id });
      return moved.length === 1;
    },
    async touchDataset(id: string, values: Partial<typeof dataset.$inferInsert>, tx: Db = db) {
      await tx.update(dataset).set(values).where(eq(dataset.id, id));
    },

    async files(draftId: string) {
      return db.select().from(draftFile).where(eq(draftFile.draftId, draftId)).orderBy(asc(draftFile.createdAt));
    },
    async findFile(id: string) {
      const [row] = await db.select().from(draftFile).where(eq(draftFile.id, id));
      return row;
    },
    async insertFile(values: typeof draftFile.$inferInsert, tx: Db = db) {
      await tx.insert(draftFile).values(values);
    },
    async updateFile(id: string, values: Partial<typeof draftFile.$inferInsert>) {
      await db.update(draftFile).set(values).where(eq(draftFile.id, id));
    },
    async deleteFile(id: string) {
      await db.delete(draftFile).where(eq(draftFile.id, id));
    },
    /** Whether any draft or release still points at an object. */
    async objectReferenced(objectKey: string) {
      const [a] = await db.select({ n: sql<number>`count(*)` }).from(draftFile).where(eq(draftFile.objectKey, objectKey));
      const [b] = await db.select({ n: sql<number>`count(*)` }).from(releaseFile).where(eq(releaseFile.objectKey, objectKey));
      return Number(a.n) + Number(b.n) > 0;
    },

    /** The newest ingest result and options recorded for each object key (used when a new version carries files over). */
    async latestResultsFor(objectKeys: string[]) {
      const out = new Map<string, { result: Record<string, unknown> | null; ingestOptions: Record<string, unknown> }>();
      if (!objectKeys.length) return out;
      const rows = await db
        .select({ objectKey: draftFile.objectKey, result: draftFile.result, ingestOptions: draftFile.ingestOptions })
        .from(draftFile)
        .where(and(inArray(draftFile.objectKey, objectKeys), sql`${draftFile.result} is not null`))
        .orderBy(desc(draftFile.updatedAt));
      for (const r of rows) if (!out.has(r.objectKey)) out.set(r.objectKey, r);
      return out;
    },

    async comments(draftId: string) {
      return db
        .select({ id: draftComment.id, kind: draftComment.kind, body: draftComment.body, createdAt: draftComment.createdAt, author: user.name })
        .from(draftComment)
        .innerJoin(user, eq(draftComment.authorId, user.id))
        .where(eq(draftComment.draftId, draftId))
        .orderBy(asc(draftComment.createdAt));
    },
    async addComment(values: typeof draftComment.$inferInsert, tx: Db = db) {
      await tx.insert(draftComment).values(values);
    },

    async latestJobFor(fileId: string) {
      const [row] = await db
        .select({ id: job.id, state: job.state, progress: job.progress, phase: job.phase, lastError: job.lastError, attempts: job.attempts })
        .from(job)
        .where(sql`${job.payload}->>'fileId' = ${fileId}`)
        .orderBy(desc(job.createdAt))
        .limit(1);
      return row;
    },

    async nextVersion(datasetId: string, tx: Db = db) {
      const [row] = await tx.select({ v: max(release.version) }).from(release).where(eq(release.datasetId, datasetId));
      return (row?.v ?? 0) + 1;
    },
    async insertRelease(values: typeof release.$inferInsert, files: Array<typeof releaseFile.$inferInsert>, tx: Db = db) {
      await tx.insert(release).values(values);
      if (files.length) await tx.insert(releaseFile).values(files);
    },
    async releasesOf(datasetId: string) {
      return db.select().from(release).where(eq(release.datasetId, datasetId)).orderBy(asc(release.version));
    },
    async findRelease(id: string) {
      const [row] = await db.select().from(release).where(eq(release.id, id));
      return row;
    },
    async findReleaseBySuffix(suffix: string) {
      const [row] = await db.select().from(release).where(eq(release.suffix, suffix));
      return row;
    },
    async releaseFiles(releaseId: string) {
      return db.select().from(releaseFile).where(eq(releaseFile.releaseId, releaseId)).orderBy(asc(releaseFile.fileName));
    },
    async withdrawRelease(id: string, values: { withdrawnAt: Date; withdrawnReason: string; withdrawnBy: string }, tx: Db = db) {
      await tx.update(release).set(values).where(eq(release.id, id));
    },
    catalogueGeneration: () => readCatalogueGeneration(db),
    async recordDownload(values: typeof downloadEvent.$inferInsert) {
      await db.insert(downloadEvent).values(values);
    },
    /**
     * Download counts following the COUNTER Code of Practice, Release 5:
     * total = requests after double-click filtering (the same visitor and item
     * again within 30 s counts once); unique = one per visitor, item and day.
     */
    async downloadCounts(releaseIds: string[]): Promise<{ total: number; unique: number }> {
      if (!releaseIds.length) return { total: 0, unique: 0 };
      const ids = sql.join(releaseIds.map((id) => sql`${id}`), sql`, `);
      const result = await db.execute<{ total: number; unique: number }>(sql`
        with e as (
          select visitor_key, coalesce(file_name, '') as item, created_at,
                 lag(created_at) over (partition by release_id, visitor_key, coalesce(file_name, '') order by created_at) as previous,
                 release_id
          from download_event where release_id in (${ids})
        )
        select count(*) filter (where previous is null or created_at - previous > interval '30 seconds')::int as total,
               count(distinct (release_id, visitor_key, item, date_trunc('day', created_at)))::int as unique
        from e`);
      const row = (result as unknown as { rows: Array<{ total: number; unique: number }> }).rows[0];
      return { total: Number(row?.total ?? 0), unique: Number(row?.unique ?? 0) };
    },
    /** Downloads of a lab's releases per month (UTC), all kinds together. */
    async monthlyDownloads(labId: string) {
      const result = await db.execute<{ month: string; downloads: number }>(sql`
        select to_char(date_trunc('month', e.created_at), 'YYYY-MM') as month, count(*)::int as downloads
        from download_event e join release r on r.id = e.release_id join dataset d on d.id = r.dataset_id
        where d.lab_id = ${labId}
        group by 1 order by 1`);
      return (result as unknown as { rows: Array<{ month: string; downloads: number }> }).rows.map((r) => ({ month: r.month, downloads: Number(r.downloads) }));
    },
    /** Published releases, newest first, with their lab; keyset pagination on (published_at, id). */
    async listReleases(opts: { limit: number; before?: { publishedAt: Date; id: string } }) {
      const cond = opts.before
        ? sql`(${release.publishedAt}, ${release.id}) < (${opts.before.publishedAt.toISOString()}::timestamptz, ${opts.before.id})`
        : sql`true`;
      return db
        .select({ release, datasetSuffix: dataset.suffix, labId: dataset.labId })
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .where(and(cond, sql`${release.withdrawnAt} is null`))
        .orderBy(desc(release.publishedAt), desc(release.id))
        .limit(opts.limit);
    },
    /** Embargoed releases whose date has come. */
    async embargoesDue(now: Date) {
      return db
        .select({ release, labId: dataset.labId })
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .where(and(eq(release.accessLevel, 'embargoed'), sql`${release.embargoUntil} <= ${now.toISOString()}::timestamptz`, sql`${release.withdrawnAt} is null`));
    },
    async setBundleKey(id: string, bundleKey: string) {
      await db.update(release).set({ bundleKey }).where(eq(release.id, id));
    },
  };
}

export type DepositingRepository = ReturnType<typeof createDepositingRepository>;
