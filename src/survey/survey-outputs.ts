/**
 * The survey as files: the `hierarchy` block of summary.json, tree.json (schema
 * "fragplan.tree/1") and fragments.csv. snake_case keys with unit suffixes; numbers rounded
 * to 6 significant digits; infinities written as null. Positions are centres of mass in the
 * box frame [-L/2, L/2)^3, pc.
 */
import type { SurveyResult, SurveyNode } from './types.js';
import { M_SUN, PC, KM_S } from '../physics/constants.js';
import { describeJeansConvention } from '../physics/jeans.js';
import { MIN_TAIL } from './power-law-fit.js';

/** A number to 6 significant digits, or null when not finite. */
export function sig6(x: number): number | null {
  return Number.isFinite(x) ? Number(x.toPrecision(6)) : null;
}

const msun = (g: number) => sig6(g / M_SUN.value);
const pc = (cm: number) => sig6(cm / PC.value);

/** The `hierarchy` block of summary.json. */
export function hierarchySummary(r: SurveyResult): Record<string, unknown> {
  const fit = r.spectrum.fit;
  const lim = r.limits;
  return {
    nodes: r.nodes.length,
    roots: r.roots.length,
    unstable_nodes: r.unstableNodes,
    bound_nodes: r.nodes.reduce((a, n) => a + (n.bound ? 1 : 0), 0),
    max_depth: r.nodes.reduce((a, n) => Math.max(a, n.depth ?? 0), 0),
    fragment_candidates: r.candidates.length,
    expected_fragments: r.expectedFragments,
    expected_fragments_rule: r.expectedFragmentsRule,
    fragment_masses_msun: r.spectrum.masses.map((m) => msun(m)),
    cmf_slope: fit ? sig6(fit.slope) : null,
    cmf_slope_error: fit ? sig6(fit.slopeError) : null,
    cmf_xmin_msun: fit ? msun(fit.xmin) : null,
    cmf_n_tail: fit ? fit.nTail : null,
    cmf_ks_distance: fit ? sig6(fit.ksDistance) : null,
    cmf_fit_method: `dN/dM ~ M^-slope by maximum likelihood, x_min by smallest KS distance, error (slope-1)/sqrt(n) (Clauset, Shalizi & Newman 2009); null with fewer than ${MIN_TAIL} candidates`,
    jeans_mass_definition: `${r.jeansConvention}: ${describeJeansConvention(r.jeansConvention)}`,
    turbulent_support: r.options ? r.options.turbulentSupport : null,
    require_bound: r.options ? r.options.requireBound : null,
    reference_jeans_mass_msun: r.referenceJeansMass !== undefined ? msun(r.referenceJeansMass) : null,
    floor_density_gcc: r.floorDensity !== undefined ? sig6(r.floorDensity) : null,
    floor_rule: r.floorRule ?? null,
    connectivity: lim ? lim.connectivity : null,
    min_cells: lim ? lim.minCells : null,
    min_contrast: lim ? lim.minContrast : null,
    min_mass_msun: lim ? msun(lim.minMass) : null,
    significance_rule: 'a branch is its own node when it has children, or has >= min_cells cells, >= min_mass and a peak >= (1 + min_contrast) x the density where it meets another branch; otherwise it is absorbed',
    gravity_method: r.gravityMethod ?? null,
    core_to_star_efficiency: r.options ? r.options.coreToStarEfficiency : null,
    notes: r.notes ?? [],
  };
}

function nodeJson(n: SurveyNode): Record<string, unknown> {
  return {
    id: n.id,
    parent: n.parent,
    children: n.children,
    depth: n.depth ?? null,
    cells: n.cells,
    mass_msun: msun(n.mass),
    volume_pc3: sig6(n.volume / PC.value ** 3),
    effective_radius_pc: n.effectiveRadius !== undefined ? pc(n.effectiveRadius) : null,
    centre_pc: n.centre.map((x) => pc(x)),
    peak_density_gcc: sig6(n.peakDensity),
    merge_density_gcc: sig6(n.mergeDensity),
    mean_density_gcc: sig6(n.meanDensity),
    temperature_k: n.temperature !== undefined ? sig6(n.temperature) : null,
    sigma_1d_kms: sig6(n.sigma1D / KM_S),
    thermal_energy_erg: sig6(n.thermalEnergy),
    kinetic_energy_erg: sig6(n.kineticEnergy),
    magnetic_energy_erg: sig6(n.magneticEnergy),
    gravitational_energy_erg: sig6(n.gravitationalEnergy),
    virial_parameter: sig6(n.virialParameter),
    alpha_thermal: sig6(n.alphaThermal),
    virial_ratio: n.virialRatio !== undefined ? sig6(n.virialRatio) : null,
    bound: n.bound,
    jeans_mass_thermal_msun: msun(n.jeansMassThermal),
    jeans_mass_turbulent_msun: msun(n.jeansMassTurbulent),
    jeans_mass_msun: msun(n.jeansMass),
    unstable: n.unstable,
    candidate: n.candidate,
    expected_fragments: n.expectedFragments,
    state: n.state,
    gravity_coarsening: n.gravityCoarsening ?? null,
    gravity_relative_error: n.gravityError !== undefined ? sig6(n.gravityError) : null,
  };
}

/** tree.json: every node of the merge tree with its energies and verdicts. */
export function treeJson(r: SurveyResult): Record<string, unknown> {
  return {
    schema: 'fragplan.tree/1',
    jeans_mass_definition: `${r.jeansConvention}: ${describeJeansConvention(r.jeansConvention)}`,
    expected_fragments_rule: r.expectedFragmentsRule,
    numbering: 'ids in creation order, children before parents; parent -1 for roots; cells and masses include descendants',
    states: { 'bound-unstable': 'mass above its Jeans mass and total energy negative', unstable: 'mass above its Jeans mass, not bound', stable: 'mass below its Jeans mass (or not bound when require_bound)' },
    roots: r.roots,
    candidates: r.candidates,
    nodes: r.nodes.map(nodeJson),
  };
}

const CSV_COLUMNS = [
  'id', 'mass_msun', 'x_pc', 'y_pc', 'z_pc', 'effective_radius_pc', 'cells', 'mean_density_gcc', 'peak_density_gcc',
  'merge_density_gcc', 'temperature_k', 'sigma_1d_kms', 'jeans_mass_msun', 'mass_over_jeans_mass', 'expected_fragments',
  'virial_parameter', 'alpha_thermal', 'bound', 'state',
];

/** fragments.csv: a header row (names carry units), then one row per fragment candidate, heaviest first. */
export function fragmentsCsv(r: SurveyResult): string {
  const rows = r.candidates.map((id) => r.nodes[id]!).sort((a, b) => b.mass - a.mass || a.id - b.id);
  const cell = (x: number | null | boolean | string): string => (x === null ? '' : String(x));
  const lines = [CSV_COLUMNS.join(',')];
  for (const n of rows) {
    lines.push([
      n.id, msun(n.mass), pc(n.centre[0]), pc(n.centre[1]), pc(n.centre[2]), n.effectiveRadius !== undefined ? pc(n.effectiveRadius) : null,
      n.cells, sig6(n.meanDensity), sig6(n.peakDensity), sig6(n.mergeDensity), n.temperature !== undefined ? sig6(n.temperature) : null,
      sig6(n.sigma1D / KM_S), msun(n.jeansMass), sig6(n.mass / n.jeansMass), n.expectedFragments, sig6(n.virialParameter),
      sig6(n.alphaThermal), n.bound, n.state,
    ].map(cell).join(','));
  }
  return lines.join('\n') + '\n';
}
