import type { Db } from '../db/client';
import { createBillingRepository } from '../repositories/billing.repository';

/**
 * Demo storage plans (our own invented names). They are mirrored at the
 * payment provider on first use (the first checkout), not here: the seed also
 * builds test templates that run before any provider is reachable. Every demo
 * lab starts on the free tier.
 */
const plans = [
  { name: 'Swarmlet 10 GB', description: 'For a pilot season: a handful of recording sessions.', quotaBytes: 10e9, monthlyPriceMinor: 400, currency: 'EUR' },
  { name: 'Field season 100 GB', description: 'A year of multi-camera field recordings with their trajectories.', quotaBytes: 100e9, monthlyPriceMinor: 1900, currency: 'EUR' },
  { name: 'Colony archive 1 TB', description: 'A lab’s long-term archive of raw trajectories and releases.', quotaBytes: 1e12, monthlyPriceMinor: 7900, currency: 'EUR' },
  { name: 'Pilot 2 GB (retired)', description: 'An early plan, no longer offered.', quotaBytes: 2e9, monthlyPriceMinor: 100, currency: 'EUR', status: 'archived' as const },
];

export async function demoPlans(db: Db) {
  const billing = createBillingRepository(db);
  for (const p of plans) if (!(await billing.findPlanByName(p.name))) await billing.insertPlan(p);
}
