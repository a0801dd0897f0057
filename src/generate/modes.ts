/**
 * Fourier-mode kernels of the generator: turbulent velocity and ln-density spectra.
 *
 * Layout as in src/grid/fft3.ts: half spectrum (nx, ny, nz/2 + 1), interleaved complex, element
 * ((i*ny + j)*nh + kz)*2; signed integer wavenumbers in cycles per box. Each mode's random
 * numbers come from modeGaussian (src/grid/random-field.ts), a hash of (seed key, stream,
 * kx, ky, kz): the same seed gives the same modes at every resolution, so a band with a fixed
 * k_max holds the same field at 64^3, 128^3 and 256^3. Streams: velocity 1, 2, 3 (the three
 * components of the raw vector w), ln density 4. On the kz = 0 plane the mode of (-kx, -ky, 0)
 * is computed at its canonical partner and conjugated (Hermitian symmetry); the k = 0 mode and
 * modes with a Nyquist component are zero, as in gaussianModes.
 *
 * Velocity: v(k) = A(k) [zeta P_perp + (1 - zeta) P_par] w(k), with P_par = khat khat^T and
 * P_perp = 1 - P_par (Helmholtz projection with weight zeta, Federrath et al. 2010) and
 * A(k) = k^(-n/2) in the band k_min <= |k| <= k_max, so <|v(k)|^2> ~ k^-n.
 * ln density: s(k) = k^(-n_s/2) [sqrt(1 - c^2) z(k) + c (-i khat . w(k))]. The second term has
 * the Fourier phase of the convergence -div v of the compressive velocity part, so c is the
 * correlation, mode by mode, between ln rho and the convergence: dense gas sits where flows
 * converge. Both terms are unit complex Gaussians, so the spectrum and the Gaussian statistics
 * of s do not depend on c. (A statistical preview of where turbulence piles up gas, not the
 * outcome of a simulation.)
 *
 * Kernels fill x-index rows [start, end); results do not depend on how rows are split. The spectrum
 * may be a band spectrum (fft3.ts: the first kz columns only) that holds kz <= k_max.
 */
import type { Grid3 } from '../grid/grid3.js';
import { halfLength, signedWavenumber, spectrumColumns } from '../grid/fft3.js';
import { modeGaussian } from '../grid/random-field.js';

/** Random-number streams of the generator (see the file comment). */
export const STREAM_VELOCITY = [1, 2, 3] as const;
export const STREAM_LOG_DENSITY = 4;

/** Parameters of the velocity spectrum (plain data for workers). */
export interface VelocityModeParams {
  /** Seed key from seedKey(seed). */
  readonly key: number;
  readonly index: number;
  readonly kMin: number;
  readonly kMax: number;
  /** Helmholtz weight: 1 solenoidal, 0 compressive. */
  readonly zeta: number;
}

/** Parameters of the ln-density spectrum (plain data for workers). */
export interface LogDensityModeParams {
  readonly key: number;
  readonly index: number;
  readonly kMin: number;
  readonly kMax: number;
  /** Coupling c in [0, 1] to the convergent velocity modes. */
  readonly coupling: number;
}

/**
 * Zeroes rows [start, end) of every spectrum, then calls fn(idx, kx, ky, kz, k, flip) for every
 * non-zero in-band mode of those rows. Only the box |kx|, |ky|, kz <= kMax is visited: outside
 * it |k| >= max(|kx|, |ky|, kz) > kMax (sqrt is exact on a perfect square), so those modes are
 * zero anyway. Same values, same bytes as visiting every mode.
 */
