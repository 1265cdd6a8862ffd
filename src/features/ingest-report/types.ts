import type { QuickLook } from '../../../shared/engine/quick-look';

// The parts of the engine's result document (schemas/ingest-result.schema.json)
// this feature reads. Numbers the engine could not compute arrive as null.
type Num = number | null;
export type TimeSeries = { t: Num[]; y: Num[] };
export type Histogram = { edges: Num[]; density: Num[] };
export type VelocityComponent = { name: string; mean: Num; standardDeviation: Num };
export type PairEvent = { a: string; b: string; startS: number; endS: number; durationS: number; meanSeparation: Num; oscillationFrequencyHz: Num };

export interface IngestReportResult {
  status?: string;
  parameters?: { dims?: 2 | 3; fps?: Num } | null;
  summary?: {
    durationS?: Num;
    velocity?: { components?: VelocityComponent[] } | null;
    springConstant?: { throughOrigin?: { springConstant: Num; standardError: Num; rSquared: Num } | null } | null;
    autocorrelation?: { firstZeroCrossingS?: Num; eFoldingTimeS?: Num } | null;
    pairs?: { distanceThreshold?: Num; minDurationS?: Num; events?: Num; eventsListed?: Num } | null;
  } | null;
  series?: {
    time?: Partial<Record<'individuals' | 'radius' | 'meanSpeed' | 'polarization' | 'milling' | 'meanNearestNeighbour', TimeSeries>> | null;
    histograms?: Partial<Record<'vx' | 'vy' | 'vz' | 'speed' | 'nearestNeighbour', Histogram>> | null;
    profiles?: {
      radialDensity?: { r: Num[]; density: Num[] } | null;
      speedVsDistance?: { r: Num[]; meanSpeed: Num[]; count: Num[] } | null;
      radialAcceleration?: { r: Num[]; meanRadialAcceleration: Num[]; count: Num[] } | null;
    } | null;
    autocorrelation?: { lagS: Num[]; rho: Num[] } | null;
  } | null;
  pairs?: { events: PairEvent[] } | null;
  quickLook?: QuickLook | null;
}
