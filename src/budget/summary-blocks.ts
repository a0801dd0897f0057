/**
 * The `resolution` and `cost` blocks of summary.json (and of `fragplan budget --json`):
 * snake_case keys with unit suffixes; units converted here, once, from cgs.
 */
import { h2NumberDensity } from '../physics/number-density.js';
import { describeJeansConvention } from '../physics/jeans.js';
import { toUnit } from '../physics/units.js';
import type { BudgetResult, GridResolution } from './types.js';


/** The grid-only resolution numbers (per-cell Jeans number on a generated or loaded cube). */
export function gridResolutionSummary(g: GridResolution, cellsPerJeansLength: number): Record<string, unknown> {
  return {
    cells_per_jeans_length: cellsPerJeansLength,
    jeans_cells_min: g.jeansCellsMin,
    unresolved_mass_fraction: g.unresolvedMassFraction,
    cells_needing_refinement: g.cellsNeedingRefinement,
    jeans_criterion: `cell unresolved when J = dx / lambda_J > 1/${cellsPerJeansLength} (Truelove et al. 1997)`,
  };
}

/** The `resolution` block: analytic budget plus, with a grid, the t = 0 Jeans-number numbers. */
export function resolutionSummary(b: BudgetResult, g: GridResolution | null): Record<string, unknown> {
  const grid = b.code === 'grid';
  const p = b.plan;
  const out: Record<string, unknown> = {
    verdict: b.verdict.status,
    verdict_reason: b.verdict.reason,
    code: b.code,
    eos: b.eos.kind,
    eos_critical_density_gcc: b.eos.kind === 'barotropic' ? b.eos.criticalDensity : null,
    eos_gamma: b.eos.kind === 'barotropic' ? b.eos.gamma : null,
    jeans_mass_definition: `${b.jeansConvention}: ${describeJeansConvention(b.jeansConvention)}`,
  };
  if (grid) {
    Object.assign(out, {
      cells_per_jeans_length: p.cellsPerJeansLength,
      base_cells: p.baseCells,
      levels_planned: p.levels,
      refinement_ratio: p.refinementRatio,
      finest_cell_size_pc: toUnit(b.levels[b.levels.length - 1]!.cellSize, 'pc'),
      finest_cell_size_au: toUnit(b.levels[b.levels.length - 1]!.cellSize, 'au'),
    });
  } else {
    Object.assign(out, {
      particle_count: p.particleCount,
      particle_mass_msun: toUnit(p.particleMass, 'Msun'),
      neighbours: p.neighbours,
      resolvable_factor: p.resolvableFactor,
      resolvable_mass_msun: toUnit(b.levels[0]!.jeansMass, 'Msun'),
      smoothing_length_at_limit_pc: toUnit(b.levels[0]!.cellSize, 'pc'),
    });
  }
  if (g) Object.assign(out, gridResolutionSummary(g, p.cellsPerJeansLength));
  Object.assign(out, {
    max_resolved_density_gcc: b.maxResolvedDensity,
    max_resolved_n_h2_cm3: h2NumberDensity(b.maxResolvedDensity),
    temperature_at_limit_k: b.temperatureAtLimit,
    jeans_mass_at_limit_msun: toUnit(b.jeansMassAtLimit, 'Msun'),
    free_fall_time_at_limit_yr: toUnit(b.freeFallTimeAtLimit, 'yr'),
    target_density_gcc: b.targetDensity,
    min_fragment_density_gcc: b.minMassDensity,
    required_density_gcc: b.requiredDensity,
    levels_needed: b.levelsNeeded,
    levels_for_target: b.levelsForTarget,
    levels_for_min_mass: b.levelsForMinMass,
    levels_needed_at_start: b.levelsAtStart,
    particles_needed: b.particlesNeeded,
    particles_for_target: b.particlesForTarget,
    particles_for_min_mass: b.particlesForMinMass,
    minimum_jeans_mass_msun: b.minimumJeansMass ? toUnit(b.minimumJeansMass.mass, 'Msun') : null,
    minimum_jeans_mass_density_gcc: b.minimumJeansMass ? b.minimumJeansMass.density : null,
    sink_threshold_gcc: b.sinkThreshold,
    sink_radius_pc: toUnit(b.sinkRadius, 'pc'),
    sink_radius_au: toUnit(b.sinkRadius, 'au'),
    sink_radius_cells: b.sinkRadiusCells,
    sink_radius_unit: grid ? 'finest cells (Federrath et al. 2010)' : 'smoothing lengths at the threshold (kernel support 2h)',
    levels: b.levels.map((l) => ({
      level: l.level,
      cell_size_pc: toUnit(l.cellSize, 'pc'),
      cell_size_au: toUnit(l.cellSize, 'au'),
      max_resolved_density_gcc: l.maxResolvedDensity,
      max_resolved_n_h2_cm3: h2NumberDensity(l.maxResolvedDensity),
      temperature_k: l.temperature,
      jeans_mass_msun: toUnit(l.jeansMass, 'Msun'),
    })),
    criterion: grid
      ? `at least ${p.cellsPerJeansLength} cells per Jeans length, judged at the EOS temperature at each density (Truelove et al. 1997)`
      : `Jeans mass above ${p.resolvableFactor} x N_neigh x m_particle, judged at the EOS temperature at each density (Bate & Burkert 1997)`,
  });
  return out;
}

/** The `cost` block (core_hours null without a user-given throughput). */
export function costSummary(b: BudgetResult): Record<string, unknown> {
  const c = b.costEstimate;
  const grid = b.code === 'grid';
  return {
    updates_of: grid ? 'cells' : 'particles',
    memory_bytes: c.memoryBytes,
    memory_gib: c.memoryBytes / 2 ** 30,
    values_per_element: c.variables,
    time_step_s: c.timeStep,
    time_step_yr: toUnit(c.timeStep, 'yr'),
    courant_number: b.plan.courant,
    initial_free_fall_time_myr: toUnit(c.initialFreeFallTime, 'Myr'),
    free_fall_times: b.plan.freeFallTimes,
    run_time_myr: toUnit(c.runTime, 'Myr'),
    steps: c.steps,
    cell_updates: c.cellUpdates,
    refined_cells_estimate: c.refinedCells,
    refined_cell_updates_estimate: c.refinedCellUpdates,
    refined_memory_bytes_estimate: c.refinedMemoryBytes,
    total_updates: c.totalUpdates,
    finest_time_step_s: c.finestTimeStep,
    finest_time_step_yr: toUnit(c.finestTimeStep, 'yr'),
    collapse_centres: c.collapseCentres,
    refined_levels: c.refinedLevels.map((l) => ({
      level: l.level,
      cell_size_pc: toUnit(l.cellSize, 'pc'),
      trigger_density_gcc: l.triggerDensity,
      cells: l.cells,
      turbulent_cells: l.turbulentCells,
      collapse_cells: l.collapseCells,
      time_step_yr: toUnit(l.timeStep, 'yr'),
      updates: l.updates,
    })),
    throughput_updates_per_core_s: b.plan.throughput,
    core_hours: c.coreHours,
    assumptions: [...c.assumptions],
  };
}
