/**
 * Histograms of field values (e.g. the density PDF, the Jeans-number distribution).
 *
 * Bins are equal in the value, or in log10 of the value when log is set (values <= 0 then
 * count as underflow). Edges run from min to max; the last bin includes max. Optional weights
 * (e.g. cell masses for a mass-weighted PDF) and a mask (count only cells where mask != 0).
 * Counts are Float64 sums of the weights (1 per value without weights).
 */

/** Options of histogram: bin count, range (default: the data's), log10 bins, weights, mask. */
export interface HistogramOptions {
  readonly bins: number;
  readonly min?: number;
  readonly max?: number;
  readonly log?: boolean;
  readonly weights?: ArrayLike<number>;
  readonly mask?: ArrayLike<number>;
}

/** A histogram: bins + 1 edges (in the value, not its log), summed weights per bin, and what fell outside. */
export interface Histogram {
  readonly edges: Float64Array;
  readonly counts: Float64Array;
  readonly underflow: number;
  readonly overflow: number;
  readonly total: number;
}

/** Histogram of values (same units as the values); throws RangeError on bins < 1 or an empty range. */
export function histogram(values: ArrayLike<number>, o: HistogramOptions): Histogram {
  if (!Number.isInteger(o.bins) || o.bins < 1) throw new RangeError(`bins must be a positive integer, got ${o.bins}`);
  const t = (x: number): number => (o.log ? (x > 0 ? Math.log10(x) : -Infinity) : x);
  let lo = o.min !== undefined ? t(o.min) : Infinity;
  let hi = o.max !== undefined ? t(o.max) : -Infinity;
  if (o.min === undefined || o.max === undefined) {
    for (let i = 0; i < values.length; i++) {
      if (o.mask && !o.mask[i]) continue;
      const v = t(values[i]!);
      if (!Number.isFinite(v)) continue;
      if (o.min === undefined && v < lo) lo = v;
      if (o.max === undefined && v > hi) hi = v;
    }
  }
  const counts = new Float64Array(o.bins);
  const edges = new Float64Array(o.bins + 1);
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { edges, counts, underflow: 0, overflow: 0, total: 0 };
  if (hi === lo) hi = lo + (Math.abs(lo) || 1) * 1e-9;
  if (hi < lo) throw new RangeError(`histogram range is empty: min ${lo} > max ${hi}`);
  for (let b = 0; b <= o.bins; b++) {
    const e = lo + ((hi - lo) * b) / o.bins;
    edges[b] = o.log ? 10 ** e : e;
  }
  let under = 0, over = 0, total = 0;
  const scale = o.bins / (hi - lo);
  for (let i = 0; i < values.length; i++) {
    if (o.mask && !o.mask[i]) continue;
    const w = o.weights ? o.weights[i]! : 1;
    const v = t(values[i]!);
    if (Number.isNaN(v)) continue;
    total += w;
    if (v < lo) { under += w; continue; }
    if (v > hi) { over += w; continue; }
    const b = Math.min(o.bins - 1, Math.floor((v - lo) * scale));
    counts[b] += w;
  }
  return { edges, counts, underflow: under, overflow: over, total };
}
