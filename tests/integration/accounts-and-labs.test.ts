import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { firstLink, startTestApp, uniqueEmail, type TestApp } from '../support/test-app';
import { httpClient } from '../support/http-client';
import { PASSWORD, signInDemo, signUpAndVerify } from '../support/accounts';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app?.close();
});

describe('sign-up, verification and sessions', () => {
  it('refuses sign-in until the address is confirmed, then signs in through the mailed link', async () => {
    const email = uniqueEmail('marla');
    const http = httpClient(app.url);
    expect((await http.post('/api/auth/sign-up/email', { name: 'Marla Fenn', email, password: PASSWORD })).status).toBe(200);

    const early = await http.post('/api/auth/sign-in/email', { email, password: PASSWORD });
    expect(early.status).toBe(403);
    expect(early.json.code).toBe('EMAIL_NOT_VERIFIED');

    const mail = await app.mail.waitFor(email, /Confirm your e-mail/);
    const verify = await http.get(firstLink(mail.text));
    expect(verify.status).toBe(302);
    const me = await http.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.json).toMatchObject({ email, name: 'Marla Fenn', orcid: null, platformRole: 'user' });

    await http.post('/api/auth/sign-out');
    expect((await http.get('/api/me')).status).toBe(401);
    expect((await http.post('/api/auth/sign-in/email', { email, password: PASSWORD })).status).toBe(200);
    expect((await http.get('/api/me')).status).toBe(200);
  });

  it('resets a forgotten password through the mailed link, and the old one stops working', async () => {
    const { email } = await signUpAndVerify(app, 'forgetful');
    const anon = httpClient(app.url);
    expect((await anon.post('/api/auth/request-password-reset', { email, redirectTo: '/reset-password' })).status).toBe(200);
    const mail = await app.mail.waitFor(email, /new Cohesia password/);
    const follow = await anon.get(firstLink(mail.text));
    expect(follow.status).toBe(302);
    const token = new URL(follow.headers.get('location')!, app.url).searchParams.get('token')!;
    expect(token).toBeTruthy();
    expect((await anon.post('/api/auth/reset-password', { newPassword: 'another-long-password', token })).status).toBe(200);
    expect((await anon.post('/api/auth/sign-in/email', { email, password: PASSWORD })).status).toBe(401);
    expect((await anon.post('/api/auth/sign-in/email', { email, password: 'another-long-password' })).status).toBe(200);
    // A used link does not work twice.
    expect((await anon.post('/api/auth/reset-password', { newPassword: 'third-long-password', token })).status).toBe(400);
  });

  it('does not say whether an address has an account when asked for a reset', async () => {
    const anon = httpClient(app.url);
    const res = await anon.post('/api/auth/request-password-reset', { email: uniqueEmail('nobody'), redirectTo: '/reset-password' });
    expect(res.status).toBe(200);
  });
});

describe('profile', () => {
  it('PATCH /api/me keeps a valid ORCID iD and refuses a wrong check digit with a field error', async () => {
    const { http } = await signUpAndVerify(app, 'orcid');
    const bad = await http.patch('/api/me', { name: 'Ines Orcid', orcid: '0000-0002-1825-0098' });
    expect(bad.status).toBe(400);
    expect(bad.json.code).toBe('invalid_input');
    expect(bad.json.fields.orcid).toMatch(/check digit/);
    const good = await http.patch('/api/me', { name: 'Ines Orcid', orcid: 'https://orcid.org/0000-0002-1825-0097' });
    expect(good.status).toBe(200);
    expect(good.json).toMatchObject({ name: 'Ines Orcid', orcid: '0000-0002-1825-0097' });
    // The auth API cannot set it around our check.
    await http.post('/api/auth/update-user', { orcid: 'not-an-orcid' });
    expect((await http.get('/api/me')).json.orcid).toBe('0000-0002-1825-0097');
  });
});

