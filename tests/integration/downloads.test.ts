import { createHash } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo, signUpAndVerify } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';
import { readZip } from '../support/zip';

const LAB = 'fenmoor-swarm-ecology';
let app: TestApp;
let depositor: HttpClient;
let curator: HttpClient;

beforeAll(async () => {
  app = await startTestApp();
  depositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
  curator = await signInDemo(app, 'rafael.quist@fenmoor.example');
});
afterAll(async () => app?.close());

async function publish(title: string, access: Record<string, unknown>, files: Array<[string, Buffer, string?]>) {
  const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
  await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title, access }) });
  for (const [name, bytes, role] of files) await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, name, bytes, role));
  expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
  const res = await curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {});
  expect(res.status).toBe(201);
  return res.json as { suffix: string; doi: string; releaseId: string };
}

async function follow(http: HttpClient, path: string) {
  const res = await http.get(path);
  if (res.status !== 302) return { status: res.status, json: res.json, body: null as Buffer | null, headers: res.headers };
  const dl = await fetch(res.headers.get('location')!);
  return { status: 302, json: null, body: Buffer.from(await dl.arrayBuffer()), headers: dl.headers };
}

const sha = (b: Buffer, algo = 'sha256') => createHash(algo).update(b).digest('hex');

describe('release bundles in BagIt layout (RFC 8493)', () => {
  it('builds one ZIP per release with valid manifests, and counts downloads', async () => {
    const traj = fixture('trapped-langevin-swarm.csv.gz');
    const notes = Buffer.from('Camera notes for the demo.\n');
    const rel = await publish('Bundled swarm', { level: 'open' }, [['swarm.csv.gz', traj], ['notes.txt', notes, 'supplementary']]);
    const visitor = httpClient(app.url);
    await expect.poll(async () => (await visitor.get(`/api/releases/${rel.suffix}/access`)).json.bundleReady, { timeout: 20_000 }).toBe(true);

    const got = await follow(visitor, `/api/releases/${rel.suffix}/bundle`);
    expect(got.status).toBe(302);
    expect(got.headers.get('content-disposition')).toContain(`${rel.suffix}.zip`);
    const zip = await readZip(got.body!);
    const root = `${rel.suffix}/`;
    const text = (p: string) => zip.get(root + p)!.toString('utf8');
    // RFC 8493 §2.1.1: bagit.txt holds exactly the version and the tag-file encoding.
    expect(text('bagit.txt')).toBe('BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n');
    expect(zip.get(root + 'data/trajectories/swarm.csv.gz')!.equals(traj)).toBe(true);
    expect(zip.get(root + 'data/supplementary/notes.txt')!.equals(notes)).toBe(true);
    for (const f of ['metadata.json', 'statistics.json', 'CITATION.cff', 'README.txt']) expect(zip.has(`${root}data/metadata/${f}`), f).toBe(true);

    // Every payload file is in both manifests with the right digest, and nothing else is (§3).
    const payload = [...zip.keys()].filter((k) => k.startsWith(root + 'data/')).map((k) => k.slice(root.length));
    for (const algo of ['sha256', 'sha512']) {
      const lines = text(`manifest-${algo}.txt`).trim().split('\n').map((l) => l.split(/\s+/));
      expect(lines.map((l) => l[1]).sort()).toEqual(payload.sort());
      for (const [digest, path] of lines) expect(digest, path).toBe(sha(zip.get(root + path)!, algo));
    }
    // bag-info.txt: Payload-Oxum = octets.streams over data/ (§2.2.2), plus the identifier and the organisation.
    const info = Object.fromEntries(text('bag-info.txt').trim().split('\n').map((l) => [l.slice(0, l.indexOf(':')), l.slice(l.indexOf(':') + 2)]));
    const octets = payload.reduce((s, p) => s + zip.get(root + p)!.length, 0);
    expect(info['Payload-Oxum']).toBe(`${octets}.${payload.length}`);
    expect(info['External-Identifier']).toBe(rel.doi);
    expect(info['Source-Organization']).toBe('Fenmoor Swarm Ecology Group');
    expect(info['Bagging-Date']).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    const tags = text('tagmanifest-sha256.txt').trim().split('\n').map((l) => l.split(/\s+/));
    expect(tags.map((t) => t[1]).sort()).toEqual(['bag-info.txt', 'bagit.txt', 'manifest-sha256.txt', 'manifest-sha512.txt']);
    for (const [digest, path] of tags) expect(digest).toBe(sha(zip.get(root + path)!));
    expect(text('data/metadata/README.txt')).toContain(rel.doi);

    // The same checks with Debian's own tools: unzip -t, then sha256sum -c / sha512sum -c inside the bag.
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-bag-'));
    fs.writeFileSync(path.join(dir, 'bundle.zip'), got.body!);
    expect(execFileSync('unzip', ['-t', 'bundle.zip'], { cwd: dir }).toString()).toMatch(/No errors detected/);
    execFileSync('unzip', ['-q', 'bundle.zip'], { cwd: dir });
    const bag = path.join(dir, rel.suffix);
    expect(execFileSync('sha256sum', ['-c', 'manifest-sha256.txt'], { cwd: bag }).toString()).not.toMatch(/FAILED/);
    expect(execFileSync('sha512sum', ['-c', 'manifest-sha512.txt'], { cwd: bag }).toString()).not.toMatch(/FAILED/);
    expect(execFileSync('sha256sum', ['-c', 'tagmanifest-sha256.txt'], { cwd: bag }).toString()).not.toMatch(/FAILED/);
    fs.rmSync(dir, { recursive: true, force: true });

    // Single files: presigned, named, counted.
    const one = await follow(visitor, `/api/releases/${rel.suffix}/files/swarm.csv.gz/download`);
    expect(one.status).toBe(302);
    expect(one.headers.get('content-disposition')).toContain('filename="swarm.csv.gz"');
    expect(one.body!.equals(traj)).toBe(true);
    // COUNTER Release 5: a repeat within 30 s is one request; unique = per visitor, item and day.
    const again = await visitor.get(`/api/releases/${rel.suffix}/files/swarm.csv.gz/download`);
    const member = await depositor.get(`/api/releases/${rel.suffix}/files/swarm.csv.gz/download`);
    expect((await visitor.get(`/api/releases/${rel.suffix}/access`)).json.downloads).toEqual({ total: 3, unique: 3 });
    // Each request is checked and counted, but the signed link is shared for a minute: it still has at least 4 of its 5 minutes.
    const link = new URL(member.headers.get('location')!);
    expect(again.headers.get('location')).toBe(link.toString());
    expect(link.searchParams.get('X-Amz-Expires')).toBe('300');
    const signedAt = Date.parse(link.searchParams.get('X-Amz-Date')!.replace(/^(\d{4})(\d\d)(\d\d)T(\d\d)(\d\d)(\d\d)Z$/, '$1-$2-$3T$4:$5:$6Z'));
    expect(Date.now() - signedAt).toBeLessThan(61_000);
    expect((await visitor.get(`/api/releases/${rel.suffix}/files/nope.csv/download`)).status).toBe(404);
    // The lab's dashboard counts them per month.
    const months = (await depositor.get(`/api/labs/${LAB}/downloads`)).json;
    expect(months.at(-1)).toMatchObject({ month: new Date().toISOString().slice(0, 7) });
    expect(months.at(-1).downloads).toBeGreaterThanOrEqual(4);
    expect((await visitor.get(`/api/labs/${LAB}/downloads`)).status).toBe(401);
  });

  it('serves restricted files only to the lab, and refuses visitors and strangers clearly', async () => {
    const rel = await publish('Restricted swarm', { level: 'restricted' }, [['swarm.csv.gz', fixture('adaptive-gravity-swarm.csv.gz')]]);
    const visitor = httpClient(app.url);
    const anon = await visitor.get(`/api/releases/${rel.suffix}/files/swarm.csv.gz/download`);
    expect(anon.status).toBe(401);
    expect(anon.json.message).toMatch(/shared on request/);
    const stranger = await signUpAndVerify(app, 'stranger');
    expect((await stranger.http.get(`/api/releases/${rel.suffix}/files/swarm.csv.gz/download`)).status).toBe(403);
    expect((await stranger.http.get(`/api/releases/${rel.suffix}/access`)).json).toMatchObject({ allowed: false });
    expect((await depositor.get(`/api/releases/${rel.suffix}/files/swarm.csv.gz/download`)).status).toBe(302);
    // The statistics stay public.
    expect((await visitor.get(`/api/releases/${rel.suffix}`)).json.results.length).toBe(1);
  });

  it('opens an embargoed release once its date has passed', async () => {
    const future = await publish('Embargoed swarm', { level: 'embargoed', embargoUntil: '2099-01-01' }, [['swarm.csv.gz', fixture('vicsek-flock-3d.csv.gz')]]);
    const past = await publish('Embargo over', { level: 'embargoed', embargoUntil: '2020-01-01' }, [['swarm.csv.gz', fixture('vicsek-flock-3d.csv.gz')]]);
    const visitor = httpClient(app.url);
    const closed = await visitor.get(`/api/releases/${future.suffix}/files/swarm.csv.gz/download`);
    expect(closed.status).toBe(401);
    expect(closed.json.message).toMatch(/embargo until 2099-01-01/);
    expect((await visitor.get(`/api/releases/${past.suffix}/files/swarm.csv.gz/download`)).status).toBe(302);
  });
});

