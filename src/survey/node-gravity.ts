/**
 * Self-gravitational energy of every merge-tree node, erg, from the node's own cells.
 *
 * Grid: shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k, cell-centred, cubic cells
 * of side dx (cm); density g/cm^3.
 *
 * Leaves (and any node at most PARENT_CELLS cells across): adaptiveSelfEnergy of
 * self-gravity.ts, i.e. the pair sum refined until its estimated coarse-graining error is
 * below the tolerance (exact when few cells are occupied).
 * Larger parents use the tree: W_parent = sum_c W_c + [E_f(parent) - sum_c E_f(c)], where the
 * W_c are the children's own (already accurate) energies and E_f is the energy on the
 * globally aligned coarse lattice of factor f (parent at most PARENT_CELLS coarse cells
 * across). The bracket holds the child-child and child-envelope interactions and the
 * envelope's self-energy, which are dominated by separations larger than a coarse cell; the
 * short-range part, where coarse-graining errs, sits in the children's own terms. The error of
 * the bracket is estimated as its change from factor 2f to f (safe for errors falling as a^p,
 * p >= 1); node errors add their children's absolute errors.
 *
 * Cost. Bounding boxes are merged bottom-up. A parent's coarse masses are built from its own
 * cells plus its children's coarse boxes (already on the parent's lattice, kept until the
 * parent is done), never from all its descendants' cells again, so building every grid costs
 * O(cells + nodes x box size) rather than O(cells x tree depth). Nodes without the tree terms
 * deposit their cells directly, in list order, as before. A child whose own lattice is its
 * parent's (common in deep, chain-like trees) has the same box there as its own term grid, bit
 * for bit, so its two energies are taken from its own job instead of being summed again (a
 * quarter to a third fewer interaction grids at 256^3). The energy sums (FFT convolutions, pair
 * sums) run on the worker pool.
 */
import type { MergeTree } from './merge-tree.js';
import type { NodeCells } from './cell-lists.js';
import type { WorkerPool } from '../grid/pool.js';
import { adaptiveSelfEnergy, coarseGrainSet, coarseSelfEnergy, type CellSet, type CoarseMass, type GravityEstimate } from './self-gravity.js';

/** Coarse cells across a parent for its interaction term. */
export const PARENT_CELLS = 16;

/** Per-node gravitational energies (erg), coarse-graining used, and relative error estimates. */
export interface NodeGravity {
  energy: Float64Array;
  factor: Int32Array;
  cellsPerSide: Int32Array;
  relativeError: Float64Array;
}

function pow2Above(x: number): number {
  let p = 1;
  while (p < x) p *= 2;
  return p;
}

/** Energies (erg) of a list of coarse grids; the unit of work sent to a worker. */
export function coarseEnergies(grids: readonly CoarseMass[]): number[] {
  return grids.map((c) => coarseSelfEnergy(c));
}

/** Coarse masses (g) of one node on the global lattice of factor f, over the node's coarse bounding box only. */
interface Box {
  readonly sh: number;
  /** Coarse origin (lattice indices) and extent per axis. */
  readonly o0: number; readonly o1: number; readonly o2: number;
  readonly s0: number; readonly s1: number; readonly s2: number;
  /** s0*s1*s2 masses, C order. */
  readonly mass: Float64Array;
}

/** An empty box of factor 2^sh over the fine bounding box bb (i0, j0, k0, i1, j1, k1 at bb[6t..6t+5]). */
function emptyBox(bb: Int32Array, t: number, sh: number): Box {
  const b = 6 * t;
  const o0 = bb[b]! >> sh, o1 = bb[b + 1]! >> sh, o2 = bb[b + 2]! >> sh;
  const s0 = (bb[b + 3]! >> sh) - o0 + 1, s1 = (bb[b + 4]! >> sh) - o1 + 1, s2 = (bb[b + 5]! >> sh) - o2 + 1;
  return { sh, o0, o1, o2, s0, s1, s2, mass: new Float64Array(s0 * s1 * s2) };
}

