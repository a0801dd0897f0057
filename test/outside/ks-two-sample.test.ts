// Two-sample Kolmogorov-Smirnov distance and its 5 % critical value c(0.05) sqrt((n+m)/(nm)),
// c(0.05) = 1.358 (Smirnov 1948). Reference: scipy.stats.ks_2samp and scipy.stats.kstwobign.
import { describe, it, expect } from 'vitest';
import { pythonJson } from '../helpers/python.js';
import { ksTwoSample, KS_C_05, ladderConvergence } from '../../src/budget/convergence.js';

describe('two-sample KS distance against scipy', () => {
  it('edge cases: empty sample gives 0, identical samples give 0, disjoint give 1', () => {
    expect(ksTwoSample([], [1, 2])).toBe(0);
    expect(ksTwoSample([1, 2, 3], [1, 2, 3])).toBe(0);
    expect(ksTwoSample([1, 2], [3, 4, 5])).toBe(1);
  });

  it('matches scipy.stats.ks_2samp statistic, with ties', () => {
    const a = [0.5, 1.2, 1.2, 3.3, 0.7, 2.2, 5.1, 0.9, 1.4];
    const b = [0.6, 1.2, 2.9, 4.4, 0.8, 1.0, 7.5, 3.1];
    const c = Array.from({ length: 40 }, (_, i) => Math.exp(Math.sin(i * 1.7) * 2));
    const d = Array.from({ length: 55 }, (_, i) => Math.exp(Math.cos(i * 0.9) * 1.5 + 0.3));
    const ref = pythonJson<number[]>(`import json; from scipy.stats import ks_2samp
pairs = ${JSON.stringify([[a, b], [c, d], [a, d]])}
print(json.dumps([float(ks_2samp(x, y).statistic) for x, y in pairs]))`);
    expect(ksTwoSample(a, b)).toBeCloseTo(ref[0]!, 12);
    expect(ksTwoSample(c, d)).toBeCloseTo(ref[1]!, 12);
    expect(ksTwoSample(a, d)).toBeCloseTo(ref[2]!, 12);
  });

  it('c(0.05) = 1.358 is the 95 % point of the Kolmogorov distribution (scipy.stats.kstwobign)', () => {
    const c = pythonJson<number>('import json; from scipy.stats import kstwobign; print(json.dumps(float(kstwobign.isf(0.05))))');
    expect(KS_C_05).toBeCloseTo(c, 3);
  });

  it('ladder: same spectrum and count converge; a shifted spectrum does not', () => {
    const masses = Array.from({ length: 30 }, (_, i) => 1e33 * (1 + i));
    const s = (m: number[]) => ({ candidates: m.map((_, i) => i), expectedFragments: m.length, spectrum: { masses: m, fit: null } });
    expect(ladderConvergence([s(masses), s(masses)]).converged).toBe(true);
    expect(ladderConvergence([s(masses), s(masses.map((m) => m * 3))]).converged).toBe(false);
    // count changes by more than 10 % (and more than 1): not converged whatever the spectrum
    expect(ladderConvergence([s(masses), s([...masses, ...masses.slice(0, 10)])]).countConverged).toBe(false);
    // too few masses: spectrum undetermined, count alone cannot confirm convergence
    const few = ladderConvergence([s([1e33, 2e33]), s([1e33, 2e33])]);
    expect(few.spectrumConverged).toBeNull();
    expect(few.converged).toBeNull();
  });
});
