import { z } from 'zod';
import { LAB_ROLES } from '../lab-roles';
import { email } from './auth';

const ROR = /^(https:\/\/ror\.org\/)?0[a-hj-km-np-tv-z0-9]{6}\d{2}$/;

export const labRole = z.enum(LAB_ROLES);

export const createLabInput = z.object({
  name: z.string().trim().min(3, 'Give the lab a name of at least 3 characters').max(120),
  slug: z
    .string()
    .trim()
    .toLowerCase()
    .min(3, 'Use at least 3 characters')
    .max(48, 'Use at most 48 characters')
    .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens'),
  institution: z.string().trim().max(200).default(''),
  rorId: z
    .string()
    .trim()
    .max(40)
    .refine((v) => v === '' || ROR.test(v), 'A ROR id looks like https://ror.org/05dxps055 or 05dxps055')
    .transform((v) => (v === '' ? '' : `https://ror.org/${v.replace(/^https:\/\/ror\.org\//, '')}`))
    .default(''),
  description: z.string().trim().max(2000).default(''),
});
export type CreateLabInput = z.input<typeof createLabInput>;
export type CreateLab = z.output<typeof createLabInput>;

export const inviteMemberInput = z.object({ email, role: labRole });
export type InviteMemberInput = z.infer<typeof inviteMemberInput>;

export const changeRoleInput = z.object({ role: labRole });

export const labSummary = z.object({
  id: z.string(),
  name: z.string(),
  slug: z.string(),
  institution: z.string().nullable(),
  rorId: z.string().nullable(),
  description: z.string().nullable(),
  isDemo: z.boolean(),
  memberCount: z.number(),
  myRole: labRole.nullable(),
});
export type LabSummary = z.infer<typeof labSummary>;

export const labMember = z.object({
  id: z.string(),
  userId: z.string(),
  name: z.string(),
  // Only members of the lab see addresses.
  email: z.string().nullable(),
  role: labRole,
  joinedAt: z.string(),
});
export type LabMember = z.infer<typeof labMember>;

export const labInvitation = z.object({
  id: z.string(),
  email: z.string(),
  role: labRole,
  status: z.string(),
  expiresAt: z.string(),
  invitedBy: z.string(),
});
export type LabInvitation = z.infer<typeof labInvitation>;

export const labDetail = labSummary.extend({
  members: z.array(labMember),
  invitations: z.array(labInvitation).nullable(),
});
export type LabDetail = z.infer<typeof labDetail>;

export const invitationView = z.object({
  id: z.string(),
  labName: z.string(),
  labSlug: z.string(),
  role: labRole,
  email: z.string(),
  status: z.string(),
  expiresAt: z.string(),
  inviterName: z.string(),
});
export type InvitationView = z.infer<typeof invitationView>;
