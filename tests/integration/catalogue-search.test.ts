import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { httpClient, type HttpClient } from '../support/http-client';
import { publishNewVersion, publishRelease, type Published } from '../support/publishing';

const FEN = 'fenmoor-swarm-ecology';
const TIDE = 'tidewater-schooling';
// Every release of this file carries this keyword, so the demo template's own data never mix in.
const TAG = 'kestrelmarsh';

let app: TestApp;
let visitor: HttpClient;
let fen: { depositor: HttpClient; curator: HttpClient; lead: HttpClient };
let tide: { depositor: HttpClient; curator: HttpClient };
const rel: Record<string, Published> = {};

const meta = (m: Record<string, unknown>) => ({ keywords: [TAG], ...m });
const search = (qs: string) => visitor.get(`/api/search?${qs}`);
const count = (facets: Record<string, Array<{ value: string; count: number }>>, key: string) =>
  Object.fromEntries(facets[key].filter((f) => f.count > 0).map((f) => [f.value, f.count]));

beforeAll(async () => {
  app = await startTestApp();
  visitor = httpClient(app.url);
  fen = {
    depositor: await signInDemo(app, 'mina.throssel@fenmoor.example'),
    curator: await signInDemo(app, 'rafael.quist@fenmoor.example'),
    lead: await signInDemo(app, 'ilse.marten@fenmoor.example'),
  };
  tide = { depositor: await signInDemo(app, 'jun.haverly@tidewater.example'), curator: await signInDemo(app, 'asha.penrose@tidewater.example') };
  rel.titleMatch = await publishRelease(fen.depositor, fen.curator, FEN, meta({
    title: 'Brindlewort swarm over the reed bed',
    description: 'Midges over a reed bed at dusk, a synthetic test recording for the catalogue search.',
    groupType: 'swarm', setting: 'field', species: [{ name: 'Culex pipiens' }], numberOfIndividuals: 40, frameRate: 100,
  }));
  rel.descriptionMatch = await publishRelease(fen.depositor, fen.curator, FEN, meta({
    title: 'Evening flight over the roost',
    description: 'Starlings above the brindlewort meadow; a synthetic test recording for the catalogue search.',
    groupType: 'flock', setting: 'laboratory', species: [{ name: 'Sturnus vulgaris' }], numberOfIndividuals: 300, frameRate: 25,
    access: { level: 'restricted' },
  }));
  rel.school = await publishRelease(tide.depositor, tide.curator, TIDE, meta({
    title: 'Tank school of zebrafish, overhead',
    description: 'Zebrafish schooling in a round tank; a synthetic test recording for the catalogue search.',
    groupType: 'school', setting: 'laboratory', species: [{ name: 'Danio rerio' }], numberOfIndividuals: 12, frameRate: 50,
  }));
  rel.withdrawn = await publishRelease(fen.depositor, fen.curator, FEN, meta({
    title: 'Withdrawn swarm of gnats',
    description: 'A synthetic recording that is withdrawn again and must leave the catalogue.',
    groupType: 'swarm', setting: 'field', species: [{ name: 'Culex pipiens' }], numberOfIndividuals: 45,
  }));
  const w = await fen.lead.post(`/api/labs/${FEN}/releases/${rel.withdrawn.suffix}/withdraw`, { reason: 'Published by mistake in a test.' });
  expect(w.status).toBe(200);
}, 240_000);
afterAll(async () => app?.close());

