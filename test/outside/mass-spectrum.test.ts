/**
 * Mass spectra: the maximum-likelihood power-law fit (Clauset, Shalizi & Newman 2009) on a
 * Salpeter (1955) sample, and the published shapes of the model mass functions.
 */
import { describe, it, expect } from 'vitest';
import { fitPowerLaw } from '../../src/survey/power-law-fit.js';
import { padoanNordlundCmf, padoanNordlundSlope, kroupaImf, chabrierImf, salpeterImf, energySpectrumIndex } from '../../src/physics/mass-functions.js';

/** Seeded uniform numbers in (0, 1) (LCG). */
function uniforms(n: number, seed: number): number[] {
  let s = seed >>> 0;
  return Array.from({ length: n }, () => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return (s + 0.5) / 2 ** 32; });
}
const logSlope = (f: (m: number) => number, m: number) => (Math.log(f(m * 1.01)) - Math.log(f(m / 1.01))) / (2 * Math.log(1.01));

describe('power-law fit', () => {
  it('recovers the Salpeter slope 2.35 within its stated error from a Salpeter sample', () => {
    // Salpeter 1955: dN/dm ~ m^-2.35; sample by inverse transform m = (1 - u)^(-1/(alpha - 1)) above 1.
    const alpha = 2.35;
    const masses = uniforms(2000, 2024).map((u) => (1 - u) ** (-1 / (alpha - 1)));
    const fit = fitPowerLaw(masses)!;
    expect(fit).not.toBeNull();
    expect(Math.abs(fit.slope - alpha)).toBeLessThan(fit.slopeError);
    // Clauset et al. 2009 eq. 3.2: error (alpha - 1)/sqrt(n)
    expect(fit.slopeError).toBeCloseTo((fit.slope - 1) / Math.sqrt(fit.nTail), 12);
  });

  it('finds x_min at the break of a sample that is flat below it', () => {
    // Clauset et al. 2009 section 3.3: x_min by smallest KS distance.
    const u = uniforms(3000, 7);
    const masses = u.map((x, i) => (i % 3 === 0 ? 0.1 + 0.9 * x : (1 - x) ** (-1 / 1.35)));
    const fit = fitPowerLaw(masses)!;
    expect(fit.xmin).toBeGreaterThan(0.8);
    expect(fit.xmin).toBeLessThan(1.3);
    expect(Math.abs(fit.slope - 2.35)).toBeLessThan(2 * fit.slopeError);
  });

  it('gives no fit for fewer than 10 masses, and ignores non-positive ones', () => {
    expect(fitPowerLaw([])).toBeNull();
    expect(fitPowerLaw([1, 2, 3, 4, 5, 6, 7, 8, 9])).toBeNull();
    expect(fitPowerLaw([0, -1, 1, 2, 3, 4, 5, 6, 7, 8, 9])).toBeNull();
  });
});

describe('model mass functions', () => {
  it('Padoan & Nordlund 2002: high-mass slope of dN/dlog m is 3/(4 - beta)', () => {
    // Padoan & Nordlund 2002, eq. 24: N(m) dln m ~ m^(-3/(4-beta)) at masses well above the Jeans mass.
    for (const beta of [1.74, 1.9, 2]) {
      expect(padoanNordlundSlope(beta)).toBeCloseTo(3 / (4 - beta), 14);
      expect(-logSlope((m) => padoanNordlundCmf(m, 10, beta), 1e4)).toBeCloseTo(3 / (4 - beta), 4);
    }
    // beta = 1.74 gives 1.33, close to Salpeter's 1.35 (Padoan & Nordlund 2002)
    expect(padoanNordlundSlope(1.74)).toBeCloseTo(1.327, 3);
    // E(k) = 4 pi k^2 P(k): P(k) ~ k^-4 (Burgers) gives beta = 2 (common practice)
    expect(energySpectrumIndex(4)).toBe(2);
    // the turnover: far below the Jeans mass few cores are unstable
    const x = 3 / (4 - 1.9);
    expect(padoanNordlundCmf(0.01, 10, 1.9) / 0.01 ** -x).toBeLessThan(1e-3);
    expect(padoanNordlundCmf(100, 10, 1.9) / 100 ** -x).toBeGreaterThan(0.99);
  });

  it('Salpeter 1955 and Kroupa 2001 have their published slopes', () => {
    expect(logSlope(salpeterImf, 3)).toBeCloseTo(1 - 2.35, 6);
    // Kroupa 2001 eq. 2: alpha = 0.3, 1.3, 2.3 (dN/dm), i.e. 0.7, -0.3, -1.3 in dN/dlog m
    expect(logSlope(kroupaImf, 0.03)).toBeCloseTo(0.7, 6);
    expect(logSlope(kroupaImf, 0.2)).toBeCloseTo(-0.3, 6);
    expect(logSlope(kroupaImf, 5)).toBeCloseTo(-1.3, 6);
    // continuous at the breaks
    expect(kroupaImf(0.08 * 1.0000001) / kroupaImf(0.08 / 1.0000001)).toBeCloseTo(1, 5);
    expect(kroupaImf(0.5 * 1.0000001) / kroupaImf(0.5 / 1.0000001)).toBeCloseTo(1, 5);
  });

  it('Chabrier 2003 peaks at 0.079 Msun (single) and 0.22 Msun (system) and falls as m^-1.3 above 1 Msun', () => {
    // Chabrier 2003, Table 1 (values from memory).
    expect(logSlope((m) => chabrierImf(m, 'single'), 0.079)).toBeCloseTo(0, 6);
    expect(logSlope((m) => chabrierImf(m, 'system'), 0.22)).toBeCloseTo(0, 6);
    expect(logSlope((m) => chabrierImf(m, 'single'), 5)).toBeCloseTo(-1.3, 6);
    // the tabulated high-mass coefficient 4.43e-2 agrees with continuity at 1 Msun within a few per cent
    expect(Math.abs(chabrierImf(2, 'single') / (4.43e-2 * 2 ** -1.3) - 1)).toBeLessThan(0.05);
  });
});
