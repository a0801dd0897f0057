/**
 * Whole-grid histograms of the report: the volume-weighted density PDF and the histogram of
 * per-cell Jeans numbers. Each is two tight passes, no per-cell allocation; the per-cell loops
 * run in block kernels (src/grid/cell-blocks.ts), every sum taken in cell order as one loop would.
 */
import type { GridResolution } from '../budget/types.js';
import type { DensityPdfPlot, JeansHistogramPlot } from './plot-data.js';
import { forCellBlocks } from '../grid/cell-blocks.js';

const PDF_BINS = 60;
const JEANS_BINS = 50;
/** +Infinity and -Infinity as float64 values read from memory (literals in the loops make V8 box). */
const INFINITIES = Float64Array.of(Infinity, -Infinity);

/** PDF pass 1 over cells [a, b): run = [count, sum, lo, hi]. */
function pdfRange(a: number, b: number, density: Float32Array, mask: Uint8Array | null, run: Float64Array): void {
  let n = run[0]!, sum = run[1]!, lo = run[2]!, hi = run[3]!;
  for (let i = a; i < b; i++) {
    if (mask && !mask[i]) continue;
    const r = density[i]!;
    if (!(r > 0)) continue;
    n++;
    sum += r;
    if (r < lo) lo = r;
    if (r > hi) hi = r;
  }
  run[0] = n; run[1] = sum; run[2] = lo; run[3] = hi;
}

/** PDF pass 2 over cells [a, b): bins of s = ln rho - ln rho0 into counts; run = [m1, m2]. */
function pdfBins(a: number, b: number, density: Float32Array, mask: Uint8Array | null, lnRho0: number, sLo: number, width: number, counts: Float64Array, run: Float64Array): void {
  let m1 = run[0]!, m2 = run[1]!;
  for (let i = a; i < b; i++) {
    if (mask && !mask[i]) continue;
    const r = density[i]!;
    if (!(r > 0)) continue;
    const v = Math.log(r) - lnRho0;
    m1 += v;
    m2 += v * v;
    const bin = Math.min(PDF_BINS - 1, Math.max(0, Math.floor((v - sLo) / width)));
    counts[bin]! += 1;
  }
  run[0] = m1; run[1] = m2;
}

/** Volume-weighted PDF of s = ln(rho/rho0) over the masked cells (all cells when mask is null). */
export function densityPdf(density: Float32Array, mask: Uint8Array | null, sigmaExpected: number | null): DensityPdfPlot | null {
  const run = Float64Array.of(0, 0, INFINITIES[0]!, INFINITIES[1]!);
  forCellBlocks(density.length, (a, b) => pdfRange(a, b, density, mask, run));
  const n = run[0]!, sum = run[1]!, lo = run[2]!, hi = run[3]!;
  if (n < 2 || !(sum > 0)) return null;
  const rho0 = sum / n;
  let sLo = Math.log(lo / rho0), sHi = Math.log(hi / rho0);
  if (!(sHi > sLo)) { sLo -= 0.5; sHi += 0.5; }
  const width = (sHi - sLo) / PDF_BINS;
  const counts = new Float64Array(PDF_BINS);
  const lnRho0 = Math.log(rho0);
  const moments = new Float64Array(2);
  forCellBlocks(density.length, (a, b) => pdfBins(a, b, density, mask, lnRho0, sLo, width, counts, moments));
  const m1 = moments[0]!, m2 = moments[1]!;
  const mean = m1 / n;
  const sigma = Math.sqrt(Math.max(0, (m2 - n * mean * mean) / (n - 1)));
  const centres: number[] = [], pdf: number[] = [];
  for (let b = 0; b < PDF_BINS; b++) {
    centres.push(sLo + (b + 0.5) * width);
    pdf.push(counts[b]! / (n * width));
  }
  return { s: centres, pdf, rho0_gcc: rho0, sigma_s_measured: sigma, sigma_s_expected: sigmaExpected };
}

/** Jeans pass 1 over cells [a, b): run = [lo, hi] of the finite J > 0. */
function jeansRange(a: number, b: number, j: Float32Array, run: Float64Array): void {
  const inf = INFINITIES[0]!;
  let lo = run[0]!, hi = run[1]!;
  for (let i = a; i < b; i++) {
    const v = j[i]!;
    if (!(v > 0) || v === inf) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  run[0] = lo; run[1] = hi;
}

/** Jeans pass 2 over cells [a, b): bins of log10 J into counts; run = [last J, its bin]. */
function jeansBins(a: number, b: number, j: Float32Array, l0: number, inv: number, counts: Float64Array, run: Float64Array): void {
  const inf = INFINITIES[0]!;
  let lastV = run[0]!, lastB = run[1]!;
  for (let i = a; i < b; i++) {
    const v = j[i]!;
    if (!(v > 0) || v === inf) continue;
    // runs of equal values (a uniform ambient medium) reuse the bin (the same result)
    if (v !== lastV) { lastV = v; lastB = Math.min(JEANS_BINS - 1, Math.max(0, Math.floor((Math.log(v) - l0 * Math.LN10) * inv))); }
    counts[lastB]! += 1;
  }
  run[0] = lastV; run[1] = lastB;
}

/** Histogram of log10 J over the cells with 0 < J < Infinity, with the 1/N_J limit (the range pass is skipped when g records jeansNumberRange). */
export function jeansHistogram(g: GridResolution | Pick<GridResolution, 'jeansNumber' | 'jeansNumberRange'>, cellsPerJeansLength: number): JeansHistogramPlot | null {
  const j = g.jeansNumber;
  const range = Float64Array.of(INFINITIES[0]!, INFINITIES[1]!);
  if (g.jeansNumberRange !== undefined) {
    if (g.jeansNumberRange !== null) { range[0] = g.jeansNumberRange[0]; range[1] = g.jeansNumberRange[1]; }
  } else {
    forCellBlocks(j.length, (a, b) => jeansRange(a, b, j, range));
  }
  const lo = range[0]!, hi = range[1]!;
  if (!(hi >= lo)) return null;
  let l0 = Math.log10(lo), l1 = Math.log10(hi);
  if (!(l1 > l0)) { l0 -= 0.5; l1 += 0.5; }
  const width = (l1 - l0) / JEANS_BINS;
  const counts = new Float64Array(JEANS_BINS);
  const inv = 1 / (width * Math.LN10);
  const last = Float64Array.of(Number.NaN, 0);
  forCellBlocks(j.length, (a, b) => jeansBins(a, b, j, l0, inv, counts, last));
  return {
    log10_j_edges: Array.from({ length: JEANS_BINS + 1 }, (_, b) => l0 + b * width),
    counts: Array.from(counts),
    limit: 1 / cellsPerJeansLength,
    cells_per_jeans_length: cellsPerJeansLength,
  };
}

/** jeansHistogram of a bare Jeans-number map, with its recorded range when known (the worker task's form). */
export function jeansNumberHistogram(jeansNumber: Float32Array, cellsPerJeansLength: number, range?: readonly [number, number] | null): JeansHistogramPlot | null {
  return jeansHistogram(range === undefined ? { jeansNumber } : { jeansNumber, jeansNumberRange: range }, cellsPerJeansLength);
}
