import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { firstLink, mailboxClient, startTestApp, type TestApp } from '../support/test-app';
import { signInDemo, signUpAndVerify } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';
import { startMailCapture } from '../../docker-free-fakes/mail-capture/server';

const LAB = 'tidewater-schooling';
let app: TestApp;
let curator: HttpClient;

async function publishRestricted(a: TestApp, title: string) {
  const depositor = await signInDemo(a, 'jun.haverly@tidewater.example');
  const cur = await signInDemo(a, 'asha.penrose@tidewater.example');
  const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
  await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title, access: { level: 'restricted' }, dimension: 2, frameRate: 25 }) });
  await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, 'school.csv.gz', fixture('vicsek-flock-2d.csv.gz')));
  await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
  return (await cur.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {})).json as { suffix: string; doi: string };
}

beforeAll(async () => {
  app = await startTestApp();
  curator = await signInDemo(app, 'asha.penrose@tidewater.example');
});
afterAll(async () => app?.close());

const request = (http: HttpClient, suffix: string, termsVersion: number, extra: Record<string, unknown> = {}) =>
  http.post(`/api/releases/${suffix}/access-requests`, {
    purpose: 'Comparing school polarization against group size for a review of schooling statistics.',
    affiliation: 'Saltmarsh University',
    termsVersion,
    acceptTerms: true,
    ...extra,
  });

describe('access requests: request → e-mail → decision → grant', () => {
  it('runs the journey with mail at each step, and the grant opens the files until it is revoked', async () => {
    const rel = await publishRestricted(app, 'Restricted school');
    const { http: researcher, email } = await signUpAndVerify(app, 'researcher');
    const terms = (await httpClient(app.url).get(`/api/releases/${rel.suffix}/terms`)).json;
    expect(terms).toMatchObject({ labName: 'Tidewater Schooling Lab', version: 1 });
    expect(terms.body).toMatch(/only for the purpose/);

    expect((await researcher.get(`/api/releases/${rel.suffix}/files/school.csv.gz/download`)).status).toBe(403);
    // Field-level checks: purpose, terms.
    const bad = await researcher.post(`/api/releases/${rel.suffix}/access-requests`, { purpose: 'short', affiliation: 'X', termsVersion: 1, acceptTerms: false });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.fields).sort()).toEqual(['acceptTerms', 'affiliation', 'purpose']);
    expect((await httpClient(app.url).post(`/api/releases/${rel.suffix}/access-requests`, {})).status).toBe(401);

    const made = await request(researcher, rel.suffix, 1);
    expect(made.status).toBe(201);
    const dup = await request(researcher, rel.suffix, 1);
    expect(dup.status).toBe(409);
    expect(dup.json.message).toMatch(/already asked/);

    // The lab's curators and lead get a mail with a link to the request.
    const note = await app.mail.waitFor('asha.penrose@tidewater.example', /Access request: Restricted school/);
    expect(note.text).toContain(`/labs/${LAB}/access-requests?request=${made.json.id}`);
    await app.mail.waitFor('tomas.okafor-lind@tidewater.example', /Access request: Restricted school/);

    const queue = (await curator.get(`/api/labs/${LAB}/access-requests?state=pending`)).json;
    const item = queue.find((q: { id: string }) => q.id === made.json.id);
    expect(item).toMatchObject({ requester: { email }, affiliation: 'Saltmarsh University', termsVersion: 1, state: 'pending' });
    // A depositor cannot decide.
    const depositor = await signInDemo(app, 'jun.haverly@tidewater.example');
    expect((await depositor.post(`/api/labs/${LAB}/access-requests/${made.json.id}/decision`, { decision: 'approve' })).status).toBe(403);

    const ok = await curator.post(`/api/labs/${LAB}/access-requests/${made.json.id}/decision`, { decision: 'approve', expiresOn: '2099-12-31', note: 'Welcome.' });
    expect(ok.status).toBe(200);
    expect((await curator.post(`/api/labs/${LAB}/access-requests/${made.json.id}/decision`, { decision: 'deny', note: 'changed my mind' })).status).toBe(409);
    const granted = await app.mail.waitFor(email, /Access granted: Restricted school/);
    expect(granted.text).toContain('until 2099-12-31');
    expect(firstLink(granted.text)).toContain(`/releases/${rel.suffix}`);

    expect((await researcher.get(`/api/releases/${rel.suffix}/files/school.csv.gz/download`)).status).toBe(302);
    const mine = (await researcher.get('/api/me/access')).json;
    expect(mine[0]).toMatchObject({ state: 'approved', grant: { status: 'active' } });

    // Revoked: stops at once.
    expect((await curator.post(`/api/labs/${LAB}/access-grants/${mine[0].grant.id}/revoke`)).status).toBe(200);
    expect((await researcher.get(`/api/releases/${rel.suffix}/files/school.csv.gz/download`)).status).toBe(403);
    await app.mail.waitFor(email, /Access withdrawn/);
    expect((await researcher.get('/api/me/access')).json[0].grant.status).toBe('revoked');

    // Every transition is an audit event.
    const history = (await curator.get(`/api/labs/${LAB}/access-requests/${made.json.id}/history`)).json;
    expect(history.map((h: { action: string; fromState: string | null; toState: string }) => [h.action, h.fromState, h.toState])).toEqual([
      ['access_request.created', null, 'pending'],
      ['access_request.approved', 'pending', 'approved'],
      ['access_grant.revoked', 'approved', 'revoked'],
    ]);
  });

  it('denies with a reason, expires grants at once, and keeps the accepted terms version', async () => {
    const rel = await publishRestricted(app, 'Second restricted school');
    const { http: a, email: ea } = await signUpAndVerify(app, 'denied');
    const r1 = await request(a, rel.suffix, 1);
    expect((await curator.post(`/api/labs/${LAB}/access-requests/${r1.json.id}/decision`, { decision: 'deny', note: '' })).status).toBe(400);
    expect((await curator.post(`/api/labs/${LAB}/access-requests/${r1.json.id}/decision`, { decision: 'deny', note: 'The data are for a funded consortium only.' })).status).toBe(200);
    const denied = await app.mail.waitFor(ea, /Access request declined/);
    expect(denied.text).toContain('funded consortium');

    // The lead changes the terms: a request made against the old version is refused, the new one accepted.
    const lead = await signInDemo(app, 'tomas.okafor-lind@tidewater.example');
    expect((await lead.put(`/api/labs/${LAB}/terms`, { body: 'New terms: use for teaching is not allowed; cite the release.' })).json.version).toBe(2);
    const { http: b } = await signUpAndVerify(app, 'expiring');
    expect((await request(b, rel.suffix, 1)).json.code).toBe('terms_changed');
    const r2 = await request(b, rel.suffix, 2, { scope: 'dataset' });
    expect(r2.status).toBe(201);
    await curator.post(`/api/labs/${LAB}/access-requests/${r2.json.id}/decision`, { decision: 'approve', expiresOn: '2099-01-01' });
    expect((await b.get(`/api/releases/${rel.suffix}/files/school.csv.gz/download`)).status).toBe(302);
    // Expiry passes (set in the database): refused at once.
    await app.database.db.execute(sql`update access_grant set expires_at = now() - interval '1 minute' where request_id = ${r2.json.id}`);
    expect((await b.get(`/api/releases/${rel.suffix}/files/school.csv.gz/download`)).status).toBe(403);
    expect((await b.get('/api/me/access')).json[0]).toMatchObject({ scope: 'dataset', termsVersion: 2, grant: { status: 'expired' } });
  });
});

