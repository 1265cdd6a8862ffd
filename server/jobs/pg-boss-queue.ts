import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { Db } from '../db/client';
import { job } from '../db/schema';
import { markDone, progressContext, type JobHandler, type JobQueue, type JobRow } from './job-queue';
import { isStorageUnreachable } from '../storage/storage-errors';
import { databaseUnavailable } from '../middleware/error-handler';

type Options = {
  db: Db;
  url: string;
  log: Logger;
  // A job still active after this long is taken as lost (its worker died) and delivered again.
  timeoutSeconds: number;
  pollSeconds?: number;
};

type Message = { jobId: string };

// pg-boss 10 records a finished delivery without awaiting it (`complete`/`fail` in its worker loop), so a
// database connection lost at that moment is an unhandled rejection, which would stop the process. That
// case is harmless here (the delivery comes back after its timeout and the job row, already done, makes it
// a no-op), so it is logged; any other unhandled rejection still stops the process as before.
let guardInstalled = false;
function guardLostCompletions(log: Logger) {
  if (guardInstalled) return;
  guardInstalled = true;
  process.on('unhandledRejection', (e) => {
    if (databaseUnavailable(e)) log.warn({ err: e }, 'the job queue lost its database connection while recording a finished job');
    else throw e;
  });
}

const STORAGE_WAIT_RETRIES = 20;

/**
 * The job queue on a PostgreSQL server: pg-boss delivers, retries with backoff
 * and re-delivers the jobs of dead workers (expiration), so any number of worker
 * processes share the work. The `job` row stays the record users see (state,
 * progress, phase, last error) and the guard that makes each job's work happen
 * once: a delivery only runs if it can move the row from not-done to running.
 */
