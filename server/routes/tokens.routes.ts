import { z } from 'zod';
import { access, type Actor } from '../middleware/authorize';
import type { TokensService } from '../services/tokens.service';
import { createTokenInput } from '../../shared/contracts';
import { route } from './route';

export function tokensRoutes(svc: TokensService) {
  const userId = (a: Actor | undefined) => a!.user.id;
  return [
    route({
      method: 'get', path: '/api/me/tokens', access: access.session, summary: "The caller's API tokens (never the secret)",
      handler: async (_req, res) => res.json(await svc.list(userId(res.locals.actor))),
    }),
    route({
      method: 'post', path: '/api/me/tokens', access: access.session, summary: 'Create an API token; the secret is in this answer only', body: createTokenInput, status: 201,
      handler: async (_req, res, body) => res.status(201).json(await svc.create(userId(res.locals.actor), body.name, body.scopes)),
    }),
    route({
      method: 'delete', path: '/api/me/tokens/:id', access: access.session, summary: 'Revoke an API token', status: 204,
      handler: async (req, res) => {
        await svc.revoke(userId(res.locals.actor), z.string().min(1).max(100).parse(req.params.id));
        res.status(204).end();
      },
    }),
  ];
}
