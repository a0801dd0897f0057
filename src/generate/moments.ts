/**
 * Mass moments of the cloud region on the grid, accumulated in Float64 in cell order on one
 * thread (so the bytes never depend on the number of workers).
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3. cgs: g, cm, cm/s.
 */
import type { Grid3 } from '../grid/grid3.js';
import { cellCentre, cellVolume } from '../grid/grid3.js';
import { forCellBlocks } from '../grid/cell-blocks.js';

/** Cell-centre coordinates along one axis, cm. */
export function axisCentres(n: number, boxSize: number): Float64Array {
  const a = new Float64Array(n);
  for (let i = 0; i < n; i++) a[i] = cellCentre(i, n, boxSize);
  return a;
}

/** Mass (g) and centre of mass (cm) of the cells with inside = 1. */
export function cloudMassCentre(g: Grid3, density: Float32Array, inside: Uint8Array): { mass: number; centre: [number, number, number] } {
  const { nx, ny, nz, boxSize: L } = g;
  const xs = axisCentres(nx, L), ys = axisCentres(ny, L), zs = axisCentres(nz, L);
  // running sums m, m x, m y, m z, added plane by plane (a block kernel per plane: src/grid/cell-blocks.ts)
  const run = new Float64Array(4);
  for (let i = 0; i < nx; i++) centrePlane(i, ny, nz, xs[i]!, ys, zs, density, inside, run);
  const m = run[0]!, mx = run[1]!, my = run[2]!, mz = run[3]!;
  const dv = cellVolume(g);
  return { mass: m * dv, centre: m > 0 ? [mx / m, my / m, mz / m] : [0, 0, 0] };
}

/** Adds plane i's cloud cells to run (m, m x, m y, m z), in cell order (a block kernel: src/grid/cell-blocks.ts). */
function centrePlane(i: number, ny: number, nz: number, x: number, ys: Float64Array, zs: Float64Array, density: Float32Array, inside: Uint8Array, run: Float64Array): void {
  let m = run[0]!, mx = run[1]!, my = run[2]!, mz = run[3]!;
  for (let j = 0, c = i * ny * nz; j < ny; j++) {
    for (let k = 0; k < nz; k++, c++) {
      if (!inside[c]) continue;
      const rho = density[c]!;
      m += rho;
      mx += rho * x;
      my += rho * ys[j]!;
      mz += rho * zs[k]!;
    }
  }
  run[0] = m; run[1] = mx; run[2] = my; run[3] = mz;
}

/** Adds density over cells [a, b) with inside = 1 to run[0]. */
function insideSum(a: number, b: number, density: Float32Array, inside: Uint8Array, run: Float64Array): void {
  let m = run[0]!;
  for (let c = a; c < b; c++) if (inside[c]) m += density[c]!;
  run[0] = m;
}

/** Mass (g) of the cells with inside = 1: the mass of cloudMassCentre, same sum in the same order. */
export function cloudMass(g: Grid3, density: Float32Array, inside: Uint8Array): number {
  const run = new Float64Array(1);
  forCellBlocks(density.length, (a, b) => insideSum(a, b, density, inside, run));
  return run[0]! * cellVolume(g);
}

/** Multiplies cells [start, end) of density (g/cm^3) by factor where inside = 1, storing Float32 (a worker task: per cell, split-independent). */
export function scaleCloudCells(start: number, end: number, density: Float32Array, inside: Uint8Array, factor: number): void {
  for (let c = start; c < end; c++) if (inside[c]) density[c] = Math.fround(density[c]! * factor);
}

/** Sum of density x volume over all cells (cloud and ambient), g. */
export function totalMass(g: Grid3, density: Float32Array): number {
  let s = 0;
  for (let c = 0; c < density.length; c++) s += density[c]!;
  return s * cellVolume(g);
}

