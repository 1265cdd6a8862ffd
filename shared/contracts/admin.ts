import { z } from 'zod';

export const adminUser = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  emailVerified: z.boolean(),
  platformRole: z.string(),
  createdAt: z.string(),
  labs: z.array(z.object({ slug: z.string(), name: z.string(), role: z.string() })),
});
export type AdminUser = z.infer<typeof adminUser>;

export const adminLab = z.object({
  id: z.string(),
  name: z.string(),
  slug: z.string(),
  institution: z.string().nullable(),
  isDemo: z.boolean(),
  memberCount: z.number(),
  leadNames: z.array(z.string()),
  createdAt: z.string(),
});
export type AdminLab = z.infer<typeof adminLab>;
