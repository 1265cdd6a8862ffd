import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo, signUpAndVerify } from '../support/accounts';
import { httpClient, type HttpClient } from '../support/http-client';
import { publishNewVersion, publishRelease, type Published } from '../support/publishing';

const ROOKERY = 'rookery-roof-array';
const FENMOOR = 'fenmoor-swarm-ecology';

let app: TestApp;
let visitor: HttpClient, depositor: HttpClient, lead: HttpClient, outsider: HttpClient;
let v1: Published, v2: Published, gone: Published;

beforeAll(async () => {
  app = await startTestApp();
  visitor = httpClient(app.url);
  depositor = await signInDemo(app, 'oskar.lenning@northgate-poly.example');
  lead = await signInDemo(app, 'priya.vell@northgate-poly.example');
  outsider = (await signUpAndVerify(app, 'profile-outsider')).http;
  v1 = await publishRelease(depositor, lead, ROOKERY, { title: 'Jackdaw roost flight, rooftop stereo', species: [{ name: 'Coloeus monedula' }] });
  v2 = await publishNewVersion(depositor, lead, ROOKERY, v1.datasetId, 'Recalibrated.');
  gone = await publishRelease(await signInDemo(app, 'mina.throssel@fenmoor.example'), await signInDemo(app, 'ilse.marten@fenmoor.example'), FENMOOR, { title: 'Mayfly swarm, withdrawn later' });
  const fenLead = await signInDemo(app, 'ilse.marten@fenmoor.example');
  expect((await fenLead.post(`/api/labs/${FENMOOR}/releases/${gone.suffix}/withdraw`, { reason: 'Wrong frame rate.' })).status).toBe(200);
}, 180_000);

afterAll(async () => {
  await app?.close();
});

describe('sitemap.xml and robots.txt', () => {
  it('lists home, catalogue, releases and datasets not withdrawn, and every lab page, with lastmod (sitemaps.org 0.9)', async () => {
    const res = await fetch(`${app.url}/sitemap.xml`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^application\/xml/);
    const body = await res.text();
    if (spawnSync('xmllint', ['--version']).status === 0) expect(spawnSync('xmllint', ['--noout', '-'], { input: body }).status).toBe(0);
    else expect(XMLValidator.validate(body)).toBe(true);
    const doc = new XMLParser({ ignoreAttributes: false, isArray: (n) => n === 'url' }).parse(body);
    expect(doc.urlset['@_xmlns']).toBe('http://www.sitemaps.org/schemas/sitemap/0.9');
    const urls = doc.urlset.url as Array<{ loc: string; lastmod?: string }>;
    const locs = urls.map((u) => u.loc.replace(app.url, ''));
    const datasetSuffix = v1.suffix.replace(/\.v1$/, '');
    expect(locs.slice(0, 2)).toEqual(['/', '/catalogue']);
    expect(locs).toEqual(expect.arrayContaining([`/releases/${v1.suffix}`, `/releases/${v2.suffix}`, `/datasets/${datasetSuffix}`, `/labs/${ROOKERY}/about`, `/labs/${FENMOOR}/about`, '/labs/tidewater-schooling/about']));
    expect(locs).not.toContain(`/releases/${gone.suffix}`);
    expect(locs).not.toContain(`/datasets/${gone.suffix.replace(/\.v1$/, '')}`);
    for (const u of urls) expect(u.lastmod, u.loc).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(new Set(locs).size).toBe(locs.length);
  });

  it('robots.txt points crawlers to the sitemap and keeps them out of the API', async () => {
    const res = await fetch(`${app.url}/robots.txt`);
    expect(res.headers.get('content-type')).toMatch(/^text\/plain/);
    const text = await res.text();
    expect(text).toContain(`Sitemap: ${app.url}/sitemap.xml`);
    expect(text).toMatch(/^User-agent: \*$/m);
    expect(text).toMatch(/^Disallow: \/api\/$/m);
  });
});

describe('schema.org JSON-LD of landing pages', () => {
  it('describes a release as a Dataset with name, identifier, creator, licence and distribution', async () => {
    const { jsonLd } = (await visitor.get(`/api/releases/${v2.suffix}`)).json;
    expect(jsonLd).toMatchObject({
      '@context': 'https://schema.org',
      '@type': 'Dataset',
      name: 'Jackdaw roost flight, rooftop stereo',
      identifier: `https://doi.org/${v2.doi}`,
      url: `${app.url}/releases/${v2.suffix}`,
      version: '2',
      license: expect.stringMatching(/^https:\/\/.*CC-BY-4\.0|creativecommons/i),
      creator: [{ '@type': 'Person', name: 'Mina Throssel', identifier: 'https://orcid.org/0000-0002-1825-0097' }],
      isPartOf: { '@type': 'Dataset', identifier: `https://doi.org/${v2.doi.replace(/\.v2$/, '')}` },
      distribution: [{ '@type': 'DataDownload', name: 'flock.csv.gz', encodingFormat: expect.any(String) }],
    });
  });

  it('gives a withdrawn release no Dataset description', async () => {
    expect((await visitor.get(`/api/releases/${gone.suffix}`)).json.jsonLd).toBeNull();
  });
});

