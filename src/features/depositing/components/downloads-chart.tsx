import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';

/** Downloads per month of the lab's releases (files and bundles). */
export default function DownloadsChart({ data }: { data: Array<{ month: string; downloads: number }> }) {
  if (!data.length) return <p className="text-sm text-ink/70">No downloads yet.</p>;
  const total = data.reduce((s, d) => s + d.downloads, 0);
  return (
    <figure className="rounded-lg border border-mist bg-white p-3">
      <div className="h-56" data-testid="downloads-chart">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 12, bottom: 20, left: 8 }}>
            <CartesianGrid stroke="#dfe5e8" vertical={false} />
            <XAxis dataKey="month" tick={{ fontSize: 11 }} label={{ value: 'month (UTC)', position: 'insideBottom', offset: -12, fontSize: 11 }} />
            <YAxis allowDecimals={false} tick={{ fontSize: 11 }} label={{ value: 'downloads', angle: -90, position: 'insideLeft', fontSize: 11 }} />
            <Tooltip />
            <Bar dataKey="downloads" fill="#0072B2" />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-ink/70">{total.toLocaleString('en-GB')} downloads of files and bundles in all, per month.</figcaption>
    </figure>
  );
}
