/**
 * The four data plots of report.html as inline SVG, drawn from PlotData (src/report/plot-data.ts):
 * density PDF with the lognormal expectation, velocity power spectrum with the input slope,
 * Jeans-number histogram with the 1/N_J limit, candidate mass spectrum with model curves and fit.
 */
import type { DensityPdfPlot, JeansHistogramPlot, MassSpectrumPlot, VelocitySpectrumPlot } from './plot-data.js';
import { formatNumber } from './format-number.js';
import { axes, bars, COLOURS, emptyPlot, legend, line, makeFrame, svgElement, vline, type LegendEntry } from './svg-frame.js';
import { extent, padLinear, padLog } from './svg-scale.js';

/** Normal probability density at x for the given mean and standard deviation (statistics, not physics). */
export function gaussianPdf(x: number, mean: number, sigma: number): number {
  const z = (x - mean) / sigma;
  return Math.exp(-0.5 * z * z) / (sigma * Math.sqrt(2 * Math.PI));
}

/** dN/dlog10 M (per dex) of a power law dN/dM = C M^-slope holding nTail objects above xmin (slope > 1): ln10 * nTail (slope-1) xmin^(slope-1) M^(1-slope). */
export function powerLawPerDex(mass: number, slope: number, xmin: number, nTail: number): number {
  return Math.LN10 * nTail * (slope - 1) * xmin ** (slope - 1) * mass ** (1 - slope);
}

/** Density PDF of s = ln(rho/rho0), log y, with the volume-weighted lognormal expectation (mean -sigma^2/2, see src/physics/turbulence.ts). */
export function densityPdfSvg(p: DensityPdfPlot | null): string {
  const title = 'Density PDF (volume-weighted)';
  if (!p || p.s.length === 0) return emptyPlot('plot-density-pdf', title, 'No density PDF for this run.');
  const sig = p.sigma_s_expected;
  const xs = p.s.slice();
  const model: number[] = sig && sig > 0 ? xs.map((s) => gaussianPdf(s, -0.5 * sig * sig, sig)) : [];
  const xr = padLinear(extent(xs) ?? [-1, 1], 0.02);
  const yr = padLog(extent([...p.pdf, ...model.filter((v) => v > 1e-6)], true) ?? [1e-3, 1]);
  const f = makeFrame({ label: 's', log: false, min: xr[0], max: xr[1] }, { label: 'p', log: true, min: yr[0], max: yr[1] });
  // a finer model curve for smoothness
  const fine: number[] = [];
  const fineY: number[] = [];
  if (sig && sig > 0) {
    for (let i = 0; i <= 200; i++) {
      const s = xr[0] + ((xr[1] - xr[0]) * i) / 200;
      fine.push(s);
      fineY.push(gaussianPdf(s, -0.5 * sig * sig, sig));
    }
  }
  const entries: LegendEntry[] = [{ label: `measured, sigma_s = ${formatNumber(p.sigma_s_measured)}`, colour: COLOURS.data }];
  if (sig) entries.push({ label: `lognormal expectation, sigma_s = ${formatNumber(sig)}`, colour: COLOURS.models[0], dash: '6 3' });
  const lg = legend(f, entries);
  const body =
    axes(f, 's = ln(rho / rho0)', 'probability density per unit s', title) +
    line(f, xs, p.pdf, COLOURS.data, '', 2) +
    line(f, fine, fineY, COLOURS.models[0], '6 3', 2) +
    lg.svg;
  return svgElement(f, 'plot-density-pdf', title, body, lg.height);
}

/** Velocity power spectrum, log-log, with a line of the input slope P ~ k^-n anchored on the data. */
export function velocitySpectrumSvg(p: VelocitySpectrumPlot | null): string {
  const title = 'Velocity power spectrum';
  const keep = p ? p.k.map((_k, i) => i).filter((i) => p.k[i] > 0 && p.power[i] > 0) : [];
  if (!p || keep.length === 0) return emptyPlot('plot-velocity-spectrum', title, 'No velocity field in this run.');
  const k = keep.map((i) => p.k[i]);
  const pw = keep.map((i) => p.power[i]);
  const xr = padLog(extent(k, true) as [number, number]);
  const yr = padLog(extent(pw, true) as [number, number]);
  const f = makeFrame({ label: 'k', log: true, min: xr[0], max: xr[1] }, { label: 'P', log: true, min: yr[0], max: yr[1] });
  let slope = '';
  const entries: LegendEntry[] = [{ label: `measured, shell average${p.cells ? ` on ${p.cells}^3` : ''}`, colour: COLOURS.data }];
  if (p.input_index !== null) {
    const lo = p.k_min ?? k[0];
    const hi = p.k_max ?? k[k.length - 1];
    const mid = Math.sqrt(lo * hi);
    let a = 0;
    for (let i = 1; i < k.length; i++) if (Math.abs(Math.log(k[i] / mid)) < Math.abs(Math.log(k[a] / mid))) a = i;
    const lk: number[] = [];
    const lp: number[] = [];
    for (let i = 0; i <= 40; i++) {
      const kk = lo * (hi / lo) ** (i / 40);
      lk.push(kk);
      lp.push(pw[a] * (kk / k[a]) ** -p.input_index);
    }
    slope = line(f, lk, lp, COLOURS.models[0], '6 3', 2);
    entries.push({ label: `input slope k^-${formatNumber(p.input_index)}`, colour: COLOURS.models[0], dash: '6 3' });
  }
  const lg = legend(f, entries);
  const body = axes(f, 'k (cycles per box)', 'P(k) (arbitrary units)', title) + line(f, k, pw, COLOURS.data, '', 2) + slope + lg.svg;
  return svgElement(f, 'plot-velocity-spectrum', title, body, lg.height);
}

