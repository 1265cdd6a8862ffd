import { formatBytes } from '../../shared/billing-format';

type Meta = Record<string, any>;

const COLUMNS: Array<[string, string]> = [
  ['track_id', 'identifier of the individual (track)'],
  ['frame', 'frame number'],
  ['t', 'time in s'],
  ['x, y, z', 'position'],
  ['vx, vy, vz', 'velocity (position unit per s)'],
  ['ax, ay, az', 'acceleration (position unit per s²)'],
];

/** The human-readable README.txt of a bundle: what, who, the column dictionary, licence and citation. */
export function releaseReadme(r: {
  title: string;
  doi: string;
  conceptDoi: string;
  version: number;
  publishedAt: Date;
  licence: { id: string; name: string; url: string | null };
  metadata: Meta;
  files: Array<{ path: string; sizeBytes: number; sha256: string }>;
  citation: string;
  landingUrl: string;
}): string {
  const m = r.metadata;
  const lines = [
    r.title,
    '='.repeat(Math.min(78, r.title.length)),
    '',
    `Identifier: ${r.doi} (version ${r.version}); all versions: ${r.conceptDoi}`,
    `Published: ${r.publishedAt.toISOString().slice(0, 10)} on Cohesia, ${r.landingUrl}`,
    '',
    String(m.description ?? ''),
    '',
    'Creators',
    '--------',
    ...(m.creators ?? []).map((c: Meta) => `- ${c.name}${c.orcid ? ` (ORCID ${c.orcid})` : ''}${c.affiliation?.name ? `, ${c.affiliation.name}` : ''}`),
    '',
    'Recording',
    '---------',
    `Species: ${(m.species ?? []).map((s: Meta) => s.name).join(', ')}`,
    `Group type: ${m.groupType ?? '–'}; setting: ${m.setting ?? '–'}`,
    `Dimension: ${m.dimension ?? '–'}D; positions in ${m.units ?? '–'}${m.units === 'px' && m.pixelSize ? ` (1 px = ${m.pixelSize} m)` : ''}; frame rate ${m.frameRate ?? '–'} frames/s; axis pointing up: ${m.gravityAxis ?? 'not given'}`,
    '',
    'Columns of the trajectory tables',
    '--------------------------------',
    'One row per individual per frame. Files may name these columns differently; data/metadata/statistics.json records the mapping Cohesia used.',
    ...COLUMNS.map(([c, d]) => `- ${c}: ${d}`),
    '',
    'Files',
    '-----',
    ...r.files.map((f) => `- ${f.path} (${formatBytes(f.sizeBytes)}, SHA-256 ${f.sha256})`),
    '',
    'Licence',
    '-------',
    `${r.licence.name} (SPDX ${r.licence.id})${r.licence.url ? `: ${r.licence.url}` : ''}`,
    '',
    'How to cite',
    '-----------',
    r.citation,
    'Machine-readable: data/metadata/CITATION.cff',
    '',
    'This bundle is a bag in BagIt layout (RFC 8493): check it with any BagIt tool; manifest-sha256.txt and manifest-sha512.txt list every payload file.',
    '',
  ];
  return lines.join('\n');
}
