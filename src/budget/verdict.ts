/**
 * The plain-language verdict: resolved / marginal / not resolved, with the one number that
 * decides it. Marginal means within a factor 4 in density of what is needed, i.e. one more
 * level at refinement ratio 2 or twice the particles (rho_max ~ dx^-2 ~ N^2 when isothermal).
 */
import { TRUELOVE_CELLS_PER_JEANS_LENGTH } from '../physics/resolution.js';
import { fmt } from './format.js';
import type { Verdict } from './types.js';

/** Density ratio (resolved / needed) below 1 but at or above this counts as marginal. */
export const MARGINAL_RATIO = 0.25;

/** Verdict from what the run resolves and what it needs (densities g/cm^3). */
export function decideVerdict(p: {
  code: 'grid' | 'particles';
  maxResolvedDensity: number;
  requiredDensity: number;
  peakDensity: number;
  cellsPerJeansLength: number;
  fixHint: string;
}): Verdict {
  const need = `${fmt(p.requiredDensity)} g/cm^3`;
  const got = `${fmt(p.maxResolvedDensity)} g/cm^3`;
  if (p.code === 'grid' && p.cellsPerJeansLength < TRUELOVE_CELLS_PER_JEANS_LENGTH) {
    return { status: 'not resolved', reason: `N_J = ${fmt(p.cellsPerJeansLength)} cells per Jeans length is below the Truelove et al. (1997) minimum of 4: artificial fragmentation is expected` };
  }
  if (p.maxResolvedDensity < p.peakDensity) {
    return { status: 'not resolved', reason: `the densest gas already present at t = 0 (${fmt(p.peakDensity)} g/cm^3) exceeds the ${got} the run resolves` };
  }
  if (!Number.isFinite(p.maxResolvedDensity)) {
    return { status: 'resolved', reason: `resolves gas at every density: with this EOS the Jeans ${p.code === 'grid' ? 'length' : 'mass'} never falls below the resolution limit (needed: ${need})` };
  }
  const ratio = p.maxResolvedDensity / p.requiredDensity;
  if (ratio >= 1) {
    return { status: 'resolved', reason: `resolves gas up to ${got}, ${fmt(ratio)}x the ${need} it needs` };
  }
  if (ratio >= MARGINAL_RATIO) {
    return { status: 'marginal', reason: `resolves gas up to ${got}, a factor ${fmt(1 / ratio)} short of the ${need} it needs (${p.fixHint})` };
  }
  return { status: 'not resolved', reason: `resolves gas only up to ${got}, a factor ${fmt(1 / ratio)} short of the ${need} it needs (${p.fixHint})` };
}
