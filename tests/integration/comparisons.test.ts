import { gunzipSync, gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo, signUpAndVerify } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';

const LAB = 'rookery-roof-array';
let app: TestApp;
let depositor: HttpClient;
let lead: HttpClient;
const rel = {} as Record<'metres' | 'millimetres' | 'restricted' | 'withdrawn', string>;

/** The trapped swarm fixture with its positions written in millimetres. */
function inMillimetres(gz: Buffer): Buffer {
  const [header, ...lines] = gunzipSync(gz).toString('utf8').trimEnd().split('\n');
  const out = lines.map((l) => {
    const [id, frame, ...xyz] = l.split(',');
    return [id, frame, ...xyz.map((v) => (Number(v) * 1000).toFixed(3))].join(',');
  });
  return gzipSync([header, ...out].join('\n') + '\n');
}

async function publish(title: string, file: Buffer, metadata: Record<string, unknown>) {
  const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
  await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title, frameRate: 100, ...metadata }) });
  const f = await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, 'swarm.csv.gz', file));
  expect(f.state).toBe('ready');
  expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
  const published = await lead.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {});
  expect(published.status).toBe(201);
  return published.json.suffix as string;
}

beforeAll(async () => {
  app = await startTestApp();
  depositor = await signInDemo(app, 'oskar.lenning@northgate-poly.example');
  lead = await signInDemo(app, 'priya.vell@northgate-poly.example');
  const swarm = fixture('trapped-langevin-swarm.csv.gz');
  rel.metres = await publish('Comparison swarm in metres', swarm, { units: 'm' });
  rel.millimetres = await publish('Comparison swarm in millimetres', inMillimetres(swarm), { units: 'mm' });
  rel.restricted = await publish('Comparison swarm, restricted', swarm, { units: 'm', access: { level: 'restricted' } });
  rel.withdrawn = await publish('Comparison swarm, later withdrawn', swarm, { units: 'm' });
}, 240_000);
afterAll(async () => app?.close());

type Row = { suffix: string; declaredUnit: string; metresPerUnit: number; scalars: Record<string, number | null> };
const close = (a: number | null, b: number | null, rel = 1e-5) => {
  expect(a).not.toBeNull();
  expect(Math.abs(a! - b!) / Math.abs(b!)).toBeLessThan(rel);
};

describe('comparing releases', () => {
  it('harmonises a file declared in millimetres with the same trajectories in metres', async () => {
    const res = await httpClient(app.url).get(`/api/comparisons/view?releases=${rel.metres},${rel.millimetres}`);
    expect(res.status).toBe(200);
    const [m, mm] = res.json.releases as Row[];
    expect([m.suffix, mm.suffix]).toEqual([rel.metres, rel.millimetres]);
    expect([m.declaredUnit, mm.declaredUnit]).toEqual(['m', 'mm']);
    expect(mm.metresPerUnit).toBe(0.001);
    // Typical laboratory swarm scales: speeds of order 0.1 m/s, spacing of centimetres.
    expect(m.scalars.meanSpeedMS).toBeGreaterThan(0.01);
    expect(m.scalars.meanSpeedMS).toBeLessThan(1);
    for (const k of ['meanSpeedMS', 'nearestNeighbourM', 'radiusM', 'springConstantS2', 'numberDensity'] as const) close(mm.scalars[k], m.scalars[k], 1e-4);
    expect(mm.scalars.polarization).toBeCloseTo(m.scalars.polarization!, 6);
    expect(res.json.curves).toHaveLength(2);
    expect(res.json.curves[0].radialAcceleration.x.length).toBeGreaterThan(3);
    expect(res.json.hidden).toBe(0);
  });

  it('names an unknown release suffix with a 400', async () => {
    const res = await httpClient(app.url).get(`/api/comparisons/view?releases=${rel.metres},no-such-release.v1`);
    expect(res.status).toBe(400);
    expect(res.json.message).toContain('"no-such-release.v1"');
  });

  it('refuses more than 12 releases, a repeated release and a missing list with a 400', async () => {
    const visitor = httpClient(app.url);
    const many = Array.from({ length: 13 }, (_, i) => `r${i}`).join(',');
    const tooMany = await visitor.get(`/api/comparisons/view?releases=${many}`);
    expect(tooMany.status).toBe(400);
    expect(tooMany.json.fields.releases).toMatch(/at most 12/);
    const twice = await visitor.get(`/api/comparisons/view?releases=${rel.metres},${rel.metres}`);
    expect(twice.status).toBe(400);
    expect(twice.json.fields.releases).toMatch(/twice/);
    const none = await visitor.get('/api/comparisons/view');
    expect(none.status).toBe(400);
    expect(none.json.fields.releases).toMatch(/\?releases=/);
  });
});

