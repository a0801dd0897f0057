// Truelove et al. (1997): a cell of size dx resolves gas up to rho_max = pi c_s^2 / (G (N_J dx)^2)
// with N_J >= 4 cells per Jeans length; lambda_J = sqrt(pi c_s^2/(G rho)) (Jeans 1902 in the
// form Truelove et al. use). Constants typed here: CODATA 2018 (G, k_B), m_H = 1.6735575e-24 g
// (common practice), pc from IAU 2015 (648000/pi au, au exact).
import { describe, it, expect } from 'vitest';
import { maxResolvedDensity } from '../../src/physics/resolution.js';
import { maxResolvedDensityEos } from '../../src/physics/eos-resolution.js';
import { parseConfig } from '../../src/config/load.js';
import { analyticBudget } from '../../src/budget/analytic-budget.js';

const G = 6.6743e-8;
const KB = 1.380649e-16;
const MH = 1.6735575e-24;
const PC = (648000 / Math.PI) * 1.495978707e13;
const T = 10;
const MU = 2.33;
const CS = Math.sqrt((KB * T) / (MU * MH));

function truelove(dx: number, nj: number): number {
  return (Math.PI * CS * CS) / (G * (nj * dx) ** 2); // Truelove et al. 1997
}

describe('max resolved density (Truelove et al. 1997) at 10 K, mu = 2.33', () => {
  for (const dxPc of [0.01, 0.001]) {
    for (const nj of [4, 8, 32]) {
      it(`dx = ${dxPc} pc, N_J = ${nj}: pi c_s^2/(G (N_J dx)^2)`, () => {
        const expected = truelove(dxPc * PC, nj);
        expect(maxResolvedDensity(CS, dxPc * PC, nj) / expected).toBeCloseTo(1, 10);
        // isothermal EOS: the self-consistent solve gives the same value
        expect(maxResolvedDensityEos(CS, dxPc * PC, nj, { kind: 'isothermal' }) / expected).toBeCloseTo(1, 10);
        // the budget's base level for a box of 128 such cells
        const config = parseConfig({
          cloud: { mass: 100, radius: 0.4 * 128 * dxPc, temperature: T, mu: MU },
          grid: { cells: 128, box_size: 128 * dxPc },
          budget: { grid: { cells_per_jeans_length: nj } },
        });
        const b = analyticBudget(config, {
          mass: 100 * 1.989e33, radius: 0.4 * 128 * dxPc * PC, meanDensity: 1e-20, peakDensity: 1e-20, soundSpeed: CS,
          sigma1D: 0, maxSpeed: 0, boxSize: 128 * dxPc * PC, temperature: T, mu: MU,
        });
        expect(b.levels[0]!.cellSize / (dxPc * PC)).toBeCloseTo(1, 12);
        expect(b.levels[0]!.maxResolvedDensity / expected).toBeCloseTo(1, 10);
        // at that density the Jeans length spans exactly N_J cells
        const lambda = Math.sqrt((Math.PI * CS * CS) / (G * expected));
        expect(lambda / (dxPc * PC)).toBeCloseTo(nj, 8);
      });
    }
  }

  it('order of magnitude: dx = 0.01 pc, N_J = 4 resolves n(H2) of a few 1e5 cm^-3 (from memory)', () => {
    const n = truelove(0.01 * PC, 4) / (2.8 * MH);
    expect(n).toBeGreaterThan(1e5);
    expect(n).toBeLessThan(1e6);
  });
});
