import { access, type Actor } from '../middleware/authorize';
import type { ProfileService } from '../services/profile.service';
import { profile as profileSchema, updateProfileInput } from '../../shared/contracts';
import { route } from './route';

export function accountRoutes(profile: ProfileService) {
  const userId = (a: Actor | undefined) => a!.user.id;
  return [
    route({
      method: 'get', path: '/api/me', access: access.signedIn, summary: "The caller's profile", response: profileSchema,
      handler: async (_req, res) => res.json(await profile.get(userId(res.locals.actor))),
    }),
    route({
      method: 'patch', path: '/api/me', access: access.session, summary: 'Update name and ORCID iD', body: updateProfileInput, response: profileSchema,
      handler: async (_req, res, body) => res.json(await profile.update(userId(res.locals.actor), body)),
    }),
  ];
}
