/**
 * Per-cell kernels of the generator, run on cell or x-row ranges by worker threads.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3, Float32 fields in cgs.
 * Every kernel writes only its own range, so the bytes do not depend on the split.
 */
import type { Grid3 } from '../grid/grid3.js';
import { cellCentre } from '../grid/grid3.js';
import { envelopeDensity, type EnvelopeParams } from './envelope.js';
import { eosTemperatureFloat32, type Eos } from '../physics/eos.js';

/**
 * Writes the envelope density (g/cm^3) at cell centres of x-rows [start, end): inside cells get
 * the profile and inside = 1; the rest get the ambient density and inside = 0. Returns the number
 * of inside cells written.
 */
export function gridEnvelope(start: number, end: number, p: EnvelopeParams, g: Grid3, ambient: number, density: Float32Array, inside: Uint8Array): number {
  let count = 0;
  const { ny, nz, boxSize: L } = g;
  const zs = new Float64Array(nz);
  for (let k = 0; k < nz; k++) zs[k] = cellCentre(k, nz, L);
  // uniform sphere: rho = peak where x*x + y*y + z*z <= R^2 (the test of envelopeDensity, same sums)
  const uniform = p.model === 'uniform';
  const R2 = p.radius * p.radius;
  for (let i = start; i < end; i++) {
    const x = cellCentre(i, g.nx, L);
    for (let j = 0; j < ny; j++) {
      const y = cellCentre(j, ny, L);
      const base = (i * ny + j) * nz;
      if (uniform) {
        const xy = x * x + y * y;
        // adding z*z >= 0 never lowers the sum, so the whole row is outside
        if (xy > R2) {
          density.fill(ambient, base, base + nz);
          inside.fill(0, base, base + nz);
          continue;
        }
        const rho = p.peakDensity;
        for (let k = 0; k < nz; k++) {
          const z = zs[k]!;
          if (xy + z * z > R2 || !(rho > 0)) {
            density[base + k] = ambient;
            inside[base + k] = 0;
          } else {
            density[base + k] = rho;
            inside[base + k] = 1;
            count++;
          }
        }
        continue;
      }
      for (let k = 0; k < nz; k++) {
        const rho = envelopeDensity(p, x, y, zs[k]!);
        if (rho > 0) {
          density[base + k] = rho;
          inside[base + k] = 1;
          count++;
        } else {
          density[base + k] = ambient;
          inside[base + k] = 0;
        }
      }
    }
  }
  return count;
}

/** Multiplies inside cells [start, end) of density by exp((s - mean) * scale - shift); dimensionless s. */
export function applyLognormal(start: number, end: number, density: Float32Array, s: Float32Array, inside: Uint8Array, mean: number, scale: number, shift: number): void {
  for (let c = start; c < end; c++) {
    if (inside[c]) density[c] = density[c]! * Math.exp((s[c]! - mean) * scale - shift);
  }
}

/** Writes cells [start, end) of temperature (K): the EOS temperature of the cloud gas inside, ambientT outside. */
export function fillTemperature(start: number, end: number, temperature: Float32Array, density: Float32Array, inside: Uint8Array, eos: Eos, cloudT: number, ambientT: number): void {
  // the Float32 of the EOS temperature (eosTemperatureFloat32: the same value as rounding eosTemperature)
  for (let i = start; i < end; i++) temperature[i] = inside[i] ? eosTemperatureFloat32(eos, cloudT, density[i]!) : ambientT;
}