describe('catalogue search', () => {
  it('ranks a title match above a description-only match and marks the matched words', async () => {
    const res = await search('q=brindlewort');
    expect(res.status).toBe(200);
    expect(res.json.items.map((i: { suffix: string }) => i.suffix)).toEqual([rel.titleMatch.suffix, rel.descriptionMatch.suffix]);
    const [first, second] = res.json.items;
    expect(first.title.text.slice(first.title.highlights[0][0], first.title.highlights[0][1])).toBe('Brindlewort');
    expect(second.snippet.text).toContain('brindlewort');
    const [a, b] = second.snippet.highlights[0];
    expect(second.snippet.text.slice(a, b)).toBe('brindlewort');
    expect(res.json.sort).toBe('relevance');
  });

  it('counts each facet exactly, with the other facets’ filters applied but not its own', async () => {
    const all = (await search(`q=${TAG}`)).json;
    expect(all.total).toBe(3);
    expect(count(all.facets, 'groupType')).toEqual({ swarm: 1, flock: 1, school: 1 });
    expect(count(all.facets, 'lab')).toEqual({ [FEN]: 2, [TIDE]: 1 });
    expect(count(all.facets, 'individuals')).toEqual({ '10-49': 2, '200-999': 1 });
    expect(count(all.facets, 'frameRate')).toEqual({ '25-59': 2, '60-119': 1 });
    expect(count(all.facets, 'access')).toEqual({ open: 2, restricted: 1 });
    expect(count(all.facets, 'species')).toEqual({ 'Culex pipiens': 1, 'Sturnus vulgaris': 1, 'Danio rerio': 1 });
    expect(count(all.facets, 'year')).toEqual({ [String(new Date().getUTCFullYear())]: 3 });

    const labOnly = (await search(`q=${TAG}&setting=laboratory`)).json;
    expect(labOnly.total).toBe(2);
    // Its own facet keeps the counts without its filter, so "field" can still be added.
    expect(count(labOnly.facets, 'setting')).toEqual({ laboratory: 2, field: 1 });
    expect(count(labOnly.facets, 'groupType')).toEqual({ flock: 1, school: 1 });

    const two = (await search(`q=${TAG}&setting=laboratory&groupType=school&groupType=swarm`)).json;
    expect(two.items.map((i: { suffix: string }) => i.suffix)).toEqual([rel.school.suffix]);
    expect(count(two.facets, 'groupType')).toEqual({ flock: 1, school: 1 });
    expect(count(two.facets, 'setting')).toEqual({ laboratory: 1, field: 1 });
    expect(count(two.facets, 'lab')).toEqual({ [TIDE]: 1 });
    // A ticked value without hits stays listed with 0, so it can be unticked.
    expect(two.facets.groupType.find((f: { value: string }) => f.value === 'swarm')).toMatchObject({ count: 0 });
  });

  it('keeps withdrawn releases out and lists restricted ones, marked', async () => {
    const res = (await search(`q=${TAG}`)).json;
    const suffixes = res.items.map((i: { suffix: string }) => i.suffix);
    expect(suffixes).not.toContain(rel.withdrawn.suffix);
    expect(res.items.find((i: { suffix: string }) => i.suffix === rel.descriptionMatch.suffix).accessLevel).toBe('restricted');
    expect((await search('q=gnats')).json.total).toBe(0);
  });

  it('shows one card per dataset: its newest version, with the number of versions', async () => {
    const v2 = await publishNewVersion(fen.depositor, fen.curator, FEN, rel.titleMatch.datasetId, 'Second version for the catalogue test.');
    const res = (await search('q=brindlewort')).json;
    const cards = res.items.filter((i: { datasetSuffix: string }) => i.datasetSuffix === res.items[0].datasetSuffix);
    expect(cards).toHaveLength(1);
    expect(res.items[0]).toMatchObject({ suffix: v2.suffix, version: 2, versionCount: 2 });
    expect(res.items[0].statistics.individuals).toBe(40);
    expect(res.items[0].statistics.durationS).toBeGreaterThan(0);
    expect(res.items[0].sparkline.length).toBeGreaterThan(1);
  }, 60_000);

  it('pages with an opaque cursor that stays stable when a release is published between pages', async () => {
    const first = (await search(`q=${TAG}&sort=newest&limit=2`)).json;
    expect(first.items).toHaveLength(2);
    expect(first.nextCursor).toEqual(expect.any(String));
    rel.late = await publishRelease(fen.depositor, fen.curator, FEN, meta({ title: 'Late swarm published between two pages', groupType: 'swarm' }));
    const second = (await search(`q=${TAG}&sort=newest&limit=2&cursor=${encodeURIComponent(first.nextCursor)}`)).json;
    const seen = [...first.items, ...second.items].map((i: { datasetSuffix: string }) => i.datasetSuffix);
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen).toHaveLength(3);
    expect(second.nextCursor).toBeNull();
    expect((await search(`q=${TAG}&sort=newest&limit=2`)).json.items[0].suffix).toBe(rel.late.suffix);
  }, 60_000);

  it('sorts by group size and by unique downloads', async () => {
    const bySize = (await search(`q=${TAG}&sort=group-size`)).json.items.map((i: { statistics: { individuals: number } }) => i.statistics.individuals);
    expect(bySize).toEqual([...bySize].sort((a: number, b: number) => b - a));
    expect(bySize.filter((n: number) => [300, 40, 12].includes(n))).toEqual([300, 40, 12]);
    const dl = await visitor.get(`/api/releases/${rel.school.suffix}/files/flock.csv.gz/download`);
    expect(dl.status).toBe(302);
    // The same visitor again the same day is not a second unique download.
    await visitor.get(`/api/releases/${rel.school.suffix}/files/flock.csv.gz/download`);
    const byDownloads = (await search(`q=${TAG}&sort=downloads`)).json.items;
    expect(byDownloads[0]).toMatchObject({ suffix: rel.school.suffix, downloads: 1 });
  });

  it('lists every dataset without search words, newest first', async () => {
    const res = await search('limit=50');
    expect(res.status).toBe(200);
    expect(res.json.sort).toBe('newest');
    expect(res.json.items[0].suffix).toBe(rel.late.suffix);
    expect(res.json.items[0].snippet.highlights).toEqual([]);
  });

  it('is described in the OpenAPI document with its answer schema', async () => {
    const spec = (await visitor.get('/api/openapi.json')).json as { paths: Record<string, { get?: { summary?: string } }> };
    expect(spec.paths['/api/search']?.get?.summary).toMatch(/Search the catalogue/);
  });

  it.each([
    `'); drop table release; --`,
    `"unbalanced quote`,
    `swarm & | ! : * ( ) <-> <2>`,
    `!!!`,
    `-swarm or "reed bed"`,
    `a:* & b:A`,
    `\\x00 %00 %27`,
    `the`,
  ])('treats %j in q as words, never as SQL or query syntax', async (q) => {
    const res = await search(`q=${encodeURIComponent(q)}`);
    expect(res.status).toBe(200);
    expect(Array.isArray(res.json.items)).toBe(true);
  });

  it('still has its tables after the injection attempts', async () => {
    expect((await search(`q=${TAG}`)).json.total).toBeGreaterThan(0);
  });

  it.each([
    ['q longer than 200 characters', `q=${'swarm '.repeat(40)}`, /under 200/],
    ['an unknown sort', 'sort=random', /Sort by/],
    ['relevance without words', 'sort=relevance', /needs search words/],
    ['a limit above 50', 'limit=500', /at most 50/],
    ['a limit that is not a number', 'limit=many', /number/],
    ['an unknown range bucket', 'individuals=5-6', /Unknown number of individuals range/],
    ['a setting outside the list', 'setting=ocean', /laboratory or field/],
    ['a year that is not a year', 'year=20x6', /four digits/],
    ['a cursor this server did not give', 'cursor=bm90LWEtY3Vyc29y', /cursor/],
    ['a forged cursor key', `cursor=${Buffer.from(JSON.stringify({ s: 'newest', k: "x'; drop table release", i: 'a' })).toString('base64url')}`, /cursor/],
    ['a cursor of another sort', `sort=downloads&cursor=${Buffer.from(JSON.stringify({ s: 'newest', k: '2026-01-01', i: 'a' })).toString('base64url')}`, /another sort/],
    ['q given twice', 'q=a&q=b', /as text/],
  ])('answers 400 with a plain message for %s', async (_what, qs, message) => {
    const res = await search(qs);
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.json)).toMatch(message);
  });
});

