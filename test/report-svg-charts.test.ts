/** svg-charts: the plotted curves follow their formulas (outside check against scipy.stats). */
import { describe, expect, it } from 'vitest';
import { densityPdfSvg, gaussianPdf, jeansHistogramSvg, massSpectrumSvg, powerLawPerDex, velocitySpectrumSvg } from '../src/report/svg-charts.js';
import { pythonJson } from './helpers/python.js';
import { fixturePlots } from './helpers/make-preview.js';

describe('curve formulas', () => {
  it('gaussianPdf equals scipy.stats.norm.pdf (the lognormal PDF in s, mean -sigma^2/2)', () => {
    // Padoan, Nordlund & Jones 1997: volume-weighted s = ln(rho/rho0) normal with mean -sigma_s^2/2
    const sig = 1.3;
    const xs = [-5, -2.2, -0.845, 0, 1.7, 4];
    const ref = pythonJson<number[]>(
      `import json; from scipy.stats import norm\nprint(json.dumps([float(norm.pdf(x, loc=-0.5*${sig}**2, scale=${sig})) for x in ${JSON.stringify(xs)}]))`,
    );
    xs.forEach((x, i) => expect(gaussianPdf(x, -0.5 * sig * sig, sig)).toBeCloseTo(ref[i], 12));
  });

  it('the fitted power law per dex integrates to n_tail objects above x_min', () => {
    // dN/dM = C M^-a normalised to n objects above xmin (Clauset, Shalizi & Newman 2009, eq. 2)
    const [a, xmin, n] = [2.35, 0.7, 40];
    let total = 0;
    const steps = 200000;
    const top = Math.log10(xmin) + 12; // integrate over 12 dex
    const h = (top - Math.log10(xmin)) / steps;
    for (let i = 0; i < steps; i++) total += powerLawPerDex(10 ** (Math.log10(xmin) + (i + 0.5) * h), a, xmin, n) * h;
    expect(total).toBeCloseTo(n, 3);
  });
});

describe('plot SVGs', () => {
  const p = fixturePlots();
  it('each is one <svg> element with a title, and says why when its data is missing', () => {
    for (const svg of [densityPdfSvg(p.density_pdf), velocitySpectrumSvg(p.velocity_spectrum), jeansHistogramSvg(p.jeans_histogram), massSpectrumSvg(p.mass_spectrum)]) {
      expect((svg.match(/<svg/g) ?? []).length).toBe(1);
      expect(svg).toMatch(/<title>[^<]+<\/title>/);
      expect(svg).not.toContain('NaN');
    }
    expect(densityPdfSvg(null)).toContain('No density PDF');
    expect(velocitySpectrumSvg(null)).toContain('No velocity field');
    expect(jeansHistogramSvg(null)).toContain('No Jeans-number histogram');
  });
  it('the Jeans histogram draws one bar per non-empty bin and the limit line at log10(1/4)', () => {
    const svg = jeansHistogramSvg(p.jeans_histogram);
    expect((svg.match(/<rect [^>]*fill-opacity="0.55"/g) ?? []).length).toBe(p.jeans_histogram!.counts.filter((c) => c > 0).length);
    // Truelove et al. 1997: J = 1/4 (dashed vertical line)
    expect(svg).toMatch(/<line [^>]*stroke-dasharray="5 3"/);
    expect(svg).toContain('limit J = 1/4');
  });
  it('the mass spectrum counts each candidate once', () => {
    const masses = [0.5, 0.52, 3, 30];
    const svg = massSpectrumSvg({ masses_msun: masses, fit: null, models: [] });
    expect(svg).toContain(`candidates (${masses.length})`);
    expect((svg.match(/<rect [^>]*fill-opacity="0.55"/g) ?? []).length).toBe(3); // 0.5 and 0.52 share a 0.25 dex bin
  });
});
