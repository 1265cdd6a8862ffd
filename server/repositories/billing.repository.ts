import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { billingWebhookEvent, labBilling, storagePlan } from '../db/schema/billing';

export type PlanRow = typeof storagePlan.$inferSelect;
export type LabBillingRow = typeof labBilling.$inferSelect;
type PlanValues = Omit<typeof storagePlan.$inferInsert, 'id' | 'createdAt' | 'updatedAt'>;

/** Plans, each lab's billing state, and the webhook events already received. */
export function createBillingRepository(db: Db) {
  return {
    async listPlans(opts: { activeOnly?: boolean } = {}): Promise<PlanRow[]> {
      const q = db.select().from(storagePlan);
      const rows = opts.activeOnly ? await q.where(eq(storagePlan.status, 'active')) : await q;
      return rows.sort((a, b) => a.quotaBytes - b.quotaBytes || a.name.localeCompare(b.name));
    },
    async findPlan(id: string): Promise<PlanRow | undefined> {
      const [row] = await db.select().from(storagePlan).where(eq(storagePlan.id, id));
      return row;
    },
    async findPlanByPrice(priceId: string): Promise<PlanRow | undefined> {
      const [row] = await db.select().from(storagePlan).where(eq(storagePlan.providerPriceId, priceId));
      return row;
    },
    async findPlanByName(name: string): Promise<PlanRow | undefined> {
      const [row] = await db.select().from(storagePlan).where(eq(storagePlan.name, name));
      return row;
    },
    async insertPlan(values: PlanValues): Promise<PlanRow> {
      const [row] = await db.insert(storagePlan).values(values).returning();
      return row;
    },
    async updatePlan(id: string, values: Partial<PlanValues>): Promise<PlanRow> {
      const [row] = await db.update(storagePlan).set(values).where(eq(storagePlan.id, id)).returning();
      return row;
    },

    async labBilling(labId: string): Promise<LabBillingRow> {
      await db.insert(labBilling).values({ labId }).onConflictDoNothing({ target: labBilling.labId });
      const [row] = await db.select().from(labBilling).where(eq(labBilling.labId, labId));
      return row;
    },
    async findByCustomer(customerId: string): Promise<LabBillingRow | undefined> {
      const [row] = await db.select().from(labBilling).where(eq(labBilling.providerCustomerId, customerId));
      return row;
    },
    /** Sets the lab's customer only if it has none; returns the one that stands. */
    async claimCustomer(labId: string, customerId: string): Promise<string> {
      await db.update(labBilling).set({ providerCustomerId: customerId }).where(and(eq(labBilling.labId, labId), isNull(labBilling.providerCustomerId)));
      const [row] = await db.select({ c: labBilling.providerCustomerId }).from(labBilling).where(eq(labBilling.labId, labId));
      return row.c!;
    },
    async updateLabBilling(labId: string, values: Partial<Omit<LabBillingRow, 'labId' | 'createdAt' | 'updatedAt'>>) {
      await db.update(labBilling).set(values).where(eq(labBilling.labId, labId));
    },
    /**
     * Applies subscription state only when the event is not older than what is stored
     * (one conditional UPDATE, so two deliveries racing cannot reverse the order).
     */
    async applySubscriptionIfNewer(labId: string, eventAt: number, values: Pick<LabBillingRow, 'planId' | 'providerSubscriptionId' | 'subscriptionStatus' | 'currentPeriodEnd' | 'cancelAtPeriodEnd'> & { providerCustomerId?: string }): Promise<boolean> {
      const rows = await db
        .update(labBilling)
        .set({ ...values, providerEventAt: sql`greatest(${labBilling.providerEventAt}, ${eventAt})` })
        .where(and(eq(labBilling.labId, labId), sql`${labBilling.providerEventAt} <= ${eventAt}`))
        .returning({ labId: labBilling.labId });
      return rows.length > 0;
    },
    async applyPaymentIfNewer(labId: string, eventAt: number, failed: boolean): Promise<{ applied: boolean; newlyFailed: boolean }> {
      const [before] = await db.select({ f: labBilling.paymentFailedAt }).from(labBilling).where(eq(labBilling.labId, labId));
      const rows = await db
        .update(labBilling)
        .set({
          paymentEventAt: eventAt,
          // The first failure starts the grace period; later failures do not extend it.
          paymentFailedAt: failed ? sql`coalesce(${labBilling.paymentFailedAt}, to_timestamp(${eventAt}))` : null,
        })
        .where(and(eq(labBilling.labId, labId), sql`${labBilling.paymentEventAt} <= ${eventAt}`))
        .returning({ labId: labBilling.labId });
      return { applied: rows.length > 0, newlyFailed: rows.length > 0 && failed && !before?.f };
    },

    /** Records an event's arrival; `alreadyProcessed` when an earlier delivery finished it. */
    async claimEvent(e: { id: string; type: string; created: number }): Promise<{ alreadyProcessed: boolean }> {
      const [row] = await db
        .insert(billingWebhookEvent)
        .values({ id: e.id, type: e.type, providerCreatedAt: e.created })
        .onConflictDoUpdate({ target: billingWebhookEvent.id, set: { attempts: sql`${billingWebhookEvent.attempts} + 1` } })
        .returning({ processedAt: billingWebhookEvent.processedAt });
      return { alreadyProcessed: !!row.processedAt };
    },
    /** Marks the event processed; false when another delivery of it got there first. */
    async finishEvent(id: string, outcome: string, labId: string | null): Promise<boolean> {
      const rows = await db
        .update(billingWebhookEvent)
        .set({ processedAt: new Date(), outcome, labId })
        .where(and(eq(billingWebhookEvent.id, id), isNull(billingWebhookEvent.processedAt)))
        .returning({ id: billingWebhookEvent.id });
      return rows.length > 0;
    },
    async events(labId: string) {
      return db.select().from(billingWebhookEvent).where(eq(billingWebhookEvent.labId, labId)).orderBy(asc(billingWebhookEvent.receivedAt));
    },
  };
}

export type BillingRepository = ReturnType<typeof createBillingRepository>;
