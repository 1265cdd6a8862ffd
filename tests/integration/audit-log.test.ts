import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { publishRelease } from '../support/publishing';
import type { HttpClient } from '../support/http-client';
import type { AuditEventView, AuditPage } from '../../shared/contracts';

const FENMOOR = 'fenmoor-swarm-ecology';
const TIDEWATER = 'tidewater-schooling';
// A name a spreadsheet would run as a formula if the export wrote it as it is.
const FORMULA_NAME = "=cmd|' /C calc'!A0";

let app: TestApp;
let lead: HttpClient;
let curator: HttpClient;
let otherLead: HttpClient;
let admin: HttpClient;
let researcher: HttpClient;
let requestId: string;

beforeAll(async () => {
  app = await startTestApp();
  [lead, curator, otherLead, admin, researcher] = await Promise.all([
    signInDemo(app, 'ilse.marten@fenmoor.example'),
    signInDemo(app, 'rafael.quist@fenmoor.example'),
    signInDemo(app, 'tomas.okafor-lind@tidewater.example'),
    signInDemo(app, 'nell.ashby@harrowgate-rds.example'),
    signInDemo(app, 'dana.whitcombe@saltmarsh-uni.example'),
  ]);
  const terms = 'Use these trajectories for research only and cite the release.';
  expect((await lead.put(`/api/labs/${FENMOOR}/terms`, { body: terms })).status).toBe(200);
  expect((await otherLead.put(`/api/labs/${TIDEWATER}/terms`, { body: `${terms} (Tidewater)` })).status).toBe(200);
  const depositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
  const rel = await publishRelease(depositor, lead, FENMOOR, { title: 'Audited dusk swarm', access: { level: 'restricted' } });
  expect((await researcher.patch('/api/me', { name: FORMULA_NAME, orcid: '' })).status).toBe(200);
  const current = (await researcher.get(`/api/releases/${rel.suffix}/terms`)).json;
  const made = await researcher.post(`/api/releases/${rel.suffix}/access-requests`, { purpose: 'Comparing swarm densities across sites.', affiliation: 'Saltmarsh University', termsVersion: current.version, acceptTerms: true });
  expect(made.status).toBe(201);
  requestId = made.json.id;
  expect((await lead.post(`/api/labs/${FENMOOR}/access-requests/${requestId}/decision`, { decision: 'approve', note: 'Welcome.' })).status).toBe(200);
}, 120_000);
afterAll(async () => app?.close());

const events = async (http: HttpClient, path: string): Promise<AuditEventView[]> => {
  const res = await http.get(path);
  expect(res.status, res.text).toBe(200);
  return (res.json as AuditPage).events;
};

