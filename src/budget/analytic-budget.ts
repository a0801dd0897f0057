/**
 * The analytic budget (no grid): what the planned grid or particle run resolves, what it needs,
 * which sink settings fit, and what it costs. cgs throughout; summary-blocks.ts names units.
 *
 * Criteria: Truelove et al. (1997) N_J cells per Jeans length (grid); Bate & Burkert (1997)
 * resolvable mass factor x N_neigh x m_particle below the Jeans mass (particles); both judged at
 * the EOS temperature the gas has at each density (barotropic form after Masunaga & Inutsuka
 * 2000). Sinks: r_acc = sink_radius_cells x finest dx, threshold pi c_s^2/(4 G r_acc^2)
 * (Federrath et al. 2010).
 */
import type { Config } from '../config/schema.js';
import { M_SUN } from '../physics/constants.js';
import { eosTemperature } from '../physics/eos.js';
import { densityForJeansMassEos, jeansMassEos, minimumJeansMassDensity, sinkThresholdDensityEos } from '../physics/eos-resolution.js';
import { freeFallTime } from '../physics/free-fall.js';
import { smoothingLength, TURBULENCE_CELLS_PER_JEANS_LENGTH } from '../physics/resolution.js';
import { budgetPlan, eosFromConfig } from './budget-plan.js';
import { gridCost, particleCost } from './cost.js';
import { fmt } from './format.js';
import { levelCellSize, levelsToReach, levelTable } from './grid-levels.js';
import { fewestParticles, particleMaxDensity, particlesToReach, resolvableMassFor } from './particle-criteria.js';
import type { BudgetCloud, BudgetResult, CostEstimate, LevelResolution } from './types.js';
import { decideVerdict } from './verdict.js';

/** Sink radius of a particle run, in smoothing lengths at the threshold (kernel support 2h, common practice). */
export const PARTICLE_SINK_RADIUS_H = 2;

/** Cautions every budget carries. */
export const BUDGET_CAUTIONS: readonly string[] = [
  'This is a plan from analytic criteria, not a convergence test of the real run: repeat the real run at higher resolution before trusting fragment counts.',
  'The densities a collapse reaches are set by the run itself; the criteria here judge resolution at the temperature the EOS gives at each density.',
  'Costs and refined-cell counts are rough estimates with the assumptions listed; measure your code\'s throughput before asking for core-hours.',
];

