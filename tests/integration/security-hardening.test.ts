import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { httpClient } from '../support/http-client';

const LAB = 'fenmoor-swarm-ecology';
const LEAD = 'ilse.marten@fenmoor.example';

describe('security headers, CSRF, body limits and account enumeration', () => {
  let app: TestApp;
  beforeAll(async () => {
    app = await startTestApp();
  });
  afterAll(async () => app?.close());

  it('sends a strict Content-Security-Policy and the other helmet headers', async () => {
    const res = await fetch(`${app.url}/api/health`);
    const csp = res.headers.get('content-security-policy') ?? '';
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("base-uri 'self'");
    expect(csp).toContain("form-action 'self'");
    // The browser uploads parts straight to the object store.
    expect(csp).toContain(`connect-src 'self' ${new URL(inject('s3Endpoint')).origin}`);
    expect(csp).not.toContain('upgrade-insecure-requests');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('x-frame-options')).toBe('SAMEORIGIN');
    expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
    expect(res.headers.get('strict-transport-security')).toBeNull();
    expect(res.headers.get('x-powered-by')).toBeNull();
  });

  it('sets the session cookie HttpOnly and SameSite=Lax (not Secure over http)', async () => {
    const res = await fetch(`${app.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { origin: app.url, 'content-type': 'application/json' },
      body: JSON.stringify({ email: LEAD, password: 'demo-swarm-2026' }),
    });
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().find((c) => c.includes('session_token='))!;
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).not.toMatch(/;\s*Secure/i);
  });

  it('refuses a cookie-session write from another site, or with no Origin, and allows our own pages and API tokens', async () => {
    const lead = await signInDemo(app, LEAD);
    const body = { title: 'Cross-site probe', summary: '' };
    const jar = new Map<string, string>();
    // Borrow the lead's cookies in clients that claim another origin.
    const signedIn = httpClient(app.url, { jar });
    expect((await signedIn.post('/api/auth/sign-in/email', { email: LEAD, password: 'demo-swarm-2026' })).status).toBe(200);
    const evil = httpClient(app.url, { jar, origin: 'https://evil.example' });
    const refused = await evil.post(`/api/labs/${LAB}/datasets`, body);
    expect(refused.status).toBe(403);
    expect(refused.json).toMatchObject({ code: 'cross_site_request', message: expect.stringContaining('https://evil.example') });
    expect(refused.json.requestId).toBeTruthy();

    const cookie = [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
    const noOrigin = await fetch(`${app.url}/api/labs/${LAB}/datasets`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify(body) });
    expect(noOrigin.status).toBe(403);
    expect((await noOrigin.json()).code).toBe('cross_site_request');
    // A browser that leaves Origin out still sends a Referer from our page.
    const withReferer = await fetch(`${app.url}/api/labs/${LAB}/datasets`, { method: 'POST', headers: { cookie, referer: `${app.url}/labs/${LAB}`, 'content-type': 'application/json' }, body: JSON.stringify(body) });
    expect(withReferer.status).toBe(201);
    // Reading is never refused for the origin.
    expect((await evil.get(`/api/labs/${LAB}/datasets`)).status).toBe(200);
    expect((await lead.post(`/api/labs/${LAB}/datasets`, body)).status).toBe(201);

    const token = (await lead.post('/api/me/tokens', { name: 'csrf exempt script', scopes: ['deposit'] })).json.token;
    const script = await fetch(`${app.url}/api/labs/${LAB}/datasets`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body: JSON.stringify(body) });
    expect(script.status).toBe(201);
  });

  it('answers 413 in the error shape for a JSON body over the limit', async () => {
    const lead = await signInDemo(app, LEAD);
    const res = await lead.post(`/api/labs/${LAB}/datasets`, { title: 'Big', summary: 'x'.repeat(1_100_000) });
    expect(res.status).toBe(413);
    expect(res.json).toMatchObject({ code: 'body_too_large', message: expect.any(String), requestId: expect.any(String) });
  });

  it('answers the same to a wrong password and an unknown e-mail', async () => {
    const http = httpClient(app.url);
    const wrong = await http.post('/api/auth/sign-in/email', { email: LEAD, password: 'not-the-password-at-all' });
    const unknown = await http.post('/api/auth/sign-in/email', { email: 'nobody.here@nowhere.example', password: 'not-the-password-at-all' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(wrong.status);
    expect(unknown.json).toEqual(wrong.json);
  });

  it('answers the same to a password reset request for a known and an unknown e-mail', async () => {
    const http = httpClient(app.url);
    const known = await http.post('/api/auth/request-password-reset', { email: LEAD, redirectTo: '/reset-password' });
    const unknown = await http.post('/api/auth/request-password-reset', { email: 'nobody.here@nowhere.example', redirectTo: '/reset-password' });
    expect(known.status).toBe(200);
    expect(unknown.status).toBe(known.status);
    expect(unknown.json).toEqual(known.json);
  });
  it('answers a sign-up with a taken address like one with a new address', async () => {
    const http = httpClient(app.url);
    const taken = await http.post('/api/auth/sign-up/email', { name: 'Second Marten', email: LEAD, password: 'a-long-test-password' });
    const fresh = await http.post('/api/auth/sign-up/email', { name: 'New Person', email: `new.person.${Date.now()}@lab.example`, password: 'a-long-test-password' });
    expect(fresh.status).toBe(200);
    expect(taken.status).toBe(fresh.status);
    expect(Object.keys(taken.json ?? {}).sort()).toEqual(Object.keys(fresh.json ?? {}).sort());
  });
});

describe('rate limits', () => {
  let app: TestApp;
  beforeAll(async () => {
    app = await startTestApp({
      env: { RATE_LIMIT_SIGN_IN: '3', RATE_LIMIT_SIGN_UP: '2', RATE_LIMIT_PASSWORD_RESET: '2', RATE_LIMIT_ACCESS_REQUESTS: '2', RATE_LIMIT_WINDOW_SECONDS: '600' },
    });
  });
  afterAll(async () => app?.close());

  async function expectLimited(res: { status: number; json: any; headers: Headers }) {
    expect(res.status).toBe(429);
    expect(res.json).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/^Too many/), requestId: expect.any(String) });
    const retry = Number(res.headers.get('retry-after'));
    expect(retry).toBeGreaterThan(0);
    expect(retry).toBeLessThanOrEqual(600);
  }

  it('limits sign-in attempts per address, right or wrong password alike', async () => {
    const http = httpClient(app.url);
    for (let i = 0; i < 3; i++) expect((await http.post('/api/auth/sign-in/email', { email: LEAD, password: 'wrong-password-guess' })).status).toBe(401);
    await expectLimited(await http.post('/api/auth/sign-in/email', { email: LEAD, password: 'demo-swarm-2026' }));
    // Counted per client address: behind a trusted proxy (loopback here) that is X-Forwarded-For.
    const elsewhere = await http.raw('POST', '/api/auth/sign-in/email', { email: LEAD, password: 'demo-swarm-2026' }, { headers: { 'x-forwarded-for': '203.0.113.7' } });
    expect(elsewhere.status).toBe(200);
  });

  it('limits sign-ups per address', async () => {
    const http = httpClient(app.url);
    for (let i = 0; i < 2; i++) {
      const res = await http.post('/api/auth/sign-up/email', { name: 'Limit Probe', email: `limit.probe.${i}.${Date.now()}@lab.example`, password: 'a-long-test-password' });
      expect(res.status).toBe(200);
    }
    await expectLimited(await http.post('/api/auth/sign-up/email', { name: 'Limit Probe', email: `limit.probe.x.${Date.now()}@lab.example`, password: 'a-long-test-password' }));
  });

  it('limits password reset requests per address', async () => {
    const http = httpClient(app.url);
    for (let i = 0; i < 2; i++) expect((await http.post('/api/auth/request-password-reset', { email: LEAD, redirectTo: '/reset-password' })).status).toBe(200);
    await expectLimited(await http.post('/api/auth/request-password-reset', { email: LEAD, redirectTo: '/reset-password' }));
  });

  it('limits access-request creation per address', async () => {
    // Sign-in over HTTP is limited in this app, so the session is made through better-auth's own API.
    const owner = await app.auth.api.signInEmail({ body: { email: 'dana.whitcombe@saltmarsh-uni.example', password: 'demo-swarm-2026' }, asResponse: true });
    const cookie = owner.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
    const call = () => fetch(`${app.url}/api/releases/NOPE-0000/access-requests`, { method: 'POST', headers: { cookie, origin: app.url, 'content-type': 'application/json' }, body: '{}' });
    for (let i = 0; i < 2; i++) expect((await call()).status).not.toBe(429);
    const res = await call();
    await expectLimited({ status: res.status, json: await res.json(), headers: res.headers });
  });
});

describe('sessions behind https', () => {
  let app: TestApp;
  const base = 'https://cohesia.example';
  beforeAll(async () => {
    app = await startTestApp({ env: { PUBLIC_BASE_URL: base } });
  });
  afterAll(async () => app?.close());

  it('marks the session cookie Secure with the __Secure- prefix, sends HSTS and upgrades insecure requests', async () => {
    const res = await fetch(`${app.url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { origin: base, 'content-type': 'application/json' },
      body: JSON.stringify({ email: LEAD, password: 'demo-swarm-2026' }),
    });
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().find((c) => c.includes('session_token='))!;
    expect(cookie).toMatch(/^__Secure-/);
    expect(cookie).toMatch(/;\s*Secure/i);
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(res.headers.get('strict-transport-security')).toMatch(/max-age=\d+/);
    expect(res.headers.get('content-security-policy')).toContain('upgrade-insecure-requests');
  });
});