describe('the audit log', () => {
  it("shows a lab lead only their own lab's events, derived from each event's subject", async () => {
    const shown = await events(lead, `/api/labs/${FENMOOR}/audit`);
    const actions = shown.map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['terms.updated', 'release.published', 'access_request.created', 'access_request.approved']));
    expect(shown.find((e) => e.action === 'release.published')).toMatchObject({ targetType: 'release', toState: 'published' });
    expect(shown.every((e) => e.lab?.slug === FENMOOR)).toBe(true);
    // Newest first.
    expect([...shown].sort((a, b) => b.at.localeCompare(a.at)).map((e) => e.id)).toEqual(shown.map((e) => e.id));
    const created = shown.find((e) => e.action === 'access_request.created')!;
    expect(created).toMatchObject({ targetType: 'access_request', targetId: requestId, toState: 'pending', actor: { name: FORMULA_NAME, email: 'dana.whitcombe@saltmarsh-uni.example' } });
    const other = await events(otherLead, `/api/labs/${TIDEWATER}/audit`);
    expect(other.map((e) => e.action)).toEqual(['terms.updated']);
  });

  it("refuses curators (the whole log is the lead's), other labs' leads and visitors", async () => {
    const res = await curator.get(`/api/labs/${FENMOOR}/audit`);
    expect(res.status).toBe(403);
    expect(res.json.code).toBe('forbidden');
    expect((await curator.get(`/api/labs/${FENMOOR}/audit/export`)).status).toBe(403);
    expect((await otherLead.get(`/api/labs/${FENMOOR}/audit`)).status).toBe(403);
    expect((await lead.get('/api/admin/audit')).status).toBe(403);
    expect((await fetch(`${app.url}/api/labs/${FENMOOR}/audit`)).status).toBe(401);
  });

  it('shows a platform admin every lab, and any one lab', async () => {
    const all = await events(admin, '/api/admin/audit?limit=200');
    const labs = new Set(all.map((e) => e.lab?.slug));
    expect(labs).toEqual(new Set([FENMOOR, TIDEWATER]));
    expect((await events(admin, `/api/labs/${FENMOOR}/audit`)).length).toBe(all.filter((e) => e.lab?.slug === FENMOOR).length);
  });

  it('filters by action, actor, target and date range', async () => {
    const base = `/api/labs/${FENMOOR}/audit`;
    expect((await events(lead, `${base}?action=terms.updated`)).map((e) => e.action)).toEqual(['terms.updated']);
    const byActor = await events(lead, `${base}?actor=WHITCOMBE`);
    expect(byActor.map((e) => e.action)).toEqual(['access_request.created']);
    expect((await events(lead, `${base}?actor=marten`)).every((e) => e.actor?.email === 'ilse.marten@fenmoor.example')).toBe(true);
    // LIKE wildcards in the filter are taken literally.
    expect(await events(lead, `${base}?actor=%25`)).toEqual([]);
    const target = await events(lead, `${base}?targetType=access_request&targetId=${requestId}`);
    expect(target.map((e) => e.action).sort()).toEqual(['access_request.approved', 'access_request.created']);
    const today = new Date().toISOString().slice(0, 10);
    expect((await events(lead, `${base}?from=${today}&to=${today}`)).length).toBeGreaterThanOrEqual(3);
    expect(await events(lead, `${base}?to=2020-01-01`)).toEqual([]);
    expect((await lead.get(`${base}?action=`)).status).toBe(200);
    const page = (await lead.get(base)).json as AuditPage;
    expect(page.actions).toEqual(expect.arrayContaining(['access_request.approved', 'access_request.created', 'terms.updated']));
  });

  it('answers 400 with a plain message to bad filters and cursors', async () => {
    const base = `/api/labs/${FENMOOR}/audit`;
    for (const q of ['from=yesterday', 'from=2026-05-02&to=2026-05-01', 'limit=0', 'limit=5000', 'targetType=DROP%20TABLE', 'cursor=not-a-cursor']) {
      const res = await lead.get(`${base}?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.json.message, q).toMatch(/\w/);
      expect(res.json.requestId, q).toBeTruthy();
    }
  });

  it('pages through every event with the cursor, none twice', async () => {
    const all = await events(admin, '/api/admin/audit?limit=200');
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const page: AuditPage = (await admin.get(`/api/admin/audit?limit=1${cursor ? `&cursor=${cursor}` : ''}`)).json;
      expect(page.events.length).toBeLessThanOrEqual(1);
      seen.push(...page.events.map((e) => e.id));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual(all.map((e) => e.id));
  });

  it('exports the filtered log as CSV with formula cells neutralised', async () => {
    const res = await lead.get(`/api/labs/${FENMOOR}/audit/export?targetType=access_request`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="?audit-fenmoor-swarm-ecology-\d{4}-\d{2}-\d{2}\.csv"?$/);
    const lines = res.text.replace(/^\uFEFF/, '').trimEnd().split('\r\n');
    expect(lines[0]).toBe('time (UTC),action,actor name,actor e-mail,lab,target type,target id,from state,to state,detail');
    expect(lines).toHaveLength(3);
    const created = lines.find((l) => l.includes('access_request.created'))!;
    // The apostrophe makes the spreadsheet show the text instead of running it.
    expect(created).toContain(`,'=cmd|' /C calc'!A0,dana.whitcombe@saltmarsh-uni.example,${FENMOOR},access_request,${requestId},`);
    expect(lines.some((l) => /,=|^=/.test(l))).toBe(false);
    const everything = await admin.get('/api/admin/audit/export');
    expect(everything.text).toContain(TIDEWATER);
  });
});

describe('membership changes in the audit log', () => {
  it('records invitations sent, cancelled and accepted, and role changes with who was changed', async () => {
    const sent = await lead.post(`/api/labs/${FENMOOR}/invitations`, { email: 'jun.haverly@tidewater.example', role: 'depositor' });
    expect(sent.status).toBe(201);
    const cancelled = await lead.post(`/api/labs/${FENMOOR}/invitations`, { email: 'nobody.yet@fenmoor.example', role: 'curator' });
    expect((await lead.delete(`/api/labs/${FENMOOR}/invitations/${cancelled.json.id}`)).status).toBe(204);
    const invitee = await signInDemo(app, 'jun.haverly@tidewater.example');
    expect((await invitee.post(`/api/invitations/${sent.json.id}/accept`)).status).toBe(200);
    const joined = (await lead.get(`/api/labs/${FENMOOR}`)).json.members.find((m: { email: string }) => m.email === 'jun.haverly@tidewater.example');
    expect((await lead.patch(`/api/labs/${FENMOOR}/members/${joined.id}`, { role: 'curator' })).status).toBe(200);

    const shown = await events(lead, `/api/labs/${FENMOOR}/audit`);
    const of = (action: string) => shown.filter((e) => e.action === action);
    expect(of('invitation.sent').map((e) => e.detail?.member)).toEqual(expect.arrayContaining(['jun.haverly@tidewater.example', 'nobody.yet@fenmoor.example']));
    expect(of('invitation.cancelled')[0]).toMatchObject({ targetType: 'invitation', targetId: cancelled.json.id, fromState: 'pending', detail: { member: 'nobody.yet@fenmoor.example' } });
    expect(of('invitation.accepted')[0]).toMatchObject({ targetId: sent.json.id, toState: 'accepted', actor: { email: 'jun.haverly@tidewater.example' } });
    expect(of('member.role_changed')[0]).toMatchObject({ targetType: 'member', targetId: joined.id, fromState: 'depositor', toState: 'curator', actor: { email: 'ilse.marten@fenmoor.example' }, detail: { member: 'jun.haverly@tidewater.example' } });
    // Another lab's lead sees none of it.
    expect((await events(otherLead, `/api/labs/${TIDEWATER}/audit`)).some((e) => e.action.startsWith('invitation.') || e.action.startsWith('member.'))).toBe(false);
  });
});
