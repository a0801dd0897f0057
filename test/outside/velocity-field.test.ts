// Outside checks of the turbulent velocity field.
// Sources: velocity spectrum P(k) ~ k^-n (common practice; n = 11/3 Kolmogorov, 4 Burgers);
// compressive power fraction of a Helmholtz-projected field with weight zeta,
// chi = (1 - zeta)^2 / (1 - 2 zeta + 3 zeta^2) (Federrath et al. 2010), written out here;
// alpha_vir = 5 sigma_1D^2 R / (G M) (Bertoldi & McKee 1992); spectral derivatives by numpy.fft;
// critical mass-to-flux ratio 1/(2 pi sqrt G) (Nakano & Nakamura 1978).
import { describe, it, expect } from 'vitest';
import { parseConfig } from '../../src/config/load.js';
import { generateCloud } from '../../src/generate/generate-cloud.js';
import { vectorPowerSpectrum, compressivePowerFraction } from '../../src/grid/spectrum.js';
import { pythonJson } from '../helpers/python.js';

const G = 6.6743e-8, KB = 1.380649e-16, MH = 1.6735575e-24; // CODATA 2018; m_H common practice
const MSUN = 1.3271244e26 / G; // IAU 2015
const PC = (648000 / Math.PI) * 1.495978707e13; // IAU 2015

// A sphere of radius 1 pc in a box of 1.15 pc: every cell is cloud, so the field is the periodic one.
function turb(t: Record<string, unknown>, cells = 64, extra: Record<string, unknown> = {}) {
  return parseConfig({ seed: 12, cloud: { mass: '300 Msun', radius: '1 pc', temperature: 10, turbulence: t, ...extra }, grid: { cells, box_size: '1.15 pc' } });
}

function massWeighted(cloud: Awaited<ReturnType<typeof generateCloud>>) {
  let m = 0, px = 0, py = 0, pz = 0, e = 0, abs = 0;
  const [vx, vy, vz] = cloud.velocity;
  for (let i = 0; i < cloud.density.length; i++) {
    if (!cloud.inside[i]) continue;
    const r = cloud.density[i]!;
    m += r; px += r * vx[i]!; py += r * vy[i]!; pz += r * vz[i]!;
    const v2 = vx[i]! ** 2 + vy[i]! ** 2 + vz[i]! ** 2;
    e += r * v2; abs += r * Math.sqrt(v2);
  }
  return { rms: Math.sqrt(e / m), momentum: Math.hypot(px, py, pz), abs };
}

