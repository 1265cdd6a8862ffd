/**
 * One frame of a trajectory dataset in columnar form: `count` individuals,
 * positions in metres, velocities in m/s, accelerations in m/s². Entries
 * that are unknown (e.g. no velocity at a track's ends) are `NaN`.
 * For `dims === 2` the `z`, `vz`, `az` arrays are ignored.
 */
export interface FrameView {
  count: number;
  dims: 2 | 3;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  z: ArrayLike<number>;
  vx?: ArrayLike<number>;
  vy?: ArrayLike<number>;
  vz?: ArrayLike<number>;
  ax?: ArrayLike<number>;
  ay?: ArrayLike<number>;
  az?: ArrayLike<number>;
}

/** Accessor used by the `(values, valueof?)` functions. */
export type Valueof<T> = (d: T, i: number) => number;

/** A point in 2D or 3D (z = 0 in 2D). */
export interface Vec3 {
  x: number;
  y: number;
  z: number;
}
