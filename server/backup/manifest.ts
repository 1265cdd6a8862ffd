import { z } from 'zod';

export const BACKUP_FORMAT = 'cohesia-backup';
export const BACKUP_FORMAT_VERSION = 1;
export const MANIFEST_FILE = 'manifest.json';
export const OBJECTS_FOLDER = 'objects';

const sha256 = z.string().regex(/^[0-9a-f]{64}$/, 'must be a hex SHA-256');

/** manifest.json of a backup folder: what was saved and how to check it. */
export const backupManifestSchema = z.object({
  format: z.literal(BACKUP_FORMAT),
  formatVersion: z.number().int().positive(),
  createdAt: z.string().datetime(),
  engine: z.enum(['pglite', 'postgres']),
  // Migrations applied to the saved database; a restore refuses a backup newer than its code.
  migrationLevel: z.number().int().nonnegative(),
  counts: z.record(z.string(), z.number().int().nonnegative()),
  database: z.object({ file: z.string().min(1), sizeBytes: z.number().int().nonnegative(), sha256 }),
  objects: z.array(
    z.object({
      key: z.string().min(1),
      file: z.string().min(1),
      sizeBytes: z.number().int().nonnegative(),
      sha256,
      mediaType: z.string().nullable(),
      referencedBy: z.array(z.string()),
    }),
  ),
  // Keys only unfinished draft uploads point at and that had no object yet.
  absent: z.array(z.object({ key: z.string(), referencedBy: z.array(z.string()) })),
});

export type BackupManifest = z.infer<typeof backupManifestSchema>;

export class BackupError extends Error {}

/** Object keys are made by the server; still, a key never leaves the backup folder. */
export function objectFile(key: string): string {
  if (key.startsWith('/') || key.split('/').some((p) => p === '..' || p === '.' || p === '')) {
    throw new BackupError(`The object key ${JSON.stringify(key)} cannot be stored as a file.`);
  }
  return `${OBJECTS_FOLDER}/${key}`;
}
