/** Survey tasks for the worker pool (registered in src/worker.ts): the merge tree, the nodes' cell lists, and batches of per-node self-gravity sums. */
import { gravityBatch } from './node-gravity.js';
import { listedCellsTask, mergeTreeTask } from './tree-task.js';

/** Task name -> function: the merge tree (labels into shared memory), the nodes' cell lists, self-gravity estimates (erg) of a batch of nodes. */
export const SURVEY_TASKS = {
  surveyMergeTree: mergeTreeTask,
  surveyListedCells: listedCellsTask,
  surveyGravityBatch: gravityBatch,
};
