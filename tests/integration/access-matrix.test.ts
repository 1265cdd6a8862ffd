import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo, signUpAndVerify } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';

const LAB = 'rookery-roof-array';
type Level = 'open' | 'restricted' | 'embargoed' | 'embargo-over';
const LEVELS: Level[] = ['open', 'restricted', 'embargoed', 'embargo-over'];
const accessFor: Record<Level, Record<string, unknown>> = {
  open: { level: 'open' },
  restricted: { level: 'restricted' },
  embargoed: { level: 'embargoed', embargoUntil: '2099-01-01' },
  'embargo-over': { level: 'embargoed', embargoUntil: '2020-01-01' },
};

let app: TestApp;
const releases = {} as Record<Level, string>;
const who = {} as Record<string, HttpClient>;

beforeAll(async () => {
  app = await startTestApp();
  const depositor = await signInDemo(app, 'oskar.lenning@northgate-poly.example');
  const lead = await signInDemo(app, 'priya.vell@northgate-poly.example');
  for (const level of LEVELS) {
    const title = `Matrix flock (${level})`;
    const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title, access: accessFor[level], frameRate: 25 }) });
    await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, 'flock.csv.gz', fixture('vicsek-flock-3d.csv.gz')));
    await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
    releases[level] = (await lead.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {})).json.suffix;
  }
  // Researchers: one with a live grant to the restricted and the embargoed release, one whose grants expired, one whose grants were revoked.
  for (const kind of ['granted', 'expired', 'revoked'] as const) {
    const { http } = await signUpAndVerify(app, `matrix-${kind}`);
    who[`researcher, ${kind} grant`] = http;
    for (const level of ['restricted', 'embargoed'] as const) {
      const terms = (await http.get(`/api/releases/${releases[level]}/terms`)).json;
      const req = await http.post(`/api/releases/${releases[level]}/access-requests`, { purpose: 'A study of flock polarization across group sizes.', affiliation: 'Test University', termsVersion: terms.version, acceptTerms: true });
      expect(req.status).toBe(201);
      await lead.post(`/api/labs/${LAB}/access-requests/${req.json.id}/decision`, { decision: 'approve' });
      const grant = (await http.get('/api/me/access')).json.find((r: { id: string }) => r.id === req.json.id).grant;
      if (kind === 'expired') await app.database.db.execute(sql`update access_grant set expires_at = now() - interval '1 second' where id = ${grant.id}`);
      if (kind === 'revoked') await lead.post(`/api/labs/${LAB}/access-grants/${grant.id}/revoke`);
    }
  }
  who.visitor = httpClient(app.url);
  who['researcher, no grant'] = (await signUpAndVerify(app, 'matrix-none')).http;
  who['lab depositor'] = depositor;
  // Rookery has no curator among the demo people: the lead invites one for this test.
  const { http: curator, email } = await signUpAndVerify(app, 'matrix-curator');
  const inv = await lead.post(`/api/labs/${LAB}/invitations`, { email, role: 'curator' });
  await curator.post(`/api/invitations/${inv.json.id}/accept`);
  who['lab curator'] = curator;
  who['lab lead'] = lead;
  who['platform admin'] = await signInDemo(app, 'nell.ashby@harrowgate-rds.example');
  // A curator of another lab is an outsider here.
  who['curator of another lab'] = await signInDemo(app, 'asha.penrose@tidewater.example');
  // Jobs (bundles) finish before the matrix is read.
  for (const level of LEVELS) {
    const until = Date.now() + 30_000;
    while (!(await lead.get(`/api/releases/${releases[level]}/access`)).json.bundleReady) {
      if (Date.now() > until) throw new Error(`bundle of ${level} not built`);
      await new Promise((r) => setTimeout(r, 200));
    }
  }
}, 240_000);
afterAll(async () => app?.close());

// Files and bundle: who gets a presigned URL (302). Landing page and statistics are public for every role and level.
const filesFor: Record<string, Level[]> = {
  visitor: ['open', 'embargo-over'],
  'researcher, no grant': ['open', 'embargo-over'],
  'researcher, granted grant': LEVELS,
  'researcher, expired grant': ['open', 'embargo-over'],
  'researcher, revoked grant': ['open', 'embargo-over'],
  'lab depositor': LEVELS,
  'lab curator': LEVELS,
  'lab lead': LEVELS,
  // Operators run the platform; they see no one's restricted data by virtue of that role.
  'platform admin': ['open', 'embargo-over'],
  'curator of another lab': ['open', 'embargo-over'],
};

describe('access matrix over HTTP: role × access level', () => {
  for (const [role, allowed] of Object.entries(filesFor)) {
    it(`${role}`, async () => {
      const http = who[role];
      for (const level of LEVELS) {
        const s = releases[level];
        const landing = await http.get(`/api/releases/${s}`);
        expect(landing.status, `${role} landing ${level}`).toBe(200);
        expect(landing.json.results[0].result.summary.tracks, `${role} statistics ${level}`).toBeGreaterThan(0);
        const expected = allowed.includes(level) ? 302 : role === 'visitor' ? 401 : 403;
        expect((await http.get(`/api/releases/${s}/files/flock.csv.gz/download`)).status, `${role} file ${level}`).toBe(expected);
        expect((await http.get(`/api/releases/${s}/bundle`)).status, `${role} bundle ${level}`).toBe(expected);
      }
    });
  }
});
