import { useState } from 'react';
import type { IngestOptionsInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert } from '../../../components/form';
import { Section } from '../../../components/page';
import { errorMessage, Loading } from '../../../components/query-state';
import { useFilePreview } from '../api/get-file-preview';
import { useReingestFile } from '../api/reingest-file';

const COLUMNS = ['track_id', 'frame', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const;
const LABELS: Record<string, string> = {
  track_id: 'Track id', frame: 'Frame number', t: 'Time (s)', x: 'x', y: 'y', z: 'z',
  vx: 'Velocity x', vy: 'Velocity y', vz: 'Velocity z', ax: 'Acceleration x', ay: 'Acceleration y', az: 'Acceleration z',
};

const splitLine = (line: string) => line.split(line.includes('\t') ? '\t' : line.includes(';') ? ';' : ',');

/** The column-mapping step: preview the first rows, say which column holds what, choose units, check again. */
export function ColumnMapping({ slug, draftId, fileId, current, open: startOpen }: { slug: string; draftId: string; fileId: string; current: IngestOptionsInput; open: boolean }) {
  const [open, setOpen] = useState(startOpen);
  const preview = useFilePreview(slug, draftId, fileId, open);
  const reingest = useReingestFile(slug, draftId, fileId);
  const [hasHeader, setHasHeader] = useState<boolean>(current.hasHeader ?? true);
  const [mapping, setMapping] = useState<Record<string, string>>(() => Object.fromEntries(Object.entries(current.mapping ?? {}).map(([k, v]) => [k, String(v)])));
  const [units, setUnits] = useState(current.units ?? 'm');
  const [fps, setFps] = useState(current.fps ? String(current.fps) : '');
  const [dims, setDims] = useState(current.dims ? String(current.dims) : '');
  const [pixelScale, setPixelScale] = useState(current.pixelScale ? String(current.pixelScale) : '');
  const [gravity, setGravity] = useState(current.gravityAxis ?? '');
  const [error, setError] = useState<string | null>(null);

  if (!open) {
    return (
      <div className="mt-6">
        <Button variant="secondary" onClick={() => setOpen(true)}>Map columns and check again</Button>
      </div>
    );
  }
  const lines = preview.data?.lines ?? [];
  const cells = lines.map(splitLine);
  const header = hasHeader ? cells[0] ?? [] : (cells[0] ?? []).map((_, i) => `column ${i + 1}`);
  const body = hasHeader ? cells.slice(1) : cells;

  const run = () => {
    setError(null);
    const m: Record<string, string | number> = {};
    for (const [k, v] of Object.entries(mapping)) if (v !== '') m[k] = hasHeader ? header[Number(v)] : Number(v);
    const options: IngestOptionsInput = {
      hasHeader,
      mapping: m as IngestOptionsInput['mapping'],
      units: units as IngestOptionsInput['units'],
      fps: fps ? Number(fps) : null,
      dims: dims ? (Number(dims) as 2 | 3) : null,
      pixelScale: pixelScale ? Number(pixelScale) : null,
      gravityAxis: (gravity || null) as IngestOptionsInput['gravityAxis'],
    };
    reingest.mutate(options, { onError: (e) => setError(errorMessage(e)) });
  };

  const select = 'rounded border border-[#b7c3c9] bg-white px-2 py-1 text-sm';
  return (
    <Section title="Columns and units">
      <div className="flex flex-col gap-4 rounded-lg border border-mist bg-white p-4">
        {error ? <FormAlert>{error}</FormAlert> : null}
        {reingest.isSuccess ? <FormAlert tone="success">Checking the file again with these settings…</FormAlert> : null}
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={hasHeader} onChange={(e) => setHasHeader(e.target.checked)} />
          The first line holds column names
        </label>
        {preview.isPending ? (
          <Loading label="Reading the first lines…" />
        ) : (
          <div className="overflow-x-auto">
            <table className="border-collapse font-mono text-xs" data-testid="preview">
              <thead>
                <tr>
                  {header.map((h, i) => (
                    <th key={i} className="border border-mist px-2 py-1 text-left">
                      <div className="font-sans font-medium">{h}</div>
                      <label className="mt-1 block font-sans">
                        <span className="sr-only">Meaning of {h}</span>
                        <select
                          className={select}
                          aria-label={`Meaning of ${h}`}
                          value={Object.entries(mapping).find(([, v]) => v === String(i))?.[0] ?? ''}
                          onChange={(e) => {
                            const next = Object.fromEntries(Object.entries(mapping).filter(([, v]) => v !== String(i)));
                            if (e.target.value) next[e.target.value] = String(i);
                            setMapping(next);
                          }}
                        >
                          <option value="">(not used)</option>
                          {COLUMNS.map((c) => (
                            <option key={c} value={c}>{LABELS[c]}</option>
                          ))}
                        </select>
                      </label>
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {body.slice(0, 8).map((row, r) => (
                  <tr key={r}>
                    {row.map((c, i) => (
                      <td key={i} className="border border-mist px-2 py-0.5">{c}</td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <div className="flex flex-wrap gap-4 text-sm">
          <label className="flex flex-col gap-1">Length unit
            <select className={select} value={units} onChange={(e) => setUnits(e.target.value as typeof units)}>
              {['m', 'cm', 'mm', 'px'].map((u) => <option key={u} value={u}>{u}</option>)}
            </select>
          </label>
          {units === 'px' ? (
            <label className="flex flex-col gap-1">Metres per pixel
              <input className={select} inputMode="decimal" value={pixelScale} onChange={(e) => setPixelScale(e.target.value)} />
            </label>
          ) : null}
          <label className="flex flex-col gap-1">Frame rate (frames/s)
            <input className={select} inputMode="decimal" value={fps} onChange={(e) => setFps(e.target.value)} placeholder="from the metadata" />
          </label>
          <label className="flex flex-col gap-1">Dimension
            <select className={select} value={dims} onChange={(e) => setDims(e.target.value)}>
              <option value="">from the columns</option><option value="2">2D</option><option value="3">3D</option>
            </select>
          </label>
          <label className="flex flex-col gap-1">Axis pointing up
            <select className={select} value={gravity} onChange={(e) => setGravity(e.target.value)}>
              <option value="">not given</option><option value="x">x</option><option value="y">y</option><option value="z">z</option>
            </select>
          </label>
        </div>
        <div>
          <Button onClick={run} busy={reingest.isPending}>Check the file again</Button>
        </div>
      </div>
    </Section>
  );
}
