import type { Auth } from '../auth/create-auth';
import { AppError, notFound } from '../errors';
import type { LabsRepository } from '../repositories/labs.repository';
import type { AuditRepository } from '../repositories/audit.repository';
import type { LabContext } from '../middleware/authorize';
import { labRoleCan, type LabRole } from '../../shared/lab-roles';
import type { CreateLab, InviteMemberInput, LabDetail, LabSummary, InvitationView } from '../../shared/contracts';

type Caller = { userId: string; email: string; headers: Headers };

const iso = (d: Date) => d.toISOString();

type Audit = Pick<AuditRepository, 'record'>;

/**
 * Labs, members and invitations. Membership writes go through better-auth's organisation API;
 * each is then recorded in the lab's audit log (after better-auth has written it, so not in
 * the same transaction: a crash in between leaves the change without its event, never the reverse).
 */
export function createLabsService({ auth, labs, audit }: { auth: Auth; labs: LabsRepository; audit: Audit }) {
  const record = (actorId: string, labId: string, action: string, subject: { type: string; id: string }, detail: Record<string, unknown>, change?: { from: string | null; to: string | null }) =>
    audit.record({ actorId, action, subjectType: subject.type, subjectId: subject.id, fromState: change?.from ?? null, toState: change?.to ?? null, detail: { labId, ...detail } });
  return {
    async myLabs(userId: string): Promise<LabSummary[]> {
      const rows = await labs.labsOfUser(userId);
      const counts = await labs.memberCounts(rows.map((r) => r.id));
      return rows.map(({ role, createdAt: _c, ...r }) => ({ ...r, memberCount: counts.get(r.id) ?? 0, myRole: role }));
    },

    async create(caller: Caller, values: CreateLab): Promise<LabSummary> {
      if (await labs.findBySlug(values.slug)) {
        throw new AppError('slug_taken', 'Another lab already uses this short name.', 409, { slug: 'Another lab already uses this short name' });
      }
      const created = await auth.api.createOrganization({
        headers: caller.headers,
        body: {
          name: values.name,
          slug: values.slug,
          institution: values.institution || undefined,
          rorId: values.rorId || undefined,
          description: values.description || undefined,
        },
      });
      if (!created) throw new AppError('lab_not_created', 'The lab could not be created.', 500);
      const lab = (await labs.findById(created.id))!;
      await record(caller.userId, lab.id, 'lab.created', { type: 'lab', id: lab.id }, { name: lab.name, slug: lab.slug });
      return { ...lab, memberCount: 1, myRole: 'lead' };
    },

    async detail(lab: LabContext): Promise<LabDetail> {
      const row = (await labs.findById(lab.id))!;
      const seesMembers = labRoleCan(lab.role, { lab: ['read-members'] });
      const members = (await labs.members(lab.id)).map((m) => ({
        ...m,
        email: seesMembers ? m.email : null,
        joinedAt: iso(m.joinedAt),
      }));
      const invitations = labRoleCan(lab.role, { invitation: ['create'] })
        ? (await labs.invitations(lab.id)).map((i) => ({ ...i, expiresAt: iso(i.expiresAt) }))
        : null;
      const { createdAt: _c, ...rest } = row;
      return { ...rest, memberCount: members.length, myRole: lab.role, members, invitations };
    },

    async invite(caller: Caller, lab: LabContext, input: InviteMemberInput) {
      const existing = (await labs.members(lab.id)).find((m) => m.email.toLowerCase() === input.email);
      if (existing) {
        throw new AppError('already_member', `${input.email} is already a member of ${lab.name}.`, 409, { email: 'Already a member of this lab' });
      }
      const inv = await auth.api.createInvitation({
        headers: caller.headers,
        body: { email: input.email, role: input.role, organizationId: lab.id, resend: true },
      });
      await record(caller.userId, lab.id, 'invitation.sent', { type: 'invitation', id: inv.id }, { member: input.email, role: input.role }, { from: null, to: 'pending' });
      return { id: inv.id, email: inv.email, role: input.role, status: inv.status, expiresAt: iso(new Date(inv.expiresAt)) };
    },

    async cancelInvitation(caller: Caller, lab: LabContext, invitationId: string) {
      const inv = await labs.findInvitation(invitationId);
      if (!inv || inv.labId !== lab.id) throw notFound('The invitation');
      await auth.api.cancelInvitation({ headers: caller.headers, body: { invitationId } });
      await record(caller.userId, lab.id, 'invitation.cancelled', { type: 'invitation', id: invitationId }, { member: inv.email, role: inv.role }, { from: inv.status, to: 'canceled' });
    },

    async changeRole(caller: Caller, lab: LabContext, memberId: string, role: LabRole) {
      const target = await labs.findMember(lab.id, memberId);
      if (!target) throw notFound('The member');
      if (target.role === 'lead' && role !== 'lead') {
        const leads = (await labs.members(lab.id)).filter((m) => m.role === 'lead');
        if (leads.length === 1) {
          throw new AppError('last_lead', 'A lab needs at least one lead: make someone else lead first.', 409);
        }
      }
      await auth.api.updateMemberRole({ headers: caller.headers, body: { memberId, role, organizationId: lab.id } });
      if (target.role !== role) await record(caller.userId, lab.id, 'member.role_changed', { type: 'member', id: memberId }, { member: target.email }, { from: target.role, to: role });
      return { id: memberId, role };
    },

    async invitation(caller: Caller, id: string): Promise<InvitationView> {
      return invitationView(caller, await labs.findInvitation(id));
    },

    async respond(caller: Caller, id: string, answer: 'accept' | 'reject') {
      const inv = await labs.findInvitation(id);
      const view = invitationView(caller, inv);
      if (view.status === 'expired') throw new AppError('invitation_expired', 'This invitation has expired. Ask the lab lead to invite you again.', 410);
      if (view.status !== 'pending') throw new AppError('invitation_closed', `This invitation was already ${view.status}.`, 409);
      if (answer === 'accept') await auth.api.acceptInvitation({ headers: caller.headers, body: { invitationId: id } });
      else await auth.api.rejectInvitation({ headers: caller.headers, body: { invitationId: id } });
      await record(caller.userId, inv!.labId, `invitation.${answer === 'accept' ? 'accepted' : 'declined'}`, { type: 'invitation', id }, { member: view.email, role: view.role }, { from: 'pending', to: answer === 'accept' ? 'accepted' : 'rejected' });
      return { labSlug: view.labSlug, status: answer === 'accept' ? 'accepted' : 'rejected' };
    },
  };
}

/** What the invited address may see of an invitation; anyone else gets the same answer as for a missing one. */
function invitationView(caller: Caller, inv: Awaited<ReturnType<LabsRepository['findInvitation']>>): InvitationView {
  if (!inv || inv.email.toLowerCase() !== caller.email.toLowerCase()) throw notFound('The invitation');
  const expired = inv.status === 'pending' && inv.expiresAt.getTime() < Date.now();
  return {
    id: inv.id,
    labName: inv.labName,
    labSlug: inv.labSlug,
    role: inv.role,
    email: inv.email,
    status: expired ? 'expired' : inv.status,
    expiresAt: iso(inv.expiresAt),
    inviterName: inv.inviterName,
  };
}

export type LabsService = ReturnType<typeof createLabsService>;
