/**
 * `fragplan budget --ladder`: the same cloud (phase-consistent seed, so the large-scale
 * structure is the same at every resolution) generated and surveyed at several resolutions,
 * judged for convergence of the fragment count and the mass spectrum (criterion in
 * src/budget/convergence.ts), with the cost of each rung. The generate+survey step is passed in,
 * so the budget module stays independent of src/generate and src/survey.
 */
import type { LoadedConfig } from '../config/load.js';
import type { Config } from '../config/schema.js';
import { InputError } from '../input-error.js';
import { toUnit } from '../physics/units.js';
import { analyticBudget } from '../budget/analytic-budget.js';
import { ladderConvergence, type LadderSurvey } from '../budget/convergence.js';
import { fmt, fmtBytes } from '../budget/format.js';
import { budgetCloud, withCells } from './budget.js';

/** One rung's numbers. */
export interface LadderRung {
  cells: number;
  /** Wall time of generate + survey at this rung, s (measured; varies run to run). */
  seconds: number;
  survey: LadderSurvey;
}

/** Config for a rung: grid.cells and the budget's base cells both set to `cells`. */
export function rungConfig(config: Config, cells: number): Config {
  const c = withCells(config, cells);
  return { ...c, budget: { ...c.budget, grid: { ...c.budget.grid, base_cells: cells } } };
}

/** Median of masses (g), or null when empty. */
function median(xs: readonly number[]): number | null {
  if (xs.length === 0) return null;
  const s = Float64Array.from(xs).sort();
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : 0.5 * (s[m - 1]! + s[m]!);
}

/** Runs the ladder over `rungs` (cells per side, at least two distinct) and judges convergence. */
export async function runLadder(
  loaded: LoadedConfig,
  rungs: number[],
  runOne: (cells: number) => Promise<{ survey: LadderSurvey; seconds: number }>,
): Promise<{ summary: Record<string, unknown>; text: string; rungs: LadderRung[] }> {
  const sorted = [...new Set(rungs)].sort((a, b) => a - b);
  if (sorted.length < 2 || sorted.some((n) => !Number.isInteger(n) || n < 8)) {
    throw new InputError(`--ladder: expected at least two distinct resolutions of 8 or more cells per side, got [${rungs.join(', ')}]`);
  }
  const done: LadderRung[] = [];
  for (const cells of sorted) {
    const r = await runOne(cells);
    done.push({ cells, seconds: r.seconds, survey: r.survey });
  }
  const conv = ladderConvergence(done.map((r) => r.survey));
  const rows = done.map((r) => {
    const config = rungConfig(loaded.config, r.cells);
    const b = analyticBudget(config, budgetCloud(config));
    const med = median(r.survey.spectrum.masses);
    return {
      cells_per_side: r.cells,
      seconds: Math.round(r.seconds * 1000) / 1000,
      fragment_candidates: r.survey.candidates.length,
      expected_fragments: r.survey.expectedFragments,
      median_mass_msun: med === null ? null : toUnit(med, 'Msun'),
      cmf_slope: r.survey.spectrum.fit ? r.survey.spectrum.fit.slope : null,
      cell_size_pc: toUnit(b.levels[0]!.cellSize, 'pc'),
      base_max_resolved_density_gcc: b.levels[0]!.maxResolvedDensity,
      memory_bytes: b.costEstimate.memoryBytes,
      cell_updates: b.costEstimate.cellUpdates,
      core_hours: b.costEstimate.coreHours,
    };
  });
  const verdict = conv.converged === null ? 'undetermined' : conv.converged ? 'converged' : 'not converged';
  const summary: Record<string, unknown> = {
    verdict,
    reason: conv.reason,
    criterion: conv.criterion,
    count_converged: conv.countConverged,
    spectrum_converged: conv.spectrumConverged,
    ks_distance: conv.ksDistance,
    ks_critical: conv.ksCritical,
    rungs: rows,
    cautions: [
      'The ladder compares forecasts from initial conditions at several resolutions; it is not a convergence test of the real run, which must be repeated at higher resolution itself.',
      'Seconds are the measured wall time of generate + survey here; memory, updates and core-hours are the planned run\'s analytic estimates at each base resolution without refinement.',
    ],
  };
  const L: string[] = [];
  L.push(`Convergence ladder: ${verdict.toUpperCase()} - ${conv.reason}.`);
  L.push(`Criterion: ${conv.criterion}.`);
  L.push(`  ${'cells'.padStart(6)} ${'seconds'.padStart(8)} ${'candidates'.padStart(10)} ${'expected'.padStart(9)} ${'median [Msun]'.padStart(14)} ${'slope'.padStart(6)} ${'memory'.padStart(10)} ${'updates'.padStart(9)} ${'core-h'.padStart(8)}`);
  for (const r of rows) {
    L.push(`  ${`${r.cells_per_side}^3`.padStart(6)} ${fmt(r.seconds).padStart(8)} ${String(r.fragment_candidates).padStart(10)} ${fmt(r.expected_fragments).padStart(9)} ${fmt(r.median_mass_msun).padStart(14)} ${fmt(r.cmf_slope).padStart(6)} ${fmtBytes(r.memory_bytes).padStart(10)} ${fmt(r.cell_updates).padStart(9)} ${fmt(r.core_hours).padStart(8)}`);
  }
  for (const c of summary.cautions as string[]) L.push(`  * ${c}`);
  return { summary, text: `${L.join('\n')}\n`, rungs: done };
}
