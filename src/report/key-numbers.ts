/**
 * The key numbers of a run, read from summary.json: the one list both report.html and the
 * terminal summary print, so the two always agree. Values are formatted by formatNumber.
 */
import type { Summary } from './summary-types.js';
import { formatNumber } from './format-number.js';

/** One key number: label for people, formatted value, unit; `key` is its summary.json path. */
export interface KeyNumber {
  label: string;
  value: string;
  unit: string;
  /** Path in summary.json, e.g. "cloud.mass_msun". */
  key: string;
  /** Section heading: Cloud, Grid, Resolution, Hierarchy, Cost. */
  group: string;
}

/** The verdict on resolution, when the run has one. */
export interface VerdictText {
  status: string;
  reason: string;
}

/** key, label, unit, and whether a null value is left out (keys that only one kind of code has). */
type Row = readonly [key: string, label: string, unit: string, skipNull?: boolean];

const CLOUD: Row[] = [
  ['mass_msun', 'Cloud mass', 'Msun'],
  ['radius_pc', 'Cloud radius', 'pc'],
  ['temperature_k', 'Temperature', 'K'],
  ['mu', 'Mean molecular weight', ''],
  ['mean_density_gcc', 'Mean density', 'g cm^-3'],
  ['sound_speed_kms', 'Sound speed', 'km/s'],
  ['mach', 'Mach number (rms)', ''],
  ['virial_parameter', 'Virial parameter', ''],
  ['alpha_thermal', 'Thermal energy ratio (alpha)', ''],
  ['beta_rotation', 'Rotational energy ratio (beta)', ''],
  ['jeans_mass_msun', 'Jeans mass', 'Msun'],
  ['jeans_length_pc', 'Jeans length', 'pc'],
  ['free_fall_time_myr', 'Free-fall time', 'Myr'],
];
const GRID: Row[] = [
  ['cells_per_side', 'Cells per side', ''],
  ['box_size_pc', 'Box size', 'pc'],
  ['cell_size_pc', 'Cell size', 'pc'],
  ['mass_on_grid_msun', 'Mass on grid (cloud and ambient)', 'Msun'],
];
const RESOLUTION: Row[] = [
  ['jeans_cells_min', 'Fewest cells per Jeans length', ''],
  ['unresolved_mass_fraction', 'Mass fraction under-resolved', ''],
  ['max_resolved_density_gcc', 'Densest gas resolved', 'g cm^-3'],
  ['levels_needed', 'Refinement levels needed', '', true],
  ['particles_needed', 'Particles needed', '', true],
  ['particle_count', 'Particles planned', '', true],
  ['resolvable_mass_msun', 'Smallest resolvable mass', 'Msun', true],
  ['sink_threshold_gcc', 'Sink density threshold', 'g cm^-3'],
  ['sink_radius_pc', 'Sink accretion radius', 'pc'],
];
const COST: Row[] = [
  ['core_hours', 'Core-hours (needs budget.throughput)', 'core-hours'],
  ['memory_gib', 'Memory at start', 'GiB'],
  ['run_time_myr', 'Simulated time', 'Myr'],
  ['time_step_yr', 'Base time step', 'yr'],
  ['finest_time_step_yr', 'Finest time step', 'yr'],
  ['steps', 'Time steps', ''],
  ['total_updates', 'Cell or particle updates', ''],
];
const HIERARCHY: Row[] = [
  ['nodes', 'Tree nodes', ''],
  ['unstable_nodes', 'Jeans-unstable nodes', ''],
  ['fragment_candidates', 'Fragment candidates', ''],
  ['expected_fragments', 'Expected fragments', ''],
  ['cmf_slope', 'Candidate mass spectrum slope', ''],
];

function rows(block: Record<string, unknown> | undefined, name: string, group: string, list: Row[]): KeyNumber[] {
  if (!block) return [];
  const out: KeyNumber[] = [];
  for (const [key, label, unit, skipNull] of list) {
    if (!(key in block)) continue;
    const v = block[key];
    if (v !== null && typeof v !== 'number') continue;
    if (v === null && skipNull) continue;
    out.push({ label, value: formatNumber(v), unit, key: `${name}.${key}`, group });
  }
  return out;
}

/** The key numbers of a summary, in reading order; blocks or keys the summary lacks are left out, null values read "n/a". */
export function keyNumbers(summary: Summary): KeyNumber[] {
  const cloud = summary.cloud as Record<string, unknown> | undefined;
  const out = rows(cloud, 'cloud', 'Cloud', CLOUD);
  const jm = out.find((r) => r.key === 'cloud.jeans_mass_msun');
  if (jm && typeof cloud?.jeans_mass_definition === 'string' && cloud.jeans_mass_definition) {
    // "sphere: diameter lambda_J ..." -> "sphere"
    jm.label = `Jeans mass (${cloud.jeans_mass_definition.split(':')[0].trim()})`;
  }
  out.push(...rows(summary.grid as Record<string, unknown>, 'grid', 'Grid', GRID));
  out.push(...rows(summary.resolution, 'resolution', 'Resolution', RESOLUTION));
  out.push(...rows(summary.hierarchy, 'hierarchy', 'Hierarchy', HIERARCHY));
  out.push(...rows(summary.cost, 'cost', 'Cost', COST));
  return out;
}

/** The resolution verdict of a summary (verdict + verdict_reason strings, or a {status, reason} object), or null. */
export function verdictOf(summary: Summary): VerdictText | null {
  const v = summary.resolution?.verdict;
  const why = summary.resolution?.verdict_reason;
  if (typeof v === 'string') return { status: v, reason: typeof why === 'string' ? why : '' };
  if (v && typeof v === 'object') {
    const o = v as Record<string, unknown>;
    const status = typeof o.status === 'string' ? o.status : '';
    const reason = typeof o.reason === 'string' ? o.reason : '';
    if (status || reason) return { status, reason };
  }
  return null;
}
