/**
 * Cells of every merge-tree node (own plus descendants) as contiguous slices of one list, with
 * each listed cell's grid indices and density, which the self-gravity deposits read.
 *
 * Grid: shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k; density g/cm^3.
 * Node t owns listed cells [start[t], end[t]). Nodes are ordered depth-first so each subtree is a
 * contiguous range; labelled cells are then counting-sorted by their node's position in one
 * pass over the grid in index order (so each node's cells are in index order), which also
 * writes their indices and densities: no second, scattered pass over the density.
 */
import type { CellSet } from './self-gravity.js';

/** Per-node cell lists: node t owns listed cells [start[t], end[t]) (grid indices i, j, k and density). */
export interface NodeCells {
  readonly start: Int32Array;
  readonly end: Int32Array;
  /** Grid indices and densities (g/cm^3) of the listed cells. */
  readonly listed: CellSet;
}

/**
 * Lists each node's cells from the labels (node id per cell, -1 none); arrays on shared memory when
 * `shared`. `reuse`: free buffers (e.g. the tree's sort scratch) the lists may be written into
 * (each one large enough is used for one list; every entry is written), saving fresh memory.
 * `subtreeCells` (the tree's cell count per node, descendants included): each node's own count is
 * then its count minus its children's, instead of a counting pass over the labels; the lists are
 * checked to have filled exactly those counts, else counted again from the labels.
 */
export function nodeCellLists(
  labels: Int32Array, parent: Int32Array, children: readonly number[][], roots: readonly number[],
  density: Float32Array, shape: { nx: number; ny: number; nz: number }, shared = false, reuse: readonly ArrayBufferLike[] = [],
  subtreeCells?: ArrayLike<number>,
): NodeCells {
  const { nx, ny, nz } = shape;
  if (labels.length !== nx * ny * nz || density.length !== labels.length) throw new RangeError(`labels (${labels.length}) and density (${density.length}) must hold ${nx}x${ny}x${nz} cells`);
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
  if (subtreeCells) {
    for (let t = 0; t < count; t++) {
      let c = subtreeCells[t]!;
      for (const k of children[t]!) c -= subtreeCells[k]!;
      own[pos[t]! + 1] = c;
    }
  } else {
    for (let c = 0; c < labels.length; c++) { const id = labels[c]!; if (id >= 0) own[pos[id]! + 1]!++; }
  }
  for (let p = 0; p < count; p++) own[p + 1]! += own[p]!;
  const m = own[count]!;
  const spare = reuse.filter((b) => b.byteLength >= 4 * m && (!shared || b instanceof SharedArrayBuffer));
  const buffer = (): ArrayBufferLike => spare.shift() ?? (shared ? new SharedArrayBuffer(4 * m) : new ArrayBuffer(4 * m));
  const ints = (): Int32Array => new Int32Array(buffer(), 0, m);
  const listed: CellSet = { i: ints(), j: ints(), k: ints(), rho: new Float32Array(buffer(), 0, m) };
  const { i: I, j: J, k: K, rho } = listed;
  const fill = own.slice(0, count);
  for (let i = 0, c = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++, c++) {
        const id = labels[c]!;
        if (id < 0) continue;
        const q = fill[pos[id]!]!++;
        I[q] = i; J[q] = j; K[q] = k; rho[q] = density[c]!;
      }
    }
  }
  // counts taken from the tree: every node must have filled exactly its range
  if (subtreeCells) for (let p = 0; p < count; p++) if (fill[p] !== own[p + 1]) return nodeCellLists(labels, parent, children, roots, density, shape, shared, reuse);
  const start = new Int32Array(count), end = new Int32Array(count);
  for (let t = 0; t < count; t++) { start[t] = own[pos[t]!]!; end[t] = own[last[t]! + 1]!; }
  return { start, end, listed };
}
