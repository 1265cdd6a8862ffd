import { z } from 'zod';

/** A lab's public page: who they are, members who agreed to be listed, releases and downloads. */
export const labProfile = z.object({
  slug: z.string(),
  name: z.string(),
  institution: z.string().nullable(),
  rorId: z.string().nullable(),
  description: z.string().nullable(),
  isDemo: z.boolean(),
  // Only members who chose to be listed; never their addresses.
  members: z.array(z.object({ name: z.string(), orcid: z.string().nullable() })),
  releases: z.array(
    z.object({
      suffix: z.string(),
      doi: z.string(),
      datasetSuffix: z.string(),
      title: z.string(),
      version: z.number(),
      publishedAt: z.string(),
      accessLevel: z.enum(['open', 'restricted', 'embargoed']),
      downloads: z.number(),
    }),
  ),
  // COUNTER Release 5 counts over every release of the lab.
  downloads: z.object({ total: z.number(), unique: z.number() }),
  // The caller's own choice when they are a member of the lab, otherwise null.
  myListing: z.boolean().nullable(),
});
export type LabProfile = z.infer<typeof labProfile>;

export const memberListingInput = z.object({ listed: z.boolean({ error: 'Say true or false: listed on the lab page or not' }) });
export type MemberListingInput = z.infer<typeof memberListingInput>;

export const labDescriptionInput = z.object({
  description: z.string({ error: 'Give the description as text' }).trim().max(2000, 'Keep the description under 2,000 characters'),
});
export type LabDescriptionInput = z.infer<typeof labDescriptionInput>;
