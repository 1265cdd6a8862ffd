import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { httpClient } from '../support/http-client';
import { labRoleCan, type LabRole } from '../../shared/lab-roles';
import type { Route } from '../../server/routes/route';

/**
 * Every route of the route table × every kind of caller. The expected outcome is
 * computed from the route's `access` rule alone, so a new route is covered the moment
 * it is added, and a route whose rule this file does not know fails the run.
 *
 * Path parameters: the lab is a real demo lab (Fenmoor); other ids are placeholders
 * except a real draft id for reads. An authorised caller may then get 400/404 from the
 * handler: the point is that authorisation runs first, so unauthorised callers get
 * 401/403 before any lookup. No rule hides a route's existence with 404 (the one 404 of
 * `authorize` is an unknown lab slug, which this matrix does not use).
 */

const LAB = 'fenmoor-swarm-ecology';
const PLACEHOLDER = '00000000-0000-4000-8000-000000000000';

type Caller = {
  name: string;
  // The caller's role in the route's lab; 'other' = lead of another lab.
  labRole: LabRole | 'none' | 'other';
  signedIn: boolean;
  admin: boolean;
  token?: 'read' | 'deposit';
  send: (method: string, path: string, body?: unknown) => Promise<{ status: number; json: any }>;
};

type Expected = 'allowed' | 401 | 403;

/** What the access rule says this caller gets (before the handler runs). */
function expected(route: Route, c: Caller): Expected {
  const rule = route.access;
  if (rule.kind === 'public' || rule.kind === 'fakes') return 'allowed'; // test apps run the fakes
  if (!c.signedIn) return 401;
  if (c.token) {
    if ((rule.kind === 'signed-in' && rule.sessionOnly) || rule.kind === 'admin') return 403;
    if (route.method !== 'get' && c.token === 'read') return 403;
  }
  switch (rule.kind) {
    case 'signed-in':
      return 'allowed';
    case 'admin':
      return c.admin ? 'allowed' : 403;
    case 'lab':
      if (rule.allowAdmin && c.admin) return 'allowed';
      if (c.labRole === 'none' || c.labRole === 'other') return 403;
      return labRoleCan(c.labRole, rule.permission) ? 'allowed' : 403;
    default:
      throw new Error(`Unknown access kind ${JSON.stringify(rule)} on ${route.method.toUpperCase()} ${route.path}: teach this matrix the rule`);
  }
}

// Messages of server/middleware/authorize.ts: an authorised caller must never see them.
const AUTHORIZE_REFUSALS = /^(Please sign in first\.|As \w+ of .+ you cannot do this\.|You are not a member of |Only platform administrators|Sign in with a browser session for this|This API token may only read)/;

let app: TestApp;
let routes: Route[];
let draftId: string;
const callers: Caller[] = [];

function pathFor(r: Route): string {
  return r.path.replace(/:(\w+)/g, (_m, name: string) => {
    if (name === 'slug') return LAB;
    if (name === 'id' && r.method === 'get' && r.path.includes('/drafts/:id')) return draftId;
    return name === 'format' ? 'bibtex' : PLACEHOLDER;
  });
}

const sessionCaller = async (name: string, email: string, labRole: Caller['labRole'], admin = false): Promise<Caller> => {
  const http = await signInDemo(app, email);
  return { name, labRole, signedIn: true, admin, send: (m, p, b) => http.raw(m, p, b) };
};

