import type { ReleaseScalars } from '../../../shared/contracts/comparisons';

/** One scalar statistic as a column of the table and an axis of the scaling view, with its SI unit. */
export type ScalarColumn = { key: keyof ReleaseScalars; label: string; unit: string; digits?: number; positive?: boolean };

export const scalarColumns: ScalarColumn[] = [
  { key: 'individuals', label: 'Individuals per frame (mean)', unit: '', positive: true },
  { key: 'individualsMax', label: 'Individuals per frame (max)', unit: '', positive: true },
  { key: 'tracks', label: 'Tracks', unit: '', positive: true },
  { key: 'durationS', label: 'Duration', unit: 's', positive: true },
  { key: 'frameRateHz', label: 'Frame rate', unit: 'Hz', positive: true },
  { key: 'dimension', label: 'Dimension', unit: 'D' },
  { key: 'radiusM', label: 'RMS radius', unit: 'm', positive: true },
  { key: 'meanSpeedMS', label: 'Mean speed', unit: 'm/s', positive: true },
  { key: 'speedKurtosis', label: 'Speed kurtosis', unit: '', positive: true },
  { key: 'polarization', label: 'Polarization', unit: '', positive: true },
  { key: 'milling', label: 'Milling', unit: '', positive: true },
  { key: 'nearestNeighbourM', label: 'Nearest-neighbour distance (mean)', unit: 'm', positive: true },
  { key: 'numberDensity', label: 'Number density in the RMS radius', unit: 'm⁻³ (3D) / m⁻² (2D)', positive: true },
  { key: 'springConstantS2', label: 'Spring constant K', unit: 's⁻²' },
  { key: 'springConstantStandardError', label: 'K standard error', unit: 's⁻²', positive: true },
  { key: 'springConstantRSquared', label: 'K fit R²', unit: '' },
  { key: 'autocorrelationTimeS', label: 'Velocity autocorrelation time (1/e)', unit: 's', positive: true },
  { key: 'firstZeroCrossingS', label: 'Autocorrelation first zero', unit: 's', positive: true },
  { key: 'pairedFraction', label: 'Fraction ever in a pair', unit: '', positive: true },
];

export const columnHeader = (c: ScalarColumn) => (c.unit && c.unit !== 'D' ? `${c.label} (${c.unit})` : c.label);
export const columnByKey = (key: string) => scalarColumns.find((c) => c.key === key);
