/**
 * generateCloud: config -> Cloud (gridded density, velocity, temperature, magnetic field).
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3, Float32 fields in cgs
 * (g/cm^3, cm/s, K, gauss); sums in Float64. Steps: envelope on the grid -> structure
 * (lognormal, clumps, fractal) -> m-mode perturbation -> renormalise the cloud to its mass ->
 * turbulence -> rotation -> temperature -> magnetic field (uniform, cell-centred) -> summary.
 * Every step either runs on one thread in cell order or splits rows between workers with
 * split-independent results, so 1 and 2 workers give the same bytes.
 */
import type { Config } from '../config/schema.js';
import type { Cloud } from './cloud.js';
import type { ProgressSink } from '../progress.js';
import { silentProgress } from '../progress.js';
import { InputError } from '../input-error.js';
import { cellCount, cubicGrid, type Grid3 } from '../grid/grid3.js';
import { createPool, defaultWorkerCount, type WorkerPool } from '../grid/pool.js';
import { sharedSpectrum } from '../grid/fft3-parallel.js';
import { bandSpectrumLength } from '../grid/fft3.js';
import { seedKey } from '../grid/random-field.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { M_SUN } from '../physics/constants.js';
import { sigmaForVirialParameter } from '../physics/virial.js';
import { forcingParameterForWeight, lognormalWidth } from '../physics/turbulence.js';
import { eosFromSettings, type Eos } from '../physics/eos.js';
import { resolveEnvelope } from './envelope.js';
import { cloudDimensions } from './dimensions.js';
import { fillTemperature, gridEnvelope } from './cell-kernels.js';
import { applyLognormalStructure } from './structure.js';
import { drawClumps, drawFractal } from './clumps.js';
import { depositBlobs } from './deposit.js';
import { applyAzimuthalMode, axisBasis } from './rotation.js';
import { addRigidRotation, momentOfInertia, rawTurbulence, removeNetAngularMomentum, removeNetMomentum, scaleVelocity } from './velocity.js';
import { cloudMass, cloudMassCentre, rmsSpeed, scaleCloudCells } from './moments.js';
import { magneticSetup } from './magnetic.js';
import { summarise } from './summary.js';

/** Options of generateCloud; seed and cells override config.seed and config.grid.cells. */
export interface GenerateOptions {
  seed?: number;
  cells?: number;
  /** Worker threads when no pool is given (default config.grid.workers or the core count). */
  workers?: number;
  /** A running pool to use (null: one thread); when absent, one is created and closed. */
  pool?: WorkerPool | null;
  progress?: ProgressSink;
  /**
   * Called once the density is final (after the renormalisation; the velocity, temperature and
   * field are still to come): density g/cm^3 on the grid, and the ambient density g/cm^3.
   */
  onDensity?: (density: Float32Array, grid: Grid3, ambientDensity: number) => void;
}

/** Number of half spectra (Float64) the generation needs at once: one scratch spectrum serves every transform. */
function spectraNeeded(config: Config): number {
  return config.cloud.turbulence || config.cloud.structure.kind === 'lognormal' ? 1 : 0;
}

/**
 * Highest k_max (cycles per box, at most the Nyquist wavenumber cells/2) of the spectra the generation
 * transforms: the scratch spectrum is a band spectrum holding kz up to it (fft3.ts), -Infinity when none.
 */
function spectrumBand(config: Config, cells: number): number {
  const c = config.cloud;
  const nyquist = cells / 2;
  let band = -Infinity;
  if (c.turbulence) band = Math.max(band, Math.min(c.turbulence.k_max ?? nyquist, nyquist));
  if (c.structure.kind === 'lognormal') band = Math.max(band, Math.min(c.structure.k_max ?? nyquist, nyquist));
  return band;
}

/** Peak bytes of generating the config at cells^3: Float32 fields, mask, the scratch band spectrum and ~64 MB overhead. */
export function estimateGenerateBytes(config: Config, cells: number): number {
  const g: Grid3 = { nx: cells, ny: cells, nz: cells, boxSize: 1 };
  const n = cellCount(g);
  const fields = 4 * n * (1 + 3 + 1 + (config.cloud.magnetic ? 3 : 0)) + n;
  return fields + spectraNeeded(config) * bandSpectrumLength(g, spectrumBand(config, cells)) * 8 + 64 * 2 ** 20;
}

/** Target 3D velocity dispersion of the turbulence, cm/s (null without turbulence). */
export function turbulentTarget(config: Config, mass: number, radius: number): number | null {
  const t = config.cloud.turbulence;
  if (!t) return null;
  if (t.mach !== undefined) return t.mach * soundSpeed(config.cloud.temperature, config.cloud.mu);
  if (t.virial_parameter !== undefined) return Math.sqrt(3) * sigmaForVirialParameter(t.virial_parameter, radius, mass);
  throw new InputError('cloud.turbulence: give mach or virial_parameter');
}

