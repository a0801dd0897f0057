/**
 * `fragplan plan`: config -> Cloud -> Survey -> Budget -> outputs, the main job.
 *
 * Writes into the run folder: summary.json, ic/ (with manifest.json), tree.json,
 * fragments.csv, report.html and preview.zip. Every file goes to a temporary name first and is
 * renamed when complete. Only summary.json's timings_s block differs between runs of the same
 * config and seed.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { LoadedConfig } from '../config/load.js';
import type { Config } from '../config/schema.js';
import type { Cloud } from '../generate/cloud.js';
import { generateCloud, estimateGenerateBytes } from '../generate/generate-cloud.js';
import { createPool, defaultWorkerCount, type WorkerPool } from '../grid/pool.js';
import { isPowerOfTwo, volumeIntegral } from '../grid/grid3.js';
import { InputError } from '../input-error.js';
import { surveyCloud } from '../survey/survey-cloud.js';
import { surveyOptionsFromConfig, hierarchySummary, treeJson, fragmentsCsv, runEnsemble, ensembleSummary, estimateSurveyBytes } from '../survey/index.js';
import type { SurveyResult } from '../survey/types.js';
import { analyticBudget, gridResolution, resolutionSummary, costSummary, eosFromConfig } from '../budget/index.js';
import type { BudgetResult, GridResolution } from '../budget/types.js';
import { budgetCloud } from './budget.js';
import { writeGridExports } from '../export/grid-exports.js';
import { writePreview } from '../export/preview.js';
import { writeFileAtomic } from '../export/atomic-file.js';
import { renderReport } from '../report/html-report.js';
import { buildSummary, cloudBlock, gridBlock, jsonText, withoutTimings } from '../report/build-summary.js';
import { buildPlots } from '../report/build-plots.js';
import type { Summary } from '../report/summary-types.js';
import type { PlotData } from '../report/plot-data.js';
import { silentProgress, type ProgressSink } from '../progress.js';
import { assertFits } from './memory-guard.js';
import { assertRunDirUsable, defaultRunDir } from './run-dir.js';
import { TOOL_VERSION } from '../version.js';
import { toUnit } from '../physics/units.js';

/** Options of a plan run (command-line overrides of the config). */
export interface PlanOptions {
  out?: string;
  cells?: number;
  seed?: number;
  workers?: number;
  realizations?: number;
  force: boolean;
  progress?: ProgressSink;
}

/** What a plan run returns: the summary, where it wrote, and the pieces for the terminal. */
export interface PlanResult {
  summary: Summary;
  plots: PlotData;
  runDir: string;
  files: string[];
  budget: BudgetResult;
  gridResolution: GridResolution;
}

/** The config with command-line overrides applied; --cells must be a power of two from 8 to 4096. */
export function effectiveConfig(config: Config, opts: Pick<PlanOptions, 'cells' | 'seed' | 'workers' | 'realizations'>): Config {
  if (opts.cells !== undefined && (!isPowerOfTwo(opts.cells) || opts.cells < 8 || opts.cells > 4096)) {
    throw new InputError(`--cells: expected a power of two from 8 to 4096 (the FFT needs one), got ${opts.cells}`);
  }
  return {
    ...config,
    seed: opts.seed ?? config.seed,
    grid: { ...config.grid, cells: opts.cells ?? config.grid.cells, workers: opts.workers ?? config.grid.workers },
    survey: { ...config.survey, realizations: opts.realizations ?? config.survey.realizations },
  };
}

/** Generates and surveys one cloud (used by plan, ensembles and the ladder). */
export async function generateAndSurvey(config: Config, pool: WorkerPool | null, progress: ProgressSink, seed = config.seed, cells = config.grid.cells): Promise<{ cloud: Cloud; survey: SurveyResult; seconds: Record<string, number> }> {
  const t0 = performance.now();
  const cloud = await generateCloud(config, { seed, cells, pool, progress });
  const t1 = performance.now();
  const s = cloud.summary;
  const options = surveyOptionsFromConfig(config, { ambientDensity: s.ambientDensity, mach: s.mach, velocitySpectrumIndex: s.velocitySpectrumIndex });
  const survey = await surveyCloud(
    { grid: cloud.grid, density: cloud.density, velocity: cloud.velocity, magnetic: cloud.magnetic, temperature: cloud.temperature, mu: s.mu, eos: eosFromConfig(config) },
    options,
    progress,
    pool,
  );
  const t2 = performance.now();
  return { cloud, survey, seconds: { generate: (t1 - t0) / 1000, survey: (t2 - t1) / 1000 } };
}

/** The analytic budget, computed from the config exactly as `fragplan budget` does, so both agree. */
export function budgetForConfig(config: Config): BudgetResult {
  return analyticBudget(config, budgetCloud(config));
}

/**
 * Warnings for root regions that are bound (E_th + E_kin + E_mag + W < 0) yet below their Jeans mass
 * at their mean density: centrally condensed clouds (a Bonnor–Ebert sphere near critical has
 * M/M_J ~ 0.6 at its mean density) can be bound without passing the mean-density Jeans test.
 */