describe('turbulent velocity field', () => {
  for (const n of [11 / 3, 4]) {
    it(`has spectrum slope -${n.toFixed(2)} within 0.1 over its k range (common practice)`, async () => {
      const cloud = await generateCloud(turb({ mach: 5, spectrum_index: n, k_min: 2, k_max: 24 }), { pool: null });
      const s = vectorPowerSpectrum(cloud.velocity, cloud.grid);
      const xs: number[] = [], ys: number[] = [];
      for (let q = 0; q < s.k.length; q++) if (s.k[q]! >= 3 && s.k[q]! <= 20 && s.power[q]! > 0) { xs.push(Math.log(s.k[q]!)); ys.push(Math.log(s.power[q]!)); }
      const mx = xs.reduce((a, b) => a + b) / xs.length, my = ys.reduce((a, b) => a + b) / ys.length;
      let sxy = 0, sxx = 0;
      xs.forEach((x, q) => { sxy += (x - mx) * (ys[q]! - my); sxx += (x - mx) ** 2; });
      expect(Math.abs(sxy / sxx + n)).toBeLessThan(0.1);
    });
  }

  for (const zeta of [0, 0.5, 0.8, 1]) {
    it(`has compressive power fraction within 0.02 of the Helmholtz expectation for zeta = ${zeta} (Federrath et al. 2010)`, async () => {
      const cloud = await generateCloud(turb({ mach: 3, solenoidal_weight: zeta, k_min: 1, k_max: 20 }, 32), { pool: null });
      const expected = (1 - zeta) ** 2 / (1 - 2 * zeta + 3 * zeta * zeta);
      expect(Math.abs(compressivePowerFraction(cloud.velocity, cloud.grid) - expected)).toBeLessThan(0.02);
    });
  }

  it('reaches the requested rms Mach number within 1% and has zero net momentum', async () => {
    // Mach = sigma_3D / c_s, c_s = sqrt(k_B T / (mu m_H)) (common practice); a cloud inside a larger box
    const c = parseConfig({ seed: 3, cloud: { mass: '300 Msun', radius: '1 pc', temperature: 12, structure: { kind: 'lognormal' }, turbulence: { mach: 6 } }, grid: { cells: 32 } });
    const cloud = await generateCloud(c, { pool: null });
    const w = massWeighted(cloud);
    const cs = Math.sqrt((KB * 12) / (2.33 * MH));
    expect(Math.abs(w.rms / cs / 6 - 1)).toBeLessThan(0.01);
    expect(w.momentum / w.abs).toBeLessThan(1e-6);
    // the ambient gas is at rest
    for (let i = 0; i < cloud.density.length; i++) if (!cloud.inside[i]) expect(cloud.velocity[0][i]).toBe(0);
  });

  it('reaches the requested virial parameter within 1% (Bertoldi & McKee 1992)', async () => {
    const cloud = await generateCloud(turb({ virial_parameter: 2 }, 32), { pool: null });
    const sigma1D = massWeighted(cloud).rms / Math.sqrt(3);
    const alpha = (5 * sigma1D ** 2 * PC) / (G * 300 * MSUN);
    expect(Math.abs(alpha / 2 - 1)).toBeLessThan(0.01);
  });

  it('removes the net angular momentum when asked', async () => {
    const c = parseConfig({ seed: 5, cloud: { mass: '300 Msun', radius: '1 pc', turbulence: { mach: 4, zero_angular_momentum: true } }, grid: { cells: 32 } });
    const cloud = await generateCloud(c, { pool: null });
    const { nx, boxSize } = cloud.grid;
    const x = (i: number) => -boxSize / 2 + (i + 0.5) * boxSize / nx;
    let lx = 0, ly = 0, lz = 0, scale = 0;
    for (let i = 0; i < nx; i++) for (let j = 0; j < nx; j++) for (let k = 0; k < nx; k++) {
      const q = (i * nx + j) * nx + k;
      if (!cloud.inside[q]) continue;
      const m = cloud.density[q]!, vx = cloud.velocity[0][q]!, vy = cloud.velocity[1][q]!, vz = cloud.velocity[2][q]!;
      lx += m * (x(j) * vz - x(k) * vy); ly += m * (x(k) * vx - x(i) * vz); lz += m * (x(i) * vy - x(j) * vx);
      scale += m * Math.hypot(x(i), x(j), x(k)) * Math.hypot(vx, vy, vz);
    }
    expect(Math.hypot(lx, ly, lz) / scale).toBeLessThan(1e-4);
  });

  it('a purely solenoidal field has a divergence tiny compared with its curl (numpy.fft derivatives)', async () => {
    const cloud = await generateCloud(turb({ mach: 3, solenoidal_weight: 1, k_min: 1 }, 32), { pool: null });
    const py = `import sys, json, numpy as np
n = 32
v = np.frombuffer(sys.stdin.buffer.read(), dtype='<f4').reshape(3, n, n, n).astype(np.float64)
k = np.fft.fftfreq(n) * n
KX, KY, KZ = np.meshgrid(k, k, k, indexing='ij')
F = [np.fft.fftn(c) for c in v]
div = np.fft.ifftn(1j * (KX * F[0] + KY * F[1] + KZ * F[2])).real
cx = np.fft.ifftn(1j * (KY * F[2] - KZ * F[1])).real
cy = np.fft.ifftn(1j * (KZ * F[0] - KX * F[2])).real
cz = np.fft.ifftn(1j * (KX * F[1] - KY * F[0])).real
print(json.dumps({'div': float(np.sqrt((div**2).mean())), 'curl': float(np.sqrt((cx**2 + cy**2 + cz**2).mean()))}))`;
    const buf = Buffer.concat(cloud.velocity.map((f) => Buffer.from(f.buffer, f.byteOffset, f.byteLength)));
    const out = execPython(py, buf);
    expect(out.div / out.curl).toBeLessThan(1e-4);
  });
});

function execPython(py: string, input: Buffer): { div: number; curl: number } {
  return pythonJson<{ div: number; curl: number }>(py, input as unknown as string);
}

describe('magnetic field from a mass-to-flux ratio', () => {
  it('uses the critical value 1/(2 pi sqrt G) (Nakano & Nakamura 1978)', async () => {
    const c = turb({ mach: 1 }, 16, { magnetic: { mass_to_flux: 1.5, direction: [0, 1, 0] } });
    const cloud = await generateCloud(c, { pool: null });
    const crit = 1 / (2 * Math.PI * Math.sqrt(G));
    const B = (300 * MSUN) / (Math.PI * PC * PC) / (1.5 * crit);
    expect(cloud.summary.field! / B).toBeCloseTo(1, 10);
    expect(cloud.magnetic![1][0]! / B).toBeCloseTo(1, 6);
    expect(cloud.magnetic![0][0]).toBe(0);
    // plasma beta 8 pi rho c_s^2 / B^2 at the mean density (common practice)
    const rho = (300 * MSUN) / ((4 / 3) * Math.PI * PC ** 3);
    expect(cloud.summary.plasmaBeta! / ((8 * Math.PI * rho * KB * 10) / (2.33 * MH) / B ** 2)).toBeCloseTo(1, 8);
  });
});
