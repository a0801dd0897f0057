/**
 * Density structure inside the cloud: lognormal turbulent density, clumps or a box fractal.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3; density Float32 g/cm^3.
 * Lognormal: s = ln(rho / rho_envelope) is a Gaussian random field with P(k) ~ k^-n over
 * [k_min, k_max] (modes.ts), shifted and scaled so that over the cloud cells its mean is 0 and
 * its standard deviation is sigma_s = sqrt(ln(1 + b^2 Mach^2)) (Padoan, Nordlund & Jones 1997;
 * Federrath, Klessen & Schmidt 2008); then rho = rho_envelope exp(s - sigma_s^2/2) (volume-weighted
 * mean of s is -sigma_s^2/2, so <rho>_V = rho_envelope) and the cloud is
 * renormalised to its mass later (generate-cloud.ts), which preserves the mean density.
 * Clumps / fractal: the envelope keeps (1 - mass_fraction) of its density and the blobs of
 * clumps.ts carry the rest (deposit.ts).
 */
import type { Grid3 } from '../grid/grid3.js';
import type { WorkerPool } from '../grid/pool.js';
import { realInverse3Parallel } from '../grid/fft3-parallel.js';
import { fillLogDensityModes, type LogDensityModeParams } from './modes.js';
import { applyLognormal } from './cell-kernels.js';
import { forCellBlocks } from '../grid/cell-blocks.js';

/** Makes the lognormal density: density (envelope, in place) times exp(s), s of width sigmaS over the cloud. */
export async function applyLognormalStructure(
  g: Grid3, pool: WorkerPool | null, p: LogDensityModeParams, sigmaS: number,
  density: Float32Array, inside: Uint8Array, spec: Float64Array, scratch: Float32Array, onStep: () => void,
): Promise<void> {
  if (pool) await pool.runRanges('genLogDensityModes', g.nx, [spec, g, p]);
  else fillLogDensityModes(0, g.nx, spec, g, p);
  onStep();
  await realInverse3Parallel(pool, spec, g, scratch, p.kMax);
  onStep();
  // mean and standard deviation of s over the cloud, in cell order, through block kernels (src/grid/cell-blocks.ts)
  const run = new Float64Array(2);
  forCellBlocks(inside.length, (a, b) => cloudSums(a, b, scratch, inside, run));
  const n = run[0]!, s1 = run[1]!;
  const mean = n > 0 ? s1 / n : 0;
  const dev = new Float64Array(1);
  forCellBlocks(inside.length, (a, b) => cloudSquares(a, b, scratch, inside, mean, dev));
  const s2 = dev[0]!;
  const std = n > 1 ? Math.sqrt(s2 / n) : 0;
  const scale = std > 0 ? sigmaS / std : 0;
  // exp(s - sigma_s^2/2) has mean 1 for Gaussian s: the renormalisation then only corrects sampling and gridding
  const shift = (sigmaS * sigmaS) / 2;
  if (pool) await pool.runRanges('genLognormal', density.length, [density, scratch, inside, mean, scale, shift]);
  else applyLognormal(0, density.length, density, scratch, inside, mean, scale, shift);
  onStep();
}

/** Adds the count and the sum of s over cloud cells [a, b) to run (count, sum). */
function cloudSums(a: number, b: number, s: Float32Array, inside: Uint8Array, run: Float64Array): void {
  let n = run[0]!, s1 = run[1]!;
  for (let c = a; c < b; c++) if (inside[c]) { n++; s1 += s[c]!; }
  run[0] = n; run[1] = s1;
}

/** Adds the squared deviations of s from mean over cloud cells [a, b) to run[0]. */
function cloudSquares(a: number, b: number, s: Float32Array, inside: Uint8Array, mean: number, run: Float64Array): void {
  let s2 = run[0]!;
  for (let c = a; c < b; c++) if (inside[c]) { const d = s[c]! - mean; s2 += d * d; }
  run[0] = s2;
}
