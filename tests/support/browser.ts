import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { chromium, type Browser, type Page } from 'playwright-core';
import { startTestApp, type TestApp } from './test-app';

export const artifactsDir = path.resolve('test-artifacts');

/** Debian's chromium, headless, with the flags this machine's closed network needs. */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** Saves a full-page screenshot under test-artifacts/ (kept by CI as an artefact). */
export async function snap(page: Page, name: string) {
  fs.mkdirSync(artifactsDir, { recursive: true });
  await page.screenshot({ path: path.join(artifactsDir, `${name}.png`), fullPage: true });
}

/**
 * The usual frame of a browser test file: the real app serving the built
 * client, and one Chromium, started before the tests and closed after.
 */
export function browserTestEnv(): { readonly app: TestApp; readonly browser: Browser } {
  let app: TestApp | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    app = await startTestApp({ client: 'dist' });
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });
  return {
    get app() {
      return app!;
    },
    get browser() {
      return browser!;
    },
  };
}

/** Fills and sends the sign-in form (demo password unless given); the caller waits for what comes next. */
export async function signInThroughForm(page: Page, base: string, email: string, opts: { next?: string; password?: string } = {}) {
  await page.goto(`${base}/sign-in${opts.next ? `?next=${encodeURIComponent(opts.next)}` : ''}`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill(opts.password ?? 'demo-swarm-2026');
  await page.getByRole('button', { name: 'Sign in' }).click();
}
