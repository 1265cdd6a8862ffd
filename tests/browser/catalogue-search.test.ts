import { beforeAll, describe, expect, it } from 'vitest';
import { browserTestEnv, snap } from '../support/browser';
import { signInDemo } from '../support/accounts';
import { publishRelease } from '../support/publishing';

const env = browserTestEnv();

beforeAll(async () => {
  const fen = { depositor: await signInDemo(env.app, 'mina.throssel@fenmoor.example'), curator: await signInDemo(env.app, 'rafael.quist@fenmoor.example') };
  const tide = { depositor: await signInDemo(env.app, 'jun.haverly@tidewater.example'), curator: await signInDemo(env.app, 'asha.penrose@tidewater.example') };
  await publishRelease(fen.depositor, fen.curator, 'fenmoor-swarm-ecology', {
    title: 'Reed-bed midge swarm at dusk',
    description: 'Chironomid midges swarming over a reed bed at dusk, with three cameras. Synthetic recording for the catalogue browser test.',
    keywords: ['midges', 'dusk'], groupType: 'swarm', setting: 'field', species: [{ name: 'Chironomus riparius' }], numberOfIndividuals: 40,
  });
  await publishRelease(fen.depositor, fen.curator, 'fenmoor-swarm-ecology', {
    title: 'Midge swarm in the flight tunnel',
    description: 'Chironomid midges in a laboratory flight tunnel under dim light. Synthetic recording for the catalogue browser test.',
    groupType: 'swarm', setting: 'laboratory', species: [{ name: 'Chironomus riparius' }], numberOfIndividuals: 25,
  });
  await publishRelease(tide.depositor, tide.curator, 'tidewater-schooling', {
    title: 'Shiner school feeding on midge larvae',
    description: 'Golden shiners schooling in a round tank while feeding on midge larvae. Synthetic recording for the catalogue browser test.',
    access: { level: 'restricted' }, groupType: 'school', setting: 'laboratory', species: [{ name: 'Notemigonus crysoleucas' }], numberOfIndividuals: 30,
  });
}, 180_000);

describe('browser: the catalogue search', () => {
  it('searches, narrows with two facets in the URL, and steps back', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${env.app.url}/`);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Catalogue' }).click();
    await page.waitForURL(/\/catalogue$/);

    await page.getByRole('searchbox', { name: 'Search released datasets' }).fill('midge');
    await page.keyboard.press('Enter');
    await page.waitForURL(/q=midge/);
    const count = page.getByTestId('result-count');
    await expect.poll(() => count.innerText()).toBe('3 datasets');
    const results = page.getByTestId('catalogue-results');
    // A title match ranks first; the matched word is marked.
    await expect.poll(() => results.getByRole('article').first().getByRole('heading').innerText()).toMatch(/midge/i);
    await expect.poll(() => results.locator('mark').count()).toBeGreaterThan(0);
    expect(await results.getByText('Files on request').count()).toBe(1);

    const swarm = page.getByRole('group', { name: 'Group type' }).getByRole('checkbox', { name: /Swarm/ });
    // The URL holds the choice: the box shows it once the page has moved to the new address.
    await swarm.click();
    await page.waitForURL(/groupType=swarm/);
    await expect.poll(() => swarm.isChecked()).toBe(true);
    await expect.poll(() => count.innerText()).toBe('2 datasets');
    // The setting facet counts follow the group-type choice.
    const settings = page.getByRole('group', { name: 'Setting' });
    await expect.poll(() => settings.getByText('Laboratory').locator('..').innerText()).toMatch(/Laboratory\s*1/);
    await settings.getByRole('checkbox', { name: /Field/ }).click();
    await page.waitForURL(/groupType=swarm.*setting=field|setting=field.*groupType=swarm/);
    await expect.poll(() => count.innerText()).toBe('1 dataset');
    await expect.poll(() => results.getByRole('article').first().innerText()).toMatch(/Reed-bed midge swarm/);
    await snap(page, 'catalogue-search-two-facets');

    // The first card's link is reachable from the keyboard and has a visible focus ring.
    await page.getByRole('combobox', { name: 'Sort by' }).focus();
    await page.keyboard.press('Tab');
    expect(await results.getByRole('link').first().evaluate((el) => el === document.activeElement)).toBe(true);
    const outline = await results.getByRole('link').first().evaluate((el) => getComputedStyle(el).outlineStyle);
    expect(outline).not.toBe('none');

    await page.goBack();
    await page.waitForURL((u) => !u.search.includes('setting=field'));
    await expect.poll(() => count.innerText()).toBe('2 datasets');
    expect(await settings.getByRole('checkbox', { name: /Field/ }).isChecked()).toBe(false);
    await page.goBack();
    await expect.poll(() => count.innerText()).toBe('3 datasets');
    expect(errors).toEqual([]);
    await context.close();
  });
});
