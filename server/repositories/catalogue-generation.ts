import { eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { catalogueGeneration } from '../db/schema';

/**
 * The catalogue's generation: it changes with every publication, withdrawal and
 * change of a lab's name or address (database triggers bump it). One
 * primary-key read, so every request can afford it and answers kept in memory
 * are never older than the database, on any instance.
 */
export async function readCatalogueGeneration(db: Db): Promise<string> {
  const [row] = await db.select({ value: catalogueGeneration.value }).from(catalogueGeneration).where(eq(catalogueGeneration.id, 1));
  return String(row?.value ?? 0);
}
