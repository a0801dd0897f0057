/**
 * The CloudSummary of a generated cloud: numbers measured on the grid or taken from the model.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3; cgs.
 * - mach, sigma1D: mass-weighted rms 3D speed over the cloud cells (turbulence and rotation
 *   together) over the cloud's sound speed; sigma1D = sigma3D / sqrt 3.
 * - virialParameter: 5 sigma1D^2 R / (G M) with that sigma1D (Bertoldi & McKee 1992), bulk
 *   motions only (no thermal term).
 * - alphaThermal = E_th / |W| with E_th = (3/2) sum m k_B T / (mu m_H) over the cloud cells;
 *   betaRotation = E_rot / |W| with E_rot = (1/2) I Omega^2, I measured on the grid about the
 *   axis through the centre of mass. |W| comes from the envelope model (envelope.ts): the
 *   radial integral of the smooth profile, exact for spheres, the infinite-cylinder virial term
 *   for filaments; it ignores the structure and the m-mode perturbation.
 * - Jeans mass and length at the mean density and the cloud temperature (thermal only), in the
 *   convention of survey.jeans_mass.
 */
import type { Config } from '../config/schema.js';
import type { CloudSummary } from './cloud.js';
import type { Grid3 } from '../grid/grid3.js';
import type { Envelope } from './envelope.js';
import type { CloudDimensions } from './dimensions.js';
import type { MagneticSetup } from './magnetic.js';
import { cellVolume } from '../grid/grid3.js';
import { forCellBlocks } from '../grid/cell-blocks.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { jeansLength, jeansMass } from '../physics/jeans.js';
import { freeFallTime } from '../physics/free-fall.js';
import { energyRatio, thermalEnergy, virialParameter } from '../physics/virial.js';
import { alfvenSpeed, plasmaBeta } from '../physics/magnetic.js';
import { momentOfInertia } from './velocity.js';
import { axisBasis } from './rotation.js';

/** Everything summarise needs. */
export interface SummaryInput {
  config: Config;
  env: Envelope;
  dims: CloudDimensions;
  grid: Grid3;
  density: Float32Array;
  inside: Uint8Array;
  velocity: readonly [Float32Array, Float32Array, Float32Array];
  temperature: Float32Array;
  omega: number;
  centre: readonly number[];
  massCorrection: number;
  sigmaS: number | null;
  kMaxV: number | null;
  zeta: number;
  mag: MagneticSetup | null;
  notes: string[];
}

function structureText(config: Config): string {
  const s = config.cloud.structure;
  switch (s.kind) {
    case 'none': return 'none (smooth)';
    case 'lognormal': return `lognormal, ln-density spectrum k^-${s.spectrum_index.toFixed(2)}, coupling ${s.coupling}`;
    case 'clumps': return `${s.count} clumps, dN/dM ~ M^-${s.spectrum_slope}, ${(100 * s.mass_fraction).toFixed(0)}% of the mass`;
    case 'fractal': return `box fractal, dimension ${s.dimension}, ${s.levels} levels, ${(100 * s.mass_fraction).toFixed(0)}% of the mass`;
  }
}

/** Adds, over cells [a, b), rho (cloud), rho |v|^2 (cloud), rho T (cloud) and rho (all cells) to run (a block kernel: src/grid/cell-blocks.ts). */
function summarySums(
  a: number, b: number, density: Float32Array, inside: Uint8Array, vx: Float32Array, vy: Float32Array, vz: Float32Array, temperature: Float32Array, run: Float64Array,
): void {
  let m = run[0]!, e = run[1]!, mt = run[2]!, all = run[3]!;
  for (let i = a; i < b; i++) {
    const rho = density[i]!;
    all += rho;
    if (!inside[i]) continue;
    const p = vx[i]!, q = vy[i]!, d = vz[i]!;
    m += rho;
    e += rho * (p * p + q * q + d * d);
    mt += rho * temperature[i]!;
  }
  run[0] = m; run[1] = e; run[2] = mt; run[3] = all;
}

