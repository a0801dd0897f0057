/**
 * The shape of summary.json (schema "fragplan.summary/1"): snake_case keys with unit suffixes.
 * Blocks may carry more keys than listed; listed keys are always present when the block is.
 */

/** The cloud block: what was built, at the mean density and temperature. */
export interface SummaryCloud {
  mass_msun: number;
  radius_pc: number;
  temperature_k: number;
  mu: number;
  mean_density_gcc: number;
  sound_speed_kms: number;
  mach: number;
  virial_parameter: number;
  alpha_thermal: number;
  beta_rotation: number;
  jeans_mass_msun: number;
  jeans_length_pc: number;
  free_fall_time_myr: number;
  jeans_mass_definition: string;
  [key: string]: unknown;
}

/** The grid block. */
export interface SummaryGrid {
  cells_per_side: number;
  box_size_pc: number;
  cell_size_pc: number;
  /** Everything in the box, cloud and ambient. */
  mass_on_grid_msun: number;
  [key: string]: unknown;
}

/** summary.json as written by `fragplan plan` (and, without grid blocks, by `fragplan survey`). */
export interface Summary {
  schema: 'fragplan.summary/1';
  tool_version: string;
  seed: number | null;
  config_sha256: string | null;
  name: string;
  cloud?: SummaryCloud;
  grid: SummaryGrid;
  resolution?: Record<string, unknown>;
  hierarchy: Record<string, unknown>;
  cost?: Record<string, unknown>;
  ensemble?: Record<string, unknown>;
  warnings: string[];
  cautions: string[];
  timings_s: Record<string, number>;
}
