import { and, desc, eq, inArray, isNull, or, gt, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { accessGrant, accessRequest, auditEvent, dataUseTerms, dataset, release, user } from '../db/schema';

export type AccessRequestRow = typeof accessRequest.$inferSelect;
export type AccessGrantRow = typeof accessGrant.$inferSelect;

/** Data-use terms, access requests, grants and the audit trail. */
export function createAccessRepository(db: Db) {
  return {
    transaction: <T>(fn: (tx: Db) => Promise<T>) => db.transaction((tx) => fn(tx as unknown as Db)),

    async currentTerms(labId: string) {
      const [row] = await db.select().from(dataUseTerms).where(eq(dataUseTerms.labId, labId)).orderBy(desc(dataUseTerms.version)).limit(1);
      return row;
    },
    async insertTerms(values: typeof dataUseTerms.$inferInsert) {
      await db.insert(dataUseTerms).values(values);
    },

    async insertRequest(values: typeof accessRequest.$inferInsert, tx: Db = db) {
      await tx.insert(accessRequest).values(values);
    },
    async findRequest(id: string) {
      const [row] = await db.select().from(accessRequest).where(eq(accessRequest.id, id));
      return row;
    },
    async pendingFor(requesterId: string, datasetId: string, releaseId: string | null) {
      const [row] = await db
        .select()
        .from(accessRequest)
        .where(
          and(
            eq(accessRequest.requesterId, requesterId),
            eq(accessRequest.datasetId, datasetId),
            releaseId ? eq(accessRequest.releaseId, releaseId) : isNull(accessRequest.releaseId),
            eq(accessRequest.state, 'pending'),
          ),
        );
      return row;
    },
    /** Moves a request out of `pending` only if it is still pending; returns whether it moved. */
    async decide(id: string, values: Partial<typeof accessRequest.$inferInsert>, tx: Db = db) {
      const moved = await tx.update(accessRequest).set(values).where(and(eq(accessRequest.id, id), eq(accessRequest.state, 'pending'))).returning({ id: accessRequest.id });
      return moved.length === 1;
    },

    /** Requests with what the views need; filter by requester or by the lab's datasets. */
    async listRequests(filter: { requesterId?: string; labId?: string; state?: string }) {
      const conds = [];
      if (filter.requesterId) conds.push(eq(accessRequest.requesterId, filter.requesterId));
      if (filter.labId) conds.push(eq(dataset.labId, filter.labId));
      if (filter.state) conds.push(eq(accessRequest.state, filter.state as AccessRequestRow['state']));
      return db
        .select({
          request: accessRequest,
          datasetTitle: dataset.title,
          datasetSuffix: dataset.suffix,
          releaseSuffix: release.suffix,
          releaseTitle: release.title,
          releaseVersion: release.version,
          requesterName: user.name,
          requesterEmail: user.email,
        })
        .from(accessRequest)
        .innerJoin(dataset, eq(accessRequest.datasetId, dataset.id))
        .innerJoin(user, eq(accessRequest.requesterId, user.id))
        .leftJoin(release, eq(accessRequest.releaseId, release.id))
        .where(conds.length ? and(...conds) : undefined)
        .orderBy(desc(accessRequest.createdAt));
    },

    async insertGrant(values: typeof accessGrant.$inferInsert, tx: Db = db) {
      await tx.insert(accessGrant).values(values);
    },
    async grantsForRequests(requestIds: string[]) {
      if (!requestIds.length) return [];
      return db.select().from(accessGrant).where(inArray(accessGrant.requestId, requestIds));
    },
    async findGrant(id: string) {
      const [row] = await db.select().from(accessGrant).where(eq(accessGrant.id, id));
      return row;
    },
    async revokeGrant(id: string, by: string) {
      const done = await db
        .update(accessGrant)
        .set({ revokedAt: new Date(), revokedBy: by })
        .where(and(eq(accessGrant.id, id), isNull(accessGrant.revokedAt)))
        .returning({ id: accessGrant.id });
      return done.length === 1;
    },
    /** A grant that covers this release now: for it or for all versions, not revoked, not expired. */
    async activeGrant(userId: string, datasetId: string, releaseId: string, now: Date) {
      const [row] = await db
        .select({ id: accessGrant.id })
        .from(accessGrant)
        .where(
          and(
            eq(accessGrant.userId, userId),
            eq(accessGrant.datasetId, datasetId),
            or(isNull(accessGrant.releaseId), eq(accessGrant.releaseId, releaseId)),
            isNull(accessGrant.revokedAt),
            or(isNull(accessGrant.expiresAt), gt(accessGrant.expiresAt, now)),
          ),
        )
        .limit(1);
      return row;
    },

    async audit(values: Omit<typeof auditEvent.$inferInsert, 'id'>, tx: Db = db) {
      await tx.insert(auditEvent).values({ id: crypto.randomUUID(), ...values });
    },
    async auditOf(subjectType: string, subjectId: string) {
      return db
        .select()
        .from(auditEvent)
        .where(and(eq(auditEvent.subjectType, subjectType), eq(auditEvent.subjectId, subjectId)))
        .orderBy(sql`${auditEvent.createdAt} asc`);
    },
  };
}

export type AccessRepository = ReturnType<typeof createAccessRepository>;
