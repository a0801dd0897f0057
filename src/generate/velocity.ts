/**
 * The cloud's velocity: turbulence (spectrum, Helmholtz mix, normalisation, zero net momentum
 * and optionally zero net angular momentum) and solid-body rotation.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, flat index
 * (i*ny + j)*nz + k, i along x, cell-centred, box [-L/2, L/2)^3; velocities Float32 in cm/s.
 * The ambient gas is at rest: velocities are set only in cloud cells (inside = 1).
 * Order: modes (modes.ts) -> inverse real FFTs -> zero outside -> subtract the mass-weighted
 * mean (zero net momentum) -> optionally subtract the best-fitting rigid rotation about the
 * centre of mass, omega = I^-1 L (zero net angular momentum) -> scale so the mass-weighted rms
 * 3D speed over the cloud is the target. Rotation is added afterwards about the centre of mass.
 */
import type { Grid3 } from '../grid/grid3.js';
import { cellVolume } from '../grid/grid3.js';
import { forCellBlocks } from '../grid/cell-blocks.js';
import type { WorkerPool } from '../grid/pool.js';
import { realInverse3Parallel } from '../grid/fft3-parallel.js';
import { fillVelocityComponent, type VelocityModeParams } from './modes.js';
import { angularMoments, axisCentres, solve3 } from './moments.js';

type Vec3Field = readonly [Float32Array, Float32Array, Float32Array];

/** Fills v with the raw turbulent field (unnormalised) on the cloud, one component at a time through `spec`, a scratch half spectrum (overwritten). */
export async function rawTurbulence(g: Grid3, pool: WorkerPool | null, p: VelocityModeParams, spec: Float64Array, v: Vec3Field, onStep: () => void): Promise<void> {
  for (const a of [0, 1, 2] as const) {
    if (pool) await pool.runRanges('genVelocityComponent', g.nx, [spec, a, g, p]);
    else fillVelocityComponent(0, g.nx, spec, a, g, p);
    await realInverse3Parallel(pool, spec, g, v[a], p.kMax);
    onStep();
  }
}

/**
 * Zeroes v outside the cloud and subtracts the mass-weighted mean velocity of the cloud (cm/s).
 * Returns the mass-weighted rms speed (cm/s) of the result, as rmsSpeed would compute it.
 * One pass zeroes and sums (the sums of velocityMoments, same order), one subtracts and sums again.
 * Each pass runs through a block kernel (src/grid/cell-blocks.ts): the same additions in the same order.
 */
export function removeNetMomentum(g: Grid3, density: Float32Array, inside: Uint8Array, v: Vec3Field): number {
  const n = inside.length;
  const sums = new Float64Array(4); // m, px, py, pz
  forCellBlocks(n, (a, b) => momentumSums(a, b, density, inside, v[0], v[1], v[2], sums));
  const dv = cellVolume(g);
  const mass = sums[0]! * dv;
  if (!(mass > 0)) return 0;
  const mx = (sums[1]! * dv) / mass, my = (sums[2]! * dv) / mass, mz = (sums[3]! * dv) / mass;
  const after = new Float64Array(2); // m, sum rho v^2
  forCellBlocks(n, (a, b) => subtractMean(a, b, density, inside, v[0], v[1], v[2], mx, my, mz, after));
  const mass2 = after[0]! * dv;
  return mass2 > 0 ? Math.sqrt((after[1]! * dv) / mass2) : 0;
}

/** Zeroes v outside the cloud in cells [a, b) and adds rho, rho v to sums (m, px, py, pz). */
function momentumSums(a: number, b: number, density: Float32Array, inside: Uint8Array, vx: Float32Array, vy: Float32Array, vz: Float32Array, sums: Float64Array): void {
  let m = sums[0]!, px = sums[1]!, py = sums[2]!, pz = sums[3]!;
  for (let c = a; c < b; c++) {
    if (!inside[c]) { vx[c] = 0; vy[c] = 0; vz[c] = 0; continue; }
    const rho = density[c]!;
    m += rho;
    px += rho * vx[c]!;
    py += rho * vy[c]!;
    pz += rho * vz[c]!;
  }
  sums[0] = m; sums[1] = px; sums[2] = py; sums[3] = pz;
}

