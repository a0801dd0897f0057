/**
 * Self-gravity of gridded mass distributions against analytic and numerically integrated
 * values. Sources are named beside each check.
 */
import { describe, it, expect } from 'vitest';
import { pythonJson } from '../helpers/python.js';
import { selfGravityEnergy, UNIT_CUBE_MEAN_INVERSE_DISTANCE } from '../../src/survey/self-gravity.js';
import { surveyCloud } from '../../src/survey/survey-cloud.js';
import type { SurveyOptions } from '../../src/survey/types.js';

const G = 6.6743e-8; // CODATA 2018
const K_B = 1.380649e-16; // CODATA 2018 (exact)
const M_H = 1.6735575e-24; // hydrogen atom mass (common practice)

/** Gridded sphere: density profile f(r) (r in cells from the box centre) inside radius R cells, else `outside`. */
function sphere(n: number, R: number, f: (r: number) => number, outside = 0): Float32Array {
  const d = new Float32Array(n ** 3);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
    const x = i + 0.5 - n / 2, y = j + 0.5 - n / 2, z = k + 0.5 - n / 2;
    const r = Math.sqrt(x * x + y * y + z * z);
    d[(i * n + j) * n + k] = r < R ? f(r) : outside;
  }
  return d;
}

describe('self-gravity against the outside world', () => {
  it('uses the mean inverse distance of the unit cube that scipy integrates', () => {
    // Box integral <1/r> over two uniform points in the unit cube, evaluated with scipy.integrate.tplquad
    // using the triangular density of coordinate differences (common practice).
    const v = pythonJson<number>(`import json, numpy as np
from scipy import integrate
f=lambda w,v,u: 8*(1-u)*(1-v)*(1-w)/np.sqrt(u*u+v*v+w*w)
print(json.dumps(integrate.tplquad(f,0,1,0,1,0,1,epsabs=1e-9,epsrel=1e-9)[0]))`);
    expect(Math.abs(UNIT_CUBE_MEAN_INVERSE_DISTANCE - v)).toBeLessThan(1e-7);
  });

  it('gives a gridded uniform sphere at 64^3 within 1 % of -(3/5) G M^2 / R', () => {
    // W = -(3/5) G M^2 / R for a uniform sphere (common practice).
    const n = 64, dx = 1e16, R = 0.4 * n, rho = 1e-19;
    const d = sphere(n, R, () => rho);
    const M = (4 / 3) * Math.PI * (R * dx) ** 3 * rho;
    const w = selfGravityEnergy(d, { nx: n, ny: n, nz: n }, dx, null, 64, 0.01);
    const expected = (-3 / 5) * G * M * M / (R * dx);
    expect(Math.abs(w.energy / expected - 1)).toBeLessThan(0.01);
    expect(w.relativeError).toBeLessThan(0.01);
    // uncoarsened (one cell per coarse cell), the point-mass sum is even closer
    const fine = selfGravityEnergy(d, { nx: n, ny: n, nz: n }, dx, null, 64, 0);
    expect(fine.factor).toBe(1);
    expect(Math.abs(fine.energy / expected - 1)).toBeLessThan(0.003);
  });

  it('matches the 1D integral of a Bonnor-Ebert-like profile rho_c / (1 + (r/r_c)^2)', () => {
    // W = -int_0^R G M(r) 4 pi r rho(r) dr, computed with scipy.integrate.quad (common practice;
    // the profile is the usual analytic stand-in for the Bonnor 1956 / Ebert 1955 sphere).
    const n = 64, R = 0.4 * n, rc = 0.25 * R, dx = 1e16, rhoc = 1e-18;
    const d = sphere(n, R, (r) => rhoc / (1 + (r / rc) ** 2));
    let mGrid = 0;
    for (const x of d) mGrid += x * dx ** 3;
    const ref = pythonJson<{ w: number; m: number }>(`import json, numpy as np
from scipy import integrate
G=6.6743e-8; R=${R * dx}; rc=${rc * dx}; rhoc=${rhoc}
rho=lambda r: rhoc/(1+(r/rc)**2)
M=lambda r: integrate.quad(lambda s: 4*np.pi*s*s*rho(s), 0, r, epsrel=1e-12)[0]
w=-integrate.quad(lambda r: G*M(r)*4*np.pi*r*rho(r), 0, R, epsrel=1e-10, limit=200)[0]
print(json.dumps({'w': w, 'm': M(R)}))`);
    const w = selfGravityEnergy(d, { nx: n, ny: n, nz: n }, dx, null, 64, 0.01).energy;
    // scale by the gridded mass so the staircase edge does not count twice: W ~ M^2
    const expected = ref.w * (mGrid / ref.m) ** 2;
    expect(Math.abs(mGrid / ref.m - 1)).toBeLessThan(0.01);
    expect(Math.abs(w / expected - 1)).toBeLessThan(0.01);
  });

  it('gives 2K/|W| of a uniform isothermal sphere from the node sums as K = (3/2) N k T, W = -(3/5) G M^2/R predict', () => {
    // Virial ratio of a uniform isothermal sphere, K = (3/2) N k_B T, W = -(3/5) G M^2 / R (common practice).
    const n = 64, R = 0.4 * n, dx = 2e15, rho = 3.82e-18, T = 10, mu = 2.33;
    const d = sphere(n, R, () => rho, rho / 100);
    const options: SurveyOptions = {
      jeansConvention: 'sphere', turbulentSupport: false, requireBound: false, connectivity: 6, minCells: 27, minContrast: 0.5,
      minMass: 0, floorDensity: rho / 50, gravityCells: 64, coreToStarEfficiency: 0.3, mach: null, velocitySpectrumIndex: null,
    };
    return surveyCloud({ grid: { nx: n, ny: n, nz: n, boxSize: n * dx }, density: d, temperature: T, mu }, options).then((r) => {
      expect(r.nodes.length).toBe(1);
      const node = r.nodes[0]!;
      let cells = 0;
      for (const x of d) if (x === Math.fround(rho)) cells++;
      const M = cells * Math.fround(rho) * dx ** 3;
      const radius = R * dx;
      const K = 1.5 * (M / (mu * M_H)) * K_B * T;
      const W = (3 / 5) * G * ((4 / 3) * Math.PI * radius ** 3 * rho) ** 2 / radius;
      expect(Math.abs(node.mass / M - 1)).toBeLessThan(1e-9);
      const ratio = (2 * node.thermalEnergy) / Math.abs(node.gravitationalEnergy);
      expect(Math.abs(ratio / ((2 * K) / W) - 1)).toBeLessThan(0.01);
    });
  });
});