/** Histogram of log10 J per cell (log counts) with the 1/N_J limit line (Truelove et al. 1997). */
export function jeansHistogramSvg(p: JeansHistogramPlot | null): string {
  const title = 'Jeans number per cell';
  if (!p || p.counts.length === 0) return emptyPlot('plot-jeans-histogram', title, 'No Jeans-number histogram for this run.');
  const lim = Math.log10(p.limit);
  const xr = padLinear(extent([...p.log10_j_edges, lim]) as [number, number], 0.03);
  const yr = padLog(extent(p.counts, true) ?? [1, 10]);
  const f = makeFrame({ label: 'log J', log: false, min: xr[0], max: xr[1] }, { label: 'cells', log: true, min: yr[0], max: yr[1] });
  const body =
    axes(f, 'log10 J, J = dx / lambda_J', 'cells', title) +
    bars(f, p.log10_j_edges, p.counts, COLOURS.data) +
    vline(f, lim, COLOURS.limit, `limit J = 1/${formatNumber(p.cells_per_jeans_length)}`);
  return svgElement(f, 'plot-jeans-histogram', title, body);
}

/** Histogram edges in log10 M, 0.25 dex wide, covering all masses. */
function massEdges(masses: readonly number[]): number[] {
  const [lo, hi] = extent(masses, true) as [number, number];
  const a = Math.floor(Math.log10(lo) * 4) / 4;
  let b = Math.ceil(Math.log10(hi) * 4) / 4;
  if (b <= a) b = a + 0.25;
  const out: number[] = [];
  for (let e = a; e <= b + 1e-9; e += 0.25) out.push(e);
  return out;
}

/** Candidate mass spectrum as dN/dlog10 M (0.25 dex bins) with model curves and the fitted power law. */
export function massSpectrumSvg(p: MassSpectrumPlot): string {
  const title = 'Fragment-candidate mass spectrum';
  const masses = p.masses_msun.filter((m) => m > 0 && Number.isFinite(m));
  if (masses.length === 0) return emptyPlot('plot-mass-spectrum', title, 'No fragment candidates: nothing to plot.');
  const le = massEdges(masses);
  const counts = new Array<number>(le.length - 1).fill(0);
  for (const m of masses) {
    const i = Math.min(counts.length - 1, Math.max(0, Math.floor((Math.log10(m) - le[0]) / 0.25)));
    counts[i] += 1;
  }
  const dn = counts.map((c) => c / 0.25);
  const edges = le.map((e) => 10 ** e);
  const xr: [number, number] = [edges[0] / 2, edges[edges.length - 1] * 2];
  const modelVals = p.models.flatMap((m) => m.dn_dlogm.filter((_v, i) => m.masses_msun[i] >= xr[0] && m.masses_msun[i] <= xr[1]));
  const yr = padLog(extent([...dn, ...modelVals], true) as [number, number]);
  const f = makeFrame({ label: 'M', log: true, min: xr[0], max: xr[1] }, { label: 'dN', log: true, min: yr[0], max: yr[1] });
  const parts = [axes(f, 'candidate mass (Msun)', 'dN / dlog10 M', title), bars(f, edges, dn, COLOURS.data)];
  const entries: LegendEntry[] = [{ label: `candidates (${masses.length})`, colour: COLOURS.data }];
  p.models.forEach((m, i) => {
    const c = COLOURS.models[(i + 1) % COLOURS.models.length];
    parts.push(line(f, m.masses_msun, m.dn_dlogm, c, '4 3'));
    entries.push({ label: m.name, colour: c, dash: '4 3' });
  });
  if (p.fit && p.fit.slope > 1 && p.fit.n_tail > 0) {
    const { slope, xmin_msun: xmin, n_tail: n } = p.fit;
    const hi = Math.max(...masses);
    const mm: number[] = [];
    const yy: number[] = [];
    for (let i = 0; i <= 30; i++) {
      const m = xmin * (hi / xmin) ** (i / 30);
      mm.push(m);
      yy.push(powerLawPerDex(m, slope, xmin, n));
    }
    parts.push(line(f, mm, yy, COLOURS.limit, '', 2));
    entries.push({ label: `fit dN/dM ~ M^-${formatNumber(slope)} +/- ${formatNumber(p.fit.slope_error)}`, colour: COLOURS.limit });
  }
  const lg = legend(f, entries);
  parts.push(lg.svg);
  return svgElement(f, 'plot-mass-spectrum', title, parts.join(''), lg.height);
}