/** Builds the CloudSummary (cgs; see the file comment for how each number is obtained). */
export function summarise(x: SummaryInput): CloudSummary {
  const { config, env, dims, grid: g, density, inside, velocity, temperature } = x;
  const c = config.cloud;
  const cs = soundSpeed(c.temperature, c.mu);
  const M = env.mass;
  const R = env.params.radius;
  // one pass for the sums of rmsSpeed, sum rho T over the cloud and totalMass (each in cell order, as those functions do)
  const [vx, vy, vz] = velocity;
  const run = new Float64Array(4);
  forCellBlocks(density.length, (a, b) => summarySums(a, b, density, inside, vx, vy, vz, temperature, run));
  const m = run[0]!, e = run[1]!, mt = run[2]!, all = run[3]!;
  const dv = cellVolume(g);
  const sigma3D = m * dv > 0 ? Math.sqrt((e * dv) / (m * dv)) : 0;
  const sigma1D = sigma3D / Math.sqrt(3);
  const eTh = thermalEnergy(mt * cellVolume(g), soundSpeed(1, c.mu));
  const W = env.gravitationalEnergy;
  let eRot = 0;
  if (x.omega > 0 && c.rotation) {
    const inertia = momentOfInertia(g, density, inside, axisBasis(c.rotation.axis).a, x.centre);
    eRot = 0.5 * inertia * x.omega * x.omega;
  }
  const conv = config.survey.jeans_mass;
  const t = c.turbulence;
  const B = x.mag?.field ?? null;
  const notes = [...x.notes];
  notes.push(`|W| = ${Math.abs(W).toExponential(3)} erg from the ${env.shape === 'sphere' ? 'radial integral of the smooth envelope (exact for the sphere; structure and perturbations ignored)' : 'infinite-cylinder virial term G lambda^2 L (exact only for length >> radius)'}`);
  if (env.shape === 'filament' && t?.virial_parameter !== undefined) notes.push('virial_parameter of a filament uses 5 sigma^2 R/(G M) with R its cross-section radius');
  if (x.mag) notes.push('magnetic field: uniform, stored cell-centred');
  notes.push('this is an initial condition and a statistical preview, not the outcome of a simulation');
  return {
    mass: M,
    radius: R,
    temperature: c.temperature,
    mu: c.mu,
    meanDensity: dims.meanDensity,
    soundSpeed: cs,
    mach: sigma3D / cs,
    sigma1D,
    virialParameter: virialParameter(sigma1D, R, M),
    alphaThermal: energyRatio(eTh, W),
    betaRotation: energyRatio(eRot, W),
    omega: x.omega,
    jeansMass: jeansMass(cs, dims.meanDensity, conv),
    jeansLength: jeansLength(cs, dims.meanDensity),
    jeansConvention: conv,
    freeFallTime: freeFallTime(dims.meanDensity),
    massOnGrid: all * dv,
    massCorrection: x.massCorrection,
    ambientDensity: dims.ambientDensity,
    ambientTemperature: dims.ambientTemperature,
    field: B,
    massToFluxRelative: x.mag?.massToFluxRelative ?? null,
    alfvenMach: B !== null && B > 0 ? sigma3D / alfvenSpeed(B, dims.meanDensity) : null,
    plasmaBeta: B !== null && B > 0 ? plasmaBeta(dims.meanDensity, cs, B) : null,
    envelope: env.description,
    structure: structureText(config),
    sigmaS: x.sigmaS,
    velocitySpectrumIndex: t ? t.spectrum_index : null,
    kMin: t ? t.k_min : null,
    kMax: t ? x.kMaxV : null,
    solenoidalWeight: t ? x.zeta : null,
    gravitationalEnergy: W,
    thermalEnergy: eTh,
    rotationalEnergy: eRot,
    peakDensity: dims.peakDensity,
    notes,
  };
}
