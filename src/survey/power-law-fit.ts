/**
 * Continuous power-law fit dN/dm ~ m^-slope above x_min by maximum likelihood, with x_min
 * chosen to minimise the Kolmogorov-Smirnov distance (Clauset, Shalizi & Newman 2009, eqs.
 * 3.1 and 3.9, section 3.3). Uncertainty of the slope (slope - 1)/sqrt(n) (their eq. 3.2).
 * Masses in any unit (g inside the survey).
 */
import type { PowerLawFit } from './types.js';

/** Fewest masses in the fitted tail; fewer candidates than this give no fit (null). */
export const MIN_TAIL = 10;

/** MLE slope of a continuous power law for the sorted-ascending tail xs[from..] above xmin. */
function mleSlope(xs: Float64Array, from: number, xmin: number): number {
  let s = 0;
  for (let i = from; i < xs.length; i++) s += Math.log(xs[i]! / xmin);
  return 1 + (xs.length - from) / s;
}

/** KS distance between the empirical tail xs[from..] and the fitted power law. */
function ksDistance(xs: Float64Array, from: number, xmin: number, slope: number): number {
  const n = xs.length - from;
  let d = 0;
  for (let i = 0; i < n; i++) {
    const model = 1 - (xs[from + i]! / xmin) ** (1 - slope);
    d = Math.max(d, (i + 1) / n - model, model - i / n);
  }
  return d;
}

/** Power-law fit of masses (any positive unit) per Clauset et al. 2009, or null with fewer than minTail masses. */
export function fitPowerLaw(masses: readonly number[], minTail = MIN_TAIL): PowerLawFit | null {
  const xs = Float64Array.from(masses.filter((m) => m > 0 && Number.isFinite(m))).sort();
  if (xs.length < minTail) return null;
  let best: PowerLawFit | null = null;
  for (let from = 0; from <= xs.length - minTail; from++) {
    if (from > 0 && xs[from] === xs[from - 1]) continue;
    const xmin = xs[from]!;
    const slope = mleSlope(xs, from, xmin);
    if (!Number.isFinite(slope)) continue;
    const ks = ksDistance(xs, from, xmin, slope);
    const n = xs.length - from;
    if (!best || ks < best.ksDistance) best = { slope, slopeError: (slope - 1) / Math.sqrt(n), xmin, nTail: n, ksDistance: ks };
  }
  return best;
}
