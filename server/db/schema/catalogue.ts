import { sql } from 'drizzle-orm';
import { boolean, customType, index, integer, pgTable, real, text, timestamp } from 'drizzle-orm/pg-core';
import { release } from './depositing';

// Drizzle has no built-in tsvector column type.
const tsvector = customType<{ data: string }>({ dataType: () => 'tsvector' });

/**
 * The catalogue's search document and facet values, one row per release.
 * Kept beside `release` because releases are immutable; filled by database
 * triggers (see the catalogue migration) in the same transaction as the
 * release is published, withdrawn or downloaded.
 */
export const releaseSearch = pgTable(
  'release_search',
  {
    releaseId: text()
      .primaryKey()
      .references(() => release.id, { onDelete: 'restrict' }),
    datasetId: text().notNull(),
    labId: text().notNull(),
    labName: text().notNull(),
    // True for the newest non-withdrawn release of its dataset: one catalogue card per dataset.
    listed: boolean().notNull().default(false),
    withdrawn: boolean().notNull().default(false),
    versionCount: integer().notNull().default(1),
    publishedAt: timestamp({ withTimezone: true }).notNull(),
    title: text().notNull(),
    description: text().notNull().default(''),
    groupType: text(),
    species: text().array().notNull().default(sql`'{}'::text[]`),
    setting: text(),
    dimension: integer(),
    individuals: integer(),
    frameRate: real(),
    licence: text().notNull(),
    accessLevel: text().notNull(),
    publicationYear: integer().notNull(),
    // Unique downloads (COUNTER: one per visitor, item and day) of all versions of the dataset.
    downloads: integer().notNull().default(0),
    document: tsvector().notNull(),
  },
  (t) => [
    // The triggers update all rows of a dataset on every publish, withdrawal and download.
    index('release_search_dataset_idx').on(t.datasetId),
    index('release_search_document_idx').using('gin', t.document),
    index('release_search_species_idx').using('gin', t.species),
    index('release_search_newest_idx').on(t.listed, t.publishedAt.desc(), t.releaseId.desc()),
    index('release_search_group_size_idx').on(t.listed, t.individuals.desc().nullsLast(), t.releaseId.desc()),
    index('release_search_downloads_idx').on(t.listed, t.downloads.desc(), t.releaseId.desc()),
  ],
);

/**
 * One row: a number that grows whenever something a catalogue answer or a
 * landing page shows may have changed (a publication, a withdrawal, a
 * release's bundle being ready, a lab's name or address). Each instance keeps
 * its answers while the number stays the same, so a page costs one
 * primary-key read instead of several joins.
 * Bumped by database triggers (see the migration), in the same transaction.
 * Download counts are not in it: they may lag by a cache lifetime.
 */
export const catalogueGeneration = pgTable('catalogue_generation', {
  id: integer().primaryKey().default(1),
  value: integer().notNull().default(0),
});
