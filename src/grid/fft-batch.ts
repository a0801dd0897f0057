/**
 * Complex FFTs of a batch of lines at once, doing for every line exactly the floating-point
 * operations of fft.js's radix-4 transform (fft.js 4.0.4 by Fedor Indutny, MIT licence: the same
 * twiddle table and bit-reversal order, taken from an fft.js instance, and the same expressions in
 * the same order), so each line's result has the same bits as `FFT.transform` /
 * `FFT.inverseTransform` without the final division (the caller divides by n where it stores).
 * The batch runs the innermost loop over lines, so the twiddle factors and index arithmetic are
 * shared and the lines' independent operations overlap.
 *
 * Layout: P lines interleaved, complex element e of line q at (e*P + q)*2 (real) and +1 (imaginary).
 */
import FFT from 'fft.js';

/** What the batched transform needs from an fft.js plan (its public table and its bit-reversal order). */
interface PlanTables {
  readonly n: number;
  readonly table: Float64Array;
  readonly bitrev: Int32Array;
  readonly width: number;
}

const tables = new Map<number, PlanTables>();

/** Tables of the fft.js plan of n points (power of two >= 2). */
function planTables(n: number): PlanTables {
  let t = tables.get(n);
  if (!t) {
    const p = new FFT(n) as unknown as { table: number[]; _bitrev: number[]; _width: number };
    t = { n, table: Float64Array.from(p.table), bitrev: Int32Array.from(p._bitrev), width: p._width };
    tables.set(n, t);
  }
  return t;
}

/**
 * Transforms P interleaved lines of n complex points from `data` into `out` (different arrays of
 * length 2nP); inverse: the unnormalised inverse (fft.js's inverseTransform before its division by n).
 */
export function transformBatch(out: Float64Array, data: Float64Array, n: number, P: number, inverse: boolean): void {
  const { table, bitrev, width } = planTables(n);
  const size = 2 * n; // doubles per line, as fft.js's _csize
  const inv = inverse ? -1 : 1;
  const P2 = 2 * P;
  // initial step: bit-reversed permutation with a radix-2 (len 4) or radix-4 (len 8) butterfly
  let step = 1 << width;
  let len = (size / step) << 1;
  for (let outOff = 0, t = 0; outOff < size; outOff += len, t++) {
    const off = bitrev[t]!;
    // single-line double index x (even) is batched index x*P + 2q
    const o = outOff * P, a = off * P, b = (off + step) * P;
    if (len === 4) {
      for (let q = 0; q < P2; q += 2) {
        const evenR = data[a + q]!, evenI = data[a + q + 1]!;
        const oddR = data[b + q]!, oddI = data[b + q + 1]!;
        out[o + q] = evenR + oddR;
        out[o + q + 1] = evenI + oddI;
        out[o + P2 + q] = evenR - oddR;
        out[o + P2 + q + 1] = evenI - oddI;
      }
    } else {
      const c = (off + 2 * step) * P, d = (off + 3 * step) * P;
      for (let q = 0; q < P2; q += 2) {
        const Ar = data[a + q]!, Ai = data[a + q + 1]!;
        const Br = data[b + q]!, Bi = data[b + q + 1]!;
        const Cr = data[c + q]!, Ci = data[c + q + 1]!;
        const Dr = data[d + q]!, Di = data[d + q + 1]!;
        const T0r = Ar + Cr, T0i = Ai + Ci;
        const T1r = Ar - Cr, T1i = Ai - Ci;
        const T2r = Br + Dr, T2i = Bi + Di;
        const T3r = inv * (Br - Dr), T3i = inv * (Bi - Di);
        out[o + q] = T0r + T2r;
        out[o + q + 1] = T0i + T2i;
        out[o + P2 + q] = T1r + T3i;
        out[o + P2 + q + 1] = T1i - T3r;
        out[o + 2 * P2 + q] = T0r - T2r;
        out[o + 2 * P2 + q + 1] = T0i - T2i;
        out[o + 3 * P2 + q] = T1r - T3i;
        out[o + 3 * P2 + q + 1] = T1i + T3r;
      }
    }
  }
  // radix-4 steps in decreasing order
  for (step >>= 2; step >= 2; step >>= 2) {
    len = (size / step) << 1;
    const quarterLen = len >>> 2;
    for (let outOff = 0; outOff < size; outOff += len) {
      const limit = outOff + quarterLen;
      for (let i = outOff, k = 0; i < limit; i += 2, k += step) {
        const A = i * P, B = (i + quarterLen) * P, C = (i + 2 * quarterLen) * P, D = (i + 3 * quarterLen) * P;
        const tableBr = table[k]!, tableBi = inv * table[k + 1]!;
        const tableCr = table[2 * k]!, tableCi = inv * table[2 * k + 1]!;
        const tableDr = table[3 * k]!, tableDi = inv * table[3 * k + 1]!;
        for (let q = 0; q < P2; q += 2) {
          const Ar = out[A + q]!, Ai = out[A + q + 1]!;
          const Br = out[B + q]!, Bi = out[B + q + 1]!;
          const Cr = out[C + q]!, Ci = out[C + q + 1]!;
          const Dr = out[D + q]!, Di = out[D + q + 1]!;
          const MBr = Br * tableBr - Bi * tableBi;
          const MBi = Br * tableBi + Bi * tableBr;
          const MCr = Cr * tableCr - Ci * tableCi;
          const MCi = Cr * tableCi + Ci * tableCr;
          const MDr = Dr * tableDr - Di * tableDi;
          const MDi = Dr * tableDi + Di * tableDr;
          const T0r = Ar + MCr, T0i = Ai + MCi;
          const T1r = Ar - MCr, T1i = Ai - MCi;
          const T2r = MBr + MDr, T2i = MBi + MDi;
          const T3r = inv * (MBr - MDr), T3i = inv * (MBi - MDi);
          out[A + q] = T0r + T2r;
          out[A + q + 1] = T0i + T2i;
          out[B + q] = T1r + T3i;
          out[B + q + 1] = T1i - T3r;
          out[C + q] = T0r - T2r;
          out[C + q + 1] = T0i - T2i;
          out[D + q] = T1r - T3i;
          out[D + q + 1] = T1i + T3r;
        }
      }
    }
  }
}
