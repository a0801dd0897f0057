// gridResolution: per-cell Jeans number J = dx / lambda_J with lambda_J = sqrt(pi c_s^2/(G rho))
// (Truelove et al. 1997), computed here from constants typed in the test (CODATA 2018, m_H common practice).
import { describe, it, expect } from 'vitest';
import { gridResolution } from '../src/budget/grid-resolution.js';
import { jeansHistogram } from '../src/report/grid-histograms.js';

const G = 6.6743e-8;
const KB = 1.380649e-16;
const MH = 1.6735575e-24;
const PC = (648000 / Math.PI) * 1.495978707e13;
const ISO = { kind: 'isothermal' } as const;
const jOf = (dx: number, rho: number, t: number, mu = 2.33) => dx / Math.sqrt((Math.PI * KB * t / (mu * MH)) / (G * rho));

describe('gridResolution', () => {
  it('one cell: J from the formula, 1/J cells per Jeans length', () => {
    const g = { nx: 1, ny: 1, nz: 1, boxSize: 0.1 * PC };
    const r = gridResolution(g, Float32Array.of(1e-18), 10, 2.33, ISO, 4);
    expect(r.jeansNumber[0]! / jOf(0.1 * PC, 1e-18, 10)).toBeCloseTo(1, 6);
    expect(r.jeansCellsMin * jOf(0.1 * PC, 1e-18, 10)).toBeCloseTo(1, 6);
  });

  it('all-zero density: nothing unresolved, cells per Jeans length unbounded', () => {
    const g = { nx: 2, ny: 2, nz: 2, boxSize: PC };
    const r = gridResolution(g, new Float32Array(8), 10, 2.33, ISO, 4);
    expect(r.unresolvedMassFraction).toBe(0);
    expect(r.cellsNeedingRefinement).toBe(0);
    expect(r.jeansCellsMin).toBe(Infinity);
  });

  it('all equal: either every cell is unresolved or none', () => {
    const g = { nx: 4, ny: 4, nz: 4, boxSize: PC };
    const dx = PC / 4;
    const rhoEdge = (Math.PI * KB * 10 / (2.33 * MH)) / (G * (4 * dx) ** 2); // J = 1/4 here
    const lo = gridResolution(g, new Float32Array(64).fill(rhoEdge * 0.5), 10, 2.33, ISO, 4);
    const hi = gridResolution(g, new Float32Array(64).fill(rhoEdge * 2), 10, 2.33, ISO, 4);
    expect(lo.unresolvedMassFraction).toBe(0);
    expect(hi.unresolvedMassFraction).toBe(1);
    expect(hi.cellsNeedingRefinement).toBe(64);
  });

  it('a dense spot on a 16^3 grid: unresolved mass fraction = mass in cells with J > 1/N_J over total', () => {
    const n = 16;
    const g = { nx: n, ny: n, nz: n, boxSize: 2 * PC };
    const dx = 2 * PC / n;
    const rho = new Float32Array(n ** 3);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
      const r2 = (i - 8) ** 2 + (j - 8) ** 2 + (k - 8) ** 2;
      rho[(i * n + j) * n + k] = 1e-22 * (1 + 1e4 * Math.exp(-r2 / 4));
    }
    const r = gridResolution(g, rho, 10, 2.33, ISO, 8);
    let m = 0; let mu = 0; let c = 0; let maxJ = 0;
    for (const v of rho) {
      const j = jOf(dx, v, 10);
      m += v; maxJ = Math.max(maxJ, j);
      if (j > 1 / 8) { mu += v; c++; }
    }
    expect(c).toBeGreaterThan(0);
    expect(c).toBeLessThan(n ** 3);
    expect(r.cellsNeedingRefinement).toBe(c);
    expect(r.unresolvedMassFraction).toBeCloseTo(mu / m, 6);
    expect(r.jeansCellsMin * maxJ).toBeCloseTo(1, 5);
  });

  it('a per-cell temperature is the gas temperature: the EOS is not applied to it again', () => {
    const g = { nx: 1, ny: 1, nz: 3, boxSize: 1e16 };
    const rho = Float32Array.of(1e-14, 1e-13, 1e-12);
    const t = Float32Array.of(10, 20, 10);
    const eos = { kind: 'barotropic', criticalDensity: 1e-13, gamma: 1.4 } as const;
    const r = gridResolution(g, rho, t, 2.33, eos, 4);
    for (let i = 0; i < 3; i++) expect(r.jeansNumber[i]! / jOf(1e16, rho[i]!, t[i]!)).toBeCloseTo(1, 5);
  });

  it('a scalar base temperature follows the barotropic EOS: T = T0 (1 + (rho/rho_c)^(gamma-1)) (common practice form)', () => {
    const g = { nx: 1, ny: 1, nz: 3, boxSize: 1e16 };
    const rho = Float32Array.of(1e-14, 1e-13, 1e-12);
    const eos = { kind: 'barotropic', criticalDensity: 1e-13, gamma: 1.4 } as const;
    const r = gridResolution(g, rho, 10, 2.33, eos, 4);
    for (let i = 0; i < 3; i++) {
      const tt = 10 * (1 + (rho[i]! / 1e-13) ** 0.4);
      expect(r.jeansNumber[i]! / jOf(1e16, rho[i]!, tt)).toBeCloseTo(1, 5);
    }
  });

  it('rejects a density of the wrong length', () => {
    expect(() => gridResolution({ nx: 2, ny: 2, nz: 2, boxSize: 1 }, new Float32Array(7), 10, 2.33, ISO, 4)).toThrow(RangeError);
  });
});

describe('gridResolution: recorded Jeans-number range', () => {
  it('is the smallest and largest stored J over 0 < J < Infinity, and the histogram from it equals the one from a range pass', () => {
    const n = 16;
    const g = { nx: n, ny: n, nz: n, boxSize: 3e18 };
    const density = new Float32Array(n ** 3).map((_, i) => (i % 97 === 0 ? 0 : 1e-20 * (1 + ((i * 7919) % 1000))));
    const temperature = new Float32Array(n ** 3).map((_, i) => (i % 89 === 0 ? 0 : 10 + (i % 13)));
    const res = gridResolution(g, density, temperature, 2.33, { kind: 'isothermal' }, 4);
    let lo = Infinity, hi = -Infinity;
    for (const v of res.jeansNumber) if (v > 0 && v !== Infinity) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
    expect(res.jeansNumberRange).toEqual([lo, hi]);
    expect(jeansHistogram(res, 4)).toEqual(jeansHistogram({ jeansNumber: res.jeansNumber }, 4));
  });
});
