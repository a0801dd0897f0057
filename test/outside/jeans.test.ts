// Sound speed, Jeans length, the three Jeans-mass conventions and the free-fall time, each
// computed here from its published formula with constants typed in this file:
// Jeans (1902) in the form of Truelove et al. (1997); free-fall time (common practice, e.g. Spitzer 1978);
// virial form from 2K + W = 0 with K = (3/2) N k T and W = -(3/5) G M^2/R (common practice).
import { describe, it, expect } from 'vitest';
import { soundSpeed } from '../../src/physics/sound-speed.js';
import { jeansLength, jeansMass, effectiveSoundSpeed, densityForJeansMass } from '../../src/physics/jeans.js';
import { freeFallTime } from '../../src/physics/free-fall.js';
import { virialParameter, uniformSphereGravitationalEnergy, thermalEnergy } from '../../src/physics/virial.js';

// CODATA 2018 and IAU 2015, typed here independently of src/physics/constants.ts
const G = 6.6743e-8;
const KB = 1.380649e-16;
const MH = 1.6735575e-24;
const MSUN = 1.3271244e26 / 6.6743e-8;
const PC = 3.0856775814913673e18;

const T = 10;
const MU = 2.33;
const N_H2 = 1e4;
const RHO = 2.8 * MH * N_H2; // mu_H2 = 2.8 per H2 molecule (common practice, Kauffmann et al. 2008)

describe('Jeans quantities at T = 10 K, mu = 2.33, n(H2) = 1e4 cm^-3', () => {
  const cs = Math.sqrt((KB * T) / (MU * MH));

  it('isothermal sound speed is sqrt(kT/(mu m_H)) ~ 0.19 km/s', () => {
    expect(soundSpeed(T, MU)).toBeCloseTo(cs, 6);
    expect(soundSpeed(T, MU) / 1e5).toBeCloseTo(0.188, 3); // common practice: ~0.19 km/s at 10 K
  });

  it('Jeans length is sqrt(pi c_s^2/(G rho)) ~ 0.2 pc', () => {
    const l = Math.sqrt((Math.PI * cs * cs) / (G * RHO));
    expect(jeansLength(cs, RHO) / l).toBeCloseTo(1, 12);
    expect(l / PC).toBeGreaterThan(0.15); // from memory: lambda_J ~ 0.2 pc at these conditions
    expect(l / PC).toBeLessThan(0.25);
  });

  it('sphere convention is (pi^(5/2)/6) c^3 G^-3/2 rho^-1/2 = (pi/6) rho lambda^3', () => {
    const m = ((Math.PI ** 2.5) / 6) * cs ** 3 / (G ** 1.5 * Math.sqrt(RHO));
    const l = Math.sqrt((Math.PI * cs * cs) / (G * RHO));
    expect(jeansMass(cs, RHO, 'sphere') / m).toBeCloseTo(1, 12);
    expect(m / ((Math.PI / 6) * RHO * l ** 3)).toBeCloseTo(1, 12);
    expect(m / MSUN).toBeGreaterThan(1); // from memory: ~ a few Msun at 10 K, 1e4 cm^-3
    expect(m / MSUN).toBeLessThan(5);
  });

  it('cube convention is rho lambda_J^3', () => {
    const l = Math.sqrt((Math.PI * cs * cs) / (G * RHO));
    expect(jeansMass(cs, RHO, 'cube') / (RHO * l ** 3)).toBeCloseTo(1, 12);
  });

  it('virial convention is (5kT/(G mu m_H))^(3/2) (3/(4 pi rho))^(1/2)', () => {
    const m = ((5 * KB * T) / (G * MU * MH)) ** 1.5 * Math.sqrt(3 / (4 * Math.PI * RHO));
    expect(jeansMass(cs, RHO, 'virial') / m).toBeCloseTo(1, 12);
  });

  it('free-fall time is sqrt(3 pi/(32 G rho)) ~ 0.3 Myr', () => {
    const t = Math.sqrt((3 * Math.PI) / (32 * G * RHO));
    expect(freeFallTime(RHO) / t).toBeCloseTo(1, 12);
    expect(t / (1e6 * 3.15576e7)).toBeCloseTo(0.31, 1); // from memory: ~0.3 Myr at n(H2) = 1e4
  });

  it('turbulent support adds sigma^2 to c_s^2', () => {
    expect(effectiveSoundSpeed(3, 4)).toBeCloseTo(5, 12); // common practice
  });

  it('densityForJeansMass inverts jeansMass in every convention', () => {
    for (const c of ['sphere', 'cube', 'virial'] as const) {
      const m = jeansMass(cs, RHO, c);
      expect(densityForJeansMass(cs, m, c) / RHO).toBeCloseTo(1, 10);
    }
  });
});

describe('uniform sphere: the three conventions relate as their formulas say', () => {
  const cs = 2e4;
  const rho = 1e-19;
  it('cube / sphere = 6/pi', () => {
    expect(jeansMass(cs, rho, 'cube') / jeansMass(cs, rho, 'sphere')).toBeCloseTo(6 / Math.PI, 12);
  });
  it('virial / sphere = (5/pi)^(3/2) (3/(4 pi))^(1/2) 6/pi', () => {
    const expected = (5 / Math.PI) ** 1.5 * Math.sqrt(3 / (4 * Math.PI)) * (6 / Math.PI);
    expect(jeansMass(cs, rho, 'virial') / jeansMass(cs, rho, 'sphere')).toBeCloseTo(expected, 12);
  });
  it('the virial mass is where 2K + W = 0 for a uniform isothermal sphere', () => {
    // K = (3/2) N k T = (3/2) M c_s^2, W = -(3/5) G M^2 / R, M = (4/3) pi R^3 rho (common practice)
    const m = jeansMass(cs, rho, 'virial');
    const r = Math.cbrt((3 * m) / (4 * Math.PI * rho));
    const k = 1.5 * m * cs * cs;
    const w = (-3 / 5) * G * m * m / r;
    expect((2 * k + w) / Math.abs(w)).toBeCloseTo(0, 5);
    expect(2 * thermalEnergy(m, cs) / Math.abs(uniformSphereGravitationalEnergy(m, r))).toBeCloseTo(1, 5);
  });
  it('virial parameter is 5 sigma^2 R/(G M) (Bertoldi & McKee 1992)', () => {
    expect(virialParameter(1e5, PC, 100 * MSUN)).toBeCloseTo((5 * 1e10 * PC) / (G * 100 * MSUN), 8);
  });
});
