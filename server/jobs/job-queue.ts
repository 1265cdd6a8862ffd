import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Db } from '../db/client';
import { job } from '../db/schema';
import { isStorageUnreachable } from '../storage/storage-errors';

export type JobRow = typeof job.$inferSelect;

const STORAGE_RETRY_MS = 5000;

export type JobContext = {
  /** Records progress (0..1) and a phase word; also renews the heartbeat. */
  progress(fraction: number, phase: string): Promise<void>;
};

export type JobHandler = (row: JobRow, ctx: JobContext) => Promise<void>;
type FinalFailure = (row: JobRow, e: Error) => Promise<void>;

/** What the app needs of a job queue; the in-database queue below and pg-boss (server/jobs/pg-boss-queue.ts) provide it. */
export type JobQueue = {
  workerId: string;
  enqueue(kind: string, payload: Record<string, unknown>, opts?: { tx?: Db; maxAttempts?: number; runAfter?: Date }): Promise<string>;
  /** Runs queued jobs of these kinds until none is left (tests and scripts). */
  drain(handlers: Record<string, JobHandler>, onFinalFailure?: FinalFailure): Promise<void>;
  /** Starts working on jobs of these kinds in this process. */
  start(handlers: Record<string, JobHandler>, onFinalFailure?: FinalFailure): void;
  stop(): Promise<void>;
  /** Whether a job of this kind is waiting (used to keep one recurring job scheduled). */
  hasQueued(kind: string): Promise<boolean>;
  /** Embedded mode only: jobs left running by a previous process of this data folder start again. */
  requeueOrphans(): Promise<void>;
  /** Sets up whatever the queue needs for these kinds before the first job (pg-boss: its queues). */
  prepare(kinds: string[]): Promise<void>;
};

/** The context a handler reports through: progress and phase on its row, which also renews the heartbeat. Shared by both queues. */
export function progressContext(db: Db, rowId: string, workerId: string): JobContext {
  return {
    progress: async (fraction, phase) => {
      await db
        .update(job)
        .set({ progress: Math.max(0, Math.min(1, fraction)), phase, heartbeatAt: new Date() })
        .where(sql`${job.id} = ${rowId} and ${job.lockedBy} = ${workerId}`);
    },
  };
}

export async function markDone(db: Db, rowId: string) {
  await db.update(job).set({ state: 'done', progress: 1, phase: 'done', lockedBy: null }).where(sql`${job.id} = ${rowId}`);
}

type Options = {
  db: Db;
  log: Logger;
  // A job whose worker has not renewed its heartbeat for this long is taken over.
  staleAfterMs?: number;
  pollMs?: number;
};

/**
 * Background jobs as database rows, claimed with `FOR UPDATE SKIP LOCKED` so
 * several workers (processes or machines) never take the same job. On the
 * embedded default one in-process worker runs; on a PostgreSQL server any
 * number of worker processes run the same loop. A failed attempt is retried
 * with exponential backoff up to `maxAttempts`; a worker killed mid-job leaves
 * a stale heartbeat and another worker (or the next start) takes the job over.
 */
