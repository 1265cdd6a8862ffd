import { z } from 'zod';

/** Most releases one comparison holds: the table and the overlaid plots stay readable. */
export const MAX_COMPARED_RELEASES = 12;

const suffixes = z
  .array(z.string().trim().min(1, 'A release suffix is empty.').max(100, 'A release suffix is too long.'))
  .min(1, 'Pick at least one release to compare.')
  .max(MAX_COMPARED_RELEASES, `A comparison holds at most ${MAX_COMPARED_RELEASES} releases.`)
  .refine((s) => new Set(s).size === s.length, 'A release appears twice in this comparison.');

/** Saving a comparison, or changing a saved one. */
export const comparisonInput = z.object({
  title: z.string().trim().min(1, 'Give the comparison a title.').max(200, 'The title is longer than 200 characters.'),
  releases: suffixes,
});
export type ComparisonInput = z.infer<typeof comparisonInput>;

/** The releases of an unsaved comparison (the browser's basket), as `?releases=a,b,c`. */
export const comparisonQuery = z.object({
  releases: z
    .string({ error: 'Give the releases to compare as ?releases=suffix1,suffix2.' })
    .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))
    .pipe(suffixes),
});

const n = z.number().nullable();

/** The scalar statistics of one release in SI units (null where the engine did not compute it). */
export const releaseScalars = z.object({
  individuals: n,
  individualsMax: n,
  tracks: n,
  durationS: n,
  frameRateHz: n,
  dimension: n,
  radiusM: n,
  meanSpeedMS: n,
  speedKurtosis: n,
  polarization: n,
  milling: n,
  nearestNeighbourM: n,
  // Individuals per m³ (3D) or per m² (2D) inside the RMS radius.
  numberDensity: n,
  springConstantS2: n,
  springConstantStandardError: n,
  springConstantRSquared: n,
  autocorrelationTimeS: n,
  firstZeroCrossingS: n,
  pairedFraction: n,
});
export type ReleaseScalars = z.infer<typeof releaseScalars>;

/** One release as a row of the comparison table or a point of the scaling view. */
export const comparedRelease = z.object({
  suffix: z.string(),
  doi: z.string(),
  title: z.string(),
  version: z.number(),
  accessLevel: z.enum(['open', 'restricted', 'embargoed']),
  lab: z.object({ name: z.string(), slug: z.string() }).nullable(),
  groupType: z.string().nullable(),
  species: z.array(z.string()),
  // The trajectory file the numbers come from (the one with the most frames) and its declared length unit.
  fileName: z.string().nullable(),
  declaredUnit: z.string().nullable(),
  metresPerUnit: n,
  scalars: releaseScalars,
});
export type ComparedRelease = z.infer<typeof comparedRelease>;

const xy = z.object({ x: z.array(z.number().nullable()), y: z.array(z.number().nullable()) });

/** The distributions and profiles overlaid on the comparison page, in SI or normalised units. */
export const releaseCurves = z.object({
  suffix: z.string(),
  // Speed over its mean: density of v/⟨v⟩.
  speed: xy.nullable(),
  // Each component standardised: density of (u − ū)/σ_u.
  components: z.array(xy.extend({ name: z.string() })),
  radialDensity: xy.nullable(),
  radialAcceleration: xy.nullable(),
  autocorrelation: xy.nullable(),
});
export type ReleaseCurves = z.infer<typeof releaseCurves>;

/** A comparison as the viewer may see it. */
export const comparisonView = z.object({
  id: z.string().nullable(),
  title: z.string().nullable(),
  owner: z.object({ name: z.string() }).nullable(),
  mine: z.boolean(),
  createdAt: z.string().nullable(),
  updatedAt: z.string().nullable(),
  releases: z.array(comparedRelease),
  curves: z.array(releaseCurves),
  // How many releases of the comparison are left out because this viewer may not see their statistics.
  hidden: z.number(),
});
export type ComparisonView = z.infer<typeof comparisonView>;

export const comparisonSummary = z.object({ id: z.string(), title: z.string(), releases: z.array(z.string()), createdAt: z.string(), updatedAt: z.string() });
export const comparisonList = z.object({ items: z.array(comparisonSummary) });
export type ComparisonSummary = z.infer<typeof comparisonSummary>;

/** Every release whose statistics are public, one row each, for the scaling view. */
export const scalingData = z.object({ items: z.array(comparedRelease) });
export type ScalingData = z.infer<typeof scalingData>;
