import { describe, it, expect } from 'vitest';
import { buildMergeTree } from '../src/survey/merge-tree.js';
import { nodeCellLists } from '../src/survey/cell-lists.js';
import { nodeGravity, PARENT_CELLS } from '../src/survey/node-gravity.js';
import { adaptiveSelfEnergy, coarseGrain, coarseSelfEnergy } from '../src/survey/self-gravity.js';

/** A 48^3 cube: a broad Gaussian envelope holding a ring of Gaussian cores (nested regions wider than PARENT_CELLS). */
function nestedCube(n: number): Float32Array {
  const d = new Float32Array(n ** 3);
  const cores: Array<[number, number, number, number, number]> = [];
  for (let a = 0; a < 6; a++) {
    const phi = (2 * Math.PI * a) / 6;
    cores.push([n / 2 + 14 * Math.cos(phi), n / 2 + 14 * Math.sin(phi), n / 2 + (a % 2 ? 4 : -4), 2 + (a % 3), 3 + a]);
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
    const x = i + 0.5 - n / 2, y = j + 0.5 - n / 2, z = k + 0.5 - n / 2;
    let v = Math.exp(-(x * x + y * y + z * z) / (2 * 12 ** 2));
    for (const [cx, cy, cz, s, amp] of cores) {
      const u = i + 0.5 - cx, w = j + 0.5 - cy, e = k + 0.5 - cz;
      v += amp * Math.exp(-(u * u + w * w + e * e) / (2 * s * s));
    }
    d[(i * n + j) * n + k] = 1e-20 * v;
  }
  return d;
}

describe('node cell lists', () => {
  it('lists each subtree as one range, in index order, with each cell\'s grid indices and density', () => {
    const n = 24;
    const shape = { nx: n, ny: n, nz: n };
    const density = nestedCube(n);
    const tree = buildMergeTree(density, shape, 1e-21, 6, { minCells: 8, minContrast: 0.2, minMass: 0 }, 1);
    const lists = nodeCellLists(tree.labels, tree.parent, tree.children, tree.roots, density, shape);
    expect(tree.count).toBeGreaterThan(1);
    for (let t = 0; t < tree.count; t++) expect(lists.end[t]! - lists.start[t]!).toBe(tree.cells[t]);
    const { i, j, k, rho } = lists.listed;
    for (let t = 0; t < tree.count; t++) {
      // own cells (before the first child's range) in index order, each with its density and label
      const kids = tree.children[t]!.map((c) => lists.start[c]!);
      const ownEnd = Math.min(lists.end[t]!, ...kids);
      let last = -1;
      for (let p = lists.start[t]!; p < ownEnd; p++) {
        const c = (i[p]! * n + j[p]!) * n + k[p]!;
        expect(c).toBeGreaterThan(last);
        last = c;
        expect(rho[p]).toBe(density[c]);
        expect(tree.labels[c]).toBe(t);
      }
    }
    // written into reused buffers holding garbage (the tree's sort scratch in a plan), the lists are the same
    const garbage = [0, 1, 2, 3].map(() => { const b = new ArrayBuffer(4 * (i.length + 5)); new Uint8Array(b).fill(0xab); return b; });
    const again = nodeCellLists(tree.labels, tree.parent, tree.children, tree.roots, density, shape, false, garbage);
    expect(again.listed).toEqual(lists.listed);
    expect(again.listed.i.buffer).toBe(garbage[0]);
    expect([again.start, again.end]).toEqual([lists.start, lists.end]);
    // own counts from the tree's subtree counts give the same lists; wrong counts are caught and recounted
    const fromTree = nodeCellLists(tree.labels, tree.parent, tree.children, tree.roots, density, shape, false, [], tree.cells);
    expect([fromTree.start, fromTree.end, fromTree.listed]).toEqual([lists.start, lists.end, lists.listed]);
    const wrong = Float64Array.from(tree.cells, (c, t) => (t === 0 ? c + 3 : c));
    const recounted = nodeCellLists(tree.labels, tree.parent, tree.children, tree.roots, density, shape, false, [], wrong);
    expect([recounted.start, recounted.end, recounted.listed]).toEqual([lists.start, lists.end, lists.listed]);
    // a child's range sits inside its parent's; within a node's own cells the index order holds
    for (let t = 0; t < tree.count; t++) {
      const p = tree.parent[t]!;
      if (p >= 0) expect(lists.start[t]! >= lists.start[p]! && lists.end[t]! <= lists.end[p]!).toBe(true);
    }
  });
});

