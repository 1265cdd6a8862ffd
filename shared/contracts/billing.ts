import { z } from 'zod';
import { toMinorUnits } from '../billing-format';

/** Currencies a plan may be priced in (all with two-digit minor units). */
export const PLAN_CURRENCIES = ['EUR', 'GBP', 'USD', 'CHF', 'SEK'] as const;
export const planCurrency = z.enum(PLAN_CURRENCIES);

const MAX_QUOTA_BYTES = 1e16; // 10 PB: well past any plan, still an exact integer in a double

export const createPlanInput = z.object({
  name: z.string().trim().min(3, 'Give the plan a name of at least 3 characters').max(80, 'Use at most 80 characters'),
  description: z.string().trim().max(500, 'Use at most 500 characters').default(''),
  quotaBytes: z.number().int('Whole bytes only').positive('The quota must be more than 0 bytes').max(MAX_QUOTA_BYTES, 'At most 10 PB'),
  monthlyPriceMinor: z.number().int('Whole cents only').min(0, 'The price cannot be negative').max(10_000_000, 'At most 100 000 per month'),
  currency: planCurrency,
});
export type CreatePlanInput = z.input<typeof createPlanInput>;

export const updatePlanInput = z
  .object({
    name: createPlanInput.shape.name,
    description: z.string().trim().max(500),
    quotaBytes: createPlanInput.shape.quotaBytes,
    monthlyPriceMinor: createPlanInput.shape.monthlyPriceMinor,
    currency: planCurrency,
    status: z.enum(['active', 'archived']),
  })
  .partial();
export type UpdatePlanInput = z.infer<typeof updatePlanInput>;

/** The admin's form: gigabytes and a decimal price, turned into the API's bytes and minor units. */
export const planFormInput = z
  .object({
    name: createPlanInput.shape.name,
    description: z.string().trim().max(500, 'Use at most 500 characters'),
    quotaGb: z
      .string()
      .trim()
      .regex(/^\d+(\.\d{1,3})?$/, 'Give the quota in GB, e.g. 50 or 2.5')
      .refine((v) => Number(v) > 0 && Number(v) <= 10_000_000, 'Between 0.001 GB and 10 PB'),
    monthlyPrice: z.string().trim().regex(/^\d{1,6}(\.\d{1,2})?$/, 'Give a price like 12 or 12.50'),
    currency: planCurrency,
  })
  .transform((v) => ({
    name: v.name,
    description: v.description,
    quotaBytes: Math.round(Number(v.quotaGb) * 1e9),
    monthlyPriceMinor: toMinorUnits(v.monthlyPrice, v.currency),
    currency: v.currency,
  }));
export type PlanFormValues = z.input<typeof planFormInput>;

export const storagePlanView = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  quotaBytes: z.number(),
  monthlyPriceMinor: z.number(),
  currency: z.string(),
  status: z.enum(['active', 'archived']),
  // True once the plan has a product and price at the payment provider.
  mirrored: z.boolean(),
});
export type StoragePlanView = z.infer<typeof storagePlanView>;

export const storageUsage = z.object({
  usedBytes: z.number(),
  reservedBytes: z.number(),
  quotaBytes: z.number(),
  availableBytes: z.number(),
  planName: z.string(),
  onFreeTier: z.boolean(),
  objectCount: z.number(),
  breakdown: z.array(z.object({ label: z.string(), objects: z.number(), bytes: z.number() })),
  byPlace: z.array(z.object({ label: z.string(), objects: z.number(), bytes: z.number() })),
  uploadsBlocked: z.boolean(),
  blockedReason: z.string().nullable(),
});
export type StorageUsage = z.infer<typeof storageUsage>;

export const labBillingView = z.object({
  usage: storageUsage,
  currentPlan: storagePlanView.nullable(),
  subscription: z
    .object({ status: z.string(), currentPeriodEnd: z.string().nullable(), cancelAtPeriodEnd: z.boolean() })
    .nullable(),
  payment: z.object({ failedAt: z.string().nullable(), graceEndsAt: z.string().nullable(), uploadsBlocked: z.boolean() }),
  freeTierBytes: z.number(),
  hasBillingAccount: z.boolean(),
  testMode: z.boolean(),
});
export type LabBillingView = z.infer<typeof labBillingView>;

export const checkoutInput = z.object({ planId: z.string().uuid('Choose a plan') });
export type CheckoutInput = z.infer<typeof checkoutInput>;
export const checkoutResult = z.object({ kind: z.enum(['checkout', 'changed']), url: z.string().nullable() });
export type CheckoutResult = z.infer<typeof checkoutResult>;

export const portalResult = z.object({ url: z.string() });

export const invoiceView = z.object({
  id: z.string(),
  number: z.string().nullable(),
  status: z.string().nullable(),
  currency: z.string(),
  subtotal: z.number(),
  total: z.number(),
  amountPaid: z.number(),
  amountDue: z.number(),
  created: z.string(),
  periodStart: z.string().nullable(),
  periodEnd: z.string().nullable(),
  hostedUrl: z.string().nullable(),
  lines: z.array(z.object({ description: z.string().nullable(), amount: z.number() })),
});
export type InvoiceView = z.infer<typeof invoiceView>;

export const reservationInput = z.object({
  bytes: z.number().int('Whole bytes only').positive('Reserve at least 1 byte').max(MAX_QUOTA_BYTES),
});
export const reservationView = z.object({ reservationId: z.string(), expiresAt: z.string() });
export type ReservationView = z.infer<typeof reservationView>;
