/** Resolves the config's budget section (and EOS) into the planned run the budget judges. cgs. */
import type { Config } from '../config/schema.js';
import { eosFromSettings, type Eos } from '../physics/eos.js';
import { forcingParameterForWeight, lognormalWidth } from '../physics/turbulence.js';
import type { BudgetCloud, BudgetPlan } from './types.js';

/** The EOS of the config's cloud.eos section. */
export function eosFromConfig(config: Config): Eos {
  return eosFromSettings(config.cloud.eos);
}

/** Forcing parameter b of the turbulence: structure.b if given, else from the Helmholtz weight (Federrath et al. 2010). */
export function forcingParameter(config: Config): number {
  const s = config.cloud.structure;
  if (s.kind === 'lognormal' && s.b !== undefined) return s.b;
  return forcingParameterForWeight(config.cloud.turbulence?.solenoidal_weight ?? 1);
}

/** The planned run from the config and the cloud numbers (base cells default grid.cells). */
export function budgetPlan(config: Config, cloud: BudgetCloud): BudgetPlan {
  const b = config.budget;
  const mach = cloud.soundSpeed > 0 ? (Math.sqrt(3) * cloud.sigma1D) / cloud.soundSpeed : 0;
  return {
    baseCells: b.grid.base_cells ?? config.grid.cells,
    levels: b.grid.levels,
    refinementRatio: b.grid.refinement_ratio,
    cellsPerJeansLength: b.grid.cells_per_jeans_length,
    courant: b.code === 'grid' ? b.grid.courant : b.particles.courant,
    particleCount: b.particles.count,
    particleMass: cloud.mass / b.particles.count,
    neighbours: b.particles.neighbours,
    resolvableFactor: b.particles.resolvable_factor,
    eta: b.particles.eta,
    freeFallTimes: b.free_fall_times,
    throughput: b.throughput ?? null,
    mach,
    sigmaS: mach > 0 ? lognormalWidth(forcingParameter(config), mach) : 0,
    magnetic: config.cloud.magnetic !== undefined,
  };
}
