/**
 * Survey options from the parsed config (cgs), with the documented defaults:
 * - floor density: survey.floor_density if given; else 2 x the ambient density when the cloud
 *   has an ambient medium; else NaN, which surveyCloud turns into the cube's mean density
 *   (for a foreign cube with no ambient medium);
 * - Mach number and velocity spectral index of the cloud for the Padoan & Nordlund curve.
 */
import type { Config } from '../config/schema.js';
import type { SurveyOptions } from './types.js';

/** Multiple of the ambient density used as the default floor. */
export const FLOOR_OVER_AMBIENT = 2;

/** SurveyOptions from config.survey plus what the cloud knows (ambient density g/cm^3, rms Mach, P(k) ~ k^-n index n). */
export function surveyOptionsFromConfig(config: Config, info: { ambientDensity: number | null; mach: number | null; velocitySpectrumIndex: number | null }): SurveyOptions {
  const s = config.survey;
  let floorDensity: number;
  let floorRule: string;
  if (s.floor_density !== undefined) {
    floorDensity = s.floor_density;
    floorRule = 'survey.floor_density';
  } else if (info.ambientDensity !== null && info.ambientDensity > 0) {
    floorDensity = FLOOR_OVER_AMBIENT * info.ambientDensity;
    floorRule = `${FLOOR_OVER_AMBIENT} x the ambient density`;
  } else {
    floorDensity = Number.NaN;
    floorRule = 'mean density of the cube (no floor or ambient density given)';
  }
  return {
    jeansConvention: s.jeans_mass,
    turbulentSupport: s.turbulent_support,
    requireBound: s.require_bound,
    connectivity: s.connectivity,
    minCells: s.min_cells,
    minContrast: s.min_contrast,
    minMass: s.min_mass,
    floorDensity,
    floorRule,
    gravityCells: s.gravity_cells,
    coreToStarEfficiency: s.core_to_star_efficiency,
    mach: info.mach,
    velocitySpectrumIndex: info.velocitySpectrumIndex,
    ...(config.grid.workers !== undefined ? { workers: config.grid.workers } : {}),
  };
}
