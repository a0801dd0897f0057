/**
 * Equal-mass particles sampled from a gridded cloud, for particle (SPH-type) codes. cgs.
 *
 * Grid conventions (src/grid/grid3.ts): C order, index (i*ny + j)*nz + k, i along x; cell
 * (i, j, k) spans x in [-L/2 + i dx, -L/2 + (i+1) dx), likewise y, z; fields cgs.
 *
 * Two methods, both seeded (seedrandom "alea", keyed by the cloud seed and the method):
 * - "monte-carlo": each particle picks a cell with probability m_cell / M (multinomial; the N
 *   sorted uniforms are generated in descending order as U_(n) = U_(n+1) V^(1/n), so no
 *   cumulative array is stored), then a uniform position inside the cell. Counts per cell
 *   have Poisson-like noise sqrt(N m_cell / M).
 * - "lattice" (low noise): systematic sampling. With S_c = N x (mass of cells 0..c) / M and one
 *   random offset u0 in [0, 1), cell c gets floor(S_c + u0) - floor(S_(c-1) + u0) particles, so
 *   every cell holds its expected count to within one particle (the fractional remainder carries
 *   over to the next cell in C order) and the total is exactly N. Inside a cell holding n
 *   particles, they sit in n distinct sub-cells of a q^3 sub-lattice (q = ceil(n^(1/3)),
 *   sub-cells chosen by a seeded shuffle), each jittered uniformly within the central half of
 *   its sub-cell (deterministic for the seed) so that no exact lattice planes remain.
 * Per particle: velocity trilinearly interpolated from the cell-centred grid with periodic
 * indexing; specific internal energy u = k_B T/((gamma - 1) mu m_H) from the temperature of the
 * cell holding it (gamma = 5/3, see grid-fields.ts); smoothing length h = eta (m / rho_cell)^(1/3)
 * (Price 2012), a first guess that the particle code will recompute.
 * Net momentum is removed by default (equal masses: the mean velocity is subtracted); the centre
 * of mass is reported, not moved (moving it would shift the cloud off the grid it came from).
 */
import seedrandom from 'seedrandom';
import type { Cloud } from '../generate/cloud.js';
import { cellSize, cellVolume } from '../grid/grid3.js';
import { smoothingLength, particleResolvableMass, SMOOTHING_ETA } from '../physics/resolution.js';
import { jeansMass } from '../physics/jeans.js';
import { soundSpeed } from '../physics/sound-speed.js';
import { M_SUN } from '../physics/constants.js';
import { internalEnergyPerKelvin } from './grid-fields.js';

/** Sampling method. */
export type ParticleMethod = 'monte-carlo' | 'lattice';

/** Options of sampleParticles. */
export interface ParticleOptions {
  count: number;
  method: ParticleMethod;
  /** 'box': every cell (cloud and ambient, default); 'cloud': only cells with inside = 1. */
  region?: 'box' | 'cloud';
  /** Subtract the mean velocity so the net momentum is zero (default true). */
  zeroMomentum?: boolean;
  /** Neighbour number of the target code (default 50) and the Bate & Burkert factor (default 2). */
  neighbours?: number;
  resolvableFactor?: number;
  /** Smoothing-length factor eta (default 1.2, Price 2012). */
  eta?: number;
}

/** Sampled particles: flat arrays, cgs (positions cm, velocities cm/s, u erg/g, h cm). */
export interface ParticleSet {
  count: number;
  /** Mass of every particle, g. */
  mass: number;
  position: Float64Array; // (N, 3)
  velocity: Float64Array; // (N, 3)
  internalEnergy: Float64Array;
  smoothingLength: Float64Array;
  report: ParticleReport;
}

/** Numbers reported with the particles (snake_case, units in the names). */
export interface ParticleReport {
  count: number;
  method: ParticleMethod;
  region: 'box' | 'cloud';
  particle_mass_g: number;
  particle_mass_msun: number;
  total_mass_g: number;
  centre_of_mass_cm: [number, number, number];
  centre_of_mass_sampling_error_cm: [number, number, number];
  mean_velocity_before_correction_cm_s: [number, number, number];
  mean_velocity_sampling_error_cm_s: [number, number, number];
  momentum_zeroed: boolean;
  jeans_mass_definition: string;
  jeans_mass_mean_density_g: number;
  particles_per_jeans_mass_mean_density: number;
  max_density_gcc: number;
  jeans_mass_max_density_g: number;
  particles_per_jeans_mass_max_density: number;
  neighbours: number;
  /** Bate & Burkert (1997) minimum resolvable mass, factor x N_neigh x m, g. */
  resolvable_mass_g: number;
  resolvable_mass_msun: number;
  /** Jeans mass at the maximum density is above the resolvable mass. */
  resolved_at_max_density: boolean;
  smoothing_eta: number;
  caution: string;
}

