import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { publishNewVersion, publishRelease, type Published } from '../support/publishing';

/*
 * Checked against "The Open Archives Initiative Protocol for Metadata
 * Harvesting, Protocol Version 2.0 of 2002-06-14". The published XML schemas
 * (OAI-PMH.xsd, oai_dc.xsd) cannot be fetched here, so each answer is checked
 * for well-formedness (xmllint when installed, else fast-xml-parser's
 * validator) and for the elements and namespaces the specification requires,
 * modelled on its examples in sections 4.1–4.6 (one per verb; the examples
 * are recalled from memory, not copied from the document).
 */

const OAI = 'http://www.openarchives.org/OAI/2.0/';
const OAI_DC = 'http://www.openarchives.org/OAI/2.0/oai_dc/';
const DC = 'http://purl.org/dc/elements/1.1/';
const ROOKERY = 'rookery-roof-array';
const FENMOOR = 'fenmoor-swarm-ecology';

const xmllint = spawnSync('xmllint', ['--version']).status === 0;
const parser = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: '@_',
  parseTagValue: false,
  isArray: (name) => ['record', 'header', 'set', 'error', 'setSpec', 'metadataFormat', 'dc:identifier', 'dc:relation', 'dc:subject', 'dc:rights', 'dc:creator', 'dc:format'].includes(name),
});

type Node = Record<string, any>;
const text = (n: unknown): string => (typeof n === 'string' ? n : ((n as Node)?.['#text'] ?? ''));

let app: TestApp;
let host: string;
let a1: Published, a2: Published, b1: Published, c1: Published;
// A second boundary between the first three releases and the rest.
let boundary: Date;

const seconds = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, 'Z');
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** One OAI-PMH request (GET, or POST with a form body); checks the envelope every answer must have. */
async function oai(args: Record<string, string | string[]>, method: 'GET' | 'POST' = 'GET') {
  const form = new URLSearchParams();
  for (const [k, v] of Object.entries(args)) for (const one of Array.isArray(v) ? v : [v]) form.append(k, one);
  const res =
    method === 'GET'
      ? await fetch(`${app.url}/oai?${form}`)
      : await fetch(`${app.url}/oai`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: form.toString() });
  const body = await res.text();
  // Section 3.1.2.1 / 3.2: protocol errors travel inside a 200 text/xml answer.
  expect(res.status).toBe(200);
  expect(res.headers.get('content-type')).toMatch(/^text\/xml; charset=utf-8/i);
  if (xmllint) {
    const lint = spawnSync('xmllint', ['--noout', '-'], { input: body });
    expect(lint.stderr.toString(), 'xmllint finds the answer well-formed').toBe('');
    expect(lint.status).toBe(0);
  } else {
    expect(XMLValidator.validate(body)).toBe(true);
  }
  const doc = parser.parse(body) as Node;
  const root = doc['OAI-PMH'] as Node;
  // Section 3.2: the root element, its namespace and schema location; responseDate in UTC seconds; request with the base URL.
  expect(root['@_xmlns']).toBe(OAI);
  expect(root['@_xsi:schemaLocation']).toBe(`${OAI} http://www.openarchives.org/OAI/2.0/OAI-PMH.xsd`);
  expect(root['@_xmlns:xsi']).toBe('http://www.w3.org/2001/XMLSchema-instance');
  expect(root.responseDate).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/);
  expect(text(root.request)).toBe(`${app.url}/oai`);
  return { root, body, request: root.request as Node | string, errors: ((root.error ?? []) as Node[]).map((e) => ({ code: e['@_code'] as string, message: text(e) })) };
}

const codes = (r: { errors: Array<{ code: string }> }) => r.errors.map((e) => e.code);
const id = (p: Published) => `oai:${host}:${p.suffix}`;
const headersOf = (list: Node) => (list.header as Node[]).map((h) => ({ id: h.identifier as string, deleted: h['@_status'] === 'deleted', sets: h.setSpec as string[], datestamp: h.datestamp as string }));