describe('node gravity', () => {
  it('builds each parent from its children exactly as a direct deposit of all its cells would', async () => {
    const n = 48, dx = 3e16, gravityCells = 32, tol = 0.01;
    const shape = { nx: n, ny: n, nz: n };
    const density = nestedCube(n);
    const tree = buildMergeTree(density, shape, 1e-21, 6, { minCells: 8, minContrast: 0.2, minMass: 0 }, dx ** 3);
    const lists = nodeCellLists(tree.labels, tree.parent, tree.children, tree.roots, density, shape);
    const got = await nodeGravity(tree, lists, dx, gravityCells, tol, null);
    const cellsOf = (t: number): Int32Array => {
      const out = new Int32Array(lists.end[t]! - lists.start[t]!);
      for (let p = lists.start[t]!, q = 0; p < lists.end[t]!; p++, q++) out[q] = (lists.listed.i[p]! * n + lists.listed.j[p]!) * n + lists.listed.k[p]!;
      return out;
    };
    const extent = (t: number) => {
      const c = coarseGrain(density, shape, dx, cellsOf(t), 1, 1); // factor 1: g is the next power of two of the extent
      return c.g;
    };
    let parents = 0;
    const lattice = new Int32Array(tree.count); // interaction factor of a parent, 0 for nodes summed adaptively
    for (let t = 0; t < tree.count; t++) {
      // reference: every grid deposited afresh from the node's full cell list (the plain method)
      const kids = tree.children[t]!;
      const idx = cellsOf(t);
      let i0 = Infinity, i1 = -1, j0 = Infinity, j1 = -1, k0 = Infinity, k1 = -1;
      for (const c of idx) {
        const i = Math.floor(c / (n * n)), j = Math.floor(c / n) % n, k = c % n;
        i0 = Math.min(i0, i); i1 = Math.max(i1, i); j0 = Math.min(j0, j); j1 = Math.max(j1, j); k0 = Math.min(k0, k); k1 = Math.max(k1, k);
      }
      const b = Math.max(i1 - i0, j1 - j0, k1 - k0) + 1;
      let f = 1;
      while (f < Math.ceil(b / PARENT_CELLS)) f *= 2;
      if (kids.length === 0 || f === 1) {
        const e = adaptiveSelfEnergy(coarseGrain(density, shape, dx, idx, gravityCells), tol);
        expect(got.energy[t]).toBe(e.energy);
        continue;
      }
      parents++;
      lattice[t] = f;
      let w = coarseSelfEnergy(coarseGrain(density, shape, dx, idx, gravityCells, f));
      for (const c of kids) w += got.energy[c]! - coarseSelfEnergy(coarseGrain(density, shape, dx, cellsOf(c), gravityCells, f));
      // same sums in another order: equal to rounding
      expect(Math.abs(got.energy[t]! - w)).toBeLessThan(1e-12 * Math.abs(w));
      expect(got.factor[t]).toBe(f);
    }
    expect(parents).toBeGreaterThan(0);
    expect(extent(tree.roots[0]!)).toBeGreaterThan(PARENT_CELLS);
    // a child on its parent's lattice (its energies there are taken from its own job) is among them
    const sameLattice = Array.from({ length: tree.count }, (_, t) => t).filter((t) => tree.parent[t]! >= 0 && lattice[t]! > 0 && lattice[t] === lattice[tree.parent[t]!]);
    expect(sameLattice.length).toBeGreaterThan(0);
  });
});
