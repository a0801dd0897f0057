/**
 * The generator's worker-thread tasks, spread into TASKS in src/worker.ts.
 * Each takes (start, end, ...args) over x-rows or flat cell ranges and writes shared arrays;
 * conventions of the kernels are in modes.ts and cell-kernels.ts.
 */
import { fillLogDensityModes, fillVelocityComponent } from './modes.js';
import { applyLognormal, fillTemperature, gridEnvelope } from './cell-kernels.js';
import { scaleVelocityCells } from './velocity.js';
import { scaleCloudCells } from './moments.js';

/** Task name -> function, for the worker registry. */
export const GENERATE_TASKS = {
  genVelocityComponent: fillVelocityComponent,
  genLogDensityModes: fillLogDensityModes,
  genEnvelope: gridEnvelope,
  genLognormal: applyLognormal,
  genTemperature: fillTemperature,
  genScaleVelocity: scaleVelocityCells,
  genScaleCloud: scaleCloudCells,
} as const;
