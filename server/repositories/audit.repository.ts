import { and, desc, eq, gte, lt, or, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../db/client';
import { accessRequest, auditEvent, dataset, draft, organization, release, user } from '../db/schema';

export type AuditFilter = {
  // Only events about this lab (by the subject's lab); undefined = every lab and none.
  labId?: string;
  action?: string;
  actor?: string;
  targetType?: string;
  targetId?: string;
  from?: Date;
  // Exclusive end.
  until?: Date;
};

export type AuditCursor = { at: string; id: string };

// The lab an event belongs to, derived from its subject, so writers need not store it
// (a `labId` in the detail wins, for subjects that have no lab link of their own).
const labOfEvent = sql<string | null>`coalesce(${auditEvent.detail}->>'labId', case ${auditEvent.subjectType}
  when 'lab' then ${auditEvent.subjectId}
  when 'access_request' then (select ${dataset.labId} from ${accessRequest} join ${dataset} on ${dataset.id} = ${accessRequest.datasetId} where ${accessRequest.id} = ${auditEvent.subjectId})
  when 'release' then (select ${dataset.labId} from ${release} join ${dataset} on ${dataset.id} = ${release.datasetId} where ${release.id} = ${auditEvent.subjectId})
  when 'dataset' then (select ${dataset.labId} from ${dataset} where ${dataset.id} = ${auditEvent.subjectId})
  when 'draft' then (select ${dataset.labId} from ${draft} join ${dataset} on ${dataset.id} = ${draft.datasetId} where ${draft.id} = ${auditEvent.subjectId})
  end)`;

const likeEscape = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** Reads the audit trail (append-only; written by the services through their own repositories). */
export function createAuditRepository(db: Db) {
  function conditions(f: AuditFilter): SQL[] {
    const c: SQL[] = [];
    if (f.labId) c.push(sql`${labOfEvent} = ${f.labId}`);
    if (f.action) c.push(eq(auditEvent.action, f.action));
    if (f.targetType) c.push(eq(auditEvent.subjectType, f.targetType));
    if (f.targetId) c.push(eq(auditEvent.subjectId, f.targetId));
    if (f.from) c.push(gte(auditEvent.createdAt, f.from));
    if (f.until) c.push(lt(auditEvent.createdAt, f.until));
    if (f.actor) {
      const pattern = `%${likeEscape(f.actor)}%`;
      c.push(or(sql`${user.name} ilike ${pattern}`, sql`${user.email} ilike ${pattern}`)!);
    }
    return c;
  }

  return {
    /** Records one event (a lab's events carry `detail.labId` when their subject has no lab link of its own). */
    async record(values: Omit<typeof auditEvent.$inferInsert, 'id'>) {
      await db.insert(auditEvent).values({ id: crypto.randomUUID(), ...values });
    },
    /** Newest first; `after` continues below the last row of the previous page. */
    async list(f: AuditFilter, limit: number, after?: AuditCursor) {
      const where = conditions(f);
      // Keyset on (created_at, id); the timestamp travels as PostgreSQL text so microseconds survive.
      if (after) where.push(sql`(${auditEvent.createdAt}, ${auditEvent.id}) < (${after.at}::timestamptz, ${after.id})`);
      return db
        .select({
          id: auditEvent.id,
          createdAt: auditEvent.createdAt,
          cursorAt: sql<string>`${auditEvent.createdAt}::text`,
          action: auditEvent.action,
          actorId: auditEvent.actorId,
          actorName: user.name,
          actorEmail: user.email,
          subjectType: auditEvent.subjectType,
          subjectId: auditEvent.subjectId,
          fromState: auditEvent.fromState,
          toState: auditEvent.toState,
          detail: auditEvent.detail,
          labSlug: organization.slug,
          labName: organization.name,
        })
        .from(auditEvent)
        .leftJoin(user, eq(user.id, auditEvent.actorId))
        .leftJoin(organization, sql`${organization.id} = ${labOfEvent}`)
        .where(and(...where))
        .orderBy(desc(auditEvent.createdAt), desc(auditEvent.id))
        .limit(limit);
    },

    /** The distinct actions recorded in a lab (or everywhere). */
    async actions(labId?: string): Promise<string[]> {
      const rows = await db
        .selectDistinct({ action: auditEvent.action })
        .from(auditEvent)
        .where(labId ? sql`${labOfEvent} = ${labId}` : undefined)
        .orderBy(auditEvent.action);
      return rows.map((r) => r.action);
    },
  };
}

export type AuditRepository = ReturnType<typeof createAuditRepository>;
