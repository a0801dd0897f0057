// Outside checks of the lognormal density structure and of phase consistency across resolution.
// Sources: sigma_s^2 = ln(1 + b^2 Mach^2) (Padoan, Nordlund & Jones 1997; Federrath, Klessen &
// Schmidt 2008), written out here from the papers; mean density preserved (common practice).
import { describe, it, expect } from 'vitest';
import { parseConfig } from '../../src/config/load.js';
import { generateCloud } from '../../src/generate/generate-cloud.js';

const MSUN = 1.3271244e26 / 6.6743e-8; // IAU 2015 GM_sun / CODATA 2018 G

function cfg(b: number, mach: number, cells = 64, extra: Record<string, unknown> = {}) {
  return parseConfig({
    seed: 4,
    cloud: { mass: '500 Msun', radius: '1 pc', temperature: 10, structure: { kind: 'lognormal', b, k_min: 2, ...extra }, turbulence: { mach, k_min: 2 } },
    grid: { cells },
  });
}

describe('lognormal density structure', () => {
  for (const [b, mach] of [[1 / 3, 5], [0.5, 10], [1, 3]] as const) {
    it(`has sigma_s within 3% of sqrt(ln(1 + b^2 M^2)) for b = ${b.toFixed(2)}, Mach ${mach} (Padoan et al. 1997; Federrath et al. 2008)`, async () => {
      const cloud = await generateCloud(cfg(b, mach), { pool: null });
      const R = 3.0856775814913673e18;
      const rhoMean = (500 * MSUN) / ((4 / 3) * Math.PI * R ** 3);
      let n = 0, s1 = 0, s2 = 0, m = 0;
      for (let i = 0; i < cloud.density.length; i++) {
        if (!cloud.inside[i]) continue;
        const s = Math.log(cloud.density[i]! / rhoMean);
        n++; s1 += s; s2 += s * s; m += cloud.density[i]!;
      }
      const sigma = Math.sqrt(s2 / n - (s1 / n) ** 2);
      const expected = Math.sqrt(Math.log(1 + b * b * mach * mach));
      expect(Math.abs(sigma / expected - 1)).toBeLessThan(0.03);
      // mean density of the cloud cells preserved (the renormalisation); compare with M / V of the gridded cloud region
      const dx = cloud.grid.boxSize / cloud.grid.nx;
      expect(Math.abs((m * dx ** 3) / (500 * MSUN) - 1)).toBeLessThan(1e-5);
    });
  }

  it('coupling 1 puts dense gas where compressive flows converge (correlation of ln rho with -div v)', async () => {
    const c = parseConfig({ seed: 2, cloud: { mass: '500 Msun', radius: '1 pc', structure: { kind: 'lognormal', coupling: 1, spectrum_index: 2, k_min: 2, k_max: 16 }, turbulence: { mach: 5, solenoidal_weight: 0, spectrum_index: 4, k_min: 2, k_max: 16 } }, grid: { cells: 32, box_size: '1.15 pc' } });
    const corr = async (coupling: number) => {
      const cc = { ...c, cloud: { ...c.cloud, structure: { ...c.cloud.structure, coupling } as typeof c.cloud.structure } };
      const cl = await generateCloud(cc, { pool: null });
      const n = cl.grid.nx;
      const at = (f: Float32Array, i: number, j: number, k: number) => f[(((i + n) % n) * n + ((j + n) % n)) * n + ((k + n) % n)]!;
      const a: number[] = [], d: number[] = [];
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
        const div = at(cl.velocity[0], i + 1, j, k) - at(cl.velocity[0], i - 1, j, k) + at(cl.velocity[1], i, j + 1, k) - at(cl.velocity[1], i, j - 1, k) + at(cl.velocity[2], i, j, k + 1) - at(cl.velocity[2], i, j, k - 1);
        a.push(Math.log(at(cl.density, i, j, k))); d.push(-div);
      }
      const ma = a.reduce((x, y) => x + y) / a.length, md = d.reduce((x, y) => x + y) / d.length;
      let sab = 0, saa = 0, sbb = 0;
      for (let q = 0; q < a.length; q++) { sab += (a[q]! - ma) * (d[q]! - md); saa += (a[q]! - ma) ** 2; sbb += (d[q]! - md) ** 2; }
      return sab / Math.sqrt(saa * sbb);
    };
    expect(await corr(1)).toBeGreaterThan(0.5);
    expect(Math.abs(await corr(0))).toBeLessThan(0.15);
  });
});

describe('phase consistency across resolution', () => {
  it('the 128^3 field block-averaged to 64^3 correlates with the 64^3 field above 0.95 (same seed, fixed k_max)', async () => {
    // The check the resolution study needs (common practice: compare like with like).
    const make = (cells: number) => parseConfig({ seed: 9, cloud: { mass: '500 Msun', radius: '1 pc', structure: { kind: 'lognormal', k_min: 2, k_max: 16 }, turbulence: { mach: 4, k_min: 2, k_max: 16, solenoidal_weight: 0.5 } }, grid: { cells, box_size: '1.15 pc' } });
    const lo = await generateCloud(make(64), { pool: null });
    const hi = await generateCloud(make(128), { pool: null });
    const block = (f: Float32Array, log: boolean): Float64Array => {
      const out = new Float64Array(64 ** 3);
      for (let i = 0; i < 128; i++) for (let j = 0; j < 128; j++) for (let k = 0; k < 128; k++) {
        const v = f[(i * 128 + j) * 128 + k]!;
        out[((i >> 1) * 64 + (j >> 1)) * 64 + (k >> 1)] += (log ? Math.log(v) : v) / 8;
      }
      return out;
    };
    const corr = (a: ArrayLike<number>, b: ArrayLike<number>) => {
      let ma = 0, mb = 0;
      for (let i = 0; i < a.length; i++) { ma += a[i]!; mb += b[i]!; }
      ma /= a.length; mb /= b.length;
      let sab = 0, saa = 0, sbb = 0;
      for (let i = 0; i < a.length; i++) { sab += (a[i]! - ma) * (b[i]! - mb); saa += (a[i]! - ma) ** 2; sbb += (b[i]! - mb) ** 2; }
      return sab / Math.sqrt(saa * sbb);
    };
    const cv = corr(lo.velocity[0], block(hi.velocity[0], false));
    const cs = corr(Float64Array.from(lo.density, Math.log), block(hi.density, true));
    console.log(`64^3 vs 128^3 block-averaged correlation: vx ${cv.toFixed(4)}, ln rho ${cs.toFixed(4)}`);
    expect(cv).toBeGreaterThan(0.95);
    expect(cs).toBeGreaterThan(0.95);
  });
});
