// analyticBudget: levels and particles needed are the smallest that meet the target, verdicts,
// and the cost arithmetic. Expected values are computed here from the published formulas
// (Truelove et al. 1997; Bate & Burkert 1997; Courant-Friedrichs-Lewy step, common practice).
import { describe, it, expect } from 'vitest';
import { parseConfig } from '../src/config/load.js';
import { analyticBudget } from '../src/budget/analytic-budget.js';
import type { BudgetCloud } from '../src/budget/types.js';

const G = 6.6743e-8;
const KB = 1.380649e-16;
const MH = 1.6735575e-24;
const PC = (648000 / Math.PI) * 1.495978707e13;
const MSUN = 1.3271244e26 / 6.6743e-8;
const CS = Math.sqrt((KB * 10) / (2.33 * MH));

const cloud = (over: Partial<BudgetCloud> = {}): BudgetCloud => ({
  mass: 100 * MSUN, radius: 0.5 * PC, meanDensity: 1e-20, peakDensity: 1e-20, soundSpeed: CS,
  sigma1D: 0, maxSpeed: 0, boxSize: 1.28 * PC, temperature: 10, mu: 2.33, ...over,
});
const cfg = (budget: Record<string, unknown>, cloudOver: Record<string, unknown> = {}) => parseConfig({
  cloud: { mass: 100, radius: 0.5, temperature: 10, mu: 2.33, ...cloudOver },
  grid: { cells: 64, box_size: 1.28 },
  budget,
});
const rhoAt = (level: number, nj = 4, ratio = 2) => (Math.PI * CS * CS) / (G * (nj * (1.28 * PC) / 64 / ratio ** level) ** 2);

describe('levels needed (Truelove et al. 1997)', () => {
  for (const target of [1e-21, 3e-17, 1e-15, 1e-13, 2.2e-11]) {
    it(`are the smallest that reach ${target} g/cm^3; one fewer does not`, () => {
      const b = analyticBudget(cfg({ target_density: target }), cloud());
      let expected = 0;
      while (rhoAt(expected) < target) expected++;
      expect(b.levelsNeeded).toBe(expected);
      expect(b.levelsForTarget).toBe(expected);
      expect(rhoAt(expected)).toBeGreaterThanOrEqual(target);
      if (expected > 0) expect(rhoAt(expected - 1)).toBeLessThan(target);
    });
  }

  it('with refinement ratio 4 and N_J = 8 likewise', () => {
    const b = analyticBudget(cfg({ target_density: 1e-14, grid: { refinement_ratio: 4, cells_per_jeans_length: 8 } }), cloud());
    let expected = 0;
    while (rhoAt(expected, 8, 4) < 1e-14) expected++;
    expect(b.levelsNeeded).toBe(expected);
    expect(rhoAt(expected - 1, 8, 4)).toBeLessThan(1e-14);
  });

  it('with a barotropic EOS fewer levels suffice than isothermal (warmer gas, longer Jeans length)', () => {
    const iso = analyticBudget(cfg({ target_density: 1e-11 }), cloud());
    const baro = analyticBudget(cfg({ target_density: 1e-11 }, { eos: { kind: 'barotropic' } }), cloud());
    expect(baro.levelsNeeded!).toBeLessThan(iso.levelsNeeded!);
    expect(baro.levels[0]!.maxResolvedDensity).toBeGreaterThanOrEqual(iso.levels[0]!.maxResolvedDensity);
  });

  it('min_fragment_mass: levels reach the density where the Jeans mass (sphere) equals it', () => {
    const mmin = 0.05 * MSUN;
    const b = analyticBudget(cfg({ target_density: 1e-21, min_fragment_mass: 0.05 }), cloud());
    const rho = (((Math.PI ** 2.5) / 6) * CS ** 3 * G ** -1.5 / mmin) ** 2; // Jeans mass of a sphere of diameter lambda_J
    expect(b.minMassDensity! / rho).toBeCloseTo(1, 8);
    let expected = 0;
    while (rhoAt(expected) < rho) expected++;
    expect(b.levelsForMinMass).toBe(expected);
    expect(b.levelsNeeded).toBe(expected);
  });

  it('default target is the EOS stiffening density', () => {
    const b = analyticBudget(cfg({}), cloud());
    expect(b.targetDensity).toBe(1e-13);
  });
});