function forBand(
  g: Grid3, start: number, end: number, kMin: number, kMax: number, specs: readonly Float64Array[],
  fn: (idx: number, kx: number, ky: number, kz: number, k: number, flip: boolean) => void,
): void {
  const { nx, ny, nz } = g;
  const nh = halfLength(nz);
  // kz columns held: all nh, or a band spectrum's first few (fft3.ts)
  const nc = specs.length > 0 ? spectrumColumns(specs[0]!, g) : nh;
  for (const s of specs) if (s.length !== specs[0]!.length) throw new RangeError('forBand: the spectra differ in size');
  const rowLen = ny * nc * 2;
  for (const s of specs) s.fill(0, start * rowLen, end * rowLen);
  const cMax = Math.min(nh - 1, Math.floor(kMax));
  if (cMax >= nc) throw new RangeError(`a band spectrum of ${nc} kz columns cannot hold modes up to k_max = ${kMax}`);
  for (let i = start; i < end; i++) {
    const kx = signedWavenumber(i, nx);
    if (Math.abs(kx) > kMax || 2 * Math.abs(kx) === nx) continue;
    for (let j = 0; j < ny; j++) {
      const ky = signedWavenumber(j, ny);
      if (Math.abs(ky) > kMax || 2 * Math.abs(ky) === ny) continue;
      for (let c = 0; c <= cMax; c++) {
        if (2 * c === nz) continue;
        const k = Math.sqrt(kx * kx + ky * ky + c * c);
        if (k === 0 || k < kMin || k > kMax) continue;
        const idx = ((i * ny + j) * nc + c) * 2;
        if (c === 0 && (ky < 0 || (ky === 0 && kx < 0))) fn(idx, -kx, -ky, 0, k, true);
        else fn(idx, kx, ky, c, k, false);
      }
    }
  }
}

/**
 * Fills the half spectrum of velocity component `axis` (0 x, 1 y, 2 z; rows [start, end)) per the file
 * comment. Each component is computed from all three raw vectors by the same expression whether
 * the components are filled together or one at a time, so one scratch spectrum serves all three.
 */
export function fillVelocityComponent(start: number, end: number, spec: Float64Array, axis: 0 | 1 | 2, g: Grid3, p: VelocityModeParams): void {
  const w0 = new Float64Array(2), w1 = new Float64Array(2), w2 = new Float64Array(2);
  const ws = [w0, w1, w2] as const;
  const w = ws[axis];
  const a = 1 - 2 * p.zeta;
  forBand(g, start, end, p.kMin, p.kMax, [spec], (idx, kx, ky, kz, k, flip) => {
    modeGaussian(p.key, STREAM_VELOCITY[0], kx, ky, kz, w0);
    modeGaussian(p.key, STREAM_VELOCITY[1], kx, ky, kz, w1);
    modeGaussian(p.key, STREAM_VELOCITY[2], kx, ky, kz, w2);
    const hx = kx / k, hy = ky / k, hz = kz / k;
    const h = axis === 0 ? hx : axis === 1 ? hy : hz;
    const dr = hx * w0[0]! + hy * w1[0]! + hz * w2[0]!;
    const di = hx * w0[1]! + hy * w1[1]! + hz * w2[1]!;
    const amp = k ** (-p.index / 2);
    const sg = flip ? -1 : 1;
    spec[idx] = amp * (p.zeta * w[0]! + a * h * dr);
    spec[idx + 1] = sg * amp * (p.zeta * w[1]! + a * h * di);
  });
}

/** Fills the ln-density half spectrum (rows [start, end)) per the file comment. */
export function fillLogDensityModes(start: number, end: number, spec: Float64Array, g: Grid3, p: LogDensityModeParams): void {
  const z = new Float64Array(2), w0 = new Float64Array(2), w1 = new Float64Array(2), w2 = new Float64Array(2);
  const c = p.coupling;
  const ci = Math.sqrt(Math.max(0, 1 - c * c));
  forBand(g, start, end, p.kMin, p.kMax, [spec], (idx, kx, ky, kz, k, flip) => {
    let re = 0, im = 0;
    if (ci > 0) {
      modeGaussian(p.key, STREAM_LOG_DENSITY, kx, ky, kz, z);
      re = ci * z[0]!;
      im = ci * z[1]!;
    }
    if (c > 0) {
      modeGaussian(p.key, STREAM_VELOCITY[0], kx, ky, kz, w0);
      modeGaussian(p.key, STREAM_VELOCITY[1], kx, ky, kz, w1);
      modeGaussian(p.key, STREAM_VELOCITY[2], kx, ky, kz, w2);
      const dr = (kx * w0[0]! + ky * w1[0]! + kz * w2[0]!) / k;
      const di = (kx * w0[1]! + ky * w1[1]! + kz * w2[1]!) / k;
      // -i (dr + i di) = di - i dr
      re += c * di;
      im -= c * dr;
    }
    const amp = k ** (-p.index / 2);
    spec[idx] = amp * re;
    spec[idx + 1] = (flip ? -1 : 1) * amp * im;
  });
}
