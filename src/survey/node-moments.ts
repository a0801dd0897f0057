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

/**
 * Cells of every node (own plus descendants) as contiguous slices of one index array:
 * node t owns cells[start[t] .. end[t]). Built by ordering nodes depth-first so each subtree
 * is a contiguous range, then a counting sort of labelled cells by their node's position.
 */
export function nodeCellLists(labels: Int32Array, parent: Int32Array, children: readonly number[][], roots: readonly number[]): { cells: Int32Array; start: Int32Array; end: Int32Array } {
  const count = parent.length;
  const pos = new Int32Array(count);
  const last = new Int32Array(count); // last DFS position inside the subtree
  let next = 0;
  const stack: Array<[number, number]> = [];
  for (const r of roots) {
    stack.push([r, 0]);
    pos[r] = next++;
    while (stack.length) {
      const top = stack[stack.length - 1]!;
      const [t, ci] = top;
      const kids = children[t]!;
      if (ci < kids.length) {
        top[1]++;
        const ch = kids[ci]!;
        pos[ch] = next++;
        stack.push([ch, 0]);
      } else {
        last[t] = next - 1;
        stack.pop();
      }
    }
  }
  const own = new Int32Array(count + 1);
  for (let c = 0; c < labels.length; c++) { const id = labels[c]!; if (id >= 0) own[pos[id]! + 1]!++; }
  for (let p = 0; p < count; p++) own[p + 1]! += own[p]!;
  const fill = own.slice(0, count);
  const cells = new Int32Array(own[count]!);
  for (let c = 0; c < labels.length; c++) { const id = labels[c]!; if (id >= 0) cells[fill[pos[id]!]!++] = c; }
  const start = new Int32Array(count), end = new Int32Array(count);
  for (let t = 0; t < count; t++) { start[t] = own[pos[t]!]!; end[t] = own[last[t]! + 1]!; }
  return { cells, start, end };
}
