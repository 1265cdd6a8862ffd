import { access, type Actor } from '../middleware/authorize';
import type { LabProfilesService } from '../services/lab-profiles.service';
import { labDescriptionInput, labProfile, memberListingInput } from '../../shared/contracts';
import { route } from './route';

export function labProfilesRoutes(svc: LabProfilesService) {
  return [
    route({
      method: 'get', path: '/api/labs/:slug/profile', access: access.public,
      summary: "A lab's public page: institution, ROR id, description, members who chose to be listed, releases and download totals", response: labProfile,
      handler: async (_req, res) => res.json(await svc.profile(res.locals.lab!, res.locals.actor?.user.id ?? null)),
    }),
    route({
      method: 'put', path: '/api/labs/:slug/listing', access: access.lab({ lab: ['read-members'] }),
      summary: "The caller's own choice to be listed (name and ORCID iD) on the lab's public page", body: memberListingInput,
      handler: async (_req, res, body) => res.json(await svc.setListing(res.locals.lab!, (res.locals.actor as Actor).user.id, body.listed)),
    }),
    route({
      method: 'put', path: '/api/labs/:slug/description', access: access.lab({ lab: ['update'] }),
      summary: "The lab's description on its public page (lab lead)", body: labDescriptionInput,
      handler: async (_req, res, body) => res.json(await svc.setDescription(res.locals.lab!, body.description)),
    }),
  ];
}
