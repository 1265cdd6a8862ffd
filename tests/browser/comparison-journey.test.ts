import fs from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { browserTestEnv, snap } from '../support/browser';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import type { HttpClient } from '../support/http-client';

const env = browserTestEnv();

/** Deposits one fixture file under `metadata` and publishes it (create → upload → submit → publish). */
async function publish(depositor: HttpClient, curator: HttpClient, lab: string, file: string, metadata: Record<string, unknown>) {
  const { draftId } = (await depositor.post(`/api/labs/${lab}/datasets`, { title: metadata.title, summary: '' })).json;
  await depositor.put(`/api/labs/${lab}/drafts/${draftId}/metadata`, { metadata: validMetadata(metadata) });
  await waitForFile(depositor, lab, draftId, await uploadFile(depositor, lab, draftId, file, fixture(file)));
  expect((await depositor.post(`/api/labs/${lab}/drafts/${draftId}/submit`)).status).toBe(200);
  expect((await curator.post(`/api/labs/${lab}/drafts/${draftId}/publish`, {})).status).toBe(201);
}

beforeAll(async () => {
  const fen = { depositor: await signInDemo(env.app, 'mina.throssel@fenmoor.example'), curator: await signInDemo(env.app, 'rafael.quist@fenmoor.example') };
  const tide = { depositor: await signInDemo(env.app, 'jun.haverly@tidewater.example'), curator: await signInDemo(env.app, 'asha.penrose@tidewater.example') };
  const lab = { groupType: 'swarm', setting: 'laboratory', description: 'Insects swarming in a laboratory flight tunnel. Synthetic recording for the comparison browser test.' };
  const F = 'fenmoor-swarm-ecology';
  await publish(fen.depositor, fen.curator, F, 'trapped-langevin-swarm.csv.gz', { ...lab, title: 'Flight-tunnel midge swarm, first night', frameRate: 100 });
  await publish(fen.depositor, fen.curator, F, 'adaptive-gravity-swarm.csv.gz', { ...lab, title: 'Flight-tunnel mosquito swarm', species: [{ name: 'Anopheles gambiae' }], frameRate: 100 });
  // A title starting with "-" is read as a formula by spreadsheets: the CSV must neutralise it.
  await publish(fen.depositor, fen.curator, F, 'vicsek-flock-3d.csv.gz', { ...lab, title: '-4 °C cold-room midge swarm', frameRate: 25 });
  await publish(fen.depositor, fen.curator, F, 'trapped-langevin-swarm.csv.gz', { ...lab, setting: 'field', title: 'Reed-bed midge swarm at dusk', frameRate: 100 });
  await publish(tide.depositor, tide.curator, 'tidewater-schooling', 'vicsek-flock-2d.csv.gz', {
    groupType: 'school', setting: 'laboratory', dimension: 2, frameRate: 25, species: [{ name: 'Danio rerio' }], title: 'Zebrafish school in the round tank',
    description: 'Zebrafish schooling in a round tank. Synthetic recording for the comparison browser test.',
  });
}, 240_000);

describe('browser: the comparison journey', () => {
  it('searches with two facets, adds three releases to a comparison, switches to the scaling view and exports CSV', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 1000 }, acceptDownloads: true });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));

    await page.goto(`${env.app.url}/catalogue`);
    const count = page.getByTestId('result-count');
    await expect.poll(() => count.innerText()).toBe('5 datasets');
    await page.getByRole('group', { name: 'Group type' }).getByRole('checkbox', { name: /Swarm/ }).check();
    await page.waitForURL(/groupType=swarm/);
    await page.getByRole('group', { name: 'Setting' }).getByRole('checkbox', { name: /Laboratory/ }).check();
    await page.waitForURL(/setting=laboratory/);
    await expect.poll(() => count.innerText()).toBe('3 datasets');

    const results = page.getByTestId('catalogue-results');
    const buttons = results.getByRole('button', { name: /Add to comparison/ });
    await expect.poll(() => buttons.count()).toBe(3);
    for (let i = 0; i < 3; i++) await results.getByRole('button', { name: /Add to comparison/ }).first().click();
    await expect.poll(() => results.getByRole('button', { name: /In comparison/ }).count()).toBe(3);
    const indicator = page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: /Compare, 3 releases picked/ });
    await expect.poll(() => indicator.count()).toBe(1);
    await snap(page, 'comparison-catalogue-picked');

    await indicator.click();
    await page.waitForURL(/\/compare$/);
    const table = page.getByTestId('comparison-table');
    await expect.poll(() => table.locator('thead th').count()).toBe(4);
    expect(await table.innerText()).toMatch(/Mean speed \(m\/s\)/);
    expect(await table.innerText()).toMatch(/Spring constant K \(s⁻²\)/);
    await expect.poll(() => page.getByTestId('figure-cmp-accel').locator('svg.recharts-surface').count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByTestId('figure-cmp-speed').getByRole('list', { name: 'Legend' }).getByRole('listitem').count()).toBe(3);
    await snap(page, 'comparison-table-and-plots');
    // Profiles of groups of different sizes line up in units of each group's RMS radius.
    await page.getByLabel('Profile distances').selectOption('radius');
    await expect.poll(() => page.getByTestId('figure-cmp-density').innerText()).toMatch(/RMS radius/);
    await snap(page, 'comparison-profiles-per-radius');

    const tableCsv = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Download table as CSV' }).click();
    const tablePath = await (await tableCsv).path();
    const csv = fs.readFileSync(tablePath, 'utf8');
    const lines = csv.replace(/^\uFEFF/, '').trimEnd().split('\r\n');
    expect(lines).toHaveLength(4);
    expect(lines[0]).toContain('Mean speed (m/s)');
    expect(csv).toContain(",'-4 °C cold-room midge swarm,");
    expect(csv).not.toMatch(/,-4 °C/);

    await page.getByRole('link', { name: 'Scaling view across all releases' }).click();
    await page.waitForURL(/\/compare\/scaling$/);
    const figure = page.getByTestId('figure-scaling');
    await expect.poll(() => figure.locator('path.recharts-symbols').count()).toBe(5);
    await page.getByLabel('Vertical axis').selectOption('polarization');
    await page.getByLabel('Colour by').selectOption('lab');
    await expect.poll(() => figure.getByRole('list', { name: 'Legend' }).innerText()).toMatch(/Fenmoor[^\n]*\(4\)/);
    expect(await figure.innerText()).toMatch(/exponent b = .*95 % confidence interval/);
    // Two fixtures share a file, so their points coincide: hover the topmost mark.
    await figure.locator('path.recharts-symbols').last().hover({ force: true });
    await expect.poll(() => page.getByText('Click the point to open the release.').count()).toBe(1);
    await snap(page, 'comparison-scaling-view');

    const scalingCsv = page.waitForEvent('download');
    await figure.getByRole('button', { name: /as CSV/ }).click();
    const scaling = fs.readFileSync(await (await scalingCsv).path(), 'utf8').replace(/^\uFEFF/, '').trimEnd().split('\r\n');
    expect(scaling[0]).toBe('release,title,lab,group type,Individuals per frame (mean),Polarization');
    expect(scaling).toHaveLength(6);
    expect(errors).toEqual([]);
    await context.close();
  });
});