/** Everything of the budget that needs no grid; cloud numbers in cgs (see BudgetCloud). */
export function analyticBudget(config: Config, cloud: BudgetCloud): BudgetResult {
  const eos = eosFromConfig(config);
  const plan = budgetPlan(config, cloud);
  const conv = config.survey.jeans_mass;
  const code = config.budget.code;
  const cs0 = cloud.soundSpeed;
  const targetDensity = config.budget.target_density ?? config.cloud.eos.critical_density;
  const minMass = config.budget.min_fragment_mass;
  const minMassDensity = minMass === undefined ? null : densityForJeansMassEos(cs0, minMass, eos, conv);
  const requiredDensity = Math.max(targetDensity, minMassDensity !== null && Number.isFinite(minMassDensity) ? minMassDensity : 0);
  const warnings: string[] = [];
  const rhoJmin = minimumJeansMassDensity(eos);
  const minimumJeansMass = Number.isFinite(rhoJmin) ? { density: rhoJmin, mass: jeansMassEos(cs0, rhoJmin, eos, conv) } : null;
  if (minMass !== undefined && minMassDensity !== null && !Number.isFinite(minMassDensity)) {
    warnings.push(`min_fragment_mass ${fmt(minMass / M_SUN.value)} Msun is below the smallest Jeans mass the EOS allows (${fmt((minimumJeansMass?.mass ?? 0) / M_SUN.value)} Msun at ${fmt(minimumJeansMass?.density)} g/cm^3): no fragments that small form by Jeans instability; judged against the target density only`);
  }

  let levels: LevelResolution[];
  let maxResolvedDensity: number;
  let levelsNeeded: number | null = null;
  let levelsForTarget: number | null = null;
  let levelsForMinMass: number | null = null;
  let levelsAtStart: number | null = null;
  let particlesNeeded: number | null = null;
  let particlesForTarget: number | null = null;
  let particlesForMinMass: number | null = null;
  let sinkRadius: number;
  let sinkThreshold: number;
  let sinkRadiusCells: number;
  let fixHint: string;
  if (code === 'grid') {
    levels = levelTable(plan, cloud, eos, conv);
    maxResolvedDensity = levels[levels.length - 1]!.maxResolvedDensity;
    levelsForTarget = levelsToReach(plan, cloud, eos, targetDensity);
    levelsForMinMass = minMassDensity === null ? null : levelsToReach(plan, cloud, eos, minMassDensity);
    levelsNeeded = levelsToReach(plan, cloud, eos, requiredDensity);
    levelsAtStart = levelsToReach(plan, cloud, eos, cloud.peakDensity);
    if (levelsNeeded === null) warnings.push(`no refinement depth up to 40 levels reaches ${fmt(requiredDensity)} g/cm^3 from ${plan.baseCells}^3 base cells`);
    else if (levelsNeeded > plan.levels) warnings.push(`${levelsNeeded} refinement level(s) needed to resolve ${fmt(requiredDensity)} g/cm^3; ${plan.levels} planned`);
    sinkRadiusCells = config.budget.sink_radius_cells;
    sinkRadius = sinkRadiusCells * levelCellSize(plan, cloud.boxSize, plan.levels);
    sinkThreshold = sinkThresholdDensityEos(cs0, sinkRadius, eos);
    if (sinkThreshold > maxResolvedDensity) {
      warnings.push(`the sink threshold ${fmt(sinkThreshold)} g/cm^3 lies above the density the finest cells resolve (${fmt(maxResolvedDensity)} g/cm^3): gas fragments artificially before sinks form; use sink_radius_cells >= N_J/2 = ${fmt(plan.cellsPerJeansLength / 2)}`);
    }
    if (plan.cellsPerJeansLength < TURBULENCE_CELLS_PER_JEANS_LENGTH && (plan.mach > 1 || plan.magnetic)) {
      warnings.push(`N_J = ${fmt(plan.cellsPerJeansLength)}: enough against artificial fragmentation (Truelove et al. 1997), but turbulence and field amplification inside collapsing cores need about 30 cells per Jeans length (Federrath et al. 2011)`);
    }
    fixHint = levelsNeeded === null ? 'no depth up to 40 levels reaches it' : `${levelsNeeded} level(s) at ratio ${plan.refinementRatio} would`;
  } else {
    maxResolvedDensity = particleMaxDensity(plan, cloud, eos, conv);
    const hLim = Number.isFinite(maxResolvedDensity) ? smoothingLength(plan.particleMass, maxResolvedDensity, plan.eta) : 0;
    levels = [{
      level: 0,
      cellSize: hLim,
      maxResolvedDensity,
      temperature: eosTemperature(eos, cloud.temperature, maxResolvedDensity),
      jeansMass: resolvableMassFor(plan, cloud.mass, plan.particleCount),
    }];
    particlesForTarget = particlesToReach(plan, cloud, eos, conv, targetDensity);
    particlesForMinMass = minMass === undefined ? null : fewestParticles(plan, cloud.mass, minMass);
    particlesNeeded = particlesForTarget === null ? particlesForMinMass : Math.max(particlesForTarget, particlesForMinMass ?? 0);
    if (particlesNeeded !== null && particlesNeeded > plan.particleCount) warnings.push(`${fmt(particlesNeeded)} particles needed; ${fmt(plan.particleCount)} planned`);
    sinkRadiusCells = PARTICLE_SINK_RADIUS_H;
    sinkThreshold = Number.isFinite(maxResolvedDensity) ? maxResolvedDensity : requiredDensity;
    sinkRadius = PARTICLE_SINK_RADIUS_H * smoothingLength(plan.particleMass, sinkThreshold, plan.eta);
    fixHint = particlesNeeded === null ? 'no particle number reaches it' : `${fmt(particlesNeeded)} particles would`;
  }
  if (maxResolvedDensity < cloud.peakDensity) warnings.push(`the initial peak density ${fmt(cloud.peakDensity)} g/cm^3 is already unresolved`);

  const limit = maxResolvedDensity;
  const cost: CostEstimate = code === 'grid'
    ? gridCost(plan, cloud, eos, conv, limit)
    : particleCost(plan, cloud, eos, conv, limit);
  const verdict = decideVerdict({ code, maxResolvedDensity, requiredDensity, peakDensity: cloud.peakDensity, cellsPerJeansLength: plan.cellsPerJeansLength, fixHint });
  return {
    code,
    levels,
    maxResolvedDensity,
    levelsNeeded,
    particlesNeeded,
    targetDensity,
    sinkRadius,
    sinkThreshold,
    freeFallTimeAtLimit: Number.isFinite(limit) ? freeFallTime(limit) : 0,
    cost: costRecord(cost),
    verdict,
    warnings,
    eos,
    cloud,
    plan,
    jeansConvention: conv,
    minMassDensity,
    requiredDensity,
    levelsForTarget,
    levelsForMinMass,
    levelsAtStart,
    particlesForTarget,
    particlesForMinMass,
    temperatureAtLimit: eosTemperature(eos, cloud.temperature, limit),
    jeansMassAtLimit: code === 'grid' ? jeansMassEos(cs0, limit, eos, conv) : levels[0]!.jeansMass,
    minimumJeansMass,
    sinkRadiusCells,
    costEstimate: cost,
    cautions: [...BUDGET_CAUTIONS],
  };
}

/** The contract's flat cost record (cgs) from the typed estimate. */
function costRecord(c: CostEstimate): Record<string, number | string | null> {
  return {
    memoryBytes: c.memoryBytes,
    timeStep: c.timeStep,
    steps: c.steps,
    cellUpdates: c.cellUpdates,
    refinedCells: c.refinedCells,
    refinedCellUpdates: c.refinedCellUpdates,
    totalUpdates: c.totalUpdates,
    finestTimeStep: c.finestTimeStep,
    coreHours: c.coreHours,
  };
}
