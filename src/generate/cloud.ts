/**
 * The Cloud: gridded fields plus the numbers that describe them.
 *
 * Grid conventions as in src/grid/grid3.ts: shape (nx, ny, nz), C order, index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3. Fields are Float32Array
 * in cgs: density g/cm^3, velocity cm/s, temperature K, magnetic field gauss (cell-centred).
 */
import type { Grid3 } from '../grid/grid3.js';
import type { JeansConvention } from '../physics/jeans.js';

/** Scalar description of a generated cloud; cgs unless the name says otherwise. */
export interface CloudSummary {
  /** Requested cloud mass, g (after renormalisation the gridded cloud holds exactly this). */
  mass: number;
  /** Cloud radius, cm (filament: cross-section radius). */
  radius: number;
  temperature: number;
  mu: number;
  /** Mean density of the cloud (mass / volume of the cloud region), g/cm^3. */
  meanDensity: number;
  soundSpeed: number;
  /** rms 3D Mach number of the cloud's velocity, mass-weighted over the cloud. */
  mach: number;
  /** One-dimensional velocity dispersion, cm/s (sigma_3D / sqrt 3). */
  sigma1D: number;
  virialParameter: number;
  /** E_th / |W| of the cloud. */
  alphaThermal: number;
  /** E_rot / |W| of the cloud. */
  betaRotation: number;
  /** Solid-body angular velocity, s^-1 (0 without rotation). */
  omega: number;
  /** Jeans mass at the mean density and temperature, g, and its convention. */
  jeansMass: number;
  jeansLength: number;
  jeansConvention: JeansConvention;
  freeFallTime: number;
  /** Everything in the box, cloud and ambient, g. */
  massOnGrid: number;
  /** Factor applied to the gridded cloud density so its mass equals the requested mass. */
  massCorrection: number;
  ambientDensity: number;
  ambientTemperature: number;
  /** Uniform field strength, G (null without a field). */
  field: number | null;
  massToFluxRelative: number | null;
  alfvenMach: number | null;
  plasmaBeta: number | null;
  envelope: string;
  structure: string;
  /** Width of the lognormal density PDF the generator aimed at (null when not lognormal). */
  sigmaS: number | null;
  /** Velocity P(k) ~ k^-n index and k range used (null without turbulence). */
  velocitySpectrumIndex: number | null;
  kMin: number | null;
  kMax: number | null;
  solenoidalWeight: number | null;
  /** Gravitational energy W of the smooth envelope, erg (radial integral for spheres; -G lambda^2 L for filaments). */
  gravitationalEnergy?: number;
  /** Thermal energy (3/2) sum m k_B T / (mu m_H) of the cloud cells, erg. */
  thermalEnergy?: number;
  /** Solid-body rotational energy (1/2) I Omega^2 of the cloud, erg (0 without rotation). */
  rotationalEnergy?: number;
  /** Central density of the envelope model before structure, g/cm^3. */
  peakDensity?: number;
  /** Notes worth showing the user (e.g. the mass correction). */
  notes: string[];
}

/** A generated cloud: grid, fields and summary. */
export interface Cloud {
  readonly grid: Grid3;
  readonly density: Float32Array;
  readonly velocity: readonly [Float32Array, Float32Array, Float32Array];
  readonly temperature: Float32Array;
  readonly magnetic: readonly [Float32Array, Float32Array, Float32Array] | null;
  /** 1 for cells inside the cloud region, 0 for ambient. */
  readonly inside: Uint8Array;
  readonly summary: CloudSummary;
  readonly seed: number;
}
