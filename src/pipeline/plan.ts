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
import { defaultWorkerCount, runWhole, type WorkerPool } from '../grid/pool.js';
import { closePlanPools, planPools, type PlanPools } from './plan-pools.js';
import { isPowerOfTwo } from '../grid/grid3.js';
import { InputError } from '../input-error.js';
import { surveyCloud } from '../survey/survey-cloud.js';
import { surveyOptionsFromConfig, hierarchySummary, treeJson, fragmentsCsv, runEnsemble, ensembleSummary, estimateSurveyBytes, startMergeTree, type PendingTree } from '../survey/index.js';
import type { SurveyResult } from '../survey/types.js';
import { analyticBudget, gridResolution, resolutionSummary, costSummary, eosFromConfig } from '../budget/index.js';
import type { BudgetResult, GridResolution } from '../budget/types.js';
import { budgetCloud } from './budget.js';
import { writeGridExports } from '../export/grid-exports.js';
import { previewBlocks, previewSize, writePreview } from '../export/preview.js';
import { writeFileAtomic } from '../export/atomic-file.js';
import { renderReport } from '../report/html-report.js';
import { buildSummary, cloudBlock, gridBlock, jsonText, withoutTimings } from '../report/build-summary.js';
import { buildGridPlots, withSurveyPlots, type GridPlots } from '../report/build-plots.js';
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
  /** Threads started early (see plan-pools.ts); used when they match the worker count, closed in any case. */
  pools?: PlanPools;
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

/**
 * Generates and surveys one cloud (used by plan, ensembles and the ladder). With `lane` (a one-worker
 * pool nothing else uses) the merge tree is built there from the moment the density is final, while the
 * generator makes the velocity. Once the cloud is done, `beside` (work on the cloud that does not need
 * the survey) runs beside the survey; both are awaited, and `besides` is what beside returned.
 * Timings: generate (s), grid_outputs (s, beside's time, when given),
 * survey (s, from the end of the generation; the tree's own build time, overlapping the others, is in
 * the survey's timings).
 */
