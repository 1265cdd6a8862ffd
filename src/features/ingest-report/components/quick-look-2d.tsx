import { useMemo } from 'react';
import type { DecodedQuickLookFrame } from '../../../../shared/engine/quick-look-decode';
import { formatNumber } from '../../../lib/format';
import { seriesColour } from '../palette';

const W = 640;
const H = 400;
const PAD = 36;

/**
 * The sample drawn in the x–y plane (a 2D file, or the projection of a 3D one),
 * equal scales on both axes, y upwards; optional trails of the last frames.
 */
export function QuickLook2D({ frames, index, dims, bounds, trail }: {
  frames: DecodedQuickLookFrame[];
  index: number;
  dims: 2 | 3;
  bounds: { min: number[]; max: number[] };
  trail: number;
}) {
  const [x0, y0] = bounds.min;
  const [x1, y1] = bounds.max;
  const scale = Math.min((W - 2 * PAD) / Math.max(x1 - x0, 1e-12), (H - 2 * PAD) / Math.max(y1 - y0, 1e-12));
  const ox = (W - scale * (x1 - x0)) / 2;
  const oy = (H - scale * (y1 - y0)) / 2;
  const px = (x: number) => ox + (x - x0) * scale;
  const py = (y: number) => H - oy - (y - y0) * scale;

  const frame = frames[index];
  const trails = useMemo(() => {
    if (!trail) return [];
    const byTrack = new Map<number, string[]>();
    for (let k = Math.max(0, index - trail); k <= index; k++) {
      const f = frames[k];
      f.ids.forEach((id, i) => {
        const x = f.positions[i * dims], y = f.positions[i * dims + 1];
        if (!Number.isFinite(x) || !Number.isFinite(y)) return;
        const list = byTrack.get(id) ?? [];
        list.push(`${px(x).toFixed(1)},${py(y).toFixed(1)}`);
        byTrack.set(id, list);
      });
    }
    return [...byTrack.entries()].filter(([, pts]) => pts.length > 1);
    // px/py follow from bounds, which belong to the same sample as frames.
  }, [frames, index, trail, dims]);

  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="h-full w-full" role="img" aria-label={`Positions at t = ${formatNumber(frame?.t)} s, x–y plane`} data-testid="quick-look-2d">
      <rect x={px(x0)} y={py(y1)} width={(x1 - x0) * scale} height={(y1 - y0) * scale} fill="#ffffff" stroke="#b7c3c9" />
      <text x={px(x0)} y={py(y0) + 16} fontSize="11" fill="#1d2a33">{formatNumber(x0)} m</text>
      <text x={px(x1)} y={py(y0) + 16} fontSize="11" fill="#1d2a33" textAnchor="end">{formatNumber(x1)} m</text>
      <text x={(px(x0) + px(x1)) / 2} y={py(y0) + 28} fontSize="11" fill="#1d2a33" textAnchor="middle">x (m)</text>
      <text x={px(x0) - 6} y={py(y0)} fontSize="11" fill="#1d2a33" textAnchor="end">{formatNumber(y0)}</text>
      <text x={px(x0) - 6} y={py(y1) + 10} fontSize="11" fill="#1d2a33" textAnchor="end">{formatNumber(y1)}</text>
      <text transform={`translate(${px(x0) - 14} ${(py(y0) + py(y1)) / 2}) rotate(-90)`} fontSize="11" fill="#1d2a33" textAnchor="middle">y (m)</text>
      {trails.map(([id, pts]) => (
        <polyline key={id} points={pts.join(' ')} fill="none" stroke={seriesColour(id)} strokeOpacity={0.35} strokeWidth={1.5} />
      ))}
      {frame?.ids.map((id, i) => {
        const x = frame.positions[i * dims], y = frame.positions[i * dims + 1];
        if (!Number.isFinite(x) || !Number.isFinite(y)) return null;
        return <circle key={id} cx={px(x)} cy={py(y)} r={4} fill={seriesColour(id)} stroke="#ffffff" strokeWidth={1} />;
      })}
    </svg>
  );
}
