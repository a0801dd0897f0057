/**
 * Additive sums of every merge-tree node, accumulated from its cells and then up the tree
 * (a parent holds its own cells plus all its children's sums).
 *
 * Grid: shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k, i along x, cell-centred,
 * box [-L/2, L/2)^3, cubic cells of side dx = L/nx. Units cgs: positions cm, velocities cm/s,
 * temperature K, field gauss. Sums in Float64.
 */
import type { Grid3 } from '../grid/grid3.js';
import { cellCentre, cellSize, cellVolume } from '../grid/grid3.js';
import { eosTemperatureFactor, type Eos } from '../physics/eos.js';
import { magneticEnergy } from '../physics/magnetic.js';

/** Channel layout of the per-node sums (stride NODE_CHANNELS). */
export const CH = {
  /** g */ mass: 0,
  /** sum m x, m y, m z: g cm */ mx: 1, my: 2, mz: 3,
  /** sum m xx, yy, zz, xy, xz, yz: g cm^2 */ mxx: 4, myy: 5, mzz: 6, mxy: 7, mxz: 8, myz: 9,
  /** momentum: g cm/s */ px: 10, py: 11, pz: 12,
  /** sum m v^2: g cm^2/s^2 */ mv2: 13,
  /** sum m T: g K */ mT: 14,
  /** magnetic energy B^2 dV/(8 pi): erg */ emag: 15,
} as const;
/** Number of channels per node. */
export const NODE_CHANNELS = 16;

/** What the sums read: density, optional velocity and field, temperature (scalar, with EOS factor; or per cell, used as is). */
export interface MomentInput {
  readonly grid: Grid3;
  readonly density: Float32Array;
  readonly velocity?: readonly [Float32Array, Float32Array, Float32Array] | null;
  readonly magnetic?: readonly [Float32Array, Float32Array, Float32Array] | null;
  readonly temperature: number | Float32Array;
  readonly eos?: Eos;
}

/** Per-node sums (count x NODE_CHANNELS), own cells plus descendants; parent ids must exceed child ids. */
export function nodeMoments(input: MomentInput, labels: Int32Array, parent: Int32Array): Float64Array {
  const { grid: g, density, velocity, magnetic, temperature, eos } = input;
  const count = parent.length;
  const s = new Float64Array(count * NODE_CHANNELS);
  const vol = cellVolume(g);
  const dx = cellSize(g);
  const { nx, ny, nz } = g;
  const xs = Float64Array.from({ length: nx }, (_, i) => cellCentre(i, nx, nx * dx));
  const ys = Float64Array.from({ length: ny }, (_, j) => cellCentre(j, ny, ny * dx));
  const zs = Float64Array.from({ length: nz }, (_, k) => cellCentre(k, nz, nz * dx));
  const tScalar = typeof temperature === 'number' ? temperature : null;
  const tField = typeof temperature === 'number' ? null : temperature;
  const isoEos = !eos || eos.kind === 'isothermal';
  for (let i = 0, c = 0; i < nx; i++) {
    const x = xs[i]!;
    for (let j = 0; j < ny; j++) {
      const y = ys[j]!;
      for (let k = 0; k < nz; k++, c++) {
        const id = labels[c]!;
        if (id < 0) continue;
        const z = zs[k]!;
        const rho = density[c]!;
        const m = rho * vol;
        const b = id * NODE_CHANNELS;
        s[b] += m;
        s[b + 1] += m * x; s[b + 2] += m * y; s[b + 3] += m * z;
        s[b + 4] += m * x * x; s[b + 5] += m * y * y; s[b + 6] += m * z * z;
        s[b + 7] += m * x * y; s[b + 8] += m * x * z; s[b + 9] += m * y * z;
        if (velocity) {
          const vx = velocity[0][c]!, vy = velocity[1][c]!, vz = velocity[2][c]!;
          s[b + 10] += m * vx; s[b + 11] += m * vy; s[b + 12] += m * vz;
          s[b + 13] += m * (vx * vx + vy * vy + vz * vz);
        }
        const t = tField ? tField[c]! : isoEos ? tScalar! : tScalar! * eosTemperatureFactor(eos!, rho);
        s[b + 14] += m * t;
        if (magnetic) {
          const bx = magnetic[0][c]!, by = magnetic[1][c]!, bz = magnetic[2][c]!;
          s[b + 15] += magneticEnergy(Math.sqrt(bx * bx + by * by + bz * bz), vol);
        }
      }
    }
  }
  for (let id = 0; id < count; id++) {
    const p = parent[id]!;
    if (p < 0) continue;
    if (p <= id) throw new RangeError(`node ${id} has parent ${p}: parents must have larger ids`);
    const a = id * NODE_CHANNELS, b = p * NODE_CHANNELS;
    for (let ch = 0; ch < NODE_CHANNELS; ch++) s[b + ch] += s[a + ch]!;
  }
  return s;
}