describe('labs, invitations and roles', () => {
  it('runs the whole journey: create lab → invite → accept → role checks', async () => {
    const lead = await signUpAndVerify(app, 'lead');
    const slug = `lab-${Date.now().toString(36)}`;

    const created = await lead.http.post('/api/labs', { name: 'Saltmarsh Midge Group', slug, institution: 'Saltmarsh University', rorId: '05dxps055' });
    expect(created.status).toBe(201);
    expect(created.json).toMatchObject({ slug, myRole: 'lead', rorId: 'https://ror.org/05dxps055', isDemo: false });

    const dup = await lead.http.post('/api/labs', { name: 'Another', slug });
    expect(dup.status).toBe(409);
    expect(dup.json.fields.slug).toBeTruthy();

    const invalid = await lead.http.post('/api/labs', { name: 'X', slug: 'Not A Slug!' });
    expect(invalid.status).toBe(400);
    expect(Object.keys(invalid.json.fields).sort()).toEqual(['name', 'slug']);

    const inviteeEmail = uniqueEmail('invitee');
    const inv = await lead.http.post(`/api/labs/${slug}/invitations`, { email: inviteeEmail, role: 'depositor' });
    expect(inv.status).toBe(201);
    const invMail = await app.mail.waitFor(inviteeEmail, /invited to join Saltmarsh Midge Group/);
    const invitationUrl = firstLink(invMail.text);
    expect(invitationUrl).toContain(`/invitations/${inv.json.id}`);

    // The invitee creates an account with the invited address and accepts.
    const invitee = await signUpAndVerify(app, 'invitee', inviteeEmail);
    const view = await invitee.http.get(`/api/invitations/${inv.json.id}`);
    expect(view.status).toBe(200);
    expect(view.json).toMatchObject({ labName: 'Saltmarsh Midge Group', role: 'depositor', status: 'pending' });

    // Someone else cannot see or accept it.
    const stranger = await signUpAndVerify(app, 'stranger');
    expect((await stranger.http.get(`/api/invitations/${inv.json.id}`)).status).toBe(404);
    expect((await stranger.http.post(`/api/invitations/${inv.json.id}/accept`)).status).toBe(404);

    const accepted = await invitee.http.post(`/api/invitations/${inv.json.id}/accept`);
    expect(accepted.status).toBe(200);
    expect((await invitee.http.post(`/api/invitations/${inv.json.id}/accept`)).status).toBe(409);
    const mine = await invitee.http.get('/api/me/labs');
    expect(mine.json.map((l: { slug: string; myRole: string }) => [l.slug, l.myRole])).toEqual([[slug, 'depositor']]);

    // A depositor cannot invite or change roles.
    const denied = await invitee.http.post(`/api/labs/${slug}/invitations`, { email: uniqueEmail('x'), role: 'curator' });
    expect(denied.status).toBe(403);
    expect(denied.json).toMatchObject({ code: 'forbidden' });
    expect(denied.json.requestId).toBeTruthy();
    const detailForLead = await lead.http.get(`/api/labs/${slug}`);
    const leadMember = detailForLead.json.members.find((m: { role: string }) => m.role === 'lead');
    expect((await invitee.http.patch(`/api/labs/${slug}/members/${leadMember.id}`, { role: 'depositor' })).status).toBe(403);

    // Members see addresses; strangers and visitors see names and roles only.
    const inviteeMember = detailForLead.json.members.find((m: { email: string }) => m.email === inviteeEmail);
    expect(inviteeMember).toBeTruthy();
    expect(detailForLead.json.invitations).toHaveLength(1);
    const forStranger = await stranger.http.get(`/api/labs/${slug}`);
    expect(forStranger.status).toBe(200);
    expect(forStranger.json.members.every((m: { email: string | null }) => m.email === null)).toBe(true);
    expect(forStranger.json.invitations).toBeNull();
    expect(JSON.stringify(forStranger.json)).not.toContain(inviteeEmail);
    const forVisitor = await httpClient(app.url).get(`/api/labs/${slug}`);
    expect(JSON.stringify(forVisitor.json)).not.toContain('@');
    const forDepositor = await invitee.http.get(`/api/labs/${slug}`);
    expect(forDepositor.json.members.some((m: { email: string | null }) => m.email === inviteeEmail)).toBe(true);
    expect(forDepositor.json.invitations).toBeNull();

    // The lead promotes the depositor; the last lead cannot step down.
    const promoted = await lead.http.patch(`/api/labs/${slug}/members/${inviteeMember.id}`, { role: 'curator' });
    expect(promoted.status).toBe(200);
    expect((await invitee.http.get('/api/me/labs')).json[0].myRole).toBe('curator');
    const stepDown = await lead.http.patch(`/api/labs/${slug}/members/${leadMember.id}`, { role: 'curator' });
    expect(stepDown.status).toBe(409);
    expect(stepDown.json.code).toBe('last_lead');
    // A curator still cannot invite.
    expect((await invitee.http.post(`/api/labs/${slug}/invitations`, { email: uniqueEmail('y'), role: 'depositor' })).status).toBe(403);
  });

  it('refuses lab routes to visitors (401) and unknown labs (404)', async () => {
    const anon = httpClient(app.url);
    expect((await anon.post('/api/labs', { name: 'Nope lab', slug: 'nope-lab' })).status).toBe(401);
    expect((await anon.post('/api/labs/fenmoor-swarm-ecology/invitations', { email: 'a@b.example', role: 'lead' })).status).toBe(401);
    expect((await anon.get('/api/labs/no-such-lab')).status).toBe(404);
  });

  it('withdraws an invitation, after which it cannot be accepted', async () => {
    const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
    const email = uniqueEmail('withdrawn');
    const inv = await lead.post('/api/labs/fenmoor-swarm-ecology/invitations', { email, role: 'curator' });
    expect(inv.status).toBe(201);
    expect((await lead.delete(`/api/labs/fenmoor-swarm-ecology/invitations/${inv.json.id}`)).status).toBe(204);
    const invitee = await signUpAndVerify(app, 'withdrawn', email);
    const res = await invitee.http.post(`/api/invitations/${inv.json.id}/accept`);
    expect(res.status).toBe(409);
    expect(res.json.message).toMatch(/already canceled/);
  });
});

