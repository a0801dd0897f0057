import { describe, it, expect } from 'vitest';
import { powerSpectrum, vectorPowerSpectrum, compressivePowerFraction } from '../src/grid/spectrum.js';
import { cubicGrid } from '../src/grid/grid3.js';

const n = 16;
const g = cubicGrid(n, 1);
function wave(fn: (x: number, y: number, z: number) => number): Float32Array {
  const f = new Float32Array(n ** 3);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) f[(i * n + j) * n + k] = fn(i / n, j / n, k / n);
  return f;
}

describe('powerSpectrum', () => {
  it('a constant field has no power in any shell k >= 1', () => {
    const s = powerSpectrum(new Float32Array(n ** 3).fill(3), g);
    expect(Math.max(...s.power)).toBe(0);
  });
  it('a single cosine of wavenumber 3 puts all its mean square (Parseval) in shell 3', () => {
    const s = powerSpectrum(wave((_x, y) => Math.cos(2 * Math.PI * 3 * y)), g);
    const total = s.energy.reduce((a, b) => a + b, 0);
    expect(total).toBeCloseTo(0.5, 6); // <cos^2> = 1/2
    expect(s.energy[2]).toBeCloseTo(0.5, 6);
    expect(s.k[0]).toBeCloseTo((6 + 12 * Math.SQRT2) / 18, 12); // mean |k| of shell 1
  });
  it('counts the modes of each shell over the full sphere of k (kz < 0 included)', () => {
    const s = powerSpectrum(new Float32Array(n ** 3), g);
    // shell 1: |k| in [0.5, 1.5): the 6 face neighbours, 12 edge ones (sqrt 2)
    expect(s.count[0]).toBe(18);
  });
  it('a vector spectrum sums the component powers', () => {
    const a = wave((x) => Math.sin(2 * Math.PI * 2 * x));
    const s = vectorPowerSpectrum([a, a, a], g);
    expect(s.energy[1]).toBeCloseTo(1.5, 6);
  });
});

describe('compressivePowerFraction', () => {
  it('is 1 for a gradient field and 0 for a shear (curl) field', () => {
    const phase = (x: number) => 2 * Math.PI * 2 * x;
    const grad: [Float32Array, Float32Array, Float32Array] = [wave((x) => Math.cos(phase(x))), new Float32Array(n ** 3), new Float32Array(n ** 3)];
    const shear: [Float32Array, Float32Array, Float32Array] = [new Float32Array(n ** 3), wave((x) => Math.cos(phase(x))), new Float32Array(n ** 3)];
    expect(compressivePowerFraction(grad, g)).toBeCloseTo(1, 6);
    expect(compressivePowerFraction(shear, g)).toBeCloseTo(0, 6);
  });
});