describe('particles needed (Bate & Burkert 1997)', () => {
  it('for min_fragment_mass are the smallest N with 2 N_neigh M / N <= M_min', () => {
    const b = analyticBudget(cfg({ code: 'particles', min_fragment_mass: 0.03, particles: { neighbours: 64 } }), cloud());
    const m = 100 * MSUN;
    const mmin = 0.03 * MSUN;
    const n = b.particlesForMinMass!;
    expect((2 * 64 * m) / n).toBeLessThanOrEqual(mmin * (1 + 1e-12));
    expect((2 * 64 * m) / (n - 1)).toBeGreaterThan(mmin);
  });
});

describe('verdict', () => {
  it('resolved / marginal / not resolved from the deciding density ratio', () => {
    const lv = 3;
    expect(analyticBudget(cfg({ target_density: rhoAt(lv) * 0.9, grid: { levels: lv } }), cloud()).verdict.status).toBe('resolved');
    expect(analyticBudget(cfg({ target_density: rhoAt(lv) * 2, grid: { levels: lv } }), cloud()).verdict.status).toBe('marginal');
    const bad = analyticBudget(cfg({ target_density: rhoAt(lv) * 100, grid: { levels: lv } }), cloud());
    expect(bad.verdict.status).toBe('not resolved');
    expect(bad.verdict.reason).toMatch(/short/);
  });

  it('N_J below 4 is not resolved whatever the depth (Truelove et al. 1997)', () => {
    const b = analyticBudget(cfg({ target_density: 1e-21, grid: { cells_per_jeans_length: 2 } }), cloud());
    expect(b.verdict.status).toBe('not resolved');
    expect(b.verdict.reason).toMatch(/N_J = 2/);
  });

  it('an initial peak above the resolved density is not resolved', () => {
    const b = analyticBudget(cfg({ target_density: 1e-21 }), cloud({ peakDensity: rhoAt(0) * 3 }));
    expect(b.verdict.status).toBe('not resolved');
  });

  it('warns when the sink threshold lies above the resolved density (N_J > 2 x sink radius in cells)', () => {
    const b = analyticBudget(cfg({ grid: { cells_per_jeans_length: 8 } }), cloud());
    expect(b.sinkThreshold).toBeGreaterThan(b.maxResolvedDensity);
    expect(b.warnings.some((w) => w.includes('sink threshold'))).toBe(true);
  });
});

describe('cost', () => {
  it('Courant step, steps, updates and memory of the base grid', () => {
    const vmax = 2e5;
    const b = analyticBudget(cfg({ grid: { courant: 0.3 }, free_fall_times: 2 }), cloud({ maxSpeed: vmax }));
    const dx = (1.28 * PC) / 64;
    const dt = (0.3 * dx) / (CS + vmax); // Courant, Friedrichs & Lewy 1928
    const tff = Math.sqrt((3 * Math.PI) / (32 * G * 1e-20)); // free-fall time, common practice
    expect(b.costEstimate.timeStep / dt).toBeCloseTo(1, 12);
    expect(b.costEstimate.steps).toBe(Math.ceil((2 * tff) / dt));
    expect(b.costEstimate.cellUpdates).toBe(64 ** 3 * Math.ceil((2 * tff) / dt));
    expect(b.costEstimate.memoryBytes).toBe(64 ** 3 * 5 * 8);
    expect(b.costEstimate.coreHours).toBeNull();
  });

  it('the ambient sound speed sets the step when it is the fastest signal', () => {
    const amb = 10 * CS;
    const b = analyticBudget(cfg({}), cloud({ ambientSoundSpeed: amb }));
    expect(b.costEstimate.timeStep / ((0.4 * (1.28 * PC) / 64) / amb)).toBeCloseTo(1, 12);
  });

  it('core-hours only from a given throughput; magnetic runs store 8 values per cell', () => {
    const b = analyticBudget(cfg({ throughput: 1e6, grid: { levels: 2 } }, { magnetic: { field: 10 } }), cloud());
    expect(b.costEstimate.coreHours! / (b.costEstimate.totalUpdates / 1e6 / 3600)).toBeCloseTo(1, 12);
    expect(b.costEstimate.memoryBytes).toBe(64 ** 3 * 8 * 8);
    expect(b.costEstimate.refinedLevels).toHaveLength(2);
    expect(b.costEstimate.totalUpdates).toBeGreaterThan(b.costEstimate.cellUpdates);
  });

  it('particles: memory of N particles and updates N x steps', () => {
    const b = analyticBudget(cfg({ code: 'particles', particles: { count: 1000 } }), cloud());
    expect(b.costEstimate.memoryBytes).toBe(1000 * 10 * 8);
    expect(b.costEstimate.cellUpdates).toBe(1000 * b.costEstimate.steps);
  });
});
