// Bate & Burkert (1997): a particle code resolves masses above ~ 2 N_neigh m_particle, so it
// resolves gas up to the density where the Jeans mass falls to that mass. Jeans mass of a sphere
// of diameter lambda_J: (pi^(5/2)/6) c_s^3 G^(-3/2) rho^(-1/2) (the form used by Bate & Burkert 1997).
// Smoothing length h = eta (m/rho)^(1/3), eta = 1.2 (Price 2012). Constants typed here: CODATA 2018,
// m_H common practice, IAU 2015 solar mass (GM_sun/G).
import { describe, it, expect } from 'vitest';
import { parseConfig } from '../../src/config/load.js';
import { analyticBudget } from '../../src/budget/analytic-budget.js';

const G = 6.6743e-8;
const KB = 1.380649e-16;
const MH = 1.6735575e-24;
const MSUN = 1.3271244e26 / 6.6743e-8;
const PC = (648000 / Math.PI) * 1.495978707e13;
const T = 10;
const MU = 2.33;
const CS = Math.sqrt((KB * T) / (MU * MH));

function budget(count: number, eos: Record<string, unknown> = {}, extra: Record<string, unknown> = {}) {
  const config = parseConfig({
    cloud: { mass: 1000, radius: 1, temperature: T, mu: MU, eos },
    budget: { code: 'particles', particles: { count, neighbours: 50 }, ...extra },
  });
  return analyticBudget(config, {
    mass: 1000 * MSUN, radius: PC, meanDensity: 1.6e-20, peakDensity: 1.6e-20, soundSpeed: CS,
    sigma1D: 0, maxSpeed: 0, boxSize: 2.5 * PC, temperature: T, mu: MU,
  });
}

describe('particle resolution (Bate & Burkert 1997): 1000 Msun in 1e6 particles, N_neigh = 50', () => {
  const m = (1000 * MSUN) / 1e6;
  const mres = 2 * 50 * m; // Bate & Burkert 1997
  // (pi^(5/2)/6) c^3 G^-3/2 rho^-1/2 = mres  =>  rho = ((pi^(5/2)/6) c^3 G^-3/2 / mres)^2
  const rho = (((Math.PI ** 2.5) / 6) * CS ** 3 * G ** -1.5 / mres) ** 2;

  it('max resolved density is where the Jeans mass equals 2 N_neigh m_particle', () => {
    const b = budget(1e6);
    expect(b.maxResolvedDensity / rho).toBeCloseTo(1, 8);
    expect(b.levels[0]!.jeansMass / mres).toBeCloseTo(1, 12);
    // smoothing length there, Price (2012)
    expect(b.levels[0]!.cellSize / (1.2 * Math.cbrt(m / rho))).toBeCloseTo(1, 8);
  });

  it('the particles needed for that density are 1e6 (the smallest that meets it)', () => {
    const b = budget(1e6, {}, { target_density: rho * (1 - 1e-9) });
    expect(b.particlesForTarget).toBe(1e6);
  });

  it('with a barotropic EOS the Jeans mass is taken at the temperature the gas has at that density', () => {
    const rhoC = 3e-16; // low stiffening density so the particle limit falls in the stiff regime
    const b = budget(1e6, { kind: 'barotropic', critical_density: '3e-16 g cm^-3', gamma: 1.4 });
    const r = b.maxResolvedDensity;
    const t = T * (1 + (r / rhoC) ** 0.4); // common practice form (Masunaga & Inutsuka 2000)
    const c = Math.sqrt((KB * t) / (MU * MH));
    const mj = ((Math.PI ** 2.5) / 6) * c ** 3 * G ** -1.5 / Math.sqrt(r);
    expect(mj / mres).toBeCloseTo(1, 6);
    expect(r).toBeGreaterThan(rho);
  });
});