/** Mass-weighted velocity moments over the cloud: momentum (g cm/s, per axis) and sum m |v|^2 (erg x 2). */
export function velocityMoments(g: Grid3, density: Float32Array, inside: Uint8Array, v: readonly [Float32Array, Float32Array, Float32Array]): { mass: number; momentum: [number, number, number]; sumMv2: number } {
  let m = 0, px = 0, py = 0, pz = 0, e = 0;
  const [vx, vy, vz] = v;
  for (let c = 0; c < density.length; c++) {
    if (!inside[c]) continue;
    const rho = density[c]!;
    const a = vx[c]!, b = vy[c]!, d = vz[c]!;
    m += rho;
    px += rho * a;
    py += rho * b;
    pz += rho * d;
    e += rho * (a * a + b * b + d * d);
  }
  const dv = cellVolume(g);
  return { mass: m * dv, momentum: [px * dv, py * dv, pz * dv], sumMv2: e * dv };
}

/** Mass-weighted rms speed over the cloud, cm/s. */
export function rmsSpeed(g: Grid3, density: Float32Array, inside: Uint8Array, v: readonly [Float32Array, Float32Array, Float32Array]): number {
  const mom = velocityMoments(g, density, inside, v);
  return mom.mass > 0 ? Math.sqrt(mom.sumMv2 / mom.mass) : 0;
}

/** Angular momentum (g cm^2/s) and inertia tensor (g cm^2, row-major 3x3) of the cloud about a centre (cm). */
export function angularMoments(g: Grid3, density: Float32Array, inside: Uint8Array, v: readonly [Float32Array, Float32Array, Float32Array], centre: readonly number[]): { l: [number, number, number]; inertia: number[] } {
  const { nx, ny, nz, boxSize: L } = g;
  const xs = axisCentres(nx, L), ys = axisCentres(ny, L), zs = axisCentres(nz, L);
  let lx = 0, ly = 0, lz = 0, ixx = 0, iyy = 0, izz = 0, ixy = 0, ixz = 0, iyz = 0;
  const [vx, vy, vz] = v;
  for (let i = 0, c = 0; i < nx; i++) {
    const x = xs[i]! - centre[0]!;
    for (let j = 0; j < ny; j++) {
      const y = ys[j]! - centre[1]!;
      for (let k = 0; k < nz; k++, c++) {
        if (!inside[c]) continue;
        const z = zs[k]! - centre[2]!;
        const m = density[c]!;
        const a = vx[c]!, b = vy[c]!, d = vz[c]!;
        lx += m * (y * d - z * b);
        ly += m * (z * a - x * d);
        lz += m * (x * b - y * a);
        ixx += m * (y * y + z * z);
        iyy += m * (x * x + z * z);
        izz += m * (x * x + y * y);
        ixy -= m * x * y;
        ixz -= m * x * z;
        iyz -= m * y * z;
      }
    }
  }
  const dv = cellVolume(g);
  return { l: [lx * dv, ly * dv, lz * dv], inertia: [ixx, ixy, ixz, ixy, iyy, iyz, ixz, iyz, izz].map((q) => q * dv) };
}

/** Solves the 3x3 system A x = b (A row-major) by Cramer's rule; zeros when A is singular. */
export function solve3(a: readonly number[], b: readonly number[]): [number, number, number] {
  const det = (m: readonly number[]): number =>
    m[0]! * (m[4]! * m[8]! - m[5]! * m[7]!) - m[1]! * (m[3]! * m[8]! - m[5]! * m[6]!) + m[2]! * (m[3]! * m[7]! - m[4]! * m[6]!);
  const d = det(a);
  if (!(Math.abs(d) > 0)) return [0, 0, 0];
  const out: [number, number, number] = [0, 0, 0];
  for (let col = 0; col < 3; col++) {
    const m = [...a];
    for (let row = 0; row < 3; row++) m[row * 3 + col] = b[row]!;
    out[col] = det(m) / d;
  }
  return out;
}
