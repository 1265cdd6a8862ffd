import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';

const env = browserTestEnv();
const LAB = 'fenmoor-swarm-ecology';

async function signIn(page: Page, email: string, next?: string) {
  await signInThroughForm(page, env.app.url, email, { next });
}

describe('browser: request access to a restricted release', () => {
  it('a stranger asks, a curator approves from the e-mail, the stranger downloads the bundle', async () => {
    // A restricted release of the lab, published through the API.
    const depositor = await signInDemo(env.app, 'mina.throssel@fenmoor.example');
    const curatorApi = await signInDemo(env.app, 'rafael.quist@fenmoor.example');
    const title = 'Restricted midge swarm for the access journey';
    const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title, access: { level: 'restricted' } }) });
    await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, 'swarm.csv.gz', fixture('trapped-langevin-swarm.csv.gz')));
    await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
    const rel = (await curatorApi.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {})).json as { suffix: string };

    const stranger = await env.browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await stranger.newPage();
    await page.goto(`${env.app.url}/releases/${rel.suffix}`);
    await page.getByText('shared on request', { exact: false }).first().waitFor();
    // The sign-in link of the request panel (it brings the reader back here), not the header's.
    await page.getByText('to ask the lab for access').getByRole('link', { name: 'Sign in' }).click();
    await page.getByLabel('E-mail address').fill('dana.whitcombe@saltmarsh-uni.example');
    await page.getByLabel('Password').fill('demo-swarm-2026');
    await page.getByRole('button', { name: 'Sign in' }).click();
    // Back on the release page (a client-side navigation: wait for its content, not a load event).
    const form = page.getByRole('form', { name: 'Request access' });
    await form.getByTestId('terms').waitFor();
    await form.getByRole('button', { name: 'Send the request' }).click();
    await form.getByText('You need to accept the data-use terms', { exact: false }).waitFor();
    await form.getByLabel('What you will use the data for').fill('Comparing swarm spring constants across species for a synthesis paper.');
    await form.getByLabel('Your affiliation').fill('Saltmarsh University');
    await form.getByLabel('I accept these terms.').check();
    await snap(page, 'access-01-request');
    await form.getByRole('button', { name: 'Send the request' }).click();
    await page.getByText('Your request is with Fenmoor Swarm Ecology Group', { exact: false }).waitFor();

    // The curator follows the link in the e-mail and approves.
    const mail = await env.app.mail.waitFor('rafael.quist@fenmoor.example', /Access request: Restricted midge swarm/);
    const link = /https?:\/\/\S+/.exec(mail.text)![0];
    const curator = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const cp = await curator.newPage();
    await signIn(cp, 'rafael.quist@fenmoor.example', new URL(link).pathname + new URL(link).search);
    const item = cp.getByTestId('access-request').filter({ hasText: 'Dana Whitcombe' });
    await item.waitFor();
    await snap(cp, 'access-02-queue');
    await item.getByRole('button', { name: 'Approve' }).click();
    await item.getByText('Access active').waitFor();
    await curator.close();

    // The stranger is told, and downloads the bundle.
    await env.app.mail.waitFor('dana.whitcombe@saltmarsh-uni.example', /Access granted: Restricted midge swarm/);
    await page.reload();
    const bundle = page.getByTestId('bundle-link');
    await bundle.waitFor({ timeout: 30_000 });
    await snap(page, 'access-03-granted');
    const [download] = await Promise.all([page.waitForEvent('download'), bundle.click()]);
    expect(download.suggestedFilename()).toBe(`${rel.suffix}.zip`);
    await page.goto(`${env.app.url}/account`);
    await page.getByTestId('my-access').getByText('Access active').waitFor();
    // A token for scripts, shown once.
    await page.getByLabel('Token name').fill('analysis notebook');
    await page.getByRole('button', { name: 'Create token' }).click();
    expect(await page.getByTestId('new-token').textContent()).toMatch(/^coh_/);
    await snap(page, 'access-04-account');
    await stranger.close();
  });
});