describe('answers kept in memory', () => {
  it('shows a lab’s new name at once on landing pages and cards, and a withdrawal at once on the landing page', async () => {
    const { sql } = await import('drizzle-orm');
    const landing = () => visitor.get(`/api/releases/${rel.school.suffix}`);
    const card = async () => (await search(`q=zebrafish&lab=${TIDE}`)).json.items.find((i: { suffix: string }) => i.suffix === rel.school.suffix);
    const before = (await landing()).json.dataset.lab.name;
    expect((await card()).lab).toBeTruthy();
    try {
      await app.database.db.execute(sql`update organization set slug = 'tidewater-schooling-renamed', name = 'Tidewater Schooling Group' where slug = ${TIDE}`);
      expect((await landing()).json.dataset.lab).toMatchObject({ name: 'Tidewater Schooling Group', slug: 'tidewater-schooling-renamed' });
      expect((await search('q=zebrafish&lab=tidewater-schooling-renamed')).json.items.map((i: { suffix: string }) => i.suffix)).toContain(rel.school.suffix);
    } finally {
      await app.database.db.execute(sql`update organization set slug = ${TIDE}, name = ${before} where slug = 'tidewater-schooling-renamed'`);
    }
    expect((await landing()).json.dataset.lab.slug).toBe(TIDE);

    const gone = await publishRelease(tide.depositor, tide.curator, TIDE, meta({ title: 'Short-lived school', description: 'A synthetic recording withdrawn right after it was read.', groupType: 'school' }));
    const page = (await visitor.get(`/api/releases/${gone.suffix}`)).json;
    expect(page.withdrawn).toBeNull();
    const file = `/api/releases/${gone.suffix}/files/${encodeURIComponent(page.files[0].fileName)}/download`;
    expect((await visitor.get(file)).status).toBe(302);
    const lead = await signInDemo(app, 'tomas.okafor-lind@tidewater.example');
    expect((await lead.post(`/api/labs/${TIDE}/releases/${gone.suffix}/withdraw`, { reason: 'Withdrawn in a test of kept answers.' })).status).toBe(200);
    expect((await visitor.get(`/api/releases/${gone.suffix}`)).json.withdrawn).toMatchObject({ reason: 'Withdrawn in a test of kept answers.' });
    expect((await visitor.get(file)).status).toBe(401);
  });
});
