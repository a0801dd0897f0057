/**
 * transformBatch against fft.js itself: for every size the grid allows and several batch widths,
 * each line's result must have exactly fft.js's bits (signed zeros included), so the results and the
 * golden checksums do not depend on which of the two ran. Lines of +0 must come out as +0, which
 * complexAxis relies on to leave such blocks untouched.
 */
import { describe, it, expect } from 'vitest';
import FFT from 'fft.js';
import { transformBatch } from '../src/grid/fft-batch.js';

function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return s / 2 ** 32; };
}

describe('transformBatch', () => {
  it('gives fft.js bits for every line, forward and inverse (before the division by n)', () => {
    const rnd = seeded(5);
    let compared = 0;
    for (let n = 2; n <= 4096; n *= 2) for (const P of [1, 3, 16]) for (const inverse of [false, true]) {
      const fft = new FFT(n);
      const lines = Array.from({ length: P }, () => Float64Array.from({ length: 2 * n }, () => {
        const u = rnd();
        return u < 0.1 ? 0 : u < 0.15 ? -0 : (rnd() - 0.5) * 10 ** Math.floor(rnd() * 8 - 4);
      }));
      const data = new Float64Array(2 * n * P);
      lines.forEach((l, q) => { for (let e = 0; e < 2 * n; e++) data[(Math.floor(e / 2) * P + q) * 2 + (e % 2)] = l[e]!; });
      const out = new Float64Array(2 * n * P);
      transformBatch(out, data, n, P, inverse);
      lines.forEach((l, q) => {
        const ref = new Float64Array(2 * n);
        if (inverse) fft.inverseTransform(ref, l); else fft.transform(ref, l);
        const got = Float64Array.from({ length: 2 * n }, (_, e) => out[(Math.floor(e / 2) * P + q) * 2 + (e % 2)]! / (inverse ? n : 1));
        expect(Buffer.compare(Buffer.from(got.buffer), Buffer.from(ref.buffer))).toBe(0);
        compared++;
      });
    }
    expect(compared).toBe(12 * 2 * (1 + 3 + 16)); // 12 sizes, 2 directions, 20 lines
  });

  it('maps lines of +0 to lines of +0, as fft.js does', () => {
    for (let n = 2; n <= 4096; n *= 2) for (const inverse of [false, true]) {
      const out = new Float64Array(2 * n * 4).fill(7);
      transformBatch(out, new Float64Array(2 * n * 4), n, 4, inverse);
      expect(out.every((v) => v === 0 && 1 / v > 0)).toBe(true);
      const ref = new Float64Array(2 * n);
      if (inverse) new FFT(n).inverseTransform(ref, new Float64Array(2 * n)); else new FFT(n).transform(ref, new Float64Array(2 * n));
      expect(ref.every((v) => v === 0 && 1 / v > 0)).toBe(true);
    }
  });
});
