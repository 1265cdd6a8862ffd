import { notFound } from '../errors';
import type { UsersRepository } from '../repositories/users.repository';
import type { Profile, UpdateProfile } from '../../shared/contracts';

export function createProfileService({ users }: { users: UsersRepository }) {
  return {
    async get(userId: string): Promise<Profile> {
      const u = await users.findById(userId);
      if (!u) throw notFound('The account');
      return { id: u.id, name: u.name, email: u.email, orcid: u.orcid ?? null, platformRole: u.role === 'admin' ? 'admin' : 'user' };
    },
    async update(userId: string, values: UpdateProfile): Promise<Profile> {
      await users.updateProfile(userId, values);
      return this.get(userId);
    },
  };
}

export type ProfileService = ReturnType<typeof createProfileService>;
