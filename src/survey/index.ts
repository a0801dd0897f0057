/** The survey's public functions, re-exported for the pipeline and the library API. */
export { surveyCloud, estimateSurveyBytes, gravityMethodText } from './survey-cloud.js';
export { surveyOptionsFromConfig, FLOOR_OVER_AMBIENT } from './survey-options.js';
export { hierarchySummary, treeJson, fragmentsCsv } from './survey-outputs.js';
export { loadCube, loadVelocityCubes, type LoadCubeOptions } from './load-cube.js';
export { runEnsemble, ensembleSummary, meanSpread, type EnsembleStats, type EnsembleMember } from './ensemble.js';
export { selfGravityEnergy, uniformCubeSelfEnergy } from './self-gravity.js';
export { buildMergeTree, type MergeTree, type TreeLimits } from './merge-tree.js';
export { startMergeTree, type PendingTree } from './tree-task.js';
export { fitPowerLaw } from './power-law-fit.js';
export { massSpectrum } from './mass-spectrum.js';
