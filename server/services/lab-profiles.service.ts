import type { LabContext } from '../middleware/authorize';
import type { LabsRepository } from '../repositories/labs.repository';
import type { LabProfilesRepository } from '../repositories/lab-profiles.repository';
import type { LabProfile } from '../../shared/contracts';

type Deps = {
  profiles: LabProfilesRepository;
  labs: LabsRepository;
  // The COUNTER Release 5 counts the downloads service uses too (depositing repository).
  downloadCounts: (releaseIds: string[]) => Promise<{ total: number; unique: number }>;
};

/** A lab's public page, each member's own choice to be listed on it, and the lead's description. */
export function createLabProfilesService({ profiles, labs, downloadCounts }: Deps) {
  return {
    async profile(lab: LabContext, viewerId: string | null): Promise<LabProfile> {
      const row = (await labs.findById(lab.id))!;
      const all = await profiles.releasesOfLab(lab.id);
      const shown = all.filter((r) => !r.withdrawnAt);
      return {
        slug: row.slug,
        name: row.name,
        institution: row.institution,
        rorId: row.rorId,
        description: row.description,
        isDemo: row.isDemo,
        members: await profiles.listedMembers(lab.id),
        releases: await Promise.all(
          shown.map(async ({ id, withdrawnAt: _w, publishedAt, ...r }) => ({ ...r, publishedAt: publishedAt.toISOString(), downloads: (await downloadCounts([id])).total })),
        ),
        downloads: await downloadCounts(all.map((r) => r.id)),
        myListing: lab.role && viewerId ? await profiles.listingOf(lab.id, viewerId) : null,
      };
    },

    async setListing(lab: LabContext, userId: string, listed: boolean) {
      await profiles.setListing(lab.id, userId, listed);
      return { listed };
    },

    async setDescription(lab: LabContext, description: string) {
      await profiles.setDescription(lab.id, description);
      return { description: description || null };
    },
  };
}

export type LabProfilesService = ReturnType<typeof createLabProfilesService>;
