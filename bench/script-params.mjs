/**
 * Turns a parsed fragplan config (cgs numbers, from dist/index.js loadConfig) into the command-line
 * arguments of bench/reference_plan.py, so that the script builds the same cloud as the preset.
 *
 * The script models a uniform sphere in an ambient medium with lognormal structure and turbulent
 * velocity; anything else in the config (other envelopes, clumps, rotation, magnetic field,
 * barotropic EOS) is reported in `notes` and left out of the script's work.
 */

/** The script's own defaults (bench/reference_plan.py), for the record when no preset is read. */
export const DEFAULT_SCRIPT_PARAMS = {
  mass_msun: 1000, radius_pc: 1, temperature_k: 15, mu: 2.33, mach: 8, velocity_index: 4, k_min: 2,
  solenoidal_weight: 1, density_index: 11 / 3, density_k_min: 1, contrast: 100, padding: 1.25, levels: 25,
  min_cells: 27, connectivity: 6,
};

/** Script arguments, seed, notes and the values used, for a config; lib = the dist/index.js module. */
export function scriptArgsFromConfig(lib, config) {
  const c = config.cloud;
  const notes = [];
  if (c.mass === undefined || c.radius === undefined) throw new Error('preset has no cloud.mass or cloud.radius');
  const cs = lib.soundSpeed(c.temperature, c.mu);
  const t = c.turbulence;
  let mach = 0;
  if (t?.mach !== undefined) mach = t.mach;
  else if (t?.virial_parameter !== undefined) {
    // alpha_vir = 5 sigma_1D^2 R/(G M) (Bertoldi & McKee 1992); 3D Mach = sqrt(3) sigma_1D / c_s
    const sigma1D = Math.sqrt((t.virial_parameter * lib.G.value * c.mass) / (5 * c.radius));
    mach = (Math.sqrt(3) * sigma1D) / cs;
  } else notes.push('preset has no turbulence: the script still draws a velocity field, at Mach 0');
  if (c.envelope.model !== 'uniform') notes.push(`envelope ${c.envelope.model}: the script uses a uniform sphere of the same mass and radius`);
  if (c.structure.kind !== 'lognormal') notes.push(`structure ${c.structure.kind}: the script uses lognormal structure anyway`);
  if (c.rotation) notes.push('rotation is not modelled by the script');
  if (c.magnetic) notes.push('the magnetic field is not modelled by the script');
  if (config.budget?.code === 'particles') notes.push('budget.code = particles does not change the script');
  const s = c.structure.kind === 'lognormal' ? c.structure : null;
  const values = {
    mass_msun: c.mass / lib.M_SUN.value,
    radius_pc: c.radius / lib.PC.value,
    temperature_k: c.temperature,
    mu: c.mu,
    mach,
    velocity_index: t?.spectrum_index ?? 4,
    k_min: t?.k_min ?? 2,
    ...(t?.k_max !== undefined ? { k_max: t.k_max } : {}),
    solenoidal_weight: t?.solenoidal_weight ?? 1,
    ...(s?.b !== undefined ? { b: s.b } : {}),
    density_index: s?.spectrum_index ?? 11 / 3,
    density_k_min: s?.k_min ?? 1,
    ...(s?.k_max !== undefined ? { density_k_max: s.k_max } : {}),
    coupling: s?.coupling ?? 0,
    contrast: c.ambient.contrast,
    padding: config.grid.padding,
    ...(config.grid.box_size !== undefined ? { box_pc: config.grid.box_size / lib.PC.value } : {}),
    levels: 25,
    min_cells: config.survey.min_cells,
    connectivity: config.survey.connectivity,
  };
  const args = Object.entries(values).flatMap(([k, v]) => [`--${k.replace(/_/g, '-')}`, String(v)]);
  if (c.eos.kind === 'barotropic') {
    values.barotropic = { critical_density: c.eos.critical_density, gamma: c.eos.gamma };
    args.push('--barotropic', '--critical-density', String(c.eos.critical_density), '--gamma', String(c.eos.gamma));
  }
  return { args, seed: config.seed, notes, values };
}
