/**
 * `fragplan budget <config>`: the resolution and cost plan, analytic, no grid, instant.
 * Imports stay light (config types, physics, the analytic cloud dimensions, the budget module).
 * budgetCloud() gives the cloud numbers that both `budget` and `plan` should feed analyticBudget,
 * so the two report the same resolution and cost numbers.
 */
import type { LoadedConfig } from '../config/load.js';
import type { Config } from '../config/schema.js';
import { cloudDimensions } from '../generate/dimensions.js';
import { freeFallTime } from '../physics/free-fall.js';
import { describeJeansConvention, jeansLength, jeansMass } from '../physics/jeans.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { lognormalWidth } from '../physics/turbulence.js';
import { toUnit } from '../physics/units.js';
import { sigmaForVirialParameter, uniformSphereRotationalEnergy } from '../physics/virial.js';
import { analyticBudget } from '../budget/analytic-budget.js';
import { forcingParameter } from '../budget/budget-plan.js';
import { budgetText } from '../budget/budget-text.js';
import { costSummary, resolutionSummary } from '../budget/summary-blocks.js';
import { h2NumberDensity } from '../physics/number-density.js';
import type { BudgetCloud, BudgetResult } from '../budget/types.js';
import { TOOL_VERSION } from '../version.js';

/** Largest speed at t = 0 in units of sigma_3D (the tail of a Gaussian velocity field; a rough choice). */
export const MAX_SPEED_SIGMAS = 3;

/** How the analytic cloud numbers were chosen, for reports. */
export const BUDGET_CLOUD_ASSUMPTIONS: readonly string[] = [
  `largest speed at t = 0: ${MAX_SPEED_SIGMAS} sigma_3D of the turbulence plus the rotation speed at the cloud's edge`,
  'peak density at t = 0: the envelope\'s central density, times the expected maximum of the lognormal structure over the cloud\'s cells when structure is lognormal',
];

/** A config with grid.cells replaced (the --cells option), unchanged when cells is undefined. */
export function withCells(config: Config, cells?: number): Config {
  return cells === undefined ? config : { ...config, grid: { ...config.grid, cells } };
}

/** Angular velocity, s^-1, of the configured rotation (omega, or from beta = E_rot/|W|); 0 without rotation. */
function rotationRate(config: Config, mass: number, radius: number, gravitationalEnergy: number): number {
  const r = config.cloud.rotation;
  if (!r) return 0;
  if (r.omega !== undefined) return r.omega;
  if (r.beta !== undefined) return Math.sqrt((r.beta * Math.abs(gravitationalEnergy)) / uniformSphereRotationalEnergy(mass, radius, 1));
  return 0;
}

/** The cloud numbers (cgs) the budget is computed from, analytic from the config: the same for `budget` and `plan`. */
export function budgetCloud(config: Config): BudgetCloud {
  const d = cloudDimensions(config);
  const { temperature, mu } = config.cloud;
  const cs = soundSpeed(temperature, mu);
  const t = config.cloud.turbulence;
  let sigma1D = 0;
  if (t?.mach !== undefined) sigma1D = (t.mach * cs) / Math.sqrt(3);
  else if (t?.virial_parameter !== undefined) sigma1D = sigmaForVirialParameter(t.virial_parameter, d.radius, d.mass);
  const omega = rotationRate(config, d.mass, d.radius, d.gravitationalEnergy);
  const maxSpeed = MAX_SPEED_SIGMAS * Math.sqrt(3) * sigma1D + omega * (d.shape === 'filament' ? d.radius : d.extent / 2);
  let peak = d.peakDensity;
  const s = config.cloud.structure;
  const mach = cs > 0 ? (Math.sqrt(3) * sigma1D) / cs : 0;
  if (s.kind === 'lognormal' && mach > 0) {
    const sigmaS = lognormalWidth(forcingParameter(config), mach);
    const dx = d.boxSize / config.grid.cells;
    const cells = Math.max(2, d.volume / dx ** 3);
    // Expected maximum of N Gaussian draws ~ sqrt(2 ln N) standard deviations (common practice, rough).
    peak *= Math.exp(sigmaS * Math.sqrt(2 * Math.log(cells)) - 0.5 * sigmaS * sigmaS);
  }
  return {
    mass: d.mass,
    radius: d.radius,
    meanDensity: d.meanDensity,
    peakDensity: peak,
    soundSpeed: cs,
    sigma1D,
    maxSpeed,
    boxSize: d.boxSize,
    temperature,
    mu,
    ambientSoundSpeed: soundSpeed(d.ambientTemperature, mu),
    volume: d.volume,
  };
}

/** The cloud block of the budget's JSON: the summary.json key names, from the analytic numbers. */
export function budgetCloudBlock(config: Config, c: BudgetCloud): Record<string, unknown> {
  const conv = config.survey.jeans_mass;
  return {
    basis: 'analytic, from the config (before generation)',
    mass_msun: toUnit(c.mass, 'Msun'),
    radius_pc: toUnit(c.radius, 'pc'),
    temperature_k: c.temperature,
    mu: c.mu,
    mean_density_gcc: c.meanDensity,
    mean_n_h2_cm3: h2NumberDensity(c.meanDensity),
    peak_density_gcc: c.peakDensity,
    sound_speed_kms: toUnit(c.soundSpeed, 'km/s'),
    sigma_1d_kms: toUnit(c.sigma1D, 'km/s'),
    mach: c.soundSpeed > 0 ? (Math.sqrt(3) * c.sigma1D) / c.soundSpeed : 0,
    max_speed_kms: toUnit(c.maxSpeed, 'km/s'),
    box_size_pc: toUnit(c.boxSize, 'pc'),
    jeans_mass_msun: toUnit(jeansMass(c.soundSpeed, c.meanDensity, conv), 'Msun'),
    jeans_length_pc: toUnit(jeansLength(c.soundSpeed, c.meanDensity), 'pc'),
    free_fall_time_myr: toUnit(freeFallTime(c.meanDensity), 'Myr'),
    jeans_mass_definition: `${conv}: ${describeJeansConvention(conv)}`,
    assumptions: [...BUDGET_CLOUD_ASSUMPTIONS],
  };
}

/** The budget of a loaded config (cells overrides grid.cells, hence the default base cells). */
export function budgetOf(loaded: LoadedConfig, opts: { cells?: number } = {}): { config: Config; cloud: BudgetCloud; budget: BudgetResult } {
  const config = withCells(loaded.config, opts.cells);
  const cloud = budgetCloud(config);
  return { config, cloud, budget: analyticBudget(config, cloud) };
}

/** What `fragplan budget` prints: text, or with --json the summary (schema fragplan.budget/1). */
export function runBudget(loaded: LoadedConfig, opts: { cells?: number } = {}): { summary: Record<string, unknown>; text: string } {
  const { config, cloud, budget } = budgetOf(loaded, opts);
  const summary: Record<string, unknown> = {
    schema: 'fragplan.budget/1',
    tool_version: TOOL_VERSION,
    name: loaded.name,
    config_sha256: loaded.sha256,
    cloud: budgetCloudBlock(config, cloud),
    resolution: resolutionSummary(budget, null),
    cost: costSummary(budget),
    warnings: [...budget.warnings],
    cautions: [...budget.cautions],
  };
  return { summary, text: budgetText(budget, null) };
}

