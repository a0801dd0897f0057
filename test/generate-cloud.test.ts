import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { parseConfig, loadConfig } from '../src/config/load.js';
import { generateCloud, estimateGenerateBytes } from '../src/generate/generate-cloud.js';
import { cloudDimensions } from '../src/generate/dimensions.js';
import { createPool, type WorkerPool } from '../src/grid/pool.js';
import { InputError } from '../src/input-error.js';

const G = 6.6743e-8; // CODATA 2018
const MSUN = 1.3271244e26 / G; // IAU 2015

function digest(fields: Float32Array[]): string {
  let h = 2166136261;
  for (const f of fields) { const u = new Uint8Array(f.buffer, f.byteOffset, f.byteLength); for (let i = 0; i < u.length; i++) h = Math.imul(h ^ u[i]!, 16777619) >>> 0; }
  return h.toString(16);
}
const allFields = (c: Awaited<ReturnType<typeof generateCloud>>) => [c.density, ...c.velocity, c.temperature, ...(c.magnetic ?? [])];

describe('generateCloud: edge cases', () => {
  it('refuses a cloud that covers no cell centre', async () => {
    const c = parseConfig({ cloud: { mass: '1 Msun', radius: '0.01 pc' }, grid: { cells: 8, box_size: '10 pc' } });
    await expect(generateCloud(c, { pool: null })).rejects.toThrow(InputError);
  });
  it('refuses turbulence with neither mach nor virial_parameter', async () => {
    const c = parseConfig({ cloud: { mass: '1 Msun', radius: '0.1 pc', turbulence: {} }, grid: { cells: 8 } });
    await expect(generateCloud(c, { pool: null })).rejects.toThrow(/mach or virial_parameter/);
  });
  it('a smooth cloud without turbulence is uniform inside, at rest, with ambient at contrast and T x contrast', async () => {
    const c = parseConfig({ cloud: { mass: '10 Msun', radius: '0.2 pc', temperature: 12, ambient: { contrast: 50 } }, grid: { cells: 16 } });
    const cloud = await generateCloud(c, { pool: null });
    let rin = -1;
    for (let i = 0; i < cloud.density.length; i++) {
      if (cloud.inside[i]) { if (rin < 0) rin = cloud.density[i]!; expect(cloud.density[i]).toBe(rin); expect(cloud.temperature[i]).toBe(12); }
      else expect(cloud.temperature[i]).toBeCloseTo(600, 3);
      expect(cloud.velocity[0][i]).toBe(0);
    }
    expect(cloud.magnetic).toBeNull();
    expect(cloud.summary.mach).toBe(0);
  });
});

describe('generateCloud: mass', () => {
  it('puts exactly the requested cloud mass in the cloud cells, and reports everything in the box', async () => {
    for (const cloudCfg of [
      { mass: '50 Msun', radius: '0.5 pc', envelope: { model: 'power-law', index: 2 }, structure: { kind: 'clumps', count: 20 } },
      { mass: '3 Msun', envelope: { model: 'bonnor-ebert' }, structure: { kind: 'fractal', levels: 3 } },
      { radius: '0.1 pc', envelope: { model: 'filament', line_mass: '30 Msun/pc', length: '1 pc' } },
    ]) {
      const c = parseConfig({ cloud: cloudCfg, grid: { cells: 32 } });
      const cloud = await generateCloud(c, { pool: null });
      const dv = (cloud.grid.boxSize / 32) ** 3;
      let mIn = 0, mAll = 0;
      for (let i = 0; i < cloud.density.length; i++) { mAll += cloud.density[i]!; if (cloud.inside[i]) mIn += cloud.density[i]!; }
      const want = cloudDimensions(c).mass;
      expect(Math.abs((mIn * dv) / want - 1)).toBeLessThan(1e-5);
      expect(Math.abs(cloud.summary.massOnGrid / (mAll * dv) - 1)).toBeLessThan(1e-9);
      expect(cloud.summary.massOnGrid).toBeGreaterThan(want);
      expect(cloud.summary.notes.some((n) => n.startsWith('mass correction'))).toBe(true);
    }
  });
  it('a filament holds line mass x length', () => {
    const c = parseConfig({ cloud: { radius: '0.1 pc', envelope: { model: 'filament', line_mass: '30 Msun/pc', length: '2 pc' } } });
    expect(cloudDimensions(c).mass / (60 * MSUN)).toBeCloseTo(1, 10);
  });
});

describe('generateCloud: the rotating test preset', () => {
  it('gives alpha near 0.26 and beta near 0.16 from its own energies (values from memory: Boss & Bodenheimer 1979)', async () => {
    const { config } = loadConfig('presets/rotating-test-cloud.yaml');
    const cloud = await generateCloud(config, { pool: null, cells: 64 });
    expect(Math.abs(cloud.summary.alphaThermal / 0.26 - 1)).toBeLessThan(0.02);
    expect(Math.abs(cloud.summary.betaRotation / 0.16 - 1)).toBeLessThan(0.02);
    expect(cloud.summary.omega).toBe(7.2e-13);
    // c_s = 1.66e4 cm/s as published
    expect(cloud.summary.soundSpeed / 1.66e4).toBeCloseTo(1, 4);
  });
  it('a target beta sets Omega so that E_rot/|W| = beta', async () => {
    const c = parseConfig({ cloud: { mass: '1 Msun', radius: '0.02 pc', rotation: { beta: 0.05, axis: [1, 1, 0] } }, grid: { cells: 32 } });
    const cloud = await generateCloud(c, { pool: null });
    expect(cloud.summary.betaRotation).toBeCloseTo(0.05, 10);
  });
});

describe('generateCloud: determinism', () => {
  let pool: WorkerPool;
  beforeAll(() => { pool = createPool(2); });
  afterAll(async () => { await pool.close(); });
  it('gives the same bytes with one worker and with two, and different bytes for another seed', async () => {
    const c = parseConfig({ seed: 17, cloud: { mass: '200 Msun', radius: '0.5 pc', envelope: { model: 'bonnor-ebert', xi_max: 9 }, structure: { kind: 'lognormal', coupling: 0.5 }, turbulence: { mach: 5, solenoidal_weight: 0.4, zero_angular_momentum: true }, rotation: { beta: 0.01, m_mode: 2, amplitude: 0.1 }, magnetic: { field: '20 uG' }, eos: { kind: 'barotropic' } }, grid: { cells: 32 } });
    const one = await generateCloud({ ...c, cloud: { ...c.cloud, mass: undefined } }, { pool: null });
    const two = await generateCloud({ ...c, cloud: { ...c.cloud, mass: undefined } }, { pool });
    expect(digest(allFields(two))).toBe(digest(allFields(one)));
    expect(Buffer.compare(Buffer.from(one.inside), Buffer.from(two.inside))).toBe(0);
    const other = await generateCloud({ ...c, cloud: { ...c.cloud, mass: undefined } }, { pool, seed: 18 });
    expect(digest(allFields(other))).not.toBe(digest(allFields(one)));
  });
});

describe('estimateGenerateBytes', () => {
  it('covers the output fields and grows with the cell count', () => {
    const c = parseConfig({ cloud: { mass: '1 Msun', radius: '0.1 pc', turbulence: { mach: 1 } } });
    const n = 128 ** 3;
    expect(estimateGenerateBytes(c, 128)).toBeGreaterThan(n * (4 * 5 + 1));
    // the fields plus one scratch half spectrum (Float64 complex, about 8 bytes per cell)
    expect(estimateGenerateBytes(c, 256)).toBeGreaterThan(8 * n * (4 * 5 + 1) + 8 * 8 * n);
  });
});
