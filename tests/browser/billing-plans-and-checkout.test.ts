import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';
import { CARDS } from '../support/billing';
import { createQuotaService } from '../../server/services/quota.service';
import { createLabsRepository } from '../../server/repositories/labs.repository';

const env = browserTestEnv();

async function signIn(page: Page, email: string) {
  await signInThroughForm(page, env.app.url, email);
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

async function typeCard(page: Page, card: string) {
  await page.getByRole('heading', { name: 'Payment stand-in — test mode' }).waitFor();
  await page.getByLabel('Card number').fill(card);
  await page.getByRole('button', { name: 'Pay and subscribe' }).click();
}

describe('browser: storage plans and hosted checkout', () => {
  it('an admin adds a plan; a lab lead is declined, then upgrades with the success card and sees the new quota', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1200, height: 900 } });
    const page = await context.newPage();

    // The platform admin adds a plan.
    await signIn(page, 'nell.ashby@harrowgate-rds.example');
    await page.getByRole('link', { name: 'Plans' }).click();
    await page.getByRole('heading', { name: 'Storage plans' }).waitFor();
    await page.getByRole('button', { name: 'Add plan' }).click();
    await page.getByText('Give the quota in GB', { exact: false }).waitFor(); // the shared schema, before anything is sent
    await page.getByLabel('Plan name').fill('Nymph 50 GB');
    await page.getByLabel('Description').fill('Room for one busy field season of mayfly swarms.');
    await page.getByLabel('Storage quota (GB)').fill('50');
    await page.getByLabel('Monthly price').fill('9.5');
    await page.getByText('Shown as €9.50').waitFor();
    await page.getByRole('button', { name: 'Add plan' }).click();
    await page.getByText('Plan “Nymph 50 GB” is on offer').waitFor();
    await page.getByRole('button', { name: 'Archive Nymph 50 GB' }).waitFor();
    // The admin edits a plan in place: a clearer description.
    await page.getByRole('button', { name: 'Edit Nymph 50 GB' }).click();
    const editor = page.locator('tr').filter({ has: page.getByRole('button', { name: 'Save changes' }) });
    await editor.getByLabel('Description').fill('Room for one busy field season of mayfly swarms, with room to spare.');
    await editor.getByRole('button', { name: 'Save changes' }).click();
    await page.getByText('with room to spare.').waitFor();
    await snap(page, 'billing-01-admin-plans');
    await page.getByRole('button', { name: 'Sign out' }).click();

    // The lab lead opens storage and billing from the lab page.
    await signIn(page, 'ilse.marten@fenmoor.example');
    await page.goto(`${env.app.url}/labs/fenmoor-swarm-ecology`);
    await page.getByRole('link', { name: 'Storage and billing' }).click();
    await page.getByRole('heading', { name: 'Storage and billing' }).waitFor();
    const meter = page.getByRole('meter');
    await meter.waitFor();
    expect(await meter.getAttribute('aria-valuemax')).toBe(String(1e9));
    await page.getByText('Free tier', { exact: true }).first().waitFor();
    await snap(page, 'billing-02-lab-free-tier');

    // A declined card shows the provider's error and changes nothing.
    await page.getByRole('button', { name: 'Choose Nymph 50 GB' }).click();
    await typeCard(page, CARDS.declined);
    await page.getByRole('alert').filter({ hasText: 'Your card was declined.' }).waitFor();
    await snap(page, 'billing-03-checkout-declined');
    await page.getByRole('link', { name: 'Cancel and return' }).click();
    await page.getByText('Checkout was cancelled. Nothing was charged').waitFor();
    expect(await page.getByRole('meter').getAttribute('aria-valuemax')).toBe(String(1e9));
    expect(await page.getByText('No invoices yet.').isVisible()).toBe(true);

    // The success card: back on Cohesia, the webhook lands and the new quota shows.
    await page.getByRole('button', { name: 'Choose Nymph 50 GB' }).click();
    await typeCard(page, CARDS.success);
    await page.getByText('is now on Nymph 50 GB', { exact: false }).waitFor({ timeout: 20_000 });
    await expect.poll(() => page.getByRole('meter').getAttribute('aria-valuemax')).toBe(String(50e9));
    await page.getByText('of 50 GB used', { exact: false }).waitFor();
    await page.getByRole('cell', { name: /STANDIN-/ }).waitFor();
    await page.getByText('€9.50').first().waitFor();

    // Some stored data and an upload in flight, through the same quota service the presign step uses.
    const labId = (await createLabsRepository(env.app.database.db).findBySlug('fenmoor-swarm-ecology'))!.id;
    const quota = createQuotaService({ db: env.app.database.db, freeTierBytes: 1e9, graceDays: 7 });
    const r1 = await quota.reserve(labId, 12e9);
    await quota.confirm(r1.reservationId, { objectKey: 'demo/fenmoor/dusk-swarm-2026-06-14.csv.gz', sizeBytes: 11.6e9, sha256: null, mediaType: 'application/gzip' });
    const r2 = await quota.reserve(labId, 4e9);
    await quota.confirm(r2.reservationId, { objectKey: 'demo/fenmoor/tracks-cam2.csv', sizeBytes: 4e9, sha256: null, mediaType: 'text/csv' });
    await quota.reserve(labId, 3e9);
    await page.reload();
    await page.getByRole('cell', { name: 'Uploads in progress' }).waitFor();
    await page.getByText('18.6 GB of 50 GB used', { exact: false }).waitFor();
    await snap(page, 'billing-04-lab-upgraded');

    // The billing portal of the stand-in opens for the lab's customer.
    await page.getByRole('button', { name: 'Open the billing portal' }).click();
    await page.getByRole('heading', { name: 'Billing portal stand-in — test mode' }).waitFor();
    await snap(page, 'billing-05-portal');

    // A renewal whose payment fails (stand-in test control): the lead is told, uploads continue during the grace period.
    await page.getByRole('button', { name: 'Simulate renewal: payment fails' }).click();
    await page.getByRole('link', { name: 'Return to the site' }).click();
    await page.getByText('A payment failed. Please update the payment details', { exact: false }).waitFor({ timeout: 15_000 });
    // The invoice and subscription events arrive one after another: reload until both have landed.
    await expect
      .poll(async () => {
        await page.reload();
        await page.getByRole('heading', { name: 'Invoices' }).waitFor();
        await page.getByRole('cell', { name: /STANDIN-/ }).first().waitFor();
        return (await page.getByText('Payment due').isVisible()) && (await page.getByText('Unpaid').isVisible());
      }, { timeout: 15_000, interval: 500 })
      .toBe(true);
    await snap(page, 'billing-06-payment-failed');

    // The lab's audit log shows the plan taken and the status change, made by the provider's events.
    await page.goto(`${env.app.url}/labs/fenmoor-swarm-ecology/audit`);
    const planRow = page.getByRole('row').filter({ hasText: 'Storage plan changed' });
    await planRow.getByText('Cohesia (automatic)').waitFor();
    await planRow.getByText('Nymph 50 GB').waitFor();
    await planRow.getByText('Free tier').waitFor();
    await planRow.getByText('Fenmoor Swarm Ecology Group').waitFor(); // a lab target is named, not only its id
    await expect.poll(async () => {
      await page.reload();
      // The table is filled once the log has loaded: wait for the row that is already there.
      await planRow.waitFor();
      return page.getByRole('row').filter({ hasText: 'Subscription status changed' }).filter({ hasText: 'Active → Payment due' }).count();
    }, { timeout: 15_000, interval: 500 }).toBe(1);
    await snap(page, 'billing-07-audit-plan-change');
    await context.close();
  });
});
