/** Survey tasks for the worker pool (registered in src/worker.ts): the per-node self-gravity sum. */
import { adaptiveSelfEnergy, type CoarseMass } from './self-gravity.js';
import { coarseEnergies } from './node-gravity.js';

/** Task name -> function; each returns the self-gravity estimate (erg, with its error) of one coarse-grained node. */
export const SURVEY_TASKS = {
  surveyNodeSelfEnergy: (c: CoarseMass, tolerance: number) => adaptiveSelfEnergy(c, tolerance),
  surveyCoarseEnergies: (grids: CoarseMass[]) => coarseEnergies(grids),
};
