/**
 * The hierarchical fragmentation survey of one density cube: merge tree -> node sums ->
 * self-gravity -> energies and Jeans test -> candidates -> mass spectrum.
 *
 * Grid: shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k, i along x, cell-centred,
 * box [-L/2, L/2)^3 with cubic cells dx = L/nx; every quantity cgs.
 * Results depend only on the input and options: the worker pool only spreads the per-node
 * self-gravity sums, each computed by the same code, so a run with and without workers gives
 * the same numbers.
 */
import type { SurveyInput, SurveyOptions, SurveyResult } from './types.js';
import { runWhole, type WorkerPool } from '../grid/pool.js';
import { cellCount, cellSize, cellVolume } from '../grid/grid3.js';
import { silentProgress, type ProgressSink } from '../progress.js';
import { startMergeTree, awaitMergeTree, type PendingTree } from './tree-task.js';
import { nodeMoments, CH, NODE_CHANNELS } from './node-moments.js';
import { nodeCellLists } from './cell-lists.js';
import { nodeGravity, type NodeGravity } from './node-gravity.js';
import { nodeVerdicts, EXPECTED_RULE } from './node-verdicts.js';
import { massSpectrum } from './mass-spectrum.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { jeansMass } from '../physics/jeans.js';

/** Bytes the survey allocates per grid cell (union-find, sizes, region nodes, labels, sort keys, cell lists), excluding the input fields. */
export const SURVEY_BYTES_PER_CELL = 40;

/** Estimated peak memory of a survey of n^3 cells beyond its input fields, bytes. */
export function estimateSurveyBytes(n: number): number {
  return SURVEY_BYTES_PER_CELL * n ** 3 + 64 * 2 ** 20;
}

/** How the self-gravity is computed, for reports. */
export function gravityMethodText(gravityCells: number, tolerance = 0.01): string {
  return `self-gravity of each node from its own cells (Hockney & Eastwood 1981 isolated-boundary FFT convolution, or direct pair sum for small nodes) on the node's bounding box, coarse-grained to at most ${gravityCells} cells per side and refined from 16 per side until the estimated coarse-graining error is below ${tolerance * 100} % (leaves), parents as their children plus coarse interaction terms; each node reports its error estimate`;
}

function now(): number {
  return performance.now() / 1000;
}

/**
 * Runs the survey of a density cube (g/cm^3) with optional velocity (cm/s), field (G) and temperature (K);
 * see types.ts. `pending`: its merge tree, already started by startMergeTree on this cube with these options.
 */
