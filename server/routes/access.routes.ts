import { z } from 'zod';
import type { Response } from 'express';
import { access, type Actor as AuthActor } from '../middleware/authorize';
import type { AccessService } from '../services/access.service';
import { decideAccessInput, requestAccessInput, termsInput } from '../../shared/contracts';
import { route } from './route';

const actorOf = (res: Response) => {
  const a = res.locals.actor as AuthActor;
  return { id: a.user.id, name: a.user.name, email: a.user.email };
};
const id = z.string().min(1).max(100);
const suffix = z.string().min(4).max(60);
const canDecide = access.lab({ accessRequest: ['decide'] });

export function accessRoutes(svc: AccessService) {
  return [
    route({
      method: 'get', path: '/api/releases/:suffix/terms', access: access.public, summary: "The depositing lab's current data-use terms",
      handler: async (req, res) => res.json(await svc.termsForRelease(suffix.parse(req.params.suffix))),
    }),
    route({
      method: 'post', path: '/api/releases/:suffix/access-requests', access: access.signedIn, summary: 'Ask for the files of a restricted release (or of all its versions)',
      body: requestAccessInput, status: 201,
      handler: async (req, res, body) => res.status(201).json(await svc.request(actorOf(res), suffix.parse(req.params.suffix), body)),
    }),
    route({
      method: 'get', path: '/api/me/access', access: access.signedIn, summary: "The caller's access requests and grants",
      handler: async (_req, res) => res.json(await svc.mine(actorOf(res))),
    }),
    route({
      method: 'post', path: '/api/me/access-requests/:id/withdraw', access: access.signedIn, summary: 'Withdraw one of my pending requests',
      handler: async (req, res) => {
        await svc.withdraw(actorOf(res), id.parse(req.params.id));
        res.json({ state: 'withdrawn' });
      },
    }),
    route({
      method: 'get', path: '/api/labs/:slug/access-requests', access: canDecide, summary: "The lab's access requests, filtered by state",
      handler: async (req, res) => res.json(await svc.labQueue(res.locals.lab!, z.enum(['pending', 'approved', 'denied', 'withdrawn']).optional().parse(req.query.state || undefined))),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/access-requests/:id/decision', access: canDecide, summary: 'Approve (optionally until a date, with a note) or deny (with a reason)',
      body: decideAccessInput,
      handler: async (req, res, body) => res.json(await svc.decide(actorOf(res), res.locals.lab!, id.parse(req.params.id), body)),
    }),
    route({
      method: 'get', path: '/api/labs/:slug/access-requests/:id/history', access: canDecide, summary: "A request's audit trail",
      handler: async (req, res) => res.json(await svc.history(res.locals.lab!, id.parse(req.params.id))),
    }),
    route({
      method: 'post', path: '/api/labs/:slug/access-grants/:id/revoke', access: canDecide, summary: 'Withdraw a grant; it stops working at once',
      handler: async (req, res) => {
        await svc.revoke(actorOf(res), res.locals.lab!, id.parse(req.params.id));
        res.json({ revoked: true });
      },
    }),
    route({
      method: 'get', path: '/api/labs/:slug/terms', access: access.lab({ lab: ['read-members'] }), summary: "The lab's data-use terms",
      handler: async (_req, res) => res.json(await svc.labTerms(res.locals.lab!)),
    }),
    route({
      method: 'put', path: '/api/labs/:slug/terms', access: access.lab({ lab: ['update'] }), summary: 'Write a new version of the data-use terms', body: termsInput,
      handler: async (_req, res, body) => res.json(await svc.setLabTerms(actorOf(res), res.locals.lab!, body.body)),
    }),
  ];
}
