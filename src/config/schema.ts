/**
 * The config schema: every key, its default and its unit. Parsing converts quantities to cgs.
 *
 * Keys are snake_case. Quantities accept "value unit" strings or bare numbers in the default
 * unit named beside each key. Sections: cloud (what to build), grid (on what), survey (how to
 * find fragments), budget (the target code), export (what to write). README.md documents every
 * key; keep the two in step.
 */
import { z } from 'zod';
import { quantity } from './quantity.js';
import { isPowerOfTwo } from '../grid/grid3.js';
import { BAROTROPIC_CRITICAL_DENSITY, BAROTROPIC_GAMMA } from '../physics/eos.js';
import { MU_DEFAULT } from '../physics/constants.js';

const positive = z.number().positive();
const fraction = z.number().min(0).max(1);
const axis3 = z.tuple([z.number(), z.number(), z.number()]).refine((v) => v.some((x) => x !== 0), 'expected a non-zero direction [x, y, z]');

const envelope = z.discriminatedUnion('model', [
  z.strictObject({ model: z.literal('uniform') }),
  z.strictObject({
    model: z.literal('bonnor-ebert'),
    /** Dimensionless outer radius; "critical" = 6.451 (Bonnor 1956; Ebert 1955). */
    xi_max: z.union([positive, z.literal('critical')]).default('critical'),
  }),
  z.strictObject({
    model: z.literal('power-law'),
    /** rho ~ r^-index outside the core. */
    index: z.number().min(0).max(2.9).default(1.5),
    /** Flat core radius (pc); default 0.1 of the cloud radius. */
    core_radius: quantity('length', 'pc').optional(),
  }),
  z.strictObject({
    model: z.literal('filament'),
    /** Mass per unit length (Msun/pc). */
    line_mass: quantity('lineMass', 'Msun/pc'),
    /** Filament length (pc). */
    length: quantity('length', 'pc'),
    axis: z.enum(['x', 'y', 'z']).default('z'),
    /** Radial profile across the filament: uniform cylinder or Plummer-like rho ~ (1 + (r/r0)^2)^-1. */
    profile: z.enum(['uniform', 'plummer']).default('plummer'),
    /** Plummer core radius (pc); default 0.1 of the filament radius. */
    core_radius: quantity('length', 'pc').optional(),
  }),
]);

const structure = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('none') }),
  z.strictObject({
    kind: z.literal('lognormal'),
    /** Forcing parameter b in sigma_s^2 = ln(1 + b^2 Mach^2); default from the turbulence weight. */
    b: z.number().min(0.1).max(1.5).optional(),
    /** Power-spectrum index of ln(rho) (P(k) ~ k^-n). */
    spectrum_index: z.number().min(0).max(6).default(11 / 3),
    /** 0: density independent of velocity; 1: density phases follow the convergent (compressive) part of the velocity. */
    coupling: fraction.default(0),
    k_min: z.number().min(1).default(1),
    k_max: z.number().min(1).optional(),
  }),
  z.strictObject({
    kind: z.literal('clumps'),
    count: z.number().int().min(1).max(100000).default(50),
    /** Share of the cloud mass in clumps. */
    mass_fraction: fraction.default(0.5),
    /** dN/dM ~ M^-slope. */
    spectrum_slope: z.number().min(1.1).max(4).default(1.7),
    /** Ratio of the largest to the smallest clump mass. */
    mass_range: z.number().min(1).default(100),
    /** Clump radius R ~ M^exponent (Larson-like size-mass relation). */
    size_mass_exponent: z.number().min(0.1).max(1).default(0.5),
    /** Radius of the most massive clump as a fraction of the cloud radius. */
    max_radius_fraction: z.number().positive().max(1).default(0.2),
  }),
  z.strictObject({
    kind: z.literal('fractal'),
    /** Box-counting dimension of the clump distribution. */
    dimension: z.number().min(1).max(3).default(2.3),
    levels: z.number().int().min(1).max(8).default(4),
    /** Share of the cloud mass in the fractal structure. */
    mass_fraction: fraction.default(0.7),
  }),
]);

