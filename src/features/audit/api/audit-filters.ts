import { env } from '../../../lib/env';

/** The audit log's filters as the page keeps them (form fields; empty = no filter). */
export type AuditFilters = { action: string; actor: string; targetType: string; targetId: string; from: string; to: string };

export const emptyAuditFilters: AuditFilters = { action: '', actor: '', targetType: '', targetId: '', from: '', to: '' };

/** The query string of the filters (only those set), plus extra parameters. */
export function auditSearch(filters: AuditFilters, extra: Record<string, string | undefined> = {}): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries({ ...filters, ...extra })) if (v) q.set(k, v);
  const s = q.toString();
  return s ? `?${s}` : '';
}

/** A download link of the export (a plain GET with the session cookie, saved by the browser). */
export const auditExportUrl = (path: string, filters: AuditFilters) => `${env.VITE_API_BASE}${path}${auditSearch(filters)}`;
