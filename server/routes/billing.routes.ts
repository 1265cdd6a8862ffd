import { z } from 'zod';
import type { RequestHandler, Response } from 'express';
import type { Logger } from 'pino';
import { access, type Actor } from '../middleware/authorize';
import type { Config } from '../config';
import type { Database } from '../db/client';
import type { Mailer } from '../mail/mailer';
import { createBillingRepository } from '../repositories/billing.repository';
import { createLabsRepository } from '../repositories/labs.repository';
import { createPaymentsClient } from '../payments/stripe-client';
import { createBillingService, type BillingService } from '../services/billing.service';
import { createAuditRepository } from '../repositories/audit.repository';
import { createQuotaService, type QuotaService } from '../services/quota.service';
import {
  checkoutInput,
  checkoutResult,
  createPlanInput,
  invoiceView,
  labBillingView,
  portalResult,
  reservationInput,
  reservationView,
  storagePlanView,
  storageUsage,
  updatePlanInput,
} from '../../shared/contracts';
import { route } from './route';

export type BillingModule = { billing: BillingService; quota: QuotaService };

type ModuleDeps = { config: Config; database: Database; log: Logger; mailer?: Pick<Mailer, 'send'> };

/** The billing and quota services (stateless: the routes and the webhook may each build their own). */
export function billingModule(deps: ModuleDeps): BillingModule {
  const { config, database, log } = deps;
  const quota = createQuotaService({
    db: database.db,
    freeTierBytes: config.payments.freeTierBytes,
    graceDays: config.payments.graceDays,
    publicBaseUrl: config.publicBaseUrl,
  });
  const billing = createBillingService({
    billing: createBillingRepository(database.db),
    labs: createLabsRepository(database.db),
    quota,
    payments: createPaymentsClient(config.payments),
    webhookSecret: config.payments.webhookSecret,
    publicBaseUrl: config.publicBaseUrl,
    graceDays: config.payments.graceDays,
    testMode: config.payments.secretKey.startsWith('sk_test_'),
    mailer: deps.mailer,
    log: log.child({ area: 'billing' }),
    audit: createAuditRepository(database.db),
  });
  return { billing, quota };
}

/**
 * The provider's webhook endpoint. Mounted with `express.raw` before the JSON
 * parser: the signature is over the exact bytes. 400 for a bad signature (the
 * provider gives up), 200 for everything verified, including event types we
 * ignore; errors while applying answer 500 so the provider retries.
 */
export function billingWebhookHandler(m: BillingModule): RequestHandler {
  return async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    const result = await m.billing.receiveWebhook(body, req.headers['stripe-signature'] as string | undefined);
    res.json({ received: true, ...result });
  };
}

export const WEBHOOK_PATH = '/api/billing/webhook';

const caller = (res: Response) => (res.locals.actor as Actor).user;
const idParam = z.string().uuid('Not a known id');

export function billingRoutes({ billing, quota }: BillingModule) {
  return [
    route({
      method: 'get', path: '/api/plans', access: access.public, summary: 'Storage plans on offer, with quota and monthly price', response: z.array(storagePlanView),
      handler: async (_req, res) => res.json(await billing.plans({ activeOnly: true })),
    }),
    route({
      method: 'get', path: '/api/admin/plans', access: access.admin, summary: 'The whole plan catalogue, archived plans included', response: z.array(storagePlanView),
      handler: async (_req, res) => res.json(await billing.plans()),
    }),
    route({
      method: 'post', path: '/api/admin/plans', access: access.admin, summary: 'Add a plan (mirrored as a product and monthly price at the payment provider)',
      body: createPlanInput, response: storagePlanView, status: 201,
      handler: async (_req, res, body) => res.status(201).json(await billing.createPlan(body)),
    }),
    route({
      method: 'patch', path: '/api/admin/plans/:id', access: access.admin, summary: 'Rename, re-price, archive or restore a plan',
      body: updatePlanInput, response: storagePlanView,
      handler: async (req, res, body) => res.json(await billing.updatePlan(idParam.parse(req.params.id), body)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/storage', access: access.lab({ dataset: ['create'] }), summary: "The lab's storage use against its quota", response: storageUsage,
      handler: async (_req, res) => res.json(await quota.usage(res.locals.lab!.id)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/storage/reservations', access: access.lab({ dataset: ['create'] }),
      summary: 'Reserve space for an upload before any byte is stored (413 with the space left when it would exceed the quota)',
      body: reservationInput, response: reservationView, status: 201,
      handler: async (_req, res, body) => {
        const lab = res.locals.lab!;
        const r = await quota.reserve(lab.id, body.bytes, { labSlug: lab.slug });
        res.status(201).json({ reservationId: r.reservationId, expiresAt: r.expiresAt.toISOString() });
      },
    }),
    route({
      method: 'delete', path: '/api/labs/:slug/storage/reservations/:id', access: access.lab({ dataset: ['create'] }), summary: 'Release reserved space (upload failed or cancelled)', status: 204,
      handler: async (req, res) => {
        await quota.release(idParam.parse(req.params.id), res.locals.lab!.id);
        res.status(204).end();
      },
    }),
    route({
      method: 'get', path: '/api/labs/:slug/billing', access: access.lab({ billing: ['manage'] }), summary: "The lab's plan, subscription, payment state and usage", response: labBillingView,
      handler: async (_req, res) => res.json(await billing.overview(res.locals.lab!)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/billing/checkout', access: access.lab({ billing: ['manage'] }),
      summary: "Choose a plan: a hosted checkout URL, or the plan changed in place when the lab already pays", body: checkoutInput, response: checkoutResult,
      handler: async (_req, res, body) => res.json(await billing.checkout(res.locals.lab!, caller(res), body.planId)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/billing/portal', access: access.lab({ billing: ['manage'] }), summary: "A session of the payment provider's billing portal", response: portalResult,
      handler: async (_req, res) => res.json(await billing.portal(res.locals.lab!)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/billing/invoices', access: access.lab({ billing: ['manage'] }), summary: "The lab's invoices as the payment provider returns them", response: z.array(invoiceView),
      handler: async (_req, res) => res.json(await billing.invoices(res.locals.lab!)),
    }),
  ];
}