const turbulence = z
  .strictObject({
    /** rms 3D Mach number (sigma_3D / c_s). Give this or virial_parameter. */
    mach: z.number().min(0).optional(),
    /** Target alpha_vir = 5 sigma_1D^2 R/(G M) (Bertoldi & McKee 1992). */
    virial_parameter: z.number().min(0).optional(),
    /** P(k) ~ k^-n of the velocity: 11/3 Kolmogorov to 4 Burgers. */
    spectrum_index: z.number().min(0).max(6).default(4),
    k_min: z.number().min(1).default(2),
    /** Largest wavenumber (cycles per box); default: the grid's Nyquist limit. Fix it for resolution studies. */
    k_max: z.number().min(1).optional(),
    /** Helmholtz weight zeta: 1 purely solenoidal, 0 purely compressive (Federrath et al. 2010). */
    solenoidal_weight: fraction.default(1),
    zero_angular_momentum: z.boolean().default(false),
  })
  .refine((t) => !(t.mach !== undefined && t.virial_parameter !== undefined), 'give mach or virial_parameter, not both');

const rotation = z
  .strictObject({
    /** Solid-body angular velocity (s^-1). Give this or beta. */
    omega: quantity('rate', 's^-1', { nonNegative: true }).optional(),
    /** Target E_rot/|W|. */
    beta: z.number().min(0).optional(),
    axis: axis3.default([0, 0, 1]),
    /** Azimuthal mode m of the density perturbation (0 = none). */
    m_mode: z.number().int().min(0).max(16).default(0),
    /** Relative amplitude A in rho (1 + A cos(m phi)). */
    amplitude: z.number().min(0).max(0.99).default(0),
  })
  .refine((r) => !(r.omega !== undefined && r.beta !== undefined), 'give omega or beta, not both');

const magnetic = z
  .strictObject({
    /** Uniform field strength (uG). Give this or mass_to_flux. */
    field: quantity('field', 'uG', { nonNegative: true }).optional(),
    /** Mass-to-flux ratio in units of the critical 1/(2 pi sqrt(G)) (Nakano & Nakamura 1978). */
    mass_to_flux: z.number().positive().optional(),
    direction: axis3.default([0, 0, 1]),
  })
  .refine((m) => (m.field === undefined) !== (m.mass_to_flux === undefined), 'give exactly one of field or mass_to_flux');

const eos = z.strictObject({
  kind: z.enum(['isothermal', 'barotropic']).default('isothermal'),
  /** Stiffening density (g/cm^3), Masunaga & Inutsuka 2000. */
  critical_density: quantity('massDensity', 'g cm^-3').prefault(BAROTROPIC_CRITICAL_DENSITY),
  gamma: z.number().min(1).max(2).default(BAROTROPIC_GAMMA),
});

const cloud = z.strictObject({
  /** Cloud mass (Msun); derived for a filament from line_mass x length. */
  mass: quantity('mass', 'Msun').optional(),
  /** Cloud radius (pc); for a filament its cross-section radius; derived for a Bonnor-Ebert sphere when absent. */
  radius: quantity('length', 'pc').optional(),
  temperature: quantity('temperature', 'K').prefault(10),
  /** Mean molecular weight per free particle (2.33 for molecular gas with helium). */
  mu: z.number().min(0.5).max(4).default(MU_DEFAULT),
  envelope: envelope.prefault({ model: 'uniform' }),
  ambient: z.strictObject({
    /** Cloud-edge density over ambient density. */
    contrast: z.number().min(1).default(100),
    /** Ambient temperature = T x contrast, so the pressure is continuous at the edge. */
    pressure_balance: z.boolean().default(true),
  }).prefault({}),
  structure: structure.prefault({ kind: 'none' }),
  turbulence: turbulence.optional(),
  rotation: rotation.optional(),
  magnetic: magnetic.optional(),
  eos: eos.prefault({}),
});

const grid = z.strictObject({
  /** Cells per side, a power of two (the FFT needs it). */
  cells: z.number().int().min(8).max(4096).refine(isPowerOfTwo, 'expected a power of two (8, 16, ... 4096)').default(128),
  /** Box side (pc); default padding x the cloud's extent. */
  box_size: quantity('length', 'pc').optional(),
  padding: z.number().min(1).max(10).default(1.25),
  /** Worker threads (default: number of cores, at most 8). */
  workers: z.number().int().min(1).max(64).optional(),
});