describe('platform admin', () => {
  it('lists users and labs for the seeded admin only', async () => {
    const admin = await signInDemo(app, 'nell.ashby@harrowgate-rds.example');
    const users = await admin.get('/api/admin/users');
    expect(users.status).toBe(200);
    expect(users.json.find((u: { email: string }) => u.email === 'ilse.marten@fenmoor.example').labs[0]).toMatchObject({ slug: 'fenmoor-swarm-ecology', role: 'lead' });
    const labs = await admin.get('/api/admin/labs');
    expect(labs.json.filter((l: { isDemo: boolean }) => l.isDemo).map((l: { slug: string }) => l.slug).sort()).toEqual([
      'fenmoor-swarm-ecology',
      'rookery-roof-array',
      'tidewater-schooling',
    ]);
    const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
    expect((await lead.get('/api/admin/users')).status).toBe(403);
    expect((await httpClient(app.url).get('/api/admin/labs')).status).toBe(401);
  });
});

describe('errors and the mailbox', () => {
  it('answers unknown API routes and bad JSON in the common error shape', async () => {
    const anon = httpClient(app.url);
    const missing = await anon.get('/api/no/such/route');
    expect(missing.status).toBe(404);
    expect(missing.json).toMatchObject({ code: 'route_not_found', message: expect.stringContaining('/api/no/such/route') });
    expect(missing.json.requestId).toBe(missing.headers.get('x-request-id'));
    const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
    const bad = await lead.raw('POST', '/api/labs', '{"name": ', { headers: { 'content-type': 'application/json' } });
    expect(bad.status).toBe(400);
    expect(bad.json.code).toBe('invalid_json');
  });

  it('shows captured mail through the app only while the fakes are on', async () => {
    const { email } = await signUpAndVerify(app, 'mailbox');
    const list = await httpClient(app.url).get('/api/dev/mailbox');
    expect(list.status).toBe(200);
    expect(list.json.some((m: { to: string[] }) => m.to.includes(email))).toBe(true);

    const prod = await startTestApp({ env: { FAKES: 'off' } });
    try {
      expect((await httpClient(prod.url).get('/api/dev/mailbox')).status).toBe(404);
      expect((await httpClient(prod.url).get('/api/info')).json.mailbox).toBe(false);
    } finally {
      await prod.close();
    }
  });

  it('reports the database and object store in /api/health', async () => {
    const res = await httpClient(app.url).get('/api/health');
    expect(res.json).toEqual({ status: 'ok', database: inject('pgAdminUrl') ? 'postgres' : 'pglite', objectStore: 'ok' });
  });
});

describe('OpenAPI description', () => {
  it('lists every API route with who may call it, generated from the route table', async () => {
    const doc = (await httpClient(app.url).get('/api/openapi.json')).json;
    expect(doc.openapi).toBe('3.1.0');
    expect(app.routes.length).toBeGreaterThan(10);
    for (const r of app.routes) {
      const op = doc.paths[r.path.replace(/:(\w+)/g, '{$1}')]?.[r.method];
      expect(op, `${r.method} ${r.path}`).toBeTruthy();
      expect(op.description).toMatch(/^Who may call it/);
    }
    // Validated against the OpenAPI 3.1 specification by @readme/openapi-parser.
    const { validate } = await import('@readme/openapi-parser');
    const result = await validate(structuredClone(doc));
    expect(result.valid, JSON.stringify(result)).toBe(true);
    const create = doc.paths['/api/labs'].post;
    expect(create.requestBody.content['application/json'].schema.required).toEqual(expect.arrayContaining(['name', 'slug']));
  });
});
