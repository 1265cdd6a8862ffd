import type { LabsRepository } from '../repositories/labs.repository';
import type { UsersRepository } from '../repositories/users.repository';
import type { AdminLab, AdminUser } from '../../shared/contracts';

export function createAdminService({ users, labs }: { users: UsersRepository; labs: LabsRepository }) {
  return {
    async users(): Promise<AdminUser[]> {
      return (await users.listWithLabs()).map((u) => ({
        ...u,
        platformRole: u.role ?? 'user',
        createdAt: u.createdAt.toISOString(),
      }));
    },
    async labs(): Promise<AdminLab[]> {
      const all = await labs.listAll();
      const counts = await labs.memberCounts(all.map((l) => l.id));
      const leads = await labs.leadNames();
      return all.map((l) => ({
        id: l.id,
        name: l.name,
        slug: l.slug,
        institution: l.institution,
        isDemo: l.isDemo,
        memberCount: counts.get(l.id) ?? 0,
        leadNames: leads.get(l.id) ?? [],
        createdAt: l.createdAt.toISOString(),
      }));
    },
  };
}

export type AdminService = ReturnType<typeof createAdminService>;
