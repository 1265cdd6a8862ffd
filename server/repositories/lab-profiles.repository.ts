import { and, asc, desc, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { dataset, labMemberListing, member, organization, release, user } from '../db/schema';

/** Public lab pages: listed members, the lab's releases, and the lab's own description. */
export function createLabProfilesRepository(db: Db) {
  return {
    /** Current members who chose to be listed (a member who left disappears with their membership). */
    async listedMembers(labId: string) {
      return db
        .select({ name: user.name, orcid: user.orcid })
        .from(labMemberListing)
        .innerJoin(member, and(eq(member.organizationId, labMemberListing.labId), eq(member.userId, labMemberListing.userId)))
        .innerJoin(user, eq(user.id, labMemberListing.userId))
        .where(and(eq(labMemberListing.labId, labId), eq(labMemberListing.listed, true)))
        .orderBy(asc(user.name));
    },

    async listingOf(labId: string, userId: string): Promise<boolean> {
      const [row] = await db
        .select({ listed: labMemberListing.listed })
        .from(labMemberListing)
        .where(and(eq(labMemberListing.labId, labId), eq(labMemberListing.userId, userId)));
      return row?.listed ?? false;
    },

    async setListing(labId: string, userId: string, listed: boolean) {
      await db
        .insert(labMemberListing)
        .values({ labId, userId, listed })
        .onConflictDoUpdate({ target: [labMemberListing.labId, labMemberListing.userId], set: { listed, updatedAt: new Date() } });
    },

    /** Every release of the lab (withdrawn ones too, for download totals), newest first. */
    async releasesOfLab(labId: string) {
      return db
        .select({
          id: release.id,
          suffix: release.suffix,
          doi: release.doi,
          datasetSuffix: dataset.suffix,
          title: release.title,
          version: release.version,
          publishedAt: release.publishedAt,
          accessLevel: release.accessLevel,
          withdrawnAt: release.withdrawnAt,
        })
        .from(release)
        .innerJoin(dataset, eq(release.datasetId, dataset.id))
        .where(eq(dataset.labId, labId))
        .orderBy(desc(release.publishedAt), desc(release.id));
    },

    async setDescription(labId: string, description: string) {
      await db.update(organization).set({ description: description || null }).where(eq(organization.id, labId));
    },
  };
}

export type LabProfilesRepository = ReturnType<typeof createLabProfilesRepository>;