describe('saved comparisons', () => {
  let owner: HttpClient;
  let stranger: HttpClient;
  let id: string;
  beforeAll(async () => {
    owner = (await signUpAndVerify(app, 'compare-owner')).http;
    stranger = (await signUpAndVerify(app, 'compare-stranger')).http;
    const saved = await owner.post('/api/comparisons', { title: 'Swarms by unit', releases: [rel.metres, rel.restricted, rel.withdrawn] });
    expect(saved.status).toBe(201);
    id = saved.json.id;
    expect((await lead.post(`/api/labs/${LAB}/releases/${rel.withdrawn}/withdraw`, { reason: 'Recorded with a miscalibrated camera.' })).status).toBe(200);
  });

  it('is listed under its owner', async () => {
    const list = await owner.get('/api/comparisons');
    expect(list.json.items.map((c: { id: string }) => c.id)).toEqual([id]);
    expect((await stranger.get('/api/comparisons')).json.items).toEqual([]);
  });

  it('shows a stranger with the link only the releases whose statistics the landing page shows them', async () => {
    const res = await stranger.get(`/api/comparisons/${id}`);
    expect(res.status).toBe(200);
    expect(res.json.mine).toBe(false);
    expect(res.json.title).toBe('Swarms by unit');
    // The withdrawn release keeps only its citation, as on its landing page.
    expect(res.json.hidden).toBe(1);
    expect(res.json.releases.map((r: Row) => r.suffix)).toEqual([rel.metres, rel.restricted]);
    expect(JSON.stringify(res.json)).not.toContain(rel.withdrawn);
    expect((await stranger.get(`/api/releases/${rel.withdrawn}`)).json.results).toEqual([]);
    // Restricted files stay behind a grant, but their statistics are public on the landing page, so here too.
    const landing = await stranger.get(`/api/releases/${rel.restricted}`);
    expect(landing.json.results[0].result.summary.velocity.speed.mean).toBeCloseTo(res.json.releases[1].scalars.meanSpeedMS, 6);
    const visitor = await httpClient(app.url).get(`/api/comparisons/${id}`);
    expect(visitor.json.releases).toHaveLength(2);
  });

  it('lets only its owner change or delete it', async () => {
    const body = { title: 'Taken over', releases: [rel.metres] };
    expect((await stranger.put(`/api/comparisons/${id}`, body)).status).toBe(403);
    expect((await stranger.delete(`/api/comparisons/${id}`)).status).toBe(403);
    expect((await httpClient(app.url).post('/api/comparisons', body)).status).toBe(401);
    const changed = await owner.put(`/api/comparisons/${id}`, { title: 'Swarms, metres only', releases: [rel.metres, rel.millimetres] });
    expect(changed.status).toBe(200);
    expect(changed.json.releases).toEqual([rel.metres, rel.millimetres]);
  });

  it('refuses bad input when saving with a plain 400', async () => {
    const noTitle = await owner.post('/api/comparisons', { title: ' ', releases: [rel.metres] });
    expect(noTitle.status).toBe(400);
    expect(noTitle.json.fields.title).toMatch(/title/i);
    const unknown = await owner.post('/api/comparisons', { title: 'x', releases: ['ghost.v9'] });
    expect(unknown.status).toBe(400);
    expect(unknown.json.message).toContain('"ghost.v9"');
    const withdrawn = await owner.post('/api/comparisons', { title: 'x', releases: [rel.withdrawn] });
    expect(withdrawn.status).toBe(400);
    expect(withdrawn.json.message).toMatch(/withdrawn/);
    const tooMany = await owner.post('/api/comparisons', { title: 'x', releases: Array.from({ length: 13 }, (_, i) => `r${i}`) });
    expect(tooMany.status).toBe(400);
    const empty = await owner.post('/api/comparisons', { title: 'x', releases: [] });
    expect(empty.status).toBe(400);
    expect((await owner.get('/api/comparisons/not-a-uuid')).status).toBe(400);
    expect((await owner.get(`/api/comparisons/${crypto.randomUUID()}`)).status).toBe(404);
  });

  it('is gone for everyone once its owner deletes it', async () => {
    const temp = await owner.post('/api/comparisons', { title: 'Short-lived', releases: [rel.metres] });
    expect((await owner.delete(`/api/comparisons/${temp.json.id}`)).status).toBe(204);
    expect((await stranger.get(`/api/comparisons/${temp.json.id}`)).status).toBe(404);
  });
});

describe('scaling view data', () => {
  it('lists the newest public release of every dataset with its scalars in SI units, withdrawn ones left out', async () => {
    const res = await httpClient(app.url).get('/api/comparisons/scaling');
    expect(res.status).toBe(200);
    const items = res.json.items as (Row & { lab: { slug: string }; groupType: string })[];
    const suffixes = items.map((i) => i.suffix);
    expect(suffixes).toEqual(expect.arrayContaining([rel.metres, rel.millimetres, rel.restricted]));
    expect(suffixes).not.toContain(rel.withdrawn);
    const mm = items.find((i) => i.suffix === rel.millimetres)!;
    expect(mm.lab.slug).toBe(LAB);
    expect(mm.groupType).toBe('swarm');
    expect(mm.scalars.individuals).toBeGreaterThan(1);
    close(mm.scalars.meanSpeedMS, items.find((i) => i.suffix === rel.metres)!.scalars.meanSpeedMS, 1e-4);
  });
});
