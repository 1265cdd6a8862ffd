import fs from 'node:fs';
import { eq, sql } from 'drizzle-orm';
import { describe, expect, inject, it } from 'vitest';
import { openPglite } from '../../server/db/client';
import { catalogueGeneration, organization } from '../../server/db/schema';
import { readCatalogueGeneration } from '../../server/repositories/catalogue-generation';

/**
 * The catalogue's generation on the embedded database: kept in memory from the triggers' notifications
 * (migration 0015) instead of read on every request. Source: PostgreSQL's NOTIFY semantics (delivered at
 * commit, not at all after a rollback), which PGlite follows; checked here on PGlite itself.
 */
// PGlite only (the embedded pass): on a PostgreSQL server the generation is read on every request.
describe.skipIf(!!inject('pgAdminUrl'))('readCatalogueGeneration(db) on PGlite', () => {
  it('moves on as soon as a writing transaction has committed, and not for a rolled-back one', async () => {
    const database = await openPglite({ template: await fs.openAsBlob(inject('templatePath')) });
    const { db } = database;
    try {
      const stored = async () => (await db.select({ value: catalogueGeneration.value }).from(catalogueGeneration))[0];
      const g0 = Number(await readCatalogueGeneration(db));
      expect(g0).toBe((await stored()).value);
      const [lab] = await db.insert(organization).values({ id: 'lab-gen-1', name: 'Fen Lab', slug: 'fen-lab', createdAt: new Date() }).returning();
      // A rename bumps the generation (trigger of migration 0014); the next read sees it at once.
      await db.update(organization).set({ name: 'Fen Swarm Lab' }).where(eq(organization.id, lab.id));
      expect(Number(await readCatalogueGeneration(db))).toBe(g0 + 1);
      await db.transaction(async (tx) => {
        await tx.update(organization).set({ slug: 'fen-swarm-lab' }).where(eq(organization.id, lab.id));
        await tx.update(organization).set({ name: 'Fen Swarms' }).where(eq(organization.id, lab.id));
      });
      expect(Number(await readCatalogueGeneration(db))).toBe(g0 + 3);
      await expect(
        db.transaction(async (tx) => {
          await tx.update(organization).set({ name: 'Never' }).where(eq(organization.id, lab.id));
          throw new Error('roll back');
        }),
      ).rejects.toThrow('roll back');
      expect(Number(await readCatalogueGeneration(db))).toBe(g0 + 3);
      expect((await stored()).value).toBe(g0 + 3);
      // Kept in memory, not read again: a change of the row that sends no notification is not seen.
      await db.execute(sql`update catalogue_generation set value = value + 10 where id = 1`);
      expect(Number(await readCatalogueGeneration(db))).toBe(g0 + 3);
    } finally {
      await database.close();
    }
  });
});
