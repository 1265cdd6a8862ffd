import { timestamp } from 'drizzle-orm/pg-core';

/** Shared timestamp columns, spread into tables. */
export const timestamps = {
  createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  updatedAt: timestamp({ withTimezone: true })
    .defaultNow()
    .notNull()
    .$onUpdate(() => new Date()),
};
