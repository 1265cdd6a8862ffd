import { z } from 'zod';
import { normaliseOrcid } from '../orcid';

export const orcidField = z
  .string()
  .trim()
  .transform((v, ctx) => {
    if (v === '') return null;
    const id = normaliseOrcid(v);
    if (!id) {
      ctx.addIssue({
        code: 'custom',
        message: 'This is not a valid ORCID iD: use the form 0000-0002-1825-0097 (the last character is a check digit)',
      });
      return z.NEVER;
    }
    return id;
  });

export const updateProfileInput = z.object({
  name: z.string().trim().min(2, 'Enter your name as it should appear in citations').max(120),
  orcid: orcidField,
});
export type UpdateProfileInput = z.input<typeof updateProfileInput>;
export type UpdateProfile = z.output<typeof updateProfileInput>;

export const profile = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  orcid: z.string().nullable(),
  platformRole: z.enum(['user', 'admin']),
});
export type Profile = z.infer<typeof profile>;
