import { asc, count, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { member, organization, user } from '../db/schema';

/** Reads and the few writes of user rows that better-auth does not own. */
export function createUsersRepository(db: Db) {
  return {
    async findById(id: string) {
      const [row] = await db
        .select({ id: user.id, name: user.name, email: user.email, orcid: user.orcid, role: user.role })
        .from(user)
        .where(eq(user.id, id));
      return row;
    },

    async updateProfile(id: string, values: { name: string; orcid: string | null }) {
      await db.update(user).set(values).where(eq(user.id, id));
    },

    async listWithLabs() {
      const users = await db
        .select({ id: user.id, name: user.name, email: user.email, emailVerified: user.emailVerified, role: user.role, createdAt: user.createdAt })
        .from(user)
        .orderBy(asc(user.name));
      const memberships = await db
        .select({ userId: member.userId, slug: organization.slug, name: organization.name, role: member.role })
        .from(member)
        .innerJoin(organization, eq(member.organizationId, organization.id));
      return users.map((u) => ({ ...u, labs: memberships.filter((m) => m.userId === u.id).map(({ userId: _u, ...m }) => m) }));
    },

    async count(): Promise<number> {
      const [row] = await db.select({ n: count() }).from(user);
      return Number(row?.n ?? 0);
    },

    async markVerified(id: string) {
      await db.update(user).set({ emailVerified: true }).where(eq(user.id, id));
    },

    async setPlatformRole(id: string, role: 'user' | 'admin') {
      await db.update(user).set({ role }).where(eq(user.id, id));
    },
  };
}

export type UsersRepository = ReturnType<typeof createUsersRepository>;
