/**
 * The work of one `fragplan plan`, piece by piece on one thread (no worker pool): how long each
 * piece takes alone, to see where the CPU goes (the plan itself runs them side by side on the cores).
 *
 * Usage: npx tsx bench/work-split.mts [cells=256] [preset=presets/massive-clump.yaml]
 * Prints seconds per piece; the grid files go to a temporary folder.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { loadConfig } from '../src/config/load.ts';
import { effectiveConfig } from '../src/pipeline/plan.ts';
import { generateCloud } from '../src/generate/generate-cloud.ts';
import { gridResolution } from '../src/budget/grid-resolution.ts';
import { eosFromConfig } from '../src/budget/index.ts';
import { densityPdf, jeansHistogram, velocitySpectrum } from '../src/report/build-plots.ts';
import { surveyCloud } from '../src/survey/survey-cloud.ts';
import { surveyOptionsFromConfig } from '../src/survey/survey-options.ts';
import { writeGridExports } from '../src/export/grid-exports.ts';
import { TOOL_VERSION } from '../src/version.ts';
import type { ProgressSink } from '../src/progress.ts';

const cells = Number(process.argv[2] ?? 256);
const loaded = loadConfig(process.argv[3] ?? 'presets/massive-clump.yaml');
const config = effectiveConfig(loaded.config, { cells, workers: 1 });
const nj = config.budget.grid.cells_per_jeans_length;

const t0 = performance.now();
let last = t0;
const lap = (label: string): void => {
  const now = performance.now();
  console.log(`${label.padEnd(24)} ${((now - last) / 1000).toFixed(3)} s`);
  last = now;
};
const stages: Record<string, number> = {};
const progress: ProgressSink = {
  stage: (label) => {
    const s = performance.now();
    return { update: () => {}, stop: () => { stages[label] = +((performance.now() - s) / 1000).toFixed(3); } };
  },
};

const cloud = await generateCloud(config, { pool: null, progress });
lap('generate');
console.log(`  stages ${JSON.stringify(stages)}`);
const eos = eosFromConfig(config);
const res = gridResolution(cloud.grid, cloud.density, cloud.temperature, cloud.summary.mu, eos, nj);
lap('Jeans numbers');
densityPdf(cloud.density, cloud.inside, cloud.summary.sigmaS);
lap('density PDF');
jeansHistogram(res, nj);
lap('Jeans histogram');
await velocitySpectrum(cloud, null);
lap('velocity spectrum');
const s = cloud.summary;
const options = surveyOptionsFromConfig(config, { ambientDensity: s.ambientDensity, mach: s.mach, velocitySpectrumIndex: s.velocitySpectrumIndex });
const survey = await surveyCloud({ grid: cloud.grid, density: cloud.density, velocity: cloud.velocity, magnetic: cloud.magnetic, temperature: cloud.temperature, mu: s.mu, eos }, options, progress, null);
lap('survey');
console.log(`  stages ${JSON.stringify(Object.fromEntries(Object.entries(survey.timings).map(([k, v]) => [k, +v.toFixed(3)])))}`);
const ex = config.export;
const out = path.join(mkdtempSync(path.join(tmpdir(), 'fragplan-split-')), 'ic');
await writeGridExports(cloud, out, {
  formats: ex.formats, precision: ex.precision, units: ex.units, codeUnits: { length: ex.code_units.length, mass: ex.code_units.mass },
  thermalField: ex.thermal_field, particles: null, force: true, mu: s.mu,
}, { toolVersion: TOOL_VERSION, seed: config.seed, configText: loaded.text, configSha256: loaded.sha256, name: loaded.name });
lap('grid files');
console.log(`${'total'.padEnd(24)} ${((performance.now() - t0) / 1000).toFixed(3)} s (one thread, ${cells}^3)`);
