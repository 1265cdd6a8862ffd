/**
 * Storage accounting and quota enforcement for labs.
 *
 * Every object a lab stores is counted once (by object key), whatever drafts
 * or releases reference it. An upload first *reserves* its declared size; the
 * reservation counts against the quota until it is confirmed (it becomes a
 * stored object), released, or expires.
 *
 * ```ts
 * const quota = createQuotaService({ db, freeTierBytes, graceDays });
 *
 * await quota.usage(labId)
 * //   → { usedBytes, reservedBytes, quotaBytes, availableBytes, planName, onFreeTier,
 * //       objectCount, breakdown: [{ label, objects, bytes }], uploadsBlocked, blockedReason }
 *
 * await quota.reserve(labId, bytes, { labSlug?, ttlMs? })
 * //   → { reservationId, expiresAt }                       (atomic, see below)
 * //   throws AppError('over_quota', 'This upload needs 3 GB but only 1.2 GB is left of your
 * //          "Seedling 5 GB" plan. …', 413, { upgradeUrl })  — nothing is reserved
 * //   throws AppError('payment_overdue', …, 402, { billingUrl }) when a payment failed more
 * //          than PAYMENTS_GRACE_DAYS ago (stored and published data stay as they are)
 *
 * await quota.confirm(reservationId, { objectKey, sizeBytes, sha256, mediaType })
 * //   → the stored object; records the REAL size (it may differ from the reservation).
 * //   Confirming the same key twice counts it once. A released/expired reservation → 409.
 *
 * await quota.release(reservationId)              // upload failed or was cancelled; idempotent
 * await quota.forget(labId, objectKey)            // object deleted from storage: stop counting it
 * await quota.expireStale()                       // pending past expiry → released (also done by reserve)
 * ```
 *
 * Atomicity: `reserve` runs in one transaction that locks the lab's billing row
 * (`SELECT … FOR UPDATE`), sums stored + pending bytes and inserts the
 * reservation only if the sum stays within the quota. Concurrent reservations
 * of one lab therefore run one after another on PostgreSQL, and PGlite runs
 * transactions one at a time on its single connection.
 *
 * The upgrade link in errors is the lab's storage page (`paths.labStorage`).
 */
import { AppError, notFound } from '../errors';
import type { Db } from '../db/client';
import { createStorageRepository } from '../repositories/storage.repository';
import { formatBytes } from '../../shared/billing-format';
import { paths } from '../../shared/paths';

export const DEFAULT_RESERVATION_TTL_MS = 24 * 3600 * 1000;
// Subscription states in which the paid plan's quota applies (past_due: within or after grace).
const PAID_STATES = new Set(['active', 'trialing', 'past_due']);

export type QuotaDeps = {
  db: Db;
  freeTierBytes: number;
  graceDays: number;
  /** Base of links in messages (PUBLIC_BASE_URL); relative links when absent. */
  publicBaseUrl?: string;
  now?: () => Date;
};

export type StorageUsageSummary = {
  usedBytes: number;
  reservedBytes: number;
  quotaBytes: number;
  availableBytes: number;
  planName: string;
  onFreeTier: boolean;
  objectCount: number;
  breakdown: Array<{ label: string; objects: number; bytes: number }>;
  // The same bytes by where they are: in published releases, or only in drafts.
  byPlace: Array<{ label: string; objects: number; bytes: number }>;
  uploadsBlocked: boolean;
  blockedReason: string | null;
};

/** What a lab without a paid plan is on (storage page, audit log). */
export const FREE_TIER_NAME = 'Free tier';

const mediaLabel = (t: string) =>
  /csv|tab-separated|tsv/.test(t) ? 'Trajectory tables' : /gzip|zip|x-tar/.test(t) ? 'Compressed files' : /json|yaml|xml/.test(t) ? 'Metadata documents' : /^image\//.test(t) ? 'Images' : /^video\//.test(t) ? 'Video' : 'Other files';

