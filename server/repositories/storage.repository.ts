import { and, asc, count, eq, gt, lte, sql, sum } from 'drizzle-orm';
import type { Db } from '../db/client';
import { storedObject, storageReservation } from '../db/schema/storage';
import { labBilling, storagePlan } from '../db/schema/billing';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Conn = Db | Tx;

export type ReservationRow = typeof storageReservation.$inferSelect;
export type StoredObjectRow = typeof storedObject.$inferSelect;

const n = (v: unknown) => Number(v ?? 0);

function queries(db: Conn) {
  return {
    /** The lab's plan (if any), subscription status and payment state, as the quota rules need them. */
    async quotaState(labId: string) {
      const [row] = await db
        .select({
          planName: storagePlan.name,
          planQuotaBytes: storagePlan.quotaBytes,
          subscriptionStatus: labBilling.subscriptionStatus,
          paymentFailedAt: labBilling.paymentFailedAt,
        })
        .from(labBilling)
        .leftJoin(storagePlan, eq(labBilling.planId, storagePlan.id))
        .where(eq(labBilling.labId, labId));
      return row;
    },

    async usedBytes(labId: string): Promise<{ bytes: number; objects: number }> {
      const [row] = await db.select({ bytes: sum(storedObject.sizeBytes), objects: count() }).from(storedObject).where(eq(storedObject.labId, labId));
      return { bytes: n(row?.bytes), objects: n(row?.objects) };
    },

    /** Bytes held by pending reservations that have not expired at `now`. */
    async reservedBytes(labId: string, now: Date): Promise<number> {
      const [row] = await db
        .select({ bytes: sum(storageReservation.bytes) })
        .from(storageReservation)
        .where(and(eq(storageReservation.labId, labId), eq(storageReservation.status, 'pending'), gt(storageReservation.expiresAt, now)));
      return n(row?.bytes);
    },

    async usageByMediaType(labId: string) {
      const rows = await db
        .select({ mediaType: storedObject.mediaType, objects: count(), bytes: sum(storedObject.sizeBytes) })
        .from(storedObject)
        .where(eq(storedObject.labId, labId))
        .groupBy(storedObject.mediaType)
        .orderBy(asc(storedObject.mediaType));
      return rows.map((r) => ({ mediaType: r.mediaType, objects: n(r.objects), bytes: n(r.bytes) }));
    },

    /** Bytes in objects that some published release holds, and in objects only drafts hold. */
    async usageByPlace(labId: string) {
      const inRelease = sql<boolean>`exists (select 1 from release_file rf where rf.object_key = ${storedObject.objectKey})`;
      const rows = await db
        .select({ released: inRelease, objects: count(), bytes: sum(storedObject.sizeBytes) })
        .from(storedObject)
        .where(eq(storedObject.labId, labId))
        .groupBy(inRelease);
      return rows.map((r) => ({ released: !!r.released, objects: n(r.objects), bytes: n(r.bytes) }));
    },

    async insertReservation(values: { labId: string; bytes: number; expiresAt: Date }): Promise<ReservationRow> {
      const [row] = await db.insert(storageReservation).values(values).returning();
      return row;
    },

    async findReservation(id: string, opts: { lock?: boolean } = {}): Promise<ReservationRow | undefined> {
      const q = db.select().from(storageReservation).where(eq(storageReservation.id, id));
      const [row] = opts.lock ? await q.for('update') : await q;
      return row;
    },

    async setReservationStatus(id: string, status: 'confirmed' | 'released', objectKey?: string) {
      await db.update(storageReservation).set({ status, ...(objectKey ? { objectKey } : {}) }).where(eq(storageReservation.id, id));
    },

    /** Inserts the object unless its key is already counted; returns the row either way. */
    async upsertStoredObject(values: { labId: string; objectKey: string; sizeBytes: number; sha256: string | null; mediaType: string }): Promise<StoredObjectRow> {
      await db.insert(storedObject).values(values).onConflictDoNothing({ target: storedObject.objectKey });
      const [row] = await db.select().from(storedObject).where(eq(storedObject.objectKey, values.objectKey));
      return row;
    },

    async deleteStoredObject(labId: string, objectKey: string): Promise<boolean> {
      const rows = await db.delete(storedObject).where(and(eq(storedObject.labId, labId), eq(storedObject.objectKey, objectKey))).returning({ id: storedObject.id });
      return rows.length > 0;
    },

    /** Marks pending reservations past their expiry as released; returns how many. */
    async releaseExpired(now: Date): Promise<number> {
      const rows = await db
        .update(storageReservation)
        .set({ status: 'released' })
        .where(and(eq(storageReservation.status, 'pending'), lte(storageReservation.expiresAt, now)))
        .returning({ id: storageReservation.id });
      return rows.length;
    },
  };
}

/**
 * Stored objects and reservations. `withLabLock` runs its callback in one
 * transaction holding the lab's billing row `FOR UPDATE`, so quota checks and
 * reservations of one lab happen one at a time on PostgreSQL (PGlite has one
 * connection and runs transactions one at a time anyway).
 */
export function createStorageRepository(db: Db) {
  return {
    ...queries(db),
    async withLabLock<T>(labId: string, fn: (q: ReturnType<typeof queries>) => Promise<T>): Promise<T> {
      return db.transaction(async (tx) => {
        await tx.insert(labBilling).values({ labId }).onConflictDoNothing({ target: labBilling.labId });
        await tx.select({ labId: labBilling.labId }).from(labBilling).where(eq(labBilling.labId, labId)).for('update');
        return fn(queries(tx));
      });
    },
    /** Runs in one transaction holding the reservation row `FOR UPDATE`. */
    async inTransaction<T>(fn: (q: ReturnType<typeof queries>) => Promise<T>): Promise<T> {
      return db.transaction(async (tx) => fn(queries(tx)));
    },
  };
}

export type StorageRepository = ReturnType<typeof createStorageRepository>;
export type StorageQueries = ReturnType<typeof queries>;
