import { eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { catalogueGeneration } from '../db/schema';

/** A database whose generation this process keeps in memory, fed by the triggers' notifications. */
interface GenerationWatch {
  listen: (onValue: (payload: string) => void) => Promise<unknown>;
  current: number | null;
  ready: Promise<void> | null;
}

const watches = new WeakMap<Db, GenerationWatch>();

/**
 * For an embedded database this process alone owns (PGlite: the data-folder lock): the generation is kept
 * in memory from the first read on, and each bump's notification (`cohesia_catalogue`, sent by the trigger
 * of migration 0015 and delivered when the writing transaction commits, before its commit resolves) moves
 * it on. A server shared by several instances keeps the per-request read: another instance's write would
 * reach this one only through a LISTEN connection of its own.
 */
export function watchCatalogueGeneration(db: Db, listen: GenerationWatch['listen']): void {
  watches.set(db, { listen, current: null, ready: null });
}

/**
 * The catalogue's generation: it changes with every publication, withdrawal and
 * change of a lab's name or address (database triggers bump it). One
 * primary-key read (or, for a watched embedded database, none), so every request
 * can afford it and answers kept in memory are never older than the database, on
 * any instance.
 */
export async function readCatalogueGeneration(db: Db): Promise<string> {
  const w = watches.get(db);
  if (!w) return String(await readStored(db));
  if (w.current === null) {
    const raise = (v: number) => {
      if (w.current === null || v > w.current) w.current = v;
    };
    // Listen first, then read: a bump in between is not lost (generations only grow).
    w.ready ??= (async () => {
      await w.listen((payload) => raise(Number(payload)));
      raise(await readStored(db));
    })().catch((e: unknown) => {
      w.ready = null;
      throw e;
    });
    await w.ready;
  }
  return String(w.current);
}

async function readStored(db: Db): Promise<number> {
  const [row] = await db.select({ value: catalogueGeneration.value }).from(catalogueGeneration).where(eq(catalogueGeneration.id, 1));
  return row?.value ?? 0;
}