export function createQuotaService(deps: QuotaDeps) {
  const storage = createStorageRepository(deps.db);
  const now = deps.now ?? (() => new Date());
  const link = (p: string) => `${deps.publicBaseUrl ?? ''}${p}`;

  type State = NonNullable<Awaited<ReturnType<typeof storage.quotaState>>> | undefined;

  function plan(state: State) {
    const paid = !!state?.planName && state.planQuotaBytes !== null && PAID_STATES.has(state.subscriptionStatus);
    return paid
      ? { planName: state!.planName!, quotaBytes: state!.planQuotaBytes!, onFreeTier: false }
      : { planName: FREE_TIER_NAME, quotaBytes: deps.freeTierBytes, onFreeTier: true };
  }

  function blocked(state: State): string | null {
    const failedAt = state?.paymentFailedAt;
    if (!failedAt) return null;
    const graceEnds = failedAt.getTime() + deps.graceDays * 24 * 3600 * 1000;
    if (now().getTime() < graceEnds) return null;
    return `New uploads are paused because a payment for this lab's plan failed on ${failedAt.toISOString().slice(0, 10)} and the ${deps.graceDays}-day grace period has ended. Everything already stored or published stays available. The lab lead can update the payment details on the storage and billing page.`;
  }

  return {
    freeTierBytes: deps.freeTierBytes,
    graceDays: deps.graceDays,

    async usage(labId: string): Promise<StorageUsageSummary> {
      const t = now();
      const [state, used, reservedBytes, byType] = [
        await storage.quotaState(labId),
        await storage.usedBytes(labId),
        await storage.reservedBytes(labId, t),
        await storage.usageByMediaType(labId),
      ];
      const places = await storage.usageByPlace(labId);
      const byPlace = [true, false].map((released) => {
        const r = places.find((x) => x.released === released);
        return { label: released ? 'In published releases' : 'Only in drafts', objects: r?.objects ?? 0, bytes: r?.bytes ?? 0 };
      });
      const p = plan(state);
      const groups = new Map<string, { objects: number; bytes: number }>();
      for (const r of byType) {
        const g = groups.get(mediaLabel(r.mediaType)) ?? { objects: 0, bytes: 0 };
        groups.set(mediaLabel(r.mediaType), { objects: g.objects + r.objects, bytes: g.bytes + r.bytes });
      }
      const breakdown = [...groups].map(([label, g]) => ({ label, ...g })).sort((a, b) => b.bytes - a.bytes);
      if (reservedBytes > 0) breakdown.push({ label: 'Uploads in progress', objects: 0, bytes: reservedBytes });
      const reason = blocked(state);
      return {
        usedBytes: used.bytes,
        reservedBytes,
        quotaBytes: p.quotaBytes,
        availableBytes: Math.max(0, p.quotaBytes - used.bytes - reservedBytes),
        planName: p.planName,
        onFreeTier: p.onFreeTier,
        objectCount: used.objects,
        breakdown,
        byPlace,
        uploadsBlocked: reason !== null,
        blockedReason: reason,
      };
    },

    async reserve(labId: string, bytes: number, opts: { labSlug?: string; ttlMs?: number } = {}): Promise<{ reservationId: string; expiresAt: Date }> {
      if (!Number.isSafeInteger(bytes) || bytes <= 0) throw new AppError('invalid_size', 'An upload needs a size of at least 1 byte.', 400, { bytes: 'Give the size in bytes' });
      const t = now();
      await storage.releaseExpired(t);
      const upgradeUrl = opts.labSlug ? link(paths.labStorage(opts.labSlug)) : undefined;
      return storage.withLabLock(labId, async (q) => {
        const state = await q.quotaState(labId);
        const reason = blocked(state);
        if (reason) throw new AppError('payment_overdue', reason, 402, upgradeUrl ? { billingUrl: upgradeUrl } : undefined);
        const p = plan(state);
        const used = (await q.usedBytes(labId)).bytes + (await q.reservedBytes(labId, t));
        const left = Math.max(0, p.quotaBytes - used);
        if (bytes > left) {
          throw new AppError(
            'over_quota',
            `This upload needs ${formatBytes(bytes)} but only ${formatBytes(left)} is left of your ${p.onFreeTier ? 'free tier' : `"${p.planName}" plan`} (${formatBytes(p.quotaBytes)}). ` +
              `Nothing was uploaded. Free some space or choose a larger plan${upgradeUrl ? `: ${upgradeUrl}` : ' on the lab\'s storage page'}.`,
            413,
            { remainingBytes: String(left), ...(upgradeUrl ? { upgradeUrl } : {}) },
          );
        }
        const row = await q.insertReservation({ labId, bytes, expiresAt: new Date(t.getTime() + (opts.ttlMs ?? DEFAULT_RESERVATION_TTL_MS)) });
        return { reservationId: row.id, expiresAt: row.expiresAt };
      });
    },

    async confirm(reservationId: string, object: { objectKey: string; sizeBytes: number; sha256?: string | null; mediaType: string }) {
      if (!Number.isSafeInteger(object.sizeBytes) || object.sizeBytes < 0) throw new AppError('invalid_size', 'The stored size must be a whole number of bytes.', 400);
      return storage.inTransaction(async (q) => {
        const r = await q.findReservation(reservationId, { lock: true });
        if (!r) throw notFound('The storage reservation');
        if (r.status === 'released') {
          throw new AppError('reservation_released', 'This upload’s reserved space was released (cancelled or expired); start the upload again.', 409);
        }
        if (r.status === 'confirmed' && r.objectKey !== object.objectKey) {
          throw new AppError('reservation_used', 'This reservation was already used for another object.', 409);
        }
        const stored = await q.upsertStoredObject({ labId: r.labId, objectKey: object.objectKey, sizeBytes: object.sizeBytes, sha256: object.sha256 ?? null, mediaType: object.mediaType });
        await q.setReservationStatus(r.id, 'confirmed', object.objectKey);
        return stored;
      });
    },

    /** Releases a pending reservation; returns false when it was already confirmed or released. */
    async release(reservationId: string, labId?: string): Promise<boolean> {
      return storage.inTransaction(async (q) => {
        const r = await q.findReservation(reservationId, { lock: true });
        if (!r || (labId && r.labId !== labId)) throw notFound('The storage reservation');
        if (r.status !== 'pending') return false;
        await q.setReservationStatus(r.id, 'released');
        return true;
      });
    },

    async reservation(reservationId: string) {
      return storage.findReservation(reservationId);
    },

    async forget(labId: string, objectKey: string): Promise<boolean> {
      return storage.deleteStoredObject(labId, objectKey);
    },

    async expireStale(): Promise<number> {
      return storage.releaseExpired(now());
    },
  };
}

export type QuotaService = ReturnType<typeof createQuotaService>;
