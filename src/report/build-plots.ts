/**
 * Builds the plot data (plots.json; see plot-data.ts) from a cloud, its survey and its Jeans
 * numbers. Grid conventions as in src/grid/grid3.ts; densities g/cm^3, masses converted to Msun.
 */
import type { Cloud } from '../generate/cloud.js';
import type { Grid3 } from '../grid/grid3.js';
import { vectorPowerSpectrumParallel } from '../grid/spectrum.js';
import { onSharedMemory, runWhole, type WorkerPool } from '../grid/pool.js';
import type { SurveyResult } from '../survey/types.js';
import type { GridResolution } from '../budget/types.js';
import { toUnit } from '../physics/units.js';
import type { DensityPdfPlot, JeansHistogramPlot, MassSpectrumPlot, PlotData, TreePlotNode, VelocitySpectrumPlot } from './plot-data.js';

import { densityPdf, jeansNumberHistogram } from './grid-histograms.js';

export { densityPdf, jeansHistogram, jeansNumberHistogram } from './grid-histograms.js';

/**
 * Largest grid the report's velocity spectrum is computed on; finer grids are block-averaged to it.
 * 128^3 resolves wavenumbers to 64 cycles per box, beyond the k_max of the presets, and costs a
 * tenth of the three forward FFTs at 256^3.
 */
export const SPECTRUM_MAX_CELLS = 128;

/**
 * Block mean by an integer factor of coarse x-planes [start, end) of a cubic field of n cells per side
 * into out (m = n/factor per side); each coarse cell sums its fine cells in cell order in Float64, so
 * the result does not depend on how planes are split (a worker task).
 */
export function blockMeanPlanes(start: number, end: number, field: Float32Array, n: number, factor: number, out: Float32Array): void {
  const m = n / factor;
  const w = 1 / factor ** 3;
  for (let ci = start; ci < end; ci++) {
    for (let cj = 0; cj < m; cj++) blockMeanRow(field, n, factor, ci, cj, m, out, (ci * m + cj) * m, w);
  }
}

/**
 * Coarse row (ci, cj) of the block mean: each coarse cell sums its fine cells in cell order (i, then
 * j, then k) in a Float64 register, the order in which a plane-by-plane sweep would add them.
 */
function blockMeanRow(field: Float32Array, n: number, factor: number, ci: number, cj: number, m: number, out: Float32Array, at: number, w: number): void {
  const i0 = ci * factor, j0 = cj * factor;
  for (let ck = 0; ck < m; ck++) {
    let s = 0;
    const k0 = ck * factor;
    for (let di = 0; di < factor; di++) {
      for (let dj = 0; dj < factor; dj++) {
        const row = ((i0 + di) * n + j0 + dj) * n + k0;
        for (let dk = 0; dk < factor; dk++) s += field[row + dk]!;
      }
    }
    out[at + ck] = s * w;
  }
}

/** Block mean of a cubic field by an integer factor, into shared memory; over the pool when given. */
export async function blockMean(field: Float32Array, n: number, factor: number, pool: WorkerPool | null = null): Promise<Float32Array> {
  const m = n / factor;
  const out = new Float32Array(new SharedArrayBuffer(m * m * m * 4));
  if (pool && pool.size >= 2 && onSharedMemory(field)) await pool.runRanges('reportBlockMean', m, [field, n, factor, out]);
  else blockMeanPlanes(0, m, field, n, factor, out);
  return out;
}

/** Share of the coarse grid's Nyquist wavenumber up to which a block-averaged spectrum is kept (aliasing grows above it). */
export const SPECTRUM_ALIAS_LIMIT = 0.75;

/**
 * Shell-averaged velocity power spectrum with the input slope. Grids finer than `maxCells` (default
 * SPECTRUM_MAX_CELLS) are block-averaged first and each mode's power divided by the block mean's
 * squared transfer function (the usual window compensation). Power from above the coarse grid's
 * Nyquist wavenumber aliases in near it, so shells above SPECTRUM_ALIAS_LIMIT of it are left out
 * (at 256^3 on 128^3 the kept shells agree with the full-resolution spectrum to 5 %, to 1 % up to
 * k = 40). `cells` says which grid was used.
 */
