import { describe, it, expect } from 'vitest';
import { histogram } from '../src/grid/histogram.js';

describe('histogram', () => {
  it('an empty input gives zero counts', () => {
    const h = histogram([], { bins: 4 });
    expect(h.total).toBe(0);
    expect(Array.from(h.counts)).toEqual([0, 0, 0, 0]);
  });
  it('all-equal values land in one bin', () => {
    const h = histogram([2, 2, 2], { bins: 3 });
    expect(h.counts.reduce((a, b) => a + b, 0)).toBe(3);
    expect(h.total).toBe(3);
  });
  it('bins equal widths, includes max in the last bin, and counts what falls outside', () => {
    const h = histogram([0, 0.5, 1, 1.5, 2, -1, 3], { bins: 2, min: 0, max: 2 });
    expect(Array.from(h.edges)).toEqual([0, 1, 2]);
    expect(Array.from(h.counts)).toEqual([2, 3]);
    expect(h.underflow).toBe(1);
    expect(h.overflow).toBe(1);
  });
  it('log bins, weights and a mask', () => {
    const h = histogram([1, 10, 100, 0, 1000], { bins: 3, min: 1, max: 1000, log: true, weights: [1, 2, 3, 4, 5], mask: [1, 1, 1, 1, 0] });
    expect(h.edges[1]).toBeCloseTo(10, 10);
    expect(Array.from(h.counts)).toEqual([1, 2, 3]);
    expect(h.underflow).toBe(4); // the zero cannot be placed on a log axis
  });
  it('refuses zero bins', () => {
    expect(() => histogram([1], { bins: 0 })).toThrow(RangeError);
  });
});