/** Adds the masses (g) of cells [a, b) of `all` to the box. */
function depositCells(box: Box, all: CellSet, a: number, b: number, vol: number): void {
  const { sh, o0, o1, o2, s1, s2, mass } = box;
  const { i: I, j: J, k: K, rho } = all;
  for (let p = a; p < b; p++) mass[(((I[p]! >> sh) - o0) * s1 + ((J[p]! >> sh) - o1)) * s2 + ((K[p]! >> sh) - o2)]! += rho[p]! * vol;
}

/** Adds a finer (or equal) box's masses to a coarser box (its region must lie inside). */
function addBox(into: Box, from: Box): void {
  const d = into.sh - from.sh;
  const { o0, o1, o2, s1, s2, mass } = into;
  const m = from.mass;
  for (let a = 0, p = 0; a < from.s0; a++) {
    const x = (((from.o0 + a) >> d) - o0) * s1;
    for (let b = 0; b < from.s1; b++) {
      const y = (x + ((from.o1 + b) >> d) - o1) * s2;
      for (let c = 0; c < from.s2; c++, p++) {
        const v = m[p]!;
        if (v !== 0) mass[y + ((from.o2 + c) >> d) - o2]! += v;
      }
    }
  }
}

/** The box as a CoarseMass on a cube of g = max(2, next power of two of its longest side) cells, cell side 2^sh dx. */
function toCoarse(box: Box, dx: number): CoarseMass {
  const g = Math.max(2, pow2Above(Math.max(box.s0, box.s1, box.s2)));
  const mass = new Float64Array(g * g * g);
  let occupied = 0;
  for (let a = 0, p = 0; a < box.s0; a++) for (let b = 0; b < box.s1; b++) {
    const q = (a * g + b) * g;
    for (let c = 0; c < box.s2; c++, p++) {
      const v = box.mass[p]!;
      mass[q + c] = v;
      if (v > 0) occupied++;
    }
  }
  const factor = 1 << box.sh;
  return { g, factor, side: factor * dx, mass, occupied };
}

/**
 * A node's work: one coarse grid summed adaptively, or its interaction-term grids: its own at factors
 * f and 2f, then those of each child on the same lattices that is not `reused` (a child whose own
 * lattice is the node's: its grids are its own term grids, bit for bit, and its energies are taken
 * from its own job).
 */
type Job = { kind: 'adaptive'; id: number; grid: CoarseMass } | { kind: 'terms'; id: number; grids: CoarseMass[]; reused: boolean[] };

/** A job as sent to a worker: one coarse grid summed adaptively, or the grids of a parent's interaction terms. */
export type GravityJobData = { adaptive: CoarseMass } | { terms: CoarseMass[] };

/** Coarse cells per batch message, and jobs at most. */
const BATCH_CELLS = 1 << 16;
const BATCH_JOBS = 64;

function jobData(job: Job): GravityJobData {
  return job.kind === 'adaptive' ? { adaptive: job.grid } : { terms: job.grids };
}

/** The worker task: each job's result (adaptiveSelfEnergy, erg with its error; or coarseEnergies, erg), in order. */
export function gravityBatch(jobs: readonly GravityJobData[], tolerance: number): Array<GravityEstimate | number[]> {
  return jobs.map((j) => ('adaptive' in j ? adaptiveSelfEnergy(j.adaptive, tolerance) : coarseEnergies(j.terms)));
}