export async function velocitySpectrum(cloud: Cloud, pool: WorkerPool | null = null, maxCells = SPECTRUM_MAX_CELLS): Promise<VelocitySpectrumPlot | null> {
  const s = cloud.summary;
  if (s.velocitySpectrumIndex === null) return null;
  const g = cloud.grid;
  const cubic = g.nx === g.ny && g.ny === g.nz;
  const factor = cubic && g.nx > maxCells ? g.nx / maxCells : 1;
  const grid = factor === 1 ? g : { nx: g.nx / factor, ny: g.ny / factor, nz: g.nz / factor, boxSize: g.boxSize };
  const comps = factor === 1 ? cloud.velocity : await Promise.all(cloud.velocity.map((v) => blockMean(v, g.nx, factor, pool)));
  const sp = await vectorPowerSpectrumParallel(pool, comps, grid, factor);
  const kTop = factor === 1 ? Infinity : SPECTRUM_ALIAS_LIMIT * (grid.nx / 2);
  const k: number[] = [], power: number[] = [];
  for (let i = 0; i < sp.k.length; i++) if (sp.power[i]! > 0 && sp.k[i]! <= kTop) { k.push(sp.k[i]!); power.push(sp.power[i]!); }
  return { k, power, input_index: s.velocitySpectrumIndex, k_min: s.kMin, k_max: s.kMax, cells: grid.nx };
}

/** Candidate masses, fit and model curves in Msun. */
export function massSpectrumPlot(survey: SurveyResult): MassSpectrumPlot {
  const sp = survey.spectrum;
  return {
    masses_msun: sp.masses.map((m) => toUnit(m, 'Msun')),
    fit: sp.fit ? { slope: sp.fit.slope, slope_error: sp.fit.slopeError, xmin_msun: toUnit(sp.fit.xmin, 'Msun'), n_tail: sp.fit.nTail } : null,
    models: sp.models.map((c) => ({ name: c.name, masses_msun: c.masses.map((m) => toUnit(m, 'Msun')), dn_dlogm: c.dndlogm })),
  };
}

/** The tree nodes for the dendrogram. */
export function treePlot(survey: SurveyResult): TreePlotNode[] {
  return survey.nodes.map((n) => ({
    id: n.id, parent: n.parent, mass_msun: toUnit(n.mass, 'Msun'), merge_density_gcc: n.mergeDensity,
    peak_density_gcc: n.peakDensity, state: n.state, candidate: n.candidate,
  }));
}

/** The plots that need only the grids (no survey): density PDF, velocity spectrum, Jeans-number histogram. */
export type GridPlots = Pick<PlotData, 'density_pdf' | 'velocity_spectrum' | 'jeans_histogram'>;

/**
 * The grid-only plots; for a foreign cube pass cloud = null and the cube as `cube`. `gridResolution`
 * may still be running (a promise). With a pool and fields on shared memory, the two histograms run
 * as whole worker tasks (the same functions, so the same numbers) beside the spectrum's transforms.
 */
export async function buildGridPlots(cloud: Cloud | null, gridResolution: GridResolution | Promise<GridResolution>, cellsPerJeansLength: number, cube?: { grid: Grid3; density: Float32Array }, pool: WorkerPool | null = null): Promise<GridPlots> {
  const density = cloud ? cloud.density : cube!.density;
  const mask = cloud ? cloud.inside : null;
  const sigma = cloud ? cloud.summary.sigmaS : null;
  const pdf = runWhole(pool, 'reportDensityPdf', densityPdf, [density, mask, sigma]);
  const spectrum = cloud ? velocitySpectrum(cloud, pool) : Promise.resolve(null);
  const res = await gridResolution;
  const jeans = runWhole(pool, 'reportJeansHistogram', jeansNumberHistogram, [res.jeansNumber, cellsPerJeansLength, res.jeansNumberRange], [res.jeansNumber]);
  const [density_pdf, velocity_spectrum, jeans_histogram] = await Promise.all([pdf, spectrum, jeans]);
  return { density_pdf, velocity_spectrum, jeans_histogram };
}

/** All plot data from the grid-only plots and the survey. */
export function withSurveyPlots(grid: GridPlots, survey: SurveyResult): PlotData {
  return {
    schema: 'fragplan.plots/1',
    density_pdf: grid.density_pdf,
    velocity_spectrum: grid.velocity_spectrum,
    jeans_histogram: grid.jeans_histogram,
    mass_spectrum: massSpectrumPlot(survey),
    tree: treePlot(survey),
  };
}

/** All plot data; for a foreign cube pass cloud = null and the cube as `cube`. */
export async function buildPlots(cloud: Cloud | null, survey: SurveyResult, gridRes: GridResolution, cellsPerJeansLength: number, cube?: { grid: Grid3; density: Float32Array }, pool: WorkerPool | null = null): Promise<PlotData> {
  return withSurveyPlots(await buildGridPlots(cloud, gridRes, cellsPerJeansLength, cube, pool), survey);
}
