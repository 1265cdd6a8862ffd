import { and, desc, eq, isNull } from 'drizzle-orm';
import type { Db } from '../db/client';
import { apiToken, user } from '../db/schema';

export function createTokensRepository(db: Db) {
  return {
    async insert(values: typeof apiToken.$inferInsert) {
      await db.insert(apiToken).values(values);
    },
    async listFor(userId: string) {
      return db.select().from(apiToken).where(eq(apiToken.userId, userId)).orderBy(desc(apiToken.createdAt));
    },
    async revoke(userId: string, id: string) {
      const done = await db
        .update(apiToken)
        .set({ revokedAt: new Date() })
        .where(and(eq(apiToken.id, id), eq(apiToken.userId, userId), isNull(apiToken.revokedAt)))
        .returning({ id: apiToken.id });
      return done.length === 1;
    },
    /** The live token with this hash and its owner, or undefined. */
    async findActive(tokenHash: string) {
      const [row] = await db
        .select({ token: apiToken, user: { id: user.id, name: user.name, email: user.email, role: user.role, emailVerified: user.emailVerified } })
        .from(apiToken)
        .innerJoin(user, eq(apiToken.userId, user.id))
        .where(and(eq(apiToken.tokenHash, tokenHash), isNull(apiToken.revokedAt)));
      return row;
    },
    async touch(id: string) {
      await db.update(apiToken).set({ lastUsedAt: new Date() }).where(eq(apiToken.id, id));
    },
  };
}

export type TokensRepository = ReturnType<typeof createTokensRepository>;