/** Computes the gravitational energy (erg) of every node from its listed cells (nodeCellLists); cubic cells of side dx (cm); spreads the sums over the pool when given. */
export async function nodeGravity(
  tree: MergeTree,
  lists: NodeCells,
  dx: number,
  gravityCells: number,
  tolerance: number,
  pool: WorkerPool | null,
  onDone: (done: number) => void = () => {},
): Promise<NodeGravity> {
  const n = tree.count;
  const out: NodeGravity = { energy: new Float64Array(n), factor: new Int32Array(n), cellsPerSide: new Int32Array(n), relativeError: new Float64Array(n) };
  // a terms node's job and its energies (erg): its own grids at f and 2f, then each child's not reused
  const terms: Array<{ reused: boolean[]; e: number[] } | undefined> = new Array(n);
  const vol = dx * dx * dx;
  // coordinates and densities of the listed cells, so deposits need no index arithmetic
  const all = lists.listed;
  const cellsOf = (id: number): CellSet => {
    const a = lists.start[id]!, b = lists.end[id]!;
    return { i: all.i.subarray(a, b), j: all.j.subarray(a, b), k: all.k.subarray(a, b), rho: all.rho.subarray(a, b) };
  };
  // own cells of t are [start, ownEnd): its children's subtrees follow them in the list
  const ownEnd = Int32Array.from(lists.end);
  for (let t = 0; t < n; t++) for (const c of tree.children[t]!) if (lists.start[c]! < ownEnd[t]!) ownEnd[t] = lists.start[c]!;
  // fine bounding boxes, bottom-up (children have smaller ids)
  const bb = new Int32Array(6 * n);
  for (let t = 0; t < n; t++) {
    let i0 = 2 ** 30, j0 = 2 ** 30, k0 = 2 ** 30, i1 = -1, j1 = -1, k1 = -1;
    for (let p = lists.start[t]!; p < ownEnd[t]!; p++) {
      const i = all.i[p]!, j = all.j[p]!, k = all.k[p]!;
      if (i < i0) i0 = i; if (i > i1) i1 = i;
      if (j < j0) j0 = j; if (j > j1) j1 = j;
      if (k < k0) k0 = k; if (k > k1) k1 = k;
    }
    for (const c of tree.children[t]!) {
      const b = 6 * c;
      if (bb[b]! < i0) i0 = bb[b]!; if (bb[b + 3]! > i1) i1 = bb[b + 3]!;
      if (bb[b + 1]! < j0) j0 = bb[b + 1]!; if (bb[b + 4]! > j1) j1 = bb[b + 4]!;
      if (bb[b + 2]! < k0) k0 = bb[b + 2]!; if (bb[b + 5]! > k1) k1 = bb[b + 5]!;
    }
    bb.set([i0, j0, k0, i1, j1, k1], 6 * t);
  }
  // interaction lattice shift per node: factor 2^sh, or -1 for nodes summed adaptively
  const shiftOf = new Int32Array(n);
  for (let t = 0; t < n; t++) {
    const b = 6 * t;
    const ext = Math.max(bb[b + 3]! - bb[b]!, bb[b + 4]! - bb[b + 1]!, bb[b + 5]! - bb[b + 2]!) + 1;
    const f = pow2Above(Math.ceil(ext / PARENT_CELLS));
    shiftOf[t] = tree.children[t]!.length === 0 || f === 1 ? -1 : Math.round(Math.log2(f));
  }
  // boxes of a node on its parent's lattices (factors f and 2f), kept until the parent is done
  const upF: Array<Box | null> = new Array(n).fill(null);
  const up2F: Array<Box | null> = new Array(n).fill(null);
  const makeJob = (id: number): Job => {
    const kids = tree.children[id]!;
    const sh = shiftOf[id]!;
    const p = tree.parent[id]!;
    const psh = p >= 0 ? shiftOf[p]! : -1;
    if (sh < 0) {
      if (psh >= 0) {
        // direct deposits of all the node's cells, in list order, on the parent's lattices
        const a = emptyBox(bb, id, psh), b = emptyBox(bb, id, psh + 1);
        depositCells(a, all, lists.start[id]!, lists.end[id]!, vol);
        depositCells(b, all, lists.start[id]!, lists.end[id]!, vol);
        upF[id] = a; up2F[id] = b;
      }
      return { kind: 'adaptive', id, grid: coarseGrainSet(cellsOf(id), dx, gravityCells) };
    }
    const own = emptyBox(bb, id, sh), own2 = emptyBox(bb, id, sh + 1);
    depositCells(own, all, lists.start[id]!, ownEnd[id]!, vol);
    depositCells(own2, all, lists.start[id]!, ownEnd[id]!, vol);
    const grids: CoarseMass[] = [];
    const childGrids: CoarseMass[] = [];
    const reused: boolean[] = [];
    for (const c of kids) {
      const a = upF[c]!, b = up2F[c]!;
      addBox(own, a);
      addBox(own2, b);
      // a child on this node's own lattice: its boxes here hold exactly its own term grids
      const same = shiftOf[c] === sh;
      reused.push(same);
      if (!same) childGrids.push(toCoarse(a, dx), toCoarse(b, dx));
      upF[c] = null; up2F[c] = null;
    }
    grids.push(toCoarse(own, dx), toCoarse(own2, dx), ...childGrids);
    if (psh >= 0) {
      const a = emptyBox(bb, id, psh), b = emptyBox(bb, id, psh + 1);
      addBox(a, own);
      addBox(b, own2);
      upF[id] = a; up2F[id] = b;
    }
    return { kind: 'terms', id, grids, reused };
  };
  let done = 0;
  const finish = (job: Job, value: GravityEstimate | number[]): void => {
    if (job.kind === 'adaptive') {
      const e = value as GravityEstimate;
      out.energy[job.id] = e.energy;
      out.factor[job.id] = e.factor;
      out.cellsPerSide[job.id] = e.cellsPerSide;
      out.relativeError[job.id] = e.relativeError;
    } else {
      terms[job.id] = { reused: job.reused, e: value as number[] };
      out.factor[job.id] = job.grids[0]!.factor;
      out.cellsPerSide[job.id] = job.grids[0]!.g;
    }
    onDone(++done);
  };
  if (pool && pool.size >= 2) {
    // small jobs go to the workers in batches (one message per BATCH_CELLS coarse cells or
    // BATCH_JOBS jobs): the round trip of a message costs more than a small node's sum
    const window = 2 * pool.size;
    const inFlight = new Set<Promise<void>>();
    let batch: Job[] = [];
    let batchCells = 0;
    const flush = (): void => {
      if (batch.length === 0) return;
      const jobs = batch;
      batch = [];
      batchCells = 0;
      // the coarse grids move to the worker (each has a buffer of its own, not read here again)
      const moved = jobs.flatMap((job) => (job.kind === 'adaptive' ? [job.grid] : job.grids).map((c) => c.mass.buffer as ArrayBuffer));
      const p: Promise<void> = pool.run<Array<GravityEstimate | number[]>>('surveyGravityBatch', [jobs.map(jobData), tolerance], moved)
        .then((values) => { jobs.forEach((job, q) => finish(job, values[q]!)); inFlight.delete(p); });
      inFlight.add(p);
    };
    for (let id = 0; id < n; id++) {
      const job = makeJob(id);
      batch.push(job);
      batchCells += job.kind === 'adaptive' ? job.grid.g ** 3 : job.grids.reduce((a, c) => a + c.g ** 3, 0);
      if (batchCells >= BATCH_CELLS || batch.length >= BATCH_JOBS) {
        flush();
        if (inFlight.size >= window) await Promise.race(inFlight);
      }
    }
    flush();
    await Promise.all(inFlight);
  } else {
    for (let id = 0; id < n; id++) {
      const job = makeJob(id);
      finish(job, job.kind === 'adaptive' ? adaptiveSelfEnergy(job.grid, tolerance) : coarseEnergies(job.grids));
    }
  }
  // combine bottom-up (children have smaller ids); the bracket E_f(node) - sum_c E_f(c), children in order
  const absErr = new Float64Array(n);
  for (let id = 0; id < n; id++) {
    const t = terms[id];
    if (!t) { absErr[id] = out.relativeError[id]! * Math.abs(out.energy[id]!); continue; }
    let corrF = t.e[0]!, corr2F = t.e[1]!;
    const kids = tree.children[id]!;
    for (let c = 0, q = 2; c < kids.length; c++) {
      // a reused child's energies on these lattices are its own first two
      const src = t.reused[c] ? terms[kids[c]!]!.e : t.e;
      const at = t.reused[c] ? 0 : q;
      corrF -= src[at]!;
      corr2F -= src[at + 1]!;
      if (!t.reused[c]) q += 2;
    }
    let w = corrF, err = Math.abs(corrF - corr2F);
    for (const c of tree.children[id]!) { w += out.energy[c]!; err += absErr[c]!; }
    out.energy[id] = w;
    absErr[id] = err;
    out.relativeError[id] = w !== 0 ? err / Math.abs(w) : 0;
  }
  return out;
}