export function boundButStableWarnings(survey: SurveyResult): string[] {
  return survey.roots
    .map((id) => survey.nodes[id]!)
    .filter((n) => n.bound && !n.unstable)
    .map((n) => `region #${n.id} (${toUnit(n.mass, 'Msun').toPrecision(3)} Msun) is gravitationally bound but below its Jeans mass at its mean density (${toUnit(n.jeansMass, 'Msun').toPrecision(3)} Msun): centrally condensed clouds can collapse from the centre without passing the mean-density Jeans test; read its bound flag and energies in tree.json`);
}

/** Runs the whole plan: generate, survey, budget, write every output. */
export async function runPlan(loaded: LoadedConfig, opts: PlanOptions): Promise<PlanResult> {
  const progress = opts.progress ?? silentProgress;
  const config = effectiveConfig(loaded.config, opts);
  const runDir = opts.out ?? defaultRunDir(loaded.name);
  assertRunDirUsable(runDir, opts.force);
  const cells = config.grid.cells;
  assertFits(`plan at ${cells}^3`, estimateGenerateBytes(config, cells) + estimateSurveyBytes(cells));

  const workers = config.grid.workers ?? defaultWorkerCount();
  const pool = workers > 1 ? createPool(workers) : null;
  try {
    const timings: Record<string, number> = {};
    const { cloud, survey, seconds } = await generateAndSurvey(config, pool, progress);
    Object.assign(timings, seconds);
    for (const [k, v] of Object.entries(survey.timings)) timings[`survey_${k}`] = v;

    let t = performance.now();
    const nj = config.budget.grid.cells_per_jeans_length;
    const gridRes = gridResolution(cloud.grid, cloud.density, cloud.temperature, cloud.summary.mu, eosFromConfig(config), nj);
    const budget = budgetForConfig(config);
    timings.budget = (performance.now() - t) / 1000;

    let ensemble: Record<string, unknown> | undefined;
    if (config.survey.realizations > 1) {
      t = performance.now();
      const seeds = Array.from({ length: config.survey.realizations }, (_, i) => config.seed + i);
      const stats = await runEnsemble(seeds.length, async (seed) => (await generateAndSurvey(config, pool, silentProgress, seed)).survey, seeds);
      ensemble = ensembleSummary(stats);
      timings.ensemble = (performance.now() - t) / 1000;
    }

    const warnings = [...cloud.summary.notes, ...budget.warnings, ...boundButStableWarnings(survey)];
    const summaryWithTimes = (): Summary =>
      buildSummary({
        name: loaded.name, toolVersion: TOOL_VERSION, seed: config.seed, configSha256: loaded.sha256,
        cloud: cloudBlock(cloud.summary), grid: gridBlock(cloud.grid, volumeIntegral(cloud.grid, cloud.density)),
        resolution: resolutionSummary(budget, gridRes), hierarchy: hierarchySummary(survey), cost: costSummary(budget),
        ...(ensemble ? { ensemble } : {}), warnings, timings,
      });
    t = performance.now();
    const plots = await buildPlots(cloud, survey, gridRes, nj, undefined, pool);
    timings.plots = (performance.now() - t) / 1000;
    const tree = treeJson(survey);
    const csv = fragmentsCsv(survey);
    const stable = withoutTimings(summaryWithTimes());

    t = performance.now();
    mkdirSync(runDir, { recursive: true });
    const files: string[] = [];
    const put = (name: string, data: string | Uint8Array): void => {
      writeFileAtomic(path.join(runDir, name), data, opts.force);
      files.push(name);
    };
    const ex = config.export;
    await writeGridExports(cloud, path.join(runDir, 'ic'), {
      formats: ex.formats, precision: ex.precision, units: ex.units, codeUnits: { length: ex.code_units.length, mass: ex.code_units.mass },
      thermalField: ex.thermal_field, particles: ex.particles ?? null, force: opts.force, mu: cloud.summary.mu,
    }, { toolVersion: TOOL_VERSION, seed: config.seed, configText: loaded.text, configSha256: loaded.sha256, name: loaded.name }, progress);
    files.push('ic/manifest.json');
    put('tree.json', jsonText(tree));
    put('fragments.csv', csv);
    put('report.html', renderReport(stable as Summary, plots, loaded.text));
    await writePreview(path.join(runDir, 'preview.zip'), {
      cloud, jeansNumber: gridRes.jeansNumber, labels: survey.labels, summary: stable, tree, fragmentsCsv: csv, plots,
      particles: null, previewCells: Math.min(ex.preview_cells, cells), toolVersion: TOOL_VERSION,
    }, opts.force);
    files.push('preview.zip');
    timings.write = (performance.now() - t) / 1000;
    const summary = summaryWithTimes();
    put('summary.json', jsonText(summary));
    return { summary, plots, runDir, files, budget, gridResolution: gridRes };
  } finally {
    await pool?.close();
  }
}
