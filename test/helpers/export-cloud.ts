/**
 * Test fixture for the export tests: a Cloud built by hand (not by the generator).
 * A Bonnor–Ebert-like sphere rho = rho_c / (1 + (r/a)^2) out to radius R (the softened
 * isothermal sphere, which follows the Bonnor–Ebert profile to within tens of per cent; common
 * practice), in a uniform ambient medium of density rho(R)/contrast at contrast x the temperature.
 * Velocity: solid-body rotation about z plus a small periodic shear (zero net momentum by symmetry).
 * Grid conventions: cubic n^3, C order (i*n + j)*n + k, i along x, cell-centred, box [-L/2, L/2)^3, cgs.
 */
import type { Cloud, CloudSummary } from '../../src/generate/cloud.js';
import { cubicGrid, cellCentre, cellVolume } from '../../src/grid/grid3.js';
import { PC, M_SUN } from '../../src/physics/constants.js';

export interface FixtureOptions {
  n?: number;
  /** Box side, pc. */
  boxPc?: number;
  /** Sphere radius, pc. */
  radiusPc?: number;
  /** Scale length a, pc. */
  corePc?: number;
  /** Central density, g/cm^3. */
  rhoC?: number;
  /** Edge-to-ambient density contrast; Infinity for empty ambient (density 0). */
  contrast?: number;
  magnetic?: boolean;
  seed?: number;
}

/** The profile density at radius r (cm), g/cm^3, without the ambient. */
export function fixtureProfile(r: number, o: Required<FixtureOptions>): number {
  const a = o.corePc * PC.value;
  return r < o.radiusPc * PC.value ? o.rhoC / (1 + (r / a) ** 2) : 0;
}

/** A hand-made Cloud (see the file comment). */
export function fixtureCloud(opts: FixtureOptions = {}): Cloud {
  const o: Required<FixtureOptions> = {
    n: 16, boxPc: 0.4, radiusPc: 0.15, corePc: 0.03, rhoC: 1e-18, contrast: 100, magnetic: true, seed: 11, ...opts,
  };
  const L = o.boxPc * PC.value;
  const grid = cubicGrid(o.n, L);
  const N = o.n ** 3;
  const density = new Float32Array(N);
  const vx = new Float32Array(N), vy = new Float32Array(N), vz = new Float32Array(N);
  const temperature = new Float32Array(N);
  const bx = new Float32Array(N), by = new Float32Array(N), bz = new Float32Array(N);
  const inside = new Uint8Array(N);
  const R = o.radiusPc * PC.value;
  const edge = o.rhoC / (1 + (o.radiusPc / o.corePc) ** 2);
  const ambient = Number.isFinite(o.contrast) ? edge / o.contrast : 0;
  const omega = 1e-13;
  let mass = 0;
  for (let i = 0; i < o.n; i++) {
    const x = cellCentre(i, o.n, L);
    for (let j = 0; j < o.n; j++) {
      const y = cellCentre(j, o.n, L);
      for (let k = 0; k < o.n; k++) {
        const z = cellCentre(k, o.n, L);
        const c = (i * o.n + j) * o.n + k;
        const r = Math.hypot(x, y, z);
        const isIn = r < R;
        inside[c] = isIn ? 1 : 0;
        density[c] = isIn ? fixtureProfile(r, o) : ambient;
        if (isIn) mass += density[c]!;
        temperature[c] = isIn ? 10 : 10 * (Number.isFinite(o.contrast) ? o.contrast : 1);
        vx[c] = -omega * y + 1e4 * Math.sin((2 * Math.PI * z) / L);
        vy[c] = omega * x;
        vz[c] = 3e3 * Math.sin((2 * Math.PI * x) / L);
        bx[c] = 1e-6 * Math.sin((2 * Math.PI * y) / L);
        by[c] = 0;
        bz[c] = 1e-5;
      }
    }
  }
  mass *= cellVolume(grid);
  let all = 0;
  for (let c = 0; c < N; c++) all += density[c]!;
  const summary: CloudSummary = {
    mass, radius: R, temperature: 10, mu: 2.33, meanDensity: mass / ((4 / 3) * Math.PI * R ** 3),
    soundSpeed: 1.9e4, mach: 0.5, sigma1D: 5e3, virialParameter: 0.5, alphaThermal: 0.4, betaRotation: 0.01,
    omega, jeansMass: 1 * M_SUN.value, jeansLength: 0.1 * PC.value, jeansConvention: 'sphere', freeFallTime: 1e13,
    massOnGrid: all * cellVolume(grid), massCorrection: 1, ambientDensity: ambient, ambientTemperature: 10 * o.contrast,
    field: o.magnetic ? 1e-5 : null, massToFluxRelative: null, alfvenMach: null, plasmaBeta: null,
    envelope: 'bonnor-ebert-like (test fixture)', structure: 'none', sigmaS: null, velocitySpectrumIndex: null,
    kMin: null, kMax: null, solenoidalWeight: null, notes: [],
  };
  return {
    grid, density, velocity: [vx, vy, vz], temperature,
    magnetic: o.magnetic ? [bx, by, bz] : null, inside, summary, seed: o.seed,
  };
}
