import { describe, it, expect } from 'vitest';
import { coarseGridSelfEnergy, directSelfEnergy, uniformCubeSelfEnergy, coarseGrain, halveCoarse, selfGravityEnergy } from '../src/survey/self-gravity.js';

describe('self-gravity sums', () => {
  it('isolated FFT convolution equals the direct pair sum on the same coarse grid', () => {
    const g = 8;
    let s = 3;
    const mass = Float64Array.from({ length: g ** 3 }, () => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return s / 2 ** 32; });
    const xyz = new Int32Array(3 * g ** 3);
    for (let q = 0; q < g ** 3; q++) { xyz[3 * q] = Math.floor(q / g / g); xyz[3 * q + 1] = Math.floor(q / g) % g; xyz[3 * q + 2] = q % g; }
    const a = coarseGridSelfEnergy(mass, g, 2.5);
    const b = directSelfEnergy(mass, xyz, 2.5);
    expect(Math.abs(a / b - 1)).toBeLessThan(1e-10);
  });

  it('gives one cell the self-energy of a uniform cube, and empty input zero', () => {
    const d = new Float32Array([2]);
    expect(selfGravityEnergy(d, { nx: 1, ny: 1, nz: 1 }, 3).energy).toBeCloseTo(uniformCubeSelfEnergy(2 * 27, 3), 20);
    expect(selfGravityEnergy(new Float32Array(8), { nx: 2, ny: 2, nz: 2 }, 1).energy).toBe(0);
  });

  it('keeps the mass when coarse-graining and halving', () => {
    const n = 16;
    const d = Float32Array.from({ length: n ** 3 }, (_, i) => 1 + (i % 7));
    const c = coarseGrain(d, { nx: n, ny: n, nz: n }, 2, null, 4);
    expect(c.factor).toBe(4);
    const total = d.reduce((x, y) => x + y, 0) * 8;
    expect(c.mass.reduce((x, y) => x + y, 0)).toBeCloseTo(total, 6);
    expect(halveCoarse(c).mass.reduce((x, y) => x + y, 0)).toBeCloseTo(total, 6);
  });
});
