import { describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { inject } from 'vitest';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';

const env = browserTestEnv();

describe('browser: upload controls', () => {
  it('retries a failed part by itself, pauses and resumes, and cancels', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, env.app.url, 'jun.haverly@tidewater.example');
    await page.waitForURL('**/labs', { waitUntil: 'commit' });
    await page.goto(`${env.app.url}/labs/tidewater-schooling/datasets/new`);
    await page.getByLabel('Title').fill('Upload controls test');
    await page.getByRole('button', { name: /Create dataset/ }).click();
    await page.waitForURL('**/drafts/**', { waitUntil: 'commit' });
    await page.getByLabel('Files are').selectOption('supplementary');

    // Part uploads go straight to the object store: slow them down, and fail the first try of part 2.
    const store = new URL(inject('s3Endpoint')).host;
    let failedOnce = false;
    const partTries: number[] = [];
    await page.route(`http://${store}/**`, async (route) => {
      const url = new URL(route.request().url());
      const part = Number(url.searchParams.get('partNumber'));
      try {
        if (route.request().method() === 'PUT' && part) {
          partTries.push(part);
          await new Promise((r) => setTimeout(r, 700));
          if (part === 2 && !failedOnce) {
            failedOnce = true;
            return await route.fulfill({ status: 500, body: 'simulated failure' });
          }
        }
        await route.continue();
      } catch {
        // The browser gave this request up meanwhile (pause or cancel): nothing to answer.
      }
    });

    const drop = async (name: string, megabytes: number) => {
      const dt = await page.evaluateHandle(
        ([n, mb]) => {
          const d = new DataTransfer();
          d.items.add(new File([new Uint8Array((mb as number) * 1024 * 1024).fill(7)], n as string, { type: 'application/octet-stream' }));
          return d;
        },
        [name, megabytes],
      );
      await page.getByTestId('drop-zone').dispatchEvent('drop', { dataTransfer: dt });
    };

    // Retry: part 2 fails once and is sent again without anyone doing anything.
    await drop('camera-raw.bin', 30);
    await page.getByTestId('draft-file').filter({ hasText: 'camera-raw.bin' }).getByText('Stored').waitFor({ timeout: 60_000 });
    expect(failedOnce).toBe(true);
    expect(partTries.filter((p) => p === 2).length).toBeGreaterThanOrEqual(2);

    // Pause and resume: while paused no new part starts.
    await drop('camera-raw-2.bin', 30);
    const row = page.getByTestId('upload-row').filter({ hasText: 'camera-raw-2.bin' });
    await row.getByRole('button', { name: 'Pause' }).click();
    await row.getByText('Paused').waitFor();
    await snap(page, 'upload-01-paused');
    const triesWhilePaused = partTries.length;
    await page.waitForTimeout(2000);
    expect(partTries.length - triesWhilePaused).toBeLessThanOrEqual(4); // parts already in flight may finish
    await row.getByRole('button', { name: 'Resume' }).click();
    await page.getByTestId('draft-file').filter({ hasText: 'camera-raw-2.bin' }).getByText('Stored').waitFor({ timeout: 60_000 });

    // Cancel: the upload disappears and nothing is left in the draft.
    await drop('cancel-me.bin', 30);
    const cancelRow = page.getByTestId('upload-row').filter({ hasText: 'cancel-me.bin' });
    await cancelRow.getByRole('button', { name: 'Cancel' }).click();
    await cancelRow.waitFor({ state: 'detached' });
    await page.waitForTimeout(1000);
    const draftId = new URL(page.url()).pathname.split('/').pop()!;
    const draft = await page.evaluate(async (id) => (await fetch(`/api/labs/tidewater-schooling/drafts/${id}`)).json(), draftId);
    expect(draft.files.map((f: { fileName: string }) => f.fileName).sort()).toEqual(['camera-raw-2.bin', 'camera-raw.bin']);
    await snap(page, 'upload-02-done');
    await context.close();
  });
});
