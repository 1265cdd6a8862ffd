import { formatBytes } from '../../../lib/format';
import { FormAlert } from '../../../components/form';
import { bundleDownloadUrl, fileDownloadUrl, useReleaseAccess } from '../api/get-release-access';

export function ReleaseFiles({ suffix, files }: { suffix: string; files: Array<{ fileName: string; role: string; sizeBytes: number; sha256: string }> }) {
  const access = useReleaseAccess(suffix);
  const allowed = !!access.data?.allowed;
  return (
    <div className="flex flex-col gap-3">
      {access.data && !allowed ? <FormAlert tone="info">{access.data.reason}</FormAlert> : null}
      {allowed ? (
        <div className="flex flex-wrap items-center gap-3">
          {access.data?.bundleReady ? (
            <a href={bundleDownloadUrl(suffix)} className="rounded-md bg-dusk px-4 py-2 text-sm font-medium text-paper no-underline" data-testid="bundle-link">
              Download everything (ZIP, BagIt layout)
            </a>
          ) : (
            <span className="text-sm text-ink/70" role="status">The bundle of all files is being put together…</span>
          )}
        </div>
      ) : null}
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
                <td className="px-3 py-2 font-medium">
                  {allowed ? <a href={fileDownloadUrl(suffix, f.fileName)}>{f.fileName}</a> : f.fileName}
                </td>
                <td className="px-3 py-2">{f.role}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatBytes(f.sizeBytes)}</td>
                <td className="break-all px-3 py-2 font-mono text-xs">{f.sha256}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="px-3 py-2 text-xs text-ink/60">
          The SHA-256 checksums let anyone verify a copy of these files.
          {access.data ? ` Downloads, all versions: ${access.data.downloads.total.toLocaleString('en-GB')} (${access.data.downloads.unique.toLocaleString('en-GB')} unique; counted as the COUNTER Code of Practice asks).` : ''}
        </p>
      </div>
    </div>
  );
}
