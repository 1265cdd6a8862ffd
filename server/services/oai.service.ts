import { createHmac, timingSafeEqual } from 'node:crypto';
import { create } from 'xmlbuilder2';
import type { XMLBuilder } from 'xmlbuilder2/lib/interfaces';
import spdxLicences from 'spdx-license-list';
import type { HarvestFilter, HarvestingRepository, HarvestItem } from '../repositories/harvesting.repository';
import { formatDoi } from '../../shared/identifiers';
import { paths } from '../../shared/paths';

/*
 * OAI-PMH 2.0: The Open Archives Initiative Protocol for Metadata Harvesting,
 * Protocol Version 2.0 of 2002-06-14. Every release is an item; withdrawn
 * releases stay as deleted records (deletedRecord = persistent); each lab with
 * releases is a set `lab:<slug>`; the one metadata format is oai_dc.
 */

export const OAI_NS = 'http://www.openarchives.org/OAI/2.0/';
export const OAI_SCHEMA = 'http://www.openarchives.org/OAI/2.0/OAI-PMH.xsd';
export const OAI_DC_NS = 'http://www.openarchives.org/OAI/2.0/oai_dc/';
export const OAI_DC_SCHEMA = 'http://www.openarchives.org/OAI/2.0/oai_dc.xsd';
export const DC_NS = 'http://purl.org/dc/elements/1.1/';
const OAI_ID_NS = 'http://www.openarchives.org/OAI/2.0/oai-identifier';
const OAI_ID_SCHEMA = 'http://www.openarchives.org/OAI/2.0/oai-identifier.xsd';
const XSI = 'http://www.w3.org/2001/XMLSchema-instance';
const XMLNS = 'http://www.w3.org/2000/xmlns/';

const VERBS = ['Identify', 'ListMetadataFormats', 'ListSets', 'ListIdentifiers', 'ListRecords', 'GetRecord'] as const;
type Verb = (typeof VERBS)[number];

// Arguments each verb allows (section 4 of the specification); `verb` itself is checked apart.
const ALLOWED: Record<Verb, { required: string[]; optional: string[]; exclusive?: string }> = {
  Identify: { required: [], optional: [] },
  ListMetadataFormats: { required: [], optional: ['identifier'] },
  ListSets: { required: [], optional: [], exclusive: 'resumptionToken' },
  ListIdentifiers: { required: ['metadataPrefix'], optional: ['from', 'until', 'set'], exclusive: 'resumptionToken' },
  ListRecords: { required: ['metadataPrefix'], optional: ['from', 'until', 'set'], exclusive: 'resumptionToken' },
  GetRecord: { required: ['identifier', 'metadataPrefix'], optional: [] },
};

export type OaiErrorCode =
  | 'badArgument'
  | 'badResumptionToken'
  | 'badVerb'
  | 'cannotDisseminateFormat'
  | 'idDoesNotExist'
  | 'noRecordsMatch'
  | 'noMetadataFormats'
  // Never answered: Cohesia supports sets, so the condition ("the repository does not support sets") does not arise.
  | 'noSetHierarchy';

type OaiError = { code: OaiErrorCode; message: string };
class OaiFailure extends Error {
  constructor(readonly errors: OaiError[]) {
    super(errors.map((e) => e.message).join(' '));
  }
}
const fail = (code: OaiErrorCode, message: string): never => {
  throw new OaiFailure([{ code, message }]);
};

type Args = Record<string, string>;
type ListToken = { k: 'ListIdentifiers' | 'ListRecords'; f?: string; u?: string; s?: string; c: number; a: [string, string]; e: number };

type Deps = {
  repo: HarvestingRepository;
  publicBaseUrl: string;
  doiPrefix: string;
  adminEmail: string;
  pageSize: number;
  tokenSeconds: number;
  // Signs resumption tokens so a garbled or forged one is recognised.
  secret: string;
  now?: () => Date;
};

const seconds = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, 'Z');
const DAY = /^\d{4}-\d{2}-\d{2}$/;
const SECOND = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/;