export async function generateAndSurvey<T = void>(
  config: Config, pool: WorkerPool | null, progress: ProgressSink, seed = config.seed, cells = config.grid.cells,
  lane: WorkerPool | null = null, beside?: (cloud: Cloud) => Promise<T>,
): Promise<{ cloud: Cloud; survey: SurveyResult; seconds: Record<string, number>; besides: T | undefined }> {
  const t0 = performance.now();
  let pending: PendingTree | undefined;
  const cloud = await generateCloud(config, {
    seed, cells, pool, progress,
    onDensity: (density, grid, ambientDensity) => {
      pending = startMergeTree(density, grid, surveyOptionsFromConfig(config, { ambientDensity, mach: null, velocitySpectrumIndex: null }), lane);
    },
  });
  const t1 = performance.now();
  const seconds: Record<string, number> = { generate: (t1 - t0) / 1000 };
  const side = beside ? beside(cloud).then((v) => { seconds.grid_outputs = (performance.now() - t1) / 1000; return v; }) : Promise.resolve(undefined);
  side.catch(() => {}); // awaited below; a failure is reported there
  const s = cloud.summary;
  const options = surveyOptionsFromConfig(config, { ambientDensity: s.ambientDensity, mach: s.mach, velocitySpectrumIndex: s.velocitySpectrumIndex });
  const survey = await surveyCloud(
    { grid: cloud.grid, density: cloud.density, velocity: cloud.velocity, magnetic: cloud.magnetic, temperature: cloud.temperature, mu: s.mu, eos: eosFromConfig(config) },
    options,
    progress,
    pool,
    pending,
  );
  seconds.survey = (performance.now() - t1) / 1000;
  let besides: T | undefined;
  if (beside) {
    const st = progress.stage('grid outputs', 1);
    besides = await side;
    st.update(1);
    st.stop();
  }
  return { cloud, survey, seconds, besides };
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
  const runDir = opts.out ?? defaultRunDir(loaded.name);
  let threads = opts.pools;
  try {
    const config = effectiveConfig(loaded.config, opts);
    assertRunDirUsable(runDir, opts.force);
    const cells = config.grid.cells;
    assertFits(`plan at ${cells}^3`, estimateGenerateBytes(config, cells) + estimateSurveyBytes(cells));
    // the pool for the grid work and the merge tree's own worker beside it (see generateAndSurvey)
    threads = await planPools(config.grid.workers ?? defaultWorkerCount(), opts.pools);
    const { pool, lane } = threads;
    const timings: Record<string, number> = {};
    const nj = config.budget.grid.cells_per_jeans_length;
    const ex = config.export;
    const previewCells = Math.min(ex.preview_cells, cells);
    const files: string[] = [];
    // Work on the finished cloud that does not need the survey, done beside it (see
    // generateAndSurvey): the grid's Jeans numbers and the budget, the grid plots, the preview's
    // label-free block reductions; the
    // initial-condition files are started here and awaited after the survey.
    const gridOutputs = async (cloud: Cloud) => {
      // Jeans numbers and histograms on the pool (into shared memory)
      const eos = eosFromConfig(config);
      const jmap = new Float32Array(new SharedArrayBuffer(cloud.density.length * 4));
      const resP = runWhole(pool, 'budgetGridResolution', gridResolution, [cloud.grid, cloud.density, cloud.temperature, cloud.summary.mu, eos, nj, jmap]);
      const plotsP = buildGridPlots(cloud, resP, nj, undefined, pool);
      plotsP.catch(() => {}); // awaited below; a failure is reported there
      // the preview's block reductions that need no labels, on the pool once the Jeans numbers are there
      const n = cloud.grid.nx;
      const blocksP = resP.then((r) => runWhole(pool, 'previewBlocks', previewBlocks, [n, previewSize(n, previewCells), cloud.density, r.jeansNumber]));
      blocksP.catch(() => {}); // awaited below
      const budget = budgetForConfig(config);
      // the grid files are written in the background while the survey runs (no bar: the survey's show)
      const t = performance.now();
      mkdirSync(runDir, { recursive: true });
      const icWrite = writeGridExports(cloud, path.join(runDir, 'ic'), {
        formats: ex.formats, precision: ex.precision, units: ex.units, codeUnits: { length: ex.code_units.length, mass: ex.code_units.mass },
        thermalField: ex.thermal_field, particles: ex.particles ?? null, force: opts.force, mu: cloud.summary.mu, pool,
      }, { toolVersion: TOOL_VERSION, seed: config.seed, configText: loaded.text, configSha256: loaded.sha256, name: loaded.name }, silentProgress)
        .then(() => { timings.write_ic = (performance.now() - t) / 1000; });
      icWrite.catch(() => {}); // awaited after the survey; a failure is reported there
      return { gridRes: await resP, gridPlots: await plotsP, budget, icWrite, previewBlocks: await blocksP };
    };
    const { cloud, survey, seconds, besides } = await generateAndSurvey(config, pool, progress, config.seed, cells, lane, gridOutputs);
    const { gridRes: res, gridPlots, budget: bud, icWrite, previewBlocks: blocks } = besides!;
    Object.assign(timings, seconds);
    for (const [k, v] of Object.entries(survey.timings)) timings[`survey_${k}`] = v;
    const sw = progress.stage('writing grids', 1);
    await icWrite;
    sw.update(1);
    sw.stop();
    files.push('ic/manifest.json');

    let ensemble: Record<string, unknown> | undefined;
    let t = performance.now();
    if (config.survey.realizations > 1) {
      const seeds = Array.from({ length: config.survey.realizations }, (_, i) => config.seed + i);
      const stats = await runEnsemble(seeds.length, async (seed) => (await generateAndSurvey(config, pool, silentProgress, seed, cells, lane)).survey, seeds);
      ensemble = ensembleSummary(stats);
      timings.ensemble = (performance.now() - t) / 1000;
    }

    const warnings = [...cloud.summary.notes, ...bud.warnings, ...boundButStableWarnings(survey)];
    const summaryWithTimes = (): Summary =>
      buildSummary({
        name: loaded.name, toolVersion: TOOL_VERSION, seed: config.seed, configSha256: loaded.sha256,
        cloud: cloudBlock(cloud.summary), grid: gridBlock(cloud.grid, cloud.summary.massOnGrid),
        resolution: resolutionSummary(bud, res), hierarchy: hierarchySummary(survey), cost: costSummary(bud),
        ...(ensemble ? { ensemble } : {}), warnings, timings,
      });
    const plots = withSurveyPlots(gridPlots, survey);
    const tree = treeJson(survey);
    const csv = fragmentsCsv(survey);
    const stable = withoutTimings(summaryWithTimes());

    t = performance.now();
    const put = (name: string, data: string | Uint8Array): void => {
      writeFileAtomic(path.join(runDir, name), data, opts.force);
      files.push(name);
    };
    // preview.zip first: its entries deflate on Node's thread pool while this thread writes the rest
    const treeText = jsonText(tree);
    const previewP = writePreview(path.join(runDir, 'preview.zip'), {
      cloud, jeansNumber: res.jeansNumber, labels: survey.labels, summary: stable, tree, fragmentsCsv: csv, plots,
      particles: null, previewCells, toolVersion: TOOL_VERSION, blocks, treeText,
    }, opts.force);
    previewP.catch(() => {}); // awaited below
    put('tree.json', treeText);
    put('fragments.csv', csv);
    put('report.html', renderReport(stable as Summary, plots, loaded.text));
    await previewP;
    files.push('preview.zip');
    timings.write = (performance.now() - t) / 1000;
    const summary = summaryWithTimes();
    put('summary.json', jsonText(summary));
    return { summary, plots, runDir, files, budget: bud, gridResolution: res };
  } finally {
    if (threads) await closePlanPools(threads);
  }
}