describe('storage usage by place', () => {
  it('splits the bytes into published releases and drafts only, counting each object once', async () => {
    const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
    const usage = (await lead.get(`/api/labs/${LAB}/storage`)).json;
    const places = Object.fromEntries((usage.usage ?? usage).byPlace.map((p: { label: string; bytes: number }) => [p.label, p.bytes]));
    expect(places['In published releases']).toBeGreaterThan(0);
    const total = (usage.usage ?? usage).byPlace.reduce((s: number, p: { bytes: number }) => s + p.bytes, 0);
    expect(total).toBe((usage.usage ?? usage).usedBytes);
  });
});

describe('embargo with a clock you can set', () => {
  it('keeps the files closed before the date and opens them at the date, for the same release', async () => {
    const rel = await publish('Embargo clock', { level: 'embargoed', embargoUntil: '2031-05-01' }, [['swarm.csv.gz', fixture('vicsek-flock-3d.csv.gz')]]);
    const { createDownloadsService } = await import('../../server/services/downloads.service');
    const { createDepositingRepository } = await import('../../server/repositories/depositing.repository');
    const { createLabsRepository } = await import('../../server/repositories/labs.repository');
    const { createReleaseReads } = await import('../../server/services/release-reads');
    const repo = createDepositingRepository(app.database.db);
    const at = (iso: string) =>
      createDownloadsService({
        grants: { hasGrant: async () => false },
        repo,
        reads: createReleaseReads(repo),
        labs: createLabsRepository(app.database.db),
        uploads: {} as never,
        store: {} as never,
        doiPrefix: '10.99999',
        publicBaseUrl: app.url,
        log: {} as never,
        now: () => new Date(iso),
      });
    expect((await at('2031-04-30T23:59:59Z').accessBySuffix(rel.suffix, { userId: null })).allowed).toBe(false);
    expect((await at('2031-05-01T00:00:00Z').accessBySuffix(rel.suffix, { userId: null })).allowed).toBe(true);

    // The embargo job, run with the clock set: nothing before the date; at the date one audit event and a mail to the lab, once.
    expect(await app.depositing.access.liftEmbargoes(new Date('2031-04-30T12:00:00Z'))).not.toContain(rel.suffix);
    expect(await app.depositing.access.liftEmbargoes(new Date('2031-05-01T00:00:01Z'))).toContain(rel.suffix);
    expect(await app.depositing.access.liftEmbargoes(new Date('2031-05-02T00:00:00Z'))).not.toContain(rel.suffix);
    const mail = await app.mail.waitFor('ilse.marten@fenmoor.example', /Embargo ended: Embargo clock/);
    expect(mail.text).toContain('2031-05-01');
  });
});
