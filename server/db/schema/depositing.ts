import { sql } from 'drizzle-orm';
import { bigint, index, integer, jsonb, pgTable, real, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';
import { timestamps } from './columns';

/** A lab's series of releases; holds the all-versions identifier suffix. */
export const dataset = pgTable(
  'dataset',
  {
    id: text().primaryKey(),
    labId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'restrict' }),
    suffix: text().notNull().unique(),
    title: text().notNull(),
    summary: text().notNull().default(''),
    createdBy: text()
      .notNull()
      .references(() => user.id),
    ...timestamps,
  },
  (t) => [index('dataset_lab_idx').on(t.labId)],
);

export const DRAFT_STATES = ['editing', 'submitted', 'returned', 'published', 'discarded'] as const;
export type DraftState = (typeof DRAFT_STATES)[number];

/** The mutable working copy of a dataset: metadata + files. Never public. */
export const draft = pgTable(
  'draft',
  {
    id: text().primaryKey(),
    datasetId: text()
      .notNull()
      .references(() => dataset.id, { onDelete: 'cascade' }),
    state: text({ enum: DRAFT_STATES }).notNull().default('editing'),
    metadata: jsonb().$type<Record<string, unknown>>().notNull().default({}),
    // The release this draft started from (a new version), if any.
    baseReleaseId: text(),
    changelog: text().notNull().default(''),
    createdBy: text()
      .notNull()
      .references(() => user.id),
    submittedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    // At most one open draft per dataset.
    uniqueIndex('draft_one_open_per_dataset').on(t.datasetId).where(sql`state in ('editing', 'submitted', 'returned')`),
  ],
);

/** Comments on a draft: review notes, submissions and returns. */
export const draftComment = pgTable('draft_comment', {
  id: text().primaryKey(),
  draftId: text()
    .notNull()
    .references(() => draft.id, { onDelete: 'cascade' }),
  authorId: text()
    .notNull()
    .references(() => user.id),
  kind: text({ enum: ['comment', 'submitted', 'returned', 'published'] }).notNull(),
  body: text().notNull(),
  createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
});

export const FILE_STATES = ['uploading', 'verifying', 'queued', 'ingesting', 'ready', 'invalid', 'failed', 'stored'] as const;
export type FileState = (typeof FILE_STATES)[number];

/**
 * A file of a draft. Its bytes live in the object store under a key the
 * server chose; a new version's draft points at the same key (carried over by
 * reference, never copied).
 */
export const draftFile = pgTable(
  'draft_file',
  {
    id: text().primaryKey(),
    draftId: text()
      .notNull()
      .references(() => draft.id, { onDelete: 'cascade' }),
    fileName: text().notNull(),
    objectKey: text().notNull(),
    role: text({ enum: ['trajectories', 'supplementary'] }).notNull(),
    mediaType: text().notNull(),
    declaredSize: bigint({ mode: 'number' }).notNull(),
    sizeBytes: bigint({ mode: 'number' }),
    sha256: text(),
    state: text({ enum: FILE_STATES }).notNull().default('uploading'),
    uploadId: text(),
    reservationId: text(),
    // Column mapping, units, fps, dimension, gravity axis chosen by the user.
    ingestOptions: jsonb().$type<Record<string, unknown>>().notNull().default({}),
    // The engine's result document (validation report, statistics, quick look).
    result: jsonb().$type<Record<string, unknown>>(),
    errorMessage: text(),
    ...timestamps,
  },
  (t) => [index('draft_file_draft_idx').on(t.draftId), uniqueIndex('draft_file_name_per_draft').on(t.draftId, t.fileName)],
);

export const JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;

/**
 * Background jobs as rows. Workers claim a job with `FOR UPDATE SKIP LOCKED`,
 * renew `heartbeatAt` while they work, and a job whose heartbeat is stale
 * (its worker died) is claimed again.
 */
export const job = pgTable(
  'job',
  {
    id: text().primaryKey(),
    kind: text().notNull(),
    payload: jsonb().$type<Record<string, unknown>>().notNull(),
    state: text({ enum: JOB_STATES }).notNull().default('queued'),
    attempts: integer().notNull().default(0),
    maxAttempts: integer().notNull().default(3),
    runAfter: timestamp({ withTimezone: true }).defaultNow().notNull(),
    lockedBy: text(),
    heartbeatAt: timestamp({ withTimezone: true }),
    progress: real().notNull().default(0),
    phase: text().notNull().default('waiting'),
    lastError: text(),
    ...timestamps,
  },
  (t) => [index('job_claim_idx').on(t.state, t.runAfter)],
);

/**
 * An immutable snapshot of a draft. A trigger (see the migration) refuses any
 * change to its content and any deletion; only the withdrawal columns and the
 * bundle key may be set later.
 */
export const release = pgTable(
  'release',
  {
    id: text().primaryKey(),
    datasetId: text()
      .notNull()
      .references(() => dataset.id, { onDelete: 'restrict' }),
    version: integer().notNull(),
    suffix: text().notNull().unique(),
    doi: text().notNull(),
    publishedAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
    publishedBy: text()
      .notNull()
      .references(() => user.id),
    title: text().notNull(),
    metadata: jsonb().$type<Record<string, unknown>>().notNull(),
    statistics: jsonb().$type<Record<string, unknown>>().notNull(),
    licence: text().notNull(),
    accessLevel: text({ enum: ['open', 'restricted', 'embargoed'] }).notNull(),
    embargoUntil: timestamp({ withTimezone: true }),
    changelog: text().notNull().default(''),
    bundleKey: text(),
    withdrawnAt: timestamp({ withTimezone: true }),
    withdrawnReason: text(),
    withdrawnBy: text(),
  },
  (t) => [uniqueIndex('release_dataset_version').on(t.datasetId, t.version)],
);

/** The file manifest of a release; immutable like the release. */
export const releaseFile = pgTable(
  'release_file',
  {
    id: text().primaryKey(),
    releaseId: text()
      .notNull()
      .references(() => release.id, { onDelete: 'restrict' }),
    fileName: text().notNull(),
    objectKey: text().notNull(),
    role: text({ enum: ['trajectories', 'supplementary'] }).notNull(),
    mediaType: text().notNull(),
    sizeBytes: bigint({ mode: 'number' }).notNull(),
    sha256: text().notNull(),
    summary: jsonb().$type<Record<string, unknown>>(),
    // The whole ingest result (plots, quick look) frozen with the release.
    result: jsonb().$type<Record<string, unknown>>(),
  },
  (t) => [index('release_file_release_idx').on(t.releaseId)],
);

/** One row per download of a release file or bundle (counts on landing pages and lab pages). */
export const downloadEvent = pgTable(
  'download_event',
  {
    id: text().primaryKey(),
    releaseId: text()
      .notNull()
      .references(() => release.id, { onDelete: 'restrict' }),
    // Null for the whole bundle.
    fileName: text(),
    userId: text(),
    // The signed-in user, or a one-day hash of address and browser: what "unique" counts (COUNTER Release 5).
    visitorKey: text(),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('download_event_release_idx').on(t.releaseId)],
);