export function createJobQueue({ db, log, staleAfterMs = 30_000, pollMs = 250 }: Options): JobQueue {
  const workerId = `${process.pid}-${randomUUID().slice(0, 8)}`;
  let running = false;
  let wake: (() => void) | null = null;
  let loop: Promise<void> | null = null;

  async function claim(kinds: string[]): Promise<JobRow | null> {
    const staleBefore = new Date(Date.now() - staleAfterMs).toISOString();
    const result = await db.execute<Record<string, unknown>>(sql`
      update ${job} set state = 'running', locked_by = ${workerId}, heartbeat_at = now(), attempts = attempts + 1, updated_at = now()
      where id = (
        select id from ${job}
        where kind in (${sql.join(kinds.map((k) => sql`${k}`), sql`, `)})
          and ((state = 'queued' and run_after <= now()) or (state = 'running' and heartbeat_at < ${staleBefore}))
        order by run_after, created_at
        limit 1
        for update skip locked
      )
      returning id`);
    const id = (result as unknown as { rows: Array<{ id: string }> }).rows[0]?.id;
    if (!id) return null;
    const [row] = await db.select().from(job).where(sql`${job.id} = ${id}`);
    return row ?? null;
  }

  async function runOne(row: JobRow, handler: JobHandler) {
    try {
      await handler(row, progressContext(db, row.id, workerId));
      await markDone(db, row.id);
    } catch (e) {
      const message = e instanceof Error ? e.message : String(e);
      // The object store being down is not the job's fault: try again every few seconds without using up an attempt.
      if (isStorageUnreachable(e)) {
        log.warn({ jobId: row.id, kind: row.kind }, 'object store unreachable; the job waits for it');
        await db
          .update(job)
          .set({ state: 'queued', lastError: message, lockedBy: null, attempts: Math.max(0, row.attempts - 1), runAfter: new Date(Date.now() + STORAGE_RETRY_MS), phase: 'waiting for storage' })
          .where(sql`${job.id} = ${row.id}`);
        return;
      }
      const final = row.attempts >= row.maxAttempts;
      log.warn({ jobId: row.id, kind: row.kind, attempt: row.attempts, err: e }, final ? 'job failed for good' : 'job failed; will retry');
      await db
        .update(job)
        .set({
          state: final ? 'failed' : 'queued',
          lastError: message,
          lockedBy: null,
          runAfter: new Date(Date.now() + 1000 * 2 ** row.attempts),
          phase: final ? 'failed' : 'waiting to retry',
        })
        .where(sql`${job.id} = ${row.id}`);
      if (final) throw Object.assign(new Error(message), { finalFailure: true, row });
    }
  }

  return {
    workerId,

    async enqueue(kind: string, payload: Record<string, unknown>, opts: { tx?: Db; maxAttempts?: number; runAfter?: Date } = {}): Promise<string> {
      const id = randomUUID();
      await (opts.tx ?? db).insert(job).values({ id, kind, payload, maxAttempts: opts.maxAttempts ?? 3, ...(opts.runAfter ? { runAfter: opts.runAfter } : {}) });
      wake?.();
      return id;
    },

    /** Runs queued jobs of these kinds until none is left (tests and scripts). */
    async drain(handlers: Record<string, JobHandler>, onFinalFailure?: (row: JobRow, e: Error) => Promise<void>) {
      for (;;) {
        const row = await claim(Object.keys(handlers));
        if (!row) return;
        await runOne(row, handlers[row.kind]).catch((e) => onFinalFailure?.(row, e));
      }
    },

    /** Starts the worker loop in this process. */
    start(handlers: Record<string, JobHandler>, onFinalFailure?: (row: JobRow, e: Error) => Promise<void>) {
      if (running) return;
      running = true;
      loop = (async () => {
        while (running) {
          let row: JobRow | null = null;
          try {
            row = await claim(Object.keys(handlers));
          } catch (e) {
            log.error({ err: e }, 'could not claim a job');
          }
          if (row) {
            await runOne(row, handlers[row.kind]).catch((e) => onFinalFailure?.(row!, e).catch(() => {}));
            continue;
          }
          await new Promise<void>((r) => {
            wake = r;
            setTimeout(r, pollMs);
          });
          wake = null;
        }
      })();
    },

    async stop() {
      running = false;
      wake?.();
      await loop;
    },

    /** Whether a job of this kind is waiting (used to keep one recurring job scheduled). */
    async hasQueued(kind: string) {
      const [row] = await db.select({ id: job.id }).from(job).where(sql`${job.kind} = ${kind} and ${job.state} = 'queued'`).limit(1);
      return !!row;
    },

    async prepare() {},

    /** Embedded mode only: jobs left running by a previous process of this data folder start again. */
    async requeueOrphans() {
      await db.update(job).set({ state: 'queued', lockedBy: null, phase: 'restarted' }).where(sql`${job.state} = 'running'`);
    },
  };
}
