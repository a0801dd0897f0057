/**
 * Grid-code resolution per refinement level: cell size dx_l = L / (N_base r^l), the densest gas
 * resolved with N_J cells per Jeans length at the EOS temperature there (Truelove et al. 1997),
 * and the fewest levels that reach a required density. cgs.
 */
import type { Eos } from '../physics/eos.js';
import { eosTemperature } from '../physics/eos.js';
import { jeansMassEos, maxResolvedDensityEos } from '../physics/eos-resolution.js';
import type { JeansConvention } from '../physics/jeans.js';
import type { BudgetCloud, BudgetPlan, LevelResolution } from './types.js';

/** Most levels searched when looking for the levels needed (the config allows at most 40). */
export const MAX_LEVELS_SEARCHED = 40;

/** Cell size, cm, at refinement level `level` (0 = base grid). */
export function levelCellSize(plan: BudgetPlan, boxSize: number, level: number): number {
  return boxSize / plan.baseCells / plan.refinementRatio ** level;
}

/** Max resolved density, g/cm^3, at refinement level `level` (EOS-aware Truelove criterion). */
export function levelMaxDensity(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, level: number): number {
  return maxResolvedDensityEos(cloud.soundSpeed, levelCellSize(plan, cloud.boxSize, level), plan.cellsPerJeansLength, eos);
}

/** The per-level table for levels 0..upTo (default: the planned levels). */
export function levelTable(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, convention: JeansConvention, upTo = plan.levels): LevelResolution[] {
  const out: LevelResolution[] = [];
  for (let l = 0; l <= upTo; l++) {
    const rho = levelMaxDensity(plan, cloud, eos, l);
    out.push({
      level: l,
      cellSize: levelCellSize(plan, cloud.boxSize, l),
      maxResolvedDensity: rho,
      temperature: eosTemperature(eos, cloud.temperature, rho),
      jeansMass: jeansMassEos(cloud.soundSpeed, rho, eos, convention),
    });
  }
  return out;
}

/** Fewest refinement levels whose finest cells resolve `density` (g/cm^3); null if not within MAX_LEVELS_SEARCHED or not finite. */
export function levelsToReach(plan: BudgetPlan, cloud: BudgetCloud, eos: Eos, density: number): number | null {
  if (!Number.isFinite(density)) return null;
  for (let l = 0; l <= MAX_LEVELS_SEARCHED; l++) {
    if (levelMaxDensity(plan, cloud, eos, l) >= density) return l;
  }
  return null;
}
