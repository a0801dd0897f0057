// Outside checks of our isothermal Lane–Emden / Bonnor–Ebert solver.
// Sources: Bonnor 1956 (MNRAS 116, 351) and Ebert 1955 (Z. Astrophys. 37, 217) for the critical
// sphere; scipy.integrate.solve_ivp (an independent general-purpose integrator) for psi(xi).
import { describe, it, expect } from 'vitest';
import { pythonJson } from '../helpers/python.js';
import { criticalBonnorEbert, solveLaneEmden, laneEmdenPsi, laneEmdenState, bonnorEbertFromMass, bonnorEbertFromRadius } from '../../src/physics/bonnor-ebert.js';

const G = 6.6743e-8; // CODATA 2018

describe('Bonnor–Ebert critical sphere', () => {
  const crit = criticalBonnorEbert();
  it('has critical xi 6.451 to 0.1% (Bonnor 1956; Ebert 1955)', () => {
    expect(Math.abs(crit.xi / 6.451 - 1)).toBeLessThan(1e-3);
  });
  it('has centre-to-edge contrast 14.04 to 0.1% (Bonnor 1956; Ebert 1955)', () => {
    expect(Math.abs(crit.contrast / 14.04 - 1)).toBeLessThan(1e-3);
  });
  it('has dimensionless mass 1.182 to 0.1% (Bonnor 1956; Ebert 1955)', () => {
    expect(Math.abs(crit.mass / 1.182 - 1)).toBeLessThan(1e-3);
  });
});

describe('isothermal Lane–Emden psi(xi)', () => {
  it('starts flat: psi(0) = 0 and psi ~ xi^2/6 - xi^4/120 near the centre (Chandrasekhar 1939 series)', () => {
    const t = solveLaneEmden(1);
    expect(laneEmdenPsi(t, 0)).toBe(0);
    expect(laneEmdenPsi(t, 0.01)).toBeCloseTo(1e-4 / 6 - 1e-8 / 120, 12);
  });

  it('matches scipy solve_ivp at several radii to 1e-7', () => {
    // Reference: scipy.integrate.solve_ivp (DOP853, rtol 1e-12), started from the series at xi = 1e-6.
    const xs = [0.5, 1, 2, 3, 5, 6.451, 10, 30];
    const py = `import json, numpy as np
from scipy.integrate import solve_ivp
def f(x, y): return [y[1], np.exp(-y[0]) - 2*y[1]/x]
x0 = 1e-6
xs = ${JSON.stringify(xs)}
s = solve_ivp(f, (x0, max(xs)), [x0**2/6, x0/3], method='DOP853', rtol=1e-12, atol=1e-14, t_eval=xs)
print(json.dumps({'psi': s.y[0].tolist(), 'dpsi': s.y[1].tolist()}))`;
    const ref = pythonJson<{ psi: number[]; dpsi: number[] }>(py);
    const t = solveLaneEmden(30);
    xs.forEach((x, n) => {
      expect(Math.abs(laneEmdenPsi(t, x) - ref.psi[n]!)).toBeLessThan(1e-7);
      const [psi, dpsi] = laneEmdenState(t, x);
      expect(Math.abs(psi - ref.psi[n]!)).toBeLessThan(1e-7);
      expect(Math.abs(dpsi - ref.dpsi[n]!)).toBeLessThan(1e-7);
    });
  });
});

describe('Bonnor–Ebert spheres in physical units', () => {
  it('given mass: M = 4 pi rho_c a^3 xi^2 psi\' and R = a xi_max, with the critical contrast', () => {
    const cs = 1.88e4, M = 2e33;
    const s = bonnorEbertFromMass(M, cs);
    const a = cs / Math.sqrt(4 * Math.PI * G * s.centralDensity);
    expect(s.radius / (a * 6.451)).toBeCloseTo(1, 3);
    expect(s.centralDensity / s.edgeDensity).toBeCloseTo(14.04, 1);
    // dimensionless mass m = M G^(3/2) P0^(1/2) / c_s^4 = 1.182 (Bonnor 1956)
    expect((M * G ** 1.5 * Math.sqrt(s.externalPressure)) / cs ** 4).toBeCloseTo(1.182, 2);
  });
  it('given radius: the same sphere comes back', () => {
    const cs = 1.88e4;
    const a = bonnorEbertFromMass(3e33, cs, 8);
    const b = bonnorEbertFromRadius(a.radius, cs, 8);
    expect(b.mass / a.mass).toBeCloseTo(1, 10);
    expect(b.centralDensity / a.centralDensity).toBeCloseTo(1, 10);
  });
  it('rejects a non-positive xi_max', () => {
    expect(() => solveLaneEmden(0)).toThrow(RangeError);
  });
});
