import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Db } from '../db/client';
import { outboxMail } from '../db/schema';
import type { JobHandler, JobQueue, JobRow } from '../jobs/job-queue';
import type { Mailer, OutgoingMail } from './mailer';

export const SEND_MAIL_JOB = 'send-mail';

/**
 * Every message the app sends is first a row of `outbox_mail`, then a job
 * that hands it to SMTP. A send that fails (server down, refused) is retried
 * with backoff by the job queue; the row records attempts and the last error,
 * so a message is never silently lost.
 */
export function createOutbox({ db, jobs, transport, log }: { db: Db; jobs: JobQueue; transport: Pick<Mailer, 'send'>; log: Logger }) {
  const handler: JobHandler = async (row) => {
    const [mail] = await db.select().from(outboxMail).where(eq(outboxMail.id, String(row.payload.outboxId)));
    if (!mail || mail.state === 'sent') return;
    try {
      await transport.send({ to: mail.to, subject: mail.subject, text: mail.text, html: mail.html ?? undefined });
    } catch (e) {
      await db.update(outboxMail).set({ attempts: mail.attempts + 1, lastError: (e as Error).message }).where(eq(outboxMail.id, mail.id));
      throw e;
    }
    await db.update(outboxMail).set({ state: 'sent', sentAt: new Date(), attempts: mail.attempts + 1, lastError: null }).where(eq(outboxMail.id, mail.id));
  };

  return {
    handler,
    async onFinalFailure(row: JobRow, e: Error) {
      log.error({ outboxId: row.payload.outboxId, err: e }, 'mail could not be sent after every retry');
      await db.update(outboxMail).set({ state: 'failed', lastError: e.message }).where(eq(outboxMail.id, String(row.payload.outboxId)));
    },
    /** The app's mailer: queues the message; the job sends it. */
    mailer: {
      async send(mail: OutgoingMail) {
        const id = randomUUID();
        await db.insert(outboxMail).values({ id, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html ?? null });
        await jobs.enqueue(SEND_MAIL_JOB, { outboxId: id }, { maxAttempts: 12 });
      },
    },
  };
}
