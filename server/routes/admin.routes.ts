import { z } from 'zod';
import { access } from '../middleware/authorize';
import { adminLab, adminUser } from '../../shared/contracts';
import type { AdminService } from '../services/admin.service';
import { route } from './route';

export function adminRoutes(admin: AdminService) {
  return [
    route({
      method: 'get', path: '/api/admin/users', access: access.admin, summary: 'Every account with its labs', response: z.array(adminUser),
      handler: async (_req, res) => res.json(await admin.users()),
    }),
    route({
      method: 'get', path: '/api/admin/labs', access: access.admin, summary: 'Every lab with its leads and size', response: z.array(adminLab),
      handler: async (_req, res) => res.json(await admin.labs()),
    }),
  ];
}