/** A UTC datestamp at day or second granularity, or null when it is not one (or not a real date). */
function parseDatestamp(value: string, bound: 'from' | 'until'): { date: Date; granularity: 'day' | 'second' } | null {
  const granularity = DAY.test(value) ? 'day' : SECOND.test(value) ? 'second' : null;
  if (!granularity) return null;
  const full = granularity === 'day' ? `${value}T${bound === 'from' ? '00:00:00' : '23:59:59'}Z` : value;
  const date = new Date(full);
  // Round trip: 2026-02-30 parses in some engines but is not a date.
  if (Number.isNaN(date.getTime()) || seconds(date) !== full) return null;
  return { date, granularity };
}

/** The OAI-PMH request handler: arguments in, one XML document out (always HTTP 200, errors inside). */
export function createOaiService(d: Deps) {
  const now = d.now ?? (() => new Date());
  const baseUrl = `${d.publicBaseUrl}/oai`;
  const host = new URL(d.publicBaseUrl).hostname;
  const idPrefix = `oai:${host}:`;
  const oaiIdentifier = (suffix: string) => `${idPrefix}${suffix}`;
  const suffixOf = (identifier: string) => (identifier.startsWith(idPrefix) ? identifier.slice(idPrefix.length) : null);

  const sign = (body: string) => createHmac('sha256', d.secret).update(`oai-token|${body}`).digest('base64url').slice(0, 22);
  function encodeToken(t: ListToken) {
    const body = Buffer.from(JSON.stringify(t)).toString('base64url');
    return `${body}.${sign(body)}`;
  }
  function decodeToken(token: string, verb: Verb): ListToken {
    const bad = () => fail('badResumptionToken', 'The resumptionToken is not valid: it was changed, is not one of ours, or belongs to another request.');
    const [body, mac, extra] = token.split('.');
    if (!body || !mac || extra !== undefined) return bad();
    const want = Buffer.from(sign(body));
    const got = Buffer.from(mac);
    if (want.length !== got.length || !timingSafeEqual(want, got)) return bad();
    let t: ListToken;
    try {
      t = JSON.parse(Buffer.from(body, 'base64url').toString('utf8')) as ListToken;
    } catch {
      return bad();
    }
    if (t.k !== verb) return bad();
    if (t.e * 1000 < now().getTime()) fail('badResumptionToken', 'The resumptionToken has expired; start the list again.');
    return t;
  }

  /** Turns raw arguments (repeated ones arrive as arrays) into one value per name, or a badVerb/badArgument. */
  function checkArgs(raw: Record<string, unknown>): { verb: Verb; args: Args } {
    const verbRaw = raw.verb;
    if (verbRaw === undefined) fail('badVerb', 'The verb argument is missing.');
    if (typeof verbRaw !== 'string') fail('badVerb', 'The verb argument is repeated.');
    if (!VERBS.includes(verbRaw as Verb)) fail('badVerb', `"${String(verbRaw)}" is not an OAI-PMH verb.`);
    const verb = verbRaw as Verb;
    const rule = ALLOWED[verb];
    const args: Args = {};
    const errors: OaiError[] = [];
    for (const [name, value] of Object.entries(raw)) {
      if (name === 'verb') continue;
      if (typeof value !== 'string') {
        errors.push({ code: 'badArgument', message: `The argument ${name} is repeated.` });
        continue;
      }
      if (![...rule.required, ...rule.optional, rule.exclusive].includes(name)) {
        errors.push({ code: 'badArgument', message: `${verb} does not take the argument ${name}.` });
        continue;
      }
      if (value === '') errors.push({ code: 'badArgument', message: `The argument ${name} is empty.` });
      args[name] = value;
    }
    if (!errors.length) {
      if (rule.exclusive && args[rule.exclusive] !== undefined) {
        const others = Object.keys(args).filter((n) => n !== rule.exclusive);
        if (others.length) errors.push({ code: 'badArgument', message: `${rule.exclusive} is an exclusive argument: send it alone with the verb (also sent: ${others.join(', ')}).` });
      } else {
        for (const name of rule.required) if (args[name] === undefined) errors.push({ code: 'badArgument', message: `${verb} needs the argument ${name}.` });
      }
    }
    if (errors.length) throw new OaiFailure(errors);
    return { verb, args };
  }

  function filterOf(args: Args): HarvestFilter {
    const from = args.from !== undefined ? parseDatestamp(args.from, 'from') : undefined;
    const until = args.until !== undefined ? parseDatestamp(args.until, 'until') : undefined;
    if (from === null) fail('badArgument', `from="${args.from}" is not a UTC datestamp of the form YYYY-MM-DD or YYYY-MM-DDThh:mm:ssZ.`);
    if (until === null) fail('badArgument', `until="${args.until}" is not a UTC datestamp of the form YYYY-MM-DD or YYYY-MM-DDThh:mm:ssZ.`);
    if (from && until && from.granularity !== until.granularity) fail('badArgument', 'from and until must have the same granularity.');
    if (from && until && from.date > until.date) fail('badArgument', 'from is later than until.');
    const f: HarvestFilter = { from: from?.date, until: until?.date };
    if (args.set !== undefined) {
      // Only `lab:<slug>` sets exist; any other set simply holds no records.
      if (!args.set.startsWith('lab:')) fail('noRecordsMatch', `There is no set ${args.set}; the sets are lab:<slug>.`);
      f.labSlug = args.set.slice(4);
    }
    return f;
  }

  async function envelope(verb: string | null, args: Args | null, build: (root: XMLBuilder) => void | Promise<void>) {
    const doc = create({ version: '1.0', encoding: 'UTF-8', invalidCharReplacement: '' });
    const root = doc.ele(OAI_NS, 'OAI-PMH').att(XMLNS, 'xmlns:xsi', XSI).att(XSI, 'xsi:schemaLocation', `${OAI_NS} ${OAI_SCHEMA}`);
    root.ele('responseDate').txt(seconds(now()));
    const req = root.ele('request');
    // After badVerb or badArgument the request element carries no attributes (section 3.6).
    if (verb) req.att('verb', verb);
    if (args) for (const [k, v] of Object.entries(args)) req.att(k, v);
    req.txt(baseUrl);
    await build(root);
    return doc.end({ prettyPrint: true });
  }

  function header(parent: XMLBuilder, item: HarvestItem) {
    const h = parent.ele('header');
    if (item.withdrawnAt) h.att('status', 'deleted');
    h.ele('identifier').txt(oaiIdentifier(item.suffix));
    h.ele('datestamp').txt(item.datestamp);
    h.ele('setSpec').txt(`lab:${item.labSlug}`);
  }

  type Extras = { versions: Map<string, Array<{ suffix: string; doi: string; version: number; withdrawn: boolean }>>; mediaTypes: Map<string, string[]> };

  /** Dublin Core of one release (DCMI elements; type from the DCMI Type Vocabulary). */
  function dublinCore(parent: XMLBuilder, item: HarvestItem, extras: Extras) {
    const m = item.metadata as {
      description?: string;
      keywords?: string[];
      creators?: Array<{ name: string }>;
      species?: Array<{ name: string }>;
      language?: string;
    };
    const dc = parent
      .ele(OAI_DC_NS, 'oai_dc:dc')
      .att(XMLNS, 'xmlns:dc', DC_NS)
      .att(XMLNS, 'xmlns:xsi', XSI)
      .att(XSI, 'xsi:schemaLocation', `${OAI_DC_NS} ${OAI_DC_SCHEMA}`);
    const el = (name: string, value: string | undefined | null) => {
      if (value) dc.ele(DC_NS, `dc:${name}`).txt(value);
    };
    el('title', item.title);
    for (const c of m.creators ?? []) el('creator', c.name);
    for (const k of m.keywords ?? []) el('subject', k);
    for (const s of m.species ?? []) el('subject', s.name);
    el('description', m.description);
    el('publisher', 'Cohesia');
    el('contributor', item.labName);
    el('date', item.publishedAt.toISOString().slice(0, 10));
    el('type', 'Dataset');
    for (const t of extras.mediaTypes.get(item.id) ?? []) el('format', t);
    el('identifier', `https://doi.org/${item.doi}`);
    el('identifier', `${d.publicBaseUrl}${paths.release(item.suffix)}`);
    const licence = (spdxLicences as Record<string, { name: string; url: string }>)[item.licence];
    el('rights', licence ? `${licence.name} (${item.licence}): ${licence.url}` : item.licence);
    el(
      'rights',
      item.accessLevel === 'open'
        ? 'Access: open'
        : item.accessLevel === 'restricted'
          ? 'Access: restricted (files shared on request by the depositing lab)'
          : `Access: embargoed until ${item.embargoUntil?.toISOString().slice(0, 10) ?? 'a date set by the lab'}`,
    );
    el('relation', `IsVersionOf https://doi.org/${formatDoi(d.doiPrefix, item.datasetSuffix)}`);
    // The other versions, named by the DataCite relation types the landing page and registration use.
    for (const v of extras.versions.get(item.datasetId) ?? []) {
      if (v.suffix !== item.suffix) el('relation', `${v.version < item.version ? 'IsNewVersionOf' : 'IsPreviousVersionOf'} https://doi.org/${v.doi}`);
    }
    el('language', m.language);
  }

  async function extrasFor(items: HarvestItem[]): Promise<Extras> {
    const live = items.filter((i) => !i.withdrawnAt);
    return {
      versions: await d.repo.versionsOf([...new Set(live.map((i) => i.datasetId))]),
      mediaTypes: await d.repo.mediaTypes(live.map((i) => i.id)),
    };
  }

  function record(parent: XMLBuilder, item: HarvestItem, extras: Extras) {
    const r = parent.ele('record');
    header(r, item);
    // A deleted record has a header only (section 2.5.1).
    if (!item.withdrawnAt) dublinCore(r.ele('metadata'), item, extras);
  }

  const checkPrefix = (prefix: string) => {
    if (prefix !== 'oai_dc') fail('cannotDisseminateFormat', `The metadata format "${prefix}" is not offered; use oai_dc.`);
  };

  async function list(verb: 'ListIdentifiers' | 'ListRecords', args: Args, root: XMLBuilder) {
    let filter: HarvestFilter;
    let cursor = 0;
    let after: { position: string; id: string } | undefined;
    let tokenArgs: Omit<ListToken, 'c' | 'a' | 'e' | 'k'>;
    if (args.resumptionToken !== undefined) {
      const t = decodeToken(args.resumptionToken, verb);
      tokenArgs = { f: t.f, u: t.u, s: t.s };
      filter = { from: t.f ? new Date(t.f) : undefined, until: t.u ? new Date(t.u) : undefined, labSlug: t.s };
      cursor = t.c;
      after = { position: t.a[0], id: t.a[1] };
    } else {
      checkPrefix(args.metadataPrefix);
      filter = filterOf(args);
      tokenArgs = { f: filter.from?.toISOString(), u: filter.until?.toISOString(), s: filter.labSlug };
    }
    const items = await d.repo.items(filter, d.pageSize + 1, after);
    const page = items.slice(0, d.pageSize);
    if (!page.length) {
      if (after) fail('badResumptionToken', 'The list this resumptionToken belongs to has changed and has no further records; start the list again.');
      fail('noRecordsMatch', 'No records match these arguments.');
    }
    const total = await d.repo.countItems(filter);
    const extras = verb === 'ListRecords' ? await extrasFor(page) : null;
    const el = root.ele(verb);
    for (const item of page) {
      if (extras) record(el, item, extras);
      else header(el, item);
    }
    const more = items.length > d.pageSize;
    if (more || after) {
      const rt = el.ele('resumptionToken').att('completeListSize', String(total)).att('cursor', String(cursor));
      if (more) {
        const expires = new Date(now().getTime() + d.tokenSeconds * 1000);
        const last = page.at(-1)!;
        rt.att('expirationDate', seconds(expires)).txt(encodeToken({ k: verb, ...tokenArgs, c: cursor + page.length, a: [last.position, last.id], e: Math.floor(expires.getTime() / 1000) }));
      }
    }
  }

  async function findByIdentifier(identifier: string) {
    const suffix = suffixOf(identifier);
    const item = suffix ? await d.repo.findItem(suffix) : undefined;
    if (!item) fail('idDoesNotExist', `There is no item ${identifier} in this repository.`);
    return item!;
  }

  async function respond(verb: Verb, args: Args, root: XMLBuilder) {
    switch (verb) {
      case 'Identify': {
        const el = root.ele('Identify');
        el.ele('repositoryName').txt('Cohesia');
        el.ele('baseURL').txt(baseUrl);
        el.ele('protocolVersion').txt('2.0');
        el.ele('adminEmail').txt(d.adminEmail);
        el.ele('earliestDatestamp').txt((await d.repo.earliestDatestamp()) ?? seconds(now()));
        el.ele('deletedRecord').txt('persistent');
        el.ele('granularity').txt('YYYY-MM-DDThh:mm:ssZ');
        const desc = el
          .ele('description')
          .ele(OAI_ID_NS, 'oai-identifier')
          .att(XMLNS, 'xmlns:xsi', XSI)
          .att(XSI, 'xsi:schemaLocation', `${OAI_ID_NS} ${OAI_ID_SCHEMA}`);
        desc.ele('scheme').txt('oai');
        desc.ele('repositoryIdentifier').txt(host);
        desc.ele('delimiter').txt(':');
        desc.ele('sampleIdentifier').txt(oaiIdentifier('cx.4X7K-P9MQ5.v1'));
        return;
      }
      case 'ListMetadataFormats': {
        if (args.identifier !== undefined) {
          const item = await findByIdentifier(args.identifier);
          // A withdrawn release keeps only its header: no metadata is disseminated for it any more.
          if (item.withdrawnAt) fail('noMetadataFormats', `${args.identifier} was withdrawn; only its deleted-record header remains.`);
        }
        const f = root.ele('ListMetadataFormats').ele('metadataFormat');
        f.ele('metadataPrefix').txt('oai_dc');
        f.ele('schema').txt(OAI_DC_SCHEMA);
        f.ele('metadataNamespace').txt(OAI_DC_NS);
        return;
      }
      case 'ListSets': {
        // The sets all fit in one answer, so no resumptionToken is ever issued for them.
        if (args.resumptionToken !== undefined) fail('badResumptionToken', 'ListSets answers in one response; this resumptionToken is not one of ours.');
        const labs = await d.repo.labsWithReleases();
        const el = root.ele('ListSets');
        for (const lab of labs) {
          const s = el.ele('set');
          s.ele('setSpec').txt(`lab:${lab.slug}`);
          s.ele('setName').txt(lab.name);
          if (lab.description) {
            const dc = s
              .ele('setDescription')
              .ele(OAI_DC_NS, 'oai_dc:dc')
              .att(XMLNS, 'xmlns:dc', DC_NS)
              .att(XMLNS, 'xmlns:xsi', XSI)
              .att(XSI, 'xsi:schemaLocation', `${OAI_DC_NS} ${OAI_DC_SCHEMA}`);
            dc.ele(DC_NS, 'dc:description').txt(lab.description);
          }
        }
        return;
      }
      case 'ListIdentifiers':
      case 'ListRecords':
        return list(verb, args, root);
      case 'GetRecord': {
        const errors: OaiError[] = [];
        let item: HarvestItem | undefined;
        try {
          item = await findByIdentifier(args.identifier);
        } catch (e) {
          if (!(e instanceof OaiFailure)) throw e;
          errors.push(...e.errors);
        }
        if (args.metadataPrefix !== 'oai_dc') errors.push({ code: 'cannotDisseminateFormat', message: `The metadata format "${args.metadataPrefix}" is not offered; use oai_dc.` });
        if (errors.length) throw new OaiFailure(errors);
        record(root.ele('GetRecord'), item!, await extrasFor([item!]));
        return;
      }
    }
  }

  return {
    baseUrl,
    oaiIdentifier,
    /** One protocol request; `raw` is the query (GET) or the form body (POST). */
    async handle(raw: Record<string, unknown>): Promise<string> {
      let checked: { verb: Verb; args: Args };
      try {
        checked = checkArgs(raw);
      } catch (e) {
        if (!(e instanceof OaiFailure)) throw e;
        return envelope(null, null, (root) => errorElements(root, e.errors));
      }
      const { verb, args } = checked;
      try {
        return await envelope(verb, args, (root) => respond(verb, args, root));
      } catch (e) {
        if (!(e instanceof OaiFailure)) throw e;
        // An error replaces the whole answer; after badArgument the request is echoed without attributes.
        const badArgument = e.errors.some((x) => x.code === 'badArgument');
        return envelope(badArgument ? null : verb, badArgument ? null : args, (root) => errorElements(root, e.errors));
      }
    },
  };
}

function errorElements(root: XMLBuilder, errors: OaiError[]) {
  for (const e of errors) root.ele('error').att('code', e.code).txt(e.message);
}

export type OaiService = ReturnType<typeof createOaiService>;
