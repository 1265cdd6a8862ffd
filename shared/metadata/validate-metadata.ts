import type { ErrorObject } from 'ajv/dist/2020';
import { fullFormats } from 'ajv-formats/dist/formats';
import spdxLicences from 'spdx-license-list';
import schema from '../../schemas/dataset-metadata.schema.json';
import { isValidOrcid } from '../orcid';
import { createMetadataValidator } from './metadata-validator.generated';

export const METADATA_SCHEMA_VERSION = '1.0.0';
export const metadataSchema = schema;

export type MetadataProblem = { path: string; field: string; message: string };

// ajv's code for the schema, compiled ahead of time: the browser's CSP forbids compiling it at run time
// (new Function). Regenerate with `npm run metadata:compile`; a unit test fails when it is stale.
const validate = createMetadataValidator({
  date: fullFormats.date,
  orcid: { validate: isValidOrcid },
  'spdx-licence': { validate: (v: string) => Object.hasOwn(spdxLicences, v) },
}) as { (doc: unknown): boolean; errors?: ErrorObject[] | null };

const titleAt = (instancePath: string): string => {
  let node: any = schema;
  for (const part of instancePath.split('/').filter(Boolean)) {
    if (node?.type === 'array' || node?.items) node = node.items;
    else node = node?.properties?.[part];
  }
  return node?.title ?? (instancePath.split('/').pop() || 'This field');
};

/** Plain-language wording of one ajv error, for a biologist filling the form. */
function explain(e: ErrorObject): MetadataProblem {
  let path = e.instancePath;
  if (e.keyword === 'required') path = `${path}/${(e.params as { missingProperty: string }).missingProperty}`;
  const field = titleAt(path);
  const p = e.params as Record<string, unknown>;
  const message = (() => {
    switch (e.keyword) {
      case 'required':
        return `${field} is required.`;
      case 'minLength':
        return `${field} needs at least ${p.limit} characters.`;
      case 'maxLength':
        return `${field} can have at most ${p.limit} characters.`;
      case 'minItems':
        return `Add at least ${p.limit} ${field.toLowerCase()} entr${p.limit === 1 ? 'y' : 'ies'}.`;
      case 'maxItems':
        return `${field} can have at most ${p.limit} entries.`;
      case 'enum':
        return `${field} must be one of: ${(p.allowedValues as unknown[]).join(', ')}.`;
      case 'const':
        return `${field} must be ${JSON.stringify(p.allowedValue)}.`;
      case 'type':
        return `${field} must be ${p.type === 'integer' ? 'a whole number' : p.type === 'number' ? 'a number' : `a ${p.type}`}.`;
      case 'minimum':
      case 'exclusiveMinimum':
        return `${field} must be ${e.keyword === 'minimum' ? 'at least' : 'more than'} ${p.limit}.`;
      case 'maximum':
      case 'exclusiveMaximum':
        return `${field} must be ${e.keyword === 'maximum' ? 'at most' : 'less than'} ${p.limit}.`;
      case 'uniqueItems':
        return `${field} lists the same entry twice.`;
      case 'additionalProperties':
        return `"${p.additionalProperty}" is not a field of this form.`;
      case 'format':
        return (
          {
            orcid: `${field} is not a valid ORCID iD (form 0000-0002-1825-0097; the last character is a check digit).`,
            'spdx-licence': `${field} is not an SPDX licence identifier (for example CC-BY-4.0 or CC0-1.0).`,
            date: `${field} must be a date written YYYY-MM-DD.`,
            email: `${field} must be an e-mail address.`,
          }[String(p.format)] ?? `${field} is not in the expected form.`
        );
      case 'pattern':
        return path.endsWith('/rorId')
          ? `${field} must look like https://ror.org/05dxps055.`
          : path.endsWith('/identifier')
            ? `${field} must be a DOI such as 10.1234/abcd.`
            : `${field} is not in the expected form.`;
      default:
        return `${field}: ${e.message ?? 'not valid'}.`;
    }
  })();
  return { path, field, message };
}

/**
 * Validates a metadata document against the JSON Schema (the same code runs
 * in the form and, authoritatively, on the server). Returns every problem
 * with its JSON Pointer, or an empty list.
 */
export function validateMetadata(doc: unknown): MetadataProblem[] {
  if (validate(doc)) return [];
  const seen = new Set<string>();
  return (validate.errors ?? [])
    .filter((e) => e.keyword !== 'if')
    .map(explain)
    .filter((p) => (seen.has(p.path + p.message) ? false : (seen.add(p.path + p.message), true)));
}

/** SPDX identifiers with names, for the licence picker. */
export const licenceOptions = Object.entries(spdxLicences as Record<string, { name: string; osiApproved: boolean }>).map(([id, l]) => ({
  id,
  name: l.name,
}));
