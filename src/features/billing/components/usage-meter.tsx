import type { StorageUsage } from '../../../../shared/contracts';
import { formatBytes } from '../../../../shared/billing-format';

const pct = (part: number, whole: number) => (whole > 0 ? Math.min(100, (part / whole) * 100) : 100);

/** Storage used against the quota: an accessible meter with the numbers in words, and a breakdown. */
export function UsageMeter({ usage }: { usage: StorageUsage }) {
  const taken = usage.usedBytes + usage.reservedBytes;
  const share = pct(taken, usage.quotaBytes);
  const tone = share >= 90 ? 'bg-ember' : 'bg-dusk';
  const text = `${formatBytes(taken)} of ${formatBytes(usage.quotaBytes)} used (${Math.round(share)} %), ${formatBytes(usage.availableBytes)} left`;
  return (
    <div className="rounded-lg border border-mist bg-white p-4">
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-semibold" id="usage-label">Storage used</p>
        <p className="text-sm tabular-nums text-ink/80">{text}</p>
      </div>
      <div
        role="meter"
        aria-labelledby="usage-label"
        aria-valuemin={0}
        aria-valuemax={usage.quotaBytes}
        aria-valuenow={taken}
        aria-valuetext={text}
        className="flex h-4 w-full overflow-hidden rounded-full border border-[#b7c3c9] bg-paper"
      >
        <div className={`${tone} h-full`} style={{ width: `${pct(usage.usedBytes, usage.quotaBytes)}%` }} />
        {usage.reservedBytes > 0 ? (
          <div className="h-full bg-[repeating-linear-gradient(45deg,#24506b_0,#24506b_4px,#9fb6c4_4px,#9fb6c4_8px)]" style={{ width: `${pct(usage.reservedBytes, usage.quotaBytes) - 0}%` }} />
        ) : null}
      </div>
      <table className="mt-4 w-full text-sm">
        <caption className="sr-only">Storage by kind of file</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="py-1 font-semibold">Kind</th>
            <th className="py-1 text-right font-semibold">Files</th>
            <th className="py-1 text-right font-semibold">Size</th>
          </tr>
        </thead>
        <tbody>
          {usage.breakdown.length === 0 ? (
            <tr>
              <td colSpan={3} className="py-2 text-ink/70">Nothing stored yet.</td>
            </tr>
          ) : (
            usage.breakdown.map((b) => (
              <tr key={b.label} className="border-b border-mist/70">
                <td className="py-1">{b.label}</td>
                <td className="py-1 text-right tabular-nums">{b.label === 'Uploads in progress' ? '—' : b.objects}</td>
                <td className="py-1 text-right tabular-nums">{formatBytes(b.bytes)}</td>
              </tr>
            ))
          )}
        </tbody>
      </table>
      <table className="mt-4 w-full text-sm">
        <caption className="sr-only">Storage by where the files are</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="py-1 font-semibold">Where</th>
            <th className="py-1 text-right font-semibold">Files</th>
            <th className="py-1 text-right font-semibold">Size</th>
          </tr>
        </thead>
        <tbody>
          {(usage.byPlace ?? []).map((b) => (
            <tr key={b.label} className="border-b border-mist/70">
              <td className="py-1">{b.label}</td>
              <td className="py-1 text-right tabular-nums">{b.objects}</td>
              <td className="py-1 text-right tabular-nums">{formatBytes(b.bytes)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-2 text-xs text-ink/70">
        Each stored file counts once, however many drafts and releases include it. Space held for uploads in progress counts until they finish or are cancelled.
      </p>
    </div>
  );
}
