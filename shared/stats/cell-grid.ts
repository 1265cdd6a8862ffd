import type { FrameView } from './types';

/** Points of one frame sorted into cubic cells (counting sort). */
export interface CellGrid {
  cellSize: number;
  dims: 2 | 3;
  /** Cells per axis. */
  nx: number;
  ny: number;
  nz: number;
  minX: number;
  minY: number;
  minZ: number;
  /** cellStart[c] .. cellStart[c+1] index into `items` for cell c. */
  cellStart: Int32Array;
  /** Point indices grouped by cell. */
  items: Int32Array;
  /** Cell index of each point, −1 for points with non-finite coordinates. */
  cellOf: Int32Array;
}

/**
 * Builds a uniform cell list over the finite points of a frame.
 *
 * Method: cell list with counting sort ("Computer simulation of liquids",
 * Allen & Tildesley, 1987) [common practice]. `cellSize` is raised when
 * needed so the grid has at most `maxCells` cells (outliers cannot make it
 * explode). Units: metres. Empty frame: a 1-cell grid with no items.
 */
export function buildCellGrid(frame: FrameView, cellSize: number, maxCells = 4 * frame.count + 64): CellGrid {
  const { count, dims, x, y, z } = frame;
  let minX = Infinity, minY = Infinity, minZ = Infinity;
  let maxX = -Infinity, maxY = -Infinity, maxZ = -Infinity;
  for (let i = 0; i < count; i++) {
    const zi = dims === 3 ? z[i] : 0;
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || !Number.isFinite(zi)) continue;
    if (x[i] < minX) minX = x[i];
    if (x[i] > maxX) maxX = x[i];
    if (y[i] < minY) minY = y[i];
    if (y[i] > maxY) maxY = y[i];
    if (zi < minZ) minZ = zi;
    if (zi > maxZ) maxZ = zi;
  }
  if (minX === Infinity) {
    minX = minY = minZ = 0;
    maxX = maxY = maxZ = 0;
  }
  let h = cellSize > 0 && Number.isFinite(cellSize) ? cellSize : 1;
  const ex = maxX - minX, ey = maxY - minY, ez = dims === 3 ? maxZ - minZ : 0;
  const cellsFor = (s: number) => (Math.floor(ex / s) + 1) * (Math.floor(ey / s) + 1) * (Math.floor(ez / s) + 1);
  while (cellsFor(h) > maxCells) h *= 1.5;
  const nx = Math.floor(ex / h) + 1;
  const ny = Math.floor(ey / h) + 1;
  const nz = Math.floor(ez / h) + 1;
  const cellOf = new Int32Array(count);
  const cellStart = new Int32Array(nx * ny * nz + 1);
  for (let i = 0; i < count; i++) {
    const zi = dims === 3 ? z[i] : 0;
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || !Number.isFinite(zi)) {
      cellOf[i] = -1;
      continue;
    }
    const cx = Math.min(nx - 1, Math.floor((x[i] - minX) / h));
    const cy = Math.min(ny - 1, Math.floor((y[i] - minY) / h));
    const cz = Math.min(nz - 1, Math.floor((zi - minZ) / h));
    const c = (cz * ny + cy) * nx + cx;
    cellOf[i] = c;
    cellStart[c + 1]++;
  }
  for (let c = 0; c < nx * ny * nz; c++) cellStart[c + 1] += cellStart[c];
  const fill = cellStart.slice(0, nx * ny * nz);
  const items = new Int32Array(cellStart[nx * ny * nz]);
  for (let i = 0; i < count; i++) if (cellOf[i] >= 0) items[fill[cellOf[i]]++] = i;
  return { cellSize: h, dims, nx, ny, nz, minX, minY, minZ: dims === 3 ? minZ : 0, cellStart, items, cellOf };
}
