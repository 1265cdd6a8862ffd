import { z } from 'zod';
import { access, type Actor } from '../middleware/authorize';
import type { LabsService } from '../services/labs.service';
import { changeRoleInput, createLabInput, invitationView, inviteMemberInput, labDetail, labSummary } from '../../shared/contracts';
import { route } from './route';
import type { Response } from 'express';

const caller = (res: Response) => {
  const a = res.locals.actor as Actor;
  return { userId: a.user.id, email: a.user.email, headers: a.headers };
};
const idParam = z.string().min(1).max(100);

export function labsRoutes(labs: LabsService) {
  return [
    route({
      method: 'get', path: '/api/me/labs', access: access.signedIn, summary: 'Labs the caller belongs to', response: z.array(labSummary),
      handler: async (_req, res) => res.json(await labs.myLabs(caller(res).userId)),
    }),
    route({
      method: 'post', path: '/api/labs', access: access.signedIn, summary: 'Create a lab (the caller becomes its lead)',
      body: createLabInput, response: labSummary, status: 201,
      handler: async (_req, res, body) => res.status(201).json(await labs.create(caller(res), body)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug', access: access.public, summary: 'A lab, its members (addresses for members only) and, for leads, its invitations', response: labDetail,
      handler: async (_req, res) => res.json(await labs.detail(res.locals.lab!)),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/invitations', access: access.lab({ invitation: ['create'] }), summary: 'Invite someone by e-mail',
      body: inviteMemberInput, status: 201,
      handler: async (_req, res, body) => res.status(201).json(await labs.invite(caller(res), res.locals.lab!, body)),
    }),
    route({
      method: 'delete', path: '/api/labs/:slug/invitations/:id', access: access.lab({ invitation: ['cancel'] }), summary: 'Withdraw an invitation', status: 204,
      handler: async (req, res) => {
        await labs.cancelInvitation(caller(res), res.locals.lab!, idParam.parse(req.params.id));
        res.status(204).end();
      },
    }),
    route({
      method: 'patch', path: '/api/labs/:slug/members/:id', access: access.lab({ member: ['update'] }), summary: "Change a member's lab role", body: changeRoleInput,
      handler: async (req, res, body) => res.json(await labs.changeRole(caller(res), res.locals.lab!, idParam.parse(req.params.id), body.role)),
    }),
    route({
      method: 'get', path: '/api/invitations/:id', access: access.signedIn, summary: 'An invitation addressed to the caller', response: invitationView,
      handler: async (req, res) => res.json(await labs.invitation(caller(res), idParam.parse(req.params.id))),
    }),
    route({
      method: 'post', path: '/api/invitations/:id/accept', access: access.signedIn, summary: 'Accept an invitation',
      handler: async (req, res) => res.json(await labs.respond(caller(res), idParam.parse(req.params.id), 'accept')),
    }),
    route({
      method: 'post', path: '/api/invitations/:id/reject', access: access.signedIn, summary: 'Decline an invitation',
      handler: async (req, res) => res.json(await labs.respond(caller(res), idParam.parse(req.params.id), 'reject')),
    }),
  ];
}