export function createPgBossQueue({ db, url, log, timeoutSeconds, pollSeconds = 0.5 }: Options): JobQueue & { ready(): Promise<void> } {
  const workerId = `${process.pid}-${randomUUID().slice(0, 8)}`;
  guardLostCompletions(log);
  const boss = new PgBoss({
    connectionString: url,
    max: 4,
    schema: 'pgboss',
    application_name: 'cohesia-jobs',
    monitorStateIntervalSeconds: 60,
    // Expired (lost) jobs are found by the maintenance pass: run it often enough for the timeout to mean something.
    maintenanceIntervalSeconds: Math.max(1, Math.min(120, Math.floor(timeoutSeconds / 4))),
  });
  boss.on('error', (e) => log.error({ err: e }, 'job queue error'));
  let started: Promise<unknown> | null = null;
  const queues = new Map<string, Promise<void>>();
  const workers: string[] = [];

  const ready = () => (started ??= boss.start());
  // Queue creation alters shared tables: run one at a time here, and retry when another process deadlocks with us.
  let creating: Promise<unknown> = Promise.resolve();
  const queueFor = (kind: string) => {
    let q = queues.get(kind);
    if (!q) {
      const next = creating.then(async () => {
        await ready();
        for (let attempt = 1; ; attempt++) {
          try {
            if (!(await boss.getQueue(kind))) await boss.createQueue(kind);
            return;
          } catch (e) {
            if ((e as { code?: string }).code !== '40P01' || attempt >= 5) throw e;
            await new Promise((r) => setTimeout(r, 100 * attempt));
          }
        }
      });
      creating = next.catch(() => {});
      q = next;
      queues.set(kind, q);
      q.catch(() => queues.delete(kind));
    }
    return q;
  };

  // A running row whose heartbeat (progress updates) is younger than this belongs to a live worker
  // (30 s as in the in-database queue; shorter when the timeout itself is short).
  const staleSeconds = Math.max(2, Math.min(30, Math.floor(timeoutSeconds / 2)));

  async function claim(jobId: string): Promise<JobRow | null> {
    const result = await db.execute<Record<string, unknown>>(sql`
      update ${job} set state = 'running', locked_by = ${workerId}, heartbeat_at = now(), attempts = attempts + 1, updated_at = now()
      where id = ${jobId} and (state = 'queued' or (state = 'running' and (heartbeat_at is null or heartbeat_at < now() - make_interval(secs => ${staleSeconds}))))
      returning id`);
    if (!(result as unknown as { rows: unknown[] }).rows.length) {
      const [row] = await db.select({ state: job.state }).from(job).where(sql`${job.id} = ${jobId}`);
      // Delivered again while its worker is alive and reporting (the job outran the timeout): try later.
      if (row?.state === 'running') throw new Error('the job is still running on another worker');
      return null;
    }
    const [row] = await db.select().from(job).where(sql`${job.id} = ${jobId}`);
    return row ?? null;
  }

  /** Runs one delivery; throws to let pg-boss retry, returns when done or failed for good. */
  async function runDelivery(jobId: string, handlers: Record<string, JobHandler>, onFinalFailure?: (row: JobRow, e: Error) => Promise<void>) {
    const row = await claim(jobId);
    if (!row) return; // already done or failed for good: a repeated delivery does nothing
    const handler = handlers[row.kind];
    try {
      await handler(row, progressContext(db, row.id, workerId));
      await markDone(db, row.id);
    } catch (e) {
      const message = e instanceof Error ? e.message : String(e);
      // The object store being down is not the job's fault: pg-boss delivers again later (its backoff) and no attempt is used up.
      if (isStorageUnreachable(e)) {
        log.warn({ jobId: row.id, kind: row.kind }, 'object store unreachable; the job waits for it');
        await db
          .update(job)
          .set({ state: 'queued', lastError: message, lockedBy: null, attempts: Math.max(0, row.attempts - 1), phase: 'waiting for storage' })
          .where(sql`${job.id} = ${row.id}`);
        throw e;
      }
      const final = row.attempts >= row.maxAttempts;
      log.warn({ jobId: row.id, kind: row.kind, attempt: row.attempts, err: e }, final ? 'job failed for good' : 'job failed; will retry');
      await db
        .update(job)
        .set({ state: final ? 'failed' : 'queued', lastError: message, lockedBy: null, phase: final ? 'failed' : 'waiting to retry' })
        .where(sql`${job.id} = ${row.id}`);
      if (!final) throw e;
      await onFinalFailure?.(row, Object.assign(new Error(message), { finalFailure: true, row })).catch((err) => log.error({ err }, 'final-failure handler failed'));
    }
  }

  return {
    workerId,
    ready: async () => {
      await ready();
    },

    async prepare(kinds) {
      for (const kind of kinds) await queueFor(kind);
    },

    async enqueue(kind, payload, opts = {}) {
      const id = randomUUID();
      const maxAttempts = opts.maxAttempts ?? 3;
      await (opts.tx ?? db).insert(job).values({ id, kind, payload, maxAttempts, ...(opts.runAfter ? { runAfter: opts.runAfter } : {}) });
      await queueFor(kind);
      await boss.send(kind, { jobId: id } satisfies Message, {
        id,
        // Our row's attempts decide when a job has failed for good; pg-boss's budget only has to outlast
        // deliveries that do not count (the object store down), with its backoff between them.
        retryLimit: maxAttempts - 1 + STORAGE_WAIT_RETRIES,
        retryDelay: 1,
        retryBackoff: true,
        expireInSeconds: timeoutSeconds,
        ...(opts.runAfter ? { startAfter: opts.runAfter } : {}),
      });
      return id;
    },

    async drain(handlers, onFinalFailure) {
      for (;;) {
        let ran = false;
        for (const kind of Object.keys(handlers)) {
          await queueFor(kind);
          const [delivery] = await boss.fetch<Message>(kind, { batchSize: 1 });
          if (!delivery) continue;
          ran = true;
          try {
            await runDelivery(delivery.data.jobId, handlers, onFinalFailure);
            await boss.complete(kind, delivery.id);
          } catch (e) {
            await boss.fail(kind, delivery.id, { message: (e as Error).message });
          }
        }
        if (!ran) return;
      }
    },

    start(handlers, onFinalFailure) {
      for (const kind of Object.keys(handlers)) {
        void queueFor(kind)
          .then(() => boss.work<Message>(kind, { batchSize: 1, pollingIntervalSeconds: pollSeconds }, async ([delivery]) => runDelivery(delivery.data.jobId, handlers, onFinalFailure)))
          .then((id) => workers.push(id))
          .catch((e) => log.error({ err: e, kind }, 'could not start a worker'));
      }
    },

    async stop() {
      if (!started) return;
      await started.catch(() => {});
      // Jobs in progress finish first; a job cut off here is delivered again after its timeout.
      await boss.stop({ graceful: true, wait: true, timeout: 20_000 });
    },

    async hasQueued(kind) {
      const [row] = await db.select({ id: job.id }).from(job).where(sql`${job.kind} = ${kind} and ${job.state} = 'queued'`).limit(1);
      return !!row;
    },

    // Never on a server: other workers may be running those jobs right now.
    async requeueOrphans() {},
  };
}
