/** Survey tasks for the worker pool (registered in src/worker.ts): the merge tree and the per-node self-gravity sums. */
import { adaptiveSelfEnergy, type CoarseMass } from './self-gravity.js';
import { coarseEnergies } from './node-gravity.js';
import { mergeTreeTask } from './tree-task.js';

/** Task name -> function: the merge tree (labels into shared memory), or the self-gravity estimate (erg, with its error) of one coarse-grained node. */
export const SURVEY_TASKS = {
  surveyMergeTree: mergeTreeTask,
  surveyNodeSelfEnergy: (c: CoarseMass, tolerance: number) => adaptiveSelfEnergy(c, tolerance),
  surveyCoarseEnergies: (grids: CoarseMass[]) => coarseEnergies(grids),
};
