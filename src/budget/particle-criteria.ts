/**
 * Particle-code resolution: a particle code resolves masses above factor x N_neigh x m_particle
 * (Bate & Burkert 1997, factor ~ 2), so it resolves gas up to the density at which the Jeans
 * mass (at the EOS temperature there) falls to that mass. cgs.
 */
import type { Eos } from '../physics/eos.js';
import { densityForJeansMassEos, jeansMassEos, minimumJeansMassDensity } from '../physics/eos-resolution.js';
import type { JeansConvention } from '../physics/jeans.js';
import { particleResolvableMass } from '../physics/resolution.js';
import type { BudgetCloud, BudgetPlan } from './types.js';

/** Resolvable mass, g, for `count` particles sharing the cloud mass. */
export function resolvableMassFor(plan: BudgetPlan, cloudMass: number, count: number): number {
  return particleResolvableMass(cloudMass / count, plan.neighbours, plan.resolvableFactor);
}

/** Densest gas, g/cm^3, resolved by `count` particles (Infinity when the EOS Jeans mass never falls that low). */
export function particleMaxDensity(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, convention: JeansConvention, count = plan.particleCount): number {
  return densityForJeansMassEos(cloud.soundSpeed, resolvableMassFor(plan, cloud.mass, count), eos, convention);
}

/** Fewest particles whose resolvable mass stays below the Jeans mass up to `density` (g/cm^3); null if not finite. */
export function particlesToReach(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, convention: JeansConvention, density: number): number | null {
  if (!Number.isFinite(density)) return null;
  // The Jeans mass to stay above: the smallest one on the way up to `density`.
  const worst = Math.min(density, minimumJeansMassDensity(eos));
  const mj = jeansMassEos(cloud.soundSpeed, worst, eos, convention);
  return fewestParticles(plan, cloud.mass, mj);
}

/** Fewest particles whose resolvable mass is at most `mass` (g). */
export function fewestParticles(plan: BudgetPlan, cloudMass: number, mass: number): number | null {
  if (!(mass > 0) || !Number.isFinite(mass)) return null;
  let n = Math.max(1, Math.ceil(resolvableMassFor(plan, cloudMass, 1) / mass));
  if (!Number.isFinite(n) || n > Number.MAX_SAFE_INTEGER) return null;
  // Guard the rounding of the division: step to the smallest count that meets it.
  while (n > 1 && resolvableMassFor(plan, cloudMass, n - 1) <= mass) n--;
  while (resolvableMassFor(plan, cloudMass, n) > mass) n++;
  return n;
}
