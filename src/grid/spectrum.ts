/**
 * Shell-averaged power spectra of scalar and vector fields, and the compressive share of a
 * vector field's power.
 *
 * Grid conventions (grid3.ts): shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k,
 * i along x, cell-centred. Wavenumbers are integers in cycles per box; shell n holds the modes
 * with n - 1/2 <= |k| < n + 1/2. Power of a mode is |F(k)|^2 / N^2 (N = cell count, F the
 * unnormalised forward FFT), so the sum over all modes is the mean square of the field
 * (Parseval). The half spectrum counts modes with 0 < kz < nz/2 twice (for k and -k).
 * `power` is the mean mode power in the shell (the 3D spectrum P(k), ~k^-n for a field drawn
 * with <|F|^2> ~ k^-n); `energy` is the shell sum (E(k) ~ 4 pi k^2 P(k)).
 */
import type { Grid3 } from './grid3.js';
import { halfLength, realForward3, signedWavenumber } from './fft3.js';
import { onSharedMemory, type WorkerPool } from './pool.js';
import { realForward3Parallel, sharedSpectrum } from './fft3-parallel.js';

/** A shell-averaged spectrum: integer shells 1..kMax with mean |k|, mean mode power, shell sum and mode count. */
export interface ShellSpectrum {
  readonly k: Float64Array;
  readonly power: Float64Array;
  readonly energy: Float64Array;
  readonly count: Float64Array;
}

/**
 * Squared transfer function, per FFT index of an axis of n cells, of a block mean over f cells per
 * axis: H(k) = sin(pi k / n) / (f sin(pi k / (f n))) (k in cycles per box); all 1 when f = 1.
 */
export function blockMeanTransfer2(n: number, f: number): Float64Array {
  const out = new Float64Array(n).fill(1);
  if (f === 1) return out;
  for (let i = 1; i < n; i++) {
    const k = signedWavenumber(i, n);
    const h = Math.sin((Math.PI * k) / n) / (f * Math.sin((Math.PI * k) / (f * n)));
    out[i] = h * h;
  }
  return out;
}

function accumulate(spec: Float64Array, g: Grid3, sumK: Float64Array, energy: Float64Array, count: Float64Array, countModes: boolean, blockFactor = 1): void {
  const { nx, ny, nz } = g;
  const nh = halfLength(nz);
  const n2 = (nx * ny * nz) ** 2;
  const shells = sumK.length;
  const hx = blockMeanTransfer2(nx, blockFactor), hy = blockMeanTransfer2(ny, blockFactor), hz = blockMeanTransfer2(nz, blockFactor);
  for (let i = 0; i < nx; i++) {
    const kx = signedWavenumber(i, nx);
    for (let j = 0; j < ny; j++) {
      const ky = signedWavenumber(j, ny);
      const hxy = hx[i]! * hy[j]!;
      for (let c = 0; c < nh; c++) {
        const k = Math.sqrt(kx * kx + ky * ky + c * c);
        const s = Math.floor(k + 0.5);
        if (s === 0 || s >= shells) continue;
        const w = c === 0 || 2 * c === nz ? 1 : 2;
        const idx = ((i * ny + j) * nh + c) * 2;
        const p = (spec[idx]! ** 2 + spec[idx + 1]! ** 2) / n2 / (hxy * hz[c]!);
        energy[s] += w * p;
        if (countModes) {
          sumK[s] += w * k;
          count[s] += w;
        }
      }
    }
  }
}

function finish(sumK: Float64Array, energy: Float64Array, count: Float64Array): ShellSpectrum {
  const n = sumK.length - 1;
  const k = new Float64Array(n), power = new Float64Array(n), e = new Float64Array(n), cnt = new Float64Array(n);
  for (let s = 1; s <= n; s++) {
    cnt[s - 1] = count[s]!;
    e[s - 1] = energy[s]!;
    k[s - 1] = count[s]! > 0 ? sumK[s]! / count[s]! : s;
    power[s - 1] = count[s]! > 0 ? energy[s]! / count[s]! : 0;
  }
  return { k, power, energy: e, count: cnt };
}

/** Shell-averaged power spectrum of a scalar field (shells 1 .. min(n)/2), single thread. */
export function powerSpectrum(field: ArrayLike<number>, g: Grid3): ShellSpectrum {
  return vectorPowerSpectrum([field], g);
}

/** Shell-averaged power spectrum of a vector field: the component powers summed (blockFactor: see vectorPowerSpectrumParallel). */
export function vectorPowerSpectrum(components: readonly ArrayLike<number>[], g: Grid3, blockFactor = 1): ShellSpectrum {
  const shells = Math.floor(Math.min(g.nx, g.ny, g.nz) / 2) + 1;
  const sumK = new Float64Array(shells), energy = new Float64Array(shells), count = new Float64Array(shells);
  components.forEach((f, a) => accumulate(realForward3(f, g), g, sumK, energy, count, a === 0, blockFactor));
  return finish(sumK, energy, count);
}

/**
 * vectorPowerSpectrum with the transforms over a worker pool (same result; fields copied to shared
 * memory if needed). `blockFactor` f > 1: the components are block means of a field f times finer,
 * and each mode's power is divided by the block mean's squared transfer function (blockMeanTransfer2).
 */
export async function vectorPowerSpectrumParallel(pool: WorkerPool | null, components: readonly Float32Array[], g: Grid3, blockFactor = 1): Promise<ShellSpectrum> {
  if (!pool || pool.size < 2) return vectorPowerSpectrum(components, g, blockFactor);
  const shells = Math.floor(Math.min(g.nx, g.ny, g.nz) / 2) + 1;
  const sumK = new Float64Array(shells), energy = new Float64Array(shells), count = new Float64Array(shells);
  const spec = sharedSpectrum(g);
  for (let a = 0; a < components.length; a++) {
    const f = components[a]!;
    const shared = onSharedMemory(f) ? f : new Float32Array(new SharedArrayBuffer(f.length * 4));
    if (shared !== f) shared.set(f);
    await realForward3Parallel(pool, shared, g, spec);
    accumulate(spec, g, sumK, energy, count, a === 0, blockFactor);
  }
  return finish(sumK, energy, count);
}

/** Share of a vector field's power in its compressive (curl-free, k-parallel) part, all modes k != 0. */
export function compressivePowerFraction(v: readonly [ArrayLike<number>, ArrayLike<number>, ArrayLike<number>], g: Grid3): number {
  const s = v.map((f) => realForward3(f, g));
  const { nx, ny, nz } = g;
  const nh = halfLength(nz);
  let total = 0, comp = 0;
  for (let i = 0; i < nx; i++) {
    const kx = signedWavenumber(i, nx);
    for (let j = 0; j < ny; j++) {
      const ky = signedWavenumber(j, ny);
      for (let c = 0; c < nh; c++) {
        const k2 = kx * kx + ky * ky + c * c;
        if (k2 === 0) continue;
        const w = c === 0 || 2 * c === nz ? 1 : 2;
        const idx = ((i * ny + j) * nh + c) * 2;
        let dr = 0, di = 0, p = 0;
        const kk = [kx, ky, c];
        for (let a = 0; a < 3; a++) {
          const re = s[a]![idx]!, im = s[a]![idx + 1]!;
          p += re * re + im * im;
          dr += kk[a]! * re;
          di += kk[a]! * im;
        }
        total += w * p;
        comp += (w * (dr * dr + di * di)) / k2;
      }
    }
  }
  return total > 0 ? comp / total : 0;
}
