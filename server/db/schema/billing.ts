import { sql } from 'drizzle-orm';
import { bigint, boolean, check, index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { organization } from './auth';
import { timestamps } from './columns';

/** A storage plan of the catalogue, mirrored as a product and a monthly price at the payment provider. */
export const storagePlan = pgTable(
  'storage_plan',
  {
    id: uuid().primaryKey().defaultRandom(),
    name: text().notNull(),
    description: text().notNull().default(''),
    quotaBytes: bigint({ mode: 'number' }).notNull(),
    // Minor units of `currency` (cents, pence).
    monthlyPriceMinor: integer().notNull(),
    currency: text().notNull(),
    status: text({ enum: ['active', 'archived'] }).notNull().default('active'),
    providerProductId: text(),
    providerPriceId: text().unique(),
    ...timestamps,
  },
  (t) => [
    check('storage_plan_quota_positive', sql`${t.quotaBytes} > 0`),
    check('storage_plan_price_nonnegative', sql`${t.monthlyPriceMinor} >= 0`),
  ],
);

/**
 * One row per lab: its provider customer and subscription as last seen.
 * `providerEventAt` / `paymentEventAt` are the provider's event times already
 * applied, so an older event never overwrites newer state.
 */
export const labBilling = pgTable(
  'lab_billing',
  {
    labId: text()
      .primaryKey()
      .references(() => organization.id, { onDelete: 'cascade' }),
    planId: uuid().references(() => storagePlan.id, { onDelete: 'set null' }),
    providerCustomerId: text().unique(),
    providerSubscriptionId: text(),
    subscriptionStatus: text().notNull().default('none'),
    currentPeriodEnd: timestamp({ withTimezone: true }),
    cancelAtPeriodEnd: boolean().notNull().default(false),
    providerEventAt: bigint({ mode: 'number' }).notNull().default(0),
    paymentFailedAt: timestamp({ withTimezone: true }),
    paymentEventAt: bigint({ mode: 'number' }).notNull().default(0),
    ...timestamps,
  },
  (t) => [index('lab_billing_subscription_idx').on(t.providerSubscriptionId)],
);

/** Webhook events already received, by the provider's event id: a replay changes nothing. */
export const billingWebhookEvent = pgTable('billing_webhook_event', {
  id: text().primaryKey(),
  type: text().notNull(),
  providerCreatedAt: bigint({ mode: 'number' }).notNull(),
  labId: text(),
  outcome: text(),
  attempts: integer().notNull().default(1),
  receivedAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  processedAt: timestamp({ withTimezone: true }),
});
