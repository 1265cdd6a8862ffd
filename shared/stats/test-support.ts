import type { FrameView } from './types';

/** Builds a FrameView from point triples (tests and demo code). */
export function frameOf(
  dims: 2 | 3,
  r: ReadonlyArray<readonly number[]>,
  v?: ReadonlyArray<readonly number[]>,
  a?: ReadonlyArray<readonly number[]>,
): FrameView {
  const col = (rows: ReadonlyArray<readonly number[]> | undefined, k: number) =>
    rows ? Float64Array.from(rows, (p) => (p[k] ?? 0)) : undefined;
  return {
    count: r.length,
    dims,
    x: col(r, 0)!,
    y: col(r, 1)!,
    z: col(r, 2)!,
    vx: col(v, 0),
    vy: col(v, 1),
    vz: col(v, 2),
    ax: col(a, 0),
    ay: col(a, 1),
    az: col(a, 2),
  };
}
