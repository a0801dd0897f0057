/** The budget module's public functions (re-exports only). */
export { analyticBudget, BUDGET_CAUTIONS } from './analytic-budget.js';
export { gridResolution } from './grid-resolution.js';
export { resolutionSummary, costSummary, gridResolutionSummary } from './summary-blocks.js';
export { budgetText } from './budget-text.js';
export { eosFromConfig, budgetPlan } from './budget-plan.js';
export { ladderConvergence, ksTwoSample } from './convergence.js';
export type * from './types.js';
