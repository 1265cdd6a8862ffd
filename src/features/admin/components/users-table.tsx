import { Link } from 'react-router-dom';
import type { AdminUser } from '../../../../shared/contracts';
import { Badge } from '../../../components/badge';
import { paths } from '../../../app/paths';

export function UsersTable({ users }: { users: AdminUser[] }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-mist bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Accounts</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="px-3 py-2 font-semibold">Name</th>
            <th className="px-3 py-2 font-semibold">E-mail</th>
            <th className="px-3 py-2 font-semibold">Address</th>
            <th className="px-3 py-2 font-semibold">Platform role</th>
            <th className="px-3 py-2 font-semibold">Labs</th>
            <th className="px-3 py-2 font-semibold">Joined</th>
          </tr>
        </thead>
        <tbody>
          {users.map((u) => (
            <tr key={u.id} className="border-b border-mist/70 align-top">
              <td className="px-3 py-2">{u.name}</td>
              <td className="px-3 py-2">{u.email}</td>
              <td className="px-3 py-2">
                {u.emailVerified ? <Badge tone="reed" icon="✓">Confirmed</Badge> : <Badge tone="ember" icon="…">Not confirmed</Badge>}
              </td>
              <td className="px-3 py-2">{u.platformRole === 'admin' ? <Badge tone="dusk" icon="⚙">Admin</Badge> : 'Researcher'}</td>
              <td className="px-3 py-2">
                {u.labs.map((l) => (
                  <div key={l.slug}>
                    <Link to={paths.lab(l.slug)}>{l.name}</Link> <span className="text-ink/60">({l.role})</span>
                  </div>
                ))}
              </td>
              <td className="px-3 py-2 tabular-nums">{u.createdAt.slice(0, 10)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
