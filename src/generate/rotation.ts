/**
 * Rotation geometry: the axis basis and the azimuthal m-mode density perturbation.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3; density Float32 g/cm^3.
 * The azimuth phi is measured about the rotation axis a from e1 towards e2 = a x e1, where e1
 * is the x axis projected off a (the y axis when a is within ~25 degrees of x); for a = z this
 * is the usual phi = atan2(y, x). The perturbation is rho -> rho (1 + A cos(m phi)), as in the
 * standard rotating test cloud (Boss & Bodenheimer 1979). It leaves the mass of any
 * axisymmetric cloud unchanged for m >= 1.
 */
import type { Grid3 } from '../grid/grid3.js';
import { axisCentres } from './moments.js';

/** Orthonormal basis (a, e1, e2) for a rotation axis (any non-zero vector). */
export function axisBasis(axis: readonly number[]): { a: [number, number, number]; e1: [number, number, number]; e2: [number, number, number] } {
  const n = Math.hypot(axis[0]!, axis[1]!, axis[2]!);
  const a: [number, number, number] = [axis[0]! / n, axis[1]! / n, axis[2]! / n];
  const ref = Math.abs(a[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const d = ref[0]! * a[0] + ref[1]! * a[1] + ref[2]! * a[2];
  const u = [ref[0]! - d * a[0], ref[1]! - d * a[1], ref[2]! - d * a[2]];
  const un = Math.hypot(u[0]!, u[1]!, u[2]!);
  const e1: [number, number, number] = [u[0]! / un, u[1]! / un, u[2]! / un];
  const e2: [number, number, number] = [a[1] * e1[2] - a[2] * e1[1], a[2] * e1[0] - a[0] * e1[2], a[0] * e1[1] - a[1] * e1[0]];
  return { a, e1, e2 };
}

/** Multiplies cloud cells by 1 + A cos(m phi), phi about the axis through the origin (see file comment). */
export function applyAzimuthalMode(g: Grid3, density: Float32Array, inside: Uint8Array, axis: readonly number[], m: number, amplitude: number): void {
  if (m === 0 || amplitude === 0) return;
  const { e1, e2 } = axisBasis(axis);
  const { nx, ny, nz, boxSize: L } = g;
  const xs = axisCentres(nx, L), ys = axisCentres(ny, L), zs = axisCentres(nz, L);
  for (let i = 0, c = 0; i < nx; i++) {
    const x = xs[i]!;
    for (let j = 0; j < ny; j++) {
      const y = ys[j]!;
      for (let k = 0; k < nz; k++, c++) {
        if (!inside[c]) continue;
        const z = zs[k]!;
        const phi = Math.atan2(x * e2[0] + y * e2[1] + z * e2[2], x * e1[0] + y * e1[1] + z * e1[2]);
        density[c] = density[c]! * (1 + amplitude * Math.cos(m * phi));
      }
    }
  }
}
