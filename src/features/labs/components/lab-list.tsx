import { Link } from 'react-router-dom';
import type { LabSummary } from '../../../../shared/contracts';
import { DemoBadge } from '../../../components/badge';
import { paths } from '../../../app/paths';
import { RoleBadge } from './role-badge';

export function LabList({ labs }: { labs: LabSummary[] }) {
  if (labs.length === 0) {
    return <p className="text-ink/75">You are not a member of any lab yet. Create one, or ask a lab lead to invite you.</p>;
  }
  return (
    <ul className="grid gap-3 sm:grid-cols-2">
      {labs.map((lab) => (
        <li key={lab.id} className="rounded-lg border border-mist bg-white p-4">
          <div className="flex flex-wrap items-center gap-2">
            <Link to={paths.lab(lab.slug)} className="font-serif text-lg font-bold">{lab.name}</Link>
            {lab.isDemo ? <DemoBadge /> : null}
          </div>
          {lab.institution ? <p className="mt-1 text-sm text-ink/75">{lab.institution}</p> : null}
          <div className="mt-3 flex items-center gap-3 text-sm">
            {lab.myRole ? <RoleBadge role={lab.myRole} /> : null}
            <span className="text-ink/70">{lab.memberCount} {lab.memberCount === 1 ? 'member' : 'members'}</span>
          </div>
        </li>
      ))}
    </ul>
  );
}