/** Generates the cloud of a config on a cubic grid (see the file comment for the steps and units). */
export async function generateCloud(config: Config, opts: GenerateOptions = {}): Promise<Cloud> {
  const seed = opts.seed ?? config.seed;
  const cells = opts.cells ?? config.grid.cells;
  const progress = opts.progress ?? silentProgress;
  let pool: WorkerPool | null;
  let own = false;
  if (opts.pool !== undefined) pool = opts.pool;
  else {
    const n = opts.workers ?? config.grid.workers ?? defaultWorkerCount();
    pool = n > 1 ? createPool(n) : null;
    own = pool !== null;
  }
  // The pool's workers are unref'd: keep the event loop alive while we wait on them.
  const keepAlive = pool ? setInterval(() => {}, 1 << 30) : null;
  try {
    return await build(config, seed, cells, pool, progress, opts.onDensity);
  } finally {
    if (keepAlive) clearInterval(keepAlive);
    if (own && pool) await pool.close();
  }
}

async function build(config: Config, seed: number, cells: number, pool: WorkerPool | null, progress: ProgressSink, onDensity?: GenerateOptions['onDensity']): Promise<Cloud> {
  const c = config.cloud;
  const env = resolveEnvelope(config);
  const dims = cloudDimensions(config);
  const g = cubicGrid(cells, dims.boxSize);
  const shared = pool !== null;
  const N = cellCount(g);
  const field = (): Float32Array => (shared ? new Float32Array(new SharedArrayBuffer(N * 4)) : new Float32Array(N));
  const notes: string[] = [];
  const cs = soundSpeed(c.temperature, c.mu);
  const key = seedKey(seed);
  const nyquist = cells / 2;

  // 1. envelope
  let st = progress.stage('cloud: envelope', 1);
  const density = field();
  const inside = shared ? new Uint8Array(new SharedArrayBuffer(N)) : new Uint8Array(N);
  // cell counts are integers: summing the workers' counts is exact
  const insideCount = pool
    ? (await pool.runRanges<number>('genEnvelope', g.nx, [env.params, g, dims.ambientDensity, density, inside])).reduce((a, b) => a + b, 0)
    : gridEnvelope(0, g.nx, env.params, g, dims.ambientDensity, density, inside);
  st.update(1); st.stop();
  if (insideCount === 0) throw new InputError(`grid.cells: the cloud covers no cell centre at ${cells}^3 (box ${(g.boxSize / dims.radius).toFixed(1)} cloud radii); use more cells or a smaller box`);
  if (dims.extent > g.boxSize * (1 + 1e-12)) notes.push(`the box (grid.box_size) is smaller than the cloud's extent: the cloud is cut at the box faces and its mass put in the part that fits`);

  const nSpec = spectraNeeded(config);
  // one scratch spectrum, holding kz up to the highest band transformed (fft3.ts: band spectrum)
  const band = spectrumBand(config, cells);
  const specs = Array.from({ length: nSpec }, () => (shared ? sharedSpectrum(g, band) : new Float64Array(bandSpectrumLength(g, band))));
  const temperature = field();
  const velocity: [Float32Array, Float32Array, Float32Array] = [field(), field(), field()];

  // Turbulence target and the lognormal width depend on it
  const sigma3D = turbulentTarget(config, env.mass, env.params.radius);
  const zeta = c.turbulence?.solenoidal_weight ?? 1;
  const kMaxV = c.turbulence ? Math.min(c.turbulence.k_max ?? nyquist, nyquist) : null;
  if (c.turbulence?.k_max !== undefined && c.turbulence.k_max > nyquist) notes.push(`cloud.turbulence.k_max ${c.turbulence.k_max} is above the grid's Nyquist limit ${nyquist}; modes above it are absent at ${cells}^3`);

  // 2. structure
  const s = c.structure;
  let sigmaS: number | null = null;
  if (s.kind === 'lognormal') {
    const mach = sigma3D === null ? 0 : sigma3D / cs;
    const b = s.b ?? forcingParameterForWeight(zeta);
    sigmaS = lognormalWidth(b, mach);
    if (sigma3D === null) notes.push('lognormal structure without turbulence: Mach 0 gives sigma_s = 0 (a smooth cloud)');
    if (s.coupling > 0 && (!c.turbulence || zeta === 1)) notes.push('structure.coupling has no convergent flow to follow: the velocity is purely solenoidal or absent');
    const kMax = Math.min(s.k_max ?? nyquist, nyquist);
    st = progress.stage('cloud: lognormal density', 3);
    let done = 0;
    await applyLognormalStructure(g, pool, { key, index: s.spectrum_index, kMin: s.k_min, kMax, coupling: s.coupling }, sigmaS, density, inside, specs[0]!, temperature, () => st.update(++done));
    st.stop();
  } else if (s.kind === 'clumps' || s.kind === 'fractal') {
    st = progress.stage(`cloud: ${s.kind}`, 1);
    const blobs = s.kind === 'clumps' ? drawClumps(env.params, env.mass, s, seed) : drawFractal(env.params, env.mass, s, seed);
    if (blobs.length === 0) notes.push('fractal structure: no leaf fell inside the cloud; the cloud is smooth');
    else {
      scaleCloudCells(0, N, density, inside, 1 - s.mass_fraction);
      const lost = depositBlobs(g, density, inside, blobs);
      if (lost > 0) notes.push(`${((100 * lost) / env.mass).toFixed(2)}% of the cloud mass was in ${s.kind} that touched no cloud cell; the renormalisation moved it into the rest of the cloud`);
    }
    st.update(1); st.stop();
  }

  // 3. m-mode perturbation
  const rot = c.rotation;
  if (rot && rot.m_mode > 0 && rot.amplitude > 0) applyAzimuthalMode(g, density, inside, rot.axis, rot.m_mode, rot.amplitude);

  // 4. renormalise the cloud to its mass
  const before = cloudMass(g, density, inside);
  const massCorrection = env.mass / before;
  notes.push(`mass correction: the gridded cloud density was multiplied by ${massCorrection.toFixed(6)} so that the cloud holds exactly ${(env.mass / M_SUN.value).toPrecision(6)} Msun`);
  if (pool) await pool.runRanges('genScaleCloud', N, [density, inside, massCorrection]);
  else scaleCloudCells(0, N, density, inside, massCorrection);
  // the density is final: the caller may start on it (the merge tree) while the rest is made
  onDensity?.(density, g, dims.ambientDensity);

  // 5. turbulence: its transforms are queued on the pool first; this thread meanwhile finds the centre of mass
  const eos: Eos = eosFromSettings(c.eos);
  // the temperature needs only the final density: on the pool, it runs while this thread removes the net momentum
  let temperatureP: Promise<unknown> | null = null;
  const startTemperature = (): void => {
    if (!pool || temperatureP) return;
    temperatureP = pool.runRanges('genTemperature', N, [temperature, density, inside, eos, c.temperature, dims.ambientTemperature]);
    temperatureP.catch(() => {}); // awaited in step 7; a failure is reported there
  };
  const turbulence = c.turbulence && sigma3D !== null ? c.turbulence : null;
  let done = 0;
  let raw: Promise<void> | null = null;
  if (turbulence) {
    st = progress.stage('cloud: turbulent velocity', 5);
    const p = { key, index: turbulence.spectrum_index, kMin: turbulence.k_min, kMax: kMaxV!, zeta };
    raw = rawTurbulence(g, pool, p, specs[0]!, velocity, () => st.update(++done));
  }
  const { centre } = cloudMassCentre(g, density, inside);
  if (turbulence && sigma3D !== null) {
    await raw;
    startTemperature();
    let rms = removeNetMomentum(g, density, inside, velocity);
    if (turbulence.zero_angular_momentum) {
      removeNetAngularMomentum(g, density, inside, velocity, centre);
      rms = rmsSpeed(g, density, inside, velocity);
    }
    if (rms > 0) {
      if (pool) await pool.runRanges('genScaleVelocity', N, [inside, velocity[0], velocity[1], velocity[2], sigma3D / rms]);
      else scaleVelocity(inside, velocity, sigma3D / rms);
    }
    else notes.push('turbulence: the k range holds no mode on this grid; the velocity is zero');
    st.update(5); st.stop();
  }
  specs.length = 0;

  // 6. rotation
  let omega = 0;
  if (rot && (rot.omega !== undefined || rot.beta !== undefined)) {
    const { a } = axisBasis(rot.axis);
    if (rot.omega !== undefined) omega = rot.omega;
    else {
      const inertia = momentOfInertia(g, density, inside, a, centre);
      omega = Math.sqrt((2 * rot.beta! * Math.abs(env.gravitationalEnergy)) / inertia);
    }
    addRigidRotation(g, inside, velocity, a.map((x) => x * omega), centre);
  }

  // 7. temperature: cloud T (or the barotropic T(rho)) inside, ambient T outside (on the pool: started above)
  startTemperature();
  if (temperatureP) await temperatureP;
  else fillTemperature(0, N, temperature, density, inside, eos, c.temperature, dims.ambientTemperature);

  // 8. magnetic field (uniform, cell-centred)
  const mag = magneticSetup(config, env);
  let magnetic: [Float32Array, Float32Array, Float32Array] | null = null;
  if (mag) {
    magnetic = [field(), field(), field()];
    for (let a = 0; a < 3; a++) magnetic[a]!.fill(mag.field * mag.direction[a]!);
  }

  st = progress.stage('cloud: summary', 1);
  const summary = summarise({ config, env, dims, grid: g, density, inside, velocity, temperature, omega, centre, massCorrection, sigmaS, kMaxV, zeta, mag, notes });
  st.update(1); st.stop();
  return { grid: g, density, velocity, temperature, magnetic, inside, summary, seed };
}
