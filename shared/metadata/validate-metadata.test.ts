import { describe, expect, it } from 'vitest';
import { licenceOptions, validateMetadata } from './validate-metadata';

const valid = {
  schemaVersion: '1.0.0',
  title: 'Dusk swarms of Culex pipiens over the Fenmoor markers, summer 2026',
  description: 'Three-camera recordings of male mosquito swarms at dusk over black ground markers. Synthetic demo data.',
  creators: [{ name: 'Ilse Marten', orcid: '0000-0002-1825-0097', affiliation: { name: 'University of Harrowgate', rorId: 'https://ror.org/05dxps055' } }],
  contact: { name: 'Ilse Marten', email: 'ilse.marten@fenmoor.example' },
  keywords: ['swarm', 'mosquito'],
  species: [{ name: 'Culex pipiens', taxonId: 'NCBITaxon:7175' }],
  groupType: 'swarm',
  setting: 'field',
  site: { place: 'Fenmoor lakeside station', latitude: 54.2, longitude: -2.9 },
  recordingDates: { start: '2026-06-14', end: '2026-06-30' },
  numberOfIndividuals: 40,
  dimension: 3,
  units: 'mm',
  frameRate: 100,
  gravityAxis: 'z',
  licence: 'CC-BY-4.0',
  access: { level: 'open' },
};

describe('validateMetadata(doc)', () => {
  it('accepts a complete document', () => {
    expect(validateMetadata(valid)).toEqual([]);
  });

  it('names every missing required field by path, in plain words', () => {
    const problems = validateMetadata({ title: 'Ok title' });
    const paths = problems.map((p) => p.path);
    expect(paths).toEqual(expect.arrayContaining(['/description', '/creators', '/contact', '/species', '/licence', '/access', '/frameRate']));
    expect(problems.find((p) => p.path === '/frameRate')?.message).toBe('Frame rate (frames/s) is required.');
  });

  it('checks the ORCID check digit, the SPDX id, the ROR form and dates', () => {
    const doc = structuredClone(valid);
    doc.creators[0].orcid = '0000-0002-1825-0098';
    doc.creators[0].affiliation.rorId = 'ror:05dxps055';
    doc.licence = 'CC-BY-9.9';
    doc.recordingDates.start = '14/06/2026';
    const byPath = Object.fromEntries(validateMetadata(doc).map((p) => [p.path, p.message]));
    expect(byPath['/creators/0/orcid']).toMatch(/not a valid ORCID iD/);
    expect(byPath['/creators/0/affiliation/rorId']).toMatch(/https:\/\/ror\.org/);
    expect(byPath['/licence']).toMatch(/SPDX/);
    expect(byPath['/recordingDates/start']).toMatch(/YYYY-MM-DD/);
  });

  it('requires an embargo date for embargoed data and a pixel size for pixel units', () => {
    const doc = { ...structuredClone(valid), access: { level: 'embargoed' }, units: 'px' };
    const paths = validateMetadata(doc).map((p) => p.path);
    expect(paths).toContain('/access/embargoUntil');
    expect(paths).toContain('/pixelSize');
  });

  it('refuses unknown fields and wrong kinds of value', () => {
    const doc = { ...structuredClone(valid), dimension: 4, numberOfIndividuals: 2.5, colour: 'blue' };
    const messages = validateMetadata(doc).map((p) => p.message);
    expect(messages).toEqual(expect.arrayContaining(['Dimension must be one of: 2, 3.', 'Number of individuals must be a whole number.', '"colour" is not a field of this form.']));
  });

  it('offers the SPDX licence list (SPDX License List, via the spdx-license-list package)', () => {
    expect(licenceOptions.find((l) => l.id === 'CC0-1.0')?.name).toMatch(/Universal/);
    expect(licenceOptions.length).toBeGreaterThan(400);
  });
});
