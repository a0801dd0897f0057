/** viewer/src/jeans-slice.ts: slice indexing in C order and the over-limit count (Truelove et al. 1997 limit 1/4). */
import { describe, expect, it } from 'vitest';
import { countAbove, jeansColour, jeansLogRange, sliceIndex } from '../viewer/src/jeans-slice.js';

describe('sliceIndex', () => {
  it('addresses (i*n + j)*n + k with the fixed axis set to the slice', () => {
    const n = 5;
    expect(sliceIndex('z', 2, 1, 3, n)).toBe((1 * n + 3) * n + 2); // a = i, b = j, k = s
    expect(sliceIndex('y', 2, 1, 3, n)).toBe((1 * n + 2) * n + 3); // a = i, b = k, j = s
    expect(sliceIndex('x', 2, 1, 3, n)).toBe((2 * n + 1) * n + 3); // a = j, b = k, i = s
  });
  it('one slice visits every cell of the plane once; all slices cover the cube', () => {
    const n = 4;
    for (const axis of ['x', 'y', 'z'] as const) {
      const seen = new Set<number>();
      for (let s = 0; s < n; s++) for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) seen.add(sliceIndex(axis, s, a, b, n));
      expect(seen.size).toBe(n ** 3);
    }
  });
});

describe('countAbove', () => {
  it('counts cells strictly above the limit in the slice: 1 cell, all equal, none', () => {
    expect(countAbove(Float32Array.from([0.3]), 1, 'z', 0, 0.25)).toBe(1);
    expect(countAbove(new Float32Array(8).fill(0.25), 2, 'x', 1, 0.25)).toBe(0); // J = 1/4 exactly is resolved
    const n = 3;
    const j = new Float32Array(n ** 3);
    j[(0 * n + 1) * n + 2] = 0.5; // k = 2
    j[(2 * n + 2) * n + 2] = 0.9;
    j[(1 * n + 1) * n + 0] = 0.9; // k = 0
    expect(countAbove(j, n, 'z', 2, 0.25)).toBe(2);
    expect(countAbove(j, n, 'z', 0, 0.25)).toBe(1);
    expect(countAbove(j, n, 'z', 1, 0.25)).toBe(0);
  });
});

describe('colour scale', () => {
  it('includes the limit in the range and uses a different ramp above it', () => {
    const [lo, hi] = jeansLogRange(Float32Array.from([0.01, 0.02]), 0.25);
    expect(lo).toBeCloseTo(-2, 6);
    expect(hi).toBeGreaterThan(Math.log10(0.25));
    const below = jeansColour(1, false);
    const above = jeansColour(0, true);
    expect(above[0]).toBeGreaterThan(below[0]);
    expect(above[2]).toBeLessThan(below[2]);
  });
});
