// Source: scipy (general-purpose reference library) and the published lognormal form below.
// Lognormal volume-weighted density PDF of supersonic turbulence (Vazquez-Semadeni 1994; Padoan,
// Nordlund & Jones 1997): s = ln(rho/rho0) Gaussian, mean -sigma^2/2 (mass-weighted +sigma^2/2).
// Reference: scipy.special.erfc and scipy.stats.norm.sf.
import { describe, it, expect } from 'vitest';
import { pythonJson } from '../helpers/python.js';
import { erfc, lognormalVolumeFractionAbove, lognormalMassFractionAbove } from '../../src/physics/lognormal-pdf.js';

describe('lognormal PDF tails against scipy', () => {
  it('erfc matches scipy.special.erfc to 1.2e-7 relative (Numerical Recipes erfcc bound)', () => {
    const xs = [-3, -1.2, -0.1, 0, 0.3, 1, 2.5, 4, 6];
    const ref = pythonJson<number[]>(`import json,sys; from scipy.special import erfc; print(json.dumps([float(erfc(x)) for x in ${JSON.stringify(xs)}]))`);
    xs.forEach((x, i) => expect(Math.abs(erfc(x) - ref[i]!) / ref[i]!).toBeLessThan(2e-7));
  });

  it('volume and mass fractions above rho/rho0 match scipy.stats.norm.sf', () => {
    const cases = [[1, 1.0], [10, 1.45], [100, 1.45], [0.3, 0.5], [1e3, 2.0]] as const;
    const ref = pythonJson<number[][]>(`import json, math; from scipy.stats import norm
out=[]
for r,s in ${JSON.stringify(cases)}:
    out.append([float(norm.sf(math.log(r), loc=-s*s/2, scale=s)), float(norm.sf(math.log(r), loc=s*s/2, scale=s))])
print(json.dumps(out))`);
    cases.forEach(([r, s], i) => {
      expect(lognormalVolumeFractionAbove(r, s) / ref[i]![0]!).toBeCloseTo(1, 5);
      expect(lognormalMassFractionAbove(r, s) / ref[i]![1]!).toBeCloseTo(1, 5);
    });
  });

  it('edge cases: zero width is a step at the mean; non-positive ratio is everything', () => {
    expect(lognormalVolumeFractionAbove(0.5, 0)).toBe(1);
    expect(lognormalVolumeFractionAbove(2, 0)).toBe(0);
    expect(lognormalVolumeFractionAbove(0, 1)).toBe(1);
  });
});
