import { beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';
import { signInDemo } from '../support/accounts';
import { publishRelease, type Published } from '../support/publishing';

const env = browserTestEnv();
const LAB = 'fenmoor-swarm-ecology';
// Metadata that would run script if any page inserted it as HTML.
const HOSTILE_TITLE = '<script>window.__pwned = 1; alert(1)</script> Dusk swarm </script><img src=x onerror="window.__pwned = 2">';
const HOSTILE_DESCRIPTION = '<img src=x onerror="alert(2)"> A synthetic swarm. <iframe src="javascript:alert(3)"></iframe>';
const HOSTILE_CREATOR = '<svg onload="alert(4)">Mina Throssel';

type Watch = { violations: string[]; consoleErrors: string[]; dialogs: string[] };

/** A browser context that records every CSP violation, CSP console error and dialog. */
async function watchedContext(): Promise<{ context: BrowserContext; page: Page; watch: Watch }> {
  const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
  const watch: Watch = { violations: [], consoleErrors: [], dialogs: [] };
  await context.exposeBinding('__reportViolation', (_source, line: string) => void watch.violations.push(line));
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __reportViolation: (l: string) => void }).__reportViolation(`${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`);
    });
  });
  const page = await context.newPage();
  page.on('console', (m) => {
    if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) watch.consoleErrors.push(m.text());
  });
  page.on('dialog', (d) => {
    watch.dialogs.push(d.message());
    void d.dismiss();
  });
  return { context, page, watch };
}

let rel: Published;
beforeAll(async () => {
  const depositor = await signInDemo(env.app, 'mina.throssel@fenmoor.example');
  const lead = await signInDemo(env.app, 'ilse.marten@fenmoor.example');
  rel = await publishRelease(depositor, lead, LAB, {
    title: HOSTILE_TITLE,
    description: HOSTILE_DESCRIPTION,
    creators: [{ name: HOSTILE_CREATOR, affiliation: { name: 'University of Harrowgate' } }],
  });
}, 120_000);

describe('browser: Content-Security-Policy and HTML injection', () => {
  it('loads the main pages, plots, quick look and uploader with no CSP violation', async () => {
    const { context, page, watch } = await watchedContext();
    const res = await page.goto(`${env.app.url}/`);
    expect(res?.headers()['content-security-policy']).toContain("script-src 'self'");
    await page.getByRole('heading').first().waitFor();
    await page.goto(`${env.app.url}/sign-in`);
    await page.getByLabel('E-mail address').waitFor();
    await page.goto(`${env.app.url}/catalogue`);
    await page.getByRole('heading').first().waitFor();

    // The landing page: statistics, plots and the three.js quick look.
    await page.goto(`${env.app.url}/releases/${rel.suffix}`);
    await page.getByTestId('summary-table').first().waitFor({ timeout: 20_000 });
    await page.getByTestId('chart').first().locator('svg').first().waitFor();
    await page.getByTestId('quick-look-player').waitFor();
    await page.getByTestId('quick-look-3d').locator('canvas').waitFor({ timeout: 10_000 });
    await snap(page, 'csp-01-landing');

    // The draft page with the uploader, and a real direct upload to the object store.
    await signInThroughForm(page, env.app.url, 'mina.throssel@fenmoor.example');
    await page.waitForURL('**/labs', { waitUntil: 'commit' });
    const depositor = await signInDemo(env.app, 'mina.throssel@fenmoor.example');
    const created = await depositor.post(`/api/labs/${LAB}/datasets`, { title: 'CSP upload check', summary: '' });
    expect(created.status, created.text).toBe(201);
    const { draftId } = created.json;
    await page.goto(`${env.app.url}/labs/${LAB}/drafts/${draftId}`);
    await page.getByRole('heading', { name: 'CSP upload check' }).waitFor().catch(async (e) => {
      await snap(page, 'csp-02-draft-failed');
      throw e;
    });
    await snap(page, 'csp-02-draft');
    const dataTransfer = await page.evaluateHandle(() => {
      const dt = new DataTransfer();
      dt.items.add(new File(['track,frame,x,y\n1,0,0,0\n1,1,0.1,0.1\n2,0,1,1\n2,1,1.1,1.1\n'], 'csp-check.csv', { type: 'text/csv' }));
      return dt;
    });
    await page.getByTestId('drop-zone').dispatchEvent('drop', { dataTransfer });
    await page.getByTestId('draft-file').filter({ hasText: 'csp-check.csv' }).waitFor();
    // The parts went straight to the object store (connect-src), so the server holds the whole file.
    await expect.poll(async () => (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).json.files?.[0]?.sizeBytes ?? null, { timeout: 30_000 }).toBeGreaterThan(0);
    await snap(page, 'csp-02-draft-upload');

    expect(watch.violations).toEqual([]);
    expect(watch.consoleErrors).toEqual([]);
    await context.close();
  }, 120_000);

  it('shows hostile metadata as text on the landing page: no script runs, no dialog opens', async () => {
    const { context, page, watch } = await watchedContext();
    await page.goto(`${env.app.url}/releases/${rel.suffix}`);
    const heading = page.getByRole('heading', { level: 1 });
    await heading.waitFor();
    expect(await heading.textContent()).toContain('<script>window.__pwned = 1; alert(1)</script> Dusk swarm');
    await page.getByText(HOSTILE_DESCRIPTION, { exact: false }).first().waitFor();
    await page.getByText(HOSTILE_CREATOR, { exact: false }).first().waitFor();
    await page.waitForTimeout(500);
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    // None of the injected elements exists in the document.
    expect(await page.locator('img[src="x"], iframe[src^="javascript"], svg[onload]').count()).toBe(0);
    expect(watch.dialogs).toEqual([]);
    // The document title and the JSON-LD carry the text too, still as text.
    expect(await page.title()).toContain('Dusk swarm');
    await snap(page, 'csp-03-hostile-metadata');
    await context.close();
  });

  it('reaches the audit log from the lab page (lead) and the admin navigation', async () => {
    const { context, page, watch } = await watchedContext();
    await signInThroughForm(page, env.app.url, 'ilse.marten@fenmoor.example');
    await page.waitForURL('**/labs', { waitUntil: 'commit' });
    await page.goto(`${env.app.url}/labs/${LAB}`);
    await page.getByRole('link', { name: 'Audit log' }).click();
    await page.getByRole('heading', { name: 'Audit log' }).waitFor();
    await page.getByRole('cell', { name: /^(Access request created|Release published)$/ }).or(page.getByText('No events match these filters.')).first().waitFor();
    await page.getByLabel('Actor').fill('marten');
    await page.getByRole('button', { name: 'Apply filters' }).click();
    await expect.poll(async () => page.getByRole('link', { name: 'Export these events as CSV' }).getAttribute('href')).toContain('actor=marten');
    await snap(page, 'csp-04-lab-audit');
    await context.close();

    const admin = await watchedContext();
    await signInThroughForm(admin.page, env.app.url, 'nell.ashby@harrowgate-rds.example');
    await admin.page.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { waitUntil: 'commit' });
    await admin.page.getByRole('link', { name: 'Audit log' }).click();
    await admin.page.getByRole('heading', { name: 'Audit log' }).waitFor();
    await admin.page.getByRole('columnheader', { name: 'Lab' }).or(admin.page.getByText('No events match these filters.')).first().waitFor();
    await snap(admin.page, 'csp-05-admin-audit');
    expect([...watch.violations, ...admin.watch.violations]).toEqual([]);
    await admin.context.close();
  });
});
