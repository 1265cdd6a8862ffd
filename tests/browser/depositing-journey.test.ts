import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';

const env = browserTestEnv();

async function signIn(page: Page, email: string) {
  await signInThroughForm(page, env.app.url, email);
  await page.waitForURL('**/labs', { waitUntil: 'commit' });
}

describe('browser: deposit a dataset, publish it, cite it', () => {
  it('is clicked through by a depositor, a curator and a visitor', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 }, permissions: ['clipboard-read', 'clipboard-write'] });
    const page = await context.newPage();
    await signIn(page, 'mina.throssel@fenmoor.example');

    await page.goto(`${env.app.url}/labs/fenmoor-swarm-ecology`);
    await page.getByRole('link', { name: 'Datasets and drafts' }).click();
    await page.getByRole('heading', { name: 'Downloads' }).waitFor();
    await page.getByRole('link', { name: 'New dataset' }).click();
    await page.getByLabel('Title').fill('Midge swarm over the reed bed, browser test');
    await page.getByLabel('Short description').fill('Deposited by the browser test. Synthetic data.');
    await page.getByRole('button', { name: /Create dataset/ }).click();
    await page.waitForURL('**/drafts/**', { waitUntil: 'commit' });

    // Drag and drop a header-less file onto the drop zone.
    const { readFileSync } = await import('node:fs');
    const bytes = readFileSync('tests/fixtures/trajectories/variants/no-header.csv');
    const dataTransfer = await page.evaluateHandle((content) => {
      const dt = new DataTransfer();
      dt.items.add(new File([content], 'reed-bed-swarm.csv', { type: 'text/csv' }));
      return dt;
    }, bytes.toString('utf8'));
    await page.getByTestId('drop-zone').dispatchEvent('drop', { dataTransfer });
    await page.getByRole('progressbar', { name: 'All uploads' }).waitFor();
    await snap(page, 'dep-01-uploading');
    const row = page.getByTestId('draft-file').filter({ hasText: 'reed-bed-swarm.csv' });
    await row.getByText('Needs attention').waitFor({ timeout: 30_000 });
    await snap(page, 'dep-02-needs-attention');

    // The column-mapping step: say which column holds what, then check again.
    await row.getByRole('link', { name: 'reed-bed-swarm.csv' }).click();
    await page.getByRole('heading', { name: 'Columns and units' }).waitFor();
    await page.getByLabel('The first line holds column names').uncheck();
    await page.getByTestId('preview').waitFor();
    const meanings = ['track_id', 'frame', 'x', 'y', 'z'];
    for (const [i, m] of meanings.entries()) await page.getByLabel(`Meaning of column ${i + 1}`).selectOption(m);
    await page.getByLabel('Frame rate (frames/s)').fill('100');
    await snap(page, 'dep-03-mapping');
    await page.getByRole('button', { name: 'Check the file again' }).click();
    await page.getByText('Passed').waitFor({ timeout: 30_000 });
    await page.getByTestId('summary-table').waitFor();
    await snap(page, 'dep-04-report');
    await page.getByRole('link', { name: 'Back to the draft' }).click();
    await row.getByText('Checked').waitFor();

    // Metadata, saved as one types.
    const form = page.getByRole('form', { name: 'Dataset metadata' });
    await form.getByLabel('Description').fill('A synthetic midge swarm over the reed bed, deposited by the browser test. Not real data.');
    await form.getByLabel('Name', { exact: true }).fill('Mina Throssel');
    await form.getByLabel('ORCID iD').fill('0000-0002-1825-0097');
    await form.getByLabel('Contact person').fill('Mina Throssel');
    await form.getByLabel('Contact e-mail').fill('mina.throssel@fenmoor.example');
    await form.getByLabel('Scientific name').fill('Chironomus riparius');
    await form.getByLabel('Group type').selectOption('swarm');
    await form.getByLabel('Setting').selectOption('laboratory');
    // Measured by the engine, pre-filled.
    await expect.poll(() => form.getByLabel('Number of individuals').inputValue()).toMatch(/^\d+$/);
    await form.getByLabel('Dimension').selectOption('3');
    await form.getByLabel('Length unit of positions').selectOption('m');
    await form.getByLabel('Frame rate (frames/s)').fill('100');
    await form.getByLabel('Licence (SPDX identifier)').fill('CC-BY-4.0');
    await page.getByText('Metadata complete').waitFor({ timeout: 10_000 });
    await page.getByText(/All changes saved at/).waitFor({ timeout: 10_000 });
    await snap(page, 'dep-05-metadata');
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText('In review').first().waitFor();
    await context.close();

    // The curator publishes from the e-mailed link.
    const mail = await env.app.mail.waitFor('rafael.quist@fenmoor.example', /Ready for review: Midge swarm over the reed bed/);
    const draftUrl = /https?:\/\/\S+/.exec(mail.text)![0];
    const curator = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const cp = await curator.newPage();
    await signIn(cp, 'rafael.quist@fenmoor.example');
    await cp.goto(draftUrl);
    await cp.getByLabel('Release notes (optional)').fill('First release.');
    await snap(cp, 'dep-06-review');
    await cp.getByRole('button', { name: 'Publish as a release' }).click();
    await cp.waitForURL('**/releases/**', { waitUntil: 'commit' });
    const releasePath = new URL(cp.url()).pathname;
    await curator.close();

    // A visitor (not signed in) reads the landing page, resolves the identifier and copies BibTeX.
    const visitor = await env.browser.newContext({ viewport: { width: 1280, height: 900 }, permissions: ['clipboard-read', 'clipboard-write'] });
    const vp = await visitor.newPage();
    await vp.goto(`${env.app.url}${releasePath}`);
    await vp.getByRole('heading', { name: 'Midge swarm over the reed bed, browser test' }).waitFor();
    const doi = (await vp.locator('a.font-mono').first().textContent())!.trim();
    expect(doi).toMatch(/^10\.99999\/cx\.[0-9A-Z]{4}-[0-9A-Z]{5}\.v1$/);
    const ld = JSON.parse((await vp.locator('script[type="application/ld+json"]').textContent())!);
    expect(ld).toMatchObject({ '@type': 'Dataset', name: 'Midge swarm over the reed bed, browser test' });
    // The statistics and plots are on the landing page.
    await vp.getByTestId('summary-table').first().waitFor();
    await vp.getByTestId('chart').first().locator('svg').first().waitFor();
    expect(await vp.locator('[data-testid^="figure-"]').count()).toBeGreaterThanOrEqual(8);
    await vp.getByTestId('bibtex').waitFor();
    await vp.getByRole('button', { name: 'Copy BibTeX' }).click();
    expect(await vp.evaluate(() => navigator.clipboard.readText())).toContain(`doi = {${doi}}`);
    await snap(vp, 'dep-07-landing');
    await vp.goto(`${env.app.url}/doi/${doi.toLowerCase()}`);
    await vp.waitForURL(`**${releasePath}`, { waitUntil: 'commit' });
    // The home page lists it among the recent releases.
    await vp.goto(env.app.url);
    await vp.getByTestId('release-list').getByRole('link', { name: 'Midge swarm over the reed bed, browser test' }).waitFor();
    await visitor.close();

    // The lab lead withdraws it: the page becomes a tombstone that keeps the citation.
    const leadContext = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const lp = await leadContext.newPage();
    await signIn(lp, 'ilse.marten@fenmoor.example');
    await lp.goto(`${env.app.url}${releasePath}`);
    await lp.getByRole('button', { name: 'Withdraw this release…' }).click();
    await lp.getByLabel('Reason readers will see').fill('A calibration error was found in camera 2.');
    await lp.getByRole('button', { name: 'Withdraw', exact: true }).click();
    await lp.getByText('This release was withdrawn on', { exact: false }).waitFor();
    await lp.getByTestId('formatted-citation').waitFor();
    await snap(lp, 'dep-09-tombstone');
    await leadContext.close();
  });

  it('keeps typed metadata when saving fails, and saves it once the server answers again', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page, 'mina.throssel@fenmoor.example');
    await page.goto(`${env.app.url}/labs/fenmoor-swarm-ecology/datasets/new`);
    await page.getByLabel('Title').fill('Autosave test');
    await page.getByRole('button', { name: /Create dataset/ }).click();
    await page.waitForURL('**/drafts/**', { waitUntil: 'commit' });
    const form = page.getByRole('form', { name: 'Dataset metadata' });

    // The network drops every save.
    await page.route('**/metadata', (route) => route.abort('connectionfailed'));
    await form.getByLabel('Description').fill('Typed while the connection was down; this text must survive.');
    await page.getByText(/Not saved yet/).waitFor({ timeout: 10_000 });
    await snap(page, 'dep-08-save-failed');

    // Reload: the text comes back from this browser, and is saved now that the server answers.
    await page.unroute('**/metadata');
    await page.reload();
    await expect.poll(() => form.getByLabel('Description').inputValue()).toBe('Typed while the connection was down; this text must survive.');
    await page.getByText(/All changes saved at/).waitFor({ timeout: 10_000 });
    const draftId = new URL(page.url()).pathname.split('/').pop()!;
    const saved = await page.evaluate(async (id) => (await fetch(`/api/labs/fenmoor-swarm-ecology/drafts/${id}`)).json(), draftId);
    expect(saved.metadata.description).toBe('Typed while the connection was down; this text must survive.');
    await context.close();
  });
});
