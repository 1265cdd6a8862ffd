import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, waitForFile } from '../support/depositing';

const LAB = 'fenmoor-swarm-ecology';
const DEPOSITOR = 'mina.throssel@fenmoor.example';
const env = browserTestEnv();

/** A draft whose metadata gives the engine its frame rate, units and dimension, with one ingested file. */
async function ingestedFile(name: string, metadata: Record<string, unknown>) {
  const http = await signInDemo(env.app, DEPOSITOR);
  const title = `Ingest report: ${name}`;
  const created = await http.post(`/api/labs/${LAB}/datasets`, { title, summary: 'For the browser test of the ingest report.' });
  expect(created.status).toBe(201);
  const { draftId } = created.json as { draftId: string };
  expect((await http.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: { title, units: 'm', ...metadata } })).status).toBe(200);
  const fileId = await uploadFile(http, LAB, draftId, name, fixture(name));
  expect(await waitForFile(http, LAB, draftId, fileId)).toMatchObject({ state: 'ready', status: 'ok' });
  return `${env.app.url}/labs/${LAB}/drafts/${draftId}/files/${fileId}`;
}

async function signIn(page: Page) {
  await signInThroughForm(page, env.app.url, DEPOSITOR);
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

// Generous: a software WebGL rasteriser on a shared CPU can be slow.
const readout = (page: Page) => page.getByTestId('quick-look-time').innerText({ timeout: 60_000 });
const seconds = (text: string) => Number(/t = (-?[\d.]+) s/.exec(text)?.[1]);

describe('browser: the ingest report of a trajectory file', () => {
  it('draws every figure, exports them, and plays the quick look', async () => {
    const url = await ingestedFile('trapped-langevin-swarm.csv.gz', { frameRate: 100, dimension: 3 });
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message + e.stack));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    await signIn(page);
    await page.goto(url);
    await page.getByTestId('summary-table').waitFor();
    await page.getByTestId('ingest-plots').waitFor();

    // Every figure of a 3D file draws an SVG chart with data in it.
    const figures = ['radial-density', 'speed', 'vx', 'vy', 'vz', 'speed-distance', 'radial-acceleration', 'order', 'nearest-neighbour', 'autocorrelation'];
    for (const id of figures) {
      const fig = page.getByTestId(`figure-${id}`);
      await fig.locator('svg.recharts-surface').first().waitFor();
      await expect.poll(() => fig.locator('.recharts-line path, .recharts-area path, .recharts-line-dots circle, .recharts-curve').count(), { message: id }).toBeGreaterThan(0);
      expect(await fig.locator('figcaption').innerText()).not.toBe('');
      // Axes carry their units.
      expect(await fig.locator('.recharts-label').allTextContents()).toEqual(expect.arrayContaining([expect.stringMatching(/\(.+\)/)]));
    }
    await expect.poll(() => page.getByTestId('figure-radial-acceleration').innerText()).toMatch(/K = [\d.]+ ± [\d.]+ s⁻², R² = [\d.]+/);
    // This swarm forms no pair under the default rule.
    await expect.poll(() => page.getByTestId('figure-pairs').innerText()).toMatch(/No pairs found/);

    // Exports: SVG is a standalone SVG document, CSV names its columns with units, PNG is a PNG.
    const fig = page.getByTestId('figure-radial-acceleration');
    const svgDownload = page.waitForEvent('download');
    await fig.getByRole('button', { name: /as SVG/ }).click();
    const svgFile = await svgDownload;
    expect(svgFile.suggestedFilename()).toBe('radial-acceleration-against-distance.svg');
    const svgText = fs.readFileSync((await svgFile.path())!, 'utf8');
    expect(svgText).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect(svgText).toContain('K = ');
    expect(svgText).toContain('@font-face');
    const shown = await context.newPage();
    await shown.setContent(svgText);
    await shown.screenshot({ path: 'test-artifacts/ingest-report-05-exported-svg.png' });
    await shown.close();

    const csvDownload = page.waitForEvent('download');
    await fig.getByRole('button', { name: /as CSV/ }).click();
    const csvFile = await csvDownload;
    expect(csvFile.suggestedFilename()).toBe('radial-acceleration-against-distance.csv');
    const csv = fs.readFileSync((await csvFile.path())!, 'utf8').replace(/^\uFEFF/, '').split('\r\n');
    expect(csv[0]).toBe('distance from centroid r (m),mean radial acceleration (m/s²),samples in bin,fitted −K r (m/s²)');
    expect(csv.length).toBeGreaterThan(10);

    const pngDownload = page.waitForEvent('download');
    await page.getByTestId('figure-speed').getByRole('button', { name: /as PNG/ }).click();
    const pngFile = await pngDownload;
    expect(pngFile.suggestedFilename()).toBe('speed-distribution.png');
    const png = fs.readFileSync((await pngFile.path())!);
    fs.writeFileSync('test-artifacts/ingest-report-06-exported.png', png);
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
    // Drawn at 2×: the PNG is twice as wide as the chart on screen.
    const width = png.readUInt32BE(16);
    const onScreen = (await page.getByTestId('figure-speed').locator('svg.recharts-surface').boundingBox())!.width;
    expect(Math.abs(width - 2 * Math.round(onScreen))).toBeLessThanOrEqual(2);

    // The player of a 3D file: three.js on a canvas (headless Chromium has a software WebGL).
    const player = page.getByTestId('quick-look-player');
    await player.scrollIntoViewIfNeeded();
    await page.getByTestId('quick-look-3d').locator('canvas').waitFor();
    expect(seconds(await readout(page))).toBe(0);
    await snap(page, 'ingest-report-01-page');
    await page.getByTestId('ingest-plots').screenshot({ path: 'test-artifacts/ingest-report-01-figures.png' });

    await page.getByTestId('quick-look-play').click();
    await expect.poll(async () => seconds(await readout(page)), { timeout: 15_000 }).toBeGreaterThan(0.2);
    await page.getByTestId('quick-look-play').click(); // pause
    const paused = seconds(await readout(page));
    await page.waitForTimeout(300);
    expect(seconds(await readout(page))).toBe(paused);

    // Scrubbing moves to the frame asked for; space on the player plays again.
    await page.getByTestId('quick-look-slider').fill('40');
    await expect.poll(async () => seconds(await readout(page))).toBeCloseTo(2, 5);
    await page.getByTestId('quick-look-slider').focus();
    await page.keyboard.press('Space');
    await expect.poll(async () => seconds(await readout(page)), { timeout: 15_000 }).toBeGreaterThan(2.2);
    await page.keyboard.press('Space');
    await player.screenshot({ path: 'test-artifacts/ingest-report-02-player.png' });

    expect(errors).toEqual([]);
    await context.close();

    // Without WebGL the player falls back to the x–y projection, says so, and still plays.
    const noGl = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    await noGl.addInitScript(() => {
      const getContext = HTMLCanvasElement.prototype.getContext;
      HTMLCanvasElement.prototype.getContext = function (this: HTMLCanvasElement, kind: string, ...rest: unknown[]) {
        return /webgl/i.test(kind) ? null : (getContext as (...a: unknown[]) => unknown).call(this, kind, ...rest);
      } as typeof getContext;
    });
    const page2 = await noGl.newPage();
    const errors2: string[] = [];
    page2.on('pageerror', (e) => errors2.push(e.message));
    await signIn(page2);
    await page2.goto(url);
    await page2.getByTestId('quick-look-fallback').waitFor();
    expect(await page2.getByTestId('quick-look-fallback').innerText()).toMatch(/x–y projection/);
    await page2.getByTestId('quick-look-2d').locator('circle').first().waitFor();
    await page2.getByTestId('quick-look-play').click();
    await expect.poll(async () => seconds(await readout(page2)), { timeout: 15_000 }).toBeGreaterThan(0.2);
    await page2.getByTestId('quick-look-player').screenshot({ path: 'test-artifacts/ingest-report-03-player-no-webgl.png' });
    expect(errors2).toEqual([]);
    await noGl.close();
  });

  it('draws a 2D file in the plane, with its pair events on a timeline', async () => {
    const url = await ingestedFile('vicsek-flock-2d.csv.gz', { frameRate: 25, dimension: 2 });
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signIn(page);
    await page.goto(url);
    await page.getByTestId('ingest-plots').waitFor();
    expect(await page.getByTestId('figure-vz').count()).toBe(0);
    await expect.poll(() => page.getByTestId('figure-radial-density').innerText()).toMatch(/m⁻²/);
    const pairs = page.getByTestId('figure-pairs');
    await expect.poll(() => pairs.locator('.recharts-bar-rectangle path').count()).toBeGreaterThan(0);
    await page.getByTestId('quick-look-2d').locator('circle').first().waitFor();
    expect(await page.getByTestId('quick-look-fallback').count()).toBe(0);
    await snap(page, 'ingest-report-04-2d');
    await context.close();
  });
});
