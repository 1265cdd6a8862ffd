import { boolean, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';

/**
 * Whether a lab member agrees to be listed on the lab's public page. Each
 * member sets it for themselves; no row means not listed. Kept apart from
 * better-auth's member table, which better-auth owns.
 */
export const labMemberListing = pgTable(
  'lab_member_listing',
  {
    labId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    userId: text()
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    listed: boolean().notNull().default(false),
    updatedAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [primaryKey({ columns: [t.labId, t.userId] })],
);
