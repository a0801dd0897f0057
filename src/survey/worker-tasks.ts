/** Survey tasks for the worker pool (registered in src/worker.ts): the merge tree (with the nodes' cell lists), node moments, and batches of per-node self-gravity sums. */
import { gravityBatch } from './node-gravity.js';
import { mergeTreeTask } from './tree-task.js';
import { nodeMoments } from './node-moments.js';

/** Task name -> function: the merge tree (labels into shared memory) and the nodes' cell lists, per-node sums, self-gravity estimates (erg) of a batch of nodes. */
export const SURVEY_TASKS = {
  surveyMergeTree: mergeTreeTask,
  surveyNodeMoments: nodeMoments,
  surveyGravityBatch: gravityBatch,
};
