import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { httpClient } from '../support/http-client';
import { signInDemo, signUpAndVerify } from '../support/accounts';
import { activePlans, CARDS, checkoutWith, eventually, standIn } from '../support/billing';
import { createQuotaService, type QuotaService } from '../../server/services/quota.service';
import { createLabsRepository } from '../../server/repositories/labs.repository';
import { createPaymentsClient } from '../../server/payments/stripe-client';

// A 1 MB free tier keeps the numbers readable.
const FREE = 1_000_000;
let app: TestApp;
let quota: QuotaService;
let fenmoorId: string;
let rookeryId: string;

beforeAll(async () => {
  app = await startTestApp({ env: { FREE_TIER_BYTES: String(FREE) } });
  // The same service the depositing presign step calls, on the app's own database.
  quota = createQuotaService({ db: app.database.db, freeTierBytes: FREE, graceDays: 7, publicBaseUrl: app.url });
  const labs = createLabsRepository(app.database.db);
  fenmoorId = (await labs.findBySlug('fenmoor-swarm-ecology'))!.id;
  rookeryId = (await labs.findBySlug('rookery-roof-array'))!.id;
});
afterAll(async () => {
  await app?.close();
});

const reservations = (slug: string) => `/api/labs/${slug}/storage/reservations`;

describe('storage reservations over HTTP', () => {
  it('refuses an upload that would exceed the quota with the space left and an upgrade link, storing nothing', async () => {
    const depositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
    const first = await depositor.post(reservations('fenmoor-swarm-ecology'), { bytes: 600_000 });
    expect(first.status).toBe(201);
    expect(first.json.reservationId).toMatch(/^[0-9a-f-]{36}$/);
    expect(new Date(first.json.expiresAt).getTime()).toBeGreaterThan(Date.now());

    const over = await depositor.post(reservations('fenmoor-swarm-ecology'), { bytes: 500_000 });
    expect(over.status).toBe(413);
    expect(over.json.code).toBe('over_quota');
    expect(over.json.message).toBe(
      `This upload needs 500 kB but only 400 kB is left of your free tier (1 MB). Nothing was uploaded. Free some space or choose a larger plan: ${app.url}/labs/fenmoor-swarm-ecology/storage.`,
    );
    expect(over.json.fields).toMatchObject({ remainingBytes: '400000', upgradeUrl: `${app.url}/labs/fenmoor-swarm-ecology/storage` });

    const usage = await depositor.get('/api/labs/fenmoor-swarm-ecology/storage');
    expect(usage.json).toMatchObject({ usedBytes: 0, reservedBytes: 600_000, availableBytes: 400_000, quotaBytes: FREE, planName: 'Free tier' });

    // Cancelling the first upload gives the space back; releasing twice is harmless.
    expect((await depositor.delete(`${reservations('fenmoor-swarm-ecology')}/${first.json.reservationId}`)).status).toBe(204);
    expect((await depositor.delete(`${reservations('fenmoor-swarm-ecology')}/${first.json.reservationId}`)).status).toBe(204);
    const now = await depositor.post(reservations('fenmoor-swarm-ecology'), { bytes: 500_000 });
    expect(now.status).toBe(201);
    await depositor.delete(`${reservations('fenmoor-swarm-ecology')}/${now.json.reservationId}`);
  });

  it('checks who may reserve and what a reservation is', async () => {
    expect((await httpClient(app.url).post(reservations('fenmoor-swarm-ecology'), { bytes: 1 })).status).toBe(401);
    const stranger = await signUpAndVerify(app, 'stranger');
    expect((await stranger.http.post(reservations('fenmoor-swarm-ecology'), { bytes: 1 })).status).toBe(403);
    const depositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
    for (const bytes of [0, -1, 1.5, 'ten']) {
      expect((await depositor.post(reservations('fenmoor-swarm-ecology'), { bytes })).status).toBe(400);
    }
    // Another lab's reservation cannot be released from here.
    const rookery = await signInDemo(app, 'oskar.lenning@northgate-poly.example');
    const theirs = await rookery.post(reservations('rookery-roof-array'), { bytes: 10 });
    expect((await depositor.delete(`${reservations('fenmoor-swarm-ecology')}/${theirs.json.reservationId}`)).status).toBe(404);
    expect((await depositor.delete(`${reservations('fenmoor-swarm-ecology')}/not-an-id`)).status).toBe(400);
    expect((await rookery.delete(`${reservations('rookery-roof-array')}/${theirs.json.reservationId}`)).status).toBe(204);
  });

  it('never lets concurrent reservations exceed the quota (60 in parallel over HTTP)', async () => {
    const lead = await signInDemo(app, 'priya.vell@northgate-poly.example');
    const before = (await lead.get('/api/labs/rookery-roof-array/storage')).json;
    const results = await Promise.all(Array.from({ length: 60 }, () => lead.post(reservations('rookery-roof-array'), { bytes: 70_000 })));
    const ok = results.filter((r) => r.status === 201).length;
    expect(results.every((r) => r.status === 201 || r.status === 413)).toBe(true);
    expect(ok).toBe(Math.floor(before.availableBytes / 70_000));
    const after = (await lead.get('/api/labs/rookery-roof-array/storage')).json;
    expect(after.usedBytes + after.reservedBytes).toBeLessThanOrEqual(FREE);
    for (const r of results.filter((x) => x.status === 201)) await quota.release(r.json.reservationId);
  });
});

