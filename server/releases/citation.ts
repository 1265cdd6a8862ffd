// citation-js has no type declarations; see citation-js.d.ts beside this file.
import { LRUCache } from 'lru-cache';
import { Cite, plugins } from '@citation-js/core';
import '@citation-js/plugin-bibtex';
import '@citation-js/plugin-ris';
import '@citation-js/plugin-csl';
import YAML from 'yaml';
import spdxLicences from 'spdx-license-list';

export type CitableRelease = {
  doi: string;
  conceptDoi: string;
  version: number;
  title: string;
  description: string;
  publishedAt: Date;
  licence: string;
  url: string;
  keywords: string[];
  creators: Array<{ name: string; orcid?: string; affiliation?: { name: string; rorId?: string } }>;
  publisher: string;
};

void plugins; // the imports above register the formats

/** "Ilse Marten" → given "Ilse", family "Marten"; a single word stays a literal name. */
function splitName(name: string): { given?: string; family?: string; literal?: string } {
  const parts = name.trim().replace(/^(Dr|Prof)\.?\s+/i, '').split(/\s+/);
  if (parts.length < 2) return { literal: name.trim() };
  return { given: parts.slice(0, -1).join(' '), family: parts.at(-1) };
}

/** The release as a CSL-JSON item (the citation data model used by citation-js). */
export function toCsl(r: CitableRelease) {
  const d = r.publishedAt;
  return {
    id: r.doi,
    type: 'dataset',
    title: r.title,
    abstract: r.description,
    author: r.creators.map((c) => splitName(c.name)),
    issued: { 'date-parts': [[d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate()]] },
    DOI: r.doi,
    URL: r.url,
    version: String(r.version),
    publisher: r.publisher,
    keyword: r.keywords.join(', '),
  };
}

export const CITATION_STYLES = { apa: 'APA', vancouver: 'Vancouver', harvard1: 'Harvard' } as const;

// Formatting through citation-js costs tens of milliseconds and a release never changes, so each
// result is kept, keyed by its whole input (bounded: the least recently used go first).
const formatted = new LRUCache<string, ReturnType<typeof formatCitations>>({ max: 5000 });

/** Formatted citations in several styles, and the export formats. */
export function citations(r: CitableRelease) {
  const key = JSON.stringify(r);
  let out = formatted.get(key);
  if (!out) formatted.set(key, (out = formatCitations(r)));
  return out;
}

function formatCitations(r: CitableRelease) {
  const cite = new Cite(toCsl(r));
  const styles = Object.fromEntries(
    Object.keys(CITATION_STYLES).map((template) => [template, String(cite.format('bibliography', { format: 'text', template, lang: 'en-US' })).trim()]),
  ) as Record<keyof typeof CITATION_STYLES, string>;
  return {
    styles,
    bibtex: String(cite.format('bibtex')),
    ris: String(cite.format('ris')),
    cslJson: JSON.stringify([toCsl(r)], null, 2),
    cff: citationCff(r),
  };
}

/** CITATION.cff (Citation File Format 1.2.0) for the release. */
export function citationCff(r: CitableRelease): string {
  const licenceKnown = Object.hasOwn(spdxLicences, r.licence);
  const doc = {
    'cff-version': '1.2.0',
    message: 'If you use this dataset, please cite it as below.',
    type: 'dataset',
    title: r.title,
    version: String(r.version),
    doi: r.doi,
    'date-released': r.publishedAt.toISOString().slice(0, 10),
    ...(licenceKnown ? { license: r.licence } : {}),
    url: r.url,
    abstract: r.description,
    keywords: r.keywords.length ? r.keywords : undefined,
    authors: r.creators.map((c) => {
      const n = splitName(c.name);
      return {
        ...(n.literal ? { name: n.literal } : { 'given-names': n.given, 'family-names': n.family }),
        ...(c.orcid ? { orcid: `https://orcid.org/${c.orcid}` } : {}),
        ...(c.affiliation?.name ? { affiliation: c.affiliation.name } : {}),
      };
    }),
    identifiers: [{ type: 'doi', value: r.conceptDoi, description: 'All versions of this dataset' }],
  };
  return YAML.stringify(JSON.parse(JSON.stringify(doc)));
}

/** schema.org `Dataset` description for the landing page (JSON-LD). */
export function datasetJsonLd(r: CitableRelease & { accessLevel: string; files: Array<{ fileName: string; sizeBytes: number; mediaType: string }>; species: string[]; catalogUrl: string }) {
  const licence = (spdxLicences as Record<string, { url: string }>)[r.licence];
  return {
    '@context': 'https://schema.org',
    '@type': 'Dataset',
    '@id': `https://doi.org/${r.doi}`,
    name: r.title,
    description: r.description,
    identifier: `https://doi.org/${r.doi}`,
    url: r.url,
    version: String(r.version),
    datePublished: r.publishedAt.toISOString().slice(0, 10),
    license: licence?.url ?? r.licence,
    keywords: [...r.keywords, ...r.species],
    creator: r.creators.map((c) => ({
      '@type': 'Person',
      name: c.name,
      ...(c.orcid ? { identifier: `https://orcid.org/${c.orcid}` } : {}),
      ...(c.affiliation?.name ? { affiliation: { '@type': 'Organization', name: c.affiliation.name, ...(c.affiliation.rorId ? { identifier: c.affiliation.rorId } : {}) } } : {}),
    })),
    isPartOf: { '@type': 'Dataset', identifier: `https://doi.org/${r.conceptDoi}`, name: `${r.title} (all versions)` },
    isAccessibleForFree: true,
    conditionsOfAccess: r.accessLevel === 'open' ? 'Open access' : r.accessLevel === 'restricted' ? 'Files on request, decided by the depositing lab' : 'Files under embargo',
    includedInDataCatalog: { '@type': 'DataCatalog', name: r.publisher, url: r.catalogUrl },
    distribution: r.files.map((f) => ({ '@type': 'DataDownload', name: f.fileName, encodingFormat: f.mediaType, contentSize: `${f.sizeBytes} B` })),
  };
}
