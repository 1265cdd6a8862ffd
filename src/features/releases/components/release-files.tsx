import { formatBytes } from '../../../lib/format';

export function ReleaseFiles({ files }: { files: Array<{ fileName: string; role: string; sizeBytes: number; sha256: string }> }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-mist bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Files of this release</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="px-3 py-2 font-semibold">File</th>
            <th className="px-3 py-2 font-semibold">Kind</th>
            <th className="px-3 py-2 text-right font-semibold">Size</th>
            <th className="px-3 py-2 font-semibold">SHA-256</th>
          </tr>
        </thead>
        <tbody>
          {files.map((f) => (
            <tr key={f.fileName} className="border-b border-mist/70">
              <td className="px-3 py-2 font-medium">{f.fileName}</td>
              <td className="px-3 py-2">{f.role}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatBytes(f.sizeBytes)}</td>
              <td className="px-3 py-2 font-mono text-xs break-all">{f.sha256}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="px-3 py-2 text-xs text-ink/60">The SHA-256 checksums let anyone verify a copy of these files.</p>
    </div>
  );
}
