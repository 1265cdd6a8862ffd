import { Link } from 'react-router-dom';
import type { AdminLab } from '../../../../shared/contracts';
import { DemoBadge } from '../../../components/badge';
import { paths } from '../../../app/paths';

export function LabsTable({ labs }: { labs: AdminLab[] }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-mist bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Labs</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="px-3 py-2 font-semibold">Lab</th>
            <th className="px-3 py-2 font-semibold">Institution</th>
            <th className="px-3 py-2 font-semibold">Lead</th>
            <th className="px-3 py-2 text-right font-semibold">Members</th>
            <th className="px-3 py-2 font-semibold">Created</th>
          </tr>
        </thead>
        <tbody>
          {labs.map((l) => (
            <tr key={l.id} className="border-b border-mist/70">
              <td className="px-3 py-2">
                <Link to={paths.lab(l.slug)}>{l.name}</Link> {l.isDemo ? <DemoBadge /> : null}
              </td>
              <td className="px-3 py-2">{l.institution}</td>
              <td className="px-3 py-2">{l.leadNames.join(', ')}</td>
              <td className="px-3 py-2 text-right tabular-nums">{l.memberCount}</td>
              <td className="px-3 py-2 tabular-nums">{l.createdAt.slice(0, 10)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