const survey = z.strictObject({
  jeans_mass: z.enum(['sphere', 'cube', 'virial']).default('sphere'),
  /** Add sigma_1D^2 to c_s^2 in the Jeans mass. */
  turbulent_support: z.boolean().default(true),
  /** Count a node unstable only if it is also gravitationally bound. */
  require_bound: z.boolean().default(false),
  connectivity: z.union([z.literal(6), z.literal(26)]).default(6),
  /** A branch is kept as its own node only with at least this many cells ... */
  min_cells: z.number().int().min(1).default(27),
  /** ... and a peak at least (1 + min_contrast) times its merge density. */
  min_contrast: z.number().min(0).default(0.5),
  /** ... and at least this mass (Msun). */
  min_mass: quantity('mass', 'Msun', { nonNegative: true }).prefault(0),
  /** Cells above this density are surveyed; default: the ambient density x 2. */
  floor_density: quantity('massDensity', 'g cm^-3').optional(),
  /** Self-gravity of a node uses at most this many cells per side (coarse-grained above). */
  gravity_cells: z.number().int().min(8).max(512).default(64),
  core_to_star_efficiency: z.number().positive().max(1).default(0.3),
  realizations: z.number().int().min(1).max(1000).default(1),
});

const budget = z.strictObject({
  code: z.enum(['grid', 'particles']).default('grid'),
  grid: z.strictObject({
    /** Base-grid cells per side of the target run; default grid.cells. */
    base_cells: z.number().int().min(8).optional(),
    levels: z.number().int().min(0).max(40).default(0),
    refinement_ratio: z.number().int().min(2).max(8).default(2),
    /** N_J: 4 after Truelove et al. 1997; 30 recommended for turbulence and dynamo studies (Federrath et al. 2011). */
    cells_per_jeans_length: z.number().min(1).default(4),
    courant: z.number().positive().max(1).default(0.4),
  }).prefault({}),
  particles: z.strictObject({
    count: z.number().int().min(1).default(1_000_000),
    neighbours: z.number().int().min(1).default(50),
    /** Resolvable mass = factor x N_neigh x m_particle (Bate & Burkert 1997). */
    resolvable_factor: z.number().positive().default(2),
    eta: z.number().positive().default(1.2),
    courant: z.number().positive().max(1).default(0.3),
  }).prefault({}),
  /** Density the run should resolve (g/cm^3); default: the EOS stiffening density. */
  target_density: quantity('massDensity', 'g cm^-3').optional(),
  /** Smallest fragment mass the run should resolve (Msun). */
  min_fragment_mass: quantity('mass', 'Msun').optional(),
  /** Run length in initial free-fall times. */
  free_fall_times: z.number().positive().default(1),
  /** Measured throughput of the target code, cell (or particle) updates per core per second; no default. */
  throughput: z.number().positive().optional(),
  /** Sink accretion radius in finest cells (Federrath et al. 2010). */
  sink_radius_cells: z.number().positive().default(2.5),
}).prefault({});

const exportSection = z.strictObject({
  formats: z.array(z.enum(['npy', 'raw', 'hdf5', 'vti'])).default(['npy']),
  precision: z.enum(['float32', 'float64']).default('float32'),
  units: z.enum(['cgs', 'si', 'code']).default('cgs'),
  /** Code units with G = 1: the length and mass units. */
  code_units: z.strictObject({
    length: quantity('length', 'pc').prefault(1),
    mass: quantity('mass', 'Msun').prefault(1),
  }).prefault({}),
  /** Thermal field written beside density and velocity. */
  thermal_field: z.enum(['temperature', 'internal_energy']).default('temperature'),
  particles: z.strictObject({
    count: z.number().int().min(1).max(200_000_000),
    method: z.enum(['monte-carlo', 'lattice']).default('lattice'),
  }).optional(),
  /** Cells per side of the preview fields the viewer loads. */
  preview_cells: z.number().int().min(8).max(256).refine(isPowerOfTwo, 'expected a power of two').default(64),
}).prefault({});

/** The whole config file. */
export const configSchema = z.strictObject({
  /** A label for the run; default the config file's name. */
  name: z.string().regex(/^[A-Za-z0-9._-]+$/, 'expected letters, digits, ".", "_" or "-"').optional(),
  seed: z.number().int().min(0).max(2 ** 31 - 1).default(1),
  cloud,
  grid: grid.prefault({}),
  survey: survey.prefault({}),
  budget,
  export: exportSection,
});

/** A parsed config, quantities in cgs. */
export type Config = z.output<typeof configSchema>;
/** A config as written in YAML. */
export type ConfigInput = z.input<typeof configSchema>;
