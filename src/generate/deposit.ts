/**
 * Depositing Gaussian blobs (clumps, fractal leaves) of given mass onto a density grid.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3; density Float32 in g/cm^3,
 * positions and widths in cm, masses in g. A blob is exp(-r^2 / (2 s^2)) with
 * s = max(sigma, dx/2), truncated at 3 s, restricted to cloud cells (inside = 1) and
 * normalised over the cells it touches, so each blob adds exactly its mass to the grid
 * (in Float64 before the Float32 store). A blob touching no cloud cell is skipped and its
 * mass reported back. Runs on one thread in blob order, so the bytes never depend on workers.
 */
import type { Grid3 } from '../grid/grid3.js';
import { cellCentre, cellSize, cellVolume } from '../grid/grid3.js';

/** A Gaussian blob: centre (cm), width sigma (cm) and mass (g). */
export interface Blob {
  readonly x: number;
  readonly y: number;
  readonly z: number;
  readonly sigma: number;
  readonly mass: number;
}

/** Adds every blob to density (inside cells only); returns the mass (g) of blobs that touched no cloud cell. */
export function depositBlobs(g: Grid3, density: Float32Array, inside: Uint8Array, blobs: readonly Blob[]): number {
  const dx = cellSize(g);
  const dv = cellVolume(g);
  const { nx, ny, nz, boxSize: L } = g;
  const idx = (x: number): number => Math.floor((x + L / 2) / dx - 0.5);
  let lost = 0;
  const cells: number[] = [];
  const weights: number[] = [];
  for (const b of blobs) {
    const s = Math.max(b.sigma, dx / 2);
    const reach = 3 * s;
    const i0 = Math.max(0, idx(b.x - reach)), i1 = Math.min(nx - 1, idx(b.x + reach) + 1);
    const j0 = Math.max(0, idx(b.y - reach)), j1 = Math.min(ny - 1, idx(b.y + reach) + 1);
    const k0 = Math.max(0, idx(b.z - reach)), k1 = Math.min(nz - 1, idx(b.z + reach) + 1);
    cells.length = 0;
    weights.length = 0;
    let sum = 0;
    const inv = 1 / (2 * s * s);
    for (let i = i0; i <= i1; i++) {
      const ddx = cellCentre(i, nx, L) - b.x;
      for (let j = j0; j <= j1; j++) {
        const ddy = cellCentre(j, ny, L) - b.y;
        for (let k = k0; k <= k1; k++) {
          const c = (i * ny + j) * nz + k;
          if (!inside[c]) continue;
          const ddz = cellCentre(k, nz, L) - b.z;
          const r2 = ddx * ddx + ddy * ddy + ddz * ddz;
          if (r2 > reach * reach) continue;
          const w = Math.exp(-r2 * inv);
          cells.push(c);
          weights.push(w);
          sum += w;
        }
      }
    }
    if (!(sum > 0)) {
      lost += b.mass;
      continue;
    }
    const scale = b.mass / (sum * dv);
    for (let n = 0; n < cells.length; n++) density[cells[n]!] = density[cells[n]!]! + weights[n]! * scale;
  }
  return lost;
}
