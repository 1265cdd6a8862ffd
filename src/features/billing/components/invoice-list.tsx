import type { InvoiceView } from '../../../../shared/contracts';
import { formatMoney } from '../../../../shared/billing-format';
import { Badge } from '../../../components/badge';

const statusBadge = (s: string | null) =>
  s === 'paid' ? <Badge tone="reed" icon="✓">Paid</Badge> : s === 'open' ? <Badge tone="ember" icon="!">Unpaid</Badge> : <Badge icon="·">{s ?? 'Unknown'}</Badge>;

/** Invoices as the payment provider returns them (amounts, status, its own invoice page). */
export function InvoiceList({ invoices }: { invoices: InvoiceView[] }) {
  if (invoices.length === 0) return <p className="text-sm text-ink/70">No invoices yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-mist bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Invoices</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="px-3 py-2 font-semibold">Number</th>
            <th className="px-3 py-2 font-semibold">Date</th>
            <th className="px-3 py-2 font-semibold">Period</th>
            <th className="px-3 py-2 text-right font-semibold">Subtotal</th>
            <th className="px-3 py-2 text-right font-semibold">Total</th>
            <th className="px-3 py-2 font-semibold">Status</th>
          </tr>
        </thead>
        <tbody>
          {invoices.map((i) => (
            <tr key={i.id} className="border-b border-mist/70">
              <td className="px-3 py-2">{i.hostedUrl ? <a href={i.hostedUrl} target="_blank" rel="noreferrer">{i.number ?? i.id}</a> : (i.number ?? i.id)}</td>
              <td className="px-3 py-2 tabular-nums">{i.created.slice(0, 10)}</td>
              <td className="px-3 py-2 tabular-nums">{i.periodStart && i.periodEnd ? `${i.periodStart.slice(0, 10)} – ${i.periodEnd.slice(0, 10)}` : '—'}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatMoney(i.subtotal, i.currency)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatMoney(i.total, i.currency)}</td>
              <td className="px-3 py-2">{statusBadge(i.status)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
