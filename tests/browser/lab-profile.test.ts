import { describe, expect, it } from 'vitest';
import { browserTestEnv, signInThroughForm, snap } from '../support/browser';
import { signInDemo } from '../support/accounts';
import { publishRelease } from '../support/publishing';

const env = browserTestEnv();
const LAB = 'rookery-roof-array';

describe('browser: the public lab page', () => {
  it('a member opts in to be listed; visitors see them, the description and the lab’s releases', async () => {
    const depositorApi = await signInDemo(env.app, 'oskar.lenning@northgate-poly.example');
    const leadApi = await signInDemo(env.app, 'priya.vell@northgate-poly.example');
    // A keyword that would end a script element if it were not escaped.
    const older = await publishRelease(depositorApi, leadApi, LAB, { title: 'Jackdaw evening flight over the roof array', keywords: ['</script><script>window.hacked=1</script>'] });
    const newer = await publishRelease(depositorApi, leadApi, LAB, { title: 'Starling murmuration at the winter roost', access: { level: 'restricted' } });
    expect((await depositorApi.patch('/api/me', { name: 'Oskar Lenning', orcid: '0000-0002-1694-233X' })).status).toBe(200);

    // The lead describes the lab on the management page.
    const leadCtx = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const leadPage = await leadCtx.newPage();
    await signInThroughForm(leadPage, env.app.url, 'priya.vell@northgate-poly.example');
    await leadPage.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await leadPage.goto(`${env.app.url}/labs/${LAB}`);
    const description = leadPage.getByLabel('Description of the lab');
    await description.fill('Jackdaw and starling flocks recorded from a rooftop stereo rig above the campus. Synthetic demo data.');
    await leadPage.getByRole('button', { name: 'Save description' }).click();
    await leadPage.getByText('Description saved', { exact: false }).waitFor();
    await snap(leadPage, 'lab-profile-01-lead-management');

    // The depositor chooses to be listed, on the public page itself.
    const memberCtx = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const memberPage = await memberCtx.newPage();
    await signInThroughForm(memberPage, env.app.url, 'oskar.lenning@northgate-poly.example');
    await memberPage.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await memberPage.goto(`${env.app.url}/labs/${LAB}/about`);
    await memberPage.getByText('No member has chosen to be listed yet.').waitFor();
    const toggle = memberPage.getByRole('checkbox', { name: /List me on the lab’s public page/ });
    expect(await toggle.isChecked()).toBe(false);
    await toggle.check();
    await memberPage.getByTestId('lab-people').getByText('Oskar Lenning').waitFor();
    expect(await toggle.isChecked()).toBe(true);
    await snap(memberPage, 'lab-profile-02-member-opted-in');

    // A visitor sees the page: description, the listed member with an ORCID link, releases newest first with identifiers.
    const visitorCtx = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await visitorCtx.newPage();
    await page.goto(`${env.app.url}/labs/${LAB}/about`);
    await page.getByRole('heading', { name: 'Rookery Roof Array', level: 1 }).waitFor();
    await page.getByText('rooftop stereo rig above the campus', { exact: false }).waitFor();
    const people = page.getByTestId('lab-people');
    await people.getByText('Oskar Lenning').waitFor();
    expect(await people.getByRole('link', { name: '0000-0002-1694-233X' }).getAttribute('href')).toBe('https://orcid.org/0000-0002-1694-233X');
    const titles = await page.getByTestId('lab-releases').locator('li a.font-serif').allTextContents();
    expect(titles).toEqual(['Starling murmuration at the winter roost', 'Jackdaw evening flight over the roof array']);
    expect(await page.getByRole('link', { name: newer.doi }).getAttribute('href')).toBe(`/doi/${newer.doi}`);
    await page.getByRole('button', { name: `Copy ${older.doi}` }).waitFor();
    expect(await page.getByRole('checkbox').count()).toBe(0);
    // Never an address on the public page.
    expect(await page.locator('main, article').first().innerText()).not.toMatch(/@/);
    await snap(page, 'lab-profile-03-visitor');

    // The release page names the lab with a link to this page.
    await page.goto(`${env.app.url}/releases/${older.suffix}`);
    await page.getByRole('link', { name: 'Rookery Roof Array' }).click();
    await page.waitForURL(`**/labs/${LAB}/about`);
    await page.getByTestId('lab-releases').waitFor();

    // A DOI link leads through the portal's resolver to the release.
    await page.getByRole('link', { name: older.doi }).click();
    await page.waitForURL(`**/releases/${older.suffix}`);
    expect(await page.evaluate(() => (window as unknown as { hacked?: number }).hacked)).toBeUndefined();
    await Promise.all([leadCtx.close(), memberCtx.close(), visitorCtx.close()]);
  });

  it('serves the schema.org Dataset of a release page in its HTML, for crawlers that run no JavaScript', async () => {
    const depositorApi = await signInDemo(env.app, 'oskar.lenning@northgate-poly.example');
    const leadApi = await signInDemo(env.app, 'priya.vell@northgate-poly.example');
    const rel = await publishRelease(depositorApi, leadApi, LAB, { title: 'Rooftop flock </script> test', keywords: ['</script><script>x()</script>'] });
    const res = await fetch(`${env.app.url}/releases/${rel.suffix}`, { headers: { accept: 'text/html' } });
    expect(res.status).toBe(200);
    const html = await res.text();
    const scripts = [...html.matchAll(/<script type="application\/ld\+json" data-from="server">([\s\S]*?)<\/script>/g)];
    expect(scripts).toHaveLength(1);
    expect(html.indexOf(scripts[0][0])).toBeLessThan(html.indexOf('</head>'));
    // Nothing in the data closes the element early; the JSON reads back intact.
    expect(scripts[0][1]).not.toContain('</');
    const doc = JSON.parse(scripts[0][1]);
    expect(doc).toMatchObject({ '@type': 'Dataset', name: 'Rooftop flock </script> test', identifier: `https://doi.org/${rel.doi}`, keywords: expect.arrayContaining(['</script><script>x()</script>']) });
    expect(res.headers.get('content-length')).toBe(String(Buffer.byteLength(html)));
    // Other pages and unknown releases get the plain shell.
    expect(await (await fetch(`${env.app.url}/releases/cx.0000-00000.v1`, { headers: { accept: 'text/html' } })).text()).not.toContain('application/ld+json');
    expect(await (await fetch(`${env.app.url}/labs/${LAB}/about`, { headers: { accept: 'text/html' } })).text()).not.toContain('application/ld+json');
  });
});
