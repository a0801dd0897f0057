/**
 * Builds the plot data (plots.json; see plot-data.ts) from a cloud, its survey and its Jeans
 * numbers. Grid conventions as in src/grid/grid3.ts; densities g/cm^3, masses converted to Msun.
 */
import type { Cloud } from '../generate/cloud.js';
import type { Grid3 } from '../grid/grid3.js';
import { histogram } from '../grid/histogram.js';
import { vectorPowerSpectrumParallel } from '../grid/spectrum.js';
import type { WorkerPool } from '../grid/pool.js';
import type { SurveyResult } from '../survey/types.js';
import type { GridResolution } from '../budget/types.js';
import { toUnit } from '../physics/units.js';
import type { DensityPdfPlot, JeansHistogramPlot, MassSpectrumPlot, PlotData, TreePlotNode, VelocitySpectrumPlot } from './plot-data.js';

const PDF_BINS = 60;
const JEANS_BINS = 50;

/** Volume-weighted PDF of s = ln(rho/rho0) over the masked cells (all cells when mask is null). */
export function densityPdf(density: Float32Array, mask: Uint8Array | null, sigmaExpected: number | null): DensityPdfPlot | null {
  let n = 0, sum = 0;
  for (let i = 0; i < density.length; i++) if (!mask || mask[i]) { n++; sum += density[i]!; }
  if (n < 2 || !(sum > 0)) return null;
  const rho0 = sum / n;
  const s = new Float64Array(n);
  let m = 0, mean = 0;
  for (let i = 0; i < density.length; i++) if (!mask || mask[i]) { const v = Math.log(Math.max(density[i]!, 1e-300) / rho0); s[m++] = v; mean += v; }
  mean /= n;
  let varS = 0;
  for (let i = 0; i < n; i++) varS += (s[i]! - mean) ** 2;
  const sigma = Math.sqrt(varS / (n - 1));
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) { if (s[i]! < lo) lo = s[i]!; if (s[i]! > hi) hi = s[i]!; }
  if (!(hi > lo)) { lo -= 0.5; hi += 0.5; }
  const h = histogram(s, { bins: PDF_BINS, min: lo, max: hi });
  const width = (hi - lo) / PDF_BINS;
  const centres: number[] = [], pdf: number[] = [];
  for (let b = 0; b < PDF_BINS; b++) {
    centres.push(0.5 * (h.edges[b]! + h.edges[b + 1]!));
    pdf.push(h.counts[b]! / (n * width));
  }
  return { s: centres, pdf, rho0_gcc: rho0, sigma_s_measured: sigma, sigma_s_expected: sigmaExpected };
}

/** Shell-averaged velocity power spectrum with the input slope. */
export async function velocitySpectrum(cloud: Cloud, pool: WorkerPool | null = null): Promise<VelocitySpectrumPlot | null> {
  const s = cloud.summary;
  if (s.velocitySpectrumIndex === null) return null;
  const sp = await vectorPowerSpectrumParallel(pool, cloud.velocity, cloud.grid);
  const k: number[] = [], power: number[] = [];
  for (let i = 0; i < sp.k.length; i++) if (sp.power[i]! > 0) { k.push(sp.k[i]!); power.push(sp.power[i]!); }
  return { k, power, input_index: s.velocitySpectrumIndex, k_min: s.kMin, k_max: s.kMax };
}

/** Histogram of log10 J over all cells with the 1/N_J limit. */
export function jeansHistogram(g: GridResolution, cellsPerJeansLength: number): JeansHistogramPlot | null {
  const h = histogram(g.jeansNumber, { bins: JEANS_BINS, log: true });
  if (h.total === 0) return null;
  return {
    log10_j_edges: Array.from(h.edges, (e) => Math.log10(e)),
    counts: Array.from(h.counts),
    limit: 1 / cellsPerJeansLength,
    cells_per_jeans_length: cellsPerJeansLength,
  };
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

/** All plot data; for a foreign cube pass cloud = null and the cube as `cube`. */
export async function buildPlots(cloud: Cloud | null, survey: SurveyResult, gridRes: GridResolution, cellsPerJeansLength: number, cube?: { grid: Grid3; density: Float32Array }, pool: WorkerPool | null = null): Promise<PlotData> {
  const density = cloud ? cloud.density : cube!.density;
  return {
    schema: 'fragplan.plots/1',
    density_pdf: densityPdf(density, cloud ? cloud.inside : null, cloud ? cloud.summary.sigmaS : null),
    velocity_spectrum: cloud ? await velocitySpectrum(cloud, pool) : null,
    jeans_histogram: jeansHistogram(gridRes, cellsPerJeansLength),
    mass_spectrum: massSpectrumPlot(survey),
    tree: treePlot(survey),
  };
}