export async function surveyCloud(input: SurveyInput, options: SurveyOptions, progress: ProgressSink = silentProgress, pool: WorkerPool | null = null, pending?: PendingTree): Promise<SurveyResult> {
  const g = input.grid;
  const n = cellCount(g);
  if (input.density.length !== n) throw new RangeError(`density has ${input.density.length} values, grid ${g.nx}x${g.ny}x${g.nz} needs ${n}`);
  for (const f of [...(input.velocity ?? []), ...(input.magnetic ?? [])]) if (f.length !== n) throw new RangeError('velocity/magnetic fields must match the density shape');
  if (typeof input.temperature !== 'number' && input.temperature.length !== n) throw new RangeError('temperature field must match the density shape');
  const timings: Record<string, number> = {};
  const notes: string[] = [];
  const vol = cellVolume(g);
  const dx = cellSize(g);

  // the merge tree: started elsewhere (a worker, while the generator finished the cloud) or built here
  const pendingTree = pending ?? startMergeTree(input.density, g, options, null);
  if (pendingTree.density !== input.density) throw new RangeError('the pending merge tree was started on another density cube');
  if (Number.isFinite(options.floorDensity) && pendingTree.floor !== options.floorDensity) throw new RangeError(`the pending merge tree uses the floor ${pendingTree.floor}, the options ${options.floorDensity}`);
  const floor = pendingTree.floor;
  const floorRule = pendingTree.floorRule;
  const built = await awaitMergeTree(pendingTree, progress);
  const tree = built.tree;
  timings.tree = built.seconds;

  // node moments: on the tree's worker (free again), beside the self-gravity, when the inputs are on
  // shared memory (the same function, the same sums); else here, now
  let t = now();
  const tm = t;
  const momentArrays = [input.density, tree.labels, ...(input.velocity ?? []), ...(input.magnetic ?? []), input.temperature];
  const momentsP = runWhole(pendingTree.lane, 'surveyNodeMoments', nodeMoments, [input, tree.labels, tree.parent], momentArrays)
    .then((sums) => { timings.moments = now() - tm; return sums; });
  momentsP.catch(() => {}); // awaited below

  t = now();
  const tolerance = options.gravityTolerance ?? 0.01;
  let gravity: NodeGravity = { energy: new Float64Array(0), factor: new Int32Array(0), cellsPerSide: new Int32Array(0), relativeError: new Float64Array(0) };
  if (tree.count > 0) {
    // the tree's worker (when it had one) listed each node's cells already
    const lists = built.lists ?? nodeCellLists(tree.labels, tree.parent, tree.children, tree.roots, input.density, g, false, [], tree.cells);
    const sg = progress.stage('survey: self-gravity', tree.count);
    gravity = await nodeGravity(tree, lists, dx, options.gravityCells, tolerance, pool, (d) => sg.update(d));
    sg.stop();
  }
  timings.gravity = now() - t;
  const sums = await momentsP;

  t = now();
  const nodes = nodeVerdicts(tree, sums, gravity, vol, input.mu, options);
  const candidates = nodes.filter((x) => x.candidate).map((x) => x.id);
  timings.verdicts = now() - t;

  // reference Jeans mass: thermal, at the mean density and mass-weighted temperature of the surveyed gas
  t = now();
  let m = 0, v = 0, mt = 0;
  for (const r of tree.roots) { const b = r * NODE_CHANNELS; m += sums[b + CH.mass]!; mt += sums[b + CH.mT]!; v += tree.cells[r]! * vol; }
  if (m === 0) {
    for (let c = 0; c < n; c++) m += input.density[c]! * vol;
    v = n * vol;
    const T = input.temperature;
    mt = m * (typeof T === 'number' ? T : T.reduce((a, b) => a + b, 0) / n);
  }
  const referenceJeansMass = jeansMass(soundSpeed(mt / m, input.mu), m / v, options.jeansConvention);
  const spectrum = massSpectrum(candidates.map((id) => nodes[id]!.mass), {
    referenceJeansMass, mach: options.mach, velocitySpectrumIndex: options.velocitySpectrumIndex, coreToStarEfficiency: options.coreToStarEfficiency,
  });
  timings.spectrum = now() - t;

  if (tree.count === 0) notes.push(`no connected region above the density floor ${floor.toExponential(3)} g/cm^3 passed the significance limits`);
  if (candidates.length > 0 && !spectrum.fit) notes.push(`fewer than 10 fragment candidates: no power-law slope fitted`);
  notes.push('fragment counts and masses are a statistical preview of the initial conditions, not a simulation: check convergence in the real run');

  return {
    nodes,
    roots: tree.roots.slice(),
    candidates,
    unstableNodes: nodes.reduce((a, x) => a + (x.unstable ? 1 : 0), 0),
    expectedFragments: nodes.reduce((a, x) => a + x.expectedFragments, 0),
    expectedFragmentsRule: EXPECTED_RULE,
    spectrum,
    jeansConvention: options.jeansConvention,
    labels: tree.labels,
    timings,
    floorDensity: floor,
    floorRule,
    limits: { minCells: options.minCells, minContrast: options.minContrast, minMass: options.minMass, connectivity: options.connectivity },
    referenceJeansMass,
    gravityMethod: gravityMethodText(options.gravityCells, tolerance),
    notes,
    options,
  };
}
