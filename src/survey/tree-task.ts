/**
 * The merge tree off the main thread. A plan starts the tree on a worker of its own as soon as
 * the density is final (the generator then still works on the velocity, and the main thread on
 * the outputs that do not need the tree); the survey awaits it. The worker runs the same
 * buildMergeTree on the same shared density, so the tree and the labels are those of an inline
 * build. Without a worker (one thread, or a density not on shared memory) the tree is built
 * inline when awaited. After the tree the same worker lists each node's cells (listedCellsTask)
 * while the main thread sums the node moments.
 */
import type { WorkerPool } from '../grid/pool.js';
import type { Grid3 } from '../grid/grid3.js';
import { cellCount, cellVolume } from '../grid/grid3.js';
import type { ProgressSink } from '../progress.js';
import { buildMergeTree, type MergeTree, type TreeLimits } from './merge-tree.js';
import type { SurveyOptions } from './types.js';
import { nodeCellLists } from './node-moments.js';
import { listedCells } from './node-gravity.js';
import type { CellSet } from './self-gravity.js';

/** A merge tree being built (or to be built inline): the floor it uses and how to get it. */
export interface PendingTree {
  /** The cube the tree is built on. */
  readonly density: Float32Array;
  /** Density floor, g/cm^3, and how it was chosen. */
  readonly floor: number;
  readonly floorRule: string;
  /** Worker build: resolves with the tree and its wall time (s); null for an inline build. */
  readonly running: Promise<{ tree: MergeTree; seconds: number }> | null;
  /** Worker build: [cells added, cells to add], written by the worker as it goes. */
  readonly counter: Int32Array | null;
  /** Inline build: the arguments. */
  readonly build: { grid: Grid3; connectivity: 6 | 26; limits: TreeLimits; cellVolume: number };
  /** The worker the tree is built on (free again once it is done), or null. */
  readonly lane: WorkerPool | null;
}

/** Per-node cell lists (see nodeCellLists) and the listed cells' indices and densities, on shared memory. */
export interface ListedCells {
  readonly lists: { cells: Int32Array; start: Int32Array; end: Int32Array };
  readonly listed: CellSet;
}

/** The worker task after the tree: nodeCellLists and listedCells of a tree's labels, the lists copied to shared memory. */
export function listedCellsTask(
  labels: Int32Array, parent: Int32Array, children: number[][], roots: number[], density: Float32Array, shape: { ny: number; nz: number },
): ListedCells {
  const l = nodeCellLists(labels, parent, children, roots);
  const cells = new Int32Array(new SharedArrayBuffer(4 * l.cells.length));
  cells.set(l.cells);
  return { lists: { cells, start: l.start, end: l.end }, listed: listedCells(cells, density, shape, true) };
}

/** Density floor of the survey, g/cm^3: options.floorDensity, or the cube's mean density when that is not a finite number >= 0. */
export function surveyFloor(density: Float32Array, options: Pick<SurveyOptions, 'floorDensity' | 'floorRule'>): { floor: number; rule: string } {
  const f = options.floorDensity;
  if (Number.isFinite(f) && f >= 0) return { floor: f, rule: options.floorRule ?? 'given' };
  let s = 0;
  for (let c = 0; c < density.length; c++) s += density[c]!;
  return { floor: s / density.length, rule: 'mean density of the cube (no floor or ambient density given)' };
}

/** The worker task: buildMergeTree writing labels into `labels` and its progress into `counter` (both shared). */
export function mergeTreeTask(
  density: Float32Array, shape: { nx: number; ny: number; nz: number }, floor: number, connectivity: 6 | 26,
  limits: TreeLimits, vol: number, labels: Int32Array, counter: Int32Array,
): MergeTree {
  return buildMergeTree(density, shape, floor, connectivity, limits, vol, (done, total) => {
    Atomics.store(counter, 1, total);
    Atomics.store(counter, 0, done);
  }, labels);
}

/** Starts the merge tree of `density` (g/cm^3) on `lane` (a pool whose worker nothing else uses), or prepares an inline build when lane is null. */
export function startMergeTree(density: Float32Array, grid: Grid3, options: SurveyOptions, lane: WorkerPool | null): PendingTree {
  const { floor, rule } = surveyFloor(density, options);
  const build = {
    grid, connectivity: options.connectivity, cellVolume: cellVolume(grid),
    limits: { minCells: options.minCells, minContrast: options.minContrast, minMass: options.minMass },
  };
  if (!lane || !(density.buffer instanceof SharedArrayBuffer)) return { density, floor, floorRule: rule, running: null, counter: null, build, lane: null };
  const labels = new Int32Array(new SharedArrayBuffer(cellCount(grid) * 4));
  const counter = new Int32Array(new SharedArrayBuffer(8));
  const shape = { nx: grid.nx, ny: grid.ny, nz: grid.nz };
  const t0 = performance.now();
  const running = lane.run<MergeTree>('surveyMergeTree', [density, shape, floor, build.connectivity, build.limits, build.cellVolume, labels, counter])
    .then((tree) => ({ tree, seconds: (performance.now() - t0) / 1000 }));
  // an unawaited failure is reported when awaited; do not let it surface as an unhandled rejection first
  running.catch(() => {});
  return { density, floor, floorRule: rule, running, counter, build, lane };
}

/** Waits for (or builds) the pending tree, showing its progress as the stage 'survey: merge tree'; seconds is the build's wall time. */
export async function awaitMergeTree(pending: PendingTree, progress: ProgressSink): Promise<{ tree: MergeTree; seconds: number }> {
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
    return { tree, seconds: (performance.now() - t0) / 1000 };
  } finally {
    st.stop();
  }
}