describe('the outbox', () => {
  it('keeps a decision mail while SMTP is down and sends it when the server is back', async () => {
    const port = await new Promise<number>((resolve) => {
      const s = net.createServer().listen(0, '127.0.0.1', () => {
        const p = (s.address() as net.AddressInfo).port;
        s.close(() => resolve(p));
      });
    });
    const down = await startTestApp({ env: { SMTP_URL: `smtp://127.0.0.1:${port}` } });
    try {
      const rel = await publishRestricted(down, 'School while mail is down');
      const researcher = await signInDemo(down, 'dana.whitcombe@saltmarsh-uni.example');
      const made = await request(researcher, rel.suffix, 1);
      const cur = await signInDemo(down, 'asha.penrose@tidewater.example');
      expect((await cur.post(`/api/labs/${LAB}/access-requests/${made.json.id}/decision`, { decision: 'approve' })).status).toBe(200);
      // The mail waits in the outbox, with the failed attempt recorded.
      await expect
        .poll(async () => ((await down.database.db.execute(sql`select max(attempts) as a from outbox_mail where state = 'pending'`)) as unknown as { rows: Array<{ a: number }> }).rows[0].a, { timeout: 15_000 })
        .toBeGreaterThan(0);
      // SMTP comes back on the same port.
      const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-smtp-back-'));
      const capture = await startMailCapture({ smtpPort: port, httpPort: 0, directory: dir });
      try {
        const mail = await mailboxClient(capture.httpUrl).waitFor('dana.whitcombe@saltmarsh-uni.example', /Access granted: School while mail is down/, 30_000);
        expect(mail.subject).toContain('Access granted');
      } finally {
        await capture.close();
      }
    } finally {
      await down.close();
    }
  }, 60_000);
});
