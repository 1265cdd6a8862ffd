import type { AuditEventView, AuditPage } from '../../shared/contracts';
import type { z } from 'zod';
import type { auditQuery } from '../../shared/contracts/audit';
import { toCsv } from '../../shared/csv';
import { AppError } from '../errors';
import type { AuditCursor, AuditFilter, AuditRepository } from '../repositories/audit.repository';

type Query = z.output<typeof auditQuery>;
// A lab's log, or the whole platform's (admins).
export type AuditScope = { labId: string } | { all: true };

// An export is one request: beyond this, narrow the filters (keeps memory and time bounded).
export const AUDIT_EXPORT_MAX_ROWS = 20_000;

const encodeCursor = (c: AuditCursor) => Buffer.from(JSON.stringify([c.at, c.id])).toString('base64url');
function decodeCursor(s: string): AuditCursor {
  try {
    const [at, id] = JSON.parse(Buffer.from(s, 'base64url').toString('utf8')) as unknown[];
    // PostgreSQL's text form of a timestamptz, e.g. 2026-03-01 10:00:00.123456+00.
    if (typeof at === 'string' && typeof id === 'string' && /^\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}:\d{2}(\.\d{1,6})?([+-]\d{2}(:?\d{2})?|Z)?$/.test(at) && id.length <= 100) return { at, id };
  } catch {
    // falls through to the 400 below
  }
  throw new AppError('invalid_cursor', 'This page link is not valid any more; start from the first page.', 400);
}

/** The audit log viewer: filtered, cursor-paginated reading and CSV export. */
export function createAuditService({ audit }: { audit: AuditRepository }) {
  function filterOf(scope: AuditScope, q: Query): AuditFilter {
    const dayAfter = (d: string) => new Date(Date.parse(`${d}T00:00:00Z`) + 24 * 3600 * 1000);
    return {
      labId: 'labId' in scope ? scope.labId : undefined,
      action: q.action,
      actor: q.actor,
      targetType: q.targetType,
      targetId: q.targetId,
      from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined,
      until: q.to ? dayAfter(q.to) : undefined,
    };
  }

  function view(r: Awaited<ReturnType<AuditRepository['list']>>[number]): AuditEventView {
    return {
      id: r.id,
      at: r.createdAt.toISOString(),
      action: r.action,
      actor: r.actorId ? { id: r.actorId, name: r.actorName ?? '(deleted account)', email: r.actorEmail ?? '' } : null,
      targetType: r.subjectType,
      targetId: r.subjectId,
      fromState: r.fromState,
      toState: r.toState,
      detail: r.detail ?? null,
      lab: r.labSlug ? { slug: r.labSlug, name: r.labName ?? r.labSlug } : null,
    };
  }

  return {
    async page(scope: AuditScope, q: Query): Promise<AuditPage> {
      const rows = await audit.list(filterOf(scope, q), q.limit + 1, q.cursor ? decodeCursor(q.cursor) : undefined);
      const more = rows.length > q.limit;
      const shown = rows.slice(0, q.limit);
      const last = shown[shown.length - 1];
      return {
        events: shown.map(view),
        nextCursor: more && last ? encodeCursor({ at: last.cursorAt, id: last.id }) : null,
        actions: await audit.actions('labId' in scope ? scope.labId : undefined),
      };
    },

    /** Every matching event as CSV (cells neutralised against spreadsheet formulas). */
    async csv(scope: AuditScope, q: Query): Promise<string> {
      const rows = await audit.list(filterOf(scope, q), AUDIT_EXPORT_MAX_ROWS + 1);
      if (rows.length > AUDIT_EXPORT_MAX_ROWS) {
        throw new AppError('export_too_large', `More than ${AUDIT_EXPORT_MAX_ROWS.toLocaleString('en')} events match; narrow the date range or filters and export again.`, 400);
      }
      const header = ['time (UTC)', 'action', 'actor name', 'actor e-mail', 'lab', 'target type', 'target id', 'from state', 'to state', 'detail'];
      return toCsv(
        header,
        rows.map(view).map((e) => [e.at, e.action, e.actor?.name, e.actor?.email, e.lab?.slug, e.targetType, e.targetId, e.fromState, e.toState, e.detail ? JSON.stringify(e.detail) : '']),
      );
    },
  };
}

export type AuditService = ReturnType<typeof createAuditService>;
