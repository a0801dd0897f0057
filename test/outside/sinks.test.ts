// Federrath et al. (2010): sink accretion radius r_acc ~ 2.5 dx_min and density threshold
// rho_sink = pi c_s^2 / (4 G r_acc^2) (the density where the Jeans length equals 2 r_acc).
// Barotropic temperature T0 [1 + (rho/rho_c)^(gamma-1)]: common practice form after
// Masunaga & Inutsuka (2000). Constants typed here: CODATA 2018, m_H common practice, IAU 2015 pc.
import { describe, it, expect } from 'vitest';
import { parseConfig } from '../../src/config/load.js';
import { analyticBudget } from '../../src/budget/analytic-budget.js';
import { sinkThresholdDensityEos } from '../../src/physics/eos-resolution.js';

const G = 6.6743e-8;
const KB = 1.380649e-16;
const MH = 1.6735575e-24;
const PC = (648000 / Math.PI) * 1.495978707e13;
const T = 10;
const MU = 2.33;
const CS = Math.sqrt((KB * T) / (MU * MH));

function budgetFor(levels: number, eos: Record<string, unknown> = {}) {
  const config = parseConfig({
    cloud: { mass: 100, radius: 0.5, temperature: T, mu: MU, eos },
    grid: { cells: 64, box_size: 1.28 },
    budget: { grid: { levels } },
  });
  return analyticBudget(config, {
    mass: 100 * 1.989e33, radius: 0.5 * PC, meanDensity: 1e-20, peakDensity: 1e-20, soundSpeed: CS,
    sigma1D: 0, maxSpeed: 0, boxSize: 1.28 * PC, temperature: T, mu: MU,
  });
}

describe('sink particles (Federrath et al. 2010)', () => {
  for (const levels of [0, 3, 7]) {
    it(`r_acc = 2.5 finest cells and threshold pi c_s^2/(4 G r_acc^2) with ${levels} levels`, () => {
      const dx = (1.28 * PC) / 64 / 2 ** levels;
      const r = 2.5 * dx; // Federrath et al. 2010
      const rho = (Math.PI * CS * CS) / (4 * G * r * r); // Federrath et al. 2010
      const b = budgetFor(levels);
      expect(b.sinkRadius / r).toBeCloseTo(1, 12);
      expect(b.sinkThreshold / rho).toBeCloseTo(1, 10);
      // with N_J = 4 the threshold lies below the density the finest cells resolve (Truelove et al. 1997)
      expect(b.sinkThreshold).toBeLessThan(b.maxResolvedDensity);
    });
  }

  it('with a barotropic EOS the threshold is solved at the temperature the gas has there', () => {
    const rhoC = 1e-13;
    const gamma = 1.4;
    const r = 5 * 1.495978707e13; // 5 au, small enough to reach the stiff regime
    const rho = sinkThresholdDensityEos(CS, r, { kind: 'barotropic', criticalDensity: rhoC, gamma });
    const t = T * (1 + (rho / rhoC) ** (gamma - 1)); // common practice form (Masunaga & Inutsuka 2000)
    const c = Math.sqrt((KB * t) / (MU * MH));
    expect(rho / ((Math.PI * c * c) / (4 * G * r * r))).toBeCloseTo(1, 8);
    expect(rho).toBeGreaterThan((Math.PI * CS * CS) / (4 * G * r * r));
  });
});
