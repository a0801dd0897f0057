/**
 * `fragplan survey <cube>`: the hierarchy and Jeans analysis of an existing density cube
 * (a .npy file, a raw file with --shape and --dtype, or a plan run folder), e.g. a snapshot of
 * the user's own run. Writes summary.json, tree.json, fragments.csv and report.html.
 * Cube conventions: C order (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3.
 */
import { existsSync, readFileSync, statSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { InputError } from '../input-error.js';
import { parseConfig, loadConfig } from '../config/load.js';
import type { Config } from '../config/schema.js';
import { parseUnit, describeDimension, DIM } from '../physics/units.js';
import { MU_DEFAULT } from '../physics/constants.js';
import { massDensityFromH2 } from '../physics/number-density.js';
import { parse as parseYaml } from 'yaml';
import { readIcManifest, readIcCloud } from '../export/manifest-read.js';
import type { Grid3 } from '../grid/grid3.js';
import { volumeIntegral } from '../grid/grid3.js';
import { createPool, defaultWorkerCount } from '../grid/pool.js';
import { surveyCloud } from '../survey/survey-cloud.js';
import { loadCube, loadVelocityCubes, surveyOptionsFromConfig, hierarchySummary, treeJson, fragmentsCsv } from '../survey/index.js';
import { gridResolution, gridResolutionSummary, eosFromConfig } from '../budget/index.js';
import { buildSummary, gridBlock, jsonText, withoutTimings } from '../report/build-summary.js';
import { buildPlots } from '../report/build-plots.js';
import { renderReport } from '../report/html-report.js';
import type { Summary } from '../report/summary-types.js';
import { writeFileAtomic } from '../export/atomic-file.js';
import { silentProgress, type ProgressSink } from '../progress.js';
import { assertRunDirUsable } from './run-dir.js';
import { TOOL_VERSION } from '../version.js';

/** Options of `fragplan survey`; quantities already in cgs. */
export interface SurveyCommandOptions {
  boxSize?: number;
  temperature?: number;
  mu?: number;
  shape?: string;
  dtype?: string;
  velocity?: string;
  /** Unit of the cube's values: a mass density (default g cm^-3) or a number density of H2 (cm^-3). */
  densityUnit: string;
  configFile?: string;
  out?: string;
  force: boolean;
  progress?: ProgressSink;
}

/** Factor from the cube's unit to g/cm^3 (n(H2) uses mu_H2 = 2.8 per molecule). */
export function densityFactor(unit: string): number {
  let u;
  try {
    u = parseUnit(unit);
  } catch (e) {
    throw new InputError(`--density-unit: ${(e as Error).message}`);
  }
  const same = (d: readonly number[]): boolean => d.every((x, i) => x === u.dim[i]);
  if (same(DIM.massDensity)) return u.factor;
  if (same(DIM.numberDensity)) return massDensityFromH2(u.factor);
  throw new InputError(`--density-unit: expected a mass density ("g cm^-3") or an H2 number density ("cm^-3"), got "${unit}" which is ${describeDimension(u.dim)}`);
}

function parseShape(text: string | undefined): [number, number, number] | undefined {
  if (text === undefined) return undefined;
  const parts = text.split(/[,x]/).map((s) => Number(s.trim()));
  if (parts.length !== 3 || parts.some((n) => !Number.isInteger(n) || n < 1)) throw new InputError(`--shape: expected three positive integers like 128,128,128, got "${text}"`);
  return parts as [number, number, number];
}

/** A config with defaults only, for the survey settings of a foreign cube. */
function defaultConfig(): Config {
  return parseConfig({ cloud: { mass: 1, radius: 1 } });
}

/** Surveys a cube or a run folder and writes the survey outputs. */
export async function runSurvey(target: string, opts: SurveyCommandOptions): Promise<{ summary: Summary; runDir: string; files: string[] }> {
  const progress = opts.progress ?? silentProgress;
  if (!existsSync(target)) throw new InputError(`${target}: no such file or folder`);
  let config = opts.configFile ? loadConfig(opts.configFile).config : defaultConfig();
  const t0 = performance.now();
  let grid: Grid3;
  let density: Float32Array;
  let velocity: readonly [Float32Array, Float32Array, Float32Array] | null = null;
  let magnetic: readonly [Float32Array, Float32Array, Float32Array] | null = null;
  let temperature: number | Float32Array;
  let mu: number;
  let sourceFile: string;
  let info: { ambientDensity: number | null; mach: number | null; velocitySpectrumIndex: number | null } = { ambientDensity: null, mach: null, velocitySpectrumIndex: null };
  if (statSync(target).isDirectory()) {
    // a plan run folder: every field comes back from ic/ (checked against the manifest's sha256)
    const { manifest, manifestFile, icDir } = readIcManifest(target);
    const cloud = await readIcCloud(manifest, icDir, manifestFile);
    if (typeof manifest.config_text === 'string' && !opts.configFile) config = parseConfig(parseYaml(manifest.config_text), manifestFile);
    ({ grid, density, velocity, magnetic } = cloud);
    temperature = opts.temperature ?? cloud.temperature;
    mu = opts.mu ?? cloud.summary.mu;
    sourceFile = manifestFile;
    info = { ambientDensity: cloud.summary.ambientDensity, mach: cloud.summary.mach, velocitySpectrumIndex: cloud.summary.velocitySpectrumIndex };
  } else {
    if (opts.boxSize === undefined) throw new InputError('--box-size: required for a cube (e.g. --box-size "2 pc")');
    temperature = opts.temperature ?? 10;
    mu = opts.mu ?? MU_DEFAULT;
    const factor = densityFactor(opts.densityUnit);
    const cube = loadCube(target, { shape: parseShape(opts.shape), dtype: opts.dtype as 'float32' | 'float64' | undefined });
    density = cube.density;
    if (factor !== 1) for (let i = 0; i < density.length; i++) density[i] = density[i]! * factor;
    const [nx, ny, nz] = cube.shape;
    grid = { nx, ny, nz, boxSize: opts.boxSize };
    if (opts.velocity) {
      const files = opts.velocity.split(',').map((x) => x.trim());
      if (files.length !== 3) throw new InputError(`--velocity: expected three files vx,vy,vz, got "${opts.velocity}"`);
      velocity = loadVelocityCubes(files, cube.shape, { shape: parseShape(opts.shape), dtype: opts.dtype as 'float32' | 'float64' | undefined });
    }
    sourceFile = target;
  }
  if (!(mu > 0.5 && mu < 4)) throw new InputError(`--mu: expected a mean molecular weight between 0.5 and 4, got ${mu}`);
  const tLoad = (performance.now() - t0) / 1000;

  const runDir = opts.out ?? path.join('runs', `${path.basename(target).replace(/\.(npy|raw|bin|dat)$/i, '')}-survey`);
  assertRunDirUsable(runDir, opts.force);
  const options = surveyOptionsFromConfig(config, info);
  const t1 = performance.now();
  const workers = config.grid.workers ?? defaultWorkerCount();
  const pool = workers > 1 ? createPool(workers) : null;
  let survey;
  try {
    survey = await surveyCloud({ grid, density, velocity, magnetic, temperature, mu, eos: eosFromConfig(config) }, options, progress, pool);
  } finally {
    await pool?.close();
  }
  const tSurvey = (performance.now() - t1) / 1000;
  const nj = config.budget.grid.cells_per_jeans_length;
  const gridRes = gridResolution(grid, density, temperature, mu, eosFromConfig(config), nj);
  const sha = createHash('sha256').update(readFileSync(sourceFile)).digest('hex');
  const summary = buildSummary({
    name: path.basename(runDir), toolVersion: TOOL_VERSION, seed: null, configSha256: null,
    grid: { ...gridBlock(grid, volumeIntegral(grid, density)), source_file: sourceFile, source_sha256: sha, temperature_k: typeof temperature === 'number' ? temperature : null, mu },
    resolution: gridResolutionSummary(gridRes, nj), hierarchy: hierarchySummary(survey),
    warnings: [], timings: { load: tLoad, survey: tSurvey, ...Object.fromEntries(Object.entries(survey.timings).map(([k, v]) => [`survey_${k}`, v])) },
  });
  const plots = await buildPlots(null, survey, gridRes, nj, { grid, density });
  mkdirSync(runDir, { recursive: true });
  const files: string[] = [];
  const put = (name: string, data: string): void => {
    writeFileAtomic(path.join(runDir, name), data, opts.force);
    files.push(name);
  };
  put('tree.json', jsonText(treeJson(survey)));
  put('fragments.csv', fragmentsCsv(survey));
  put('report.html', renderReport(withoutTimings(summary) as Summary, plots, opts.configFile ? readFileSync(opts.configFile, 'utf8') : '# no config: survey of a foreign cube with default settings\n'));
  put('summary.json', jsonText(summary));
  return { summary, runDir, files };
}
