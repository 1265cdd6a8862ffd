import { sql } from 'drizzle-orm';
import { bigint, check, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { organization } from './auth';
import { timestamps } from './columns';

/**
 * Storage accounting. A stored object is counted once per lab whatever drafts
 * or releases reference it; a reservation holds bytes for an upload in flight
 * so two uploads cannot both pass the quota check.
 */
export const storedObject = pgTable(
  'stored_object',
  {
    id: uuid().primaryKey().defaultRandom(),
    labId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    objectKey: text().notNull().unique(),
    sizeBytes: bigint({ mode: 'number' }).notNull(),
    sha256: text(),
    mediaType: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('stored_object_lab_idx').on(t.labId), check('stored_object_size_nonnegative', sql`${t.sizeBytes} >= 0`)],
);

export const RESERVATION_STATUSES = ['pending', 'confirmed', 'released'] as const;
export type ReservationStatus = (typeof RESERVATION_STATUSES)[number];

export const storageReservation = pgTable(
  'storage_reservation',
  {
    id: uuid().primaryKey().defaultRandom(),
    labId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    bytes: bigint({ mode: 'number' }).notNull(),
    status: text({ enum: RESERVATION_STATUSES }).notNull().default('pending'),
    objectKey: text(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [
    index('storage_reservation_lab_status_idx').on(t.labId, t.status),
    check('storage_reservation_bytes_positive', sql`${t.bytes} > 0`),
    check('storage_reservation_status_known', sql`${t.status} in ('pending', 'confirmed', 'released')`),
  ],
);
