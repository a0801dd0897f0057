// runBudget (what `fragplan budget` prints) reports the same numbers as the summary.json blocks
// built from the same inputs; runLadder judges convergence and prices each rung.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseConfigText, type LoadedConfig } from '../src/config/load.js';
import { runBudget, budgetCloud } from '../src/pipeline/budget.js';
import { runLadder } from '../src/pipeline/ladder.js';
import { analyticBudget } from '../src/budget/analytic-budget.js';
import { resolutionSummary, costSummary } from '../src/budget/summary-blocks.js';
import { InputError } from '../src/input-error.js';

const load = (file: string): LoadedConfig => {
  const text = readFileSync(file, 'utf8');
  return { config: parseConfigText(text, file), text, file, name: 'test', sha256: '0' };
};
const FILES = ['test/data/budget-clump.yaml', 'test/data/budget-core.yaml'];

describe('runBudget', () => {
  for (const f of FILES) {
    it(`${f}: resolution and cost equal resolutionSummary/costSummary of the same inputs`, () => {
      const loaded = load(f);
      const r = runBudget(loaded);
      const b = analyticBudget(loaded.config, budgetCloud(loaded.config));
      expect(r.summary.schema).toBe('fragplan.budget/1');
      expect(r.summary.resolution).toEqual(resolutionSummary(b, null));
      expect(r.summary.cost).toEqual(costSummary(b));
      const res = r.summary.resolution as Record<string, unknown>;
      for (const k of ['max_resolved_density_gcc', 'levels_needed', 'sink_threshold_gcc', 'sink_radius_pc', 'verdict', 'levels']) expect(res).toHaveProperty(k);
      const cost = r.summary.cost as Record<string, unknown>;
      for (const k of ['memory_bytes', 'time_step_s', 'time_step_yr', 'steps', 'cell_updates', 'core_hours', 'assumptions']) expect(cost).toHaveProperty(k);
      expect(r.text.split('\n')[0]).toMatch(/^Verdict: (RESOLVED|MARGINAL|NOT RESOLVED) - /);
      expect(r.text).toContain('not a convergence test');
    });
  }

  it('core_hours is null without a throughput and a number with one', () => {
    expect((runBudget(load(FILES[1]!)).summary.cost as Record<string, unknown>).core_hours).toBeNull();
    expect(typeof (runBudget(load(FILES[0]!)).summary.cost as Record<string, unknown>).core_hours).toBe('number');
  });

  it('--cells sets the base cells when budget.grid.base_cells is absent', () => {
    const loaded = load(FILES[0]!);
    const noBase = { ...loaded, config: { ...loaded.config, budget: { ...loaded.config.budget, grid: { ...loaded.config.budget.grid, base_cells: undefined } } } };
    const r = runBudget(noBase, { cells: 64 });
    expect((r.summary.resolution as Record<string, unknown>).base_cells).toBe(64);
    expect((r.summary.cost as Record<string, unknown>).memory_bytes).toBe(64 ** 3 * 5 * 8);
  });

  it('turbulence given as Mach sets sigma_1D = Mach c_s / sqrt 3', () => {
    const loaded = load(FILES[0]!);
    const c = budgetCloud(loaded.config);
    expect((Math.sqrt(3) * c.sigma1D) / c.soundSpeed).toBeCloseTo(8, 10);
  });
});

describe('runLadder', () => {
  const survey = (masses: number[]) => ({ candidates: masses.map((_, i) => i), expectedFragments: masses.length, spectrum: { masses, fit: null } });
  const base = Array.from({ length: 12 }, (_, i) => 2e32 * (i + 1));

  it('runs the rungs coarse to fine and reports convergence with each rung\'s cost', async () => {
    const seen: number[] = [];
    const r = await runLadder(load(FILES[0]!), [64, 16, 32], async (cells) => {
      seen.push(cells);
      return { survey: survey(cells === 16 ? base.slice(0, 5) : base), seconds: 0.5 };
    });
    expect(seen).toEqual([16, 32, 64]);
    expect(r.summary.verdict).toBe('converged');
    const rungs = r.summary.rungs as Array<Record<string, number>>;
    expect(rungs.map((x) => x.cells_per_side)).toEqual([16, 32, 64]);
    expect(rungs.map((x) => x.memory_bytes)).toEqual([16 ** 3 * 40, 32 ** 3 * 40, 64 ** 3 * 40]);
    expect(r.text).toMatch(/^Convergence ladder: CONVERGED/);
  });

  it('not converged when the finest rungs disagree', async () => {
    const r = await runLadder(load(FILES[0]!), [16, 32], async (cells) => ({ survey: survey(cells === 16 ? base : base.slice(0, 4)), seconds: 0.1 }));
    expect(r.summary.verdict).toBe('not converged');
  });

  it('refuses fewer than two distinct rungs', async () => {
    await expect(runLadder(load(FILES[0]!), [32, 32], async () => ({ survey: survey(base), seconds: 0 }))).rejects.toThrow(InputError);
  });
});