describe('public lab pages', () => {
  const profile = async (who: HttpClient = visitor, slug = ROOKERY) => (await who.get(`/api/labs/${slug}/profile`)).json;

  it('shows the lab, its releases newest first without withdrawn ones, and download totals', async () => {
    const before = await profile();
    expect(before).toMatchObject({ slug: ROOKERY, name: 'Rookery Roof Array', institution: 'Northgate Polytechnic (fictional)', isDemo: true, members: [], myListing: null });
    expect(before.releases.map((r: { suffix: string }) => r.suffix)).toEqual([v2.suffix, v1.suffix]);
    expect(before.downloads).toEqual({ total: 0, unique: 0 });
    expect((await visitor.get(`/api/releases/${v2.suffix}/files/flock.csv.gz/download`)).status).toBe(302);
    const after = await profile();
    expect(after.downloads).toEqual({ total: 1, unique: 1 });
    expect(after.releases[0]).toMatchObject({ suffix: v2.suffix, doi: v2.doi, downloads: 1 });
    expect((await profile(visitor, FENMOOR)).releases).toEqual([]);
  });

  it('lists a member only after they choose to be, with name and ORCID iD and never an address', async () => {
    expect((await profile(depositor)).myListing).toBe(false);
    expect((await depositor.patch('/api/me', { name: 'Oskar Lenning', orcid: '0000-0002-1694-233X' })).status).toBe(200);
    expect((await depositor.put(`/api/labs/${ROOKERY}/listing`, { listed: true })).json).toEqual({ listed: true });
    const shown = await profile();
    expect(shown.members).toEqual([{ name: 'Oskar Lenning', orcid: '0000-0002-1694-233X' }]);
    expect(JSON.stringify(shown)).not.toMatch(/@/);
    expect((await profile(depositor)).myListing).toBe(true);
    // The lead has not chosen, so stays off the page; taking the choice back removes the member again.
    expect((await profile(lead)).myListing).toBe(false);
    await depositor.put(`/api/labs/${ROOKERY}/listing`, { listed: false });
    expect((await profile()).members).toEqual([]);
    await depositor.put(`/api/labs/${ROOKERY}/listing`, { listed: true });
  });

  it('lets only members set their own listing, and refuses a malformed choice', async () => {
    expect((await visitor.put(`/api/labs/${ROOKERY}/listing`, { listed: true })).status).toBe(401);
    expect((await outsider.put(`/api/labs/${ROOKERY}/listing`, { listed: true })).status).toBe(403);
    const bad = await depositor.put(`/api/labs/${ROOKERY}/listing`, { listed: 'yes' });
    expect(bad.status).toBe(400);
    expect(bad.json.fields.listed).toMatch(/true or false/);
    expect((await depositor.put(`/api/labs/${ROOKERY}/listing`, {})).status).toBe(400);
  });

  it('lets the lab lead edit the description, and no one else', async () => {
    expect((await lead.put(`/api/labs/${ROOKERY}/description`, { description: '  Jackdaws and starlings from a rooftop stereo rig.  ' })).json).toEqual({ description: 'Jackdaws and starlings from a rooftop stereo rig.' });
    expect((await profile()).description).toBe('Jackdaws and starlings from a rooftop stereo rig.');
    // The management page reads the same field.
    expect((await lead.get(`/api/labs/${ROOKERY}`)).json.description).toBe('Jackdaws and starlings from a rooftop stereo rig.');
    expect((await depositor.put(`/api/labs/${ROOKERY}/description`, { description: 'x' })).status).toBe(403);
    expect((await visitor.put(`/api/labs/${ROOKERY}/description`, { description: 'x' })).status).toBe(401);
    const long = await lead.put(`/api/labs/${ROOKERY}/description`, { description: 'x'.repeat(2001) });
    expect(long.status).toBe(400);
    expect(long.json.fields.description).toMatch(/2,000/);
    expect((await lead.put(`/api/labs/${ROOKERY}/description`, { description: 42 })).status).toBe(400);
  });

  it('answers 404 for a lab that does not exist', async () => {
    const res = await visitor.get('/api/labs/no-such-lab/profile');
    expect(res.status).toBe(404);
    expect(res.json.message).toMatch(/lab was not found/);
  });
});
