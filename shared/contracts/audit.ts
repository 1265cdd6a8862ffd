import { z } from 'zod';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-01');
// Empty form fields arrive as "", which means "no filter".
const optional = <T extends z.ZodType>(t: T) => z.preprocess((v) => (v === '' ? undefined : v), t.optional());

/** Filters of the audit log (query string); dates are whole UTC days, both ends included. */
export const auditQuery = z
  .object({
    action: optional(z.string().trim().max(80)),
    // Part of the actor's name or e-mail address.
    actor: optional(z.string().trim().max(200)),
    // What the event was about: a type (lab, access_request, release…) and/or one id.
    targetType: optional(z.string().trim().regex(/^[a-z_]{1,40}$/, 'Use a type like access_request')),
    targetId: optional(z.string().trim().max(100)),
    from: optional(isoDate),
    to: optional(isoDate),
    cursor: optional(z.string().max(200)),
    limit: z.coerce.number().int().min(1).max(200).default(50),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The start date must not be after the end date', path: ['to'] });
export type AuditQuery = z.input<typeof auditQuery>;

export const auditEventView = z.object({
  id: z.string(),
  at: z.string(),
  action: z.string(),
  actor: z.object({ id: z.string(), name: z.string(), email: z.string() }).nullable(),
  targetType: z.string(),
  targetId: z.string(),
  fromState: z.string().nullable(),
  toState: z.string().nullable(),
  detail: z.record(z.string(), z.unknown()).nullable(),
  lab: z.object({ slug: z.string(), name: z.string() }).nullable(),
});
export type AuditEventView = z.infer<typeof auditEventView>;

export const auditPage = z.object({
  events: z.array(auditEventView),
  // Pass as `cursor` for the next (older) page; null on the last page.
  nextCursor: z.string().nullable(),
  // Every action recorded in this scope, for the filter's choices.
  actions: z.array(z.string()),
});
export type AuditPage = z.infer<typeof auditPage>;