/** Subtracts (mx, my, mz) from v in cloud cells [a, b) and adds rho, rho |v|^2 of the stored values to sums (m, e). */
function subtractMean(a: number, b: number, density: Float32Array, inside: Uint8Array, vx: Float32Array, vy: Float32Array, vz: Float32Array, mx: number, my: number, mz: number, sums: Float64Array): void {
  let m2 = sums[0]!, e = sums[1]!;
  for (let c = a; c < b; c++) {
    if (!inside[c]) continue;
    // the Float32 values that are stored, as velocityMoments would read them back
    const p = Math.fround(vx[c]! - mx), q = Math.fround(vy[c]! - my), d = Math.fround(vz[c]! - mz);
    vx[c] = p; vy[c] = q; vz[c] = d;
    const rho = density[c]!;
    m2 += rho;
    e += rho * (p * p + q * q + d * d);
  }
  sums[0] = m2; sums[1] = e;
}

/** Adds omega x (r - centre) to v in cloud cells; omega in s^-1 (vector), centre in cm. */
export function addRigidRotation(g: Grid3, inside: Uint8Array, v: Vec3Field, omega: readonly number[], centre: readonly number[]): void {
  const { nx, ny, nz, boxSize: L } = g;
  const xs = axisCentres(nx, L), ys = axisCentres(ny, L), zs = axisCentres(nz, L);
  const [wx, wy, wz] = omega as [number, number, number];
  for (let i = 0, c = 0; i < nx; i++) {
    const x = xs[i]! - centre[0]!;
    for (let j = 0; j < ny; j++) {
      const y = ys[j]! - centre[1]!;
      for (let k = 0; k < nz; k++, c++) {
        if (!inside[c]) continue;
        const z = zs[k]! - centre[2]!;
        v[0][c] = v[0][c]! + (wy * z - wz * y);
        v[1][c] = v[1][c]! + (wz * x - wx * z);
        v[2][c] = v[2][c]! + (wx * y - wy * x);
      }
    }
  }
}

/** Removes the rigid rotation that carries the cloud's angular momentum about its centre of mass (cm). */
export function removeNetAngularMomentum(g: Grid3, density: Float32Array, inside: Uint8Array, v: Vec3Field, centre: readonly number[]): void {
  const { l, inertia } = angularMoments(g, density, inside, v, centre);
  const w = solve3(inertia, l);
  addRigidRotation(g, inside, v, w.map((x) => -x), centre);
}

/** Multiplies v by factor in cloud cells. */
export function scaleVelocity(inside: Uint8Array, v: Vec3Field, factor: number): void {
  scaleVelocityCells(0, inside.length, inside, v[0], v[1], v[2], factor);
}

/** Multiplies cells [start, end) of vx, vy, vz by factor where inside = 1 (a worker task: per cell, split-independent). */
export function scaleVelocityCells(start: number, end: number, inside: Uint8Array, vx: Float32Array, vy: Float32Array, vz: Float32Array, factor: number): void {
  for (let c = start; c < end; c++) {
    if (!inside[c]) continue;
    vx[c] = vx[c]! * factor; vy[c] = vy[c]! * factor; vz[c] = vz[c]! * factor;
  }
}

/** Moment of inertia, g cm^2, of the cloud about the axis (unit vector) through centre (cm). */
export function momentOfInertia(g: Grid3, density: Float32Array, inside: Uint8Array, axis: readonly number[], centre: readonly number[]): number {
  const { nx, ny, nz, boxSize: L } = g;
  const xs = axisCentres(nx, L), ys = axisCentres(ny, L), zs = axisCentres(nz, L);
  const [ax, ay, az] = axis as [number, number, number];
  let s = 0;
  for (let i = 0, c = 0; i < nx; i++) {
    const x = xs[i]! - centre[0]!;
    for (let j = 0; j < ny; j++) {
      const y = ys[j]! - centre[1]!;
      for (let k = 0; k < nz; k++, c++) {
        if (!inside[c]) continue;
        const z = zs[k]! - centre[2]!;
        const along = x * ax + y * ay + z * az;
        s += density[c]! * (x * x + y * y + z * z - along * along);
      }
    }
  }
  return s * cellVolume(g);
}
