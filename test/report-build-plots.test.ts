import { describe, it, expect } from 'vitest';
import { densityPdf, jeansHistogram, blockMean } from '../src/report/build-plots.js';
import { blockMeanTransfer2, vectorPowerSpectrum } from '../src/grid/spectrum.js';
import { pythonJson } from './helpers/python.js';

function lognormalSample(n: number, sigma: number, seed = 3): Float32Array {
  const a = new Float32Array(n);
  let s = seed >>> 0;
  const u = (): number => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return (s + 0.5) / 2 ** 32; };
  for (let i = 0; i < n; i++) a[i] = 1e-20 * Math.exp(sigma * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u()));
  return a;
}

describe('plot data', () => {
  it('densityPdf of an empty or single-cell field is null', () => {
    expect(densityPdf(new Float32Array(0), null, null)).toBeNull();
    expect(densityPdf(Float32Array.of(1), null, null)).toBeNull();
  });

  it('densityPdf integrates to 1 and its width matches numpy on the same cells', () => {
    const rho = lognormalSample(20000, 1.5);
    const p = densityPdf(rho, null, 1.5)!;
    const dw = p.s[1]! - p.s[0]!;
    expect(p.pdf.reduce((x, y) => x + y, 0) * dw).toBeCloseTo(1, 10);
    // numpy reference (general-purpose library): std of ln(rho / mean rho), ddof = 1
    const ref = pythonJson<{ sd: number; mean: number }>(
      'import sys,json,numpy as np\nr=np.array(json.loads(sys.stdin.read()),dtype=np.float64)\ns=np.log(r/r.mean())\nprint(json.dumps({"sd":float(s.std(ddof=1)),"mean":float(r.mean())}))',
      JSON.stringify(Array.from(rho)),
    );
    expect(p.sigma_s_measured).toBeCloseTo(ref.sd, 6);
    expect(p.rho0_gcc / ref.mean).toBeCloseTo(1, 6);
  });

  it('densityPdf honours the mask', () => {
    const rho = Float32Array.of(1, 2, 1000, 4);
    const p = densityPdf(rho, Uint8Array.of(1, 1, 0, 1), null)!;
    expect(p.rho0_gcc).toBeCloseTo(7 / 3, 10);
  });

  it('jeansHistogram counts every positive cell once, matching numpy.histogram', () => {
    const j = lognormalSample(5000, 1, 9).map((x) => x * 1e19);
    const h = jeansHistogram({ jeansNumber: j, jeansCellsMin: 1, unresolvedMassFraction: 0, cellsNeedingRefinement: 0 }, 4)!;
    expect(h.counts.reduce((x, y) => x + y, 0)).toBe(5000);
    expect(h.limit).toBe(0.25);
    const ref = pythonJson<number[]>(
      'import sys,json,numpy as np\nd=json.loads(sys.stdin.read())\nc,_=np.histogram(np.log10(np.array(d["j"])),bins=np.array(d["e"]))\nprint(json.dumps([int(x) for x in c]))',
      JSON.stringify({ j: Array.from(j), e: h.log10_j_edges }),
    );
    // bin edges can differ by one ulp between log(x)/ln10 and log10(x): allow a handful of cells to move one bin
    const moved = ref.reduce((acc, c, b) => acc + Math.abs(c - h.counts[b]!), 0);
    expect(moved).toBeLessThanOrEqual(6);
  });
});

describe('block mean for the velocity spectrum', () => {
  it('conserves the mean and averages each block', async () => {
    const n = 4;
    const f = new Float32Array(n ** 3).map((_, i) => i);
    const m = await blockMean(f, n, 2);
    expect(m.length).toBe(8);
    // block (0,0,0) holds cells i,j,k in {0,1}: indices (i*4 + j)*4 + k
    const first = [0, 1, 4, 5, 16, 17, 20, 21].reduce((a, b) => a + b, 0) / 8;
    expect(m[0]).toBeCloseTo(first, 5);
    const mean = (a: Float32Array): number => a.reduce((x, y) => x + y, 0) / a.length;
    expect(mean(m)).toBeCloseTo(mean(f), 4);
  });
});

describe('window compensation of the block-averaged spectrum', () => {
  // A single Fourier mode on a 32^3 grid, block-averaged by 2, keeps its shape with amplitude H(k):
  // the block mean is a box filter (common practice: assignment-window compensation of gridded spectra).
  it('blockMeanTransfer2 is the measured damping of a plane wave', async () => {
    const n = 32, f = 2, m = n / f;
    const h2 = blockMeanTransfer2(m, f);
    for (const k of [1, 3, 6, 7]) {
      const field = new Float32Array(n ** 3);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let q = 0; q < n; q++) field[(i * n + j) * n + q] = Math.cos((2 * Math.PI * k * (q + 0.5)) / n);
      const coarse = await blockMean(field, n, f);
      const fine = vectorPowerSpectrum([field], { nx: n, ny: n, nz: n, boxSize: 1 });
      const raw = vectorPowerSpectrum([coarse], { nx: m, ny: m, nz: m, boxSize: 1 });
      const comp = vectorPowerSpectrum([coarse], { nx: m, ny: m, nz: m, boxSize: 1 }, f);
      // the mode sits in shell k; its power is damped by h2[k] and restored by the compensation
      expect(raw.energy[k - 1]! / fine.energy[k - 1]!).toBeCloseTo(h2[k]!, 5);
      expect(comp.energy[k - 1]! / fine.energy[k - 1]!).toBeCloseTo(1, 5);
      expect(h2[k]!).toBeLessThan(1);
    }
  });
});
