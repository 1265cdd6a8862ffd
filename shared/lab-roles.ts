import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements } from 'better-auth/plugins/organization/access';

/**
 * What each lab role may do. One table, used by better-auth's organisation
 * plugin on the server, by our authorisation helper on every lab route, and
 * by the client to hide what a role cannot do.
 */
export const labStatements = {
  ...defaultStatements,
  lab: ['read-members', 'update'],
  dataset: ['create', 'edit'],
  release: ['review', 'publish', 'embargo'],
  accessRequest: ['decide'],
  billing: ['manage'],
} as const;

export const labAccessControl = createAccessControl(labStatements);

const depositor = labAccessControl.newRole({
  lab: ['read-members'],
  dataset: ['create', 'edit'],
});

const curator = labAccessControl.newRole({
  lab: ['read-members'],
  dataset: ['create', 'edit'],
  release: ['review', 'publish', 'embargo'],
  accessRequest: ['decide'],
});

const lead = labAccessControl.newRole({
  organization: ['update', 'delete'],
  member: ['create', 'update', 'delete'],
  invitation: ['create', 'cancel'],
  team: [],
  ac: [],
  lab: ['read-members', 'update'],
  dataset: ['create', 'edit'],
  release: ['review', 'publish', 'embargo'],
  accessRequest: ['decide'],
  billing: ['manage'],
});

export const labRoles = { lead, curator, depositor };

export const LAB_ROLES = ['lead', 'curator', 'depositor'] as const;
export type LabRole = (typeof LAB_ROLES)[number];

export const labRoleLabels: Record<LabRole, string> = {
  lead: 'Lab lead',
  curator: 'Curator',
  depositor: 'Depositor',
};

type Statements = typeof labStatements;
export type LabPermission = { [K in keyof Statements]?: Array<Statements[K][number]> };

/** True when the role grants every action asked for. */
export function labRoleCan(role: string | null | undefined, permission: LabPermission): boolean {
  if (!role) return false;
  const r = labRoles[role as LabRole];
  if (!r) return false;
  return r.authorize(permission as never).success;
}
