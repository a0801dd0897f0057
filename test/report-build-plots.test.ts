import { describe, it, expect } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { densityPdf, jeansHistogram, blockMean, velocitySpectrum, SPECTRUM_ALIAS_LIMIT } from '../src/report/build-plots.js';
import { loadConfig } from '../src/config/load.js';
import { generateCloud } from '../src/generate/generate-cloud.js';
import { encodeNpy } from '../src/export/npy.js';
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

describe('report velocity spectrum', () => {
  // Outside reference: numpy.fft.rfftn of the same velocity, shell-averaged the same way
  // (|F|^2 / N^2 per mode, shells n - 1/2 <= |k| < n + 1/2, half-spectrum planes counted twice).
  it('matches numpy at full resolution, and on block means (window-compensated, aliasing tail cut) within 5 %', async () => {
    const loaded = loadConfig('presets/massive-clump.yaml');
    const cloud = await generateCloud(loaded.config, { cells: 64, pool: null });
    const dir = mkdtempSync(path.join(tmpdir(), 'fragplan-vspec-'));
    cloud.velocity.forEach((v, a) => writeFileSync(path.join(dir, `v${a}.npy`), encodeNpy(v, [64, 64, 64])));
    const ref = pythonJson<number[]>(`import numpy as np, json
n = 64
kx = np.fft.fftfreq(n, 1 / n); kz = np.arange(n // 2 + 1)
K = np.sqrt(kx[:, None, None] ** 2 + kx[None, :, None] ** 2 + kz[None, None, :] ** 2)
w = np.broadcast_to(np.where((kz == 0) | (kz == n // 2), 1.0, 2.0), K.shape)
sh = np.floor(K + 0.5).astype(int); m = (sh > 0) & (sh <= n // 2)
tot = np.zeros(n // 2 + 1)
for a in range(3):
    F = np.fft.rfftn(np.load(${JSON.stringify(dir)} + f'/v{a}.npy').astype(np.float64))
    tot += np.bincount(sh[m], weights=(w * np.abs(F) ** 2 / n ** 6)[m], minlength=n // 2 + 1)
cnt = np.bincount(sh[m], weights=w[m], minlength=n // 2 + 1)
print(json.dumps([tot[s] / cnt[s] for s in range(1, n // 2 + 1)]))`);
    const full = (await velocitySpectrum(cloud, null))!;
    expect(full.cells).toBe(64);
    full.k.forEach((k, i) => expect(full.power[i]! / ref[Math.round(k) - 1]!).toBeCloseTo(1, 6));
    const coarse = (await velocitySpectrum(cloud, null, 32))!;
    expect(coarse.cells).toBe(32);
    const top = SPECTRUM_ALIAS_LIMIT * 16;
    expect(Math.max(...coarse.k)).toBeLessThanOrEqual(top);
    expect(coarse.k.length).toBeGreaterThan(8);
    coarse.k.forEach((k, i) => expect(Math.abs(coarse.power[i]! / ref[Math.round(k) - 1]! - 1)).toBeLessThan(0.05));
  });
});
