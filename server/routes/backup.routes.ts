import { z } from 'zod';
import { access } from '../middleware/authorize';
import type { BackupService } from '../services/backup.service';
import { route } from './route';

const backupSummary = z.object({
  folder: z.string(),
  createdAt: z.string(),
  engine: z.enum(['pglite', 'postgres']),
  migrationLevel: z.number().int(),
  counts: z.record(z.string(), z.number()),
});

export function backupRoutes(backups: BackupService) {
  return [
    route({
      method: 'post', path: '/api/admin/backups', access: access.admin, status: 201, response: backupSummary,
      summary: 'Back up the running instance (database image, every referenced object, manifest.json) into a new folder on the server',
      handler: async (_req, res) => res.status(201).json(await backups.backupNow()),
    }),
  ];
}