/** Samples equal-mass particles from the cloud (seeded by cloud.seed); see the file comment. */
export function sampleParticles(cloud: Cloud, opts: ParticleOptions): ParticleSet {
  const N = opts.count;
  if (!Number.isInteger(N) || N < 1) throw new RangeError(`particle count must be a positive integer, got ${N}`);
  const region = opts.region ?? 'box';
  const g = cloud.grid;
  const { nx, ny, nz } = g;
  const ncell = nx * ny * nz;
  const dx = cellSize(g);
  const half = g.boxSize / 2;
  const rho = cloud.density;
  const inside = cloud.inside;
  const w = (c: number): number => (region === 'box' || inside[c] ? rho[c]! : 0);
  let sumRho = 0;
  for (let c = 0; c < ncell; c++) sumRho += w(c);
  if (!(sumRho > 0)) throw new RangeError(`no mass to sample in region "${region}"`);
  const totalMass = sumRho * cellVolume(g);
  const m = totalMass / N;
  const rng = seedrandom.alea(`${cloud.seed}:particles:${opts.method}`);
  const pos = new Float64Array(N * 3);
  const cellOf = new Int32Array(N);

  const corner = (c: number, out: number[]): void => {
    const k = c % nz;
    const j = ((c - k) / nz) % ny;
    const i = (c - k - j * nz) / (ny * nz);
    out[0] = -half + i * dx; out[1] = -half + j * dx; out[2] = -half + k * dx;
  };
  const lo = [0, 0, 0];

  if (opts.method === 'monte-carlo') {
    // descending order statistics of N uniforms, walked against the cells from the top
    let u = 1;
    let c = ncell - 1;
    let low = sumRho - w(c);
    for (let p = N - 1; p >= 0; p--) {
      u *= Math.pow(rng(), 1 / (p + 1));
      const t = u * sumRho;
      while (c > 0 && (t < low || w(c) === 0)) { c--; low -= w(c); }
      cellOf[p] = c;
      corner(c, lo);
      pos[3 * p] = lo[0]! + rng() * dx; pos[3 * p + 1] = lo[1]! + rng() * dx; pos[3 * p + 2] = lo[2]! + rng() * dx;
    }
  } else {
    const u0 = rng();
    let acc = 0;
    let prev = Math.floor(u0);
    let p = 0;
    let scratch = new Int32Array(64);
    for (let c = 0; c < ncell; c++) {
      const wc = w(c);
      if (wc === 0) continue;
      acc += wc;
      const s = c === ncell - 1 || acc >= sumRho ? N : (N * acc) / sumRho;
      const next = Math.floor(s + u0);
      let n = next - prev;
      prev = next;
      if (n <= 0) continue;
      if (p + n > N) n = N - p; // guard against rounding at the very end
      const q = Math.ceil(Math.cbrt(n) - 1e-9);
      const q3 = q * q * q;
      if (scratch.length < q3) scratch = new Int32Array(q3);
      for (let s3 = 0; s3 < q3; s3++) scratch[s3] = s3;
      corner(c, lo);
      const sub = dx / q;
      for (let a = 0; a < n; a++) {
        const b = a + Math.floor(rng() * (q3 - a));
        const t = scratch[a]!; scratch[a] = scratch[b]!; scratch[b] = t;
        const sc = scratch[a]!;
        const sk = sc % q, sj = ((sc - sk) / q) % q, si = (sc - sk - sj * q) / (q * q);
        pos[3 * p] = lo[0]! + (si + 0.25 + 0.5 * rng()) * sub;
        pos[3 * p + 1] = lo[1]! + (sj + 0.25 + 0.5 * rng()) * sub;
        pos[3 * p + 2] = lo[2]! + (sk + 0.25 + 0.5 * rng()) * sub;
        cellOf[p] = c;
        p++;
      }
    }
    if (p !== N) throw new Error(`lattice sampling placed ${p} of ${N} particles`);
  }

  // velocities (trilinear, periodic), internal energy and smoothing length
  const vel = new Float64Array(N * 3);
  const uArr = new Float64Array(N);
  const hArr = new Float64Array(N);
  const uPerK = internalEnergyPerKelvin(cloud.summary.mu);
  const eta = opts.eta ?? SMOOTHING_ETA;
  const [vx, vy, vz] = cloud.velocity;
  for (let p = 0; p < N; p++) {
    const fx = (pos[3 * p]! + half) / dx - 0.5, fy = (pos[3 * p + 1]! + half) / dx - 0.5, fz = (pos[3 * p + 2]! + half) / dx - 0.5;
    const i0 = Math.floor(fx), j0 = Math.floor(fy), k0 = Math.floor(fz);
    const tx = fx - i0, ty = fy - j0, tz = fz - k0;
    const ia = ((i0 % nx) + nx) % nx, ib = (ia + 1) % nx;
    const ja = ((j0 % ny) + ny) % ny, jb = (ja + 1) % ny;
    const ka = ((k0 % nz) + nz) % nz, kb = (ka + 1) % nz;
    let sx = 0, sy = 0, sz = 0;
    for (let corner3 = 0; corner3 < 8; corner3++) {
      const ii = corner3 & 4 ? ib : ia, jj = corner3 & 2 ? jb : ja, kk = corner3 & 1 ? kb : ka;
      const wt = (corner3 & 4 ? tx : 1 - tx) * (corner3 & 2 ? ty : 1 - ty) * (corner3 & 1 ? tz : 1 - tz);
      const idx = (ii * ny + jj) * nz + kk;
      sx += wt * vx[idx]!; sy += wt * vy[idx]!; sz += wt * vz[idx]!;
    }
    vel[3 * p] = sx; vel[3 * p + 1] = sy; vel[3 * p + 2] = sz;
    const c = cellOf[p]!;
    uArr[p] = cloud.temperature[c]! * uPerK;
    hArr[p] = smoothingLength(m, rho[c]!, eta);
  }

  // centre of mass, mean velocity and their sampling errors (equal masses: plain means)
  const com: [number, number, number] = [0, 0, 0];
  const comErr: [number, number, number] = [0, 0, 0];
  const vmean: [number, number, number] = [0, 0, 0];
  const vErr: [number, number, number] = [0, 0, 0];
  for (let a = 0; a < 3; a++) {
    let s = 0, s2 = 0, v = 0, v2 = 0;
    for (let p = 0; p < N; p++) {
      const x = pos[3 * p + a]!; s += x; s2 += x * x;
      const y = vel[3 * p + a]!; v += y; v2 += y * y;
    }
    com[a] = s / N; vmean[a] = v / N;
    comErr[a] = Math.sqrt(Math.max(0, s2 / N - com[a] ** 2) / N);
    vErr[a] = Math.sqrt(Math.max(0, v2 / N - vmean[a] ** 2) / N);
  }
  const zero = opts.zeroMomentum ?? true;
  if (zero) for (let p = 0; p < N; p++) for (let a = 0; a < 3; a++) vel[3 * p + a] -= vmean[a];

  // resolution numbers
  const s = cloud.summary;
  const mj0 = jeansMass(soundSpeed(s.temperature, s.mu), s.meanDensity, s.jeansConvention);
  let cmax = 0;
  for (let c = 1; c < ncell; c++) if (rho[c]! > rho[cmax]!) cmax = c;
  const rhoMax = rho[cmax]!;
  const mjMax = jeansMass(soundSpeed(cloud.temperature[cmax]!, s.mu), rhoMax, s.jeansConvention);
  const neighbours = opts.neighbours ?? 50;
  const mres = particleResolvableMass(m, neighbours, opts.resolvableFactor ?? 2);
  const report: ParticleReport = {
    count: N, method: opts.method, region,
    particle_mass_g: m, particle_mass_msun: m / M_SUN.value, total_mass_g: totalMass,
    centre_of_mass_cm: com, centre_of_mass_sampling_error_cm: comErr,
    mean_velocity_before_correction_cm_s: vmean, mean_velocity_sampling_error_cm_s: vErr,
    momentum_zeroed: zero,
    jeans_mass_definition: s.jeansConvention,
    jeans_mass_mean_density_g: mj0, particles_per_jeans_mass_mean_density: mj0 / m,
    max_density_gcc: rhoMax, jeans_mass_max_density_g: mjMax, particles_per_jeans_mass_max_density: mjMax / m,
    neighbours, resolvable_mass_g: mres, resolvable_mass_msun: mres / M_SUN.value,
    resolved_at_max_density: mjMax >= mres, smoothing_eta: eta,
    caution: 'Particles sample the initial grid only; densities reached later in the run need their own resolution check (Bate & Burkert 1997), and convergence must be tested in the real run.',
  };
  return { count: N, mass: m, position: pos, velocity: vel, internalEnergy: uArr, smoothingLength: hArr, report };
}