describe('quota service (called by the presign step)', () => {
  it('never over-reserves with many parallel service calls', async () => {
    const attempts = await Promise.allSettled(Array.from({ length: 80 }, () => quota.reserve(rookeryId, 30_000)));
    const won = attempts.filter((a) => a.status === 'fulfilled') as PromiseFulfilledResult<{ reservationId: string }>[];
    expect(won).toHaveLength(Math.floor(FREE / 30_000));
    for (const a of attempts) if (a.status === 'rejected') expect((a.reason as { code: string }).code).toBe('over_quota');
    const u = await quota.usage(rookeryId);
    expect(u.reservedBytes).toBe(won.length * 30_000);
    for (const w of won) await quota.release(w.value.reservationId);
    expect((await quota.usage(rookeryId)).reservedBytes).toBe(0);
  });

  it('confirms with the real size, counts an object once, refuses released reservations, and expires stale ones', async () => {
    const a = await quota.reserve(fenmoorId, 200_000, { labSlug: 'fenmoor-swarm-ecology' });
    const stored = await quota.confirm(a.reservationId, { objectKey: 'labs/fenmoor/objects/aa11', sizeBytes: 180_000, sha256: 'a'.repeat(64), mediaType: 'text/csv' });
    expect(stored).toMatchObject({ objectKey: 'labs/fenmoor/objects/aa11', sizeBytes: 180_000 });
    // A second draft pointing at the same object: it is counted once.
    const b = await quota.reserve(fenmoorId, 180_000);
    await quota.confirm(b.reservationId, { objectKey: 'labs/fenmoor/objects/aa11', sizeBytes: 180_000, sha256: 'a'.repeat(64), mediaType: 'text/csv' });
    const c = await quota.reserve(fenmoorId, 50_000);
    await quota.confirm(c.reservationId, { objectKey: 'labs/fenmoor/objects/bb22.json', sizeBytes: 50_000, mediaType: 'application/json' });
    const u = await quota.usage(fenmoorId);
    expect(u).toMatchObject({ usedBytes: 230_000, reservedBytes: 0, objectCount: 2, availableBytes: FREE - 230_000 });
    expect(u.breakdown).toEqual([
      { label: 'Trajectory tables', objects: 1, bytes: 180_000 },
      { label: 'Metadata documents', objects: 1, bytes: 50_000 },
    ]);

    const d = await quota.reserve(fenmoorId, 10_000);
    expect(await quota.release(d.reservationId)).toBe(true);
    await expect(quota.confirm(d.reservationId, { objectKey: 'x', sizeBytes: 1, mediaType: 'text/csv' })).rejects.toMatchObject({ code: 'reservation_released', status: 409 });
    expect(await quota.release(a.reservationId)).toBe(false); // confirmed: stays counted

    // Long enough that a loaded machine still reads the usage before it expires.
    const e = await quota.reserve(fenmoorId, 700_000, { ttlMs: 1500 });
    expect((await quota.usage(fenmoorId)).reservedBytes).toBe(700_000);
    await new Promise((r) => setTimeout(r, 1700));
    expect((await quota.usage(fenmoorId)).reservedBytes).toBe(0); // expired space no longer counts
    expect(await quota.expireStale()).toBeGreaterThanOrEqual(1);
    expect((await quota.reservation(e.reservationId))!.status).toBe('released');

    expect(await quota.forget(fenmoorId, 'labs/fenmoor/objects/bb22.json')).toBe(true);
    expect((await quota.usage(fenmoorId)).usedBytes).toBe(180_000);
  });
});

describe('failed payment and the grace period', () => {
  it('refuses new uploads after the grace period but keeps what is stored, and lifts the pause once paid', async () => {
    const strict = await startTestApp({ env: { FREE_TIER_BYTES: String(FREE), PAYMENTS_GRACE_DAYS: '0' } });
    try {
      const lead = await signInDemo(strict, 'tomas.okafor-lind@tidewater.example');
      const plan = (await activePlans(lead))[0];
      expect((await checkoutWith(lead, 'tidewater-schooling', plan.id, CARDS.success)).status).toBe(303);
      await eventually(() => lead.get('/api/labs/tidewater-schooling/billing'), (r) => r.json.currentPlan?.id === plan.id);
      const kept = await lead.post(reservations('tidewater-schooling'), { bytes: 5_000_000 }); // beyond the free tier, within the plan
      expect(kept.status).toBe(201);

      const stripe = createPaymentsClient({ secretKey: strict.payments.secretKey, apiUrl: strict.payments.url });
      const sub = (await stripe.subscriptions.list({ limit: 1 })).data[0];
      await standIn(strict, 'POST', `/subscriptions/${sub.id}/renew`, { outcome: 'failed' });
      await strict.mail.waitFor('tomas.okafor-lind@tidewater.example', /Payment failed for Tidewater Schooling Lab/);
      const blocked = await eventually(() => lead.post(reservations('tidewater-schooling'), { bytes: 1_000 }), (r) => r.status === 402);
      expect(blocked.json.code).toBe('payment_overdue');
      expect(blocked.json.message).toMatch(/Everything already stored or published stays available/);
      const usage = (await lead.get('/api/labs/tidewater-schooling/storage')).json;
      expect(usage).toMatchObject({ uploadsBlocked: true, reservedBytes: 5_000_000, planName: plan.name });

      await standIn(strict, 'POST', `/subscriptions/${sub.id}/renew`, { outcome: 'paid' });
      const open = await eventually(() => lead.post(reservations('tidewater-schooling'), { bytes: 1_000 }), (r) => r.status === 201);
      expect(open.json.reservationId).toBeTruthy();
    } finally {
      await strict.close();
    }
  });
});
