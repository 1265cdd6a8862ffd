import { index, pgTable, text } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { timestamps } from './columns';

/** A saved comparison: an owner's ordered list of release suffixes, shared by its id. */
export const comparison = pgTable(
  'comparison',
  {
    id: text().primaryKey(),
    ownerId: text()
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    title: text().notNull(),
    releaseSuffixes: text().array().notNull(),
    ...timestamps,
  },
  (t) => [index('comparison_owner_idx').on(t.ownerId)],
);
