import { access, type Actor } from '../middleware/authorize';
import type { ProfileService } from '../services/profile.service';
import { updateProfileInput } from '../../shared/contracts';
import { route } from './route';

export function accountRoutes(profile: ProfileService) {
  const userId = (a: Actor | undefined) => a!.user.id;
  return [
    route({
      method: 'get', path: '/api/me', access: access.signedIn, summary: "The caller's profile",
      handler: async (_req, res) => res.json(await profile.get(userId(res.locals.actor))),
    }),
    route({
      method: 'patch', path: '/api/me', access: access.signedIn, summary: 'Update name and ORCID iD',
      handler: async (req, res) => res.json(await profile.update(userId(res.locals.actor), updateProfileInput.parse(req.body))),
    }),
  ];
}
