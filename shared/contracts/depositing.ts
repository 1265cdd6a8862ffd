import { z } from 'zod';

export const createDatasetInput = z.object({
  title: z.string().trim().min(3, 'Give the dataset a title of at least 3 characters').max(300),
  summary: z.string().trim().max(1000, 'Keep the short description under 1,000 characters').default(''),
});
export type CreateDatasetInput = z.input<typeof createDatasetInput>;

export const FILE_ROLES = ['trajectories', 'supplementary'] as const;

/** 5 TB: the largest object S3 allows, and far above any trajectory file. */
const MAX_FILE_BYTES = 5 * 1024 ** 4;

export const startUploadInput = z.object({
  fileName: z.string().min(1, 'The file needs a name').max(500),
  size: z.number().int().positive('The file is empty').max(MAX_FILE_BYTES),
  mediaType: z.string().max(200).default('application/octet-stream'),
  role: z.enum(FILE_ROLES).default('trajectories'),
});
export type StartUploadInput = z.input<typeof startUploadInput>;

export const signPartsInput = z.object({ partNumbers: z.array(z.number().int().min(1).max(10_000)).min(1).max(200) });

export const completeUploadInput = z.object({
  parts: z.array(z.object({ partNumber: z.number().int().min(1).max(10_000), etag: z.string().min(1).max(200) })).min(1).max(10_000),
});

const STANDARD = ['track_id', 'frame', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const;

/** What the column-mapping step sends: which file column holds what, and the units. */
export const ingestOptionsInput = z.object({
  mapping: z.partialRecord(z.enum(STANDARD), z.union([z.string().min(1).max(200), z.number().int().min(0).max(1000)])).optional(),
  hasHeader: z.boolean().nullable().optional(),
  units: z.enum(['m', 'cm', 'mm', 'px']).optional(),
  pixelScale: z.number().positive().nullable().optional(),
  fps: z.number().positive().max(100_000).nullable().optional(),
  dims: z.union([z.literal(2), z.literal(3)]).nullable().optional(),
  gravityAxis: z.enum(['x', 'y', 'z']).nullable().optional(),
});
export type IngestOptionsInput = z.infer<typeof ingestOptionsInput>;

export const saveMetadataInput = z.object({ metadata: z.record(z.string(), z.unknown()) });

export const commentInput = z.object({ body: z.string().trim().min(1, 'Write a comment').max(5000) });
export const returnDraftInput = z.object({ body: z.string().trim().min(5, 'Tell the depositor what to change').max(5000) });
export const publishInput = z.object({ changelog: z.string().trim().max(5000).default('') });
export const withdrawInput = z.object({ reason: z.string().trim().min(10, 'Give the reason readers will see (at least 10 characters)').max(2000) });

export type MetadataProblem = { path: string; field: string; message: string };

export type DatasetListItem = {
  id: string;
  title: string;
  summary: string;
  suffix: string;
  doi: string;
  openDraft: { id: string; state: string } | null;
  latestVersion: number | null;
  updatedAt: string;
};

export type DraftFileView = {
  id: string;
  fileName: string;
  role: 'trajectories' | 'supplementary';
  mediaType: string;
  declaredSize: number;
  sizeBytes: number | null;
  sha256: string | null;
  state: string;
  errorMessage: string | null;
  job: { state: string; progress: number; phase: string; attempts: number; lastError: string | null } | null;
  // From the ingest result, when there is one.
  status: 'ok' | 'invalid' | null;
  errors: number;
  warnings: number;
  summary: Record<string, unknown> | null;
  // What the engine found: frame rate, dimension and duration, for checking the metadata.
  measured: { fps: number | null; dims: number | null; durationS: number | null } | null;
  carriedOver: boolean;
};

export type DraftView = {
  id: string;
  state: string;
  dataset: { id: string; title: string; summary: string; suffix: string; doi: string };
  metadata: Record<string, unknown>;
  problems: MetadataProblem[];
  files: DraftFileView[];
  comments: Array<{ id: string; kind: string; body: string; author: string; createdAt: string }>;
  baseVersion: number | null;
  changelog: string;
  canSubmit: boolean;
  blockers: string[];
  uploadPartSize: number;
};