beforeAll(async () => {
  app = await startTestApp({ env: { OAI_PAGE_SIZE: '2', OAI_TOKEN_SECONDS: '4' } });
  host = new URL(app.url).hostname;
  const rookeryDepositor = await signInDemo(app, 'oskar.lenning@northgate-poly.example');
  const rookeryLead = await signInDemo(app, 'priya.vell@northgate-poly.example');
  a1 = await publishRelease(rookeryDepositor, rookeryLead, ROOKERY, {
    title: 'Jackdaw flock over the roof <evening> & "dusk" run',
    keywords: ['flocking', 'corvids'],
    species: [{ name: 'Coloeus monedula' }],
    licence: 'CC-BY-4.0',
  });
  a2 = await publishNewVersion(rookeryDepositor, rookeryLead, ROOKERY, a1.datasetId, 'Checked again.');
  b1 = await publishRelease(rookeryDepositor, rookeryLead, ROOKERY, { title: 'Starling roost arrival, to be withdrawn', access: { level: 'restricted' } });
  boundary = new Date(Math.ceil((Date.now() + 1) / 1000) * 1000);
  await sleep(boundary.getTime() - Date.now() + 50);
  const fenmoorDepositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
  const fenmoorLead = await signInDemo(app, 'ilse.marten@fenmoor.example');
  c1 = await publishRelease(fenmoorDepositor, fenmoorLead, FENMOOR, { title: 'Mayfly swarm over the jetty marker', access: { level: 'embargoed', embargoUntil: '2099-01-01' } });
  const withdrawn = await rookeryLead.post(`/api/labs/${ROOKERY}/releases/${b1.suffix}/withdraw`, { reason: 'The camera calibration was wrong.' });
  expect(withdrawn.status).toBe(200);
}, 180_000);

afterAll(async () => {
  await app?.close();
});

