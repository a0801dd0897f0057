/** svg-scale: linear and log scales, extents, padding and ticks for the report's plots. */
import { describe, expect, it } from 'vitest';
import { extent, formatTick, linearScale, linearTicks, logScale, logTicks, padLinear, padLog } from '../src/report/svg-scale.js';

describe('extent', () => {
  it('is null for empty or all-invalid input and ignores non-finite (and non-positive when asked)', () => {
    expect(extent([])).toBeNull();
    expect(extent([NaN, Infinity])).toBeNull();
    expect(extent([0, -1], true)).toBeNull();
    expect(extent([3, NaN, -2, 7])).toEqual([-2, 7]);
    expect(extent([0, 5, 1e-3], true)).toEqual([1e-3, 5]);
  });
});

describe('scales', () => {
  it('map domain ends to range ends; a zero-width domain maps to the middle', () => {
    const x = linearScale(-1, 3, 10, 90);
    expect(x(-1)).toBe(10);
    expect(x(3)).toBe(90);
    expect(x(1)).toBe(50);
    expect(linearScale(2, 2, 0, 100)(2)).toBe(50);
    const y = logScale(1e-3, 1e3, 300, 0);
    expect(y(1e-3)).toBeCloseTo(300, 9);
    expect(y(1)).toBeCloseTo(150, 9);
    expect(y(0)).toBeNaN();
    expect(y(-5)).toBeNaN();
  });
});

describe('padding', () => {
  it('widens linear domains and rounds log domains out to decades', () => {
    expect(padLinear([0, 10], 0.1)).toEqual([-1, 11]);
    expect(padLinear([5, 5])).toEqual([4.5, 5.5]);
    expect(padLinear([0, 0])).toEqual([-1, 1]);
    expect(padLog([2e-19, 3e-17])).toEqual([1e-19, 1e-16]);
    const one = padLog([10, 10]);
    expect(one[0]).toBeCloseTo(1, 12);
    expect(one[1]).toBeCloseTo(100, 12);
  });
});

describe('ticks', () => {
  it('linear ticks step by 1, 2 or 5 times a power of ten inside the domain', () => {
    expect(linearTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(linearTicks(-4, 4, 6)).toEqual([-4, -2, 0, 2, 4]);
    expect(linearTicks(3, 3)).toEqual([3]);
    expect(linearTicks(5, 1)).toEqual([]);
    for (const t of linearTicks(-2.3, 17.9, 5)) expect(t >= -2.3 && t <= 17.9).toBe(true);
  });
  it('log ticks are the decades inside the domain, with 2 and 5 added for a short one', () => {
    expect(logTicks(1e-3, 1e2)).toEqual([1e-3, 1e-2, 0.1, 1, 10, 100]);
    expect(logTicks(2, 40)).toEqual([2, 5, 10, 20]);
    expect(logTicks(0, 10)).toEqual([]);
    expect(logTicks(1e-30, 1e10).length).toBeLessThanOrEqual(8);
  });
  it('tick labels are short', () => {
    expect(formatTick(0)).toBe('0');
    expect(formatTick(0.25)).toBe('0.25');
    expect(formatTick(1e-18)).toBe('1e-18');
    expect(formatTick(2e5)).toBe('2e5');
    expect(formatTick(-0.5)).toBe('-0.5');
  });
});
