import type { StoragePlanView } from '../../../../shared/contracts';
import { formatBytes, formatMoney } from '../../../../shared/billing-format';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { useUpdatePlan } from '../api/update-plan';
import { useState, Fragment } from 'react';
import { PlanForm } from './plan-form';

/** The whole catalogue for the admin, with archive and restore. */
export function PlansTable({ plans }: { plans: StoragePlanView[] }) {
  const update = useUpdatePlan();
  const [editing, setEditing] = useState<string | null>(null);
  return (
    <div className="overflow-x-auto rounded-lg border border-mist bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Storage plans</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="px-3 py-2 font-semibold">Plan</th>
            <th className="px-3 py-2 text-right font-semibold">Quota</th>
            <th className="px-3 py-2 text-right font-semibold">Per month</th>
            <th className="px-3 py-2 font-semibold">Status</th>
            <th className="px-3 py-2 font-semibold">Payment provider</th>
            <th className="px-3 py-2"><span className="sr-only">Actions</span></th>
          </tr>
        </thead>
        <tbody>
          {plans.map((p) => (
            <Fragment key={p.id}>
            <tr className="border-b border-mist/70">
              <td className="px-3 py-2">
                <span className="font-medium">{p.name}</span>
                {p.description ? <span className="block text-xs text-ink/70">{p.description}</span> : null}
              </td>
              <td className="px-3 py-2 text-right tabular-nums">{formatBytes(p.quotaBytes)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatMoney(p.monthlyPriceMinor, p.currency)}</td>
              <td className="px-3 py-2">{p.status === 'active' ? <Badge tone="reed" icon="●">On offer</Badge> : <Badge icon="▪">Archived</Badge>}</td>
              <td className="px-3 py-2">{p.mirrored ? <Badge tone="dusk" icon="⇄">Mirrored</Badge> : <Badge icon="…">On first checkout</Badge>}</td>
              <td className="px-3 py-2 text-right">
                <Button
                  variant="quiet"
                  disabled={update.isPending}
                  onClick={() => update.mutate({ id: p.id, input: { status: p.status === 'active' ? 'archived' : 'active' } })}
                  aria-label={`${p.status === 'active' ? 'Archive' : 'Restore'} ${p.name}`}
                >
                  {p.status === 'active' ? 'Archive' : 'Restore'}
                </Button>
                <Button variant="quiet" onClick={() => setEditing(editing === p.id ? null : p.id)} aria-label={`Edit ${p.name}`}>
                  Edit
                </Button>
              </td>
            </tr>
            {editing === p.id ? (
              <tr className="border-b border-mist/70 bg-paper">
                <td colSpan={6} className="p-3">
                  <PlanForm plan={p} onDone={() => setEditing(null)} />
                </td>
              </tr>
            ) : null}
            </Fragment>
          ))}
        </tbody>
      </table>
      {update.isError ? <p role="alert" className="p-3 text-sm text-[#9a4a1c]">⚠ {update.error.message}</p> : null}
    </div>
  );
}
