/**
 * The Grid3 type: a cubic, cell-centred, periodic-indexed 3D grid.
 *
 * Conventions (bind every file that touches a grid):
 * - shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k, i along x, k along z (fastest);
 * - the box spans [-L/2, L/2) on each axis; cell (i, j, k) is centred at
 *   x = -L/2 + (i + 1/2) dx, and likewise for y and z;
 * - fields are Float32Array in cgs (g/cm^3, cm/s, K, gauss); sums are accumulated in Float64.
 */

/** Shape and physical size of a grid; lengths in cm. */
export interface Grid3 {
  readonly nx: number;
  readonly ny: number;
  readonly nz: number;
  /** Side of the cubic box, cm. */
  readonly boxSize: number;
}

/** Creates a cubic grid of n cells per side spanning boxSize cm. */
export function cubicGrid(n: number, boxSize: number): Grid3 {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`cells per side must be a positive integer, got ${n}`);
  if (!(boxSize > 0)) throw new RangeError(`box size must be positive, got ${boxSize}`);
  return { nx: n, ny: n, nz: n, boxSize };
}

/** Number of cells in the grid. */
export function cellCount(g: Grid3): number {
  return g.nx * g.ny * g.nz;
}

/** Cell size dx, cm (cells are cubes; nx sets the spacing). */
export function cellSize(g: Grid3): number {
  return g.boxSize / g.nx;
}

/** Cell volume, cm^3. */
export function cellVolume(g: Grid3): number {
  const dx = cellSize(g);
  return dx * dx * dx;
}

/** Flat index of cell (i, j, k). */
export function cellIndex(g: Grid3, i: number, j: number, k: number): number {
  return (i * g.ny + j) * g.nz + k;
}

/** Centre coordinate, cm, of cell index i along an axis of n cells over boxSize. */
export function cellCentre(i: number, n: number, boxSize: number): number {
  return -boxSize / 2 + ((i + 0.5) * boxSize) / n;
}

/** A new zero-filled field for the grid, optionally backed by shared memory for worker threads. */
export function newField(g: Grid3, shared = false): Float32Array {
  const n = cellCount(g);
  return shared ? new Float32Array(new SharedArrayBuffer(n * 4)) : new Float32Array(n);
}

/** Sum of a field times the cell volume (e.g. mass in g from density), accumulated in Float64. */
export function volumeIntegral(g: Grid3, field: Float32Array): number {
  let s = 0;
  for (let i = 0; i < field.length; i++) s += field[i]!;
  return s * cellVolume(g);
}

/** True when n is a power of two (the FFT needs it). */
export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
}