describe('OAI-PMH verbs (section 4)', () => {
  it('Identify names the repository, its base URL, persistent deleted records and second granularity (4.2)', async () => {
    const { root, request } = await oai({ verb: 'Identify' });
    expect((request as Node)['@_verb']).toBe('Identify');
    const i = root.Identify as Node;
    expect(i).toMatchObject({ repositoryName: 'Cohesia', baseURL: `${app.url}/oai`, protocolVersion: '2.0', deletedRecord: 'persistent', granularity: 'YYYY-MM-DDThh:mm:ssZ' });
    expect(i.adminEmail).toMatch(/^[^@\s]+@[^@\s]+$/);
    expect(i.earliestDatestamp).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/);
    const first = headersOf((await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc' })).root.ListIdentifiers)[0];
    expect(i.earliestDatestamp).toBe(first.datestamp);
    const desc = i.description['oai-identifier'] as Node;
    expect(desc['@_xmlns']).toBe('http://www.openarchives.org/OAI/2.0/oai-identifier');
    expect(desc).toMatchObject({ scheme: 'oai', repositoryIdentifier: host, delimiter: ':' });
  });

  it('answers POST with a form body like GET (3.1.1.2)', async () => {
    const { root } = await oai({ verb: 'GetRecord', identifier: id(c1), metadataPrefix: 'oai_dc' }, 'POST');
    expect(root.GetRecord.record[0].header[0].identifier).toBe(id(c1));
  });

  it('ListMetadataFormats offers oai_dc with its schema and namespace, for the repository and for one item (4.4)', async () => {
    for (const args of [{}, { identifier: id(a1) }] as Array<Record<string, string>>) {
      const { root } = await oai({ verb: 'ListMetadataFormats', ...args });
      expect(root.ListMetadataFormats.metadataFormat).toEqual([{ metadataPrefix: 'oai_dc', schema: 'http://www.openarchives.org/OAI/2.0/oai_dc.xsd', metadataNamespace: OAI_DC }]);
    }
  });

  it('ListSets has one set per lab with releases, lab:<slug> (4.6)', async () => {
    const { root, errors } = await oai({ verb: 'ListSets' });
    // Sets are supported, so noSetHierarchy (its condition: no set support) never arises.
    expect(errors).toEqual([]);
    const sets = (root.ListSets.set as Node[]).map((s) => ({ spec: s.setSpec[0], name: s.setName }));
    expect(sets).toEqual([
      { spec: `lab:${FENMOOR}`, name: 'Fenmoor Swarm Ecology Group' },
      { spec: `lab:${ROOKERY}`, name: 'Rookery Roof Array' },
    ]);
  });

  it('GetRecord gives the Dublin Core of a release: DOI and landing page, licence and access, version relations (4.1)', async () => {
    const { root, request } = await oai({ verb: 'GetRecord', identifier: id(a2), metadataPrefix: 'oai_dc' });
    expect(request).toMatchObject({ '@_verb': 'GetRecord', '@_identifier': id(a2), '@_metadataPrefix': 'oai_dc' });
    const rec = root.GetRecord.record[0] as Node;
    expect(rec.header[0]).toMatchObject({ identifier: id(a2), setSpec: [`lab:${ROOKERY}`] });
    expect(rec.header[0]['@_status']).toBeUndefined();
    const dc = rec.metadata['oai_dc:dc'] as Node;
    expect(dc['@_xmlns:oai_dc']).toBe(OAI_DC);
    expect(dc['@_xmlns:dc']).toBe(DC);
    expect(dc['@_xsi:schemaLocation']).toBe(`${OAI_DC} http://www.openarchives.org/OAI/2.0/oai_dc.xsd`);
    // Escaped on the way out, read back intact.
    expect(dc['dc:title']).toBe('Jackdaw flock over the roof <evening> & "dusk" run');
    expect(dc['dc:creator']).toEqual(['Mina Throssel']);
    expect(dc['dc:subject']).toEqual(['flocking', 'corvids', 'Coloeus monedula']);
    expect(dc['dc:description']).toMatch(/synthetic/i);
    expect(dc['dc:publisher']).toBe('Cohesia');
    expect(dc['dc:date']).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(dc['dc:type']).toBe('Dataset');
    expect(dc['dc:identifier']).toEqual([`https://doi.org/${a2.doi}`, `${app.url}/releases/${a2.suffix}`]);
    expect(dc['dc:rights']).toEqual([expect.stringMatching(/^Creative Commons Attribution 4\.0 International \(CC-BY-4\.0\): https:\/\//), 'Access: open']);
    const concept = a2.doi.replace(/\.v2$/, '');
    expect(dc['dc:relation']).toEqual([`IsVersionOf https://doi.org/${concept}`, `IsNewVersionOf https://doi.org/${a1.doi}`]);
    const older = (await oai({ verb: 'GetRecord', identifier: id(a1), metadataPrefix: 'oai_dc' })).root.GetRecord.record[0].metadata['oai_dc:dc'];
    expect(older['dc:relation']).toContain(`IsPreviousVersionOf https://doi.org/${a2.doi}`);
    const embargoed = (await oai({ verb: 'GetRecord', identifier: id(c1), metadataPrefix: 'oai_dc' })).root.GetRecord.record[0].metadata['oai_dc:dc'];
    expect(embargoed['dc:rights']).toContain('Access: embargoed until 2099-01-01');
  });

  it('ListIdentifiers gives headers in datestamp order, with each lab set (4.3)', async () => {
    const first = await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc' });
    const page = headersOf(first.root.ListIdentifiers);
    expect(page.map((h) => h.id)).toEqual([id(a1), id(a2)]);
    expect(page.every((h) => h.sets[0] === `lab:${ROOKERY}`)).toBe(true);
    expect(first.root.ListIdentifiers.record).toBeUndefined();
  });

  it('ListRecords resumes through every page with an opaque token, completeListSize and cursor, ending with an empty token (4.5, 3.5)', async () => {
    const seen: string[] = [];
    let res = await oai({ verb: 'ListRecords', metadataPrefix: 'oai_dc' });
    const cursors: string[] = [];
    for (let guard = 0; guard < 10; guard++) {
      const list = res.root.ListRecords as Node;
      for (const r of list.record as Node[]) seen.push(r.header[0].identifier);
      const token = list.resumptionToken as Node | undefined;
      expect(token).toBeDefined();
      expect(token!['@_completeListSize']).toBe('4');
      cursors.push(token!['@_cursor']);
      const value = text(token);
      if (!value) {
        expect(token!['@_expirationDate']).toBeUndefined();
        break;
      }
      expect(token!['@_expirationDate']).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/);
      res = await oai({ verb: 'ListRecords', resumptionToken: value });
    }
    expect(cursors).toEqual(['0', '2']);
    // The withdrawal of b1 came after c1's publication, so its datestamp puts it last.
    expect(seen).toEqual([id(a1), id(a2), id(c1), id(b1)]);
  });

  it('keeps a withdrawn release as a deleted record: a header with status="deleted" and no metadata (2.5.1)', async () => {
    const got = await oai({ verb: 'GetRecord', identifier: id(b1), metadataPrefix: 'oai_dc' });
    const rec = got.root.GetRecord.record[0] as Node;
    expect(rec.header[0]['@_status']).toBe('deleted');
    expect(rec.header[0].setSpec).toEqual([`lab:${ROOKERY}`]);
    expect(rec.metadata).toBeUndefined();
    // The withdrawal gave it a new datestamp, after the boundary.
    expect(new Date(rec.header[0].datestamp).getTime()).toBeGreaterThanOrEqual(boundary.getTime());
    const listed = await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', from: seconds(boundary) });
    expect(headersOf(listed.root.ListIdentifiers).map((h) => [h.id, h.deleted])).toEqual([
      [id(c1), false],
      [id(b1), true],
    ]);
  });

  it('selects by set', async () => {
    const { root } = await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', set: `lab:${FENMOOR}` });
    expect(headersOf(root.ListIdentifiers).map((h) => h.id)).toEqual([id(c1)]);
  });

  it('selects by from and until at second granularity, both bounds inclusive', async () => {
    const before = new Date(boundary.getTime() - 1000);
    const early = await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', until: seconds(before) });
    expect(headersOf(early.root.ListIdentifiers).map((h) => h.id)).toEqual([id(a1), id(a2)]);
    const cDatestamp = headersOf((await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', set: `lab:${FENMOOR}` })).root.ListIdentifiers)[0].datestamp;
    const exact = await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', from: cDatestamp, until: cDatestamp });
    expect(headersOf(exact.root.ListIdentifiers).map((h) => h.id)).toContain(id(c1));
  });

  it('accepts day granularity for from and until', async () => {
    const today = new Date().toISOString().slice(0, 10);
    const all = await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', from: today, until: today });
    expect(all.root.ListIdentifiers.resumptionToken['@_completeListSize']).toBe('4');
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    expect(codes(await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', until: yesterday }))).toEqual(['noRecordsMatch']);
  });
});

describe('OAI-PMH errors (section 3.6)', () => {
  const noAttributes = (request: Node | string) => expect(typeof request).toBe('string');

  it('badVerb: missing, unknown or repeated verb, with a bare request element', async () => {
    for (const args of [{}, { verb: 'ListEverything' }, { verb: ['Identify', 'Identify'] }] as Array<Record<string, string | string[]>>) {
      const r = await oai(args);
      expect(codes(r)).toEqual(['badVerb']);
      noAttributes(r.request);
    }
  });

  it('badArgument: an argument the verb does not take, a missing required one, a repeated one, an empty one', async () => {
    const cases: Array<Record<string, string | string[]>> = [
      { verb: 'Identify', metadataPrefix: 'oai_dc' },
      { verb: 'GetRecord', identifier: 'oai:x:y' },
      { verb: 'ListRecords' },
      { verb: 'ListRecords', metadataPrefix: ['oai_dc', 'oai_dc'] },
      { verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', set: '' },
    ];
    for (const args of cases) {
      const r = await oai(args);
      expect(codes(r), JSON.stringify(args)).toEqual(['badArgument']);
      noAttributes(r.request);
    }
  });

  it('badArgument: resumptionToken is exclusive', async () => {
    const token = text((await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc' })).root.ListIdentifiers.resumptionToken);
    const r = await oai({ verb: 'ListIdentifiers', resumptionToken: token, metadataPrefix: 'oai_dc' });
    expect(codes(r)).toEqual(['badArgument']);
    expect(r.errors[0].message).toMatch(/exclusive/);
  });

  it('badArgument: datestamps that are malformed, not real dates, finer than seconds, of mixed granularity, or from after until', async () => {
    const cases: Array<Record<string, string>> = [
      { from: '2026-13-01' },
      { from: '2026-02-30' },
      { until: '2026-01-01T10:00Z' },
      { from: '2026-01-01T10:00:00.5Z' },
      { from: '2026-01-01', until: '2026-01-02T00:00:00Z' },
      { from: '2026-01-02', until: '2026-01-01' },
    ];
    for (const dates of cases) {
      const r = await oai({ verb: 'ListRecords', metadataPrefix: 'oai_dc', ...dates });
      expect(codes(r), JSON.stringify(dates)).toEqual(['badArgument']);
    }
  });

  it('badResumptionToken: garbled, forged, for another verb, or expired', async () => {
    const token = text((await oai({ verb: 'ListRecords', metadataPrefix: 'oai_dc' })).root.ListRecords.resumptionToken);
    const flipped = `${token.slice(0, 5)}${token[5] === 'A' ? 'B' : 'A'}${token.slice(6)}`;
    const forged = `${Buffer.from(JSON.stringify({ k: 'ListRecords', c: 0, a: ['2000-01-01T00:00:00Z', ''], e: 9e9 })).toString('base64url')}.AAAAAAAAAAAAAAAAAAAAAA`;
    for (const t of [flipped, forged, 'not-a-token', `${token}.x`]) {
      const r = await oai({ verb: 'ListRecords', resumptionToken: t });
      expect(codes(r), t).toEqual(['badResumptionToken']);
      // Not a badArgument: the request is echoed with its attributes.
      expect((r.request as Node)['@_verb']).toBe('ListRecords');
    }
    expect(codes(await oai({ verb: 'ListIdentifiers', resumptionToken: token }))).toEqual(['badResumptionToken']);
    expect(codes(await oai({ verb: 'ListSets', resumptionToken: token }))).toEqual(['badResumptionToken']);
    // The test app's tokens live 4 s.
    await sleep(4_200);
    const expired = await oai({ verb: 'ListRecords', resumptionToken: token });
    expect(expired.errors).toEqual([{ code: 'badResumptionToken', message: expect.stringMatching(/expired/) }]);
  });

  it('cannotDisseminateFormat: a metadata prefix other than oai_dc', async () => {
    expect(codes(await oai({ verb: 'ListRecords', metadataPrefix: 'marc21' }))).toEqual(['cannotDisseminateFormat']);
    expect(codes(await oai({ verb: 'ListIdentifiers', metadataPrefix: 'marc21' }))).toEqual(['cannotDisseminateFormat']);
    const r = await oai({ verb: 'GetRecord', identifier: id(a1), metadataPrefix: 'marc21' });
    expect(codes(r)).toEqual(['cannotDisseminateFormat']);
    expect(r.request).toMatchObject({ '@_verb': 'GetRecord', '@_metadataPrefix': 'marc21' });
  });

  it('idDoesNotExist: an unknown item, another repository’s identifier, for GetRecord and ListMetadataFormats', async () => {
    for (const identifier of [`oai:${host}:cx.0000-00000.v1`, `oai:elsewhere.example:${a1.suffix}`, a1.doi]) {
      expect(codes(await oai({ verb: 'GetRecord', identifier, metadataPrefix: 'oai_dc' }))).toEqual(['idDoesNotExist']);
      expect(codes(await oai({ verb: 'ListMetadataFormats', identifier }))).toEqual(['idDoesNotExist']);
    }
    // Both conditions at once are both reported.
    expect(codes(await oai({ verb: 'GetRecord', identifier: `oai:${host}:nope`, metadataPrefix: 'marc21' })).sort()).toEqual(['cannotDisseminateFormat', 'idDoesNotExist']);
  });

  it('noRecordsMatch: an unknown set, a window with no records', async () => {
    expect(codes(await oai({ verb: 'ListRecords', metadataPrefix: 'oai_dc', set: 'lab:no-such-lab' }))).toEqual(['noRecordsMatch']);
    expect(codes(await oai({ verb: 'ListIdentifiers', metadataPrefix: 'oai_dc', set: 'species:jackdaw' }))).toEqual(['noRecordsMatch']);
    expect(codes(await oai({ verb: 'ListRecords', metadataPrefix: 'oai_dc', until: '2001-01-01T00:00:00Z' }))).toEqual(['noRecordsMatch']);
  });

  it('noMetadataFormats: a withdrawn release disseminates no metadata any more', async () => {
    const r = await oai({ verb: 'ListMetadataFormats', identifier: id(b1) });
    expect(codes(r)).toEqual(['noMetadataFormats']);
    expect(r.request).toMatchObject({ '@_verb': 'ListMetadataFormats', '@_identifier': id(b1) });
  });

  it('is public and described in the route table and the OpenAPI description', async () => {
    expect(app.routes.filter((r) => r.path === '/oai').map((r) => [r.method, r.access.kind])).toEqual([['get', 'public'], ['post', 'public']]);
    const spec = (await (await fetch(`${app.url}/api/openapi.json`)).json()) as { paths: Record<string, Record<string, unknown>> };
    expect(Object.keys(spec.paths['/oai'])).toEqual(['get', 'post']);
  });
});
