import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { fixture, validMetadata } from '../support/depositing';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => app?.close());

/** A script's HTTP client: only the bearer token, no cookies, no Origin. */
const script = (token: string) => async (method: string, path: string, body?: unknown) => {
  const res = await fetch(`${app.url}${path}`, {
    method,
    redirect: 'manual',
    headers: { authorization: `Bearer ${token}`, ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
  const text = await res.text();
  return { status: res.status, json: text ? (() => { try { return JSON.parse(text); } catch { return null; } })() : null, headers: res.headers };
};

describe('API tokens for scripts', () => {
  it('deposits, publishes and downloads with tokens; read-only tokens cannot write; revoked tokens stop', async () => {
    const browserSession = await signInDemo(app, 'mina.throssel@fenmoor.example');
    const made = await browserSession.post('/api/me/tokens', { name: 'nightly upload script', scopes: ['deposit'] });
    expect(made.status).toBe(201);
    expect(made.json.token).toMatch(/^coh_/);
    expect(made.json.scopes).toEqual(['read', 'deposit']);
    const listed = (await browserSession.get('/api/me/tokens')).json;
    expect(JSON.stringify(listed)).not.toContain(made.json.token);
    expect(listed[0].prefix).toBe(made.json.token.slice(0, 10));

    const call = script(made.json.token);
    const ds = await call('POST', '/api/labs/fenmoor-swarm-ecology/datasets', { title: 'Scripted deposit', summary: 'By token.' });
    expect(ds.status).toBe(201);
    const draftId = ds.json.draftId;
    await call('PUT', `/api/labs/fenmoor-swarm-ecology/drafts/${draftId}/metadata`, { metadata: validMetadata({ title: 'Scripted deposit' }) });
    const bytes = fixture('trapped-langevin-swarm.csv.gz');
    const up = await call('POST', `/api/labs/fenmoor-swarm-ecology/drafts/${draftId}/uploads`, { fileName: 'swarm.csv.gz', size: bytes.length, mediaType: 'application/gzip' });
    expect(up.status).toBe(201);
    const put = await fetch(up.json.parts[0].url, { method: 'PUT', body: new Uint8Array(bytes) });
    await call('POST', `/api/labs/fenmoor-swarm-ecology/drafts/${draftId}/uploads/${up.json.fileId}/complete`, { parts: [{ partNumber: 1, etag: put.headers.get('etag') }] });
    await expect.poll(async () => (await call('GET', `/api/labs/fenmoor-swarm-ecology/drafts/${draftId}`)).json.files[0].state, { timeout: 20_000 }).toBe('ready');
    expect((await call('POST', `/api/labs/fenmoor-swarm-ecology/drafts/${draftId}/submit`)).status).toBe(200);

    // The curator publishes with a token too; then anyone's read token lists the files and gets a download URL.
    const curatorSession = await signInDemo(app, 'rafael.quist@fenmoor.example');
    const curatorToken = (await curatorSession.post('/api/me/tokens', { name: 'review bot', scopes: ['deposit'] })).json.token;
    const pub = await script(curatorToken)('POST', `/api/labs/fenmoor-swarm-ecology/drafts/${draftId}/publish`, { changelog: 'By script.' });
    expect(pub.status).toBe(201);

    const reader = await signInDemo(app, 'dana.whitcombe@saltmarsh-uni.example');
    const readToken = (await reader.post('/api/me/tokens', { name: 'analysis notebook' })).json.token;
    const read = script(readToken);
    const landing = await read('GET', `/api/releases/${pub.json.suffix}`);
    expect(landing.json.files.map((f: { fileName: string }) => f.fileName)).toEqual(['swarm.csv.gz']);
    expect(landing.json.results[0].result.summary.tracks).toBeGreaterThan(0);
    const dl = await read('GET', `/api/releases/${pub.json.suffix}/files/swarm.csv.gz/download`);
    expect(dl.status).toBe(302);
    // The catalogue lists it, newest first, page by page.
    const first = await read('GET', '/api/releases?limit=1');
    expect(first.json.items[0]).toMatchObject({ suffix: pub.json.suffix, title: 'Scripted deposit', lab: { slug: 'fenmoor-swarm-ecology' } });
    expect(first.json.nextCursor === null || typeof first.json.nextCursor === 'string').toBe(true);
    expect((await read('GET', '/api/releases?cursor=garbage')).status).toBe(400);
    // A read token cannot write, manage tokens, or act as an admin.
    const write = await read('POST', '/api/labs/fenmoor-swarm-ecology/datasets', { title: 'Nope', summary: '' });
    expect(write.status).toBe(403);
    expect(write.json.message).toMatch(/may only read/);
    expect((await read('GET', '/api/me/tokens')).status).toBe(403);
    expect((await script(made.json.token)('PATCH', '/api/me', { name: 'X Y', orcid: '' })).status).toBe(403);

    // Revoked, and a made-up token: 401 at once.
    const tokens = (await reader.get('/api/me/tokens')).json;
    expect((await reader.delete(`/api/me/tokens/${tokens[0].id}`)).status).toBe(204);
    expect((await read('GET', `/api/releases/${pub.json.suffix}/files/swarm.csv.gz/download`)).status).toBe(401);
    expect((await script('coh_made_up')('GET', '/api/me')).status).toBe(401);
  });
});
