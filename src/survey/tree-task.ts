/**
 * The merge tree off the main thread. A plan starts the tree on a worker of its own as soon as
 * the density is final (the generator then still works on the velocity, and the main thread on
 * the outputs that do not need the tree); the survey awaits it. The worker runs the same
 * buildMergeTree on the same shared density, so the tree and the labels are those of an inline
 * build. Without a worker (one thread, or a density not on shared memory) the tree is built
 * inline when awaited. After the tree the same worker lists each node's cells (nodeCellLists),
 * which the self-gravity needs, while the main thread is still busy with other outputs.
 */
import { onSharedMemory, type WorkerPool } from '../grid/pool.js';
import type { Grid3 } from '../grid/grid3.js';
import { cellCount, cellVolume } from '../grid/grid3.js';
import type { ProgressSink } from '../progress.js';
import { buildMergeTree, type MergeTree, type TreeLimits } from './merge-tree.js';
import type { SurveyOptions } from './types.js';
import { nodeCellLists, type NodeCells } from './cell-lists.js';

/** A merge tree being built (or to be built inline): the floor it uses and how to get it. */
export interface PendingTree {
  /** The cube the tree is built on. */
  readonly density: Float32Array;
  /** Density floor, g/cm^3, and how it was chosen. */
  readonly floor: number;
  readonly floorRule: string;
  /** Worker build: resolves with the tree, its wall time (s) and the nodes' cell lists; null for an inline build. */
  readonly running: Promise<BuiltTree> | null;
  /** Worker build: [cells added, cells to add], written by the worker as it goes. */
  readonly counter: Int32Array | null;
  /** Inline build: the arguments. */
  readonly build: { grid: Grid3; connectivity: 6 | 26; limits: TreeLimits; cellVolume: number };
  /** The worker the tree is built on (free once the tree is done; the survey then sums node moments there), or null. */
  readonly lane: WorkerPool | null;
}

/** A finished tree: the tree, its build time (s), and (from a worker) the nodes' cell lists. */
export interface BuiltTree {
  readonly tree: MergeTree;
  readonly seconds: number;
  /** The nodes' cell lists (nodeCellLists, on shared memory) when the tree was built on a worker, else null. */
  readonly lists: NodeCells | null;
}

/** Density floor of the survey, g/cm^3: options.floorDensity, or the cube's mean density when that is not a finite number >= 0. */
export function surveyFloor(density: Float32Array, options: Pick<SurveyOptions, 'floorDensity' | 'floorRule'>): { floor: number; rule: string } {
  const f = options.floorDensity;
  if (Number.isFinite(f) && f >= 0) return { floor: f, rule: options.floorRule ?? 'given' };
  let s = 0;
  for (let c = 0; c < density.length; c++) s += density[c]!;
  return { floor: s / density.length, rule: 'mean density of the cube (no floor or ambient density given)' };
}

/**
 * The worker task: buildMergeTree writing labels into `labels` and its progress into `counter` (both
 * shared), then each node's cell list with the listed cells' indices and densities (nodeCellLists, on shared memory).
 */
export function mergeTreeTask(
  density: Float32Array, shape: { nx: number; ny: number; nz: number }, floor: number, connectivity: 6 | 26,
  limits: TreeLimits, vol: number, labels: Int32Array, counter: Int32Array,
): { tree: MergeTree; lists: NodeCells | null } {
  // the sort's scratch arrays on shared memory: free once the tree is built, they then hold the cell lists
  const scratch: SharedArrayBuffer[] = [];
  const alloc = (bytes: number): SharedArrayBuffer => { const b = new SharedArrayBuffer(bytes); scratch.push(b); return b; };
  const tree = buildMergeTree(density, shape, floor, connectivity, limits, vol, (done, total) => {
    Atomics.store(counter, 1, total);
    Atomics.store(counter, 0, done);
  }, labels, alloc);
  const lists = tree.count > 0 ? nodeCellLists(labels, tree.parent, tree.children, tree.roots, density, shape, true, scratch, tree.cells) : null;
  return { tree, lists };
}

/** Starts the merge tree of `density` (g/cm^3) on `lane` (a pool whose worker nothing else uses), or prepares an inline build when lane is null. */
export function startMergeTree(density: Float32Array, grid: Grid3, options: SurveyOptions, lane: WorkerPool | null): PendingTree {
  const { floor, rule } = surveyFloor(density, options);
  const build = {
    grid, connectivity: options.connectivity, cellVolume: cellVolume(grid),
    limits: { minCells: options.minCells, minContrast: options.minContrast, minMass: options.minMass },
  };
  if (!lane || !onSharedMemory(density)) return { density, floor, floorRule: rule, running: null, counter: null, build, lane: null };
  const labels = new Int32Array(new SharedArrayBuffer(cellCount(grid) * 4));
  const counter = new Int32Array(new SharedArrayBuffer(8));
  const shape = { nx: grid.nx, ny: grid.ny, nz: grid.nz };
  const t0 = performance.now();
  const running = lane.run<{ tree: MergeTree; lists: NodeCells | null }>('surveyMergeTree', [density, shape, floor, build.connectivity, build.limits, build.cellVolume, labels, counter])
    .then((r) => ({ tree: r.tree, lists: r.lists, seconds: (performance.now() - t0) / 1000 }));
  // an unawaited failure is reported when awaited; do not let it surface as an unhandled rejection first
  running.catch(() => {});
  return { density, floor, floorRule: rule, running, counter, build, lane };
}

/** Waits for (or builds) the pending tree, showing its progress as the stage 'survey: merge tree'; seconds is the build's wall time. */
export async function awaitMergeTree(pending: PendingTree, progress: ProgressSink): Promise<BuiltTree> {
  const st = progress.stage('survey: merge tree', 100);
  try {
    if (pending.running) {
      const counter = pending.counter!;
      const show = (): void => {
        const total = Atomics.load(counter, 1);
        if (total > 0) st.update(Math.floor((100 * Atomics.load(counter, 0)) / total));
      };
      const timer = setInterval(show, 100);
      try {
        return await pending.running;
      } finally {
        clearInterval(timer);
      }
    }
    const t0 = performance.now();
    const { grid, connectivity, limits, cellVolume: vol } = pending.build;
    const tree = buildMergeTree(pending.density, grid, pending.floor, connectivity, limits, vol, (done, total) => st.update(Math.floor((100 * done) / total)));
    return { tree, seconds: (performance.now() - t0) / 1000, lists: null };
  } finally {
    st.stop();
  }
}
