/**
 * The data behind every plot, shared by report.html and the viewer (plots.json in preview.zip).
 * Plain JSON, snake_case, units in key names; no functions of ours are needed to draw it.
 */

/** Volume-weighted PDF of s = ln(rho/rho0) with the lognormal expectation. */
export interface DensityPdfPlot {
  /** Bin centres of s. */
  s: number[];
  /** Probability density per unit s (volume-weighted), over the cloud cells. */
  pdf: number[];
  rho0_gcc: number;
  sigma_s_measured: number;
  /** Width aimed at, sqrt(ln(1 + b^2 M^2)) (Padoan, Nordlund & Jones 1997), or null. */
  sigma_s_expected: number | null;
}

/** Shell-averaged velocity power spectrum P(k) with the input slope. */
export interface VelocitySpectrumPlot {
  /** Wavenumber, cycles per box. */
  k: number[];
  /** Shell-averaged |v(k)|^2 (arbitrary normalisation). */
  power: number[];
  input_index: number | null;
  k_min: number | null;
  k_max: number | null;
  /** Cells per side of the grid the spectrum was computed on (finer grids are block-averaged to it). */
  cells?: number;
}

/** Histogram of log10 of the per-cell Jeans number with the 1/N_J limit. */
export interface JeansHistogramPlot {
  /** Bin edges in log10 J (length counts.length + 1). */
  log10_j_edges: number[];
  counts: number[];
  /** 1 / N_J (1/4 for Truelove et al. 1997). */
  limit: number;
  cells_per_jeans_length: number;
}

/** Candidate mass spectrum, fit and model curves (dN/dlog10 M normalised to the sample). */
export interface MassSpectrumPlot {
  masses_msun: number[];
  fit: { slope: number; slope_error: number; xmin_msun: number; n_tail: number } | null;
  models: Array<{ name: string; masses_msun: number[]; dn_dlogm: number[] }>;
}

/** One node for the tree diagram. */
export interface TreePlotNode {
  id: number;
  parent: number;
  mass_msun: number;
  merge_density_gcc: number;
  peak_density_gcc: number;
  state: 'bound-unstable' | 'unstable' | 'stable';
  candidate: boolean;
}

/** Everything the report and the viewer plot. */
export interface PlotData {
  schema: 'fragplan.plots/1';
  density_pdf: DensityPdfPlot | null;
  velocity_spectrum: VelocitySpectrumPlot | null;
  jeans_histogram: JeansHistogramPlot | null;
  mass_spectrum: MassSpectrumPlot;
  tree: TreePlotNode[];
}
