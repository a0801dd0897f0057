/** Survey tasks for the worker pool (registered in src/worker.ts): the merge tree and the per-node self-gravity sums. */
import { adaptiveSelfEnergy, type CoarseMass } from './self-gravity.js';
import { coarseEnergies } from './node-gravity.js';
import { listedCellsTask, mergeTreeTask } from './tree-task.js';

/** Task name -> function: the merge tree (labels into shared memory), the nodes' cell lists, or the self-gravity estimate (erg, with its error) of one coarse-grained node. */
export const SURVEY_TASKS = {
  surveyMergeTree: mergeTreeTask,
  surveyListedCells: listedCellsTask,
  surveyNodeSelfEnergy: (c: CoarseMass, tolerance: number) => adaptiveSelfEnergy(c, tolerance),
  surveyCoarseEnergies: (grids: CoarseMass[]) => coarseEnergies(grids),
};
