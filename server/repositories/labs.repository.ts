import { and, asc, count, eq, inArray } from 'drizzle-orm';
import type { Db } from '../db/client';
import { invitation, member, organization, user } from '../db/schema';
import { LAB_ROLES, type LabRole } from '../../shared/lab-roles';

const asRole = (r: string): LabRole => (LAB_ROLES.includes(r as LabRole) ? (r as LabRole) : 'depositor');

export type LabRow = {
  id: string;
  name: string;
  slug: string;
  institution: string | null;
  rorId: string | null;
  description: string | null;
  isDemo: boolean;
  createdAt: Date;
};

const labColumns = {
  id: organization.id,
  name: organization.name,
  slug: organization.slug,
  institution: organization.institution,
  rorId: organization.rorId,
  description: organization.description,
  isDemo: organization.isDemo,
  createdAt: organization.createdAt,
};

/** Reads of labs (better-auth organisations), their members and invitations. */
export function createLabsRepository(db: Db) {
  const normalise = (r: { isDemo: boolean | null } & Omit<LabRow, 'isDemo'>): LabRow => ({ ...r, isDemo: !!r.isDemo });

  return {
    async findBySlug(slug: string): Promise<LabRow | undefined> {
      const [row] = await db.select(labColumns).from(organization).where(eq(organization.slug, slug));
      return row ? normalise(row) : undefined;
    },

    async findById(id: string): Promise<LabRow | undefined> {
      const [row] = await db.select(labColumns).from(organization).where(eq(organization.id, id));
      return row ? normalise(row) : undefined;
    },

    async roleOf(labId: string, userId: string): Promise<LabRole | null> {
      const [row] = await db
        .select({ role: member.role })
        .from(member)
        .where(and(eq(member.organizationId, labId), eq(member.userId, userId)));
      return row ? asRole(row.role) : null;
    },

    async memberCounts(labIds: string[]): Promise<Map<string, number>> {
      if (labIds.length === 0) return new Map();
      const rows = await db
        .select({ labId: member.organizationId, n: count() })
        .from(member)
        .where(inArray(member.organizationId, labIds))
        .groupBy(member.organizationId);
      return new Map(rows.map((r) => [r.labId, Number(r.n)]));
    },

    async labsOfUser(userId: string): Promise<Array<LabRow & { role: LabRole }>> {
      const rows = await db
        .select({ ...labColumns, role: member.role })
        .from(member)
        .innerJoin(organization, eq(member.organizationId, organization.id))
        .where(eq(member.userId, userId))
        .orderBy(asc(organization.name));
      return rows.map((r) => ({ ...normalise(r), role: asRole(r.role) }));
    },

    async listAll(): Promise<LabRow[]> {
      const rows = await db.select(labColumns).from(organization).orderBy(asc(organization.name));
      return rows.map(normalise);
    },

    async members(labId: string) {
      const rows = await db
        .select({ id: member.id, userId: user.id, name: user.name, email: user.email, role: member.role, joinedAt: member.createdAt })
        .from(member)
        .innerJoin(user, eq(member.userId, user.id))
        .where(eq(member.organizationId, labId))
        .orderBy(asc(user.name));
      return rows.map((r) => ({ ...r, role: asRole(r.role) }));
    },

    async findMember(labId: string, memberId: string) {
      const [row] = await db
        .select({ id: member.id, userId: member.userId, role: member.role, email: user.email })
        .from(member)
        .innerJoin(user, eq(user.id, member.userId))
        .where(and(eq(member.organizationId, labId), eq(member.id, memberId)));
      return row ? { ...row, role: asRole(row.role) } : undefined;
    },

    async invitations(labId: string) {
      const rows = await db
        .select({
          id: invitation.id,
          email: invitation.email,
          role: invitation.role,
          status: invitation.status,
          expiresAt: invitation.expiresAt,
          invitedBy: user.name,
        })
        .from(invitation)
        .innerJoin(user, eq(invitation.inviterId, user.id))
        .where(eq(invitation.organizationId, labId))
        .orderBy(asc(invitation.createdAt));
      return rows.map((r) => ({ ...r, role: asRole(r.role ?? 'depositor') }));
    },

    async findInvitation(id: string) {
      const [row] = await db
        .select({
          id: invitation.id,
          email: invitation.email,
          role: invitation.role,
          status: invitation.status,
          expiresAt: invitation.expiresAt,
          labId: organization.id,
          labName: organization.name,
          labSlug: organization.slug,
          inviterName: user.name,
        })
        .from(invitation)
        .innerJoin(organization, eq(invitation.organizationId, organization.id))
        .innerJoin(user, eq(invitation.inviterId, user.id))
        .where(eq(invitation.id, id));
      return row ? { ...row, role: asRole(row.role ?? 'depositor') } : undefined;
    },

    async leadNames(): Promise<Map<string, string[]>> {
      const rows = await db
        .select({ labId: member.organizationId, name: user.name })
        .from(member)
        .innerJoin(user, eq(member.userId, user.id))
        .where(eq(member.role, 'lead'));
      const out = new Map<string, string[]>();
      for (const r of rows) out.set(r.labId, [...(out.get(r.labId) ?? []), r.name]);
      return out;
    },

    async markDemo(labId: string) {
      await db.update(organization).set({ isDemo: true }).where(eq(organization.id, labId));
    },
  };
}

export type LabsRepository = ReturnType<typeof createLabsRepository>;
