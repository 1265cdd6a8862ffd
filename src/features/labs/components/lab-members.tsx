import { useState } from 'react';
import type { LabDetail } from '../../../../shared/contracts';
import { LAB_ROLES, labRoleCan, labRoleLabels, type LabRole } from '../../../../shared/lab-roles';
import { FormAlert } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { useChangeMemberRole } from '../api/change-member-role';
import { RoleBadge } from './role-badge';

export function LabMembers({ lab }: { lab: LabDetail }) {
  const canChange = labRoleCan(lab.myRole, { member: ['update'] });
  const change = useChangeMemberRole(lab.slug);
  const [error, setError] = useState<string | null>(null);

  return (
    <div className="overflow-x-auto">
      {error ? <FormAlert>{error}</FormAlert> : null}
      <table className="mt-2 w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="py-2 pr-4 font-semibold">Name</th>
            {lab.members.some((m) => m.email) ? <th className="py-2 pr-4 font-semibold">E-mail</th> : null}
            <th className="py-2 pr-4 font-semibold">Role</th>
            <th className="py-2 font-semibold">Member since</th>
          </tr>
        </thead>
        <tbody>
          {lab.members.map((m) => (
            <tr key={m.id} className="border-b border-mist/70">
              <td className="py-2 pr-4">{m.name}</td>
              {m.email ? <td className="py-2 pr-4">{m.email}</td> : lab.members.some((x) => x.email) ? <td /> : null}
              <td className="py-2 pr-4">
                {canChange ? (
                  <label className="flex items-center gap-2">
                    <span className="sr-only">Role of {m.name}</span>
                    <select
                      className="rounded border border-[#b7c3c9] bg-white px-2 py-1"
                      value={m.role}
                      disabled={change.isPending}
                      onChange={(e) => {
                        setError(null);
                        change.mutate({ memberId: m.id, role: e.target.value as LabRole }, { onError: (err) => setError(errorMessage(err)) });
                      }}
                    >
                      {LAB_ROLES.map((r) => (
                        <option key={r} value={r}>{labRoleLabels[r]}</option>
                      ))}
                    </select>
                  </label>
                ) : (
                  <RoleBadge role={m.role} />
                )}
              </td>
              <td className="py-2">{new Date(m.joinedAt).toLocaleDateString('en-GB', { dateStyle: 'medium' })}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
