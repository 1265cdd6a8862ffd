import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';

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

async function newDraft(title = 'Test swarm dataset', metadata: Record<string, unknown> | null = { frameRate: 100, units: 'm', dimension: 3 }) {
  const res = await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: 'For the tests.' });
  expect(res.status).toBe(201);
  // The frame rate and units the engine needs come from the metadata.
  if (metadata) await depositor.put(`/api/labs/${LAB}/drafts/${res.json.draftId}/metadata`, { metadata: { title, ...metadata } });
  return res.json as { datasetId: string; draftId: string; suffix: string; doi: string };
}

describe('depositing: upload → ingest → metadata → review → release', () => {
  it('runs the whole journey and publishes immutable, versioned releases', async () => {
    const { draftId, datasetId, doi } = await newDraft();
    expect(doi).toMatch(/^10\.99999\/cx\.[0-9A-Z]{4}-[0-9A-Z]{5}$/);

    const bytes = fixture('trapped-langevin-swarm.csv.gz');
    const fileId = await uploadFile(depositor, LAB, draftId, '../trapped swarm.csv.gz', bytes);
    const file = await waitForFile(depositor, LAB, draftId, fileId);
    expect(file).toMatchObject({ state: 'ready', status: 'ok', fileName: 'trapped swarm.csv.gz', sizeBytes: bytes.length });
    expect(file.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    const report = (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}/files/${fileId}`)).json;
    expect(report.result.engineVersion).toBeTruthy();
    expect(report.result.summary).toBeTruthy();

    // Invalid metadata is kept (nothing typed is lost) and its problems come back with paths.
    const bad = await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ licence: 'MY-OWN', frameRate: -1 }) });
    expect(bad.status).toBe(200);
    expect(bad.json.problems.map((p: { path: string }) => p.path).sort()).toEqual(['/frameRate', '/licence']);
    const notReady = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
    expect(notReady.status).toBe(409);
    expect(notReady.json.message).toMatch(/metadata/);

    expect((await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata() })).json.problems).toEqual([]);
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
    await app.mail.waitFor('rafael.quist@fenmoor.example', /Ready for review: Trapped swarm/);
    // A submitted draft is locked for editing.
    expect((await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata() })).status).toBe(409);

    // A depositor cannot publish; a curator can, once.
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {})).status).toBe(403);
    const [a, b] = await Promise.all([
      curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, { changelog: 'First release.' }),
      curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, { changelog: 'First release.' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const v1 = (a.status === 201 ? a : b).json;
    expect(v1).toMatchObject({ version: 1, doi: `${doi}.v1` });
    await app.mail.waitFor('mina.throssel@fenmoor.example', /Published: Trapped swarm/);

    // The database refuses to change a published release.
    const dbError = (p: Promise<unknown>) => p.then(() => 'no error', (e) => String(e.cause?.message ?? e.message));
    expect(await dbError(app.database.db.execute(sql`update release set title = 'changed' where id = ${v1.releaseId}`))).toMatch(/content cannot change/);
    expect(await dbError(app.database.db.execute(sql`delete from release where id = ${v1.releaseId}`))).toMatch(/cannot be deleted/);
    expect(await dbError(app.database.db.execute(sql`update release_file set sha256 = 'x' where release_id = ${v1.releaseId}`))).toMatch(/cannot change/);

    // The identifiers reach the registration agency (a background job).
    await expect
      .poll(async () => (await fetch(`${inject('identifierRegistryUrl')}/identifiers/${encodeURIComponent(v1.doi)}`)).status, { timeout: 10_000 })
      .toBe(200);

    // A new version carries the files over by reference and publishes as version 2.
    const next = await depositor.post(`/api/labs/${LAB}/datasets/${datasetId}/versions`);
    expect(next.status).toBe(201);
    expect((await depositor.post(`/api/labs/${LAB}/datasets/${datasetId}/versions`)).status).toBe(409);
    const d2 = (await depositor.get(`/api/labs/${LAB}/drafts/${next.json.draftId}`)).json;
    expect(d2.files).toHaveLength(1);
    expect(d2.files[0]).toMatchObject({ state: 'ready', sha256: file.sha256, carriedOver: true });
    expect(d2.problems).toEqual([]);
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${next.json.draftId}/submit`)).status).toBe(200);
    const v2 = await curator.post(`/api/labs/${LAB}/drafts/${next.json.draftId}/publish`, { changelog: 'Same data, checked again.' });
    expect(v2.json).toMatchObject({ version: 2, doi: `${doi}.v2` });
  });

  it('lets a curator return a draft with a comment, mailed to the depositor', async () => {
    const { draftId } = await newDraft('Returned dataset');
    const fileId = await uploadFile(depositor, LAB, draftId, 'swarm.csv.gz', fixture('adaptive-gravity-swarm.csv.gz'));
    await waitForFile(depositor, LAB, draftId, fileId);
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title: 'Returned dataset' }) });
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/return`, { body: 'Please add the camera model.' })).status).toBe(403);
    expect((await curator.post(`/api/labs/${LAB}/drafts/${draftId}/return`, { body: 'Please add the camera model.' })).status).toBe(200);
    const mail = await app.mail.waitFor('mina.throssel@fenmoor.example', /Changes asked for: Returned dataset/);
    expect(mail.text).toContain('Please add the camera model.');
    const draft = (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).json;
    expect(draft.state).toBe('returned');
    expect(draft.comments.map((c: { kind: string }) => c.kind)).toEqual(['submitted', 'returned']);
  });

  it('maps the columns of a header-less file and checks it again', async () => {
    const { draftId } = await newDraft('Header-less file', null);
    const bytes = fixture('variants/no-header.csv');
    const fileId = await uploadFile(depositor, LAB, draftId, 'no-header.csv', bytes);
    const first = await waitForFile(depositor, LAB, draftId, fileId);
    const preview = (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}/files/${fileId}/preview`)).json;
    expect(preview.lines[0].split(',').length).toBeGreaterThanOrEqual(5);
    const res = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/files/${fileId}/ingest`, {
      hasHeader: false,
      mapping: { track_id: 0, frame: 1, x: 2, y: 3, z: 4 },
      units: 'm',
      fps: 100,
      dims: 3,
    });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    const again = await waitForFile(depositor, LAB, draftId, fileId);
    expect(again.state).toBe('ready');
    expect(first.sha256).toBe(again.sha256);
  });

  it('keeps an invalid file with its report and never marks it ready', async () => {
    const { draftId } = await newDraft('Broken file');
    const fileId = await uploadFile(depositor, LAB, draftId, 'broken.csv', Buffer.from('track_id,frame,x,y,z\n1,1,0.1,0.2,abc\n1,2,0.1,0.2,0.3\n'));
    const file = await waitForFile(depositor, LAB, draftId, fileId);
    expect(file).toMatchObject({ state: 'invalid', status: 'invalid' });
    expect(file.errors).toBeGreaterThan(0);
    const report = (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}/files/${fileId}`)).json;
    expect(report.result.validation.errors[0].message).toMatch(/abc/);
    const draft = (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).json;
    expect(draft.blockers.join(' ')).toMatch(/did not pass/);
  });

  it('refuses bad uploads clearly: missing parts, duplicate names, other labs', async () => {
    const { draftId } = await newDraft('Upload errors');
    const start = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads`, { fileName: 'a.csv', size: 20 * 1024 * 1024, mediaType: 'text/csv' });
    expect(start.status).toBe(201);
    expect(start.json.partCount).toBe(3);
    const missing = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads/${start.json.fileId}/complete`, { parts: [{ partNumber: 1, etag: '"x"' }] });
    expect(missing.status).toBe(400);
    expect(missing.json.message).toMatch(/all 3 parts/);
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads`, { fileName: 'a.csv', size: 10, mediaType: 'text/csv' })).status).toBe(409);
    expect((await depositor.delete(`/api/labs/${LAB}/drafts/${draftId}/files/${start.json.fileId}`)).status).toBe(204);
    const outsider = await signInDemo(app, 'jun.haverly@tidewater.example');
    expect((await outsider.get(`/api/labs/${LAB}/drafts/${draftId}`)).status).toBe(403);
    expect((await outsider.get(`/api/labs/tidewater-schooling/drafts/${draftId}`)).status).toBe(404);
  });
});

describe('ingest jobs survive a crash', () => {
  it('a job left running by a dead worker is taken over and ends with one correct result', async () => {
    // An API-only instance: nothing runs the jobs until a worker starts.
    const api = await startTestApp({ workers: false });
    try {
      const http = await signInDemo(api, 'mina.throssel@fenmoor.example');
      const res = await http.post(`/api/labs/${LAB}/datasets`, { title: 'Crash test', summary: '' });
      const { draftId } = res.json;
      await http.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: { title: 'Crash test', frameRate: 100 } });
      const fileId = await uploadFile(http, LAB, draftId, 'swarm.csv.gz', fixture('vicsek-flock-3d.csv.gz'));
      // The worker that claimed the job died: its heartbeat stopped a minute ago.
      await api.database.db.execute(
        sql`update job set state = 'running', locked_by = 'dead-worker', attempts = 1, heartbeat_at = now() - interval '60 seconds' where payload->>'fileId' = ${fileId}`,
      );
      await api.jobs.drain(api.depositing.handlers, api.depositing.onFinalFailure);
      const file = await waitForFile(http, LAB, draftId, fileId, 5000);
      expect(file).toMatchObject({ state: 'ready', status: 'ok' });
      const jobs = await api.database.db.execute<{ state: string; attempts: number }>(sql`select state, attempts from job where payload->>'fileId' = ${fileId}`);
      expect((jobs as unknown as { rows: Array<{ state: string; attempts: number }> }).rows).toEqual([{ state: 'done', attempts: 2 }]);
    } finally {
      await api.close();
    }
  });
});

describe('release landing pages, citations and identifiers', () => {
  it('serves the landing page publicly, resolves /doi/ in any case, and cites in several formats', async () => {
    const { draftId, suffix } = await newDraft('Citable swarm');
    const fileId = await uploadFile(depositor, LAB, draftId, 'swarm.csv.gz', fixture('trapped-langevin-swarm.csv.gz'));
    await waitForFile(depositor, LAB, draftId, fileId);
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, {
      metadata: validMetadata({ title: 'Citable swarm', keywords: ['midges', 'swarm'], creators: [{ name: 'Mina Throssel', orcid: '0000-0002-1825-0097' }, { name: 'Rafael Quist' }] }),
    });
    await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
    const pub = (await curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {})).json;

    const visitor = httpClient(app.url);
    const page = await visitor.get(`/api/releases/${pub.suffix}`);
    expect(page.status).toBe(200);
    expect(page.json).toMatchObject({ doi: pub.doi, version: 1, licence: { id: 'CC-BY-4.0' }, accessLevel: 'open', dataset: { suffix } });
    expect(page.json.files[0]).toMatchObject({ fileName: 'swarm.csv.gz' });
    expect(page.json.results[0].result.series).toBeTruthy();
    expect(page.json.citation.styles.apa).toMatch(/^Throssel, M\., & Quist, R\. \(\d{4}\)\. Citable swarm \(Version 1\) \[Data set\]/);

    // schema.org Dataset: name and description are required; identifier, creator, license, version and datePublished recommended.
    const ld = page.json.jsonLd;
    expect(ld['@type']).toBe('Dataset');
    for (const key of ['name', 'description', 'identifier', 'creator', 'license', 'version', 'datePublished', 'url']) expect(ld[key], key).toBeTruthy();
    expect(ld.creator[0].identifier).toBe('https://orcid.org/0000-0002-1825-0097');

    // Case-insensitive resolution (ISO 26324), for the release and the all-versions identifier.
    const lower = await visitor.get(`/doi/${pub.doi.toLowerCase()}`);
    expect(lower.status).toBe(302);
    expect(lower.headers.get('location')).toBe(`/releases/${pub.suffix}`);
    const concept = await visitor.get(`/doi/${pub.doi.replace(/\.v1$/, '')}`);
    expect(concept.headers.get('location')).toBe(`/datasets/${suffix}`);
    expect((await visitor.get('/api/datasets/' + suffix)).json.latest).toBe(pub.suffix);

    // BibTeX and RIS parse back with citation-js; CSL-JSON is an array of items with the DOI.
    const { Cite } = await import('@citation-js/core');
    await import('@citation-js/plugin-bibtex');
    await import('@citation-js/plugin-ris');
    const bib = await visitor.get(`/api/releases/${pub.suffix}/citation/bibtex`);
    expect(bib.headers.get('content-disposition')).toContain('.bib');
    const fromBib = new Cite(bib.text).data[0];
    expect(fromBib).toMatchObject({ title: 'Citable swarm', DOI: pub.doi });
    const fromRis = new Cite((await visitor.get(`/api/releases/${pub.suffix}/citation/ris`)).text).data[0];
    expect(fromRis.DOI).toBe(pub.doi);
    const csl = JSON.parse((await visitor.get(`/api/releases/${pub.suffix}/citation/csl-json`)).text);
    expect(csl[0]).toMatchObject({ type: 'dataset', DOI: pub.doi, title: 'Citable swarm' });
    // CSL-JSON is read back by citation-js's CSL input (which checks the item types and fields of the CSL data model).
    const fromCsl = new Cite(csl).data[0];
    expect(fromCsl).toMatchObject({ type: 'dataset', DOI: pub.doi });
    expect(fromCsl.author).toEqual([{ given: 'Mina', family: 'Throssel' }, { given: 'Rafael', family: 'Quist' }]);

    // CITATION.cff: Citation File Format 1.2.0 requires cff-version, message, title and authors.
    const YAML = (await import('yaml')).default;
    const cff = YAML.parse((await visitor.get(`/api/releases/${pub.suffix}/citation/cff`)).text);
    expect(cff['cff-version']).toBe('1.2.0');
    for (const key of ['message', 'title', 'authors']) expect(cff[key], key).toBeTruthy();
    expect(cff.authors[0]).toMatchObject({ 'family-names': 'Throssel', 'given-names': 'Mina' });
    expect(cff.doi).toBe(pub.doi);

    // Withdrawal: a tombstone keeps the citation, hides files and statistics. A curator may not; the lead may.
    expect((await curator.post(`/api/labs/${LAB}/releases/${pub.suffix}/withdraw`, { reason: 'Calibration error found in camera 2.' })).status).toBe(403);
    const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
    expect((await lead.post(`/api/labs/${LAB}/releases/${pub.suffix}/withdraw`, { reason: 'Calibration error found in camera 2.' })).status).toBe(200);
    const tomb = (await visitor.get(`/api/releases/${pub.suffix}`)).json;
    expect(tomb.withdrawn.reason).toBe('Calibration error found in camera 2.');
    expect(tomb.files).toEqual([]);
    expect(tomb.citation.styles.apa).toContain(pub.doi);
    expect((await lead.post(`/api/labs/${LAB}/releases/${pub.suffix}/withdraw`, { reason: 'Calibration error found in camera 2.' })).status).toBe(409);
    // Publishing and withdrawing are in the lab's audit trail.
    const audit = (await lead.get(`/api/labs/${LAB}/audit?targetType=release&targetId=${pub.releaseId}`)).json;
    expect(audit.events.map((e: { action: string }) => e.action).sort()).toEqual(['release.published', 'release.withdrawn']);
  });
});

describe('review queue, schema address and quota at the upload step', () => {
  it('lists submitted drafts for curators only', async () => {
    const { draftId } = await newDraft('Queued dataset');
    const fileId = await uploadFile(depositor, LAB, draftId, 'q.csv.gz', fixture('trapped-langevin-swarm.csv.gz'));
    await waitForFile(depositor, LAB, draftId, fileId);
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title: 'Queued dataset' }) });
    await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
    expect((await depositor.get(`/api/labs/${LAB}/review-queue`)).status).toBe(403);
    const queue = (await curator.get(`/api/labs/${LAB}/review-queue`)).json;
    expect(queue.find((q: { draftId: string }) => q.draftId === draftId)).toMatchObject({ title: 'Queued dataset', newVersion: false });
  });

  it('publishes the metadata JSON Schema at a stable, versioned address', async () => {
    const res = await fetch(`${app.url}/schemas/dataset-metadata/1.0.0.json`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('application/schema+json');
    const schema = await res.json();
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(schema.$id).toBe(`${app.url}/schemas/dataset-metadata/1.0.0.json`);
    expect((await fetch(`${app.url}/schemas/dataset-metadata/9.9.9.json`, { headers: { accept: 'application/json' } })).status).not.toBe(200);
  });

  it('refuses an upload beyond the quota before any byte is stored, saying how much is left', async () => {
    const { draftId } = await newDraft('Too big');
    const res = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads`, { fileName: 'huge.csv.gz', size: 50 * 1000 ** 3, mediaType: 'application/gzip' });
    expect(res.status).toBe(413);
    expect(res.json.code).toBe('over_quota');
    expect(res.json.message).toMatch(/only .* is left/);
    expect(res.json.message).toContain('/labs/fenmoor-swarm-ecology/storage');
    expect((await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).json.files).toEqual([]);
  });
});