beforeAll(async () => {
  app = await startTestApp();
  routes = app.routes;
  const visitor = httpClient(app.url);
  callers.push({ name: 'visitor', labRole: 'none', signedIn: false, admin: false, send: (m, p, b) => visitor.raw(m, p, b) });
  callers.push(
    ...(await Promise.all([
      sessionCaller('researcher (no lab)', 'dana.whitcombe@saltmarsh-uni.example', 'none'),
      sessionCaller('depositor', 'mina.throssel@fenmoor.example', 'depositor'),
      sessionCaller('curator', 'rafael.quist@fenmoor.example', 'curator'),
      sessionCaller('lab lead', 'ilse.marten@fenmoor.example', 'lead'),
      sessionCaller('lead of another lab', 'tomas.okafor-lind@tidewater.example', 'other'),
      sessionCaller('platform admin', 'nell.ashby@harrowgate-rds.example', 'none', true),
    ])),
  );
  const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
  draftId = (await lead.post(`/api/labs/${LAB}/datasets`, { title: 'Matrix swarm', summary: '' })).json.draftId;
  // Tokens belong to the lab lead, so a refusal can only come from the token's limits.
  for (const scope of ['read', 'deposit'] as const) {
    const made = await lead.post('/api/me/tokens', { name: `matrix ${scope}`, scopes: [scope] });
    expect(made.status).toBe(201);
    const token = made.json.token as string;
    callers.push({
      name: `API token (${scope})`,
      labRole: 'lead',
      signedIn: true,
      admin: false,
      token: scope,
      send: async (method, path, body) => {
        const res = await fetch(`${app.url}${path}`, {
          method,
          redirect: 'manual',
          headers: { authorization: `Bearer ${token}`, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
          body: body === undefined ? undefined : JSON.stringify(body),
        });
        const text = await res.text();
        let json: any = null;
        try {
          json = JSON.parse(text);
        } catch {
          json = null;
        }
        return { status: res.status, json };
      },
    });
  }
}, 60_000);
afterAll(async () => app?.close());

describe('the route table', () => {
  it('gives every route a known access rule and a summary', () => {
    expect(routes.length).toBeGreaterThan(50);
    for (const r of routes) {
      expect(['public', 'signed-in', 'admin', 'lab', 'fakes'], `${r.method} ${r.path}`).toContain(r.access.kind);
      expect(r.summary?.trim().length ?? 0, `${r.method} ${r.path} needs a summary`).toBeGreaterThan(10);
      // A lab rule without a :slug could not name its lab.
      if (r.access.kind === 'lab') expect(r.path, `${r.method} ${r.path}`).toContain(':slug');
    }
  });

  it('reads request bodies and queries only through zod', () => {
    // OAI-PMH answers bad arguments in its own protocol (badArgument), so its service checks them.
    const ownProtocol = new Set(['/oai']);
    for (const r of routes) {
      if (ownProtocol.has(r.path)) continue;
      const src = r.handler.toString();
      expect(src, `${r.method} ${r.path} reads req.body: give it a body schema`).not.toMatch(/req\.body/);
      if (/req\.query/.test(src)) expect(src, `${r.method} ${r.path} reads req.query without zod`).toMatch(/\.parse\(/);
      if (r.method !== 'get' && r.method !== 'delete' && !r.body) {
        // Writes without a body schema must not take a body argument at all.
        expect(r.handler.length, `${r.method} ${r.path} takes a body but has no schema`).toBeLessThan(3);
      }
    }
  });
});

describe('authorisation over HTTP', () => {
  it('refuses every unauthorised caller with 401/403 before the handler, and lets authorised callers through, on every route', async () => {
    const cases = routes.flatMap((r) => callers.map((c) => ({ r, c, want: expected(r, c) })));
    const failures: string[] = [];
    const tally = { refused: 0, allowed: 0 };
    let next = 0;
    async function worker() {
      while (next < cases.length) {
        const { r, c, want } = cases[next++];
        const path = pathFor(r);
        const res = await c.send(r.method.toUpperCase(), path, r.method === 'get' || r.method === 'delete' ? undefined : {});
        const where = `${c.name} → ${r.method.toUpperCase()} ${r.path}: got ${res.status} ${res.json?.message ?? ''}`;
        if (res.status >= 500) failures.push(`${where} (server error)`);
        else if (want === 'allowed') {
          tally.allowed++;
          if (res.status === 401 || (res.status === 403 && AUTHORIZE_REFUSALS.test(res.json?.message ?? ''))) failures.push(`${where} (expected to pass authorisation)`);
        } else {
          tally.refused++;
          if (res.status !== want) failures.push(`${where} (expected ${want})`);
        }
      }
    }
    await Promise.all(Array.from({ length: 12 }, worker));
    expect(failures).toEqual([]);
    expect(tally.refused).toBeGreaterThan(200);
    expect(tally.allowed + tally.refused).toBe(routes.length * callers.length);
  }, 120_000);

  it('lets a lab member read their own draft and refuses the lead of another lab', async () => {
    const get = routes.find((r) => r.method === 'get' && r.path === '/api/labs/:slug/drafts/:id')!;
    const depositor = callers.find((c) => c.name === 'depositor')!;
    const other = callers.find((c) => c.name === 'lead of another lab')!;
    expect((await depositor.send('GET', pathFor(get))).status).toBe(200);
    const refused = await other.send('GET', pathFor(get));
    expect(refused.status).toBe(403);
    expect(refused.json).toMatchObject({ code: 'forbidden', message: expect.stringContaining('not a member') });
    expect(refused.json.requestId).toBeTruthy();
  });
});
