/**
 * The categorical scale of every plot and of the quick-look player: Okabe & Ito,
 * "Color Universal Design" (2002), safe for the common colour-vision deficiencies.
 * Ordered for a white ground: yellow, the palest, comes last.
 */
export const categorical = ['#0072B2', '#E69F00', '#009E73', '#D55E00', '#56B4E9', '#CC79A7', '#000000', '#F0E442'] as const;

/** The colour of the n-th series or track, cycling through the scale. */
export const seriesColour = (n: number): string => categorical[((n % categorical.length) + categorical.length) % categorical.length];
