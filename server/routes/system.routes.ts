import { z } from 'zod';
import { access } from '../middleware/authorize';
import type { MailboxService } from '../services/mailbox.service';
import { route } from './route';

export function systemRoutes(deps: { mailbox: MailboxService; health: () => Promise<Record<string, unknown>>; info: Record<string, unknown> }) {
  return [
    route({
      method: 'get', path: '/api/health', access: access.public, summary: 'Liveness and what the server is connected to',
      handler: async (_req, res) => res.json(await deps.health()),
    }),
    route({
      method: 'get', path: '/api/info', access: access.public, summary: 'Public facts the client needs at start (demo mode, identifier prefix)',
      handler: async (_req, res) => res.json(deps.info),
    }),
    route({
      method: 'get', path: '/api/dev/mailbox', access: access.fakes, summary: 'Mail captured by the local SMTP stand-in',
      handler: async (req, res) => res.json(await deps.mailbox.list(z.string().email().optional().parse(req.query.to))),
    }),
    route({
      method: 'get', path: '/api/dev/mailbox/:id', access: access.fakes, summary: 'One captured message',
      handler: async (req, res) => res.json(await deps.mailbox.one(z.string().min(1).max(80).parse(req.params.id))),
    }),
  ];
}
