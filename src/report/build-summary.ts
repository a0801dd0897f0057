/**
 * Assembles summary.json (schema "fragplan.summary/1") from the pipeline's results.
 * Units are converted here, once, from cgs to the unit named in each key.
 */
import type { CloudSummary } from '../generate/cloud.js';
import type { Grid3 } from '../grid/grid3.js';
import { cellSize } from '../grid/grid3.js';
import { describeJeansConvention } from '../physics/jeans.js';
import { toUnit } from '../physics/units.js';
import type { Summary, SummaryCloud, SummaryGrid } from './summary-types.js';

/** The cautions every forecast carries. */
export const CAUTIONS: readonly string[] = [
  'This is a statistical preview of the initial conditions, not a simulation: fragplan does not evolve the cloud.',
  'Fragment counts and mass spectra are forecasts from the t = 0 density field and simple criteria; the real run decides.',
  'Check convergence in the real run (repeat it at higher resolution) before trusting any fragment count.',
];

/** The cloud block of summary.json from a CloudSummary (cgs in, named units out). */
export function cloudBlock(c: CloudSummary): SummaryCloud {
  return {
    mass_msun: toUnit(c.mass, 'Msun'),
    radius_pc: toUnit(c.radius, 'pc'),
    temperature_k: c.temperature,
    mu: c.mu,
    mean_density_gcc: c.meanDensity,
    sound_speed_kms: toUnit(c.soundSpeed, 'km/s'),
    mach: c.mach,
    sigma_1d_kms: toUnit(c.sigma1D, 'km/s'),
    virial_parameter: c.virialParameter,
    alpha_thermal: c.alphaThermal,
    beta_rotation: c.betaRotation,
    omega_per_s: c.omega,
    jeans_mass_msun: toUnit(c.jeansMass, 'Msun'),
    jeans_length_pc: toUnit(c.jeansLength, 'pc'),
    jeans_masses_in_cloud: c.mass / c.jeansMass,
    free_fall_time_myr: toUnit(c.freeFallTime, 'Myr'),
    jeans_mass_definition: `${c.jeansConvention}: ${describeJeansConvention(c.jeansConvention)}`,
    envelope: c.envelope,
    structure: c.structure,
    mass_correction_factor: c.massCorrection,
    ambient_density_gcc: c.ambientDensity,
    ambient_temperature_k: c.ambientTemperature,
    field_ug: c.field === null ? null : toUnit(c.field, 'uG'),
    mass_to_flux_relative: c.massToFluxRelative,
    alfven_mach: c.alfvenMach,
    plasma_beta: c.plasmaBeta,
    sigma_s_target: c.sigmaS,
    velocity_spectrum_index: c.velocitySpectrumIndex,
    k_min: c.kMin,
    k_max: c.kMax,
    solenoidal_weight: c.solenoidalWeight,
  };
}

/** The grid block of summary.json. */
export function gridBlock(g: Grid3, massOnGrid: number): SummaryGrid {
  return {
    cells_per_side: g.nx,
    shape: [g.nx, g.ny, g.nz],
    box_size_pc: toUnit(g.boxSize, 'pc'),
    cell_size_pc: toUnit(cellSize(g), 'pc'),
    mass_on_grid_msun: toUnit(massOnGrid, 'Msun'),
    axis_order: 'C order, index (i*ny + j)*nz + k, i along x',
    cell_centring: 'cell-centred; box spans [-L/2, L/2) on each axis',
  };
}

/** Everything summary.json holds, assembled in a fixed key order (so the bytes are stable). */
export function buildSummary(parts: {
  name: string;
  toolVersion: string;
  seed: number | null;
  configSha256: string | null;
  cloud?: SummaryCloud;
  grid: SummaryGrid;
  resolution?: Record<string, unknown>;
  hierarchy: Record<string, unknown>;
  cost?: Record<string, unknown>;
  ensemble?: Record<string, unknown>;
  warnings: string[];
  timings: Record<string, number>;
}): Summary {
  const s: Summary = {
    schema: 'fragplan.summary/1',
    tool_version: parts.toolVersion,
    name: parts.name,
    seed: parts.seed,
    config_sha256: parts.configSha256,
    ...(parts.cloud ? { cloud: parts.cloud } : {}),
    grid: parts.grid,
    ...(parts.resolution ? { resolution: parts.resolution } : {}),
    hierarchy: parts.hierarchy,
    ...(parts.cost ? { cost: parts.cost } : {}),
    ...(parts.ensemble ? { ensemble: parts.ensemble } : {}),
    warnings: parts.warnings,
    cautions: [...CAUTIONS],
    timings_s: Object.fromEntries(Object.entries(parts.timings).map(([k, v]) => [k, Math.round(v * 1000) / 1000])),
  };
  return s;
}

/** The summary without wall-clock timings: what goes into files that must be byte-identical run to run. */
export function withoutTimings(s: Summary): Omit<Summary, 'timings_s'> {
  const { timings_s: _t, ...rest } = s;
  void _t;
  return rest;
}

/** JSON text of a value with 2-space indent and a final newline, non-finite numbers as null. */
export function jsonText(value: unknown): string {
  // JSON.stringify writes null for NaN and +-Infinity itself (ECMA-262, SerializeJSONProperty)
  return `${JSON.stringify(value, null, 2)}\n`;
}
