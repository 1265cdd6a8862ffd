import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { uniqueEmail } from '../support/test-app';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';

const env = browserTestEnv();

/** Opens the newest captured mail to `to` on the mailbox page and follows its first link. */
async function followMailLink(page: Page, to: string, subject: RegExp, shot: string) {
  await page.goto(`${env.app.url}/dev/mailbox`);
  const item = page.getByTestId('mail-item').filter({ hasText: to }).filter({ hasText: subject }).first();
  await item.waitFor({ timeout: 15_000 });
  const body = item.getByTestId('mail-body');
  if (!(await body.isVisible())) await item.getByRole('button').click();
  await snap(page, shot);
  await body.getByRole('link').first().click();
}

async function signUp(page: Page, name: string, email: string) {
  await page.goto(`${env.app.url}/sign-up`);
  await page.getByLabel('Full name').fill(name);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill('a-long-browser-password');
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
}

describe('browser: sign up, confirm, create a lab, invite, accept', () => {
  it('is clicked through by a lead and an invitee', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1200, height: 900 } });
    const page = await context.newPage();
    const leadEmail = uniqueEmail('browser-lead');

    // Field-level errors come from the shared zod schema before anything is sent.
    await page.goto(`${env.app.url}/sign-up`);
    await page.getByRole('button', { name: 'Create account' }).click();
    await expect.poll(() => page.getByText('Enter a valid e-mail address').isVisible()).toBe(true);
    await snap(page, '01-sign-up-errors');

    await signUp(page, 'Dr Wren Calloway', leadEmail);
    await snap(page, '02-check-email');
    await followMailLink(page, leadEmail, /Confirm your e-mail/, '03-mailbox-verification');
    await page.getByRole('heading', { name: 'Your account' }).waitFor();

    // ORCID check digit, shown on the field.
    await page.getByLabel('ORCID iD').fill('0000-0002-1825-0098');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText('This is not a valid ORCID iD', { exact: false }).waitFor();
    await page.getByLabel('ORCID iD').fill('0000-0002-1825-0097');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText('Your profile is saved.').waitFor();
    await snap(page, '04-account');

    await page.goto(`${env.app.url}/labs/new`);
    await page.getByLabel('Lab name').fill('Marsh Gnat Observatory');
    const slug = await page.getByLabel('Short name').inputValue();
    expect(slug).toBe('marsh-gnat-observatory');
    await page.getByLabel('Institution', { exact: true }).fill('University of Lowfield');
    await page.getByRole('button', { name: 'Create lab' }).click();
    await page.getByRole('heading', { name: 'Marsh Gnat Observatory' }).waitFor();

    const inviteeEmail = uniqueEmail('browser-invitee');
    await page.getByLabel('E-mail address').fill(inviteeEmail);
    await page.getByLabel('Role', { exact: true }).selectOption('depositor');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${inviteeEmail}.`).waitFor();
    await page.getByText('Awaiting answer').waitFor();
    await snap(page, '05-lab-as-lead');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();

    // The invitee signs up with the invited address, confirms it, and accepts.
    await signUp(page, 'Ada Brackwater', inviteeEmail);
    await followMailLink(page, inviteeEmail, /Confirm your e-mail/, '06-mailbox-invitee');
    await page.getByRole('heading', { name: 'Your account' }).waitFor();
    await followMailLink(page, inviteeEmail, /invited to join Marsh Gnat Observatory/, '07-mailbox-invitation');
    await page.getByRole('button', { name: 'Accept and join' }).click();
    await page.getByText('You are now a member of Marsh Gnat Observatory.').waitFor();
    await snap(page, '08-invitation-accepted');

    await page.getByRole('link', { name: 'Open the lab' }).click();
    await page.getByRole('heading', { name: 'Members (2)' }).waitFor();
    // A depositor sees members but neither the invitation form nor role controls.
    expect(await page.getByRole('heading', { name: 'Invite a member' }).count()).toBe(0);
    expect(await page.getByRole('combobox').count()).toBe(0);
    await snap(page, '09-lab-as-depositor');
    await context.close();
  });

  it('lets the seeded admin see every lab, and hides admin pages from others', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1200, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, env.app.url, 'nell.ashby@harrowgate-rds.example');
    await page.getByRole('link', { name: 'All labs' }).click();
    await page.getByRole('link', { name: 'Tidewater Schooling Lab' }).waitFor();
    await snap(page, '10-admin-labs');
    await page.getByRole('link', { name: 'Accounts' }).click();
    await page.getByText('ilse.marten@fenmoor.example').waitFor();
    await snap(page, '11-admin-accounts');
    await context.close();

    const other = await env.browser.newContext();
    const p2 = await other.newPage();
    await p2.goto(`${env.app.url}/sign-in?next=/admin/users`);
    await p2.getByLabel('E-mail address').fill('jun.haverly@tidewater.example');
    await p2.getByLabel('Password').fill('demo-swarm-2026');
    await p2.getByRole('button', { name: 'Sign in' }).click();
    await p2.getByText("This page is for the platform's administrators.").waitFor();
    expect(await p2.getByRole('link', { name: 'Accounts' }).count()).toBe(0);
    await other.close();
  });
});
