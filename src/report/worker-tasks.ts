/** Report and budget tasks for the worker pool (registered in src/worker.ts): whole-grid passes run as one task each, by the same functions as on the main thread. */
import { blockMeanPlanes, densityPdf, jeansNumberHistogram } from './build-plots.js';
import { gridResolution } from '../budget/grid-resolution.js';
import { previewBlocks } from '../export/preview.js';

/** Task name -> function: block means (coarse planes), density PDF, Jeans-number histogram, the grid's Jeans numbers (into a shared output), the preview's label-free block reductions. */
export const REPORT_TASKS = {
  reportBlockMean: blockMeanPlanes,
  reportDensityPdf: densityPdf,
  reportJeansHistogram: jeansNumberHistogram,
  budgetGridResolution: gridResolution,
  previewBlocks,
};
