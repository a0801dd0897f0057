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
 */
import type { MergeTree } from './merge-tree.js';
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

function extent(set: CellSet): number {
  const { i: I, j: J, k: K } = set;
  let i0 = Infinity, j0 = Infinity, k0 = Infinity, i1 = -1, j1 = -1, k1 = -1;
  for (let p = 0; p < I.length; p++) {
    const i = I[p]!, j = J[p]!, k = K[p]!;
    if (i < i0) i0 = i; if (i > i1) i1 = i;
    if (j < j0) j0 = j; if (j > j1) j1 = j;
    if (k < k0) k0 = k; if (k > k1) k1 = k;
  }
  return i1 < 0 ? 0 : Math.max(i1 - i0, j1 - j0, k1 - k0) + 1;
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

type Job = { kind: 'adaptive'; id: number; grid: CoarseMass } | { kind: 'terms'; id: number; grids: CoarseMass[]; children: number };

/** Computes the gravitational energy of every node; spreads the sums over the pool when given. */
export async function nodeGravity(
  tree: MergeTree,
  lists: { cells: Int32Array; start: Int32Array; end: Int32Array },
  density: Float32Array,
  shape: { nx: number; ny: number; nz: number },
  dx: number,
  gravityCells: number,
  tolerance: number,
  pool: WorkerPool | null,
  onDone: (done: number) => void = () => {},
): Promise<NodeGravity> {
  const n = tree.count;
  const out: NodeGravity = { energy: new Float64Array(n), factor: new Int32Array(n), cellsPerSide: new Int32Array(n), relativeError: new Float64Array(n) };
  const corrF = new Float64Array(n), corr2F = new Float64Array(n), isTerms = new Uint8Array(n);
  // coordinates and densities of the listed cells, once, so deposits need no index arithmetic
  const m = lists.cells.length;
  const all: CellSet = { i: new Int32Array(m), j: new Int32Array(m), k: new Int32Array(m), rho: new Float32Array(m) };
  for (let p = 0; p < m; p++) {
    const c = lists.cells[p]!;
    all.i[p] = Math.floor(c / (shape.ny * shape.nz));
    all.j[p] = Math.floor(c / shape.nz) % shape.ny;
    all.k[p] = c % shape.nz;
    all.rho[p] = density[c]!;
  }
  const cellsOf = (id: number): CellSet => {
    const a = lists.start[id]!, b = lists.end[id]!;
    return { i: all.i.subarray(a, b), j: all.j.subarray(a, b), k: all.k.subarray(a, b), rho: all.rho.subarray(a, b) };
  };
  const makeJob = (id: number): Job => {
    const cells = cellsOf(id);
    const b = extent(cells);
    const kids = tree.children[id]!;
    const f = pow2Above(Math.ceil(b / PARENT_CELLS));
    if (kids.length === 0 || f === 1) return { kind: 'adaptive', id, grid: coarseGrainSet(cells, dx, gravityCells) };
    const grids: CoarseMass[] = [coarseGrainSet(cells, dx, gravityCells, f), coarseGrainSet(cells, dx, gravityCells, 2 * f)];
    for (const c of kids) grids.push(coarseGrainSet(cellsOf(c), dx, gravityCells, f), coarseGrainSet(cellsOf(c), dx, gravityCells, 2 * f));
    return { kind: 'terms', id, grids, children: kids.length };
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
      const e = value as number[];
      let f = e[0]!, f2 = e[1]!;
      for (let c = 0; c < job.children; c++) { f -= e[2 + 2 * c]!; f2 -= e[3 + 2 * c]!; }
      corrF[job.id] = f;
      corr2F[job.id] = f2;
      isTerms[job.id] = 1;
      out.factor[job.id] = job.grids[0]!.factor;
      out.cellsPerSide[job.id] = job.grids[0]!.g;
    }
    onDone(++done);
  };
  if (pool && pool.size >= 2) {
    const window = 2 * pool.size;
    const inFlight = new Set<Promise<void>>();
    for (let id = 0; id < n; id++) {
      const job = makeJob(id);
      const p: Promise<void> = (job.kind === 'adaptive'
        ? pool.run<GravityEstimate>('surveyNodeSelfEnergy', [job.grid, tolerance])
        : pool.run<number[]>('surveyCoarseEnergies', [job.grids])
      ).then((v) => { finish(job, v); inFlight.delete(p); });
      inFlight.add(p);
      if (inFlight.size >= window) await Promise.race(inFlight);
    }
    await Promise.all(inFlight);
  } else {
    for (let id = 0; id < n; id++) {
      const job = makeJob(id);
      finish(job, job.kind === 'adaptive' ? adaptiveSelfEnergy(job.grid, tolerance) : coarseEnergies(job.grids));
    }
  }
  // combine bottom-up (children have smaller ids)
  const absErr = new Float64Array(n);
  for (let id = 0; id < n; id++) {
    if (!isTerms[id]) { absErr[id] = out.relativeError[id]! * Math.abs(out.energy[id]!); continue; }
    let w = corrF[id]!, err = Math.abs(corrF[id]! - corr2F[id]!);
    for (const c of tree.children[id]!) { w += out.energy[c]!; err += absErr[c]!; }
    out.energy[id] = w;
    absErr[id] = err;
    out.relativeError[id] = w !== 0 ? err / Math.abs(w) : 0;
  }
  return out;
}
