import { sql } from 'drizzle-orm';
import type { Db } from '../db/client';

export type ReferencedObject = {
  key: string;
  // Known from the database where a finished upload or a release recorded it.
  sizeBytes: number | null;
  sha256: string | null;
  // Which tables point at the key (release_file, release_bundle, draft_file, stored_object).
  referencedBy: string[];
};

const rows = <T>(result: unknown) => (result as { rows: T[] }).rows;

/** The backup's view of the database: every object key it references, and a few figures for the manifest. */
export function backupRepository(db: Db) {
  return {
    async referencedObjects(): Promise<ReferencedObject[]> {
      const found = rows<{ key: string; size_bytes: string | null; sha256: string | null; source: string }>(
        await db.execute(sql`
          select object_key as key, size_bytes::text, sha256, 'release_file' as source from release_file
          union all
          select bundle_key, null, null, 'release_bundle' from release where bundle_key is not null
          union all
          select object_key, size_bytes::text, sha256, 'draft_file' from draft_file
          union all
          select object_key, size_bytes::text, sha256, 'stored_object' from stored_object`),
      );
      const byKey = new Map<string, ReferencedObject>();
      for (const r of found) {
        const o = byKey.get(r.key) ?? { key: r.key, sizeBytes: null, sha256: null, referencedBy: [] };
        o.sizeBytes ??= r.size_bytes === null ? null : Number(r.size_bytes);
        o.sha256 ??= r.sha256;
        if (!o.referencedBy.includes(r.source)) o.referencedBy.push(r.source);
        byKey.set(r.key, o);
      }
      return [...byKey.values()].sort((a, b) => a.key.localeCompare(b.key));
    },

    /** How many migrations drizzle has applied (its own bookkeeping table). */
    async migrationsApplied(): Promise<number> {
      const [r] = rows<{ n: string }>(await db.execute(sql`select count(*)::text as n from drizzle.__drizzle_migrations`));
      return Number(r?.n ?? 0);
    },

    async counts(): Promise<Record<string, number>> {
      const [r] = rows<Record<string, string>>(
        await db.execute(sql`select
          (select count(*) from "user")::text as users,
          (select count(*) from organization)::text as labs,
          (select count(*) from dataset)::text as datasets,
          (select count(*) from release)::text as releases,
          (select count(*) from release_file)::text as release_files,
          (select count(*) from release where bundle_key is not null)::text as bundles,
          (select count(*) from draft_file)::text as draft_files`),
      );
      return Object.fromEntries(Object.entries(r ?? {}).map(([k, v]) => [k, Number(v)]));
    },
  };
}
